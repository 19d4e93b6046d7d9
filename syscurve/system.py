"""The system: a pipeline between a source and a delivery point, and its scenarios.

System head, from the source's free surface to the delivery point, at flow Q:

    H_sys(Q) = (z_d + p_d/(rho g)) - (z_s + p_s/(rho g))
               + sum over segments (f L/D + sum K) V^2/(2g) + V_out^2/(2g)

The last term is the exit loss of a tank outlet, or the velocity head kept by a free
or pressure outlet. H_sys(0) is the static head; gravity alone delivers Q when
H_sys(Q) <= 0. For negative Q (used only to bracket roots) the curve is continued
antisymmetrically: static head minus the losses at |Q|.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from functools import cached_property
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .catalogue import HAZEN_WILLIAMS_C_FLOOR, contraction_k, expansion_k
from .errors import CaseError
from .friction import FrictionModel, friction_factor
from .liquid import Liquid
from .pipe import Segment, SegmentLosses, segment_losses
from .units import G

FloatArray = NDArray[np.float64]

OUTLETS = ("tank", "free", "pressure")


@dataclass(frozen=True)
class Scenario:
    """Boundary levels and pipe age of one credible condition."""

    name: str
    source_level: float  # [m]
    delivery_level: float  # [m]
    age_years: float = 0.0
    description: str = ""


@dataclass(frozen=True)
class Pipeline:
    """Liquid, route and end conditions, independent of levels and pipe age.

    Parameters
    ----------
    liquid : Liquid
    segments : tuple of Segment
        In order from the source to the delivery point.
    model : FrictionModel
    outlet : str
        "tank", "free" or "pressure".
    source_pressure_head : float
        Gauge pressure above the source surface, as head of the liquid. [m]
    delivery_pressure_head : float
        Vessel gauge pressure (tank) or required residual pressure (pressure), as head. [m]
    transitions : bool
        Add expansion and contraction losses between segments of different diameter.
    """

    liquid: Liquid
    segments: tuple[Segment, ...]
    model: FrictionModel
    outlet: str = "tank"
    source_pressure_head: float = 0.0
    delivery_pressure_head: float = 0.0
    transitions: bool = True

    def __post_init__(self) -> None:
        if not self.segments:
            raise CaseError("a case needs at least one [[segment]]", "segment")
        if self.outlet not in OUTLETS:
            raise CaseError(
                f'unknown outlet "{self.outlet}"; use one of {", ".join(OUTLETS)}',
                "delivery.outlet",
            )
        if self.model.name == "hazen-williams":
            if not self.liquid.is_water:
                raise CaseError(
                    "hazen-williams applies to water only; use colebrook for this liquid",
                    "pipe.friction",
                )
            for segment in self.segments:
                if segment.hazen_williams_c is None:
                    raise CaseError(
                        "hazen-williams needs a material or hazen_williams_c",
                        f"segment '{segment.name}'.hazen_williams_c",
                    )

    @cached_property
    def transition_k(self) -> tuple[float, ...]:
        """Loss coefficient at each segment's inlet from a change of diameter, on its own
        velocity head (0 for the first segment and where `transitions` is off)."""
        values = [0.0]
        for previous, segment in zip(self.segments, self.segments[1:], strict=False):
            d_up, d_down = previous.diameter, segment.diameter
            if not self.transitions or d_up == d_down:
                values.append(0.0)
            elif d_up < d_down:  # expansion: Borda-Carnot on the upstream velocity
                values.append(expansion_k(d_up, d_down) * (d_down / d_up) ** 4)
            else:  # contraction: on the downstream (own) velocity
                values.append(contraction_k(d_up, d_down))
        return tuple(values)

    @cached_property
    def k_minor(self) -> tuple[float, ...]:
        """Total minor-loss coefficient per segment on its own velocity head. [-]"""
        return tuple(
            s.k_fittings + s.k_extra + k_t
            for s, k_t in zip(self.segments, self.transition_k, strict=True)
        )

    def with_diameters(self, diameter: float, names: set[str] | None = None) -> Pipeline:
        """This pipeline with `diameter` [m] on the named segments (all when None)."""
        segments = tuple(
            replace(s, diameter=diameter) if names is None or s.name in names else s
            for s in self.segments
        )
        return replace(self, segments=segments)

    def at(self, scenario: Scenario) -> SystemCurve:
        """The system curve of this pipeline in `scenario`."""
        return SystemCurve(self, scenario)


@dataclass(frozen=True)
class SystemCurve:
    """A pipeline in one scenario: H_sys over arrays of flow."""

    pipeline: Pipeline
    scenario: Scenario

    @cached_property
    def static_head(self) -> float:
        """H_sys(0): delivery head minus source head, pressures as heads. [m]"""
        p = self.pipeline
        return (self.scenario.delivery_level + p.delivery_pressure_head) - (
            self.scenario.source_level + p.source_pressure_head
        )

    @cached_property
    def roughness(self) -> tuple[float, ...]:
        """Absolute roughness of each segment at the scenario's age. [m]"""
        return tuple(s.roughness_at(self.scenario.age_years) for s in self.pipeline.segments)

    @cached_property
    def hazen_williams_c(self) -> tuple[float | None, ...]:
        """Hazen-Williams C of each segment at the scenario's age. [-]"""
        age = self.scenario.age_years
        return tuple(
            s.hazen_williams_c_at(age, HAZEN_WILLIAMS_C_FLOOR) for s in self.pipeline.segments
        )

    @property
    def model(self) -> FrictionModel:
        return self.pipeline.model

    def head(self, flow: ArrayLike) -> FloatArray:
        """System head H_sys at each flow.

        Parameters
        ----------
        flow : float or ndarray
            Volumetric flow. [m^3/s]

        Returns
        -------
        ndarray
            Head the flow needs above the source, negative where gravity has spare. [m]
        """
        Q = np.asarray(flow, dtype=float)
        eD = [
            eps / s.diameter for eps, s in zip(self.roughness, self.pipeline.segments, strict=True)
        ]
        losses = loss_sum(self.pipeline, np.abs(Q), eD, list(self.hazen_williams_c))
        return self.static_head + np.copysign(losses, Q)

    def losses(self, flow: ArrayLike, suction_only: bool = False) -> list[SegmentLosses]:
        """Per-segment velocity, Re, f, friction and minor losses at each flow.

        With `suction_only`, the leading segments marked suction only.
        """
        nu = self.pipeline.liquid.kinematic_viscosity
        results = []
        for s, eps, k, c in zip(
            self.pipeline.segments,
            self.roughness,
            self.pipeline.k_minor,
            self.hazen_williams_c,
            strict=True,
        ):
            if suction_only and not s.suction:
                break  # suction segments come first
            results.append(
                segment_losses(
                    flow,
                    length=s.length,
                    diameter=s.diameter,
                    roughness=eps,
                    k_minor=k,
                    model=self.pipeline.model,
                    kinematic_viscosity=nu,
                    hazen_williams_c=c,
                )
            )
        return results

    def outlet_velocity_head(self, flow: ArrayLike) -> FloatArray:
        """V_out^2/(2g) on the last segment's velocity. [m]"""
        last = self.pipeline.segments[-1]
        velocity = np.abs(np.asarray(flow, dtype=float)) / last.area
        return velocity * velocity / (2.0 * G)

    def suction_loss(self, flow: ArrayLike) -> FloatArray:
        """Friction and minor losses of the suction segments (those marked suction). [m]"""
        total = np.zeros(np.shape(flow))
        for loss in self.losses(flow, suction_only=True):
            total = total + loss.friction_loss + loss.minor_loss
        return total


