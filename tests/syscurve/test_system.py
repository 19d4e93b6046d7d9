"""System head: definition, scenarios, transitions, and its properties."""

from __future__ import annotations

import math
from typing import Any

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import syscurve
from syscurve.case import case_from_dict
from syscurve.friction import MODELS
from syscurve.gravity import gravity_flow
from syscurve.liquid import Liquid
from syscurve.pipe import Segment
from syscurve.system import Pipeline, Scenario, build_scenarios
from syscurve.units import G

WATER = Liquid("water-like", 998.2, 1.0016e-3, 2339.0, 293.15, False)


def test_static_head_is_the_system_head_at_zero_flow(minimal: dict[str, Any]) -> None:
    case = case_from_dict(minimal)
    head = syscurve.system_head(case, [0.0])
    assert head[0] == pytest.approx(80.0 - 100.0)  # analytic: z_d - z_s


def test_single_segment_head_is_darcy_weisbach_plus_minor_and_outlet_terms() -> None:
    # Analytic composition of H_sys for one segment, f from the same Colebrook solver.
    segment = Segment("s", 500.0, 0.1, roughness=0.05e-3, fittings=(("elbow-90", 2, 0.9),))
    pipeline = Pipeline(WATER, (segment,), MODELS["colebrook"])
    curve = pipeline.at(Scenario("x", 10.0, 30.0))
    q = 0.012
    v = q / (math.pi * 0.1**2 / 4)
    re = v * 0.1 / WATER.kinematic_viscosity
    f = float(MODELS["colebrook"].turbulent(re, 0.05e-3 / 0.1))  # type: ignore[misc]
    expected = 20.0 + (f * 500 / 0.1 + 1.8 + 1.0) * v**2 / (2 * G)
    assert float(curve.head(q)) == pytest.approx(expected, rel=1e-12)


def test_pressure_outlet_adds_the_residual_as_head_of_the_liquid(minimal: dict[str, Any]) -> None:
    tank = syscurve.system_head(case_from_dict(minimal), [0.004])[0]
    minimal["delivery"].update({"outlet": "pressure", "residual_pressure": "150 kPa"})
    case = case_from_dict(minimal)
    pressure = syscurve.system_head(case, [0.004])[0]
    assert pressure - tank == pytest.approx(150e3 / (case.liquid.density * G), rel=1e-12)


def test_closed_source_vessel_pressure_lowers_the_system_head(minimal: dict[str, Any]) -> None:
    open_tank = syscurve.system_head(case_from_dict(minimal), [0.0])[0]
    minimal["source"]["gauge_pressure"] = "50 kPa"
    case = case_from_dict(minimal)
    assert open_tank - syscurve.system_head(case, [0.0])[0] == pytest.approx(
        50e3 / (case.liquid.density * G), rel=1e-12
    )


def test_transitions_add_borda_carnot_and_contraction_losses() -> None:
    small = Segment("small", 10.0, 0.05, roughness=0.0)
    large = Segment("large", 10.0, 0.10, roughness=0.0)
    q = 0.004
    with_t = Pipeline(WATER, (small, large), MODELS["colebrook"])
    without = Pipeline(WATER, (small, large), MODELS["colebrook"], transitions=False)
    scenario = Scenario("x", 0.0, 0.0)
    v_small = q / small.area
    expected = (1 - 0.25) ** 2 * v_small**2 / (2 * G)  # Borda-Carnot, beta^2 = 0.25
    difference = float(with_t.at(scenario).head(q) - without.at(scenario).head(q))
    assert difference == pytest.approx(expected, rel=1e-12)


