"""Unit parsing and display conversion.

Exact unit constants are published definitions (NIST SP 811 / Handbook 44): 1 ft = 0.3048 m,
1 US gallon = 3.785411784 L, 1 imperial gallon = 4.54609 L, 1 psi = 6894.757293168 Pa,
1 hp = 550 ft lbf/s = 745.69987158 W, 1 lbf = 4.4482216152605 N, g0 = 9.80665 m/s^2 (3rd CGPM).
"""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from syscurve.errors import CaseError
from syscurve.units import (
    DISPLAY_SYSTEMS,
    Display,
    head_from_pressure,
    parse_head_or_pressure,
    parse_quantity,
    parse_temperature,
)

US_GALLON = 3.785411784e-3


@pytest.mark.parametrize(
    ("text", "kind", "expected"),
    [
        ("3.2 L/s", "flow", 0.0032),
        ("50 gpm", "flow", 50 * US_GALLON / 60),
        ("50 igpm", "flow", 50 * 4.54609e-3 / 60),
        ("1 MGD", "flow", 1e6 * US_GALLON / 86400),
        ("2 ML/d", "flow", 2e3 / 86400),
        ("11.5 m^3/h", "flow", 11.5 / 3600),
        ("3 in", "length", 0.0762),
        ("2300 m", "length", 2300.0),
        ("10 ft", "length", 3.048),
        ("60 psi", "pressure", 60 * 6894.757293168),
        ("60 psig", "pressure", 60 * 6894.757293168),
        ("1.2 bar", "pressure", 1.2e5),
        ("1.2 cP", "viscosity", 1.2e-3),
        ("15 kW", "power", 15000.0),
        ("20 hp", "power", 20 * 550 * 0.3048 * 4.4482216152605),
        ("2900 rpm", "rotational_speed", 2900.0),
        ("20 year", "duration", 20.0),
        ("1e-3 m", "length", 1e-3),
    ],
)
def test_quantities_parse_to_internal_units(text: str, kind: str, expected: float) -> None:
    assert parse_quantity(text, kind, "key") == pytest.approx(expected, rel=1e-12)


def test_us_and_imperial_gallons_stay_apart() -> None:
    us = parse_quantity("1 gpm", "flow", "k")
    imperial = parse_quantity("1 igpm", "flow", "k")
    assert imperial / us == pytest.approx(4.54609 / 3.785411784, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "kelvin"),
    [
        ("12 degC", 285.15),
        ("54 degF", 285.3722222),
        ("285 K", 285.0),
        ("-5 degC", 268.15),
        ("12 °C", 285.15),
    ],
)
def test_temperatures_in_celsius_fahrenheit_and_kelvin(text: str, kelvin: float) -> None:
    assert parse_temperature(text, "liquid.temperature") == pytest.approx(kelvin, rel=1e-9)


@pytest.mark.parametrize(
    ("value", "kind", "fragment"),
    [
        (80, "length", 'bare number 80; write e.g. "80 mm"'),
        ("80", "length", "expected a length with a unit"),
        ("3 L/s", "length", 'expected a length, got a volumetric flow "L/s"'),
        ("3 lps", "flow", 'unknown unit "lps"'),
        ("1.2 cp", "viscosity", "centipoise"),
        ("fast", "flow", 'expected "value unit"'),
        ("50 Hz", "rotational_speed", "rpm"),
    ],
)
def test_bad_quantities_name_the_key_and_the_fix(value: object, kind: str, fragment: str) -> None:
    with pytest.raises(CaseError) as error:
        parse_quantity(value, kind, "segment[2].diameter")
    message = str(error.value)
    assert message.startswith("segment[2].diameter: ")
    assert fragment in message


def test_temperature_needs_a_temperature_unit() -> None:
    with pytest.raises(CaseError, match="degC, degF or K"):
        parse_temperature("12 C", "liquid.temperature")
    with pytest.raises(CaseError, match="bare number"):
        parse_temperature(12, "liquid.temperature")


def test_pressure_becomes_head_through_the_liquids_own_density() -> None:
    # 100 kPa of a liquid of 850 kg/m^3 is 100000 / (850 * 9.80665) = 11.9966 m, not the
    # 10.197 m a fixed water density would give (analytic).
    assert parse_head_or_pressure("100 kPa", "k", 850.0) == pytest.approx(11.99664, rel=1e-5)
    assert parse_head_or_pressure("10 m", "k", 850.0) == 10.0
    assert head_from_pressure(9806.65, 1000.0) == pytest.approx(1.0, rel=1e-15)


def test_us_display_units() -> None:
    us = Display("US")
    assert us.value("flow", 6.30901964e-5) == pytest.approx(1.0, rel=1e-9)
    assert us.value("head", 0.3048) == pytest.approx(1.0, rel=1e-12)
    assert us.value("power", 745.69987158) == pytest.approx(1.0, rel=1e-9)
    assert us.value("temperature", 273.15) == pytest.approx(32.0)
    assert us.label("flow") == "gpm"


values = st.floats(min_value=1e-6, max_value=1e6, allow_nan=False)
kinds = st.sampled_from(
    ["flow", "head", "length", "diameter", "velocity", "pressure", "power", "density", "viscosity"]
)


@given(value=values, kind=kinds, system=st.sampled_from(sorted(DISPLAY_SYSTEMS)))
def test_display_round_trip(value: float, kind: str, system: str) -> None:
    display = Display(system)
    assert display.to_si(kind, display.value(kind, value)) == pytest.approx(value, rel=1e-12)


@given(value=values, system=st.sampled_from(sorted(DISPLAY_SYSTEMS)))
def test_case_strings_written_in_display_units_read_back(value: float, system: str) -> None:
    display = Display(system)
    kind_of = {"flow": "flow", "length": "length", "diameter": "length", "pressure": "pressure"}
    for display_kind, parse_kind in kind_of.items():
        text = display.quantity_string(display_kind, value, digits=12)
        assert parse_quantity(text, parse_kind, "k") == pytest.approx(value, rel=1e-9)
