"""PURE: pumps and arrangements <-> the case dict.

Pumps are stored as ``[[pump]]`` tables: a bundled demo curve as ``library = "<name>"``;
pasted points and uploaded CSV files as points (``speed``, ``flow_unit``,
``head_unit``, ``flow``, ``head``, ``efficiency``, ``npsh_required``), so that a saved
case needs no other file. Arrangements are ``[[arrangement]]`` tables; when a case
has none, the engine runs each pump alone, and the grid shows those implicit rows.
"""

from __future__ import annotations

import copy
import math
import re
from typing import Any

from syscurve.errors import CaseError
from syscurve.pumpcase import arrangement_name
from syscurve.units import unit_factor

from .viewmodel import is_number, number_text

#: Units offered for pasted points: (label, pint unit).
FLOW_UNITS = (("L/s", "L/s"), ("m³/h", "m**3/h"), ("gpm (US)", "gpm"))
HEAD_UNITS = (("m", "m"), ("ft", "ft"))
#: The pasted-points units offered first in each display system.
POINT_UNITS = {"SI": ("L/s", "m"), "US": ("gpm", "ft")}
SPEED_HINT = "blank: the curve's speed; a number: rpm; for-demand: the speed that meets the demand"


def _pumps(data: dict[str, Any]) -> list[dict[str, Any]]:
    pumps = data.get("pump")
    return [p for p in pumps if isinstance(p, dict)] if isinstance(pumps, list) else []


def pump_names(data: dict[str, Any]) -> list[str]:
    """Names of the pumps in the case (a library pump without a name uses its library name)."""
    return [str(p.get("name") or p.get("library") or "") for p in _pumps(data)]


def _unique(existing: list[str], name: str) -> str:
    if name not in existing:
        return name
    number = 2
    while f"{name} ({number})" in existing:
        number += 1
    return f"{name} ({number})"


def pump_rows(data: dict[str, Any]) -> list[dict[str, Any]]:
    """One row per ``[[pump]]``: name, where its curve comes from, speed."""
    rows = []
    for index, (table, name) in enumerate(zip(_pumps(data), pump_names(data), strict=True)):
        if "library" in table:
            origin = f"demo library: {table['library']}"
        elif "file" in table:
            origin = f"file: {table['file']}"
        else:
            flows = table.get("flow")
            count = len(flows) if isinstance(flows, list) else 0
            units = f"{table.get('flow_unit', '?')}, {table.get('head_unit', '?')}"
            origin = f"{count} points ({units})"
        speed = table.get("speed", "") or _library_speed(table.get("library"))
        rows.append({"row": str(index), "name": name, "origin": origin, "speed": str(speed)})
    return rows


def _library_speed(name: Any) -> str:
    """The speed of a bundled demo curve, e.g. "2900 rpm" ("" when there is none)."""
    import pump_data

    try:
        return f"{number_text(pump_data.load(str(name)).speed_rpm)} rpm" if name else ""
    except CaseError:
        return ""


def _explicit_arrangements(data: dict[str, Any]) -> list[dict[str, Any]]:
    """The arrangement tables, made explicit (each pump alone) when the case has none."""
    raw = data.get("arrangement")
    if isinstance(raw, list):
        return raw
    tables: list[dict[str, Any]] = [{"pump": name} for name in pump_names(data)]
    data["arrangement"] = tables
    return tables


def rename_pump(data: dict[str, Any], index: int, new_name: Any) -> dict[str, Any]:
    """The case with pump `index` renamed; arrangements follow the new name."""
    result = copy.deepcopy(data)
    pumps = _pumps(result)
    if not 0 <= index < len(pumps):
        return result
    old = pump_names(result)[index]
    text = "" if new_name is None else str(new_name).strip()
    if not text:
        pumps[index].pop("name", None)
        text = pump_names(result)[index]
    else:
        pumps[index]["name"] = text
    arrangements = result.get("arrangement")
    for table in arrangements if isinstance(arrangements, list) else []:
        if not isinstance(table, dict):
            continue
        if table.get("pump") == old:
            table["pump"] = text
        if isinstance(table.get("pumps"), list):
            table["pumps"] = [text if n == old else n for n in table["pumps"]]
    return result


def delete_pump(data: dict[str, Any], index: int) -> dict[str, Any]:
    """The case without pump `index` and without the arrangements that use it."""
    result = copy.deepcopy(data)
    pumps = _pumps(result)
    if not 0 <= index < len(pumps):
        return result
    name = pump_names(result)[index]
    result["pump"] = [p for i, p in enumerate(pumps) if i != index]
    arrangements = result.get("arrangement")
    if isinstance(arrangements, list):
        result["arrangement"] = [
            a
            for a in arrangements
            if not (
                isinstance(a, dict) and (a.get("pump") == name or name in (a.get("pumps") or []))
            )
        ]
    if not result["pump"]:
        result.pop("pump")
        result.pop("arrangement", None)
    return result


