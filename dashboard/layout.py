"""The page: a header, the editor on the left and the results on the right.

Every function returns a component tree for the case it is given; the callbacks
then keep the components in step with the case held in the browser.
"""

from __future__ import annotations

from typing import Any

import dash_ag_grid as dag
from dash import dcc, html

from . import ids
from .components import GRID_OPTIONS, button, fittings_help, segment_columns
from .formspec import FIELDS, FIELDS_BY_KEY, SECTIONS, FieldSpec
from .pumplayout import pump_block
from .segmentsview import segment_rows
from .viewmodel import display_of, form_values, system_of, unit_labels, visible_fields


def _field_input(spec: FieldSpec, value: str) -> Any:
    if spec.parse == "choice" and len(spec.choices) <= 3:
        return dcc.RadioItems(
            id=spec.field_id,
            options=[{"label": c, "value": c} for c in spec.choices],
            value=value,
            inline=True,
            className="choice",
        )
    if spec.parse == "choice":
        return dcc.Dropdown(
            id=spec.field_id,
            options=[{"label": c, "value": c} for c in spec.choices],
            value=value,
            clearable=False,
            searchable=False,
            className="dropdown",
        )
    return dcc.Input(
        id=spec.field_id,
        type="text",
        value=value,
        debounce=True,
        autoComplete="off",
        className="field-input",
    )


def field_row(spec: FieldSpec, value: str, unit: str, visible: bool) -> html.Div:
    """Label, input with its unit, a note and the message line of one field."""
    return html.Div(
        [
            html.Label(spec.label, htmlFor=spec.field_id, className="field-label"),
            html.Div(
                [
                    _field_input(spec, value),
                    html.Span(unit, id=ids.unit_id(spec.field_id), className="unit"),
                ],
                className="field-control",
            ),
            html.Div(spec.note, className="field-note") if spec.note else None,
            html.Div(id=ids.message_id(spec.field_id), className="field-message"),
        ],
        id=ids.row_id(spec.field_id),
        className=field_class(visible, spec),
    )


def field_class(visible: bool, spec: FieldSpec) -> str:
    """CSS class of a field's wrapper: wide for text, hidden when it does not apply."""
    radio = spec.parse == "choice" and len(spec.choices) <= 3
    wide = " wide" if spec.parse == "text" or (radio and len(spec.choices) > 2) else ""
    return "field" + wide + ("" if visible else " hidden")


def form_sections(data: dict[str, Any]) -> list[Any]:
    """The form, one block per section of `dashboard.formspec`."""
    values, units, visible = form_values(data), unit_labels(data), visible_fields(data)
    blocks = []
    for section in SECTIONS:
        rows = [
            field_row(spec, values[spec.field_id], units[spec.field_id], visible[spec.field_id])
            for spec in FIELDS
            if spec.section == section
        ]
        blocks.append(
            html.Details(
                [html.Summary(section), html.Div(rows, className="fields")],
                open=True,
                className="block",
            )
        )
    return blocks


def route_block(data: dict[str, Any]) -> html.Details:
    """The pipe route: the segment grid with its buttons, hints and messages."""
    grid = dag.AgGrid(
        id=ids.SEGMENT_GRID,
        rowData=segment_rows(data),
        columnDefs=segment_columns(display_of(data), {}),
        defaultColDef={"editable": True, "resizable": True, "sortable": False},
        getRowId="params.data.row",
        dashGridOptions=GRID_OPTIONS,
        style={"height": None},
        className="grid",
    )
    buttons = html.Div(
        [
            button(ids.SEGMENT_ADD, "Add below"),
            button(ids.SEGMENT_DELETE, "Delete"),
            button(ids.SEGMENT_UP, "Move up"),
            button(ids.SEGMENT_DOWN, "Move down"),
            html.Span(
                "Select a row, then act on it. Double-click a cell to edit.", className="hint"
            ),
        ],
        className="button-row",
    )
    return html.Details(
        [
            html.Summary("Pipe route, from the source"),
            buttons,
            grid,
            html.Div(id=ids.SEGMENT_MESSAGE, className="grid-message"),
            html.P(
                "Inside diameter. Roughness blank: the material's. Suction segments come first "
                "(between the source and the pump inlet). End elevation on every segment turns "
                "on the pressure check along the route.",
                className="hint",
            ),
            fittings_help(),
        ],
        open=True,
        className="block",
    )


