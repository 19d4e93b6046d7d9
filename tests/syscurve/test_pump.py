"""Pump curves: the PCHIP fit, the pump laws and the checks of the points.

Sources of expected values:
* reference library: ``scipy.interpolate.PchipInterpolator`` (scipy >= 1.11), which
  implements the same Fritsch-Carlson / Fritsch-Butland scheme, evaluated live;
* analytic: the affinity laws Q ~ N, H ~ N^2, P ~ N^3; hydraulic power
  P = rho g Q H / eta; a PCHIP reproduces a straight line exactly (all secant slopes
  equal, so every node slope is that slope); a PCHIP interval is monotone, so its
  values stay between its end values;
* the curves below are invented test data.
"""

from __future__ import annotations

import subprocess
import sys

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from syscurve.errors import CaseError
from syscurve.pump import TEST_DENSITY, PumpCurve, flow_at_head
from syscurve.pumpfit import Pchip, pchip_slopes
from syscurve.units import G

interpolate = pytest.importorskip("scipy.interpolate")

LS = 1e-3  # m^3/s per L/s

# An invented, well-behaved curve (flows in L/s).
FLOW = np.array([0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0]) * LS
HEAD = np.array([20.0, 19.7, 18.9, 17.6, 15.8, 13.5, 10.6])
EFFICIENCY = np.array([0.0, 0.30, 0.50, 0.62, 0.66, 0.62, 0.50])
NPSHR = np.array([np.nan, 1.0, 1.2, 1.5, 1.9, 2.5, 3.2])


def curve(**changes: object) -> PumpCurve:
    values: dict[str, object] = dict(
        name="test pump",
        speed_rpm=2900.0,
        flow=FLOW,
        head=HEAD,
        efficiency=EFFICIENCY,
        npsh_required=NPSHR,
    )
    values.update(changes)
    return PumpCurve.from_points(**values)  # type: ignore[arg-type]


def problems_of(error: pytest.ExceptionInfo[CaseError]) -> list[tuple[str, str]]:
    return [(p.key, p.message) for p in error.value.problems]


# --- PCHIP against the reference library ----------------------------------------------

# abscissae: a start and 1-11 positive steps (pump flows are never closer than this)
sorted_x = st.tuples(
    st.floats(min_value=-100.0, max_value=100.0),
    st.lists(st.floats(min_value=1e-3, max_value=20.0), min_size=1, max_size=11),
).map(lambda start_steps: list(start_steps[0] + np.cumsum([0.0, *start_steps[1]])))


def _compare_with_scipy(x: np.ndarray, y: np.ndarray) -> None:
    reference = interpolate.PchipInterpolator(x, y)
    fit = Pchip(x, y)
    xq = np.concatenate([x, np.linspace(x[0], x[-1], 501)])
    scale = max(np.max(np.abs(y)), 1.0)
    # reference library: values rel 1e-12 (plus 1e-12 of the data scale near zero)
    np.testing.assert_allclose(fit(xq), reference(xq), rtol=1e-12, atol=1e-12 * scale)
    np.testing.assert_allclose(
        fit.slopes, reference.derivative()(x), rtol=1e-12, atol=1e-12 * scale
    )


@settings(max_examples=200, deadline=None)
@given(sorted_x, st.data())
def test_pchip_matches_scipy_on_non_monotone_data(x: list[float], data: st.DataObject) -> None:
    y = data.draw(
        st.lists(
            st.floats(min_value=-50.0, max_value=50.0, allow_nan=False),
            min_size=len(x),
            max_size=len(x),
        )
    )
    _compare_with_scipy(np.array(x), np.array(y))


def test_pchip_matches_scipy_on_random_monotone_and_flat_data() -> None:
    rng = np.random.default_rng(20240601)
    for _ in range(200):
        n = int(rng.integers(2, 15))
        x = np.cumsum(rng.uniform(0.1, 3.0, n))
        steps = rng.uniform(0.0, 2.0, n - 1) * (rng.random(n - 1) > 0.15)  # some flat
        y = 30.0 - np.concatenate([[0.0], np.cumsum(steps)])
        _compare_with_scipy(x, y)
        _compare_with_scipy(x, -y[::-1])


def test_pchip_reproduces_a_straight_line_exactly() -> None:
    # analytic: equal secant slopes give node slopes equal to them
    x = np.array([0.0, 0.7, 1.0, 2.5, 4.0])
    y = 3.0 - 2.0 * x
    np.testing.assert_allclose(pchip_slopes(x, y), -2.0, rtol=1e-14)
    xq = np.linspace(0.0, 4.0, 41)
    np.testing.assert_allclose(Pchip(x, y)(xq), 3.0 - 2.0 * xq, rtol=1e-13, atol=1e-13)


