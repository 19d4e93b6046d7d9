"""Component trees the callbacks fill in: verdict, tables, messages, grid columns.

Functions here only arrange values that `dashboard.resultsview` and
`dashboard.problems` have already computed and formatted.
"""

from __future__ import annotations

from typing import Any

from dash import html

from syscurve.catalogue import FITTINGS, MATERIALS
from syscurve.units import Display

from .formspec import SEGMENT_COLUMNS
from .problems import cell_rule
from .viewmodel import label_of

INVALID_CELL = "cell-invalid"
GRID_OPTIONS = {
    "rowSelection": {"mode": "singleRow", "checkboxes": False, "enableClickSelection": True},
    "stopEditingWhenCellsLoseFocus": True,
    "domLayout": "autoHeight",
    "tooltipShowDelay": 300,
}


def button(button_id: str, text: str, kind: str = "") -> html.Button:
    """A plain button (n_clicks starts at 0)."""
    return html.Button(text, id=button_id, n_clicks=0, className=f"button {kind}".strip())


def messages(items: list[str], kind: str = "problem") -> list[Any]:
    """A list of messages (problems or notes) as paragraphs."""
    return [html.P(text, className=f"message {kind}") for text in items]


def verdict(view: dict[str, Any]) -> list[Any]:
    """The verdict: a heading in plain words, the sentences, the scenarios, the duty."""
    meets = view["meets"]
    sentences = view["sentences"]
    chips = [
        html.Span(
            [
                html.Span("✓ " if s["meets"] else "✗ ", className="chip-mark"),
                s["name"],
                ": ",
                s["text"],
            ],
            className="chip ok" if s["meets"] else "chip short",
        )
        for s in view["scenarios"]
    ]
    return [
        html.Div(
            [
                html.Span("Gravity verdict", className="verdict-label"),
                html.Span(
                    "gravity is enough" if meets else "a pump or a change is needed",
                    className="verdict-badge " + ("ok" if meets else "short"),
                ),
            ],
            className="verdict-head",
        ),
        html.P(sentences[0], className="verdict-lead"),
        *[html.P(s, className="verdict-line") for s in sentences[1:]],
        html.Div(chips, className="chips"),
        html.P(view["duty"], className="verdict-duty"),
    ]


def table(view: dict[str, Any], numeric_from: int = 1) -> html.Table:
    """A read-only results table: header row with units, numbers right-aligned."""
    head = html.Thead(html.Tr([html.Th(h) for h in view["headers"]]))
    body = html.Tbody(
        [
            html.Tr(
                [
                    html.Td(cell, className="num" if i >= numeric_from else "text")
                    for i, cell in enumerate(row)
                ],
                className="row-short" if "NO" in row else "",
            )
            for row in view["rows"]
        ]
    )
    return html.Table([head, body], className="results-table")


def fittings_help() -> html.Details:
    """The fittings the catalogue knows, with their K, for the fittings cells."""
    return html.Details(
        [
            html.Summary("Fittings: write name: count, separated by commas; names known"),
            html.Ul(
                [
                    html.Li([html.Code(name), f" {fitting.label}, K = {fitting.k:g}"])
                    for name, fitting in FITTINGS.items()
                ],
                className="fittings-list",
            ),
        ],
        className="hint-details",
    )


def segment_columns(display: Display, invalid: dict[str, list[int]]) -> list[dict[str, Any]]:
    """Column definitions of the route grid in display units, invalid cells marked."""
    columns: list[dict[str, Any]] = [
        {
            "field": "number",
            "headerName": "#",
            "width": 52,
            "editable": False,
            "pinned": "left",
            "cellClass": "row-number",
        }
    ]
    for spec in SEGMENT_COLUMNS:
        unit = label_of(spec.display, display)
        column: dict[str, Any] = {
            "field": spec.key,
            "headerName": f"{spec.header} [{unit}]" if unit else spec.header,
            "width": spec.width,
            "headerTooltip": spec.header,
            "wrapHeaderText": True,
            "autoHeaderHeight": True,
        }
        if spec.key == "name":
            column["pinned"] = "left"
        if spec.key == "material":
            column["cellEditor"] = "agSelectCellEditor"
            column["cellEditorParams"] = {"values": ["", *MATERIALS]}
        if spec.key == "suction":
            column["cellDataType"] = "boolean"
        else:
            column["cellDataType"] = "text"
        if spec.key == "fittings":
            column["headerTooltip"] = "e.g. elbow-90: 2, gate-valve: 1; names in the list below"
        if spec.key in invalid:
            column["cellClassRules"] = {INVALID_CELL: cell_rule(invalid[spec.key])}
        columns.append(column)
    return columns


