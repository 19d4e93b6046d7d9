"""Case files (TOML, format 1) to engine objects, with errors that name the key.

The contract is in the README's "Case file" section. Every problem found is
reported at once; each names its key path (segments are numbered from 1, as they
stand in the file) and says how to fix it.
"""

from __future__ import annotations

import math
import tomllib
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from .atmosphere import barometric_pressure
from .catalogue import (
    PIPE_SERIES_SOURCES,
    get_fitting,
    get_material,
    get_series,
)
from .errors import CaseError
from .fields import Reader
from .friction import HAZEN_WILLIAMS_TEMPERATURE_RANGE, MODELS, FrictionModel
from .liquid import Liquid, water_at
from .pipe import Segment
from .pumpcase import PumpPart, read_pump_part
from .system import OUTLETS, Pipeline, Scenario, build_scenarios
from .units import P_STANDARD, ZERO_CELSIUS, head_from_pressure

#: Velocity range checked at the demand flow unless the case sets [checks]: rural
#: gravity lines 0.7-3.0 m/s (Jordan, A Handbook of Gravity-Flow Water Systems, 1984,
#: via a secondary summary; common practice): the lower bound keeps sediment
#: moving, the upper limits erosion and surge.
VELOCITY_RANGE = (0.7, 3.0)
VELOCITY_RANGE_SOURCE = "Jordan (1984) A Handbook of Gravity-Flow Water Systems (common practice)"

TOP_KEYS = (
    "format",
    "title",
    "notes",
    "display",
    "liquid",
    "site",
    "source",
    "delivery",
    "pipe",
    "segment",
    "checks",
    "sizing",
    "pump_station",
    "pump",
    "arrangement",
    "operation",
)
SEGMENT_KEYS = (
    "name",
    "length",
    "diameter",
    "material",
    "roughness",
    "roughness_growth",
    "hazen_williams_c",
    "fittings",
    "k_extra",
    "suction",
    "elevation_end",
    "pressure_rating",
    "wave_speed",
)


@dataclass(frozen=True)
class Case:
    """One pipeline study, read and validated. All values SI (see `syscurve.units`)."""

    data: dict[str, Any]
    title: str
    display: str
    pipeline: Pipeline
    scenarios: tuple[Scenario, ...]
    demand: float  # [m^3/s]
    barometric_pressure: float  # [Pa]
    altitude: float | None  # [m]
    liquid_hot: Liquid | None  # at temperature_max, for NPSH
    source_gauge_pressure: float  # [Pa]
    velocity_range: tuple[float, float]
    sizing_candidates: tuple[tuple[str, float, str], ...]
    sizing_segments: frozenset[str] | None
    warnings: tuple[str, ...] = ()
    base_dir: Path | None = None
    pump_part: PumpPart = field(default_factory=PumpPart)

    @property
    def liquid(self) -> Liquid:
        return self.pipeline.liquid


def read_toml(path: str | Path) -> dict[str, Any]:
    """Parse a TOML file; a missing or malformed file raises `CaseError`."""
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError(f"no such file: {path}") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise CaseError(f"cannot read {path}: {exc}") from None
    return parse_toml(text, str(path))


def parse_toml(text: str, name: str = "case") -> dict[str, Any]:
    """Parse TOML text; a syntax error raises `CaseError` with the line and column."""
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise CaseError(f"{name} is not valid TOML: {exc}") from None


def load_case(path: str | Path) -> Case:
    """Read and validate a case file.

    Raises
    ------
    CaseError
        With one problem per wrong or missing value, each naming its key.
    """
    path = Path(path)
    return case_from_dict(read_toml(path), base_dir=path.parent)


