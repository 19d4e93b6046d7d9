"""From a case to its report: scenarios, gravity verdict, checks and cautions."""

from __future__ import annotations

import numpy as np

from .case import VELOCITY_RANGE_SOURCE, Case
from .catalogue import WAVE_SPEED_SOURCE
from .friction import range_warnings
from .gravity import (
    DiameterChoice,
    curve_flows,
    gravity_flow,
    required_source_level,
    smallest_diameter,
)
from .pumping import OperatingPoint, operating_points, pump_cautions, required_duties
from .results import GravityVerdict, NodePressure, Report, ScenarioResult, SegmentResult
from .system import SystemCurve
from .units import Display, G

#: Cautions every summary and report carries.
STANDING_CAUTIONS = (
    "Steady state only: no surge (water hammer) analysis. Pump trips, valve closures, "
    "check-valve slam and filling can raise or drop pressures far beyond these results; "
    "screen with Joukowsky (dH = a dV / g) and have a transient study made for pumped "
    "or long mains.",
    "Check every pressure against the ratings of the pipe, fittings and valves, including "
    "the no-flow (static) pressure with the outlet closed, plus any surge allowance.",
    "Keep the hydraulic grade line above the pipe everywhere: sub-atmospheric pressure "
    "draws in contaminants and air and can stop the flow over high points. Give "
    "segment elevations (elevation_end) to have it checked.",
    "Roughness, loss coefficients, levels and demand are estimates; roughness grows and "
    "deposits form with age. Keep a margin and verify at commissioning.",
    "This is a screening and design aid. Final design rests with a licensed engineer "
    "under the local codes and standards; drinking-water and fire-protection pressures "
    "must meet local regulation.",
)


def _segment_results(curve: SystemCurve, flow: float) -> tuple[SegmentResult, ...]:
    losses = curve.losses(np.array(flow))
    return tuple(
        SegmentResult(
            name=s.name,
            velocity=float(loss.velocity),
            reynolds=float(loss.reynolds),
            friction_factor=float(loss.friction_factor),
            friction_loss=float(loss.friction_loss),
            minor_loss=float(loss.minor_loss),
            k_minor=k,
            roughness=eps,
            diameter=s.diameter,
        )
        for s, loss, k, eps in zip(
            curve.pipeline.segments, losses, curve.pipeline.k_minor, curve.roughness, strict=True
        )
    )


def grade_line(curve: SystemCurve, flow: float) -> tuple[NodePressure, ...] | None:
    """Hydraulic grade line and gauge pressure head at each segment's end, gravity only.

    HGL_i = z_s + p_s/(rho g) - (losses up to the end of segment i) - V_i^2/(2g).
    None unless every segment gives `elevation_end`.
    """
    segments = curve.pipeline.segments
    if any(s.elevation_end is None for s in segments):
        return None
    energy = curve.scenario.source_level + curve.pipeline.source_pressure_head
    nodes = []
    for s, loss in zip(segments, curve.losses(np.array(flow)), strict=True):
        energy -= float(loss.friction_loss + loss.minor_loss)
        hgl = energy - float(loss.velocity) ** 2 / (2.0 * G)
        assert s.elevation_end is not None
        nodes.append(NodePressure(s.name, s.elevation_end, hgl, hgl - s.elevation_end))
    return tuple(nodes)


def analyze_gravity(case: Case) -> tuple[list[ScenarioResult], list[str]]:
    """Per scenario: static head, head at demand, gravity flow and segment results."""
    warnings: list[str] = []
    demand = case.demand
    curves = [case.pipeline.at(s) for s in case.scenarios]
    flows = [gravity_flow(c) for c in curves]
    grid = curve_flows(demand, flows)
    results = []
    for curve, q_gravity in zip(curves, flows, strict=True):
        head_at_demand = float(curve.head(demand))
        segments = _segment_results(curve, demand)
        for seg in segments:
            where = f"{curve.scenario.name}, segment '{seg.name}' at the demand"
            warnings.extend(
                range_warnings(curve.model, seg.reynolds, seg.roughness / seg.diameter, where)
            )
        results.append(
            ScenarioResult(
                curve=curve,
                static_head=curve.static_head,
                head_at_demand=head_at_demand,
                required_source_level=required_source_level(curve, demand),
                gravity_flow=q_gravity,
                meets_demand=head_at_demand <= 0,
                segments_at_demand=segments,
                curve_flow=grid,
                curve_head=curve.head(grid),
                profile_at_gravity_flow=grade_line(curve, q_gravity) if q_gravity > 0 else None,
            )
        )
    return results, warnings


def verdict(results: list[ScenarioResult], demand: float) -> GravityVerdict:
    """The governing scenario is the one with the highest system head at the demand."""
    governing = max(results, key=lambda r: r.head_at_demand)
    return GravityVerdict(
        meets_everywhere=all(r.meets_demand for r in results),
        governing_scenario=governing.name,
        margin_head=governing.margin_head,
        flow_ratio=governing.gravity_flow / demand,
        failing_scenarios=tuple(r.name for r in results if not r.meets_demand),
    )