def add_pump(data: dict[str, Any], table: dict[str, Any]) -> dict[str, Any]:
    """The case with a new ``[[pump]]`` (its name made unique) running alone."""
    result = copy.deepcopy(data)
    existing = pump_names(result)
    table = dict(table)
    table["name"] = _unique(existing, str(table.get("name") or table.get("library") or "pump"))
    pumps = result.get("pump")
    if not isinstance(pumps, list):
        pumps = []
        result["pump"] = pumps
    pumps.append(table)
    if isinstance(result.get("arrangement"), list):
        result["arrangement"].append({"pump": table["name"]})
    return result


def library_table(library_name: str) -> dict[str, Any]:
    """A ``[[pump]]`` table that names a bundled demo curve."""
    return {"name": library_name, "library": library_name}


def _rounded(values: list[float]) -> list[float | None]:
    return [None if math.isnan(v) else float(f"{v:.10g}") for v in values]


def curve_table(curve: Any, flow_unit: str, head_unit: str) -> dict[str, Any]:
    """A ``[[pump]]`` table of points from a `PumpCurve` (values in the given units)."""
    flow_factor = unit_factor(flow_unit, "flow")
    head_factor = unit_factor(head_unit, "length")
    table: dict[str, Any] = {
        "name": curve.name,
        "speed": f"{number_text(curve.speed_rpm, 10)} rpm",
        "flow_unit": flow_unit,
        "head_unit": head_unit,
        "flow": _rounded([q / flow_factor for q in curve.flow]),
        "head": _rounded([h / head_factor for h in curve.head]),
    }
    if curve.efficiency is not None:
        table["efficiency"] = _rounded([100.0 * e for e in curve.efficiency])
    if curve.shaft_power is not None:
        table["power_unit"] = "kW"
        table["shaft_power"] = _rounded([p / 1000.0 for p in curve.shaft_power])
    if curve.npsh_required is not None:
        table["npsh_required"] = _rounded([n / head_factor for n in curve.npsh_required])
    return table


def uploaded_pump_table(text: str, system: str) -> tuple[dict[str, Any] | None, list[str]]:
    """A pump CSV file (syscurve pump curve format) as a ``[[pump]]`` table of points.

    Returns the table, or None and one message per problem in the file.
    """
    from syscurve.pumpcsv import read_pump_csv

    try:
        curve = read_pump_csv(text, "pump CSV")
    except CaseError as error:
        return None, [str(p) for p in error.problems]
    flow_unit, head_unit = ("L/s", "m") if system == "SI" else ("gpm", "ft")
    return curve_table(curve, flow_unit, head_unit), []


def _cells(line: str) -> list[str]:
    separator = "," if "," in line else ";" if ";" in line else None
    cells = line.split(separator) if separator else line.split()
    return [c.strip() for c in cells]


def pasted_pump_table(
    name: Any, speed: Any, flow_unit: str, head_unit: str, text: Any
) -> tuple[dict[str, Any] | None, list[str]]:
    """Pasted rows "flow, head[, efficiency %[, NPSH required]]" as a ``[[pump]]`` table.

    Cells are separated by commas, semicolons, tabs or spaces; a first line that does
    not start with a number is a header and skipped; efficiency and NPSH required may
    be blank on the zero-flow row. Returns the table, or None and the problems.
    """
    from syscurve.pump import PumpCurve

    problems: list[str] = []
    name_text = str(name or "").strip()
    if not name_text:
        problems.append("name: give the pump a name, e.g. booster C")
    speed_text = str(speed or "").strip()
    speed_value = float(speed_text) if is_number(speed_text) else None
    if speed_value is None or speed_value <= 0:
        problems.append(
            f"speed: expected the speed of the points in rpm, e.g. 2900; got {speed_text!r}"
        )
    rows: list[list[float | None]] = []
    lines = [
        ln for ln in str(text or "").splitlines() if ln.strip() and not ln.strip().startswith("#")
    ]
    for number, line in enumerate(lines, start=1):
        cells = _cells(line)
        if number == 1 and not is_number(cells[0]):
            continue
        if not 2 <= len(cells) <= 4:
            problems.append(
                f"line {number}: expected 2 to 4 values (flow, head, efficiency, NPSHr)"
            )
            continue
        values: list[float | None] = []
        for cell in cells:
            if cell == "":
                values.append(None)
            elif is_number(cell):
                values.append(float(cell))
            else:
                problems.append(f"line {number}: {cell!r} is not a number")
                values.append(None)
        rows.append(values + [None] * (4 - len(values)))
    if not rows:
        problems.append("points: paste rows of flow, head[, efficiency %[, NPSH required]]")
    if problems:
        return None, problems
    columns = list(zip(*rows, strict=True))
    flows, heads, efficiencies, npsh = (list(c) for c in columns)
    table: dict[str, Any] = {
        "name": name_text,
        "speed": f"{speed_text} rpm",
        "flow_unit": flow_unit,
        "head_unit": head_unit,
        "flow": flows,
        "head": heads,
    }
    if any(v is not None for v in efficiencies):
        table["efficiency"] = efficiencies
    if any(v is not None for v in npsh):
        table["npsh_required"] = npsh
    try:
        q, h = unit_factor(flow_unit, "flow"), unit_factor(head_unit, "length")
        nan = math.nan

        def si(values: list[Any], factor: float) -> list[float]:
            return [nan if v is None else v * factor for v in values]

        PumpCurve.from_points(
            name_text,
            speed_value or 1.0,
            si(flows, q),
            si(heads, h),
            None if "efficiency" not in table else si(efficiencies, 0.01),
            None,
            None if "npsh_required" not in table else si(npsh, h),
            key="points",
        )
    except CaseError as error:
        return None, [str(p) for p in error.problems]
    return table, []


