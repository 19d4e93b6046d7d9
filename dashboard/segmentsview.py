"""PURE: the route grid (one row per ``[[segment]]``) <-> the case dict.

Cells show values in display units, as the form does (`dashboard.viewmodel`); an
edit is written back to its key of the segment table. Fittings are one text cell,
"name: count, name: count", read into the fittings table; text that cannot be read
is kept as typed for the problem to be shown beside the cell.
"""

from __future__ import annotations

import copy
import re
from typing import Any

from .formspec import SEGMENT_COLUMNS, SEGMENT_COLUMNS_BY_KEY
from .viewmodel import display_of, get_path, is_number, number_text, shown_text, stored_value


def fittings_text(raw: Any) -> str:
    """A fittings table as "name: count, name: count" (counts without ".0")."""
    if isinstance(raw, dict):
        return ", ".join(
            f"{name}: {number_text(float(count)) if isinstance(count, (int, float)) else count}"
            for name, count in raw.items()
        )
    return "" if raw is None else str(raw)


def parse_fittings(text: str) -> dict[str, int | float] | str:
    """ "elbow-90: 6, gate-valve" -> {"elbow-90": 6, "gate-valve": 1}; the text itself
    when it cannot be read (the problem is then reported beside the cell)."""
    result: dict[str, int | float] = {}
    for item in re.split(r"[,;\n]", text):
        item = item.strip()
        if not item:
            continue
        match = re.match(r"^([A-Za-z][\w\-]*)\s*(?:[:=x×*]\s*(\S+))?$", item)
        if not match:
            return text
        name, count_text = match.group(1).lower(), match.group(2)
        if count_text is None:
            count: int | float = 1
        elif is_number(count_text):
            number = float(count_text)
            count = int(number) if number.is_integer() else number
        else:
            return text
        result[name] = result.get(name, 0) + count
    return result


def segment_rows(data: dict[str, Any]) -> list[dict[str, Any]]:
    """One grid row per ``[[segment]]``, values in display units; "row" is the index."""
    display = display_of(data)
    segments = data.get("segment")
    rows = []
    for index, table in enumerate(segments if isinstance(segments, list) else []):
        if not isinstance(table, dict):
            table = {}
        row: dict[str, Any] = {"row": str(index), "number": index + 1}
        for column in SEGMENT_COLUMNS:
            raw = table.get(column.key)
            if column.key == "fittings":
                row[column.key] = fittings_text(raw)
            elif column.key == "suction":
                row[column.key] = bool(raw) if isinstance(raw, bool) else False
            else:
                row[column.key] = shown_text(raw, column.parse, column.display, display)
        rows.append(row)
    return rows


def _segments(data: dict[str, Any]) -> list[Any]:
    segments = data.get("segment")
    if not isinstance(segments, list):
        segments = []
        data["segment"] = segments
    return segments


def apply_segment_edit(data: dict[str, Any], index: int, column: str, value: Any) -> dict[str, Any]:
    """The case with one cell of the route grid written back."""
    result = copy.deepcopy(data)
    segments = _segments(result)
    if not 0 <= index < len(segments) or column not in SEGMENT_COLUMNS_BY_KEY:
        return result
    table = segments[index]
    spec = SEGMENT_COLUMNS_BY_KEY[column]
    if column == "suction":
        stored: Any = True if value in (True, "true", "True", "yes", 1) else None
    elif column == "fittings":
        text = "" if value is None else str(value)
        stored = parse_fittings(text) if text.strip() else None
    else:
        stored = stored_value(value, spec.parse, spec.display, display_of(result))
    if column == "name":
        _rename_in_sizing(result, table.get("name"), stored)
    if stored is None:
        table.pop(column, None)
    else:
        table[column] = stored
    return result


def _rename_in_sizing(data: dict[str, Any], old: Any, new: Any) -> None:
    names = get_path(data, ("sizing", "segments"))
    if isinstance(names, list) and isinstance(old, str) and isinstance(new, str):
        data["sizing"]["segments"] = [new if n == old else n for n in names]


def _unique_name(existing: list[str], stem: str) -> str:
    number = 1
    while f"{stem} {number}" in existing:
        number += 1
    return f"{stem} {number}"


def add_segment(data: dict[str, Any], after: int | None) -> tuple[dict[str, Any], int]:
    """The case with a new segment below `after` (at the end when None), and its index.

    The new segment copies the inside diameter and material of the one above it;
    its length is 100 m (or 300 ft).
    """
    result = copy.deepcopy(data)
    segments = _segments(result)
    display = display_of(result)
    position = len(segments) if after is None else min(max(after + 1, 0), len(segments))
    above = (
        segments[position - 1] if position > 0 and isinstance(segments[position - 1], dict) else {}
    )
    names = [s.get("name", "") for s in segments if isinstance(s, dict)]
    length = "100 m" if display.system == "SI" else "300 ft"
    new: dict[str, Any] = {"name": _unique_name(names, "segment"), "length": length}
    new["diameter"] = above.get("diameter", "100 mm" if display.system == "SI" else "4 in")
    new["material"] = above.get("material", "pvc")
    segments.insert(position, new)
    return result, position


def delete_segment(data: dict[str, Any], index: int) -> dict[str, Any]:
    """The case without segment `index` (its name leaves the sizing list too)."""
    result = copy.deepcopy(data)
    segments = _segments(result)
    if 0 <= index < len(segments):
        removed = segments.pop(index)
        names = get_path(result, ("sizing", "segments"))
        if isinstance(names, list) and isinstance(removed, dict):
            kept = [n for n in names if n != removed.get("name")]
            if kept:
                result["sizing"]["segments"] = kept
            else:
                result["sizing"].pop("segments")
    return result


def move_segment(data: dict[str, Any], index: int, step: int) -> tuple[dict[str, Any], int]:
    """The case with segment `index` moved by `step` (-1 up, +1 down), and its new index."""
    result = copy.deepcopy(data)
    segments = _segments(result)
    target = index + step
    if not (0 <= index < len(segments) and 0 <= target < len(segments)):
        return result, index
    segments[index], segments[target] = segments[target], segments[index]
    return result, target
