"""Pumps on the system: required duty, operating points with their details, energy."""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Any

from .arrangement import Arrangement, Combined, mixed_parallel_flows
from .npsh import NPSH_GUIDELINE_SOURCE, PREFERRED_REGION_SOURCE, npsh_available
from .operating import Solution, min_speed_ratio, solve_all
from .pump import PumpCurve
from .system import ScenarioBatch
from .units import Display, G


@dataclass(frozen=True)
class Duty:
    """The head a pump must add at the demand flow in one scenario."""

    scenario: str
    flow: float  # [m^3/s]
    head: float  # [m]; not positive: gravity alone suffices

    @property
    def needed(self) -> bool:
        return self.head > 0

    def to_dict(self) -> dict[str, Any]:
        return {
            "scenario": self.scenario,
            "flow_m3_s": self.flow,
            "head_m": self.head,
            "pump_needed": self.needed,
        }


@dataclass(frozen=True)
class UnitPoint:
    """One pump unit at an operating point."""

    pump: str
    speed_rpm: float
    flow: float  # [m^3/s]
    head: float  # [m]
    efficiency: float | None
    shaft_power: float | None  # [W]
    bep_flow_ratio: float | None
    npsh_required: float | None  # [m]

    def to_dict(self) -> dict[str, Any]:
        return {
            "pump": self.pump,
            "speed_rpm": self.speed_rpm,
            "flow_m3_s": self.flow,
            "head_m": self.head,
            "efficiency": self.efficiency,
            "shaft_power_w": self.shaft_power,
            "bep_flow_ratio": self.bep_flow_ratio,
            "npsh_required_m": self.npsh_required,
        }


@dataclass(frozen=True)
class OperatingPoint:
    """An arrangement in a scenario: where it runs and how well. None: does not apply."""

    arrangement: str
    pump: str
    count: int
    connection: str
    speed_rpm: float | None
    scenario: str
    status: str
    flow: float | None = None
    head: float | None = None
    flow_per_pump: float | None = None
    head_per_pump: float | None = None
    efficiency: float | None = None
    hydraulic_power: float | None = None
    shaft_power: float | None = None
    bep_flow_ratio: float | None = None
    in_preferred_region: bool | None = None
    npsh_available: float | None = None
    npsh_required: float | None = None
    npsh_margin_ratio: float | None = None
    npsh_margin: float | None = None
    meets_demand: bool = False
    intersections: tuple[float, ...] = ()
    min_speed_rpm: float | None = None
    annual_energy_kwh: float | None = None
    annual_cost: float | None = None
    specific_energy_kwh_m3: float | None = None
    units: tuple[UnitPoint, ...] = ()
    warnings: tuple[str, ...] = field(default=())

    def to_dict(self) -> dict[str, Any]:
        """The contract's `operating_points` entry (SI, units in the keys)."""
        return {
            "arrangement": self.arrangement,
            "pump": self.pump,
            "count": self.count,
            "connection": self.connection,
            "speed_rpm": self.speed_rpm,
            "scenario": self.scenario,
            "status": self.status,
            "flow_m3_s": self.flow,
            "head_m": self.head,
            "flow_per_pump_m3_s": self.flow_per_pump,
            "head_per_pump_m": self.head_per_pump,
            "efficiency": self.efficiency,
            "hydraulic_power_w": self.hydraulic_power,
            "shaft_power_w": self.shaft_power,
            "bep_flow_ratio": self.bep_flow_ratio,
            "in_preferred_region": self.in_preferred_region,
            "npsh_available_m": self.npsh_available,
            "npsh_required_m": self.npsh_required,
            "npsh_margin_ratio": self.npsh_margin_ratio,
            "npsh_margin_m": self.npsh_margin,
            "meets_demand": self.meets_demand,
            "intersections_m3_s": list(self.intersections),
            "min_speed_rpm": self.min_speed_rpm,
            "annual_energy_kwh": self.annual_energy_kwh,
            "annual_cost": self.annual_cost,
            "specific_energy_kwh_m3": self.specific_energy_kwh_m3,
            "units": [u.to_dict() for u in self.units],
            "warnings": list(self.warnings),
        }


