"""Net positive suction head: what the system offers and the margin it keeps.

NPSH available at the pump inlet, from the source surface (energy balance):

    NPSHa = (p_surface,abs - p_v) / (rho g) + (z_source - z_inlet) - h_f,suction

with the absolute pressure on the source surface (barometric plus any vessel gauge
pressure), the vapour pressure at the warmest liquid temperature, and the losses of
the suction segments at the operating flow. z_source - z_inlet is positive for a
flooded suction and negative for a suction lift.

References
----------
.. [1] Any fluid-machinery text; ANSI/HI 9.6.1, Rotodynamic Pumps - Guideline for NPSH
   Margin (definitions).
"""

from __future__ import annotations

from dataclasses import dataclass

from .units import G

#: Guideline for the NPSH margin (configurable in [pump_station]): NPSHa/NPSHr >= 1.1
#: or NPSHa - NPSHr >= 0.6 m, whichever is greater.
NPSH_GUIDELINE_SOURCE = (
    "ANSI/HI 9.6.1-2012, water and wastewater, suction specific speed below 145 (metric); "
    "figures from a secondary summary of the standard, not read directly"
)
#: Preferred operating region as fractions of BEP flow (configurable): 70-120 % of BEP
#: flow for most rotodynamic pumps, narrower at high specific speed.
PREFERRED_REGION_SOURCE = (
    "ANSI/HI 9.6.3, most rotodynamic pumps (narrower at high specific speed); figures from "
    "a trade-journal summary of the standard, not read directly"
)


@dataclass(frozen=True)
class PumpStation:
    """Where the pumps sit and the limits their operating points are judged by.

    Parameters
    ----------
    inlet_elevation : float or None
        Pump suction centreline. [m]; None: NPSH available cannot be computed.
    margin_ratio : float
        Least NPSHa/NPSHr. [-]
    margin_min : float
        Least NPSHa - NPSHr. [m]
    preferred_region : (float, float)
        Preferred operating region as fractions of BEP flow. [-]
    """

    inlet_elevation: float | None = None
    margin_ratio: float = 1.1
    margin_min: float = 0.6
    preferred_region: tuple[float, float] = (0.7, 1.2)

    def npsh_needed(self, npsh_required: float) -> float:
        """NPSH available the guideline asks for at this NPSHr. [m]"""
        return max(self.margin_ratio * npsh_required, npsh_required + self.margin_min)


def npsh_available(
    *,
    surface_pressure: float,
    vapor_pressure: float,
    density: float,
    source_level: float,
    inlet_elevation: float,
    suction_loss: float,
) -> float:
    """NPSH available at the pump inlet. [m]

    Parameters
    ----------
    surface_pressure : float
        Absolute pressure on the source surface. [Pa]
    vapor_pressure : float
        Vapour pressure of the liquid at its warmest. [Pa]
    density : float
        Liquid density at that temperature. [kg/m^3]
    source_level, inlet_elevation : float
        Source surface and pump suction centreline. [m]
    suction_loss : float
        Friction and minor losses from the source to the pump inlet. [m]
    """
    return (
        (surface_pressure - vapor_pressure) / (density * G)
        + (source_level - inlet_elevation)
        - suction_loss
    )
