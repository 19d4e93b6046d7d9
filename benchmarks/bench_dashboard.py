"""Dashboard speed: the server-side time of the main update on the demo case.

Run:  python benchmarks/bench_dashboard.py            (about 10 s)

The main update is what the dashboard's main callback runs on every edit,
`dashboard.resultsview.update`: the case dict is validated and analysed by the engine
(`case_from_dict`, `analyze`), then turned into the verdict, the figure and the
tables in display units. The browser's own drawing time is not included. Goal: a
median under 100 ms (the engine's analysis alone takes about 30 ms).

Also timed, for comparison: the engine part alone, the update in US units, and the
whole render callback (the update plus building the component trees).
"""

from __future__ import annotations

import statistics
import sys
import time
import tomllib
from collections.abc import Callable
from typing import Any

GOAL_S = 0.100


def timings(function: Callable[[], Any], repeats: int) -> list[float]:
    """Wall times of `repeats` calls after two warm-up calls. [s]"""
    function()
    function()
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return times


def main(repeats: int = 100) -> int:
    from dashboard.callbacks import render
    from dashboard.resultsview import update
    from dashboard.viewmodel import for_engine, for_store, set_units
    from syscurve import analyze, case_from_dict
    from syscurve.cli import example_text

    data = for_store(tomllib.loads(example_text()))
    assert update(data)["ok"], "the demo case must analyse"
    results = {
        "engine only (case_from_dict + analyze)": timings(
            lambda: analyze(case_from_dict(for_engine(data))), repeats
        ),
        "main update, SI (dashboard.resultsview.update)": timings(lambda: update(data), repeats),
        "main update, US units": timings(lambda: update(set_units(data, "US")), repeats),
        "whole render callback (update + components)": timings(lambda: render(data), repeats),
    }
    print(f"demo case, {repeats} repetitions each (median, 10th-90th percentile):")
    for name, times in results.items():
        deciles = statistics.quantiles(times, n=10)
        print(
            f"  {name:<50} {statistics.median(times) * 1e3:7.1f} ms "
            f"({deciles[0] * 1e3:.1f}-{deciles[-1] * 1e3:.1f} ms)"
        )
    median = statistics.median(results["main update, SI (dashboard.resultsview.update)"])
    verdict = "within" if median < GOAL_S else "OVER"
    print(f"main update median {median * 1e3:.1f} ms: {verdict} the {GOAL_S * 1e3:.0f} ms goal")
    return 0 if median < GOAL_S else 1


if __name__ == "__main__":
    sys.exit(main())