def velocity_warnings(case: Case, results: list[ScenarioResult], d: Display) -> list[str]:
    """Segment velocities at the demand against the case's range (common practice)."""
    low, high = case.velocity_range
    warnings = []
    for seg in results[0].segments_at_demand:  # velocity at a flow is the same in every scenario
        if seg.velocity < low:
            warnings.append(
                f"segment '{seg.name}': velocity {d.text('velocity', seg.velocity)} at the demand "
                f"is below {d.text('velocity', low)}; sediment may settle and air may collect "
                f"({VELOCITY_RANGE_SOURCE})"
            )
        elif seg.velocity > high:
            warnings.append(
                f"segment '{seg.name}': velocity {d.text('velocity', seg.velocity)} at the demand "
                f"is above {d.text('velocity', high)}; expect erosion, noise and high surge "
                f"pressures ({VELOCITY_RANGE_SOURCE})"
            )
    return warnings


def pressure_warnings(case: Case, results: list[ScenarioResult], d: Display) -> list[str]:
    """Sub-atmospheric pressure along the route and static pressure against ratings."""
    warnings = []
    for result in results:
        nodes = result.profile_at_gravity_flow
        if nodes is None:
            continue
        worst = min(nodes, key=lambda n: n.pressure_head)
        if worst.pressure_head < 0:
            warnings.append(
                f"{result.name}: sub-atmospheric pressure "
                f"({d.text('head', worst.pressure_head)} of liquid) "
                f"at the end of segment '{worst.segment}' when gravity runs at full flow; the "
                "line may draw air or contaminants and stop flowing over the high point"
            )
    segments = case.pipeline.segments
    if all(s.elevation_end is not None for s in segments):
        top_level = max(s.source_level for s in case.scenarios)
        rho_g = case.liquid.density * G
        for s in segments:
            assert s.elevation_end is not None
            static = rho_g * (top_level + case.pipeline.source_pressure_head - s.elevation_end)
            if s.pressure_rating is not None and static > s.pressure_rating:
                warnings.append(
                    f"segment '{s.name}': static pressure with the outlet closed "
                    f"({d.text('pressure', static)}) exceeds its rating "
                    f"({d.text('pressure', s.pressure_rating)}); consider a break-pressure tank "
                    "or a higher pipe class"
                )
    return warnings


def surge_screening(
    case: Case, results: list[ScenarioResult], points: list[OperatingPoint], d: Display
) -> str | None:
    """A Joukowsky screening figure for the cautions: dH = a V / g for a sudden stop.

    Takes the largest steady flow found (gravity flow with the outlet open, the demand,
    or a pumped operating point), the segment where it gives the largest head change,
    and the wave's round trip 2 sum(L/a) along the route. None without wave speeds.
    """
    segments = [s for s in case.pipeline.segments if s.wave_speed]
    if not segments:
        return None
    flows = [case.demand, *(r.gravity_flow for r in results)]
    flows += [p.flow for p in points if p.flow is not None]
    flow = max(flows)
    worst = max(segments, key=lambda s: (s.wave_speed or 0.0) * flow / s.area)
    assert worst.wave_speed is not None
    surge = worst.wave_speed * (flow / worst.area) / G
    round_trip = 2.0 * sum(s.length / (s.wave_speed or 1.0) for s in segments)
    return (
        f"Surge screening (Joukowsky, dH = a dV/g): stopping the largest steady flow found "
        f"here ({d.text('flow', flow)}) at once could change the head by about "
        f"{d.text('head', surge, 2)} in segment '{worst.name}' (wave speed about "
        f"{d.text('velocity', worst.wave_speed, 2)}; {WAVE_SPEED_SOURCE}). Closures faster "
        f"than 2L/a, about {round_trip:.2g} s along the route, count as sudden."
    )


def size_for_gravity(case: Case, results: list[ScenarioResult]) -> DiameterChoice | None:
    """Smallest candidate diameter meeting the demand by gravity in the governing scenario."""
    if not case.sizing_candidates:
        return None
    governing = max(results, key=lambda r: r.head_at_demand)
    return smallest_diameter(
        case.pipeline,
        governing.curve.scenario,
        case.demand,
        list(case.sizing_candidates),
        set(case.sizing_segments) if case.sizing_segments else None,
    )


def _unique(items: list[str]) -> list[str]:
    return list(dict.fromkeys(items))


def analyze(case: Case) -> Report:
    """Analyse a case: system curves per scenario, gravity verdict, checks, cautions.

    Parameters
    ----------
    case : Case
        From `load_case` or `case_from_dict`.

    Returns
    -------
    Report
        `Report.to_dict()` is the JSON report of the contract.
    """
    results, warnings = analyze_gravity(case)
    warnings = list(case.warnings) + warnings
    display = Display(case.display)
    warnings += velocity_warnings(case, results, display)
    warnings += pressure_warnings(case, results, display)
    cautions = list(STANDING_CAUTIONS)
    points: list[OperatingPoint] = []
    if case.pump_part.arrangements:
        points = operating_points(case)
        cautions += pump_cautions(case, points)
    surge = surge_screening(case, results, points, display)
    if surge:
        cautions.insert(1, surge)
        for pump in case.pump_part.pumps:
            warnings += pump.warnings(display)
    return Report(
        case=case,
        scenarios=results,
        verdict=verdict(results, case.demand),
        sizing=size_for_gravity(case, results),
        warnings=_unique(warnings),
        cautions=cautions,
        operating_points=points,
        duties=required_duties(case.demand, results),
    )
