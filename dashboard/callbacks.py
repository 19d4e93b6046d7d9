"""Thin callbacks: unpack what the browser sent, call the pure modules, return outputs.

The state is the case dict in ``case-store``. Four callbacks change it (form
fields, route grid, pumps and arrangements, loading and units), one renders
everything that follows from it, and three make the files to download. The page
starts with what `render` gives for the initial case (`initial_values`), so it
shows results without a round trip. `register` attaches the callbacks to an app
(callbacks are per app, so that several apps can live in one process, as in the
tests).
"""

from __future__ import annotations

from typing import Any

from dash import Dash, Input, Output, State, ctx, no_update

from . import actions, components, ids
from .files import case_toml, file_stem, plot_file, table_file
from .formspec import FIELDS
from .layout import field_class
from .pumpsview import pump_names
from .resultsview import update
from .viewmodel import apply_form, display_of, visible_fields

FIELD_IDS = [spec.field_id for spec in FIELDS]
#: Fields in the form blocks (the title sits in the header, without unit or wrapper).
FORM_FIELDS = [spec for spec in FIELDS if spec.section != "header"]
FORM_IDS = [spec.field_id for spec in FORM_FIELDS]


def _or_keep(value: Any) -> Any:
    return no_update if value is None else value


def _trigger() -> str | None:
    triggered = ctx.triggered_id
    return triggered if isinstance(triggered, str) else None


def edit_fields(*args: Any) -> Any:
    """A form field changed: write the changed values into the case."""
    *values, data = args
    new = apply_form(data, dict(zip(FIELD_IDS, values, strict=True)))
    return _or_keep(new)


def edit_segments(
    changes: Any, _add: int, _delete: int, _up: int, _down: int, data: dict, selected: Any
) -> tuple[Any, Any, Any, Any]:
    """A route-grid cell or button: the new case, grid rows, selection and a message."""
    result = actions.segment_action(data, _trigger(), changes, selected)
    message = result["message"]
    return (
        _or_keep(result["data"]),
        _or_keep(result["rows"]),
        _or_keep(result["selected"]),
        no_update if message is None else components.messages(message),
    )


def edit_pumps(*args: Any) -> tuple[Any, ...]:
    """A pump or arrangement action: the new case, the grids and the messages."""
    (
        _lib,
        _points,
        upload,
        _delete,
        pump_changes,
        arrangement_changes,
        _add,
        _remove,
        data,
        library,
        name,
        speed,
        flow_unit,
        head_unit,
        text,
        filename,
        pump_selected,
        arrangement_selected,
    ) = args
    inputs = {
        "library": library,
        "points": (name, speed, flow_unit, head_unit, text),
        "upload": (upload, filename),
        "pump_changes": pump_changes,
        "arrangement_changes": arrangement_changes,
        "pump_selected": pump_selected,
        "arrangement_selected": arrangement_selected,
    }
    result = actions.pump_action(data, _trigger(), inputs)
    points, uploaded = result["points_message"], result["upload_message"]
    return (
        _or_keep(result["data"]),
        _or_keep(result.get("pump_rows")),
        _or_keep(result.get("arrangement_rows")),
        no_update if points is None else components.messages(points, "note"),
        no_update if uploaded is None else components.messages(uploaded, "note"),
        None if _trigger() == ids.PUMP_UPLOAD else no_update,  # the same file may come again
    )


def make_load_case(demo: dict[str, Any]) -> Any:
    """The callback that switches units, opens a case file or loads the demo."""

    def load_case(
        units: str, upload: Any, _demo: int, data: dict, filename: str
    ) -> tuple[Any, ...]:
        trigger = _trigger()
        result = actions.load_action(data, trigger, units, (upload, filename), demo)
        message = components.messages(result["message"], "note") if result["message"] else []
        again = None if trigger == ids.CASE_UPLOAD else no_update  # the same file may come again
        if result["data"] is None:
            keep = [no_update] * (len(FIELD_IDS) + len(FORM_IDS) + 6)
            return (no_update, *keep, message, again)
        return (
            result["data"],
            *[result["fields"][i] for i in FIELD_IDS],
            *[result["units"][i] for i in FORM_IDS],
            result["system"],
            result["segment_rows"],
            result["pump_rows"],
            result["arrangement_rows"],
            *result["point_units"],
            message,
            again,
        )

    return load_case


