"""Operating points: pumps on the system curve, arrangements, speed for demand, statuses."""

from __future__ import annotations

import copy
import math
from typing import Any

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import pump_data
from syscurve import analyze, case_from_dict
from syscurve.arrangement import Arrangement, Combined, mixed_parallel_flows
from syscurve.operating import min_speed_ratio, solve, solve_fixed_speed, solve_for_demand
from syscurve.pump import PumpCurve, flow_at_head
from syscurve.system import ScenarioBatch
from syscurve.units import G
from tests.conftest import MINIMAL

# --- a constructed pump/system cross-check (not published) ------------------------------
# Pump H = 60 - 1500 Q^2 (m, m^3/s); system: static lift 20 m, commercial steel D 0.2 m,
# L 500 m, eps 0.045 mm, K 2.25 (entrance 0.5, exit 1.0, two elbows 0.3 each, valve 0.15),
# water at 20 C. Computed by two independent routes with outside libraries (iapws + own
# Colebrook + brentq; chemicals + fluids.friction_factor + scipy Newton), which agree.
# The engine fits the parabola through 39 points with PCHIP, so allow 2e-5.
CONSTRUCTED = {
    "single": (0.105497, 43.3056),
    "parallel": (0.127920, 53.8637),
    "series": (0.140599, 60.6960),
}


def parabola_pump() -> PumpCurve:
    flow = np.linspace(0.0, 0.19, 39)
    return PumpCurve.from_points("parabola", 1450.0, flow, 60.0 - 1500.0 * flow**2)


CONSTRUCTED_CASE: dict[str, Any] = {
    "format": 1,
    "liquid": {"kind": "water", "temperature": "20 degC"},
    "source": {"level": "0 m"},
    "delivery": {"outlet": "tank", "level": "20 m", "demand": "0.1 m^3/s"},
    "segment": [
        {"length": "500 m", "diameter": "0.2 m", "roughness": "0.045 mm", "k_extra": 1.25}
    ],  # the engine adds the exit's 1.0
}


def constructed_batch() -> ScenarioBatch:
    case = case_from_dict(copy.deepcopy(CONSTRUCTED_CASE))
    return ScenarioBatch(case.pipeline, case.scenarios)


@pytest.mark.parametrize("connection", ["single", "parallel", "series"])
def test_constructed_cross_check_single_parallel_series(connection: str) -> None:
    count = 1 if connection == "single" else 2
    solution = solve_fixed_speed(constructed_batch(), Combined(parabola_pump(), count, connection))
    flow, head = CONSTRUCTED[connection]
    assert solution[0].status == "ok"
    assert solution[0].flow == pytest.approx(flow, rel=2e-5)
    assert solution[0].head == pytest.approx(head, rel=2e-5)


def test_constructed_cross_check_against_fluids_and_scipy_live() -> None:
    # Reference libraries evaluated here: fluids.friction_factor (Colebrook) with
    # scipy.optimize.brentq on the exact parabola; water properties from iapws.
    fluids = pytest.importorskip("fluids")
    optimize = pytest.importorskip("scipy.optimize")
    iapws = pytest.importorskip("iapws")
    state = iapws.IAPWS97(T=293.15, P=0.101325)
    nu = state.mu / state.rho

    def system(q: float) -> float:
        v = q / (math.pi * 0.2**2 / 4)
        f = fluids.friction.friction_factor(Re=v * 0.2 / nu, eD=0.045e-3 / 0.2)
        return 20.0 + (f * 500 / 0.2 + 2.25) * v**2 / (2 * G)

    batch = constructed_batch()
    for connection, count, pump_head in (
        ("single", 1, lambda q: 60 - 1500 * q**2),
        ("parallel", 2, lambda q: 60 - 1500 * (q / 2) ** 2),
        ("series", 2, lambda q: 2 * (60 - 1500 * q**2)),
    ):
        reference = optimize.brentq(lambda q, h=pump_head: h(q) - system(q), 1e-6, 0.19)
        engine = solve_fixed_speed(batch, Combined(parabola_pump(), count, connection))[0]
        assert engine.flow == pytest.approx(reference, rel=2e-5), connection


