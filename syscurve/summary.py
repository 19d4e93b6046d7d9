"""The readable summary of a report, in display units, for the command line."""

from __future__ import annotations

import textwrap
from collections.abc import Sequence

from .pumping import OperatingPoint
from .results import Report
from .tables import columns, format_cell, row_values, scenario_table, segment_table
from .units import Display


def text_table(headers: Sequence[str], rows: Sequence[Sequence[str]], indent: str = "  ") -> str:
    """A plain-text table: first column left-aligned, the others right-aligned."""
    widths = [len(h) for h in headers]
    for row in rows:
        widths = [max(w, len(cell)) for w, cell in zip(widths, row, strict=True)]

    def line(cells: Sequence[str]) -> str:
        parts = [
            cell.ljust(w) if i == 0 else cell.rjust(w)
            for i, (cell, w) in enumerate(zip(cells, widths, strict=True))
        ]
        return indent + "  ".join(parts).rstrip()

    rule = indent + "  ".join("-" * w for w in widths)
    return "\n".join([line(headers), rule, *(line(r) for r in rows)])


def _wrap(text: str, first: str, rest: str, width: int = 96) -> str:
    """Wrap text to `width`, never breaking inside a hyphenated word."""
    return textwrap.fill(
        text, width=width, initial_indent=first, subsequent_indent=rest, break_on_hyphens=False
    )


def _bullets(items: Sequence[str], width: int = 96) -> str:
    if not items:
        return "  (none)"
    return "\n".join(_wrap(item, "  - ", "    ") for item in items)


def verdict_sentences(report: Report, display: Display) -> list[str]:
    """The gravity verdict in plain words (shared by the CLI and the dashboard)."""
    v = report.verdict
    governing = report.scenario(v.governing_scenario)
    demand = display.text("flow", report.case.demand)
    gravity = display.text("flow", governing.gravity_flow)
    margin = display.text("head", abs(v.margin_head))
    if v.meets_everywhere:
        sentences = [
            f"Gravity alone meets the demand of {demand} in every scenario.",
            f"The tightest is {v.governing_scenario}, with {margin} of head to spare; gravity "
            f"would deliver {gravity} there ({v.flow_ratio:.0%} of the demand).",
        ]
    else:
        failing = ", ".join(v.failing_scenarios)
        sentences = [
            f"Gravity alone does NOT meet the demand of {demand} in: {failing}.",
            f"The governing scenario is {v.governing_scenario}: short by {margin} of head; "
            f"gravity delivers {gravity} there ({v.flow_ratio:.0%} of the demand).",
            f"A pump must add {margin} at {demand} in {v.governing_scenario}, or raise the "
            f"source to {display.text('level', governing.required_source_level, 5)}, "
            "or enlarge the pipe.",
        ]
    sizing = report.sizing
    if sizing is not None:
        which = ", ".join(f"'{n}'" for n in sizing.segments)
        named = "" if sizing.source == "case list" else f"{sizing.label}, "
        sentences.append(
            f"Smallest candidate inside diameter for {which} that meets the demand by gravity "
            f"in {v.governing_scenario}: {display.text('diameter', sizing.diameter)} "
            f"({named}{sizing.source})."
        )
    elif report.case.sizing_candidates:
        sentences.append(
            "None of the candidate diameters meets the demand by gravity in "
            f"{v.governing_scenario}."
        )
    return sentences