@settings(max_examples=300, deadline=None)
@given(sorted_x, st.data())
def test_pchip_never_overshoots_between_points(x: list[float], data: st.DataObject) -> None:
    y = np.array(
        data.draw(
            st.lists(
                st.floats(min_value=-50.0, max_value=50.0, allow_nan=False),
                min_size=len(x),
                max_size=len(x),
            )
        )
    )
    xs = np.array(x)
    fit = Pchip(xs, y)
    tolerance = 1e-12 * max(np.max(np.abs(y)), 1.0)
    for i in range(len(xs) - 1):
        values = fit(np.linspace(xs[i], xs[i + 1], 65))
        assert values.min() >= min(y[i], y[i + 1]) - tolerance
        assert values.max() <= max(y[i], y[i + 1]) + tolerance


# --- the curve --------------------------------------------------------------------------


def test_the_fit_passes_through_every_point() -> None:
    pump = curve()
    np.testing.assert_allclose(pump.head_at(FLOW), HEAD, rtol=1e-14)
    np.testing.assert_allclose(pump.efficiency_at(FLOW), EFFICIENCY, atol=1e-15)


def test_head_is_nan_beyond_the_data_and_linear_when_extrapolated() -> None:
    pump = curve(flow=FLOW + 0.5 * LS, efficiency=None, npsh_required=None)
    outside = np.array([0.0, 0.2 * LS, 6.6 * LS, 9.0 * LS])
    assert np.all(np.isnan(pump.head_at(outside)))
    assert not pump.in_range(outside).any()
    assert pump.in_range(FLOW + 0.5 * LS).all()
    # reference library: the end slopes of the PCHIP; analytic: a straight line beyond
    reference = interpolate.PchipInterpolator(FLOW + 0.5 * LS, HEAD).derivative()
    end, start = reference(6.5 * LS), reference(0.5 * LS)
    for dq in (0.1 * LS, 2.0 * LS):
        got = pump.head_at(6.5 * LS + dq, extrapolate=True)
        np.testing.assert_allclose(got, HEAD[-1] + end * dq, rtol=1e-12)
    np.testing.assert_allclose(
        pump.head_at(0.0, extrapolate=True), HEAD[0] - start * 0.5 * LS, rtol=1e-12
    )
    assert pump.shutoff_extrapolated
    assert pump.shutoff_head == pytest.approx(HEAD[0] - start * 0.5 * LS, rel=1e-12)
    assert any("extrapolated" in w for w in pump.warnings())


def test_affinity_laws_scale_the_points() -> None:
    power = TEST_DENSITY * G * FLOW[1:] * HEAD[1:] / EFFICIENCY[1:]
    pump = curve(shaft_power=np.concatenate([[900.0], power]))
    slow = pump.at_speed(2320.0)  # N2/N1 = 0.8
    # analytic: Q x 0.8, H x 0.64, P x 0.512, NPSHr x 0.64, efficiency kept
    assert slow.speed_rpm == 2320.0 and slow.name == pump.name
    np.testing.assert_allclose(slow.flow, FLOW * 0.8, rtol=1e-14)
    np.testing.assert_allclose(slow.head, HEAD * 0.64, rtol=1e-14)
    assert slow.shaft_power is not None and pump.shaft_power is not None
    np.testing.assert_allclose(slow.shaft_power, pump.shaft_power * 0.512, rtol=1e-14)
    assert slow.npsh_required is not None
    np.testing.assert_allclose(slow.npsh_required, NPSHR * 0.64, rtol=1e-14)
    assert slow.bep_efficiency == pump.bep_efficiency
    assert slow.bep_flow == pytest.approx(0.8 * pump.bep_flow, rel=1e-14)  # type: ignore[operator]
    assert slow.bep_head == pytest.approx(0.64 * pump.bep_head, rel=1e-14)  # type: ignore[operator]
    # the fitted curve follows the law too (PCHIP is invariant to scaling x and y)
    q = np.linspace(0.0, 6.0, 25) * LS
    np.testing.assert_allclose(slow.head_at(0.8 * q), 0.64 * pump.head_at(q), rtol=1e-12)
    with pytest.raises(CaseError):
        pump.at_speed(0.0)