def loss_sum(
    pipeline: Pipeline,
    flow: FloatArray,
    relative_roughness: list[Any],
    hazen_williams_c: list[Any],
) -> FloatArray:
    """Friction, minor and outlet losses of the whole route at non-negative flows. [m]

    ``relative_roughness[i]`` and ``hazen_williams_c[i]`` (segment i) are floats, or arrays
    that broadcast against `flow` (one value per scenario of a batch). One vectorised pass
    per segment: sum of (f L/D + K) V^2, plus the outlet's V^2, over 2g.
    """
    model = pipeline.model
    nu = pipeline.liquid.kinematic_viscosity
    total = np.zeros(np.broadcast_shapes(flow.shape, *(np.shape(e) for e in relative_roughness)))
    velocity = flow
    for segment, k, eD, c in zip(
        pipeline.segments, pipeline.k_minor, relative_roughness, hazen_williams_c, strict=True
    ):
        D = segment.diameter
        velocity = flow * (4.0 / (math.pi * D * D))
        f = friction_factor(
            model, velocity * (D / nu), eD, velocity=velocity, diameter=D, hazen_williams_c=c
        )
        f = f * (segment.length / D)
        f += k
        f *= velocity
        f *= velocity
        total += f
    total += velocity * velocity  # outlet term on the last segment's velocity
    total *= 1.0 / (2.0 * G)
    return total


