"""Catalogue values and transition losses against a reference library and tables.

* Sudden expansion: Borda-Carnot K = (1 - beta^2)^2 (momentum and energy balance);
  `fluids.fittings.diffuser_sharp` reproduces it: beta 0.25 -> 0.87891, 0.5 -> 0.5625,
  0.75 -> 0.19141 (computed).
* Sudden contraction: Rennels & Hudson (2012) method via `fluids.fittings.contraction_sharp`
  (method "Rennels"): beta 0.25 -> 0.557, 0.5 -> 0.496, 0.75 -> 0.294 (computed).
* Schedule 40 inside diameters: ASME B36.10M, checked against the tables in
  `fluids.piping` (a general-purpose reference library).
"""

from __future__ import annotations

from fractions import Fraction

import pytest

from syscurve.catalogue import (
    FITTINGS,
    MATERIALS,
    PIPE_SERIES,
    contraction_k,
    expansion_k,
)

fluids = pytest.importorskip("fluids")


@pytest.mark.parametrize(("beta", "expected"), [(0.25, 0.87891), (0.5, 0.5625), (0.75, 0.19141)])
def test_expansion_is_borda_carnot(beta: float, expected: float) -> None:
    assert expansion_k(beta, 1.0) == pytest.approx(expected, abs=1e-5)
    assert expansion_k(beta, 1.0) == pytest.approx(
        fluids.fittings.diffuser_sharp(Di1=beta, Di2=1.0), rel=1e-12
    )


@pytest.mark.parametrize(("beta", "expected"), [(0.25, 0.557), (0.5, 0.496), (0.75, 0.294)])
def test_contraction_follows_rennels(beta: float, expected: float) -> None:
    assert contraction_k(1.0, beta) == pytest.approx(expected, abs=5e-4)
    reference = fluids.fittings.contraction_sharp(Di1=1.0, Di2=beta, method="Rennels")
    assert contraction_k(1.0, beta) == pytest.approx(reference, rel=1e-12)


def test_sharp_entrance_is_one_half() -> None:
    # Published textbook value 0.5 (Munson, Cengel, White; from memory); fluids gives the
    # same for Idelchik/Blevins/Swamee.
    assert FITTINGS["entrance-sharp"].k == 0.5
    assert fluids.fittings.entrance_sharp(method="Idelchik") == pytest.approx(0.5)


def test_schedule_40_inside_diameters_match_asme_b36_10m_tables() -> None:
    for label, inside in PIPE_SERIES["steel-sch40"].items():
        nps = label.split()[1]  # e.g. "1-1/2"
        value = float(sum(Fraction(part) for part in nps.split("-")))
        _, di, _, _ = fluids.piping.nearest_pipe(NPS=value, schedule="40")
        assert inside == pytest.approx(di, abs=0.3e-3), label


def test_contract_names_exist_with_a_source() -> None:
    for name in (
        "pvc",
        "hdpe",
        "steel-commercial",
        "steel-galvanized",
        "cast-iron",
        "ductile-iron-lined",
        "concrete",
        "copper",
    ):
        assert MATERIALS[name].roughness_source
    for name in (
        "entrance-sharp",
        "entrance-rounded",
        "entrance-reentrant",
        "elbow-90",
        "elbow-90-long",
        "elbow-45",
        "tee-run",
        "tee-branch",
        "gate-valve",
        "globe-valve",
        "butterfly-valve",
        "check-valve-swing",
        "foot-valve-strainer",
    ):
        assert FITTINGS[name].source


def test_roughness_values_match_the_moody_chart_as_repeated_by_fluids() -> None:
    # fluids' roughness table (Moody 1944 values): cast iron 0.259 mm, galvanized 0.152 mm.
    assert MATERIALS["cast-iron"].roughness == pytest.approx(0.259e-3, rel=0.01)
    assert MATERIALS["steel-galvanized"].roughness == pytest.approx(0.152e-3, rel=0.02)