def case_from_dict(data: dict[str, Any], base_dir: Path | None = None) -> Case:
    """Validate a case dict (as parsed from TOML) and build the engine objects."""
    r = Reader()
    r.known_keys(data, TOP_KEYS, "")
    fmt = data.get("format")
    if fmt is None:
        r.add("format", "missing; add format = 1 at the top of the file")
    elif fmt != 1:
        r.add("format", f"unsupported format {fmt!r}; this version reads format = 1")
    title = data.get("title", "untitled case")
    if not isinstance(title, str):
        r.add("title", f"expected a string, got {title!r}")
        title = "untitled case"

    display_table = r.table(data, "display")
    r.known_keys(display_table, ("units",), "display")
    display = r.string(display_table, "units", "display", default="SI", choices=("SI", "US"))

    site = r.table(data, "site")
    r.known_keys(site, ("altitude", "barometric_pressure"), "site")
    altitude = r.quantity(site, "altitude", "site", "length")
    barometric = r.quantity(site, "barometric_pressure", "site", "pressure", positive=True)
    if barometric is None and altitude is not None:
        try:
            barometric = barometric_pressure(altitude)
        except CaseError as error:
            r.problems.extend(error)
    if barometric is None:
        barometric = P_STANDARD

    source = r.table(data, "source", required=True)
    r.known_keys(source, ("level", "level_min", "level_max", "gauge_pressure"), "source")
    source_gauge = r.quantity(source, "gauge_pressure", "source", "pressure") or 0.0
    if barometric + source_gauge <= 0:
        r.add("source.gauge_pressure", "gives an absolute pressure at or below zero")

    liquid, liquid_hot = _read_liquid(r, data, barometric + max(source_gauge, -barometric))

    delivery = r.table(data, "delivery", required=True)
    r.known_keys(
        delivery,
        (
            "outlet",
            "level",
            "level_min",
            "level_max",
            "residual_pressure",
            "gauge_pressure",
            "demand",
        ),
        "delivery",
    )
    outlet = r.string(delivery, "outlet", "delivery", choices=OUTLETS, required=True)
    demand = r.quantity(delivery, "demand", "delivery", "flow", required=True, positive=True)
    density = liquid.density if liquid else None
    delivery_head = 0.0
    if outlet == "pressure":
        if "residual_pressure" not in delivery:
            r.add(
                "delivery.residual_pressure",
                'missing for outlet "pressure"; write e.g. residual_pressure = "10 m" or "100 kPa"',
            )
        delivery_head = (
            r.head_or_pressure(delivery, "residual_pressure", "delivery", density) or 0.0
        )
    elif "residual_pressure" in delivery:
        r.add("delivery.residual_pressure", f'applies to outlet = "pressure", not "{outlet}"')
    if "gauge_pressure" in delivery:
        if outlet != "tank":
            r.add("delivery.gauge_pressure", f'applies to outlet = "tank", not "{outlet}"')
        gauge = r.quantity(delivery, "gauge_pressure", "delivery", "pressure")
        if gauge is not None and density is not None:
            delivery_head = head_from_pressure(gauge, density)

    levels = {
        f"{table_name}.{key}": r.quantity(table, key, table_name, "length", required=key == "level")
        for table_name, table in (("source", source), ("delivery", delivery))
        for key in ("level", "level_min", "level_max")
    }
    for table_name in ("source", "delivery"):
        low, mid, high = (levels[f"{table_name}.{k}"] for k in ("level_min", "level", "level_max"))
        if low is not None and mid is not None and low > mid:
            r.add(f"{table_name}.level_min", "is above level; level_min <= level <= level_max")
        if high is not None and mid is not None and high < mid:
            r.add(f"{table_name}.level_max", "is below level; level_min <= level <= level_max")

    pipe = r.table(data, "pipe")
    r.known_keys(pipe, ("friction", "age", "transitions"), "pipe")
    model_name = r.string(pipe, "friction", "pipe", default="colebrook", choices=tuple(MODELS))
    model = MODELS[model_name] if model_name else MODELS["colebrook"]
    age = r.quantity(pipe, "age", "pipe", "duration", non_negative=True)
    transitions = r.string(pipe, "transitions", "pipe", default="auto", choices=("auto", "none"))

    segments = _read_segments(r, data, model)
    pump_part = read_pump_part(r, data, base_dir)
    velocity_range = _read_checks(r, data)
    candidates, sizing_segments = _read_sizing(r, data)

    if liquid is not None and model.name == "hazen-williams":
        if not liquid.is_water:
            r.add("pipe.friction", "hazen-williams applies to water only; use colebrook")
        elif liquid.temperature is not None:
            low_t, high_t = HAZEN_WILLIAMS_TEMPERATURE_RANGE
            if not low_t <= liquid.temperature <= high_t:
                r.warnings.append(
                    f"pipe.friction: Hazen-Williams at "
                    f"{liquid.temperature - ZERO_CELSIUS:.0f} degC is outside the ordinary "
                    f"water temperatures it was fitted to ({low_t - ZERO_CELSIUS:.0f}-"
                    f"{high_t - ZERO_CELSIUS:.0f} degC, common practice); prefer colebrook"
                )

    r.done()
    assert liquid is not None and demand is not None and outlet is not None
    pipeline = Pipeline(
        liquid=liquid,
        segments=tuple(segments),
        model=model,
        outlet=outlet,
        source_pressure_head=head_from_pressure(source_gauge, liquid.density),
        delivery_pressure_head=delivery_head,
        transitions=transitions != "none",
    )
    scenarios = build_scenarios(
        levels["source.level"] or 0.0,
        levels["delivery.level"] or 0.0,
        source_level_min=levels["source.level_min"],
        source_level_max=levels["source.level_max"],
        delivery_level_min=levels["delivery.level_min"],
        delivery_level_max=levels["delivery.level_max"],
        age_years=age,
    )
    return Case(
        data=data,
        title=title,
        display=display or "SI",
        pipeline=pipeline,
        scenarios=scenarios,
        demand=demand,
        barometric_pressure=barometric,
        altitude=altitude,
        liquid_hot=liquid_hot,
        source_gauge_pressure=source_gauge,
        velocity_range=velocity_range,
        sizing_candidates=tuple(candidates),
        sizing_segments=sizing_segments,
        warnings=tuple(r.warnings),
        base_dir=base_dir,
        pump_part=pump_part,
    )


