"""The figure and the results view (dashboard.figures, dashboard.resultsview).

Expected values:
* the curves, the heads at the demand, the gravity flows and the operating points
  are the engine's own numbers on the invented demo case, converted with the
  engine's `Display` (identity: the figure must plot what the report says);
* pump arrangement curves follow the combination rules (analytic): N identical
  pumps in parallel give H(Q) = h(Q/N); a pump at speed n follows the affinity laws
  h_n(Q) = (n/n0)^2 h(Q n0/n);
* the operating-point table rows are `syscurve.tables.operating_table` formatted
  with `syscurve.tables.format_cell` (the CSV's own formatting);
* a 3.2 L/s demand is 50.7210 US gpm (analytic), heads in ft are metres / 0.3048.
"""

from __future__ import annotations

from typing import Any

import numpy as np
import pytest

from dashboard import resultsview
from dashboard.figures import as_plotly, system_figure
from dashboard.resultsview import operating_view, report_view, update
from dashboard.viewmodel import for_store
from syscurve.tables import columns, format_cell, operating_table
from syscurve.units import Display
from tests.dashboard.helpers import demo_data, demo_report

SI, US = Display("SI"), Display("US")


@pytest.fixture(scope="module")
def report() -> Any:
    return demo_report()


def by_role(figure: dict[str, Any], role: str) -> list[dict[str, Any]]:
    return [t for t in figure["data"] if t["meta"]["role"] == role]


def test_one_system_curve_per_scenario_in_display_units(report: Any) -> None:
    figure = system_figure(report, SI)
    curves = by_role(figure, "system-curve")
    assert [c["meta"]["scenario"] for c in curves] == ["nominal", "max-static", "min-static"]
    for curve, result in zip(curves, report.scenarios, strict=True):
        assert curve["x"] == pytest.approx(list(result.curve_flow * 1000), abs=1e-6)
        assert curve["y"] == pytest.approx(list(result.curve_head), abs=1e-6)
    us = by_role(system_figure(report, US), "system-curve")[1]
    assert us["y"] == pytest.approx(list(report.scenarios[1].curve_head / 0.3048), rel=1e-6)


def test_the_demand_is_marked_on_every_system_curve(report: Any) -> None:
    figure = system_figure(report, SI)
    (demand,) = by_role(figure, "demand")
    assert demand["x"] == pytest.approx([3.2] * 3)
    assert demand["y"] == pytest.approx([r.head_at_demand for r in report.scenarios], abs=1e-6)
    assert demand["name"] == "demand 3.20 L/s"
    rules = [s for s in figure["layout"]["shapes"] if s["type"] == "line" and s["x0"] == s["x1"]]
    assert rules[0]["x0"] == pytest.approx(3.2)
    (us_demand,) = by_role(system_figure(report, US), "demand")
    assert us_demand["x"][0] == pytest.approx(50.7210, abs=1e-3)


def test_the_gravity_region_is_the_band_below_zero_head(report: Any) -> None:
    figure = system_figure(report, SI)
    band = [s for s in figure["layout"]["shapes"] if s["type"] == "rect"]
    assert len(band) == 1 and band[0]["y1"] == 0
    assert band[0]["y0"] == figure["layout"]["yaxis"]["range"][0] < 0
    (gravity,) = by_role(figure, "gravity-flow")
    assert gravity["y"] == [0.0] * 3
    assert gravity["x"] == pytest.approx(
        [r.gravity_flow * 1000 for r in report.scenarios], abs=1e-6
    )


def test_axis_titles_carry_the_units(report: Any) -> None:
    layout = system_figure(report, SI)["layout"]
    assert layout["xaxis"]["title"]["text"] == "Flow Q [L/s]"
    assert layout["yaxis"]["title"]["text"] == "Head H [m]"
    layout = system_figure(report, US)["layout"]
    assert layout["xaxis"]["title"]["text"] == "Flow Q [gpm]"
    assert layout["yaxis"]["title"]["text"] == "Head H [ft]"


def test_pump_curves_and_operating_points_per_arrangement(report: Any) -> None:
    figure = system_figure(report, SI)
    pumps = by_role(figure, "pump-curve")
    assert [p["meta"]["arrangement"] for p in pumps] == [
        "booster A",
        "2 x booster A parallel",
        "booster B at speed for demand",  # one curve: the pump runs in max-static only
    ]
    points = by_role(figure, "operating-points")
    solved = [p for p in report.operating_points if p.flow is not None]
    plotted = [v for t in points for x, y in zip(t["x"], t["y"], strict=True) for v in (x, y)]
    expected = [v for p in solved for v in (p.flow * 1000, p.head)]
    assert plotted == pytest.approx(expected, abs=1e-6)
    assert len(by_role(figure, "bep")) == 1
    # one trace per scenario plus the pump traces, the demand, gravity flows and BEPs
    assert len(figure["data"]) == 3 + 1 + 1 + len(pumps) + len(points) + 1


