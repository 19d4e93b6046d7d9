"""Gravity alone: the flow it delivers, the source level it needs, the diameter that works."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .roots import bracket_increasing, brent
from .system import Pipeline, Scenario, SystemCurve


def gravity_flow(curve: SystemCurve) -> float:
    """Flow that gravity alone delivers in this scenario: the root of H_sys(Q) = 0.

    Returns 0 when the static head is not negative (gravity cannot start a flow).
    H_sys increases with flow, so the root is unique; it is bracketed by doubling
    from the flow at 1 m/s in the narrowest segment, then found by Brent's method
    to about 1e-15 relative. [m^3/s]
    """
    if curve.static_head >= 0:
        return 0.0

    def head(flow: float) -> float:
        return float(curve.head(flow))

    narrowest = min(s.area for s in curve.pipeline.segments)
    lower, upper = bracket_increasing(head, 0.0, 1.0 * narrowest)
    return brent(head, lower, upper)


def required_source_level(curve: SystemCurve, demand: float) -> float:
    """Source level at which gravity alone exactly delivers `demand` [m^3/s]. [m]

    Raising the source by dz lowers H_sys by dz at every flow, so the level needed is
    the scenario's source level plus H_sys(demand).
    """
    return curve.scenario.source_level + float(curve.head(demand))


@dataclass(frozen=True)
class DiameterChoice:
    """The smallest candidate inside diameter that meets the demand by gravity."""

    label: str
    diameter: float  # [m]
    source: str
    head_at_demand: float  # [m], H_sys(demand) with this diameter, <= 0
    segments: tuple[str, ...]


def smallest_diameter(
    pipeline: Pipeline,
    scenario: Scenario,
    demand: float,
    candidates: list[tuple[str, float, str]],
    segment_names: set[str] | None = None,
) -> DiameterChoice | None:
    """Smallest candidate diameter that lets gravity deliver `demand` in `scenario`.

    Parameters
    ----------
    pipeline : Pipeline
    scenario : Scenario
        Normally the governing scenario (highest H_sys at the demand).
    demand : float
        [m^3/s]
    candidates : list of (label, inside diameter [m], source)
    segment_names : set of str, optional
        Segments that take the candidate diameter; all segments when None.

    Returns
    -------
    DiameterChoice or None
        None when no candidate works.
    """
    names = tuple(
        s.name for s in pipeline.segments if segment_names is None or s.name in segment_names
    )
    resized = [s for s in pipeline.segments if segment_names is None or s.name in segment_names]
    for label, diameter, source in sorted(candidates, key=lambda c: c[1]):
        if not (math.isfinite(diameter) and diameter > 0):
            continue
        if any(s.roughness_at(scenario.age_years) >= 0.5 * diameter for s in resized):
            continue  # roughness as large as the radius: not a pipe
        curve = pipeline.with_diameters(diameter, segment_names).at(scenario)
        head = float(curve.head(demand))
        if head <= 0:
            return DiameterChoice(label, diameter, source, head, names)
    return None


def curve_flows(demand: float, gravity_flows: list[float], points: int = 101) -> np.ndarray:
    """Flows for a plotted or reported curve: 0 up to past the demand and the gravity flows."""
    top = 1.5 * demand
    finite = [q for q in gravity_flows if q > 0]
    if finite:
        top = max(top, min(1.15 * max(finite), 4.0 * demand))
    return np.linspace(0.0, top, points)
