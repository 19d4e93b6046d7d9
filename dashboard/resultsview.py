"""PURE: the case dict -> everything the results panel shows (the main update).

`update` is what the main callback calls on every edit: validate and analyse the
case, then build the verdict, the figure and the tables in display units. It never
raises: an invalid case gives ``ok = False`` and the problems sorted to their
fields; an unexpected error gives one short message (no traceback).
"""

from __future__ import annotations

from typing import Any

from syscurve.errors import CaseError
from syscurve.results import Report
from syscurve.tables import scenario_table, segment_table
from syscurve.units import Display

from .figures import system_figure
from .problems import empty_map, problem_map
from .viewmodel import display_of, for_engine


def analyse(data: dict[str, Any]) -> Report:
    """Validate and analyse a case dict (as held by the browser).

    Raises
    ------
    CaseError
        For an invalid case; a pump given by ``file`` is refused here (the browser
        cannot hand the server a file path; upload the pump CSV instead).
    """
    from syscurve.analysis import analyze
    from syscurve.case import case_from_dict

    pumps = data.get("pump")
    file_pumps = [
        (
            f"pump[{i}].file",
            "a pump file cannot be opened from the dashboard; upload the "
            "pump CSV under Pumps instead",
        )
        for i, table in enumerate(pumps if isinstance(pumps, list) else [], start=1)
        if isinstance(table, dict) and "file" in table
    ]
    if file_pumps:
        from syscurve.errors import Problem

        raise CaseError([Problem(key, message) for key, message in file_pumps])
    return analyze(case_from_dict(for_engine(data)))


def scenario_view(report: Report, d: Display) -> dict[str, Any]:
    """The scenarios table of `syscurve.tables`."""
    headers, rows = scenario_table(report, d)
    return {"headers": headers, "rows": rows}


def segment_view(report: Report, d: Display) -> dict[str, Any]:
    """The segments at the demand in the governing scenario (`syscurve.tables`)."""
    headers, rows = segment_table(report, d)
    return {"headers": headers, "rows": rows, "scenario": report.verdict.governing_scenario}


def operating_view(report: Report, d: Display) -> dict[str, Any]:
    """The operating-point table of `syscurve.tables`, cells formatted as in its CSV."""
    from syscurve.tables import columns, format_cell, operating_table

    headers, rows = operating_table(report, d.system)
    cols = columns(d, report.case.pump_part.operation.currency)
    cells = [
        [format_cell(value, column) for value, column in zip(row, cols, strict=True)]
        for row in rows
    ]
    return {"headers": headers, "rows": cells}


def verdict_view(report: Report, d: Display) -> dict[str, Any]:
    """The verdict sentences, the pump duty and one line per scenario."""
    from syscurve.summary import duty_sentence, verdict_sentences

    scenarios = [
        {
            "name": r.name,
            "meets": r.meets_demand,
            "text": (
                f"{d.text('head', -r.head_at_demand)} to spare"
                if r.meets_demand
                else f"short by {d.text('head', r.head_at_demand)}"
            ),
        }
        for r in report.scenarios
    ]
    return {
        "meets": report.verdict.meets_everywhere,
        "sentences": verdict_sentences(report, d),
        "duty": duty_sentence(report, d),
        "scenarios": scenarios,
    }


def report_view(report: Report, d: Display) -> dict[str, Any]:
    """Everything the results panel shows for a valid case (JSON-ready)."""
    return {
        "ok": True,
        "title": report.case.title,
        "problems": empty_map(),
        "verdict": verdict_view(report, d),
        "figure": system_figure(report, d),
        "scenarios": scenario_view(report, d),
        "segments": segment_view(report, d),
        "operating": operating_view(report, d),
        "warnings": list(report.warnings),
        "cautions": list(report.cautions),
    }


def update(data: dict[str, Any]) -> dict[str, Any]:
    """The main update: case dict -> analysis -> view model with figure and tables.

    Returns
    -------
    dict
        `report_view` for a valid case; otherwise ``{"ok": False, "problems": ...}``
        with the problems placed by `dashboard.problems.problem_map`.
    """
    try:
        report = analyse(data)
        return report_view(report, display_of(data))
    except CaseError as error:
        problems = [(p.key, p.message) for p in error.problems]
        return {"ok": False, "problems": problem_map(problems, data)}
    except Exception as error:  # never a traceback in the browser
        problems_map = empty_map()
        problems_map["general"].append(
            f"unexpected problem ({type(error).__name__}: {error}); the results shown are "
            "from the last case that could be computed"
        )
        return {"ok": False, "problems": problems_map}