#: What `render` fills in, in its order: (component id, property).
RENDER_OUTPUTS: list[tuple[str, str]] = [
    *[(ids.message_id(i), "children") for i in FIELD_IDS],
    *[(ids.row_id(i), "className") for i in FORM_IDS],
    (ids.GENERAL_MESSAGE, "children"),
    (ids.SEGMENT_MESSAGE, "children"),
    (ids.SEGMENT_GRID, "columnDefs"),
    (ids.PUMP_MESSAGE, "children"),
    (ids.ARRANGEMENT_MESSAGE, "children"),
    (ids.ARRANGEMENT_GRID, "columnDefs"),
    (ids.STALE_NOTE, "children"),
    (ids.RESULTS_PANEL, "className"),
    (ids.VERDICT, "children"),
    (ids.VERDICT, "className"),
    (ids.SYSTEM_PLOT, "figure"),
    (ids.SCENARIO_TABLE, "children"),
    (ids.SEGMENT_RESULTS_TITLE, "children"),
    (ids.SEGMENT_RESULTS, "children"),
    (ids.OPERATING_GRID, "rowData"),
    (ids.OPERATING_GRID, "columnDefs"),
    (ids.WARNINGS, "children"),
    (ids.CAUTIONS, "children"),
    (ids.GOOD_STORE, "data"),
    (ids.DOWNLOAD_MESSAGE, "children"),
]


def initial_values(data: dict[str, Any]) -> dict[tuple[str, str], Any]:
    """What the page shows for `data` before any edit: `render`'s values by output."""
    values = dict(zip(RENDER_OUTPUTS, render(data), strict=True))
    return {key: value for key, value in values.items() if value is not no_update}


def render(data: dict[str, Any]) -> tuple[Any, ...]:
    """The case changed: recompute and redraw, or mark the results out of date."""
    view = update(data)
    problems = view["problems"]
    visible = visible_fields(data)
    common = (
        *components.field_messages(view, FIELD_IDS),
        *[field_class(visible[spec.field_id], spec) for spec in FORM_FIELDS],
        components.messages(problems["general"]),
        components.messages(problems["segment_list"]),
        components.segment_columns(display_of(data), problems["segments"]),
        components.messages(problems["pumps"]),
        components.messages(problems["arrangement_list"]),
        components.arrangement_columns(pump_names(data), problems["arrangements"]),
        components.stale_note(view["ok"]),
        "results" if view["ok"] else "results stale",
    )
    if not view["ok"]:
        return (*common, *[no_update] * 12)
    shown = components.results(view)
    return (
        *common,
        shown["verdict"],
        shown["verdict_class"],
        shown["figure"],
        shown["scenarios"],
        shown["segments_title"],
        shown["segments"],
        shown["operating_rows"],
        shown["operating_columns"],
        shown["warnings"],
        shown["cautions"],
        data,
        [],
    )


def save_case(_clicks: int, data: dict) -> tuple[Any, Any]:
    """The case as a TOML download (or a message saying why it cannot be written)."""
    try:
        return {"content": case_toml(data), "filename": f"{file_stem(data)}.toml"}, []
    except Exception as error:  # never a traceback
        message = f"the case could not be written as TOML ({type(error).__name__}: {error})"
        return no_update, components.messages([message])


def download_table(_csv: int, _xlsx: int, good: dict) -> tuple[Any, Any]:
    """The operating-point table of the last valid case, as CSV or XLSX."""
    return _download(table_file, good, "csv" if _trigger() == ids.DOWNLOAD_CSV else "xlsx")


def download_plot(_png: int, _html: int, good: dict) -> tuple[Any, Any]:
    """The plot of the last valid case, as PNG or self-contained HTML."""
    return _download(plot_file, good, "png" if _trigger() == ids.DOWNLOAD_PNG else "html")


def _download(make: Any, data: dict, kind: str) -> tuple[Any, Any]:
    import base64

    try:
        name, content = make(data, kind)
    except Exception as error:  # a missing browser for PNG, say: a message, no traceback
        return no_update, f"could not make the {kind.upper()} file: {type(error).__name__}: {error}"
    encoded = base64.b64encode(content).decode("ascii")
    return {"content": encoded, "filename": name, "base64": True}, ""


