"""Barometric pressure against the US Standard Atmosphere 1976.

Published: NOAA-S/T 76-1562 (1976); its tables give 8.9876e4 Pa at 1000 m and 7.0121e4 Pa
at 3000 m (from memory). The grid below was computed from the standard's formula and
agrees with two reference libraries (`fluids.atmosphere.ATMOSPHERE_1976` and
`ambiance`, ICAO 1993) to 0.02 Pa; the `fluids` one is also evaluated live here.
"""

from __future__ import annotations

import pytest

from syscurve.atmosphere import barometric_pressure, geopotential_altitude
from syscurve.errors import CaseError

# geometric altitude [m] -> pressure [Pa]
USSA_1976 = {
    0: 101325.00,
    300: 97772.74,
    500: 95461.29,
    1000: 89876.29,
    1500: 84559.68,
    2000: 79501.42,
    2500: 74691.76,
    3000: 70121.16,
    4000: 61660.44,
}


@pytest.mark.parametrize(("altitude", "pressure"), sorted(USSA_1976.items()))
def test_barometric_pressure_matches_the_standard_atmosphere(
    altitude: float, pressure: float
) -> None:
    assert barometric_pressure(altitude) == pytest.approx(pressure, abs=0.02)


def test_printed_table_values_from_memory() -> None:
    # USSA 1976 tables (from memory), 5 significant figures.
    assert barometric_pressure(1000) == pytest.approx(8.9876e4, rel=1e-4)
    assert barometric_pressure(3000) == pytest.approx(7.0121e4, rel=1e-4)


def test_agrees_with_the_fluids_library() -> None:
    fluids_atmosphere = pytest.importorskip("fluids.atmosphere")
    for altitude in (-400.0, 0.0, 750.0, 1450.0, 2800.0, 5000.0, 10000.0):
        expected = fluids_atmosphere.ATMOSPHERE_1976(altitude).P
        assert barometric_pressure(altitude) == pytest.approx(expected, rel=1e-7)


def test_geopotential_altitude_differs_from_geometric_by_0_16_m_at_1000_m() -> None:
    # Published relation H = r0 Z / (r0 + Z), r0 = 6 356 766 m.
    assert 1000 - geopotential_altitude(1000) == pytest.approx(0.157, abs=1e-3)


def test_altitude_outside_the_formula_range_names_the_key() -> None:
    with pytest.raises(CaseError) as error:
        barometric_pressure(20000.0)
    assert error.value.problems[0].key == "site.altitude"
    assert "barometric_pressure" in str(error.value)