def test_scenarios_follow_the_contract() -> None:
    scenarios = build_scenarios(
        100.0,
        80.0,
        source_level_min=98.0,
        source_level_max=101.0,
        delivery_level_max=82.0,
        age_years=20.0,
    )
    by_name = {s.name: s for s in scenarios}
    assert list(by_name) == ["nominal", "max-static", "min-static"]
    assert (by_name["max-static"].source_level, by_name["max-static"].delivery_level) == (98, 82)
    assert by_name["max-static"].age_years == 20.0
    assert (by_name["min-static"].source_level, by_name["min-static"].delivery_level) == (101, 80)
    assert by_name["min-static"].age_years == 0.0
    assert [s.name for s in build_scenarios(100.0, 80.0)] == ["nominal"]


def test_aged_pipe_is_rougher_in_max_static(demo_data: dict[str, Any]) -> None:
    case = case_from_dict(demo_data)
    nominal, max_static, min_static = (case.pipeline.at(s) for s in case.scenarios)
    assert max_static.roughness[0] > min_static.roughness[0]
    assert max_static.roughness[0] == pytest.approx(0.15e-3 + 25 * 0.05e-3)


def test_hazen_williams_c_declines_with_age_but_not_below_the_floor() -> None:
    segment = Segment("s", 1.0, 0.1, hazen_williams_c=130.0, hazen_williams_c_decline=1.5)
    assert segment.hazen_williams_c_at(20.0, 60.0) == pytest.approx(100.0)
    assert segment.hazen_williams_c_at(100.0, 60.0) == 60.0


def test_system_head_api_names_the_scenarios_it_knows(minimal: dict[str, Any]) -> None:
    case = case_from_dict(minimal)
    heads = syscurve.system_head(case, np.linspace(0, 0.01, 7))
    assert heads.shape == (7,)
    with pytest.raises(KeyError, match="it has: nominal"):
        syscurve.system_head(case, [0.0], scenario="max-static")


# --- properties ---------------------------------------------------------------------

segment_strategy = st.builds(
    lambda length, diameter, roughness, k: Segment(
        "s", length, diameter, roughness=roughness * diameter, k_extra=k
    ),
    length=st.floats(1.0, 5000.0),
    diameter=st.floats(0.01, 1.0),
    roughness=st.floats(0.0, 0.05),
    k=st.floats(0.0, 20.0),
)


@settings(max_examples=60, deadline=None)
@given(
    segments=st.lists(segment_strategy, min_size=1, max_size=5),
    model=st.sampled_from(["colebrook", "swamee-jain", "haaland", "churchill"]),
    nu=st.floats(1e-7, 1e-4),
    static=st.floats(-100.0, 100.0),
)
def test_system_head_increases_with_flow(
    segments: list[Segment], model: str, nu: float, static: float
) -> None:
    named = tuple(Segment(**{**s.__dict__, "name": f"s{i}"}) for i, s in enumerate(segments))
    liquid = Liquid("l", 1000.0, nu * 1000.0, 0.0)
    curve = Pipeline(liquid, named, MODELS[model]).at(Scenario("x", 0.0, static))
    # flows spanning laminar, transitional and turbulent flow in the narrowest pipe
    area = min(s.area for s in named)
    d = min(s.diameter for s in named)
    flows = np.geomspace(1e-3, 1e8, 400) * nu / d * area
    assert np.all(np.diff(curve.head(flows)) >= 0)
    # strictly on the losses alone: a static head would swamp the tiniest in rounding
    losses = Pipeline(liquid, named, MODELS[model]).at(Scenario("x", 0.0, 0.0)).head(flows)
    assert np.all(np.diff(losses) > 0)


@settings(max_examples=40, deadline=None)
@given(
    segments=st.lists(segment_strategy, min_size=1, max_size=4),
    fall=st.floats(0.5, 200.0),
)
def test_the_gravity_flow_zeroes_the_system_head(segments: list[Segment], fall: float) -> None:
    named = tuple(Segment(**{**s.__dict__, "name": f"s{i}"}) for i, s in enumerate(segments))
    curve = Pipeline(WATER, named, MODELS["colebrook"]).at(Scenario("x", fall, 0.0))
    flow = gravity_flow(curve)
    assert flow > 0
    assert abs(float(curve.head(flow))) < 1e-9 * fall
