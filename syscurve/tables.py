"""The operating-point table: one row per arrangement and scenario, units in the headers.

The same rows feed the CSV and XLSX files, the command-line summary and the
dashboard. Values are in display units; a value that does not apply is empty (None),
never invented.
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from .errors import CaseError
from .pumping import OperatingPoint
from .results import Report
from .units import Display, format_number


@dataclass(frozen=True)
class Column:
    """One column: its header (with unit) and how to read a point in display units."""

    header: str
    kind: str  # "text", "bool", "number", "percent"
    digits: int = 4


def columns(display: Display, currency: str = "") -> list[Column]:
    """The table's columns in `display` units."""
    flow, head, power = display.label("flow"), display.label("head"), display.label("power")
    cost = f"annual cost [{currency}]" if currency else "annual cost"
    return [
        Column("arrangement", "text"),
        Column("scenario", "text"),
        Column("status", "text"),
        Column(f"flow [{flow}]", "number"),
        Column(f"head [{head}]", "number"),
        Column(f"flow per pump [{flow}]", "number"),
        Column(f"head per pump [{head}]", "number"),
        Column("speed [rpm]", "number", 4),
        Column("efficiency [%]", "number", 3),
        Column(f"shaft power [{power}]", "number", 3),
        Column("BEP flow ratio [%]", "number", 3),
        Column("in preferred region", "bool"),
        Column(f"NPSH available [{head}]", "number", 3),
        Column(f"NPSH required [{head}]", "number", 3),
        Column(f"NPSH margin [{head}]", "number", 3),
        Column("NPSH ratio [-]", "number", 3),
        Column("demand met", "bool"),
        Column("annual energy [kWh]", "number", 4),
        Column(cost, "number", 4),
        Column(f"specific energy [{display.label('specific_energy')}]", "number", 3),
        Column("warnings", "text"),
    ]


def scenario_table(report: Report, d: Display) -> tuple[list[str], list[list[str]]]:
    """The scenarios: levels, pipe age, static head, H_sys at the demand, gravity flow."""
    level, head, flow = d.label("level"), d.label("head"), d.label("flow")
    headers = [
        "scenario",
        f"source [{level}]",
        f"delivery [{level}]",
        "pipe age [yr]",
        f"static head [{head}]",
        f"H_sys at demand [{head}]",
        f"gravity flow [{flow}]",
        "gravity meets demand",
        f"source level needed [{level}]",
    ]
    rows = [
        [
            r.name,
            format_number(d.value("level", r.curve.scenario.source_level), 6),
            format_number(d.value("level", r.curve.scenario.delivery_level), 6),
            format_number(r.curve.scenario.age_years, 3),
            format_number(d.value("head", r.static_head), 4),
            format_number(d.value("head", r.head_at_demand), 4),
            format_number(d.value("flow", r.gravity_flow), 4),
            "yes" if r.meets_demand else "NO",
            format_number(d.value("level", r.required_source_level), 6),
        ]
        for r in report.scenarios
    ]
    return headers, rows


def segment_table(report: Report, d: Display) -> tuple[list[str], list[list[str]]]:
    """Each segment at the demand in the governing scenario."""
    governing = report.scenario(report.verdict.governing_scenario)
    head = d.label("head")
    headers = [
        "segment",
        f"inside diameter [{d.label('diameter')}]",
        f"velocity [{d.label('velocity')}]",
        "Re",
        "f (Darcy)",
        "K total",
        f"friction loss [{head}]",
        f"minor loss [{head}]",
    ]
    rows = [
        [
            s.name,
            format_number(d.value("diameter", s.diameter), 4),
            format_number(d.value("velocity", s.velocity), 3),
            f"{s.reynolds:,.0f}",
            f"{s.friction_factor:.4f}",
            format_number(s.k_minor, 3),
            format_number(d.value("head", s.friction_loss), 4),
            format_number(d.value("head", s.minor_loss), 3),
        ]
        for s in governing.segments_at_demand
    ]
    return headers, rows


def _percent(value: float | None) -> float | None:
    return None if value is None else 100.0 * value