def _read_liquid(
    r: Reader, data: dict[str, Any], absolute_pressure: float
) -> tuple[Liquid | None, Liquid | None]:
    if not isinstance(data.get("liquid"), dict):
        r.table(data, "liquid", required=True)  # records what is wrong
        return None, None
    table = data["liquid"]
    kind = r.string(table, "kind", "liquid", default="water", choices=("water", "custom"))
    if kind == "water":
        r.known_keys(table, ("kind", "temperature", "temperature_max"), "liquid")
        temperature = r.temperature(table, "temperature", "liquid", required=True)
        hot_temperature = r.temperature(table, "temperature_max", "liquid")
        liquid = hot = None
        if temperature is not None:
            try:
                liquid = water_at(temperature, absolute_pressure, "liquid.temperature")
            except CaseError as error:
                r.problems.extend(error)
        if hot_temperature is not None:
            if temperature is not None and hot_temperature < temperature:
                r.add("liquid.temperature_max", "is below liquid.temperature")
            else:
                try:
                    hot = water_at(hot_temperature, absolute_pressure, "liquid.temperature_max")
                except CaseError as error:
                    r.problems.extend(error)
        return liquid, hot
    if kind == "custom":
        r.known_keys(
            table,
            (
                "kind",
                "name",
                "temperature",
                "density",
                "viscosity",
                "vapor_pressure",
                "vapor_pressure_max",
            ),
            "liquid",
        )
        name = r.string(table, "name", "liquid", default="custom liquid") or "custom liquid"
        temperature = r.temperature(table, "temperature", "liquid")
        density = r.quantity(table, "density", "liquid", "density", required=True, positive=True)
        viscosity = r.quantity(
            table, "viscosity", "liquid", "viscosity", required=True, positive=True
        )
        vapor = r.quantity(table, "vapor_pressure", "liquid", "pressure", non_negative=True)
        vapor_max = r.quantity(table, "vapor_pressure_max", "liquid", "pressure", non_negative=True)
        for key, value in (("vapor_pressure", vapor), ("vapor_pressure_max", vapor_max)):
            if value is not None and value >= absolute_pressure:
                r.add(
                    f"liquid.{key}",
                    "reaches the source's absolute pressure: the liquid would boil at the source",
                )
        if density is None or viscosity is None:
            return None, None
        liquid = Liquid(name, density, viscosity, vapor, temperature, False)
        hot = Liquid(name, density, viscosity, vapor_max, None, False) if vapor_max else None
        return liquid, hot
    return None, None


