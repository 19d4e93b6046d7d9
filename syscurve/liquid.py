"""The flowing liquid: density, viscosity and vapour pressure at one temperature."""

from __future__ import annotations

from dataclasses import dataclass

from . import water
from .errors import CaseError
from .units import ZERO_CELSIUS


@dataclass(frozen=True)
class Liquid:
    """A liquid at one state; all values SI.

    Parameters
    ----------
    name : str
        "water" or the user's name for a custom liquid.
    density : float
        [kg/m^3]
    viscosity : float
        Dynamic viscosity. [Pa s]
    vapor_pressure : float or None
        Absolute vapour pressure. [Pa]; None when a custom liquid does not give it
        (NPSH then cannot be judged).
    temperature : float or None
        [K]; None when a custom liquid gives no temperature.
    is_water : bool
        True when the properties come from the IAPWS formulations for water.
    """

    name: str
    density: float
    viscosity: float
    vapor_pressure: float | None
    temperature: float | None = None
    is_water: bool = False

    def __post_init__(self) -> None:
        for key, value in (
            ("density", self.density),
            ("viscosity", self.viscosity),
        ):
            if not value > 0:
                raise CaseError(f"must be > 0, got {value}", f"liquid.{key}")
        if self.vapor_pressure is not None and not self.vapor_pressure >= 0:
            raise CaseError(f"must be >= 0, got {self.vapor_pressure}", "liquid.vapor_pressure")

    @property
    def kinematic_viscosity(self) -> float:
        """nu = mu / rho. [m^2/s]"""
        return self.viscosity / self.density


def water_at(temperature: float, pressure: float, key: str = "liquid.temperature") -> Liquid:
    """Liquid water at `temperature` [K] under absolute `pressure` [Pa].

    Density from IAPWS-IF97 region 1, viscosity from IAPWS R12-08 and vapour pressure
    from the IF97 saturation line (see `syscurve.water`).

    Raises
    ------
    CaseError
        Naming `key`, when the water would be ice (below 0 degC) or would boil at
        `pressure` (its vapour pressure reaches `pressure`).
    """
    celsius = temperature - ZERO_CELSIUS
    if temperature < water.MIN_TEMPERATURE:
        raise CaseError(
            f"water at {celsius:.2f} degC would be ice; give a temperature of 0 degC or more",
            key,
        )
    if temperature > water.MAX_TEMPERATURE:
        raise CaseError(
            f"water at {celsius:.1f} degC is outside the liquid range computed "
            f"(up to {water.MAX_TEMPERATURE - ZERO_CELSIUS:.0f} degC)",
            key,
        )
    if not water.MIN_SATURATION_PRESSURE < pressure <= water.MAX_PRESSURE:
        raise CaseError(
            f"the liquid's absolute pressure {pressure / 1000:.3g} kPa is outside the range "
            "computed for water; check site.barometric_pressure and source.gauge_pressure",
            key,
        )
    vapor_pressure = float(water.saturation_pressure(temperature))
    if vapor_pressure >= pressure:
        boiling = float(water.saturation_temperature(pressure)) - ZERO_CELSIUS
        raise CaseError(
            f"water at {celsius:.1f} degC would boil at the source's absolute pressure "
            f"{pressure / 1000:.1f} kPa (it boils there at {boiling:.1f} degC); "
            "give a lower temperature or a pressurised source",
            key,
        )
    density = float(water.density(temperature, pressure))
    viscosity = float(water.viscosity(temperature, density))
    return Liquid("water", density, viscosity, vapor_pressure, temperature, True)
