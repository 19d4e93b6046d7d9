"""Every component id of the dashboard, in one place.

Plain string ids (no pattern-matching dicts) so that tests and style sheets can
address them as ``#id``. The form fields take their ids from `dashboard.formspec`;
each field ``X`` has a unit label ``X-unit``, a message line ``X-message`` and a
wrapper ``X-row`` (shown or hidden with the case).
"""

from __future__ import annotations

# --- state ------------------------------------------------------------------------------
CASE_STORE = "case-store"  # the case dict (JSON), what Save writes
GOOD_STORE = "last-good-store"  # the last case dict that analysed without problems

# --- header -----------------------------------------------------------------------------
TITLE_INPUT = "title-input"
UNITS_SWITCH = "units-switch"
CASE_UPLOAD = "case-upload"
CASE_UPLOAD_MESSAGE = "case-upload-message"
SAVE_CASE = "save-case"
SAVE_CASE_DOWNLOAD = "save-case-download"
LOAD_DEMO = "load-demo"

# --- the system -------------------------------------------------------------------------
DEMAND_INPUT = "demand-input"
SEGMENT_GRID = "segment-grid"
SEGMENT_ADD = "segment-add"
SEGMENT_DELETE = "segment-delete"
SEGMENT_UP = "segment-up"
SEGMENT_DOWN = "segment-down"
SEGMENT_MESSAGE = "segment-message"

# --- pumps ------------------------------------------------------------------------------
PUMP_GRID = "pump-grid"
PUMP_DELETE = "pump-delete"
PUMP_MESSAGE = "pump-message"
LIBRARY_PICK = "library-pick"
LIBRARY_ADD = "library-add"
POINTS_NAME = "points-name"
POINTS_SPEED = "points-speed"
POINTS_FLOW_UNIT = "points-flow-unit"
POINTS_HEAD_UNIT = "points-head-unit"
POINTS_TEXT = "points-text"
POINTS_ADD = "points-add"
POINTS_MESSAGE = "points-message"
PUMP_UPLOAD = "pump-upload"
PUMP_UPLOAD_MESSAGE = "pump-upload-message"
ARRANGEMENT_GRID = "arrangement-grid"
ARRANGEMENT_ADD = "arrangement-add"
ARRANGEMENT_DELETE = "arrangement-delete"
ARRANGEMENT_MESSAGE = "arrangement-message"

# --- results ----------------------------------------------------------------------------
RESULTS_PANEL = "results-panel"
STALE_NOTE = "stale-note"
GENERAL_MESSAGE = "general-message"
VERDICT = "verdict"
SYSTEM_PLOT = "system-plot"
SCENARIO_TABLE = "scenario-table"
SEGMENT_RESULTS = "segment-results"
SEGMENT_RESULTS_TITLE = "segment-results-title"
OPERATING_GRID = "operating-grid"
WARNINGS = "warnings"
CAUTIONS = "cautions"

# --- downloads --------------------------------------------------------------------------
DOWNLOAD_CSV = "download-csv"
DOWNLOAD_XLSX = "download-xlsx"
DOWNLOAD_PNG = "download-png"
DOWNLOAD_HTML = "download-html"
TABLE_DOWNLOAD = "table-download"
PLOT_DOWNLOAD = "plot-download"
DOWNLOAD_MESSAGE = "download-message"


def unit_id(field_id: str) -> str:
    """Id of the unit label beside a field."""
    return f"{field_id}-unit"


def message_id(field_id: str) -> str:
    """Id of the message line beside a field."""
    return f"{field_id}-message"


def row_id(field_id: str) -> str:
    """Id of the wrapper of a field (label, input, unit, message)."""
    return f"{field_id}-row"