def _read_segments(r: Reader, data: dict[str, Any], model: FrictionModel) -> list[Segment]:
    raw_segments = data.get("segment")
    if raw_segments is None or raw_segments == []:
        r.add("segment", "a case needs at least one [[segment]] with length and diameter")
        return []
    if not isinstance(raw_segments, list) or not all(isinstance(s, dict) for s in raw_segments):
        r.add("segment", "write segments as [[segment]] tables")
        return []
    segments: list[Segment] = []
    names: set[str] = set()
    seen_non_suction = False
    for number, table in enumerate(raw_segments, start=1):
        path = f"segment[{number}]"
        r.known_keys(table, SEGMENT_KEYS, path)
        name = r.string(table, "name", path, default=f"segment {number}") or f"segment {number}"
        if name in names:
            r.add(f"{path}.name", f'"{name}" is used by an earlier segment; names must differ')
        names.add(name)
        length = r.quantity(table, "length", path, "length", required=True, positive=True)
        diameter = r.quantity(table, "diameter", path, "length", required=True, positive=True)
        material = None
        if "material" in table:
            try:
                material = get_material(table["material"], f"{path}.material")
            except CaseError as error:
                r.problems.extend(error)
        roughness = r.quantity(table, "roughness", path, "length", non_negative=True)
        growth = r.quantity(table, "roughness_growth", path, "roughness_growth", non_negative=True)
        c = r.number(table, "hazen_williams_c", path, exclusive_minimum=0.0)
        if (
            roughness is None
            and material is None
            and "material" not in table
            and "roughness" not in table
            and model.name != "hazen-williams"
        ):
            r.add(
                f"{path}.material",
                'missing; give material (e.g. "pvc") or roughness (e.g. "0.0015 mm")',
            )
        if (
            model.name == "hazen-williams"
            and c is None
            and material is None
            and "material" not in table
            and "hazen_williams_c" not in table
        ):
            r.add(
                f"{path}.hazen_williams_c",
                "missing; hazen-williams needs material or hazen_williams_c (e.g. 140)",
            )
        fittings = _read_fittings(r, table, path, name)
        k_extra = r.number(table, "k_extra", path, default=0.0, minimum=0.0)
        suction = r.boolean(table, "suction", path, False)
        if suction and seen_non_suction:
            r.add(f"{path}.suction", "suction segments come first, before the pump")
        seen_non_suction = seen_non_suction or not suction
        elevation = r.quantity(table, "elevation_end", path, "length")
        rating = r.quantity(table, "pressure_rating", path, "pressure", positive=True)
        wave_speed = r.quantity(table, "wave_speed", path, "velocity", positive=True)
        if length is None or diameter is None:
            continue
        if roughness is None:
            roughness = material.roughness if material else 0.0
        if growth is None:
            growth = material.roughness_growth if material else 0.0
        if roughness >= 0.5 * diameter:
            r.add(f"{path}.roughness", "is not smaller than the pipe radius; check its unit")
            continue
        segments.append(
            Segment(
                name=name,
                length=length,
                diameter=diameter,
                roughness=roughness,
                roughness_growth=growth,
                hazen_williams_c=c
                if c is not None
                else (material.hazen_williams_c if material else None),
                hazen_williams_c_decline=(
                    material.hazen_williams_c_decline if material and c is None else 0.0
                ),
                fittings=fittings,
                k_extra=k_extra or 0.0,
                suction=suction,
                material=material.name if material else None,
                elevation_end=elevation,
                pressure_rating=rating,
                wave_speed=wave_speed or (material.wave_speed if material else None),
            )
        )
    return segments