def summary_text(report: Report, units: str | None = None) -> str:
    """The report as readable text in `units` ("SI" or "US"; default: the case's)."""
    case = report.case
    d = Display(units or case.display)
    liquid = case.liquid
    out: list[str] = []
    out.append(case.title)
    out.append("=" * min(len(case.title), 96))
    what = liquid.name
    if liquid.temperature is not None:
        what += f" at {d.text('temperature', liquid.temperature)}"
    vapor = "n/a" if liquid.vapor_pressure is None else d.text("pressure", liquid.vapor_pressure)
    out.append(
        f"Liquid: {what}; density {d.text('density', liquid.density, 5)}, viscosity "
        f"{d.text('viscosity', liquid.viscosity, 4)}, vapour pressure {vapor}"
    )
    site = f"altitude {d.text('level', case.altitude, 4)}, " if case.altitude is not None else ""
    out.append(f"Site: {site}barometric pressure {d.text('pressure', case.barometric_pressure, 4)}")
    out.append(
        f"Demand {d.text('flow', case.demand)}; friction {case.pipeline.model.label}; "
        f"outlet: {case.pipeline.outlet}"
    )
    out.append("")
    out.append("GRAVITY VERDICT")
    out.append(
        _bullets(verdict_sentences(report, d)).replace("  - ", "  ", 1).replace("\n  - ", "\n  ")
    )
    out.append("")
    out.append("SCENARIOS")
    out.append(text_table(*scenario_table(report, d)))
    out.append("")
    governing = report.verdict.governing_scenario
    out.append(f"SEGMENTS AT THE DEMAND ({governing})")
    out.append(text_table(*segment_table(report, d)))
    if report.operating_points or report.case.pump_part.pumps:
        out.append("")
        out.append(pump_sections(report, d))
    out.append("")
    out.append("WARNINGS")
    out.append(_bullets(report.warnings))
    out.append("")
    out.append("CAUTIONS")
    out.append(_bullets(report.cautions))
    return "\n".join(out) + "\n"


def duty_sentence(report: Report, display: Display) -> str:
    """The pump duty to ask for, in plain words."""
    needed = [d for d in report.duties if d.needed]
    if not needed:
        return "No pump is needed: gravity alone meets the demand in every scenario."
    worst = max(needed, key=lambda d: d.head)
    others = ", ".join(
        f"{d.scenario} {display.text('head', d.head)}" for d in needed if d is not worst
    )
    also = f" (also needed in {others})" if others else ""
    return (
        f"Required pump duty: {display.text('head', worst.head)} at "
        f"{display.text('flow', worst.flow)} in {worst.scenario}{also}."
    )


def pump_sections(report: Report, d: Display) -> str:
    """Required duty, the pumps and the operating-point table."""
    out = ["PUMPS", "  " + duty_sentence(report, d)]
    for pump in report.case.pump_part.pumps:
        bep = (
            f"BEP {d.text('flow', pump.bep_flow)} at {d.text('head', pump.bep_head)}, "
            f"{pump.bep_efficiency:.0%}"
            if pump.bep_flow is not None and pump.bep_efficiency is not None
            else "no efficiency data"
        )
        shutoff = d.text("head", pump.shutoff_head)
        out.append(
            _wrap(
                f"{pump.name}: {pump.speed_rpm:.0f} rpm, shutoff {shutoff}, {bep}; fit PCHIP, "
                f"largest leave-one-out head residual {d.text('head', pump.max_head_residual, 2)}"
                + (f"; {pump.source}" if pump.source else ""),
                "  ",
                "    ",
            )
        )
    speeds: dict[str, list[str]] = {}
    for point in report.operating_points:
        if point.min_speed_rpm is None:
            continue
        static = d.text("head", report.scenario(point.scenario).static_head)
        below = f"{point.min_speed_rpm:.0f} rpm" if point.min_speed_rpm > 0 else "any speed"
        speeds.setdefault(point.arrangement, []).append(
            f"{point.scenario} {below} (static head {static})"
        )
    for arrangement, items in speeds.items():
        out.append(
            _wrap(
                f"{arrangement}: the pumps overcome the static head from " + "; ".join(items),
                "  ",
                "    ",
            )
        )
    if not report.operating_points:
        return "\n".join(out)
    cols = columns(d, report.case.pump_part.operation.currency)
    shown = [0, 1, 2, 3, 4, 5, 7, 8, 9, 10, 12, 13, 16]
    headers = [cols[i].header for i in shown]
    rows: list[list[str]] = []
    notes: list[tuple[int, OperatingPoint]] = []
    for point in report.operating_points:
        values = row_values(point, d)
        cells = [format_cell(values[i], cols[i]) or "-" for i in shown]
        if point.warnings:
            notes.append((len(notes) + 1, point))
            cells[2] += f" [{len(notes)}]"
        rows.append(cells)
    out += ["", "OPERATING POINTS", text_table(headers, rows)]
    for number, point in notes:
        out.append(
            _wrap(
                f"[{number}] {point.arrangement}, {point.scenario}: " + "; ".join(point.warnings),
                "  ",
                "      ",
            )
        )
    return "\n".join(out)
