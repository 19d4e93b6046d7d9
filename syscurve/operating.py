"""Operating points: where an arrangement's curve meets the system curve, per scenario.

The solver is vectorised over scenarios. For an arrangement of identical units the
difference D(Q) = H_pump(Q) - H_sys(Q) is tabulated on a grid from zero to twice the
end of the pump data (every scenario at once); each sign change brackets an
intersection, refined by the Illinois variant of regula falsi to 1e-12 of the flow
range. All intersections are kept: a drooping (unstable) curve can meet a system
curve twice. Beyond the last data point the pump curve continues as a straight line
with its end slope, only so that the status `outside-curve` can say where the point
would lie.

For `speed = "for-demand"` the speed ratio r is solved on the real system curve:
H_pump(Q_d; r) = s r^2 h(Q_d / (p r)) = H_sys(Q_d), with p units in parallel or s in
series, never along an affinity parabola through the origin (which overstates the
saving when there is static head).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from .arrangement import Arrangement, Combined, mixed_parallel_flows
from .pump import PumpCurve
from .roots import NoBracket, brent
from .system import ScenarioBatch
from .units import Display

FloatArray = NDArray[np.float64]
IntArray = NDArray[np.int_]

#: Points of the grid that brackets intersections (0 to twice the data end).
GRID_POINTS = 129
#: Search range beyond the pump data, as a multiple of its last flow.
SEARCH_FACTOR = 2.0


@dataclass(frozen=True)
class Solution:
    """The raw answer for one arrangement in one scenario (before the details)."""

    scenario_index: int
    status: str  # ok | no-intersection | several-intersections | outside-curve | not-needed
    flow: float | None  # [m^3/s]
    head: float | None  # [m]
    speed_ratio: float  # of the arrangement's speed
    intersections: tuple[float, ...] = ()
    reason: str = ""


def _without_point(index: int, status: str, reason: str, speed_ratio: float = 1.0) -> Solution:
    """A solution that has no operating point (no intersection, not needed, ...)."""
    return Solution(index, status, None, None, speed_ratio, (), reason)


def illinois(
    function: Callable[[FloatArray, IntArray], FloatArray],
    a: FloatArray,
    b: FloatArray,
    fa: FloatArray,
    fb: FloatArray,
    context: IntArray,
    xtol: float,
    ftol: float = 1e-10,
    max_iterations: int = 100,
) -> FloatArray:
    """Roots of many bracketed functions at once (Illinois regula falsi, vectorised).

    `function(x, context)` evaluates each problem k at x[k]; brackets [a, b] must
    change sign. Converges superlinearly; each bracket shrinks every step.

    References
    ----------
    .. [1] Dowell, M. & Jarratt, P. (1971). A modified regula falsi method for
       computing the root of an equation. BIT 11, 168-174.
    """
    a, b, fa, fb = (np.array(v, dtype=float) for v in (a, b, fa, fb))
    done = (fb == 0) | (np.abs(b - a) <= xtol)
    for _ in range(max_iterations):
        if done.all():
            break
        c = b - fb * (b - a) / (fb - fa)
        c = np.where(np.isfinite(c), c, 0.5 * (a + b))
        fc = function(c, context)
        flip = fc * fb < 0
        a = np.where(done, a, np.where(flip, b, a))
        fa = np.where(done, fa, np.where(flip, fb, 0.5 * fa))
        b = np.where(done, b, c)
        fb = np.where(done, fb, fc)
        done |= (np.abs(fb) <= ftol) | (np.abs(b - a) <= xtol)
    return b


def _brackets(
    difference: FloatArray, grid: FloatArray
) -> tuple[IntArray, FloatArray, FloatArray, FloatArray, FloatArray, IntArray, FloatArray]:
    """Sign changes of `difference` (scenarios x grid): brackets, and exact zeros."""
    sign = np.sign(difference)
    change = sign[:, :-1] * sign[:, 1:] < 0
    s, j = np.nonzero(change)
    zs, zj = np.nonzero(sign == 0)
    return (
        s,
        grid[j],
        grid[j + 1],
        difference[s, j],
        difference[s, j + 1],
        zs,
        grid[zj],
    )


def solve_fixed_speed(
    batch: ScenarioBatch,
    combined: Combined,
    speed_ratio: float = 1.0,
    display: Display | None = None,
) -> list[Solution]:
    """Every intersection of an identical-unit arrangement with every scenario's curve.

    Reasons for missing points are written in `display` units (SI by default).
    """
    d = display or Display()
    n = len(batch.scenarios)
    q_end = combined.max_flow
    # A head curve that never rises meets the rising system curve once at most, so the
    # ends of the search range bracket it; a curve that rises anywhere is searched on a
    # grid for every crossing.
    falling = bool(np.all(np.diff(combined.unit.head) <= 0))
    grid = np.linspace(0.0, SEARCH_FACTOR * q_end, 2 if falling else GRID_POINTS)
    difference = combined.head(grid)[None, :] - batch.head_grid(grid)
    s, a, b, fa, fb, zero_s, zero_q = _brackets(difference, grid)

    def gap(q: FloatArray, index: IntArray) -> FloatArray:
        return combined.head(q) - batch.head_of(index, q)

    roots = illinois(gap, a, b, fa, fb, s, xtol=1e-12 * q_end) if s.size else np.empty(0)
    found: list[list[float]] = [[] for _ in range(n)]
    for index, q in zip(np.r_[s, zero_s], np.r_[roots, zero_q], strict=True):
        found[int(index)].append(float(q))
    static = batch.static_head
    kept = [sorted(q for q in found[i] if q > 1e-12 * q_end) for i in range(n)]
    first = np.array([flows[0] if flows else 0.0 for flows in kept])
    heads = combined.head(first)
    solutions = []
    for i, flows in enumerate(kept):
        if not flows:
            solutions.append(
                _no_intersection(i, combined, float(static[i]), speed_ratio, grid, difference[i], d)
            )
            continue
        flow = flows[0]
        beyond = flow > q_end * (1 + 1e-9) or flow < combined.min_flow * (1 - 1e-9)
        status = (
            "outside-curve" if beyond else ("several-intersections" if len(flows) > 1 else "ok")
        )
        solutions.append(Solution(i, status, flow, float(heads[i]), speed_ratio, tuple(flows)))
    return solutions


def beyond_reason(search_end: float, d: Display) -> str:
    """Why there is no point within the search range: the pump stays above the system."""
    return (
        "the pump curve stays above the system curve beyond twice its last point "
        f"({d.text('flow', search_end)}); the point lies far outside the data"
    )


def below_reason(shutoff: float, static: float, d: Display) -> str:
    """Why there is no point: the pump stays below the system curve."""
    if shutoff <= static:
        return (
            f"shutoff head {d.text('head', shutoff)} is below the static head "
            f"{d.text('head', static)}"
        )
    return "the pump curve stays below the system curve"


def _no_intersection(
    index: int,
    combined: Combined,
    static: float,
    ratio: float,
    grid: FloatArray,
    difference: FloatArray,
    d: Display,
) -> Solution:
    if difference[-1] > 0:  # pump still above the system at twice its data range
        return _without_point(index, "outside-curve", beyond_reason(grid[-1], d), ratio)
    reason = below_reason(combined.shutoff_head, static, d)
    return _without_point(index, "no-intersection", reason, ratio)


def solve_for_demand(
    batch: ScenarioBatch, arrangement: Arrangement, demand: float, display: Display | None = None
) -> list[Solution]:
    """Per scenario, the speed at which the arrangement delivers `demand` [m^3/s].

    The speed is limited to the arrangement's speed (its curve's, unless given).
    """
    d = display or Display()
    base = arrangement.units_at(1.0)[0]
    combined = Combined(base, arrangement.count, arrangement.connection)
    required = batch.head_each(np.full(len(batch.scenarios), demand))
    ratios = np.linspace(0.02, 1.0, 197)
    unit_flow = demand / combined.parallel_units
    head_at_ratio = combined.series_units * ratios**2 * base.head_at(unit_flow / ratios, True)

    def head_of_ratio(r: FloatArray) -> FloatArray:
        return combined.series_units * r**2 * base.head_at(unit_flow / r, True)

    solutions = []
    for i, needed in enumerate(required):
        needed = float(needed)
        if needed <= 0:
            solutions.append(
                _without_point(
                    i,
                    "not-needed",
                    (
                        f"gravity alone delivers the demand here (system head at the demand "
                        f"{d.text('head', needed)}); the pump need not run"
                    ),
                    0.0,
                )
            )
            continue
        gap = head_at_ratio - needed
        above = np.nonzero(gap >= 0)[0]
        if above.size == 0:
            solutions.append(
                _without_point(
                    i,
                    "no-intersection",
                    (
                        "even at full speed the arrangement gives "
                        f"{d.text('head', float(head_at_ratio[-1]))} at the demand; the system "
                        f"needs {d.text('head', needed)}"
                    ),
                )
            )
            continue
        k = int(above[0])
        if k == 0:
            ratio = float(ratios[0])
        else:

            def shortfall(r: float, target: float = needed) -> float:
                return float(head_of_ratio(np.array(r))) - target

            ratio = brent(shortfall, float(ratios[k - 1]), float(ratios[k]))
        beyond = unit_flow / ratio > base.max_flow * (1 + 1e-9)
        status = "outside-curve" if beyond else "ok"
        solutions.append(Solution(i, status, demand, needed, ratio, (demand,)))
    return solutions


def solve_mixed_parallel(
    batch: ScenarioBatch, arrangement: Arrangement, display: Display | None = None
) -> list[Solution]:
    """Different pumps in parallel: solve in head space, H = H_sys(sum of q_i(H))."""
    d = display or Display()
    units = arrangement.units_at(1.0)
    top = max(u.max_head for u in units)
    solutions = []
    for i in range(len(batch.scenarios)):
        index = np.array([i])

        def gap(head: float, index: IntArray = index) -> float:
            total = sum(mixed_parallel_flows(units, head))
            return head - float(batch.head_of(index, np.array([total]))[0])

        low = float(batch.static_head[i])
        if gap(top) <= 0:
            solutions.append(
                _without_point(
                    i,
                    "no-intersection",
                    (
                        f"the highest shutoff head {d.text('head', top)} is below the static "
                        f"head {d.text('head', low)}"
                    ),
                )
            )
            continue
        try:
            head = brent(gap, min(low, 0.0) - 10.0 * top, top)
        except NoBracket:
            solutions.append(
                _without_point(i, "outside-curve", "the point lies far beyond the pumps' data")
            )
            continue
        flows = mixed_parallel_flows(units, head)
        total = sum(flows)
        beyond = any(q > u.max_flow * (1 + 1e-9) for q, u in zip(flows, units, strict=True))
        if total <= 0:
            solutions.append(
                _without_point(
                    i,
                    "no-intersection",
                    (f"no pump's shutoff head exceeds the static head {d.text('head', low)}"),
                )
            )
            continue
        status = "outside-curve" if beyond else "ok"
        solutions.append(Solution(i, status, total, head, 1.0, (total,)))
    return solutions


def _falling(curve: PumpCurve) -> bool:
    """True when the head never rises with flow (then it meets a system curve once)."""
    return bool(np.all(np.diff(curve.head) <= 0))


def solve_falling_group(
    batch: ScenarioBatch,
    base: PumpCurve,
    arrangements: list[Arrangement],
    display: Display | None = None,
) -> list[list[Solution]]:
    """Fixed-speed arrangements of one falling pump curve, all scenarios in one solve.

    Each arrangement's curve is s r^2 h(Q / (p r)) of the base curve h (affinity laws;
    PCHIP commutes with that scaling, so this equals the refitted curve), so every
    (arrangement, scenario) pair is one element of a single vectorised Illinois solve
    on [0, twice the data end], where the falling pump curve meets the rising system
    curve once at most.
    """
    d = display or Display()
    n = len(batch.scenarios)
    ratio = np.array([(a.speed_rpm or base.speed_rpm) / base.speed_rpm for a in arrangements])
    combos = [Combined(base, a.count, a.connection) for a in arrangements]
    parallel = np.array([c.parallel_units for c in combos], dtype=float)
    series = np.array([c.series_units for c in combos], dtype=float)
    pair_arrangement = np.repeat(np.arange(len(arrangements)), n)
    pair_scenario = np.tile(np.arange(n), len(arrangements))
    r, p, s = ratio[pair_arrangement], parallel[pair_arrangement], series[pair_arrangement]
    q_end = base.max_flow * r * p

    def pump_head(flow: FloatArray, k: IntArray) -> FloatArray:
        return s[k] * r[k] ** 2 * base.head_at(flow / (p[k] * r[k]), True)

    def difference(flow: FloatArray, k: IntArray) -> FloatArray:
        return pump_head(flow, k) - batch.head_of(pair_scenario[k], flow)

    every = np.arange(pair_arrangement.size)
    upper = SEARCH_FACTOR * q_end
    at_zero = difference(np.zeros(every.size), every)
    at_upper = difference(upper, every)
    bracketed = np.nonzero((at_zero > 0) & (at_upper < 0))[0]
    flow = np.full(every.size, np.nan)
    flow[at_upper == 0] = upper[at_upper == 0]
    if bracketed.size:
        flow[bracketed] = illinois(
            difference,
            np.zeros(bracketed.size),
            upper[bracketed],
            at_zero[bracketed],
            at_upper[bracketed],
            bracketed,
            xtol=1e-12 * float(q_end.max()),
        )
    known = np.isfinite(flow)
    head = np.full(every.size, np.nan)
    head[known] = pump_head(flow[known], every[known])
    static = batch.static_head
    results: list[list[Solution]] = []
    for a in range(len(arrangements)):
        group = []
        for i in range(n):
            k = a * n + i
            if np.isfinite(flow[k]):
                q = float(flow[k])
                beyond = q > q_end[k] * (1 + 1e-9) or q < base.flow[0] * r[k] * p[k] * (1 - 1e-9)
                status = "outside-curve" if beyond else "ok"
                group.append(Solution(i, status, q, float(head[k]), 1.0, (q,)))
            elif at_upper[k] > 0:
                reason = beyond_reason(float(upper[k]), d)
                group.append(_without_point(i, "outside-curve", reason))
            else:
                shutoff = float(s[k] * r[k] ** 2 * base.shutoff_head)
                reason = below_reason(shutoff, float(static[i]), d)
                group.append(_without_point(i, "no-intersection", reason))
        results.append(group)
    return results


def solve_all(
    batch: ScenarioBatch,
    arrangements: list[Arrangement] | tuple[Arrangement, ...],
    demand: float,
    display: Display | None = None,
) -> list[list[Solution]]:
    """Solutions of every arrangement in every scenario (same order as `arrangements`).

    Fixed-speed arrangements of identical pumps with falling curves are solved together
    per pump curve (`solve_falling_group`); the others one by one (`solve`).
    """
    results: dict[int, list[Solution]] = {}
    groups: dict[int, list[int]] = {}
    for index, arrangement in enumerate(arrangements):
        base = arrangement.pumps[0]
        if arrangement.identical and not arrangement.for_demand and _falling(base):
            groups.setdefault(id(base), []).append(index)
        else:
            results[index] = solve(batch, arrangement, demand, display)
    for members in groups.values():
        chosen = [arrangements[i] for i in members]
        for index, solutions in zip(
            members, solve_falling_group(batch, chosen[0].pumps[0], chosen, display), strict=True
        ):
            results[index] = solutions
    return [results[i] for i in range(len(arrangements))]


def solve(
    batch: ScenarioBatch,
    arrangement: Arrangement,
    demand: float,
    display: Display | None = None,
) -> list[Solution]:
    """Solutions of one arrangement in every scenario of `batch`."""
    if not arrangement.identical:
        return solve_mixed_parallel(batch, arrangement, display)
    if arrangement.for_demand:
        return solve_for_demand(batch, arrangement, demand, display)
    unit = arrangement.units_at(1.0)[0]
    combined = Combined(unit, arrangement.count, arrangement.connection)
    return solve_fixed_speed(batch, combined, display=display)


def min_speed_ratio(static_head: float, shutoff_head: float) -> float:
    """Speed ratio below which the pumps cannot overcome `static_head` (affinity: H ~ N^2).

    0 when the static head is not positive (gravity already starts the flow).
    """
    if static_head <= 0:
        return 0.0
    return float(np.sqrt(static_head / shutoff_head)) if shutoff_head > 0 else float("inf")
