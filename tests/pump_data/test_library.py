"""The bundled pump curves: every one loads, fits and looks like a pump.

Sources of expected values:
* the bundled curves are invented demo data (pump_data/README.md);
* plausibility ranges are common practice for centrifugal pumps (from memory, no
  single source): best efficiency 50-85 % (smaller pumps lower), shutoff head
  110-125 % of the head at the best efficiency point, NPSH required rising with flow;
* the demo system curves are the scenarios of the invented demo case (hillside
  gravity main with an in-line booster): H(Q) = -14 m + 1.65 m (Q / 1 L/s)^1.8 in the
  worst scenario and -25 m + 1.6 m (Q / 1 L/s)^1.8 in the best (invented).
"""

from __future__ import annotations

import re

import numpy as np
import pytest

import pump_data
from syscurve.errors import CaseError
from syscurve.pump import flow_at_head
from syscurve.pumpcsv import read_pump_csv

NAMES = pump_data.list_pumps()
LS = 1e-3
# Lower-case words, numbers and single capital letters as designators ("booster A").
GENERIC_NAME = re.compile(
    r"^(?:[a-z][a-z\-]*|[0-9][0-9.]*|[A-Z])(?: (?:[a-z][a-z\-]*|[0-9][0-9.]*|[A-Z]))*$"
)


def test_there_are_at_least_six_pumps() -> None:
    assert len(NAMES) >= 6
    assert len(set(NAMES)) == len(NAMES)


@pytest.mark.parametrize("name", NAMES)
def test_every_pump_loads_and_is_plausible(name: str) -> None:
    curve = pump_data.load(name)
    assert curve.name == name
    assert GENERIC_NAME.match(name), f"{name!r} is not a generic lower-case description"
    assert name.endswith(f"{curve.speed_rpm:.0f} rpm")
    assert "invented" in curve.source and "not a real pump" in curve.source
    assert 6 <= len(curve.flow) <= 10
    assert curve.flow[0] == 0.0
    assert curve.head[-1] < curve.head.max()  # head falls overall
    assert curve.bep_efficiency is not None and 0.50 <= curve.bep_efficiency <= 0.85
    assert curve.bep_head is not None and 1.10 <= curve.shutoff_head / curve.bep_head <= 1.25
    assert curve.npsh_required is not None
    npsh = curve.npsh_required[np.isfinite(curve.npsh_required)]
    assert np.all(np.diff(npsh) >= 0)
    efficiency = curve.efficiency_at(curve.flow)
    assert efficiency[0] == 0.0
    assert curve.consistency_warnings() == []
    q = np.linspace(0.0, curve.max_flow, 301)
    assert np.all(np.isfinite(curve.head_at(q)))
    assert curve.max_head_residual < 0.05 * curve.shutoff_head
    # the unstable flag is raised exactly for the curve marked as drooping
    assert curve.unstable == ("drooping" in curve.source)


def test_slugs_and_paths() -> None:
    for name in NAMES:
        file = pump_data.path(name)
        assert file.is_file() and re.fullmatch(r"[a-z0-9\-]+\.csv", file.name)
        assert pump_data.load(file.stem).name == name
        assert read_pump_csv(file.read_text(encoding="utf-8")).name == name


def test_one_drooping_curve_and_big_and_small_pumps() -> None:
    curves = [pump_data.load(name) for name in NAMES]
    assert sum(c.unstable for c in curves) == 1
    assert any(c.max_flow <= 3.5 * LS and 10 <= c.shutoff_head <= 35 for c in curves)
    assert any(100 * LS <= c.bep_flow <= 200 * LS for c in curves if c.bep_flow)
    big = max(curves, key=lambda c: c.max_flow)
    small = min(curves, key=lambda c: c.max_flow)
    assert big.bep_efficiency > small.bep_efficiency  # type: ignore[operator]


@pytest.mark.parametrize("name", ["inline booster A 2900 rpm", "inline booster B 2900 rpm"])
def test_the_demo_boosters_suit_the_demo_case(name: str) -> None:
    curve = pump_data.load(name)
    assert 8.0 <= curve.shutoff_head <= 15.0
    assert curve.bep_flow is not None and 3.0 * LS <= curve.bep_flow <= 4.0 * LS * (1 + 1e-12)
    q = np.linspace(0.0, curve.max_flow, 4001)
    pump = curve.head_at(q)
    for static, k in ((-14.0, 1.65), (-25.0, 1.6)):  # invented worst and best scenarios
        system = static + k * (q / LS) ** 1.8
        crossing = np.flatnonzero(np.diff(np.sign(pump - system)))
        assert len(crossing) == 1, "one operating point within the measured curve"
        flow = q[crossing[0]]
        assert 3.2 * LS < flow < curve.max_flow
        np.testing.assert_allclose(flow_at_head(curve, curve.head_at(flow)), flow, rtol=1e-9)


def test_unknown_pump_names_suggest_the_nearest() -> None:
    with pytest.raises(CaseError) as error:
        pump_data.load("inline boster A 2900 rpm", key="pump[1].library")
    problem = error.value.problems[0]
    assert problem.key == "pump[1].library"
    assert "did you mean 'inline booster A 2900 rpm'" in problem.message
    with pytest.raises(CaseError):
        pump_data.path("no such pump at all")