def test_shaft_power_from_efficiency_and_back() -> None:
    # analytic: P = rho g Q H / eta
    pump = curve()
    q = FLOW[1:]
    expected = 1000.0 * G * q * HEAD[1:] / EFFICIENCY[1:]
    np.testing.assert_allclose(pump.shaft_power_at(q, 1000.0), expected, rtol=1e-13)
    assert np.isnan(pump.shaft_power_at(0.0, 1000.0))  # undetermined without power data
    measured = TEST_DENSITY * G * q * HEAD[1:] / EFFICIENCY[1:]
    power_only = PumpCurve.from_points(
        "test pump", 2900.0, FLOW, HEAD, shaft_power=np.concatenate([[700.0], measured])
    )
    np.testing.assert_allclose(power_only.efficiency_at(q), EFFICIENCY[1:], rtol=1e-13)
    assert power_only.bep_efficiency == pytest.approx(0.66, rel=1e-13)
    # measured power scales with density (analytic: P ~ rho at equal Q and H)
    np.testing.assert_allclose(
        power_only.shaft_power_at(q, 1100.0), measured * 1100.0 / TEST_DENSITY, rtol=1e-13
    )
    # between the points the ratio of the fits is still P = rho g Q H / eta
    qq = np.linspace(0.3, 5.7, 19) * LS
    np.testing.assert_allclose(
        power_only.shaft_power_at(qq, TEST_DENSITY),
        TEST_DENSITY * G * qq * power_only.head_at(qq) / power_only.efficiency_at(qq),
        rtol=1e-13,
    )
    assert power_only.consistency_warnings() == []


def test_both_efficiency_and_power_are_checked_against_each_other() -> None:
    power = TEST_DENSITY * G * FLOW[1:] * HEAD[1:] / EFFICIENCY[1:]
    power[3] *= 1.2  # point 5 off by 20 %
    pump = curve(shaft_power=np.concatenate([[900.0], power]))
    messages = pump.consistency_warnings()
    assert len(messages) == 1 and "point 5" in messages[0] and "4.00 L/s" in messages[0]
    assert messages[0] in pump.warnings()
    # at shutoff (efficiency 0) the measured power, scaled, is used
    assert pump.shaft_power_at(0.0, TEST_DENSITY) == pytest.approx(900.0, rel=1e-14)


def test_bep_is_the_point_of_highest_efficiency() -> None:
    pump = curve()
    assert pump.bep_flow == pytest.approx(4.0 * LS)
    assert pump.bep_head == 15.8 and pump.bep_efficiency == 0.66
    q = np.linspace(0.0, 6.0, 6001) * LS
    assert np.max(pump.efficiency_at(q)) <= 0.66 + 1e-15  # no overshoot above the data
    bare = curve(efficiency=None)
    assert bare.bep_flow is None and bare.bep_head is None and bare.bep_efficiency is None
    assert np.isnan(bare.efficiency_at(2 * LS)) and np.isnan(bare.shaft_power_at(2 * LS, 1e3))


def test_a_hump_curve_is_unstable_and_inverted_right_of_the_hump() -> None:
    hump = np.array([20.0, 20.6, 20.4, 19.2, 17.1, 14.3, 10.8])
    pump = curve(head=hump)
    assert pump.unstable
    assert any("unstable" in w for w in pump.warnings())
    assert not curve().unstable
    assert not curve(head=np.array([20.0, 20.09, 19.5, 18, 16, 14, 11])).unstable  # < 0.5 %
    assert pump.max_head == 20.6 and pump.shutoff_head == 20.0
    # a head between shutoff and the hump is met twice; the right branch is taken
    flow = flow_at_head(pump, 20.2)
    assert flow > 1.0 * LS
    np.testing.assert_allclose(pump.head_at(flow), 20.2, rtol=1e-13)
    assert np.isnan(flow_at_head(pump, 20.7))


@settings(max_examples=200, deadline=None)
@given(st.floats(min_value=0.0, max_value=6.0))
def test_flow_at_head_inverts_head_at(flow_ls: float) -> None:
    pump = curve()
    head = pump.head_at(flow_ls * LS)
    np.testing.assert_allclose(flow_at_head(pump, head), flow_ls * LS, rtol=1e-9, atol=1e-12)


def test_flow_at_head_outside_the_curve() -> None:
    pump = curve()
    heads = np.array([21.0, 20.0, 10.6, 8.0])
    flows = flow_at_head(pump, heads)
    assert np.isnan(flows[0]) and np.isnan(flows[3])
    assert flows[1] == pytest.approx(0.0, abs=1e-15) and flows[2] == pytest.approx(6.0 * LS)
    beyond = flow_at_head(pump, heads, extrapolate=True)
    assert np.isnan(beyond[0])
    np.testing.assert_allclose(pump.head_at(beyond[3], extrapolate=True), 8.0, rtol=1e-13)
    assert beyond[3] > 6.0 * LS
    assert flow_at_head(pump, heads.reshape(2, 2)).shape == (2, 2)


def test_npsh_required_blank_at_shutoff() -> None:
    pump = curve()
    assert np.isnan(pump.npsh_required_at(0.0))
    assert pump.npsh_required_at(4.0 * LS) == pytest.approx(1.9)
    assert np.isnan(curve(npsh_required=None).npsh_required_at(2 * LS))


