"""Pipe segments and their losses over arrays of flow."""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .errors import CaseError
from .friction import FrictionModel, friction_factor, reynolds
from .units import G

FloatArray = NDArray[np.float64]


@dataclass(frozen=True)
class Segment:
    """One straight run of pipe of one inside diameter, with its fittings.

    All values SI. ``k_fittings`` and ``k_extra`` refer to this segment's velocity
    head; transition losses at a change of diameter are added by the system.

    Parameters
    ----------
    name : str
    length : float
        [m], > 0
    diameter : float
        Inside diameter. [m], > 0
    roughness : float
        Absolute roughness of new pipe. [m], >= 0
    roughness_growth : float
        Linear growth of roughness with age. [m/year]
    hazen_williams_c : float or None
        Hazen-Williams C of new pipe. [-]
    hazen_williams_c_decline : float
        Loss of C per year of age. [1/year]
    fittings : tuple of (name, count, K each)
    k_extra : float
        Further loss coefficient. [-]
    suction : bool
        True for segments between the source and the pump inlet.
    material : str or None
    elevation_end : float or None
        Pipe centreline elevation at the downstream end. [m]
    pressure_rating : float or None
        Allowable gauge pressure of the pipe class. [Pa]
    wave_speed : float or None
        Pressure-wave speed, for the surge screening figure only. [m/s]
    """

    name: str
    length: float
    diameter: float
    roughness: float = 0.0
    roughness_growth: float = 0.0
    hazen_williams_c: float | None = None
    hazen_williams_c_decline: float = 0.0
    fittings: tuple[tuple[str, float, float], ...] = field(default=())
    k_extra: float = 0.0
    suction: bool = False
    material: str | None = None
    elevation_end: float | None = None
    pressure_rating: float | None = None
    wave_speed: float | None = None

    def __post_init__(self) -> None:
        where = f"segment '{self.name}'"
        for key, value in (("length", self.length), ("diameter", self.diameter)):
            if not (math.isfinite(value) and value > 0):
                raise CaseError(f"must be > 0, got {value:g} m", f"{where}.{key}")
        if not self.roughness >= 0:
            raise CaseError(f"must be >= 0, got {self.roughness:g} m", f"{where}.roughness")
        if self.roughness >= 0.5 * self.diameter:
            raise CaseError("is not smaller than the radius; check its unit", f"{where}.roughness")
        if not self.k_extra >= 0:
            raise CaseError(f"must be >= 0, got {self.k_extra:g}", f"{where}.k_extra")

    @property
    def area(self) -> float:
        """Flow area. [m^2]"""
        return math.pi * self.diameter**2 / 4.0

    @property
    def k_fittings(self) -> float:
        """Sum of the fittings' loss coefficients. [-]"""
        return sum(count * k for _, count, k in self.fittings)

    def roughness_at(self, age_years: float) -> float:
        """Absolute roughness at `age_years` (linear growth). [m]"""
        return self.roughness + self.roughness_growth * age_years

    def hazen_williams_c_at(self, age_years: float, floor: float) -> float | None:
        """Hazen-Williams C at `age_years`, never below `floor`."""
        if self.hazen_williams_c is None:
            return None
        return max(self.hazen_williams_c - self.hazen_williams_c_decline * age_years, floor)


@dataclass(frozen=True)
class SegmentLosses:
    """Losses of one segment at an array of flows (all arrays of the flows' shape)."""

    velocity: FloatArray  # [m/s]
    reynolds: FloatArray  # [-]
    friction_factor: FloatArray  # [-]
    friction_loss: FloatArray  # [m]
    minor_loss: FloatArray  # [m]


def segment_losses(
    flow: ArrayLike,
    *,
    length: float,
    diameter: float,
    roughness: float,
    k_minor: float,
    model: FrictionModel,
    kinematic_viscosity: float,
    hazen_williams_c: float | None = None,
) -> SegmentLosses:
    """Friction and minor losses of one segment over an array of flows.

    Parameters
    ----------
    flow : float or ndarray
        Volumetric flow. [m^3/s]
    length, diameter, roughness : float
        [m]
    k_minor : float
        Total minor-loss coefficient on this segment's velocity head. [-]
    model : FrictionModel
    kinematic_viscosity : float
        [m^2/s]
    hazen_williams_c : float, optional
        Needed by the Hazen-Williams model.

    Notes
    -----
    h_f = f (L/D) V^2/(2g) (Darcy-Weisbach), h_m = K V^2/(2g).
    """
    Q = np.abs(np.asarray(flow, dtype=float))
    velocity = Q * (4.0 / (math.pi * diameter**2))
    Re = reynolds(velocity, diameter, kinematic_viscosity)
    f = friction_factor(
        model,
        Re,
        roughness / diameter,
        velocity=velocity,
        diameter=diameter,
        hazen_williams_c=hazen_williams_c,
    )
    velocity_head = velocity * velocity / (2.0 * G)
    return SegmentLosses(
        velocity=velocity,
        reynolds=Re,
        friction_factor=f,
        friction_loss=f * (length / diameter) * velocity_head,
        minor_loss=k_minor * velocity_head,
    )
