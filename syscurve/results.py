"""Results of an analysis and the JSON report (SI, units in the key names)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from .case import Case
from .gravity import DiameterChoice
from .pump import PumpCurve
from .pumping import Duty, OperatingPoint
from .system import SystemCurve

REPORT_FORMAT = 1


@dataclass(frozen=True)
class SegmentResult:
    """One segment at one flow."""

    name: str
    velocity: float  # [m/s]
    reynolds: float
    friction_factor: float
    friction_loss: float  # [m]
    minor_loss: float  # [m]
    k_minor: float
    roughness: float  # [m], at the scenario's age
    diameter: float  # [m]


@dataclass(frozen=True)
class NodePressure:
    """Hydraulic grade and pressure at the downstream end of a segment."""

    segment: str
    elevation: float  # [m]
    grade_line: float  # [m]
    pressure_head: float  # [m of liquid], gauge


@dataclass(frozen=True)
class ScenarioResult:
    """A scenario's system curve and its gravity answer."""

    curve: SystemCurve
    static_head: float  # [m]
    head_at_demand: float  # [m]
    required_source_level: float  # [m]
    gravity_flow: float  # [m^3/s]
    meets_demand: bool
    segments_at_demand: tuple[SegmentResult, ...]
    curve_flow: np.ndarray  # [m^3/s]
    curve_head: np.ndarray  # [m]
    profile_at_gravity_flow: tuple[NodePressure, ...] | None

    @property
    def name(self) -> str:
        return self.curve.scenario.name

    @property
    def margin_head(self) -> float:
        """Head to spare at the demand (negative: short by that much). [m]"""
        return -self.head_at_demand


@dataclass(frozen=True)
class GravityVerdict:
    """Does gravity alone meet the demand in every scenario, and with what margin?"""

    meets_everywhere: bool
    governing_scenario: str
    margin_head: float  # [m] in the governing scenario
    flow_ratio: float  # gravity flow / demand in the governing scenario
    failing_scenarios: tuple[str, ...]


@dataclass
class Report:
    """Everything `analyze` found; `to_dict()` is the JSON report of the contract."""

    case: Case
    scenarios: list[ScenarioResult]
    verdict: GravityVerdict
    sizing: DiameterChoice | None
    warnings: list[str]
    cautions: list[str]
    operating_points: list[OperatingPoint] = field(default_factory=list)
    duties: list[Duty] = field(default_factory=list)

    def scenario(self, name: str) -> ScenarioResult:
        """The result of the scenario called `name`."""
        for result in self.scenarios:
            if result.name == name:
                return result
        raise KeyError(name)

    def to_dict(self) -> dict[str, Any]:
        """The report as plain JSON-ready data (SI units, named in the keys)."""
        from . import __version__

        case = self.case
        liquid = case.liquid
        pipeline = case.pipeline
        data: dict[str, Any] = {
            "format": REPORT_FORMAT,
            "title": case.title,
            "syscurve_version": __version__,
            "display_units": case.display,
            "liquid": {
                "name": liquid.name,
                "temperature_k": liquid.temperature,
                "density_kg_m3": liquid.density,
                "viscosity_pa_s": liquid.viscosity,
                "vapor_pressure_pa": liquid.vapor_pressure,
            },
            "site_altitude_m": case.altitude,
            "barometric_pressure_pa": case.barometric_pressure,
            "demand_m3_s": case.demand,
            "friction_model": pipeline.model.name,
            "outlet": pipeline.outlet,
            "segments": [
                {
                    "name": s.name,
                    "length_m": s.length,
                    "diameter_m": s.diameter,
                    "material": s.material,
                    "roughness_new_m": s.roughness,
                    "roughness_growth_m_per_year": s.roughness_growth,
                    "hazen_williams_c_new": s.hazen_williams_c,
                    "fittings": {name: count for name, count, _ in s.fittings},
                    "k_fittings": s.k_fittings,
                    "k_extra": s.k_extra,
                    "k_transition": k_t,
                    "suction": s.suction,
                }
                for s, k_t in zip(pipeline.segments, pipeline.transition_k, strict=True)
            ],
            "scenarios": [_scenario_dict(r) for r in self.scenarios],
            "gravity": {
                "meets_demand_in_every_scenario": self.verdict.meets_everywhere,
                "governing_scenario": self.verdict.governing_scenario,
                "margin_head_m": self.verdict.margin_head,
                "gravity_flow_over_demand": self.verdict.flow_ratio,
                "failing_scenarios": list(self.verdict.failing_scenarios),
            },
            "smallest_gravity_diameter": None
            if self.sizing is None
            else {
                "label": self.sizing.label,
                "diameter_m": self.sizing.diameter,
                "source": self.sizing.source,
                "system_head_at_demand_m": self.sizing.head_at_demand,
                "segments": list(self.sizing.segments),
            },
            "required_duty": [d.to_dict() for d in self.duties],
            "pumps": [_pump_dict(p) for p in case.pump_part.pumps],
            "operating_points": [p.to_dict() for p in self.operating_points],
            "warnings": list(self.warnings),
            "cautions": list(self.cautions),
        }
        return data


def _scenario_dict(result: ScenarioResult) -> dict[str, Any]:
    scenario = result.curve.scenario
    profile = result.profile_at_gravity_flow
    return {
        "name": scenario.name,
        "description": scenario.description,
        "source_level_m": scenario.source_level,
        "delivery_level_m": scenario.delivery_level,
        "pipe_age_years": scenario.age_years,
        "static_head_m": result.static_head,
        "system_head_at_demand_m": result.head_at_demand,
        "required_source_level_m": result.required_source_level,
        "gravity_flow_m3_s": result.gravity_flow,
        "gravity_meets_demand": result.meets_demand,
        "margin_head_m": result.margin_head,
        "segments_at_demand": [
            {
                "name": s.name,
                "velocity_m_s": s.velocity,
                "reynolds": s.reynolds,
                "friction_factor": s.friction_factor,
                "friction_loss_m": s.friction_loss,
                "minor_loss_m": s.minor_loss,
                "k_minor": s.k_minor,
                "roughness_m": s.roughness,
            }
            for s in result.segments_at_demand
        ],
        "pressure_profile_at_gravity_flow": None
        if profile is None
        else [
            {
                "segment": n.segment,
                "elevation_m": n.elevation,
                "grade_line_m": n.grade_line,
                "pressure_head_m": n.pressure_head,
            }
            for n in profile
        ],
        "curve": {
            "flow_m3_s": np.asarray(result.curve_flow).tolist(),
            "head_m": np.asarray(result.curve_head).tolist(),
        },
    }


def _pump_dict(pump: PumpCurve) -> dict[str, Any]:
    return {
        "name": pump.name,
        "speed_rpm": pump.speed_rpm,
        "source": pump.source,
        "shutoff_head_m": pump.shutoff_head,
        "max_flow_m3_s": pump.max_flow,
        "bep_flow_m3_s": pump.bep_flow,
        "bep_head_m": pump.bep_head,
        "bep_efficiency": pump.bep_efficiency,
        "unstable": pump.unstable,
        "fit": "PCHIP (monotone piecewise cubic through every point)",
        "max_leave_one_out_head_residual_m": pump.max_head_residual,
        "points": {
            "flow_m3_s": pump.flow.tolist(),
            "head_m": pump.head.tolist(),
            "efficiency": None if pump.efficiency is None else pump.efficiency.tolist(),
            "npsh_required_m": None
            if pump.npsh_required is None
            else [None if v != v else v for v in pump.npsh_required.tolist()],
        },
        "warnings": pump.warnings(),
    }
