"""Operating-point solves: scenarios x arrangements of a realistic case.

Run:  python benchmarks/bench_operating.py

The demo case's pipeline (three segments, aged pipe) is solved for 100 scenarios
(source and delivery levels across their ranges, pipe ages 0-50 years) times 100
arrangements (the two demo boosters, one to three units, in parallel and in series,
at ten fixed speeds from 70 % to 100 %): 10,000 operating points, each with all its
intersections refined to 1e-12. Goal: at most 0.5 s. Also times the same cases
solved with details (efficiency, power, NPSH, energy) as `analyze` does.
"""

from __future__ import annotations

import statistics
import time
import tomllib

import numpy as np


def build():  # noqa: ANN201 - benchmark script
    import pump_data
    from syscurve.arrangement import Arrangement
    from syscurve.case import case_from_dict
    from syscurve.cli import example_text
    from syscurve.system import Scenario, ScenarioBatch

    case = case_from_dict(tomllib.loads(example_text()))
    scenarios = tuple(
        Scenario(f"s{i}", 1806.0 + 7.0 * (i % 10) / 9, 1788.0 + 4.0 * (i // 10) / 9, 5.0 * (i % 11))
        for i in range(100)
    )
    batch = ScenarioBatch(case.pipeline, scenarios)
    pumps = [
        pump_data.load("inline booster A 2900 rpm"),
        pump_data.load("inline booster B 2900 rpm"),
    ]
    arrangements = []
    for pump in pumps:
        for count, connection in (
            (1, "single"),
            (2, "parallel"),
            (3, "parallel"),
            (2, "series"),
            (3, "series"),
        ):
            for speed in np.linspace(0.7, 1.0, 10) * pump.speed_rpm:
                arrangements.append(
                    Arrangement(
                        f"{count} x {pump.name} {connection} {speed:.0f}",
                        (pump,) * count,
                        connection,
                        float(speed),
                    )
                )
    return case, batch, arrangements


def main() -> None:
    from syscurve.operating import solve_all

    case, batch, arrangements = build()
    n = len(batch.scenarios) * len(arrangements)
    times = []
    for _ in range(5):
        start = time.perf_counter()
        solutions = solve_all(batch, arrangements, case.demand)
        times.append(time.perf_counter() - start)
    statuses: dict[str, int] = {}
    for group in solutions:
        for s in group:
            statuses[s.status] = statuses.get(s.status, 0) + 1
    print(
        f"{n:,} operating-point solves ({len(batch.scenarios)} scenarios x "
        f"{len(arrangements)} arrangements)"
    )
    print(
        f"  median {statistics.median(times):.3f} s, best {min(times):.3f} s "
        f"({statistics.median(times) / n * 1e6:.1f} us per point); goal <= 0.5 s"
    )
    print(f"  statuses: {statuses}")

    from syscurve.pumping import PointBuilder

    builder = PointBuilder(case, batch)
    start = time.perf_counter()
    for arrangement, group in zip(arrangements, solutions, strict=True):
        for solution in group:
            builder.build(arrangement, solution)
    print(
        f"  with details (efficiency, power, NPSH, energy): "
        f"{time.perf_counter() - start:.3f} s more"
    )


if __name__ == "__main__":
    main()