def test_parallel_pumps_are_plotted_at_the_head_of_one_pump_at_half_the_flow(
    report: Any,
) -> None:
    import pump_data

    single = pump_data.load("inline booster A 2900 rpm")
    (pair,) = [
        p
        for p in by_role(system_figure(report, SI), "pump-curve")
        if p["meta"]["arrangement"] == "2 x booster A parallel"
    ]
    x, y = np.array(pair["x"], dtype=float), np.array(pair["y"], dtype=float)
    assert y == pytest.approx(single.head_at(x / 2 / 1000), abs=1e-5)


def test_a_pump_at_the_speed_for_demand_follows_the_affinity_laws(report: Any) -> None:
    (point,) = [
        p
        for p in report.operating_points
        if p.arrangement == "booster B at speed for demand" and p.flow is not None
    ]
    (curve,) = [
        p
        for p in by_role(system_figure(report, SI), "pump-curve")
        if p["meta"]["arrangement"] == "booster B at speed for demand"
    ]
    rated = [p for p in report.case.pump_part.pumps if p.name == "booster B"][0]
    ratio = point.speed_rpm / rated.speed_rpm
    x = np.array(curve["x"], dtype=float) / 1000
    assert np.array(curve["y"], dtype=float) == pytest.approx(
        ratio**2 * rated.head_at(x / ratio, extrapolate=True), abs=1e-5
    )
    # and the operating point lies on that curve at the demand
    assert point.flow == pytest.approx(3.2e-3, rel=1e-6)
    assert np.interp(3.2, x * 1000, curve["y"]) == pytest.approx(point.head, abs=2e-3)


def test_the_figure_is_a_valid_plotly_figure(report: Any) -> None:
    figure = as_plotly(system_figure(report, US))
    assert len(figure.data) == len(system_figure(report, US)["data"])
    assert figure.layout.xaxis.title.text == "Flow Q [gpm]"


def test_operating_rows_are_the_engine_table_formatted_as_in_its_csv(report: Any) -> None:
    for display in (SI, US):
        headers, rows = operating_table(report, display.system)
        view = operating_view(report, display)
        cols = columns(display, report.case.pump_part.operation.currency)
        assert view["headers"] == headers
        assert view["rows"] == [
            [format_cell(v, c) for v, c in zip(row, cols, strict=True)] for row in rows
        ]
    assert len(view["rows"]) == 9 and view["headers"][3] == "flow [gpm]"


def test_the_view_carries_verdict_duty_tables_warnings_and_cautions(report: Any) -> None:
    view = report_view(report, SI)
    verdict = view["verdict"]
    assert verdict["meets"] is False
    assert verdict["sentences"][0] == (
        "Gravity alone does NOT meet the demand of 3.20 L/s in: max-static."
    )
    assert verdict["duty"] == "Required pump duty: 2.83 m at 3.20 L/s in max-static."
    assert [s["meets"] for s in verdict["scenarios"]] == [True, False, True]
    assert verdict["scenarios"][1]["text"] == "short by 2.83 m"
    assert view["segments"]["scenario"] == "max-static"
    assert [r[0] for r in view["segments"]["rows"]] == ["intake", "spring main", "tank inlet"]
    assert view["scenarios"]["rows"][1][7] == "NO"
    assert any("Steady state only" in c for c in view["cautions"])
    assert any("velocity 0.671 m/s" in w for w in view["warnings"])


def test_update_on_an_invalid_case_returns_its_problems_and_no_results() -> None:
    data = for_store(demo_data())
    data["delivery"]["demand"] = "fast"
    view = update(data)
    assert view["ok"] is False and "figure" not in view
    assert view["problems"]["fields"]["demand-input"][0].startswith('expected "value unit"')


def test_an_unexpected_error_becomes_a_short_message(monkeypatch: pytest.MonkeyPatch) -> None:
    def broken(data: dict[str, Any]) -> Any:
        raise ZeroDivisionError("division by zero")

    monkeypatch.setattr(resultsview, "analyse", broken)
    view = update(for_store(demo_data()))
    assert view["ok"] is False
    (message,) = view["problems"]["general"]
    assert message.startswith("unexpected problem (ZeroDivisionError: division by zero)")
    assert "Traceback" not in message


def test_a_pump_file_in_the_case_is_refused_without_reading_the_server_disk() -> None:
    data = for_store(demo_data())
    data["pump"][1] = {"name": "booster B", "file": "/etc/passwd"}
    view = update(data)
    assert view["ok"] is False
    assert "upload the pump CSV" in view["problems"]["pumps"][0]


def test_a_case_without_pumps_draws_only_the_system(report: Any) -> None:
    data = for_store(demo_data())
    for key in ("pump", "arrangement", "pump_station", "operation"):
        data.pop(key)
    view = update(data)
    assert view["ok"] is True
    roles = {t["meta"]["role"] for t in view["figure"]["data"]}
    assert roles == {"system-curve", "gravity-flow", "demand"}
    assert view["operating"]["rows"] == []
