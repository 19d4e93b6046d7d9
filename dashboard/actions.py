"""PURE: what each user action does to the case, as the callbacks need it.

Each function takes the case dict and what the browser sent, and returns a dict of
the new case (``data``; None: unchanged) and the values of the components that
follow from it. The callbacks in `dashboard.callbacks` only unpack and pass on.
"""

from __future__ import annotations

from typing import Any

from . import ids
from .files import decode_upload, open_case
from .pumpsview import (
    POINT_UNITS,
    add_arrangement,
    add_pump,
    apply_arrangement_edit,
    arrangement_rows,
    delete_arrangement,
    delete_pump,
    library_table,
    pasted_pump_table,
    pump_rows,
    rename_pump,
    uploaded_pump_table,
)
from .segmentsview import (
    add_segment,
    apply_segment_edit,
    delete_segment,
    move_segment,
    segment_rows,
)
from .viewmodel import form_values, set_units, system_of, unit_labels


def selected_index(selected: Any) -> int | None:
    """The row index of the selected grid row (rows carry their index as "row")."""
    if isinstance(selected, list) and selected and isinstance(selected[0], dict):
        row: Any = selected[0].get("row")
        try:
            return int(row)
        except (TypeError, ValueError):
            return None
    return None


def _changes(changes: Any) -> list[tuple[int, str, Any]]:
    result = []
    for change in changes if isinstance(changes, list) else []:
        if not isinstance(change, dict):
            continue
        row: Any = change.get("rowId", change.get("rowIndex"))
        try:
            index = int(row)
        except (TypeError, ValueError):
            continue
        value = change.get("value", change.get("newValue"))
        result.append((index, str(change.get("colId")), value))
    return result


def unexpected(error: Exception) -> str:
    """A short message for an error no input should cause (no traceback)."""
    return f"unexpected problem ({type(error).__name__}: {error}); nothing was changed"


def segment_action(
    data: dict[str, Any], trigger: str | None, changes: Any, selected: Any
) -> dict[str, Any]:
    """Edit a cell, add, delete or move a segment.

    Returns ``data`` (the new case), ``rows`` (new grid rows, None: keep the grid as
    it is, e.g. after a cell edit), ``selected`` (rows to select, or None) and
    ``message`` (None, or what went wrong: the case is then left as it was).
    """
    try:
        return {**_segment_action(data, trigger, changes, selected), "message": None}
    except Exception as error:  # never a traceback
        return {"data": None, "rows": None, "selected": None, "message": [unexpected(error)]}


def _segment_action(
    data: dict[str, Any], trigger: str | None, changes: Any, selected: Any
) -> dict[str, Any]:
    index = selected_index(selected)
    if trigger == ids.SEGMENT_GRID:
        new = data
        for row, column, value in _changes(changes):
            new = apply_segment_edit(new, row, column, value)
        return {"data": new, "rows": None, "selected": None}
    if trigger == ids.SEGMENT_ADD:
        new, position = add_segment(data, index)
    elif trigger == ids.SEGMENT_DELETE and index is not None:
        new, position = delete_segment(data, index), max(index - 1, 0)
    elif trigger in (ids.SEGMENT_UP, ids.SEGMENT_DOWN) and index is not None:
        new, position = move_segment(data, index, -1 if trigger == ids.SEGMENT_UP else 1)
    else:
        return {"data": None, "rows": None, "selected": None}
    rows = segment_rows(new)
    chosen = [r for r in rows if r["row"] == str(position)]
    return {"data": new, "rows": rows, "selected": chosen}


def pump_action(
    data: dict[str, Any], trigger: str | None, inputs: dict[str, Any]
) -> dict[str, Any]:
    """Add (library, points, CSV upload), rename or delete pumps; edit arrangements.

    `inputs` holds what the callback read: ``library``, ``points`` (name, speed,
    flow_unit, head_unit, text), ``upload`` (contents, filename), ``pump_changes``,
    ``arrangement_changes``, ``pump_selected``, ``arrangement_selected``.
    Returns ``data`` (None: unchanged), ``points_message``, ``upload_message``
    (None: leave as is) and, with a new case, ``pump_rows`` and ``arrangement_rows``.
    """
    try:
        return _pump_action(data, trigger, inputs)
    except Exception as error:  # never a traceback
        return {"data": None, "points_message": [unexpected(error)], "upload_message": None}