def row_values(point: OperatingPoint, display: Display) -> list[Any]:
    """A point's values in display units, in column order (None where not applicable)."""
    d = display
    specific = point.specific_energy_kwh_m3
    if specific is not None:  # kWh/m^3 -> display (J/m^3 is the SI base of the kind)
        specific = d.value("specific_energy", specific * 3.6e6)
    return [
        point.arrangement,
        point.scenario,
        point.status,
        d.value("flow", point.flow),
        d.value("head", point.head),
        d.value("flow", point.flow_per_pump),
        d.value("head", point.head_per_pump),
        point.speed_rpm,
        _percent(point.efficiency),
        d.value("power", point.shaft_power),
        _percent(point.bep_flow_ratio),
        point.in_preferred_region,
        d.value("head", point.npsh_available),
        d.value("head", point.npsh_required),
        d.value("head", point.npsh_margin),
        point.npsh_margin_ratio,
        point.meets_demand,
        point.annual_energy_kwh,
        point.annual_cost,
        specific,
        "; ".join(point.warnings),
    ]


def operating_table(report: Report, units: str | None = None) -> tuple[list[str], list[list[Any]]]:
    """Headers and rows of the operating-point table in display units."""
    display = Display(units or report.case.display)
    cols = columns(display, report.case.pump_part.operation.currency)
    rows = [row_values(p, display) for p in report.operating_points]
    return [c.header for c in cols], rows


def format_cell(value: Any, column: Column) -> str:
    """Text of one cell for CSV and the summary: empty for None, 4 significant figures."""
    if value is None:
        return ""
    if column.kind == "bool":
        return "yes" if value else "no"
    if column.kind == "number":
        return format_number(float(value), column.digits)
    return str(value)


def table_csv(report: Report, units: str | None = None) -> str:
    """The table as CSV text (UTF-8, comma separated, a header row with units)."""
    display = Display(units or report.case.display)
    cols = columns(display, report.case.pump_part.operation.currency)
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow([c.header for c in cols])
    for point in report.operating_points:
        values = row_values(point, display)
        writer.writerow([format_cell(v, c) for v, c in zip(values, cols, strict=True)])
    return buffer.getvalue()


def table_xlsx(report: Report, units: str | None = None) -> bytes:
    """The table as an XLSX workbook: sheet "operating points" and a sheet "about"."""
    from openpyxl import Workbook
    from openpyxl.styles import Alignment, Font
    from openpyxl.utils import get_column_letter

    display = Display(units or report.case.display)
    cols = columns(display, report.case.pump_part.operation.currency)
    book = Workbook()
    sheet = book.active
    assert sheet is not None
    sheet.title = "operating points"
    sheet.append([c.header for c in cols])
    for cell in sheet[1]:
        cell.font = Font(bold=True)
        cell.alignment = Alignment(wrap_text=True, vertical="top")
    for point in report.operating_points:
        values = row_values(point, display)
        sheet.append(
            [
                ("yes" if v else "no") if c.kind == "bool" and v is not None else v
                for v, c in zip(values, cols, strict=True)
            ]
        )
    for index, column in enumerate(cols, start=1):
        letter = get_column_letter(index)
        sheet.column_dimensions[letter].width = 40 if column.header == "warnings" else 14
        if column.kind == "number":
            for cell in sheet[letter][1:]:
                cell.number_format = "0.000"
    sheet.freeze_panes = "D2"
    about = book.create_sheet("about")
    from . import __version__

    for line in (
        ["case", report.case.title],
        ["units", display.system],
        ["demand", display.text("flow", report.case.demand)],
        ["made by", f"syscurve {__version__}"],
        [],
        ["cautions"],
        *[[c] for c in report.cautions],
    ):
        about.append(line)
    about.column_dimensions["A"].width = 14
    about.column_dimensions["B"].width = 60
    buffer = io.BytesIO()
    book.save(buffer)
    return buffer.getvalue()


def write_table(report: Report, path: str | Path, units: str | None = None) -> None:
    """Write the operating-point table to `path` (.csv or .xlsx)."""
    path = Path(path)
    suffix = path.suffix.lower()
    if suffix == ".csv":
        data: bytes = table_csv(report, units).encode("utf-8")
    elif suffix == ".xlsx":
        data = table_xlsx(report, units)
    else:
        raise CaseError(f'"{path.name}": write the table as .csv or .xlsx', "--table")
    if not report.operating_points:
        raise CaseError("the case has no [[pump]] to tabulate; add pumps first", "--table")
    try:
        path.write_bytes(data)
    except OSError as exc:
        raise CaseError(f"cannot write {path}: {exc.strerror}", "--table") from None
