"""The pump part of a case: [pump_station], [[pump]], [[arrangement]], [operation].

Read with the same `Reader` as the rest of the case, so every problem is reported
at once with its key path (pumps and arrangements numbered from 1).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from .arrangement import Arrangement
from .errors import CaseError
from .fields import Reader
from .npsh import PumpStation
from .pump import PumpCurve
from .units import unit_factor

PUMP_KEYS = (
    "name",
    "speed",
    "flow_unit",
    "head_unit",
    "power_unit",
    "flow",
    "head",
    "efficiency",
    "npsh_required",
    "shaft_power",
    "file",
    "library",
)
ARRANGEMENT_KEYS = ("name", "pump", "pumps", "count", "connection", "speed")
STATION_KEYS = (
    "inlet_elevation",
    "npsh_margin_ratio",
    "npsh_margin",
    "preferred_region",
)
OPERATION_KEYS = ("hours_per_year", "tariff", "currency", "motor_efficiency")


@dataclass(frozen=True)
class Operation:
    """Hours and tariff for the energy figures (all optional)."""

    hours_per_year: float | None = None
    tariff: float | None = None  # currency per kWh
    currency: str = ""
    motor_efficiency: float | None = None  # fraction; None: energy at the pump shaft


@dataclass(frozen=True)
class PumpPart:
    """Everything about pumps in a case."""

    pumps: tuple[PumpCurve, ...] = ()
    arrangements: tuple[Arrangement, ...] = ()
    station: PumpStation = PumpStation()
    operation: Operation = Operation()


def read_pump_part(r: Reader, data: dict[str, Any], base_dir: Path | None) -> PumpPart:
    """Read the pump tables of a case; problems go to `r`."""
    station = _read_station(r, data)
    operation = _read_operation(r, data)
    pumps = _read_pumps(r, data, base_dir)
    arrangements = _read_arrangements(r, data, pumps)
    return PumpPart(tuple(pumps.values()), tuple(arrangements), station, operation)


def _read_station(r: Reader, data: dict[str, Any]) -> PumpStation:
    table = r.table(data, "pump_station")
    r.known_keys(table, STATION_KEYS, "pump_station")
    inlet = r.quantity(table, "inlet_elevation", "pump_station", "length")
    ratio = r.number(table, "npsh_margin_ratio", "pump_station", default=1.1, minimum=1.0)
    margin = r.quantity(table, "npsh_margin", "pump_station", "length", non_negative=True)
    region = (0.7, 1.2)
    raw = table.get("preferred_region")
    if raw is not None:
        ok = (
            isinstance(raw, list)
            and len(raw) == 2
            and all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in raw)
            and 0 < raw[0] < 100 < raw[1]
        )
        if ok:
            region = (raw[0] / 100.0, raw[1] / 100.0)
        else:
            r.add(
                "pump_station.preferred_region",
                f"expected [low, high] in percent of BEP flow around 100, e.g. [70, 120]; "
                f"got {raw!r}",
            )
    return PumpStation(
        inlet_elevation=inlet,
        margin_ratio=1.1 if ratio is None else ratio,
        margin_min=0.6 if margin is None else margin,
        preferred_region=region,
    )


def _read_operation(r: Reader, data: dict[str, Any]) -> Operation:
    table = r.table(data, "operation")
    r.known_keys(table, OPERATION_KEYS, "operation")
    hours = r.number(table, "hours_per_year", "operation", minimum=0.0, maximum=8784.0)
    tariff = r.number(table, "tariff", "operation", minimum=0.0)
    currency = r.string(table, "currency", "operation", default="") or ""
    motor = r.number(table, "motor_efficiency", "operation", exclusive_minimum=0.0, maximum=100.0)
    return Operation(hours, tariff, currency, None if motor is None else motor / 100.0)


def _number_list(r: Reader, table: dict[str, Any], name: str, key: str) -> list[float] | None:
    raw = table.get(name)
    if raw is None:
        return None
    if not isinstance(raw, list) or not all(
        isinstance(v, (int, float)) and not isinstance(v, bool) for v in raw
    ):
        r.add(f"{key}.{name}", f"expected a list of plain numbers, e.g. [0, 1, 2], got {raw!r}")
        return None
    return [float(v) for v in raw]


def _read_pumps(r: Reader, data: dict[str, Any], base_dir: Path | None) -> dict[str, PumpCurve]:
    raw = data.get("pump", [])
    if not isinstance(raw, list) or not all(isinstance(t, dict) for t in raw):
        r.add("pump", "write pumps as [[pump]] tables")
        return {}
    pumps: dict[str, PumpCurve] = {}
    for number, table in enumerate(raw, start=1):
        key = f"pump[{number}]"
        r.known_keys(table, PUMP_KEYS, key)
        sources = [k for k in ("file", "library", "flow") if k in table]
        if len(sources) != 1:
            r.add(
                key,
                'give the curve one way: flow and head points, file = "pump.csv", '
                'or library = "<name of a bundled demo pump>"',
            )
            continue
        try:
            curve = _read_one_pump(r, table, key, base_dir)
        except CaseError as error:
            r.problems.extend(error)
            continue
        if curve is None:
            continue
        if curve.name in pumps:
            r.add(f"{key}.name", f'"{curve.name}" is used by an earlier pump; names must differ')
            continue
        pumps[curve.name] = curve
    return pumps


def _read_one_pump(
    r: Reader, table: dict[str, Any], key: str, base_dir: Path | None
) -> PumpCurve | None:
    name = r.string(table, "name", key)
    if "file" in table or "library" in table:
        if "file" in table:
            from .pumpcsv import read_pump_csv

            file_name = r.string(table, "file", key)
            if file_name is None:
                return None
            path = Path(file_name)
            if not path.is_absolute() and base_dir is not None:
                path = base_dir / path
            try:
                text = path.read_text(encoding="utf-8")
            except OSError as exc:
                raise CaseError(f"cannot read {path}: {exc.strerror}", f"{key}.file") from None
            curve = read_pump_csv(text, f"{key}.file ({path.name})", name=name)
        else:
            import pump_data

            library_name = r.string(table, "library", key)
            if library_name is None:
                return None
            curve = pump_data.load(library_name, f"{key}.library")
        if name is not None and curve.name != name:
            from dataclasses import replace

            curve = replace(curve, name=name)
        if "speed" in table:
            speed = r.quantity(table, "speed", key, "rotational_speed", positive=True)
            if speed is not None and not math.isclose(speed, curve.speed_rpm, rel_tol=1e-9):
                r.add(
                    f"{key}.speed",
                    f"the curve was measured at {curve.speed_rpm:g} rpm; "
                    "to run it at another speed, give speed in an [[arrangement]]",
                )
        return curve
    if name is None:
        r.add(f"{key}.name", 'missing; write e.g. name = "booster A"')
    speed = r.quantity(table, "speed", key, "rotational_speed", required=True, positive=True)
    factors: dict[str, float] = {}
    for unit_key, kind, example in (
        ("flow_unit", "flow", "L/s"),
        ("head_unit", "length", "m"),
        ("power_unit", "power", "kW"),
    ):
        needed = unit_key != "power_unit" or "shaft_power" in table
        unit_text = table.get(unit_key)
        if unit_text is None:
            if needed:
                r.add(f"{key}.{unit_key}", f'missing; write e.g. {unit_key} = "{example}"')
            continue
        try:
            factors[unit_key] = unit_factor(str(unit_text), kind, f"{key}.{unit_key}")
        except CaseError as error:
            r.problems.extend(error)
    lists = {
        n: _number_list(r, table, n, key)
        for n in ("flow", "head", "efficiency", "npsh_required", "shaft_power")
    }
    if "head" not in table:
        r.add(f"{key}.head", "missing; give the head at each flow, e.g. head = [58, 54, 42]")
    flow, head = lists["flow"], lists["head"]
    if (
        name is None
        or speed is None
        or flow is None
        or head is None
        or "flow_unit" not in factors
        or "head_unit" not in factors
    ):
        return None
    q, h = factors["flow_unit"], factors["head_unit"]
    efficiency = lists["efficiency"]
    npsh = lists["npsh_required"]
    power = lists["shaft_power"]
    if power is not None and "power_unit" not in factors:
        return None
    return PumpCurve.from_points(
        name,
        speed,
        [v * q for v in flow],
        [v * h for v in head],
        efficiency=None if efficiency is None else [v / 100.0 for v in efficiency],
        shaft_power=None if power is None else [v * factors["power_unit"] for v in power],
        npsh_required=None if npsh is None else [v * h for v in npsh],
        key=key,
    )


def _read_arrangements(
    r: Reader, data: dict[str, Any], pumps: dict[str, PumpCurve]
) -> list[Arrangement]:
    raw = data.get("arrangement")
    if raw is None:  # default: each pump alone at its speed
        return [Arrangement(p.name, (p,)) for p in pumps.values()]
    if not isinstance(raw, list) or not all(isinstance(t, dict) for t in raw):
        r.add("arrangement", "write arrangements as [[arrangement]] tables")
        return []
    arrangements: list[Arrangement] = []
    names: set[str] = set()
    for number, table in enumerate(raw, start=1):
        key = f"arrangement[{number}]"
        r.known_keys(table, ARRANGEMENT_KEYS, key)
        arrangement = _read_one_arrangement(r, table, key, pumps)
        if arrangement is None:
            continue
        if arrangement.name in names:
            r.add(f"{key}.name", f'"{arrangement.name}" is used by an earlier arrangement')
            continue
        names.add(arrangement.name)
        arrangements.append(arrangement)
    return arrangements


def _pump_named(r: Reader, name: Any, key: str, pumps: dict[str, PumpCurve]) -> PumpCurve | None:
    if isinstance(name, str) and name in pumps:
        return pumps[name]
    from .errors import did_you_mean

    known = ", ".join(pumps) or "none defined"
    r.add(key, f'no pump is named "{name}"; {did_you_mean(name, pumps)}pumps: {known}')
    return None


def _read_one_arrangement(
    r: Reader, table: dict[str, Any], key: str, pumps: dict[str, PumpCurve]
) -> Arrangement | None:
    if ("pump" in table) == ("pumps" in table):
        r.add(
            key,
            'name the pump: pump = "booster A" (or pumps = ["A", "B"] for different '
            "pumps in parallel)",
        )
        return None
    count_raw = table.get("count", 1)
    if isinstance(count_raw, bool) or not isinstance(count_raw, int) or count_raw < 1:
        r.add(f"{key}.count", f"must be a whole number of pumps, 1 or more; got {count_raw!r}")
        return None
    connection = r.string(table, "connection", key, choices=("parallel", "series"))
    speed_raw = table.get("speed")
    speed = None
    for_demand = speed_raw == "for-demand"
    if speed_raw is not None and not for_demand:
        speed = r.quantity(table, "speed", key, "rotational_speed", positive=True)
        if speed is None:
            return None
    if "pumps" in table:
        names = table["pumps"]
        if not isinstance(names, list) or len(names) < 2:
            r.add(f"{key}.pumps", 'expected two or more pump names, e.g. ["A", "B"]')
            return None
        curves = [_pump_named(r, n, f"{key}.pumps", pumps) for n in names]
        if any(c is None for c in curves) or "count" in table:
            if "count" in table:
                r.add(f"{key}.count", "give count with pump, not with pumps")
            return None
        units = tuple(c for c in curves if c is not None)
        conn = connection or "parallel"
        label = " + ".join(c.name for c in units)
    else:
        curve = _pump_named(r, table["pump"], f"{key}.pump", pumps)
        if curve is None:
            return None
        units = (curve,) * count_raw
        conn = "single" if count_raw == 1 else (connection or "parallel")
        label = arrangement_name(curve.name, count_raw, conn, speed, for_demand)
    name = r.string(table, "name", key, default=label) or label
    try:
        return Arrangement(name, units, conn, speed, for_demand)
    except CaseError as error:
        r.add(key, error.problems[0].message)
        return None


def arrangement_name(
    pump: str, count: int, connection: str, speed_rpm: float | None, for_demand: bool
) -> str:
    """The name an arrangement of identical pumps gets when the case gives none.

    e.g. "booster A", "2 x booster A parallel", "booster B at speed for demand".
    """
    label = pump if count == 1 else f"{count} x {pump} {connection}"
    if for_demand:
        return label + " at speed for demand"
    if speed_rpm is not None:
        return label + f" at {speed_rpm:g} rpm"
    return label