def pump_columns() -> list[dict[str, Any]]:
    """Column definitions of the pump grid (the name is editable)."""
    return [
        {"field": "name", "headerName": "Pump", "editable": True, "flex": 2, "minWidth": 140},
        {"field": "origin", "headerName": "Curve from", "editable": False, "flex": 3},
        {"field": "speed", "headerName": "Measured at", "editable": False, "flex": 1},
    ]


def arrangement_columns(
    pump_names: list[str], invalid: dict[str, list[int]]
) -> list[dict[str, Any]]:
    """Column definitions of the arrangement grid, pump choices from the case."""
    columns: list[dict[str, Any]] = [
        {
            "field": "name",
            "headerName": "Name (blank: automatic)",
            "flex": 2,
            "minWidth": 170,
            "valueFormatter": {"function": "params.value || params.data.automatic"},
            "cellClassRules": {"automatic-name": "!params.value"},
        },
        {
            "field": "pump",
            "headerName": "Pump",
            "cellEditor": "agSelectCellEditor",
            "cellEditorParams": {"values": pump_names},
            "flex": 2,
            "minWidth": 130,
        },
        {"field": "count", "headerName": "Count", "cellDataType": "text", "width": 80},
        {
            "field": "connection",
            "headerName": "Connection",
            "cellEditor": "agSelectCellEditor",
            "cellEditorParams": {"values": ["single", "parallel", "series"]},
            "width": 115,
        },
        {
            "field": "speed",
            "headerName": "Speed [rpm]",
            "cellDataType": "text",
            "headerTooltip": "blank: the curve's speed; a number in rpm; for-demand",
            "width": 120,
        },
    ]
    for column in columns:
        if column["field"] in invalid:
            rules = column.setdefault("cellClassRules", {})
            rules[INVALID_CELL] = cell_rule(invalid[column["field"]])
    return columns


def operating_columns(headers: list[str]) -> list[dict[str, Any]]:
    """Column definitions of the operating-point grid (read-only, headers with units)."""
    columns = []
    for index, header in enumerate(headers):
        column: dict[str, Any] = {
            "field": f"c{index}",
            "headerName": header,
            "wrapHeaderText": True,
            "autoHeaderHeight": True,
            "width": 104,
            "type": "rightAligned",
        }
        if index < 3:
            column.update({"type": None, "pinned": "left" if index < 2 else None})
            column["width"] = 230 if index == 0 else 110
        if header == "warnings":
            column.update(
                {"type": None, "width": 520, "wrapText": False, "tooltipField": f"c{index}"}
            )
        columns.append({k: v for k, v in column.items() if v is not None})
    return columns


def operating_rows(rows: list[list[str]]) -> list[dict[str, Any]]:
    """Rows of the operating-point grid: one field per column."""
    return [{f"c{i}": cell for i, cell in enumerate(row)} for row in rows]


def fill(tree: Any, values: dict[tuple[str, str], Any]) -> None:
    """Set properties of the components in `tree` by (id, property) (the first render)."""
    if isinstance(tree, (list, tuple)):
        for child in tree:
            fill(child, values)
        return
    if not hasattr(tree, "to_plotly_json"):
        return
    component_id = getattr(tree, "id", None)
    for (target, prop), value in values.items():
        if target == component_id:
            setattr(tree, prop, value)
    fill(getattr(tree, "children", None), values)


def field_messages(view: dict[str, Any], field_ids: list[str]) -> list[list[Any]]:
    """The message line of each field (in the order of `field_ids`)."""
    fields = view["problems"]["fields"]
    return [messages(fields.get(field_id, [])) for field_id in field_ids]


def stale_note(ok: bool) -> list[Any]:
    """The note over results that no longer match the inputs."""
    if ok:
        return []
    return [
        html.Strong("Out of date. "),
        "The inputs have problems (marked beside the fields). The results below are from "
        "the last case that could be computed.",
    ]


def results(view: dict[str, Any]) -> dict[str, Any]:
    """The results panel's children for a valid case (the view of `resultsview.update`)."""
    return {
        "verdict": verdict(view["verdict"]),
        "verdict_class": "verdict " + ("ok" if view["verdict"]["meets"] else "short"),
        "figure": view["figure"],
        "scenarios": table(view["scenarios"]),
        "segments_title": f"Segments at the demand ({view['segments']['scenario']}, governing)",
        "segments": table(view["segments"]),
        "operating_rows": operating_rows(view["operating"]["rows"]),
        "operating_columns": operating_columns(view["operating"]["headers"]),
        "warnings": messages(view["warnings"] or ["none"], "warning"),
        "cautions": messages(view["cautions"], "caution"),
    }