# --- arrangements -----------------------------------------------------------------------


def _speed_text(raw: Any) -> str:
    if raw is None:
        return ""
    text = str(raw)
    match = re.match(r"^\s*([-+0-9.eE]+)\s*rpm\s*$", text)
    return match.group(1) if match else text


def arrangement_rows(data: dict[str, Any]) -> list[dict[str, Any]]:
    """One row per arrangement (each pump alone when the case lists none)."""
    raw = data.get("arrangement")
    tables = raw if isinstance(raw, list) else [{"pump": n} for n in pump_names(data)]
    rows = []
    for index, table in enumerate(tables):
        if not isinstance(table, dict):
            table = {}
        pumps = table.get("pumps")
        pump = " + ".join(map(str, pumps)) if isinstance(pumps, list) else table.get("pump", "")
        count = table.get("count", 1 if not isinstance(pumps, list) else len(pumps))
        connection = table.get("connection", "parallel" if (count != 1) else "single")
        rows.append(
            {
                "row": str(index),
                "name": str(table.get("name", "")),
                "automatic": automatic_name(table),
                "pump": str(pump),
                "count": count,
                "connection": str(connection) if count != 1 else "single",
                "speed": _speed_text(table.get("speed")),
            }
        )
    return rows


def automatic_name(table: dict[str, Any]) -> str:
    """The name the engine gives an arrangement without one (as `syscurve.pumpcase`)."""
    pumps = table.get("pumps")
    if isinstance(pumps, list):
        return " + ".join(map(str, pumps))
    pump, count = str(table.get("pump", "")), table.get("count", 1)
    connection = table.get("connection", "parallel")
    speed = table.get("speed")
    rpm = None
    if isinstance(speed, str) and re.match(r"^\s*[-+0-9.eE]+\s*rpm\s*$", speed):
        rpm = float(speed.split()[0])
    return arrangement_name(pump, count, connection, rpm, speed == "for-demand")


def _arrangement_value(column: str, value: Any) -> Any:
    text = "" if value is None else str(value).strip()
    if column == "count":
        return int(float(text)) if is_number(text) and float(text).is_integer() else (text or None)
    if column == "speed":
        if text == "":
            return None
        if is_number(text):
            return f"{text} rpm"
        compact = text.lower().replace(" ", "-").replace("_", "-")
        if compact in ("for-demand", "demand", "fordemand"):
            return "for-demand"
        return text
    if column == "connection":
        return None if text in ("", "single") else text
    return text or None


def apply_arrangement_edit(
    data: dict[str, Any], index: int, column: str, value: Any
) -> dict[str, Any]:
    """The case with one cell of the arrangement grid written back."""
    result = copy.deepcopy(data)
    tables = _explicit_arrangements(result)
    if not 0 <= index < len(tables) or not isinstance(tables[index], dict):
        return result
    table = tables[index]
    if column == "pump":
        text = "" if value is None else str(value)
        table.pop("pump", None)
        table.pop("pumps", None)
        if " + " in text:
            table["pumps"] = [n.strip() for n in text.split(" + ")]
            table.pop("count", None)
        else:
            table["pump"] = text.strip()
        return result
    stored = _arrangement_value(column, value)
    if column not in ("name", "count", "connection", "speed"):
        return result
    if stored is None:
        table.pop(column, None)
    else:
        table[column] = stored
    if column == "count" and stored in (1, None):
        table.pop("connection", None)
    if column == "count" and isinstance(stored, int) and stored > 1:
        table.setdefault("connection", "parallel")
    return result


def add_arrangement(data: dict[str, Any]) -> dict[str, Any]:
    """The case with one more arrangement: the first pump, two in parallel."""
    result = copy.deepcopy(data)
    names = pump_names(result)
    tables = _explicit_arrangements(result)
    if names:
        tables.append({"pump": names[0], "count": 2, "connection": "parallel"})
    return result


def delete_arrangement(data: dict[str, Any], index: int) -> dict[str, Any]:
    """The case without arrangement `index` (an empty list: no pump runs)."""
    result = copy.deepcopy(data)
    tables = _explicit_arrangements(result)
    if 0 <= index < len(tables):
        tables.pop(index)
    return result