def _finite(value: Any) -> float | None:
    number = float(value)
    return number if math.isfinite(number) else None


def _unit_point(unit: PumpCurve, flow: float, head: float, density: float) -> UnitPoint:
    inside = bool(unit.in_range(flow))
    bep = unit.bep_flow
    return UnitPoint(
        pump=unit.name,
        speed_rpm=unit.speed_rpm,
        flow=flow,
        head=head,
        efficiency=_finite(unit.efficiency_at(flow)) if inside else None,
        shaft_power=_finite(unit.shaft_power_at(flow, density)) if inside else None,
        bep_flow_ratio=flow / bep if bep else None,
        npsh_required=_finite(unit.npsh_required_at(flow)) if inside else None,
    )


class PointBuilder:
    """Turns solver answers into operating points with efficiency, power, NPSH, energy."""

    def __init__(self, case: Any, batch: ScenarioBatch) -> None:
        self.case = case
        self.batch = batch
        self.part = case.pump_part
        self.density = case.liquid.density
        hot = case.liquid_hot or case.liquid
        self.npsh_liquid = hot
        self.surface_pressure = case.barometric_pressure + case.source_gauge_pressure
        self._unit_cache: dict[tuple[int, float], tuple[PumpCurve, ...]] = {}
        self.display = Display(case.display)

    def build(self, arrangement: Arrangement, solution: Solution) -> OperatingPoint:
        d = self.display
        scenario = self.batch.scenarios[solution.scenario_index]
        warnings: list[str] = []
        units = self._units(arrangement, solution.speed_ratio or 1.0)
        speed = units[0].speed_rpm if arrangement.identical else None
        base: dict[str, Any] = dict(
            arrangement=arrangement.name,
            pump=arrangement.pump_label,
            count=arrangement.count,
            connection=arrangement.connection,
            speed_rpm=speed,
            scenario=scenario.name,
            status=solution.status,
            intersections=solution.intersections,
            min_speed_rpm=self._min_speed(arrangement, solution)
            if arrangement.for_demand
            else None,
        )
        if solution.reason:
            warnings.append(solution.reason)
        if solution.status == "not-needed":
            return OperatingPoint(
                **{**base, "speed_rpm": None}, meets_demand=True, warnings=tuple(warnings)
            )
        if solution.flow is None or solution.head is None:
            return OperatingPoint(**base, warnings=tuple(warnings))
        flow, head = solution.flow, solution.head
        if arrangement.identical:
            combined = Combined(units[0], arrangement.count, arrangement.connection)
            q_unit = float(combined.unit_flow(flow))
            h_unit = float(combined.unit_head(head))
            unit_points = (_unit_point(units[0], q_unit, h_unit, self.density),) * (
                arrangement.count
            )
        else:
            flows = mixed_parallel_flows(units, head)
            unit_points = tuple(
                _unit_point(u, q, head, self.density) for u, q in zip(units, flows, strict=True)
            )
            for u, q in zip(units, flows, strict=True):
                if q <= 0:
                    warnings.append(
                        f"{u.name} delivers nothing: its shutoff head "
                        f"{d.text('head', u.shutoff_head)} is below the header head "
                        f"{d.text('head', head)}"
                    )
        running = [u for u in unit_points if u.flow > 0]
        powers = [u.shaft_power for u in running]
        shaft = (
            sum(p for p in powers if p is not None)
            if all(p is not None for p in powers) and running
            else None
        )
        hydraulic = self.density * G * flow * head
        efficiency = hydraulic / shaft if shaft else None
        if solution.status == "outside-curve":
            warnings.append(
                "the point lies beyond the pump data; flow and head follow the curve's end "
                "slope, and efficiency, power and NPSH required are not reported"
            )
        if solution.status == "several-intersections":
            listed = ", ".join(d.text("flow", q) for q in solution.intersections)
            warnings.append(
                f"the curves meet at {len(solution.intersections)} flows ({listed}); the "
                "lowest-flow one is reported and the pump may hunt between them"
            )
        if arrangement.connection == "parallel" and any(u.unstable for u in set(units)):
            warnings.append(
                "a head rising from shutoff (unstable curve) can make pumps in parallel hunt; "
                "prefer a curve that falls from shutoff"
            )
        in_region = self._preferred(running, warnings)
        npsh_a, npsh_r, ratio, margin = self._npsh(
            scenario, flow, unit_points, arrangement.connection, warnings
        )
        if (
            solution.speed_ratio
            and abs(solution.speed_ratio - 1.0) > 1e-9
            or (arrangement.speed_rpm is not None)
        ):
            warnings.append(
                f"at {speed:.0f} rpm efficiency is taken as at the curve's speed and NPSH "
                "required scaled with speed squared (affinity laws; both approximate)"
            )
        meets = flow >= self.case.demand * (1 - 1e-9)
        if not meets:
            warnings.append(
                f"delivers {d.text('flow', flow)}, short of the demand "
                f"{d.text('flow', self.case.demand)}"
            )
        energy, cost, specific = self._energy(shaft, flow)
        identical = arrangement.identical
        return OperatingPoint(
            **base,
            flow=flow,
            head=head,
            flow_per_pump=unit_points[0].flow if identical else None,
            head_per_pump=unit_points[0].head if identical else None,
            efficiency=efficiency,
            hydraulic_power=hydraulic,
            shaft_power=shaft,
            bep_flow_ratio=unit_points[0].bep_flow_ratio if identical else None,
            in_preferred_region=in_region,
            npsh_available=npsh_a,
            npsh_required=npsh_r,
            npsh_margin_ratio=ratio,
            npsh_margin=margin,
            meets_demand=meets,
            annual_energy_kwh=energy,
            annual_cost=cost,
            specific_energy_kwh_m3=specific,
            units=unit_points,
            warnings=tuple(dict.fromkeys(warnings)),
        )

    def _units(self, arrangement: Arrangement, ratio: float) -> tuple[PumpCurve, ...]:
        key = (id(arrangement), ratio)
        if key not in self._unit_cache:
            self._unit_cache[key] = arrangement.units_at(ratio)
        return self._unit_cache[key]

    def _min_speed(self, arrangement: Arrangement, solution: Solution) -> float:
        units = self._units(arrangement, 1.0)
        combined = Combined(units[0], arrangement.count, arrangement.connection)
        static = float(self.batch.static_head[solution.scenario_index])
        return units[0].speed_rpm * min_speed_ratio(static, combined.shutoff_head)

    def _preferred(self, running: list[UnitPoint], warnings: list[str]) -> bool | None:
        low, high = self.part.station.preferred_region
        ratios = [u.bep_flow_ratio for u in running]
        if not running or any(r is None for r in ratios):
            return None
        inside = all(low <= r <= high for r in ratios if r is not None)
        if not inside:
            shown = ", ".join(dict.fromkeys(f"{r:.0%}" for r in ratios if r is not None))
            warnings.append(
                f"flow per pump is {shown} of its BEP flow, outside the preferred operating "
                f"region {low:.0%}-{high:.0%} of BEP flow"
            )
        return inside

    def _npsh(
        self,
        scenario: Any,
        flow: float,
        unit_points: tuple[UnitPoint, ...],
        connection: str,
        warnings: list[str],
    ) -> tuple[float | None, float | None, float | None, float | None]:
        d = self.display
        station = self.part.station
        liquid = self.npsh_liquid
        # in series only the first unit draws from the suction line
        judged = unit_points[:1] if connection == "series" else unit_points
        required = [u.npsh_required for u in judged if u.flow > 0]
        npsh_r = max((r for r in required if r is not None), default=None)
        if station.inlet_elevation is None:
            warnings.append("NPSH cannot be judged: give pump_station.inlet_elevation")
            return None, npsh_r, None, None
        if liquid.vapor_pressure is None:
            warnings.append("NPSH cannot be judged: the liquid has no vapor_pressure")
            return None, npsh_r, None, None
        suction = float(self.case.pipeline.at(scenario).suction_loss(flow))
        npsh_a = npsh_available(
            surface_pressure=self.surface_pressure,
            vapor_pressure=liquid.vapor_pressure,
            density=liquid.density,
            source_level=scenario.source_level,
            inlet_elevation=station.inlet_elevation,
            suction_loss=suction,
        )
        if npsh_r is None or any(r is None for r in required):
            warnings.append("NPSH cannot be judged: no NPSH required at this flow in the curve")
            return npsh_a, npsh_r, None, None
        ratio = npsh_a / npsh_r if npsh_r > 0 else None
        margin = npsh_a - npsh_r
        needed = station.npsh_needed(npsh_r)
        if npsh_a < npsh_r:
            warnings.append(
                f"NPSH available {d.text('head', npsh_a)} is below NPSH required "
                f"{d.text('head', npsh_r)}: the pump "
                "will cavitate"
            )
        elif npsh_a < needed:
            warnings.append(
                f"NPSH available {d.text('head', npsh_a)} is short of the guideline "
                f"{d.text('head', needed)} (ratio {station.margin_ratio:g} or "
                f"{d.text('head', station.margin_min)}, whichever is greater)"
            )
        return npsh_a, npsh_r, ratio, margin

    def _energy(
        self, shaft: float | None, flow: float
    ) -> tuple[float | None, float | None, float | None]:
        operation = self.part.operation
        if shaft is None:
            return None, None, None
        power_in = shaft / (operation.motor_efficiency or 1.0)
        specific = power_in / flow / 3.6e6 if flow > 0 else None
        if operation.hours_per_year is None:
            return None, None, specific
        energy = power_in * operation.hours_per_year / 1000.0
        cost = energy * operation.tariff if operation.tariff is not None else None
        return energy, cost, specific


