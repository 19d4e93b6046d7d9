"""The pumps block of the editor: sources of curves, the pumps, the arrangements."""

from __future__ import annotations

from typing import Any

import dash_ag_grid as dag
from dash import dcc, html

from . import ids
from .components import GRID_OPTIONS, arrangement_columns, button, pump_columns
from .pumpsview import (
    FLOW_UNITS,
    HEAD_UNITS,
    POINT_UNITS,
    SPEED_HINT,
    arrangement_rows,
    pump_names,
    pump_rows,
)
from .viewmodel import system_of


def _points_entry(system: str) -> html.Div:
    """Name, speed, units and a text area for pasted points (units of `system` first)."""
    flow_unit, head_unit = POINT_UNITS[system]
    return html.Div(
        [
            html.H4("Enter or paste points"),
            html.Div(
                [
                    dcc.Input(
                        id=ids.POINTS_NAME,
                        type="text",
                        placeholder="pump name",
                        className="field-input",
                        debounce=False,
                    ),
                    dcc.Input(
                        id=ids.POINTS_SPEED,
                        type="text",
                        placeholder="speed, rpm",
                        className="field-input short",
                    ),
                    dcc.Dropdown(
                        id=ids.POINTS_FLOW_UNIT,
                        clearable=False,
                        searchable=False,
                        options=[{"label": f"flow {a}", "value": b} for a, b in FLOW_UNITS],
                        value=flow_unit,
                        className="dropdown short",
                    ),
                    dcc.Dropdown(
                        id=ids.POINTS_HEAD_UNIT,
                        clearable=False,
                        searchable=False,
                        options=[{"label": f"head {a}", "value": b} for a, b in HEAD_UNITS],
                        value=head_unit,
                        className="dropdown short",
                    ),
                ],
                className="inline-inputs",
            ),
            dcc.Textarea(
                id=ids.POINTS_TEXT,
                placeholder="one point per line: flow, head, efficiency %, NPSH required\n"
                "0, 14.5, , \n1, 14.3, 25, 1.2\n...",
                className="points-text",
            ),
            html.Div([button(ids.POINTS_ADD, "Add pump from points")], className="button-row"),
            html.Div(id=ids.POINTS_MESSAGE, className="grid-message"),
        ],
        className="pump-source",
    )


def pump_block(data: dict[str, Any], library: list[str]) -> html.Details:
    """Pumps: sources of curves, the pumps in the case, and the arrangements to test."""
    sources = html.Div(
        [
            html.Div(
                [
                    html.H4("From the demo library (invented curves)"),
                    html.Div(
                        [
                            dcc.Dropdown(
                                id=ids.LIBRARY_PICK,
                                options=library,
                                value=library[0] if library else None,
                                clearable=False,
                                className="dropdown",
                            ),
                            button(ids.LIBRARY_ADD, "Add"),
                        ],
                        className="inline-inputs",
                    ),
                    html.H4("Upload a pump CSV (syscurve pump curve format)"),
                    dcc.Upload(
                        id=ids.PUMP_UPLOAD,
                        children=html.Div("Drop a .csv here or click"),
                        className="upload",
                        multiple=False,
                    ),
                    html.Div(id=ids.PUMP_UPLOAD_MESSAGE, className="grid-message"),
                ],
                className="pump-source",
            ),
            _points_entry(system_of(data)),
        ],
        className="pump-sources",
    )
    pumps = dag.AgGrid(
        id=ids.PUMP_GRID,
        rowData=pump_rows(data),
        columnDefs=pump_columns(),
        defaultColDef={"resizable": True},
        getRowId="params.data.row",
        dashGridOptions=GRID_OPTIONS,
        style={"height": None},
        className="grid",
    )
    arrangements = dag.AgGrid(
        id=ids.ARRANGEMENT_GRID,
        rowData=arrangement_rows(data),
        columnDefs=arrangement_columns(pump_names(data), {}),
        defaultColDef={"editable": True, "resizable": True},
        getRowId="params.data.row",
        dashGridOptions=GRID_OPTIONS,
        style={"height": None},
        className="grid",
    )
    return html.Details(
        [
            html.Summary("Pumps and arrangements"),
            sources,
            html.H4("Pumps in the case"),
            html.Div([button(ids.PUMP_DELETE, "Delete selected pump")], className="button-row"),
            pumps,
            html.Div(id=ids.PUMP_MESSAGE, className="grid-message"),
            html.H4("Arrangements tested on the system"),
            html.Div(
                [
                    button(ids.ARRANGEMENT_ADD, "Add arrangement"),
                    button(ids.ARRANGEMENT_DELETE, "Delete selected"),
                    html.Span(f"Speed: {SPEED_HINT}.", className="hint"),
                ],
                className="button-row",
            ),
            arrangements,
            html.Div(id=ids.ARRANGEMENT_MESSAGE, className="grid-message"),
        ],
        open=True,
        className="block",
    )