@dataclass(frozen=True)
class ScenarioBatch:
    """Many scenarios of one pipeline at once, for vectorised operating-point solves.

    Parameters
    ----------
    pipeline : Pipeline
    scenarios : tuple of Scenario
    """

    pipeline: Pipeline
    scenarios: tuple[Scenario, ...]

    @cached_property
    def static_head(self) -> FloatArray:
        """Static head of each scenario, shape (n,). [m]"""
        return np.array([SystemCurve(self.pipeline, s).static_head for s in self.scenarios])

    @cached_property
    def _per_segment(self) -> tuple[list[FloatArray], list[Any]]:
        curves = [SystemCurve(self.pipeline, s) for s in self.scenarios]
        eD = [
            np.array([c.roughness[i] for c in curves]) / seg.diameter
            for i, seg in enumerate(self.pipeline.segments)
        ]
        cs: list[Any] = [
            None
            if seg.hazen_williams_c is None
            else np.array([c.hazen_williams_c[i] for c in curves], dtype=float)
            for i, seg in enumerate(self.pipeline.segments)
        ]
        return eD, cs

    def head_each(self, flow: ArrayLike) -> FloatArray:
        """H_sys of scenario i at flow[i]; `flow` has shape (n,). [m]"""
        Q = np.asarray(flow, dtype=float)
        eD, cs = self._per_segment
        return self.static_head + np.copysign(loss_sum(self.pipeline, np.abs(Q), eD, cs), Q)

    def head_of(self, index: ArrayLike, flow: ArrayLike) -> FloatArray:
        """H_sys of scenario index[k] at flow[k] (same shapes). [m]"""
        i = np.asarray(index, dtype=int)
        Q = np.asarray(flow, dtype=float)
        eD, cs = self._per_segment
        losses = loss_sum(
            self.pipeline, np.abs(Q), [e[i] for e in eD], [None if c is None else c[i] for c in cs]
        )
        return self.static_head[i] + np.copysign(losses, Q)

    def head_grid(self, flow: ArrayLike) -> FloatArray:
        """H_sys of every scenario at every flow: shape (n, m) for `flow` of shape (m,). [m]"""
        Q = np.asarray(flow, dtype=float)[None, :]
        eD, cs = self._per_segment
        eD2 = [e[:, None] for e in eD]
        cs2 = [None if c is None else c[:, None] for c in cs]
        return self.static_head[:, None] + np.copysign(
            loss_sum(self.pipeline, np.abs(Q), eD2, cs2), Q
        )


def build_scenarios(
    source_level: float,
    delivery_level: float,
    *,
    source_level_min: float | None = None,
    source_level_max: float | None = None,
    delivery_level_min: float | None = None,
    delivery_level_max: float | None = None,
    age_years: float | None = None,
) -> tuple[Scenario, ...]:
    """The scenarios of the contract.

    `nominal`: nominal levels, pipe at `age_years` (new when None). Where a range of
    levels or an age is given, also `max-static` (lowest source, highest delivery,
    aged pipe: governs whether the demand is met) and `min-static` (highest source,
    lowest delivery, new pipe: governs runout, NPSH and motor power).
    """
    age = age_years or 0.0
    scenarios = [
        Scenario("nominal", source_level, delivery_level, age, "nominal levels, pipe at its age")
    ]
    ranged = (
        source_level_min,
        source_level_max,
        delivery_level_min,
        delivery_level_max,
        age_years,
    )
    if any(value is not None for value in ranged):
        scenarios.append(
            Scenario(
                "max-static",
                source_level if source_level_min is None else source_level_min,
                delivery_level if delivery_level_max is None else delivery_level_max,
                age,
                "lowest source, highest delivery, aged pipe",
            )
        )
        scenarios.append(
            Scenario(
                "min-static",
                source_level if source_level_max is None else source_level_max,
                delivery_level if delivery_level_min is None else delivery_level_min,
                0.0,
                "highest source, lowest delivery, new pipe",
            )
        )
    return tuple(scenarios)
