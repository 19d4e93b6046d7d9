"""Engine speed: system head over arrays, and the command line on the demo case.

Run:  python benchmarks/bench_engine.py            (about 30 s)

1. System head of a 10-segment system over 100,000 flows, in nanoseconds per
   segment-flow point, beside a scalar loop of a reference library's Colebrook
   (`fluids.friction.Colebrook`, one call per point) in the same run. Goal: at least
   30 times faster per point.
2. `syscurve analyze` on the demo case: median wall time of repeated runs of the
   installed command (a fresh process each time). Goal: at most 1.0 s.
"""

from __future__ import annotations

import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np


def system_of_ten_segments():  # noqa: ANN201 - benchmark script
    from syscurve.friction import MODELS
    from syscurve.liquid import water_at
    from syscurve.pipe import Segment
    from syscurve.system import Pipeline, Scenario

    water = water_at(288.15, 101325.0)
    diameters = [0.30, 0.30, 0.25, 0.25, 0.20, 0.20, 0.25, 0.30, 0.30, 0.35]
    segments = tuple(
        Segment(
            f"s{i}",
            200.0 + 50 * i,
            d,
            roughness=0.045e-3 * (1 + i % 3),
            fittings=(("elbow-90", 2, 0.9),),
        )
        for i, d in enumerate(diameters)
    )
    return Pipeline(water, segments, MODELS["colebrook"]).at(Scenario("x", 100.0, 60.0))


def bench_system_head(n_flows: int = 100_000, repeats: int = 7) -> dict[str, float]:
    curve = system_of_ten_segments()
    flows = np.linspace(0.0, 0.4, n_flows)
    curve.head(flows)  # warm up
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        curve.head(flows)
        times.append(time.perf_counter() - start)
    points = n_flows * len(curve.pipeline.segments)
    engine_ns = min(times) / points * 1e9

    import fluids.friction

    Re = np.geomspace(4e3, 1e7, 20_000)
    start = time.perf_counter()
    for r in Re:
        fluids.friction.Colebrook(float(r), 1.5e-4)
    reference_ns = (time.perf_counter() - start) / Re.size * 1e9
    start = time.perf_counter()
    for r in Re:
        fluids.friction.Clamond(float(r), 1.5e-4)
    clamond_ns = (time.perf_counter() - start) / Re.size * 1e9
    return {
        "reference_clamond_ns_per_call": clamond_ns,
        "engine_ns_per_point": engine_ns,
        "median_ms_per_call": statistics.median(times) * 1e3,
        "reference_colebrook_ns_per_call": reference_ns,
        "speedup": reference_ns / engine_ns,
    }


def bench_cli(runs: int = 9) -> dict[str, float]:
    command = shutil.which("syscurve")
    if command is None:
        raise SystemExit("install first: python -m pip install -e .")
    with tempfile.TemporaryDirectory() as folder:
        case = Path(folder) / "demo.toml"
        subprocess.run([command, "example", "-o", str(case)], check=True)
        subprocess.run([command, "analyze", str(case)], check=True, capture_output=True)
        times = []
        for _ in range(runs):
            start = time.perf_counter()
            subprocess.run([command, "analyze", str(case)], check=True, capture_output=True)
            times.append(time.perf_counter() - start)
    return {"median_s": statistics.median(times), "min_s": min(times), "max_s": max(times)}


def main() -> None:
    head = bench_system_head()
    print("System head, 10 segments x 100,000 flows")
    print(
        f"  engine:    {head['engine_ns_per_point']:.1f} ns per segment-flow point "
        f"({head['median_ms_per_call']:.1f} ms per call, median)"
    )
    print(
        f"  reference: {head['reference_colebrook_ns_per_call']:.0f} ns per scalar "
        "fluids.friction.Colebrook call"
    )
    print(
        f"             {head['reference_clamond_ns_per_call']:.0f} ns per scalar "
        "fluids.friction.Clamond call (its fastest exact solver)"
    )
    print(f"  speed-up:  {head['speedup']:.0f}x per point against Colebrook (goal >= 30x)")
    cli = bench_cli()
    print("syscurve analyze on the demo case (fresh process each run)")
    print(
        f"  median {cli['median_s']:.3f} s (min {cli['min_s']:.3f}, max {cli['max_s']:.3f}); "
        "goal <= 1.0 s"
    )
    sys.stdout.flush()


if __name__ == "__main__":
    main()
