"""NPSH available against values rebuilt from their published inputs.

Each row: site altitude (barometric pressure from the US Standard Atmosphere 1976),
water temperature (vapour pressure and density from IAPWS-95), static suction head
(+ flooded, - lift), suction loss, and NPSHa = (p_atm - p_v)/(rho g0) + z - h_loss
computed with those published inputs (g0 = 9.80665 m/s^2). The engine rebuilds each
from the same inputs with its own atmosphere and IAPWS-IF97 water; IF97 differs from
IAPWS-95 by at most 1.5e-5 in density and 7e-5 in vapour pressure, so 2 mm.
"""

from __future__ import annotations

import copy
from typing import Any

import numpy as np
import pytest

from syscurve import analyze, case_from_dict
from syscurve.atmosphere import barometric_pressure
from syscurve.npsh import npsh_available
from syscurve.water import density, saturation_pressure
from tests.conftest import MINIMAL

# altitude [m], temperature [C], z static [m], suction loss [m], NPSHa [m]
ROWS = [
    (0, 10, -3, 0.5, 6.71007),
    (0, 10, 2, 0.5, 11.7101),
    (0, 20, -3, 0.5, 6.61186),
    (0, 20, 2, 0.5, 11.6119),
    (0, 40, -3, 0.5, 6.15437),
    (0, 40, 2, 0.5, 11.1544),
    (0, 60, -3, 0.5, 4.94013),
    (0, 60, 2, 0.5, 9.94013),
    (0, 80, -3, 0.5, 2.15692),
    (0, 80, 2, 0.5, 7.15692),
    (500, 10, -3, 0.5, 6.11196),
    (500, 10, 2, 0.5, 11.112),
    (500, 20, -3, 0.5, 6.01285),
    (500, 20, 2, 0.5, 11.0129),
    (500, 40, -3, 0.5, 5.55174),
    (500, 40, 2, 0.5, 10.5517),
    (500, 60, -3, 0.5, 4.33198),
    (500, 60, 2, 0.5, 9.33198),
    (500, 80, -3, 0.5, 1.54163),
    (500, 80, 2, 0.5, 6.54163),
    (1000, 10, -3, 0.5, 5.54228),
    (1000, 10, 2, 0.5, 10.5423),
    (1000, 20, -3, 0.5, 5.44232),
    (1000, 20, 2, 0.5, 10.4423),
    (1000, 40, -3, 0.5, 4.97776),
    (1000, 40, 2, 0.5, 9.97776),
    (1000, 60, -3, 0.5, 3.75274),
    (1000, 60, 2, 0.5, 8.75274),
    (1000, 80, -3, 0.5, 0.95559),
    (1000, 80, 2, 0.5, 5.95559),
    (2000, 10, -3, 0.5, 4.48402),
    (2000, 10, 2, 0.5, 9.48402),
    (2000, 20, -3, 0.5, 4.38248),
    (2000, 20, 2, 0.5, 9.38248),
    (2000, 40, -3, 0.5, 3.91152),
    (2000, 40, 2, 0.5, 8.91152),
    (2000, 60, -3, 0.5, 2.67671),
    (2000, 60, 2, 0.5, 7.67671),
    (2000, 80, -3, 0.5, -0.133062),
    (2000, 80, 2, 0.5, 4.86694),
    (3000, 10, -3, 0.5, 3.52722),
    (3000, 10, 2, 0.5, 8.52722),
    (3000, 20, -3, 0.5, 3.42424),
    (3000, 20, 2, 0.5, 8.42424),
    (3000, 40, -3, 0.5, 2.9475),
    (3000, 40, 2, 0.5, 7.9475),
    (3000, 60, -3, 0.5, 1.70384),
    (3000, 60, 2, 0.5, 6.70384),
    (3000, 80, -3, 0.5, -1.11735),
    (3000, 80, 2, 0.5, 3.88265),
]


@pytest.mark.parametrize(("altitude", "celsius", "static", "loss", "expected"), ROWS)
def test_npsh_available_matches_the_rebuilt_table(
    altitude: float, celsius: float, static: float, loss: float, expected: float
) -> None:
    temperature = 273.15 + celsius
    pressure = barometric_pressure(altitude)
    value = npsh_available(
        surface_pressure=pressure,
        vapor_pressure=float(saturation_pressure(temperature)),
        density=float(density(temperature, pressure)),
        source_level=static,
        inlet_elevation=0.0,
        suction_loss=loss,
    )
    assert value == pytest.approx(expected, abs=2e-3)


def test_npsh_available_at_altitude_and_heat_can_go_negative() -> None:
    # Published-input row: 2000 m, 80 C, 3 m lift, 0.5 m loss gives -0.133 m: the pump
    # would need a flooded suction.
    row = next(r for r in ROWS if r[:4] == (2000, 80, -3, 0.5))
    assert row[4] < 0


def test_operating_points_use_the_suction_loss_at_their_flow(demo_data: dict[str, Any]) -> None:
    # End to end: the NPSHa of each point equals the formula with the engine's suction loss
    # at that point's flow, the warmest water (temperature_max) and the site's pressure.
    case = case_from_dict(demo_data)
    report = analyze(case)
    hot = case.liquid_hot
    assert hot is not None and hot.vapor_pressure is not None
    inlet = case.pump_part.station.inlet_elevation
    assert inlet is not None
    for point in report.operating_points:
        if point.flow is None:
            continue
        scenario = next(s for s in case.scenarios if s.name == point.scenario)
        curve = case.pipeline.at(scenario)
        suction = sum(
            float(loss.friction_loss + loss.minor_loss)
            for loss in curve.losses(np.array(point.flow), suction_only=True)
        )
        expected = (
            (case.barometric_pressure - hot.vapor_pressure) / (hot.density * 9.80665)
            + (scenario.source_level - inlet)
            - suction
        )
        assert point.npsh_available == pytest.approx(expected, rel=1e-12)


def test_missing_inlet_elevation_means_npsh_cannot_be_judged(demo_data: dict[str, Any]) -> None:
    data = copy.deepcopy(demo_data)
    del data["pump_station"]["inlet_elevation"]
    point = analyze(case_from_dict(data)).operating_points[0]
    assert point.npsh_available is None
    assert any("NPSH cannot be judged" in w for w in point.warnings)


def test_short_npsh_margin_is_warned() -> None:
    data = copy.deepcopy(MINIMAL)
    data["liquid"]["temperature"] = "80 degC"
    data["site"] = {"altitude": "2000 m"}
    data["segment"].insert(
        0,
        {
            "name": "suction",
            "length": "6 m",
            "diameter": "100 mm",
            "material": "pvc",
            "suction": True,
        },
    )
    data["pump_station"] = {"inlet_elevation": "104 m"}  # 4 m suction lift
    data["delivery"]["level"] = "110 m"
    data["pump"] = [{"name": "B", "library": "inline booster B 2900 rpm"}]
    point = analyze(case_from_dict(data)).operating_points[0]
    assert point.npsh_available is not None and point.npsh_available < 0
    assert any("will cavitate" in w for w in point.warnings)