def test_hydraulic_power_at_the_constructed_point() -> None:
    # Analytic: P = rho g Q H; the cross-check gives 44 722 W with rho 998.21 kg/m^3.
    case = case_from_dict(copy.deepcopy(CONSTRUCTED_CASE))
    points = analyze(_with_pump(case, parabola_pump())).operating_points
    assert points[0].hydraulic_power == pytest.approx(44722, rel=1e-4)


def _with_pump(case: Any, pump: PumpCurve, **arrangement: Any) -> Any:
    from dataclasses import replace

    from syscurve.pumpcase import PumpPart

    arr = Arrangement(arrangement.pop("name", pump.name), (pump,), **arrangement)
    return replace(case, pump_part=PumpPart((pump,), (arr,)))


# --- a textbook example of a pump on a system curve ----------------------------------------


def test_munson_pump_on_system_curve_example_point_lies_on_the_engine_system_curve() -> None:
    # Munson et al., Fundamentals of Fluid Mechanics, ch. 12 (example number varies by
    # edition; from memory): water between two open tanks 10 ft apart in level, 200 ft
    # of 6-in pipe, K: entrance 0.5, elbow 1.5, exit 1.0, f taken constant 0.02. The book's
    # system curve is h = 10 + 4.43 Q^2 (ft, ft^3/s) and the operating point read from the
    # pump graph is about 1600 gpm at about 66 ft. The pump curve itself is a graph not
    # reproduced here, so this checks the system side of the example: with roughness
    # eps/D = 0.001 (0.0005 ft), Colebrook gives f = 0.020 at that flow, and the published
    # point must lie on the engine's curve within the graph's precision (3 %).
    data = copy.deepcopy(MINIMAL)
    data["liquid"] = {"kind": "water", "temperature": "60 degF"}
    data["source"] = {"level": "0 ft"}
    data["delivery"] = {"outlet": "tank", "level": "10 ft", "demand": "1600 gpm"}
    data["segment"] = [
        {
            "name": "line",
            "length": "200 ft",
            "diameter": "6 in",
            "roughness": "0.0005 ft",
            "fittings": {"entrance-sharp": 1},
            "k_extra": 1.5,
        }
    ]
    report = analyze(case_from_dict(data))
    result = report.scenarios[0]
    assert result.segments_at_demand[0].friction_factor == pytest.approx(0.020, rel=0.02)
    assert result.head_at_demand / 0.3048 == pytest.approx(66, rel=0.03)
    q_cfs = 1600 * 3.785411784e-3 / 60 / 0.3048**3
    assert result.head_at_demand / 0.3048 == pytest.approx(10 + 4.43 * q_cfs**2, rel=0.03)


# --- analytic identities ----------------------------------------------------------------


def demo() -> Any:
    import tomllib

    from syscurve.cli import example_text

    return case_from_dict(tomllib.loads(example_text()))


def test_the_demo_reports_every_arrangement_in_every_scenario() -> None:
    case = demo()
    report = analyze(case)
    assert len(report.operating_points) == len(case.pump_part.arrangements) * len(case.scenarios)
    duty = {d.scenario: d for d in report.duties}
    assert duty["max-static"].needed and not duty["nominal"].needed
    # analytic: the duty is the system head at the demand
    assert duty["max-static"].head == pytest.approx(report.scenario("max-static").head_at_demand)


def test_an_operating_point_lies_on_both_curves() -> None:
    case = demo()
    batch = ScenarioBatch(case.pipeline, case.scenarios)
    for arrangement in case.pump_part.arrangements:
        if arrangement.for_demand:
            continue
        combined = Combined(arrangement.units_at()[0], arrangement.count, arrangement.connection)
        for solution in solve(batch, arrangement, case.demand):
            assert solution.flow is not None and solution.head is not None
            system = float(batch.head_of([solution.scenario_index], [solution.flow])[0])
            assert solution.head == pytest.approx(system, abs=1e-8)
            assert float(combined.head(solution.flow)) == pytest.approx(system, abs=1e-8)