def header(data: dict[str, Any]) -> html.Header:
    """Name, case title, unit switch and the case file actions."""
    title_spec = FIELDS_BY_KEY["title"]
    return html.Header(
        [
            html.Div(
                [
                    html.Span("syscurve", className="brand"),
                    html.Span("system curves and gravity verdicts", className="tagline"),
                ],
                className="brand-block",
            ),
            html.Div(
                [
                    dcc.Input(
                        id=title_spec.field_id,
                        type="text",
                        debounce=True,
                        value=form_values(data)[title_spec.field_id],
                        className="title-input",
                        placeholder="case title",
                    ),
                    html.Div(id=ids.message_id(title_spec.field_id), className="field-message"),
                ],
                className="title-block",
            ),
            dcc.RadioItems(
                id=ids.UNITS_SWITCH,
                options=[{"label": "SI", "value": "SI"}, {"label": "US customary", "value": "US"}],
                value=system_of(data),
                inline=True,
                className="units-switch",
            ),
            html.Div(
                [
                    dcc.Upload(
                        html.Button("Open case…", className="button"),
                        id=ids.CASE_UPLOAD,
                        multiple=False,
                        className="upload-button",
                    ),
                    button(ids.SAVE_CASE, "Save case (TOML)"),
                    button(ids.LOAD_DEMO, "Demo case", "quiet"),
                    dcc.Download(id=ids.SAVE_CASE_DOWNLOAD),
                ],
                className="file-actions",
            ),
            html.Div(id=ids.CASE_UPLOAD_MESSAGE, className="header-message"),
        ],
        className="header",
    )


def results_panel() -> html.Section:
    """The results: verdict, plot, downloads, tables, warnings and cautions."""
    downloads = html.Div(
        [
            html.Span("Download:", className="hint"),
            button(ids.DOWNLOAD_PNG, "Plot PNG", "small"),
            button(ids.DOWNLOAD_HTML, "Plot HTML", "small"),
            button(ids.DOWNLOAD_CSV, "Operating points CSV", "small"),
            button(ids.DOWNLOAD_XLSX, "Operating points XLSX", "small"),
            dcc.Download(id=ids.PLOT_DOWNLOAD),
            dcc.Download(id=ids.TABLE_DOWNLOAD),
            html.Span(id=ids.DOWNLOAD_MESSAGE, className="hint"),
        ],
        className="button-row downloads",
    )
    operating = dag.AgGrid(
        id=ids.OPERATING_GRID,
        rowData=[],
        columnDefs=[],
        defaultColDef={"resizable": True, "sortable": True, "editable": False},
        dashGridOptions={"domLayout": "autoHeight", "tooltipShowDelay": 200},
        style={"height": None},
        className="grid",
    )
    return html.Section(
        [
            html.Div(id=ids.STALE_NOTE, className="stale-note"),
            html.Div(id=ids.GENERAL_MESSAGE, className="general-message"),
            html.Div(id=ids.VERDICT, className="verdict"),
            dcc.Graph(
                id=ids.SYSTEM_PLOT,
                config={"displaylogo": False, "responsive": True},
                className="plot",
                style={"height": "520px"},
            ),
            downloads,
            html.H3("Scenarios"),
            html.Div(id=ids.SCENARIO_TABLE, className="table-wrap"),
            html.H3(id=ids.SEGMENT_RESULTS_TITLE, children="Segments at the demand"),
            html.Div(id=ids.SEGMENT_RESULTS, className="table-wrap"),
            html.H3("Operating points"),
            operating,
            html.H3("Warnings"),
            html.Div(id=ids.WARNINGS, className="warnings"),
            html.H3("Cautions"),
            html.Div(id=ids.CAUTIONS, className="cautions"),
        ],
        id=ids.RESULTS_PANEL,
        className="results",
    )


def page(data: dict[str, Any], library: list[str]) -> html.Div:
    """The whole page for the case `data` (the store starts with it)."""
    return html.Div(
        [
            dcc.Store(id=ids.CASE_STORE, data=data),
            dcc.Store(id=ids.GOOD_STORE, data=data),
            header(data),
            html.Main(
                [
                    html.Section(
                        [*form_sections(data), route_block(data), pump_block(data, library)],
                        className="editor",
                    ),
                    results_panel(),
                ],
                className="workspace",
            ),
        ],
        className="page",
    )