def _read_fittings(
    r: Reader, table: dict[str, Any], path: str, segment_name: str
) -> tuple[tuple[str, float, float], ...]:
    raw = table.get("fittings", {})
    if not isinstance(raw, dict):
        r.add(f"{path}.fittings", 'expected a table such as { "elbow-90" = 2 }')
        return ()
    fittings = []
    for name, count in raw.items():
        key = f"{path}.fittings.{name}"
        try:
            fitting = get_fitting(name, key)
        except CaseError as error:
            r.problems.extend(error)
            continue
        if (
            isinstance(count, bool)
            or not isinstance(count, (int, float))
            or not math.isfinite(count)
            or count < 0
        ):
            r.add(key, f"expected a count >= 0, got {count!r}")
            continue
        if name == "exit":
            r.warnings.append(
                f"{key}: the engine already adds the outlet term (exit loss of a tank, or "
                f"the velocity head kept by a free outlet); this exit K double-counts it"
            )
        fittings.append((name, float(count), fitting.k))
    return tuple(fittings)


def _read_checks(r: Reader, data: dict[str, Any]) -> tuple[float, float]:
    table = r.table(data, "checks")
    r.known_keys(table, ("velocity_min", "velocity_max"), "checks")
    low = r.quantity(table, "velocity_min", "checks", "velocity", non_negative=True)
    high = r.quantity(table, "velocity_max", "checks", "velocity", positive=True)
    low = VELOCITY_RANGE[0] if low is None else low
    high = VELOCITY_RANGE[1] if high is None else high
    if low >= high:
        r.add("checks.velocity_max", "must be above velocity_min")
    return low, high


def _segment_names(data: dict[str, Any]) -> set[str]:
    """Names of every segment table, valid or not (so one bad segment cascades no further)."""
    raw = data.get("segment")
    if not isinstance(raw, list):
        return set()
    return {
        str(t.get("name", f"segment {number}"))
        for number, t in enumerate(raw, start=1)
        if isinstance(t, dict)
    }


def _read_sizing(
    r: Reader, data: dict[str, Any]
) -> tuple[list[tuple[str, float, str]], frozenset[str] | None]:
    table = r.table(data, "sizing")
    r.known_keys(table, ("candidate_diameters", "series", "segments"), "sizing")
    candidates: list[tuple[str, float, str]] = []
    raw = table.get("candidate_diameters", [])
    if not isinstance(raw, list):
        r.add("sizing.candidate_diameters", 'expected a list such as ["63 mm", "75 mm"]')
        raw = []
    for index, text in enumerate(raw, start=1):
        value = r.value(text, f"sizing.candidate_diameters[{index}]", "length", positive=True)
        if value is None:
            continue
        candidates.append((str(text), value, "case list"))
    series_names = table.get("series", [])
    if isinstance(series_names, str):
        series_names = [series_names]
    for name in series_names if isinstance(series_names, list) else []:
        try:
            series = get_series(name)
        except CaseError as error:
            r.problems.extend(error)
            continue
        candidates.extend((label, d, PIPE_SERIES_SOURCES[name]) for label, d in series.items())
    names = r.string_list(table, "segments", "sizing")
    known = _segment_names(data)
    for name in names or []:
        if name not in known:
            r.add("sizing.segments", f'no segment is named "{name}"')
    return candidates, frozenset(names) if names else None
