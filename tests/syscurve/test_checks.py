"""Checks along the route: pressure profile, pipe ratings, method ranges, NPSH data."""

from __future__ import annotations

from typing import Any

import pytest

from syscurve import analyze, case_from_dict
from syscurve.units import G


def route_over_a_hill(minimal: dict[str, Any], summit: float) -> dict[str, Any]:
    # invented: source 100 m, tank 80 m, a summit between them
    minimal["segment"] = [
        {
            "name": "up",
            "length": "400 m",
            "diameter": "100 mm",
            "material": "pvc",
            "fittings": {"entrance-sharp": 1},
            "elevation_end": f"{summit} m",
        },
        {
            "name": "down",
            "length": "600 m",
            "diameter": "100 mm",
            "material": "pvc",
            "elevation_end": "79 m",
        },
    ]
    return minimal


def test_the_grade_line_is_the_source_head_less_losses_and_velocity_head(
    minimal: dict[str, Any],
) -> None:
    # Analytic: HGL at the end of the first segment = z_s - losses in it - V^2/2g.
    report = analyze(case_from_dict(route_over_a_hill(minimal, 90.0)))
    result = report.scenarios[0]
    assert result.profile_at_gravity_flow is not None
    node = result.profile_at_gravity_flow[0]
    first = result.curve.losses(result.gravity_flow)[0]
    expected = (
        100.0 - float(first.friction_loss + first.minor_loss) - float(first.velocity) ** 2 / (2 * G)
    )
    assert node.grade_line == pytest.approx(expected, rel=1e-12)
    assert node.pressure_head == pytest.approx(expected - 90.0, rel=1e-12)


def test_a_summit_above_the_grade_line_is_flagged_sub_atmospheric(minimal: dict[str, Any]) -> None:
    report = analyze(case_from_dict(route_over_a_hill(minimal, 99.0)))
    assert any("sub-atmospheric pressure" in w and "'up'" in w for w in report.warnings)
    low = analyze(case_from_dict(route_over_a_hill(minimal, 85.0)))
    assert not any("sub-atmospheric" in w for w in low.warnings)


def test_static_pressure_above_a_pipe_rating_is_flagged(minimal: dict[str, Any]) -> None:
    data = route_over_a_hill(minimal, 90.0)
    data["segment"][1]["elevation_end"] = "20 m"  # 80 m below the source: ~785 kPa static
    data["delivery"]["level"] = "21 m"
    data["segment"][1]["pressure_rating"] = "600 kPa"
    report = analyze(case_from_dict(data))
    assert any("exceeds its rating" in w and "'down'" in w for w in report.warnings)
    data["segment"][1]["pressure_rating"] = "1 MPa"
    assert not any("rating" in w for w in analyze(case_from_dict(data)).warnings)


def test_hazen_williams_warns_outside_ordinary_water_temperatures(minimal: dict[str, Any]) -> None:
    minimal["pipe"] = {"friction": "hazen-williams"}
    minimal["liquid"]["temperature"] = "60 degC"
    case = case_from_dict(minimal)
    assert any("Hazen-Williams at 60 degC" in w for w in case.warnings)


def test_velocity_outside_the_range_is_warned_with_its_source(minimal: dict[str, Any]) -> None:
    minimal["checks"] = {"velocity_min": "0.3 m/s", "velocity_max": "0.5 m/s"}
    report = analyze(case_from_dict(minimal))  # 5 L/s in 100 mm: 0.64 m/s
    assert any("is above 0.500 m/s" in w and "Jordan" in w for w in report.warnings)


def test_a_custom_liquid_without_vapour_pressure_cannot_be_judged_for_npsh(
    minimal: dict[str, Any],
) -> None:
    minimal["liquid"] = {"kind": "custom", "density": "870 kg/m^3", "viscosity": "12 cP"}
    minimal["pump_station"] = {"inlet_elevation": "99 m"}
    minimal["delivery"]["level"] = "110 m"
    minimal["pump"] = [{"name": "B", "library": "small booster 2900 rpm"}]
    point = analyze(case_from_dict(minimal)).operating_points[0]
    assert point.npsh_available is None
    assert any("no vapor_pressure" in w for w in point.warnings)


def test_transitional_flow_at_the_demand_is_flagged(minimal: dict[str, Any]) -> None:
    minimal["liquid"] = {"kind": "custom", "density": "870 kg/m^3", "viscosity": "25 cP"}
    report = analyze(case_from_dict(minimal))  # Re about 2,200
    assert any("transitional flow" in w for w in report.warnings)


def test_surge_screening_is_joukowsky_on_the_largest_steady_flow(minimal: dict[str, Any]) -> None:
    # Analytic (Joukowsky): dH = a V / g for a sudden stop; the wave speed given here.
    minimal["segment"][0]["wave_speed"] = "350 m/s"
    report = analyze(case_from_dict(minimal))
    flow = max(report.case.demand, *(r.gravity_flow for r in report.scenarios))
    velocity = flow / report.case.pipeline.segments[0].area
    expected = 350.0 * velocity / G
    caution = next(c for c in report.cautions if c.startswith("Surge screening"))
    assert f"about {expected:.0f} m in segment 'main'" in caution
    assert f"about {2 * 1000 / 350:.2g} s" in caution