def register(app: Dash, demo: dict[str, Any]) -> None:
    """Attach every callback to `app`; `demo` is what the "Demo case" button loads."""
    store = Output(ids.CASE_STORE, "data", allow_duplicate=True)
    app.callback(
        store,
        [Input(i, "value") for i in FIELD_IDS],
        State(ids.CASE_STORE, "data"),
        prevent_initial_call=True,
    )(edit_fields)
    app.callback(
        store,
        Output(ids.SEGMENT_GRID, "rowData", allow_duplicate=True),
        Output(ids.SEGMENT_GRID, "selectedRows", allow_duplicate=True),
        Output(ids.SEGMENT_MESSAGE, "children", allow_duplicate=True),
        Input(ids.SEGMENT_GRID, "cellValueChanged"),
        *[
            Input(i, "n_clicks")
            for i in (ids.SEGMENT_ADD, ids.SEGMENT_DELETE, ids.SEGMENT_UP, ids.SEGMENT_DOWN)
        ],
        State(ids.CASE_STORE, "data"),
        State(ids.SEGMENT_GRID, "selectedRows"),
        prevent_initial_call=True,
    )(edit_segments)
    app.callback(
        store,
        Output(ids.PUMP_GRID, "rowData", allow_duplicate=True),
        Output(ids.ARRANGEMENT_GRID, "rowData", allow_duplicate=True),
        Output(ids.POINTS_MESSAGE, "children"),
        Output(ids.PUMP_UPLOAD_MESSAGE, "children"),
        Output(ids.PUMP_UPLOAD, "contents"),
        Input(ids.LIBRARY_ADD, "n_clicks"),
        Input(ids.POINTS_ADD, "n_clicks"),
        Input(ids.PUMP_UPLOAD, "contents"),
        Input(ids.PUMP_DELETE, "n_clicks"),
        Input(ids.PUMP_GRID, "cellValueChanged"),
        Input(ids.ARRANGEMENT_GRID, "cellValueChanged"),
        Input(ids.ARRANGEMENT_ADD, "n_clicks"),
        Input(ids.ARRANGEMENT_DELETE, "n_clicks"),
        State(ids.CASE_STORE, "data"),
        *[
            State(i, "value")
            for i in (
                ids.LIBRARY_PICK,
                ids.POINTS_NAME,
                ids.POINTS_SPEED,
                ids.POINTS_FLOW_UNIT,
                ids.POINTS_HEAD_UNIT,
                ids.POINTS_TEXT,
            )
        ],
        State(ids.PUMP_UPLOAD, "filename"),
        State(ids.PUMP_GRID, "selectedRows"),
        State(ids.ARRANGEMENT_GRID, "selectedRows"),
        prevent_initial_call=True,
    )(edit_pumps)
    app.callback(
        store,
        *[Output(i, "value") for i in FIELD_IDS],
        *[Output(ids.unit_id(i), "children") for i in FORM_IDS],
        Output(ids.UNITS_SWITCH, "value"),
        Output(ids.SEGMENT_GRID, "rowData", allow_duplicate=True),
        Output(ids.PUMP_GRID, "rowData", allow_duplicate=True),
        Output(ids.ARRANGEMENT_GRID, "rowData", allow_duplicate=True),
        Output(ids.POINTS_FLOW_UNIT, "value"),
        Output(ids.POINTS_HEAD_UNIT, "value"),
        Output(ids.CASE_UPLOAD_MESSAGE, "children"),
        Output(ids.CASE_UPLOAD, "contents"),
        Input(ids.UNITS_SWITCH, "value"),
        Input(ids.CASE_UPLOAD, "contents"),
        Input(ids.LOAD_DEMO, "n_clicks"),
        State(ids.CASE_STORE, "data"),
        State(ids.CASE_UPLOAD, "filename"),
        prevent_initial_call=True,
    )(make_load_case(demo))
    app.callback(
        *[
            Output(i, prop, allow_duplicate=(i, prop) == (ids.DOWNLOAD_MESSAGE, "children"))
            for i, prop in RENDER_OUTPUTS
        ],
        Input(ids.CASE_STORE, "data"),
        prevent_initial_call=True,  # the layout starts with these values (`initial_values`)
    )(render)
    app.callback(
        Output(ids.SAVE_CASE_DOWNLOAD, "data"),
        Output(ids.CASE_UPLOAD_MESSAGE, "children", allow_duplicate=True),
        Input(ids.SAVE_CASE, "n_clicks"),
        State(ids.CASE_STORE, "data"),
        prevent_initial_call=True,
    )(save_case)
    app.callback(
        Output(ids.TABLE_DOWNLOAD, "data"),
        Output(ids.DOWNLOAD_MESSAGE, "children", allow_duplicate=True),
        Input(ids.DOWNLOAD_CSV, "n_clicks"),
        Input(ids.DOWNLOAD_XLSX, "n_clicks"),
        State(ids.GOOD_STORE, "data"),
        prevent_initial_call=True,
    )(download_table)
    app.callback(
        Output(ids.PLOT_DOWNLOAD, "data"),
        Output(ids.DOWNLOAD_MESSAGE, "children", allow_duplicate=True),
        Input(ids.DOWNLOAD_PNG, "n_clicks"),
        Input(ids.DOWNLOAD_HTML, "n_clicks"),
        State(ids.GOOD_STORE, "data"),
        prevent_initial_call=True,
    )(download_plot)
