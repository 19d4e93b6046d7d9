"""PURE: values in the form and the route grid <-> the case dict.

The route grid has its own module, `dashboard.segmentsview`.

The case dict is exactly what a case file holds (README "The case file"): every
quantity a ``"value unit"`` string. The form shows numbers in the display units of
``[display].units``; an edit is written back as ``"<number> <display unit>"``. What a
user types is never thrown away: text with its own unit (``"3 in"``) is kept as
typed, and text that is not a number at all is kept too, for the engine to name
the problem beside the field.

Missing values of a few pump lists (NPSH required at zero flow) are NaN in the
engine and ``None`` in the dict held by the browser (JSON has no NaN): `for_engine`
turns them back.
"""

from __future__ import annotations

import copy
import math
import re
from collections.abc import Callable
from typing import Any

from syscurve.errors import CaseError
from syscurve.units import Display, parse_quantity, parse_temperature

from .formspec import FIELDS, FIXED_UNITS, FieldSpec

SYSTEMS = ("SI", "US")
_NUMBER = re.compile(r"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$")
_NUMBER_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")
_PUMP_LISTS = ("flow", "head", "efficiency", "npsh_required", "shaft_power")


# --- small helpers ----------------------------------------------------------------------


def system_of(data: dict[str, Any]) -> str:
    """The display system of the case ("SI" when missing or not understood)."""
    table = data.get("display")
    units = table.get("units") if isinstance(table, dict) else None
    return units if units in SYSTEMS else "SI"


def display_of(data: dict[str, Any]) -> Display:
    """The `Display` of the case's unit system."""
    return Display(system_of(data))


def unit_of(display_kind: str, display: Display) -> str:
    """The unit written into the case for a typed number of `display_kind`."""
    if display_kind in FIXED_UNITS:
        return FIXED_UNITS[display_kind][0]
    return display.unit(display_kind)


def label_of(display_kind: str, display: Display) -> str:
    """The unit label shown beside a value of `display_kind` ("" for plain numbers)."""
    if display_kind in FIXED_UNITS:
        return FIXED_UNITS[display_kind][1]
    return display.label(display_kind)


def number_text(value: float, digits: int = 6) -> str:
    """A number with at most `digits` significant figures and no trailing zeros."""
    if value != value or math.isinf(value):
        return str(value)
    if value == 0:
        return "0"
    text = f"{value:.{digits}g}"
    if "e" in text:
        mantissa, exponent = text.split("e")
        if -8 <= int(exponent) < 15:
            text = f"{value:.{max(digits - 1 - int(exponent), 0)}f}"
        else:
            return text
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return text


def is_number(text: str) -> bool:
    """True for text that is a plain number such as "3.2", "-1e3"."""
    return bool(_NUMBER.match(text))


def get_path(data: dict[str, Any], path: tuple[str, ...]) -> Any:
    """The value at a key path, or None."""
    node: Any = data
    for part in path:
        if not isinstance(node, dict) or part not in node:
            return None
        node = node[part]
    return node


def set_path(data: dict[str, Any], path: tuple[str, ...], value: Any) -> None:
    """Set (or, for None, remove) the value at a key path, creating tables on the way."""
    node = data
    for part in path[:-1]:
        child = node.get(part)
        if not isinstance(child, dict):
            if value is None:
                return
            child = {}
            node[part] = child
        node = child
    if value is None:
        node.pop(path[-1], None)
    else:
        node[path[-1]] = value


# --- one value: stored <-> shown --------------------------------------------------------


def _si_of(raw: str, parse: str, key: str) -> float:
    if parse == "temperature":
        return parse_temperature(raw, key)
    return parse_quantity(raw, "length" if parse == "head_or_pressure" else parse, key)


def shown_text(raw: Any, parse: str, display_kind: str, display: Display) -> str:
    """How a stored value appears in an input: a number in display units where possible.

    A value stored in the display unit keeps its own digits ("3.2 L/s" shows "3.2");
    one in another unit of the same kind is converted; anything else (a head given
    for a pressure, text that does not parse) is shown as it stands.
    """
    if raw is None:
        return ""
    if parse in ("text", "choice"):
        return str(raw)
    if parse in ("number", "fittings", "boolean"):
        if isinstance(raw, bool):
            return str(raw).lower()
        if isinstance(raw, (int, float)):
            return number_text(float(raw))
        return str(raw)
    if not isinstance(raw, str):
        return str(raw)
    unit = unit_of(display_kind, display)
    match = _NUMBER_UNIT.match(raw)
    if match is None:
        return raw
    if match.group(2) == unit:
        return match.group(1)
    if display_kind in FIXED_UNITS:
        return raw
    try:
        if parse == "head_or_pressure":
            si = parse_quantity(raw, "pressure", "")
        else:
            si = _si_of(raw, parse, "")
    except CaseError:
        return raw
    return number_text(float(display.value(display_kind, si)))


