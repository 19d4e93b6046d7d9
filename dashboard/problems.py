"""PURE: where each problem of a `CaseError` is shown.

The engine names every problem by its key path: ``delivery.demand``,
``segment[2].diameter``, ``segment[2].fittings.elbw``, ``arrangement[1].speed``,
``pump[3].flow``. A key of a form field goes beside that field; a key inside a
segment or an arrangement marks that cell and is listed under its grid; a pump's
problem is listed under the pump grid; the rest go to the general message area.
"""

from __future__ import annotations

import re
from typing import Any

from .formspec import FIELDS, SEGMENT_COLUMNS_BY_KEY
from .viewmodel import get_path

_INDEXED = re.compile(r"^(segment|arrangement|pump)\[(\d+)\](?:\.([A-Za-z_]+))?(?:\.(.*))?$")
_FIELD_IDS = {spec.key: spec.field_id for spec in FIELDS}
_ARRANGEMENT_COLUMNS = ("name", "pump", "count", "connection", "speed")
_COLUMN_ALIASES = {"pumps": "pump"}
FITTINGS_HINT = (
    "write fittings as name: count, separated by commas, e.g. elbow-90: 2, gate-valve: 1"
)


def empty_map() -> dict[str, Any]:
    """A problem map with nothing in it."""
    return {
        "fields": {},
        "segments": {},
        "segment_list": [],
        "pumps": [],
        "arrangements": {},
        "arrangement_list": [],
        "general": [],
    }


def _describe(what: str, number: int, column: str | None, data: dict[str, Any]) -> str:
    tables = data.get(what)
    name = None
    if (
        isinstance(tables, list)
        and 0 < number <= len(tables)
        and isinstance(tables[number - 1], dict)
    ):
        name = tables[number - 1].get("name")
    label = f"{what.capitalize()} {number}" + (f" ({name})" if name else "")
    if column is not None and what == "segment" and column in SEGMENT_COLUMNS_BY_KEY:
        label += f", {SEGMENT_COLUMNS_BY_KEY[column].name}"
    elif column is not None:
        label += f", {column}"
    return label


def problem_map(problems: list[tuple[str, str]], data: dict[str, Any]) -> dict[str, Any]:
    """Sort problems ``(key, message)`` to the places that show them.

    Returns
    -------
    dict
        ``fields``: field id -> messages; ``segments``: column -> row indices (from 0)
        in error; ``segment_list``: messages under the route grid; ``pumps``: messages
        under the pump grid; ``arrangements`` and ``arrangement_list`` likewise;
        ``general``: everything else.
    """
    result = empty_map()
    for key, message in problems:
        if key in _FIELD_IDS:
            result["fields"].setdefault(_FIELD_IDS[key], []).append(message)
            continue
        match = _INDEXED.match(key)
        if match is None:
            if key in ("segment", "sizing.segments"):
                result["segment_list"].append(message)
            elif key in ("pump", "arrangement"):
                result["pumps" if key == "pump" else "arrangement_list"].append(message)
            else:
                result["general"].append(f"{key}: {message}" if key else message)
            continue
        what, number_text, column, rest = match.groups()
        number = int(number_text)
        if what == "segment":
            if (
                column == "fittings"
                and rest is None
                and isinstance(get_path(data, ("segment",)), list)
            ):
                segment = data["segment"][number - 1] if number <= len(data["segment"]) else {}
                if isinstance(segment, dict) and isinstance(segment.get("fittings"), str):
                    message = FITTINGS_HINT
            label = _describe("segment", number, column, data)
            if rest is not None:
                label += f" {rest}"
            result["segment_list"].append(f"{label}: {message}")
            if column in SEGMENT_COLUMNS_BY_KEY:
                result["segments"].setdefault(column, []).append(number - 1)
        elif what == "arrangement":
            column = _COLUMN_ALIASES.get(column or "", column)
            result["arrangement_list"].append(
                f"{_describe('arrangement', number, column, data)}: {message}"
            )
            if column in _ARRANGEMENT_COLUMNS:
                result["arrangements"].setdefault(column, []).append(number - 1)
        else:
            label = _describe("pump", number, column, data)
            result["pumps"].append(f"{label}{' ' + rest if rest else ''}: {message}")
    return result


def cell_rule(rows: list[int]) -> str:
    """An AG Grid class-rule expression true for the given row indices."""
    return f"{sorted(set(rows))}.includes(params.node.rowIndex)"