def _pump_action(
    data: dict[str, Any], trigger: str | None, inputs: dict[str, Any]
) -> dict[str, Any]:
    result: dict[str, Any] = {"data": None, "points_message": None, "upload_message": None}
    new: dict[str, Any] | None = None
    if trigger == ids.LIBRARY_ADD and inputs.get("library"):
        new = add_pump(data, library_table(inputs["library"]))
    elif trigger == ids.POINTS_ADD:
        table, problems = pasted_pump_table(*inputs["points"])
        result["points_message"] = problems
        if table is not None:
            new = add_pump(data, table)
            result["points_message"] = [f'added pump "{table["name"]}"']
    elif trigger == ids.PUMP_UPLOAD:
        contents, filename = inputs["upload"]
        text, message = decode_upload(contents, filename)
        if text is None:
            result["upload_message"] = [message]
        else:
            table, problems = uploaded_pump_table(text, system_of(data))
            if table is None:
                result["upload_message"] = [f"{filename} was not added:", *problems]
            else:
                new = add_pump(data, table)
                result["upload_message"] = [f'added pump "{table["name"]}" from {filename}']
    elif trigger == ids.PUMP_DELETE:
        index = selected_index(inputs.get("pump_selected"))
        if index is not None:
            new = delete_pump(data, index)
    elif trigger == ids.PUMP_GRID:
        new = data
        for row, column, value in _changes(inputs.get("pump_changes")):
            if column == "name":
                new = rename_pump(new, row, value)
    elif trigger == ids.ARRANGEMENT_GRID:
        new = data
        for row, column, value in _changes(inputs.get("arrangement_changes")):
            new = apply_arrangement_edit(new, row, column, value)
        result["data"] = new
        return result  # the grid already shows the edit
    elif trigger == ids.ARRANGEMENT_ADD:
        new = add_arrangement(data)
    elif trigger == ids.ARRANGEMENT_DELETE:
        index = selected_index(inputs.get("arrangement_selected"))
        if index is not None:
            new = delete_arrangement(data, index)
    if new is not None:
        result["data"] = new
        result["pump_rows"] = pump_rows(new)
        result["arrangement_rows"] = arrangement_rows(new)
    return result


def load_action(
    data: dict[str, Any],
    trigger: str | None,
    units: str | None,
    upload: tuple[str | None, str | None],
    demo: dict[str, Any],
) -> dict[str, Any]:
    """Switch units, open an uploaded case or load the demo; refill the whole editor.

    Returns ``data`` (None: unchanged), ``message`` (for the header) and, with a new
    case, ``fields`` (id -> text), ``units`` (id -> label), ``system``,
    ``segment_rows``, ``pump_rows``, ``arrangement_rows`` and ``point_units`` (the
    flow and head units offered for pasted points).
    """
    try:
        return _load_action(data, trigger, units, upload, demo)
    except Exception as error:  # never a traceback
        return {"data": None, "message": [unexpected(error)]}


def _load_action(
    data: dict[str, Any],
    trigger: str | None,
    units: str | None,
    upload: tuple[str | None, str | None],
    demo: dict[str, Any],
) -> dict[str, Any]:
    message: list[str] = []
    new: dict[str, Any] | None = None
    if trigger == ids.UNITS_SWITCH and units in ("SI", "US") and units != system_of(data):
        new = set_units(data, units)
    elif trigger == ids.CASE_UPLOAD:
        opened, problems = open_case(*upload)
        name = upload[1] or "the file"
        if opened is None:
            message = [f"{name} was not opened; the current case stays. What is wrong:", *problems]
        else:
            new = opened
            message = [f"opened {name}"]
    elif trigger == ids.LOAD_DEMO:
        new = demo
        message = ["loaded the demo case (invented)"]
    result: dict[str, Any] = {"data": new, "message": message}
    if new is not None:
        result.update(
            fields=form_values(new),
            units=unit_labels(new),
            system=system_of(new),
            segment_rows=segment_rows(new),
            pump_rows=pump_rows(new),
            arrangement_rows=arrangement_rows(new),
            point_units=POINT_UNITS[system_of(new)],
        )
    return result