def test_speed_for_demand_puts_the_scaled_curve_through_the_demand_point() -> None:
    case = demo()
    batch = ScenarioBatch(case.pipeline, case.scenarios)
    arrangement = next(a for a in case.pump_part.arrangements if a.for_demand)
    index = [s.name for s in case.scenarios].index("max-static")
    solution = solve_for_demand(batch, arrangement, case.demand)[index]
    assert solution.status == "ok"
    unit = arrangement.units_at(solution.speed_ratio)[0]
    # affinity-scaled curve at the solved speed meets the real system curve at the demand
    needed = float(batch.head_of([index], [case.demand])[0])
    assert float(unit.head_at(case.demand)) == pytest.approx(needed, rel=1e-9)


def test_minimum_speed_is_where_shutoff_head_equals_static_head() -> None:
    # Analytic (affinity laws): shutoff head scales with N^2.
    pump = pump_data.load("small booster 2900 rpm")
    ratio = min_speed_ratio(20.0, pump.shutoff_head)
    assert pump.at_speed(2900 * ratio).shutoff_head == pytest.approx(20.0, rel=1e-9)
    assert min_speed_ratio(-5.0, pump.shutoff_head) == 0.0


def test_a_pump_that_cannot_lift_the_static_head_is_a_result_not_an_error() -> None:
    data = copy.deepcopy(MINIMAL)
    data["delivery"]["level"] = "160 m"  # 60 m above the source
    data["pump"] = [{"name": "small", "library": "small booster 2900 rpm"}]
    point = analyze(case_from_dict(data)).operating_points[0]
    assert point.status == "no-intersection"
    assert point.flow is None and point.efficiency is None
    assert any("shutoff head 34.0 m is below the static head 60.0 m" in w for w in point.warnings)


def test_a_drooping_curve_can_meet_the_system_twice() -> None:
    pump = pump_data.load("end-suction pump B 1450 rpm")
    assert pump.unstable
    static = 0.5 * (pump.shutoff_head + pump.max_head)  # between shutoff and the hump
    data = copy.deepcopy(MINIMAL)
    data["source"]["level"] = "0 m"
    data["delivery"]["level"] = f"{static} m"
    data["segment"][0].update(diameter="300 mm", length="50 m")
    case = _with_pump(case_from_dict(data), pump)
    point = analyze(case).operating_points[0]
    assert point.status == "several-intersections"
    assert len(point.intersections) == 2
    assert point.flow == min(point.intersections)
    assert any("lowest-flow one is reported" in w for w in point.warnings)


def test_a_point_beyond_the_data_is_outside_curve_without_invented_values() -> None:
    data = copy.deepcopy(MINIMAL)
    data["delivery"]["level"] = "60 m"  # 40 m fall: gravity alone pushes hard
    data["segment"][0]["diameter"] = "150 mm"
    data["pump"] = [{"name": "small", "library": "small booster 2900 rpm"}]
    point = analyze(case_from_dict(data)).operating_points[0]
    assert point.status == "outside-curve"
    assert point.efficiency is None and point.shaft_power is None


@settings(max_examples=30, deadline=None)
@given(static=st.floats(-15.0, 30.0), count=st.integers(1, 3))
def test_more_pumps_in_parallel_never_give_less_flow(static: float, count: int) -> None:
    pump = pump_data.load("small booster 2900 rpm")
    data = copy.deepcopy(MINIMAL)
    data["delivery"]["level"] = f"{100 + static} m"
    data["segment"][0]["diameter"] = "60 mm"
    case = case_from_dict(data)
    batch = ScenarioBatch(case.pipeline, case.scenarios)
    fewer = solve_fixed_speed(batch, Combined(pump, count, "parallel"))[0]
    more = solve_fixed_speed(batch, Combined(pump, count + 1, "parallel"))[0]
    if fewer.flow is not None:
        assert more.flow is not None and more.flow >= fewer.flow * (1 - 1e-12)