def required_duties(demand: float, results: list[Any]) -> list[Duty]:
    """Per scenario: the demand flow and the head a pump must add there (H_sys at it)."""
    return [Duty(r.name, demand, r.head_at_demand) for r in results]


def operating_points(case: Any) -> list[OperatingPoint]:
    """Every arrangement of the case in every scenario."""
    part = case.pump_part
    if not part.arrangements:
        return []
    batch = ScenarioBatch(case.pipeline, case.scenarios)
    builder = PointBuilder(case, batch)
    solutions = solve_all(batch, part.arrangements, case.demand, Display(case.display))
    return [
        builder.build(arrangement, solution)
        for arrangement, group in zip(part.arrangements, solutions, strict=True)
        for solution in group
    ]


def pump_cautions(case: Any, points: list[OperatingPoint]) -> list[str]:
    """Cautions that go with pumped results."""
    if not points:
        return []
    station = case.pump_part.station
    display = Display(case.display)
    low, high = station.preferred_region
    cautions = [
        "NPSH required on a pump curve is NPSH3, the suction head at which the head has "
        "already dropped 3 % by cavitation; keep the margin over it in every scenario, "
        "worst at the highest flow and the warmest liquid. Guideline used: NPSHa/NPSHr >= "
        f"{station.margin_ratio:g} or a margin of {display.text('head', station.margin_min)}, "
        "whichever is "
        f"greater (default from {NPSH_GUIDELINE_SOURCE}).",
        f"Preferred operating region used: {low:.0%}-{high:.0%} of BEP flow (default from "
        f"{PREFERRED_REGION_SOURCE}); the manufacturer sets the allowable region.",
        "Check the motor at the highest-flow point of each arrangement (usually min-static, "
        "fewest pumps running) and the shutoff head plus the highest suction pressure "
        "against the ratings of pipe, valves and flanges; a pump trip causes surge.",
        "Pump curves carry test tolerances (ISO 9906 grades) and wear with time; confirm the "
        "selection with the manufacturer's certified data.",
    ]
    if any(
        p.speed_rpm is not None
        and p.units
        and abs(p.units[0].speed_rpm - _curve_speed(case, p)) > 1e-9
        for p in points
    ):
        cautions.append(
            "At reduced speed the affinity laws keep the efficiency and scale NPSH required "
            "with speed squared; real efficiency falls at low speed and suction performance "
            "follows the law less closely."
        )
    return cautions


def _curve_speed(case: Any, point: OperatingPoint) -> float:
    for pump in case.pump_part.pumps:
        if pump.name == point.units[0].pump:
            return float(pump.speed_rpm)
    return float(point.units[0].speed_rpm)