def test_leave_one_out_residuals() -> None:
    # analytic: points on a line except one raised by 0.5 m; without it the fit is the
    # line, so that point's residual is 0.5 m; the others see a disturbed neighbour
    flow = np.array([0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0]) * LS
    head = 20.0 - 1.5 * np.arange(7.0)
    pump = curve(flow=flow, head=head)
    residuals = pump.head_residuals()
    assert np.isnan(residuals[0]) and np.isnan(residuals[-1])
    np.testing.assert_allclose(residuals[1:-1], 0.0, atol=1e-12)
    raised = head.copy()
    raised[3] += 0.5
    bumped = curve(flow=flow, head=raised)
    assert bumped.head_residuals()[3] == pytest.approx(0.5, rel=1e-12)
    assert bumped.max_head_residual >= 0.5


# --- bad input --------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("changes", "key", "words"),
    [
        (
            dict(flow=FLOW[:2], head=HEAD[:2], efficiency=None, npsh_required=None),
            "pump[1].flow",
            "at least 3 points",
        ),
        (dict(flow=FLOW[[0, 1, 3, 2, 4, 5, 6]]), "pump[1].flow", "must increase strictly"),
        (dict(flow=FLOW - 1 * LS), "pump[1].flow", "must be >= 0"),
        (dict(head=HEAD[:-1]), "pump[1].head", "has 6 values but flow has 7"),
        (dict(efficiency=EFFICIENCY[:5]), "pump[1].efficiency", "has 5 values"),
        (dict(efficiency=EFFICIENCY * 1.6), "pump[1].efficiency", "at most 100 %"),
        (dict(efficiency=EFFICIENCY * 100), "pump[1].efficiency", "a fraction here"),
        (
            dict(efficiency=np.array([0, 0.3, 0.0, 0.6, 0.6, 0.6, 0.5])),
            "pump[1].efficiency",
            "above 0",
        ),
        (
            dict(efficiency=np.array([0, 0.3, -0.1, 0.6, 0.6, 0.6, 0.5])),
            "pump[1].efficiency",
            "point 3",
        ),
        (dict(head=HEAD[::-1]), "pump[1].head", "does not fall"),
        (dict(head=np.where(HEAD > 19, np.nan, HEAD)), "pump[1].head", "not a finite number"),
        (dict(flow=np.where(FLOW > 5 * LS, np.inf, FLOW)), "pump[1].flow", "finite"),
        (dict(speed_rpm=0.0), "pump[1].speed", "must be > 0"),
        (dict(speed_rpm=float("nan")), "pump[1].speed", "must be > 0"),
        (dict(shaft_power=np.full(7, -1.0)), "pump[1].shaft_power", "must be > 0"),
        (dict(npsh_required=np.full(7, np.nan)), "pump[1].npsh_required", "point 2"),
        (
            dict(efficiency=np.array([0.2, 0.3, 0.5, 0.6, 0.6, 0.6, 0.5])),
            "pump[1].efficiency",
            "must be 0 (or blank) at zero flow",
        ),
    ],
)
def test_bad_points_raise_case_errors(changes: dict[str, object], key: str, words: str) -> None:
    with pytest.raises(CaseError) as error:
        curve(**changes)
    assert any(k == key and words in m for k, m in problems_of(error)), problems_of(error)


def test_all_problems_are_reported_at_once_with_the_given_key() -> None:
    with pytest.raises(CaseError) as error:
        PumpCurve.from_points(
            "x", -5.0, [0.0, 4e-3, 3e-3], [10.0, 9.0], [0.0, 1.2, 0.5], key="pump[2]"
        )
    keys = [k for k, _ in problems_of(error)]
    assert keys == ["pump[2].speed", "pump[2].head", "pump[2].flow", "pump[2].efficiency"]
    assert "pump[2].flow: must increase strictly; got 3 L/s after 4 L/s at point 3" in str(
        error.value
    )


def test_not_a_list_of_numbers() -> None:
    with pytest.raises(CaseError) as error:
        PumpCurve.from_points("x", 2900.0, ["a", "b", "c"], [1.0, 2.0, 3.0])
    assert problems_of(error)[0][0] == "pump[1].flow"


def test_the_modules_do_not_import_scipy_or_pandas() -> None:
    # the command line must start fast (scipy.optimize alone costs ~0.6 s)
    code = (
        "import sys, syscurve.pump, syscurve.pumpcsv, syscurve.pumpfit\n"
        "heavy = [m for m in ('scipy.interpolate', 'scipy.optimize', 'pandas') "
        "if m in sys.modules]\n"
        "print(heavy)\n"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "[]"