def test_series_adds_heads_and_parallel_adds_flows() -> None:
    # Analytic combination rules.
    pump = pump_data.load("inline booster A 2900 rpm")
    flows = np.linspace(0.0, pump.max_flow, 9)
    np.testing.assert_allclose(Combined(pump, 3, "series").head(flows), 3 * pump.head_at(flows))
    np.testing.assert_allclose(
        Combined(pump, 2, "parallel").head(2 * flows), pump.head_at(flows), rtol=1e-12
    )


def test_different_pumps_in_parallel_share_the_header_head() -> None:
    small = pump_data.load("inline booster A 2900 rpm")
    large = pump_data.load("inline booster B 2900 rpm")
    head = 0.5 * (small.shutoff_head + small.head[-1])
    flows = mixed_parallel_flows((small, large), head)
    assert flows[0] == pytest.approx(float(flow_at_head(small, head)))
    # (this head lies beyond B's data: its curve continues along its end slope)
    assert flows[1] == pytest.approx(float(flow_at_head(large, head, extrapolate=True)))
    # above the small pump's shutoff head it delivers nothing (its check valve stays shut)
    assert mixed_parallel_flows((small, large), small.shutoff_head + 1.0)[0] == 0.0


def test_a_weak_pump_in_a_mixed_parallel_set_says_it_delivers_nothing() -> None:
    data = copy.deepcopy(MINIMAL)
    data["delivery"]["level"] = "109 m"  # 9 m lift: above booster A's 8.5 m shutoff
    data["pump"] = [
        {"name": "A", "library": "inline booster A 2900 rpm"},
        {"name": "B", "library": "inline booster B 2900 rpm"},
    ]
    data["arrangement"] = [{"pumps": ["A", "B"]}]
    point = analyze(case_from_dict(data)).operating_points[0]
    assert point.status in ("ok", "outside-curve")
    assert point.units[0].flow == 0.0 and point.units[1].flow > 0
    assert any("A delivers nothing" in w for w in point.warnings)


def test_energy_figures_follow_power_hours_and_tariff() -> None:
    case = demo()
    point = next(p for p in analyze(case).operating_points if p.shaft_power)
    operation = case.pump_part.operation
    assert operation.motor_efficiency is not None and operation.hours_per_year is not None
    power_in = point.shaft_power / operation.motor_efficiency
    assert point.annual_energy_kwh == pytest.approx(power_in * operation.hours_per_year / 1000)
    assert point.annual_cost == pytest.approx(point.annual_energy_kwh * operation.tariff)
    assert point.specific_energy_kwh_m3 == pytest.approx(power_in / point.flow / 3.6e6)


def test_grouped_and_single_solves_agree() -> None:
    # Regression between two routes of the engine: the vectorised group solve of falling
    # curves and the one-arrangement grid solve.
    from syscurve.operating import solve_all

    case = demo()
    batch = ScenarioBatch(case.pipeline, case.scenarios)
    pump = pump_data.load("inline booster B 2900 rpm")
    arrangements = [
        Arrangement(f"{n} {c} {v}", (pump,) * n, c, v)
        for n, c in ((1, "single"), (2, "parallel"), (3, "series"))
        for v in (None, 2000.0, 2600.0)
    ]
    grouped = solve_all(batch, arrangements, case.demand)
    for arrangement, group in zip(arrangements, grouped, strict=True):
        unit = arrangement.units_at()[0]
        single = solve_fixed_speed(batch, Combined(unit, arrangement.count, arrangement.connection))
        for a, b in zip(group, single, strict=True):
            assert a.status == b.status
            if a.flow is not None:
                assert a.flow == pytest.approx(b.flow, rel=1e-9)
                assert a.head == pytest.approx(b.head, rel=1e-9)
