"""Friction factors against published values and an independent reference library.

Sources:
* Colebrook grid: Colebrook (1939) equation solved by three independent routes (the
  `fluids` library's Lambert-W solution, a safeguarded Newton solve and a 40-digit
  mpmath root) that agree to 4e-15 relative; values copied here to 10 significant
  figures, so the tolerance is 1e-9 relative.
* `fluids` 1.3 (PyPI), a general-purpose fluid-mechanics library, evaluated live.
* Hazen-Williams: h_f = 10.67 L Q^1.852 / (C^1.852 D^4.87), the SI form quoted in texts,
  evaluated for D = 0.3 m, L = 1000 m, Q = 0.1 m^3/s (computed; formula as source).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from syscurve import friction
from syscurve.friction import (
    MODELS,
    churchill,
    colebrook,
    colebrook_residual,
    friction_factor,
    haaland,
    hazen_williams_gradient,
    laminar,
    swamee_jain,
)

fluids = pytest.importorskip("fluids")

# Reynolds number x relative roughness -> Colebrook f (published grid, see module notes).
EPS_D = [0.0, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 0.05]
COLEBROOK_GRID = {
    4e3: [
        0.03990701406,
        0.03990802945,
        0.03991716685,
        0.04000843123,
        0.04091038986,
        0.04908226945,
        0.07698683489,
    ],
    1e4: [
        0.03088295035,
        0.03088449809,
        0.03089842305,
        0.0310372122,
        0.03238180636,
        0.04312658471,
        0.07380127564,
    ],
    1e5: [
        0.01798977308,
        0.01799519319,
        0.0180438029,
        0.01851386608,
        0.02217453594,
        0.03850354353,
        0.07178092944,
    ],
    1e6: [
        0.011645041,
        0.01166815551,
        0.01186954483,
        0.01344143769,
        0.01994346584,
        0.03796474188,
        0.07157375386,
    ],
    1e7: [
        0.008102669431,
        0.008213180404,
        0.008995711745,
        0.01216608096,
        0.01966705243,
        0.03790982575,
        0.07155298184,
    ],
    1e8: [
        0.005940466352,
        0.00643255652,
        0.008187559103,
        0.01199905056,
        0.01963863284,
        0.03790432339,
        0.07155090409,
    ],
}


@pytest.mark.parametrize("reynolds", sorted(COLEBROOK_GRID))
def test_colebrook_matches_the_published_grid(reynolds: float) -> None:
    expected = np.array(COLEBROOK_GRID[reynolds])
    got = colebrook(np.full(len(EPS_D), reynolds), np.array(EPS_D))
    np.testing.assert_allclose(got, expected, rtol=1e-9)


def test_colebrook_matches_the_fluids_docstring_value() -> None:
    # fluids documents Colebrook(1e5, 1e-4) = 0.018513866077471 (published in its docs).
    assert colebrook(1e5, 1e-4) == pytest.approx(0.018513866077471, rel=1e-12)


def test_colebrook_residual_is_below_1e_12_everywhere_it_applies() -> None:
    Re, eD = np.meshgrid(
        np.logspace(np.log10(4e3), 8, 400), np.r_[0, np.logspace(-7, np.log10(0.05), 60)]
    )
    f = colebrook(Re, eD)
    assert np.abs(colebrook_residual(f, Re, eD)).max() < 1e-12


def test_colebrook_agrees_with_the_fluids_library_over_a_grid() -> None:
    # Reference library: fluids.friction.Colebrook (exact, Lambert W), scalar calls.
    Re = np.logspace(np.log10(4e3), 8, 25)
    for eD in (0.0, 1e-6, 3e-5, 1e-3, 0.02, 0.05):
        expected = np.array([fluids.friction.Colebrook(r, eD) for r in Re])
        np.testing.assert_allclose(colebrook(Re, eD), expected, rtol=1e-12)


def test_laminar_friction_factor_is_64_over_re() -> None:
    # Analytic: Hagen-Poiseuille.
    Re = np.array([1.0, 10.0, 500.0, 1999.0])
    np.testing.assert_allclose(friction_factor("colebrook", Re, 1e-3), 64.0 / Re, rtol=1e-15)
    np.testing.assert_allclose(laminar(Re), 64.0 / Re, rtol=1e-15)


def test_transitional_band_is_continuous_and_flagged() -> None:
    eps = 1e-9
    for name in ("colebrook", "swamee-jain", "haaland"):
        below = friction_factor(name, friction.LAMINAR_LIMIT - eps, 1e-4)
        at_low = friction_factor(name, friction.LAMINAR_LIMIT + eps, 1e-4)
        at_high = friction_factor(name, friction.TURBULENT_LIMIT - eps, 1e-4)
        above = friction_factor(name, friction.TURBULENT_LIMIT + eps, 1e-4)
        assert at_low == pytest.approx(below, rel=1e-6)
        assert at_high == pytest.approx(above, rel=1e-6)
    warnings = friction.range_warnings(MODELS["colebrook"], 3000.0, 1e-4, "here")
    assert len(warnings) == 1 and "transitional" in warnings[0]


# Explicit approximations: against the fluids implementations (same formulas; fluids
# writes Swamee-Jain's 5.74/Re^0.9 as (6.97/Re)^0.9, which differs by <= 2.5e-6) and
# against exact Colebrook with the error bounds measured over the published ranges.


def test_swamee_jain_matches_fluids_and_stays_within_3_percent_of_colebrook() -> None:
    Re = np.logspace(np.log10(5e3), 8, 30)
    for eD in (1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 0.05):
        reference = np.array([fluids.friction.Swamee_Jain_1976(r, eD) for r in Re])
        np.testing.assert_allclose(swamee_jain(Re, eD), reference, rtol=1e-5)
        error = swamee_jain(Re, eD) / colebrook(Re, eD) - 1
        assert np.abs(error).max() < 0.03


def test_haaland_matches_fluids_and_stays_within_1_5_percent_of_colebrook() -> None:
    Re = np.logspace(np.log10(4e3), 8, 30)
    for eD in (0.0, 1e-6, 1e-4, 1e-3, 1e-2, 0.05):
        reference = np.array([fluids.friction.Haaland(r, eD) for r in Re])
        np.testing.assert_allclose(haaland(Re, eD), reference, rtol=1e-12)
        assert np.abs(haaland(Re, eD) / colebrook(Re, eD) - 1).max() < 0.015


def test_churchill_matches_fluids_in_all_regimes() -> None:
    Re = np.logspace(1, 8, 60)
    for eD in (0.0, 1e-4, 1e-2):
        reference = np.array([fluids.friction.Churchill_1977(r, eD) for r in Re])
        np.testing.assert_allclose(churchill(Re, eD), reference, rtol=1e-10)
    # laminar limit (published: equals 64/Re to 2e-14 at Re <= 1000)
    assert churchill(500.0, 0.0) == pytest.approx(64 / 500.0, rel=1e-12)
    # within 3.2 % of Colebrook for Re >= 4000 (measured bound)
    Re = np.logspace(np.log10(4e3), 8, 60)
    for eD in (0.0, 1e-4, 1e-2, 0.05):
        assert np.abs(churchill(Re, eD) / colebrook(Re, eD) - 1).max() < 0.032


@pytest.mark.parametrize(
    ("c", "expected"), [(100, 10.442), (120, 7.450), (130, 6.424), (140, 5.600), (150, 4.928)]
)
def test_hazen_williams_head_loss_matches_the_si_formula(c: float, expected: float) -> None:
    D, L, Q = 0.3, 1000.0, 0.1
    velocity = Q / (math.pi * D**2 / 4)
    head_loss = L * float(hazen_williams_gradient(velocity, D, c))
    # The engine uses Hazen-Williams' own velocity form (US constant 1.318 converted
    # exactly). The SI 10.67 form rounds its constant (10.674) and its exponents
    # (1/0.54 = 1.85185 -> 1.852, 4.8704 -> 4.87), which moves h_f by about 0.1 % here.
    assert head_loss == pytest.approx(expected, rel=2e-3)


def test_hazen_williams_matches_the_textbook_discharge_form() -> None:
    # Textbook SI discharge form Q = 0.2784 C D^2.63 S^0.54 (constant derived from 1.318
    # in ft units; texts quote 0.278); same exponents as the velocity form.
    D, C, S = 0.2, 130.0, 0.004
    Q = 0.2784 * C * D**2.63 * S**0.54
    velocity = Q / (math.pi * D**2 / 4)
    assert float(hazen_williams_gradient(velocity, D, C)) == pytest.approx(S, rel=2e-3)


def test_every_registered_model_gives_finite_factors_over_its_range() -> None:
    Re = np.logspace(0, 8, 50)
    for model in MODELS.values():
        f = friction_factor(
            model, Re, 1e-4, velocity=Re * 1e-6 / 0.1, diameter=0.1, hazen_williams_c=130.0
        )
        assert np.all(np.isfinite(f)) and np.all(f > 0), model.name
