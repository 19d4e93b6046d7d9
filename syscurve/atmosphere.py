"""Barometric pressure from site altitude: US Standard Atmosphere 1976.

Below 11 km geopotential altitude (the troposphere) the standard atmosphere has a
constant lapse rate and

    P = P0 (T / T0)^(g0 M0 / (R* L)),   T = T0 - L H,   H = r0 Z / (r0 + Z)

with geometric altitude Z and geopotential altitude H. In this layer the 1976
standard is identical to the ICAO standard atmosphere (ISO 2533).

References
----------
.. [1] NOAA, NASA, USAF (1976). U.S. Standard Atmosphere, 1976. NOAA-S/T 76-1562,
   Washington DC, eqs. 18, 33a and Table 4.
"""

from __future__ import annotations

from .errors import CaseError
from .units import P_STANDARD, G

#: Sea-level standard temperature. [K]
T0 = 288.15
#: Temperature lapse rate of the lowest layer (temperature falls with height). [K/m]
LAPSE_RATE = 0.0065
#: Mean molecular weight of sea-level air. [kg/mol]
MOLAR_MASS_AIR = 0.0289644
#: Gas constant as defined by the 1976 standard. [J/(mol K)]
GAS_CONSTANT_1976 = 8.31432
#: Effective Earth radius for geopotential altitude. [m]
EARTH_RADIUS = 6356766.0
#: Altitudes (geometric) the formula is used for: the standard's lowest tabulated
#: level to the top of the troposphere. [m]
ALTITUDE_RANGE = (-5000.0, 11000.0)

_EXPONENT = G * MOLAR_MASS_AIR / (GAS_CONSTANT_1976 * LAPSE_RATE)  # 5.255876...


def geopotential_altitude(altitude: float) -> float:
    """Geopotential altitude H [m] of geometric altitude Z [m]: H = r0 Z / (r0 + Z)."""
    return EARTH_RADIUS * altitude / (EARTH_RADIUS + altitude)


def barometric_pressure(altitude: float, key: str = "site.altitude") -> float:
    """Standard atmospheric pressure at a geometric altitude.

    Parameters
    ----------
    altitude : float
        Geometric altitude above mean sea level. [m]
    key : str
        Key path for the error message.

    Returns
    -------
    float
        Absolute pressure. [Pa]
    """
    low, high = ALTITUDE_RANGE
    if not low <= altitude <= high:
        raise CaseError(
            f"altitude {altitude:.0f} m is outside the {low:.0f} to {high:.0f} m the standard "
            "atmosphere formula covers; give site.barometric_pressure instead",
            key,
        )
    temperature = T0 - LAPSE_RATE * geopotential_altitude(altitude)
    return P_STANDARD * (temperature / T0) ** _EXPONENT
