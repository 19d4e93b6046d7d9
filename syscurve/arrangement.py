"""Pump arrangements: one pump, N identical pumps in parallel or series, mixed pumps in
parallel, at a fixed speed or at the speed that delivers the demand.

Combination rules (analytic): in parallel, flows add at equal head, so N identical
pumps give H(Q) = h(Q/N); in series, heads add at equal flow, H(Q) = N h(Q). Pumps of
different kinds in parallel share the header head H; each delivers h_i^-1(H), and
one whose shutoff head is below H delivers nothing (its check valve stays shut).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .errors import CaseError
from .pump import PumpCurve, flow_at_head

FloatArray = NDArray[np.float64]

CONNECTIONS = ("single", "parallel", "series")


@dataclass(frozen=True, eq=False)
class Arrangement:
    """What to evaluate on the system.

    Parameters
    ----------
    name : str
    pumps : tuple of PumpCurve
        One entry per unit; identical units repeat the same curve.
    connection : str
        "single", "parallel" or "series".
    speed_rpm : float or None
        Shaft speed of every unit; None runs each at the speed of its curve.
    for_demand : bool
        Solve, per scenario, the speed at which the arrangement delivers the demand.
    """

    name: str
    pumps: tuple[PumpCurve, ...]
    connection: str = "single"
    speed_rpm: float | None = None
    for_demand: bool = False

    def __post_init__(self) -> None:
        if not self.pumps:
            raise CaseError("needs at least one pump", f"arrangement '{self.name}'")
        if self.connection not in CONNECTIONS:
            raise CaseError(
                f'unknown connection "{self.connection}"; use parallel or series',
                f"arrangement '{self.name}'.connection",
            )
        if self.connection == "single" and len(self.pumps) != 1:
            raise CaseError("single means one pump", f"arrangement '{self.name}'.count")
        if not self.identical and self.connection == "series":
            raise CaseError(
                "different pumps are combined in parallel only",
                f"arrangement '{self.name}'.connection",
            )
        if not self.identical and (self.for_demand or self.speed_rpm is not None):
            raise CaseError(
                "a speed applies to identical pumps only",
                f"arrangement '{self.name}'.speed",
            )

    @property
    def count(self) -> int:
        return len(self.pumps)

    @property
    def identical(self) -> bool:
        return all(p is self.pumps[0] for p in self.pumps)

    @property
    def pump_label(self) -> str:
        """The pump's name, or the names joined with " + " for mixed pumps."""
        if self.identical:
            return self.pumps[0].name
        return " + ".join(p.name for p in self.pumps)

    @property
    def rated_speed_rpm(self) -> float:
        """Speed of the (identical) pumps' curve data. [rpm]"""
        return self.pumps[0].speed_rpm

    def units_at(self, speed_ratio: float = 1.0) -> tuple[PumpCurve, ...]:
        """Each unit's curve, at `speed_ratio` times the arrangement's speed."""
        if self.identical:
            base = self.speed_rpm if self.speed_rpm is not None else self.rated_speed_rpm
            speed = base * speed_ratio
            unit = self.pumps[0]
            scaled = unit if speed == unit.speed_rpm else unit.at_speed(speed)
            return (scaled,) * self.count
        return self.pumps


@dataclass(frozen=True)
class Combined:
    """The combined curve of identical units: total head against total flow."""

    unit: PumpCurve
    count: int
    connection: str

    @property
    def parallel_units(self) -> int:
        return self.count if self.connection == "parallel" else 1

    @property
    def series_units(self) -> int:
        return self.count if self.connection == "series" else 1

    @property
    def max_flow(self) -> float:
        """Total flow at the end of the data. [m^3/s]"""
        return self.unit.max_flow * self.parallel_units

    @property
    def min_flow(self) -> float:
        """Total flow at the first data point. [m^3/s]"""
        return float(self.unit.flow[0]) * self.parallel_units

    @property
    def shutoff_head(self) -> float:
        return self.unit.shutoff_head * self.series_units

    def head(self, flow: ArrayLike, extrapolate: bool = True) -> FloatArray:
        """Total head at total `flow`. [m]"""
        Q = np.asarray(flow, dtype=float)
        return self.series_units * self.unit.head_at(Q / self.parallel_units, extrapolate)

    def unit_flow(self, flow: ArrayLike) -> FloatArray:
        return np.asarray(flow, dtype=float) / self.parallel_units

    def unit_head(self, head: ArrayLike) -> FloatArray:
        return np.asarray(head, dtype=float) / self.series_units


def mixed_parallel_flows(units: tuple[PumpCurve, ...], head: float) -> list[float]:
    """Each unit's flow at a common header `head` [m]; 0 where it cannot open its check
    valve (shutoff head not above the header head). Extrapolates beyond the data."""
    flows = []
    for unit in units:
        if head >= unit.shutoff_head:
            flows.append(0.0)
            continue
        q = float(flow_at_head(unit, head, extrapolate=True))
        flows.append(q if np.isfinite(q) and q > 0 else 0.0)
    return flows