def stored_value(text: Any, parse: str, display_kind: str, display: Display) -> Any:
    """What an edit writes into the case: None (remove) for a blank.

    A plain number becomes ``"<number> <display unit>"`` for quantities and a float
    for plain numbers; text that carries a unit, or that is not a number, is kept.
    """
    if text is None:
        return None
    if isinstance(text, bool):
        return text
    if isinstance(text, (int, float)):
        text = number_text(float(text), 12)
    text = str(text).strip()
    if text == "":
        return None
    if parse in ("text", "choice"):
        return text
    if parse == "number":
        if is_number(text):
            value = float(text)
            return int(value) if value.is_integer() and "." not in text else value
        return text
    unit = unit_of(display_kind, display)
    if is_number(text) and unit:
        return f"{text} {unit}"
    return text


# --- the form ---------------------------------------------------------------------------


def field_text(data: dict[str, Any], spec: FieldSpec, display: Display) -> str:
    """The text of one field for the case as it stands."""
    raw = get_path(data, spec.path)
    if raw is None and spec.parse == "choice":
        return spec.default
    return shown_text(raw, spec.parse, spec.display, display)


def form_values(data: dict[str, Any]) -> dict[str, str]:
    """Field id -> the text each input shows."""
    display = display_of(data)
    return {spec.field_id: field_text(data, spec, display) for spec in FIELDS}


def unit_labels(data: dict[str, Any]) -> dict[str, str]:
    """Field id -> the unit label beside it."""
    display = display_of(data)
    return {spec.field_id: label_of(spec.display, display) for spec in FIELDS}


def visible_fields(data: dict[str, Any]) -> dict[str, bool]:
    """Field id -> whether the field belongs to the case as it stands."""
    return {spec.field_id: spec.applies(data) for spec in FIELDS}


def prune_inactive(data: dict[str, Any]) -> None:
    """Remove values of fields that no longer apply (after the liquid or outlet changed)."""
    for spec in FIELDS:
        if not spec.applies(data):
            set_path(data, spec.path, None)


def apply_form(data: dict[str, Any], values: dict[str, Any]) -> dict[str, Any] | None:
    """Write the fields whose text differs from what the case shows; None: no change.

    Choice fields go first so that a new liquid kind or outlet decides which of the
    other fields apply; values of fields that no longer apply are removed.
    """
    display = display_of(data)
    result = copy.deepcopy(data)
    changed = False
    ordered = sorted(FIELDS, key=lambda s: s.parse != "choice")
    for spec in ordered:
        if spec.field_id not in values or not spec.applies(result):
            continue
        text = values[spec.field_id]
        shown = field_text(result, spec, display)
        if ("" if text is None else str(text)) == shown:
            continue
        set_path(result, spec.path, stored_value(text, spec.parse, spec.display, display))
        changed = True
        if spec.parse == "choice":
            prune_inactive(result)
    return result if changed else None


def set_units(data: dict[str, Any], system: str) -> dict[str, Any]:
    """The case with ``[display].units`` set to `system` ("SI" or "US")."""
    result = copy.deepcopy(data)
    set_path(result, ("display", "units"), system)
    return result


# --- what the engine reads --------------------------------------------------------------


def _map_pump_lists(data: dict[str, Any], change: Callable[[Any], Any]) -> dict[str, Any]:
    """A copy of the case with `change` applied to every value of every pump list."""
    result = copy.deepcopy(data)
    pumps = result.get("pump")
    for table in pumps if isinstance(pumps, list) else []:
        if not isinstance(table, dict):
            continue
        for name in _PUMP_LISTS:
            values = table.get(name)
            if isinstance(values, list):
                table[name] = [change(v) for v in values]
    return result


def for_engine(data: dict[str, Any]) -> dict[str, Any]:
    """The case dict as the engine and a TOML file take it (``None`` in pump lists -> NaN)."""
    return _map_pump_lists(data, lambda v: math.nan if v is None else v)


def for_store(data: dict[str, Any]) -> dict[str, Any]:
    """The case dict as the browser keeps it (JSON: NaN in pump lists -> ``None``)."""
    return _map_pump_lists(data, lambda v: None if isinstance(v, float) and math.isnan(v) else v)
