"""Materials and fittings: every value with the source it comes from.

Status words used in `source` texts:

* "from memory": a textbook value recalled, widely repeated, not re-read from the page;
* "common practice": a value of the trade with no single source; a planning figure;
* otherwise the citation is of the formula or table the value was computed from.

Roughness grows with age by the linear model of Colebrook & White (1937),
eps(t) = eps_0 + alpha t; the growth rates alpha below are order-of-magnitude
planning figures (common practice, after Lamont's 1981 grouping by water
aggressiveness, from memory): set `roughness_growth` on a segment for your water.
"""

from __future__ import annotations

from dataclasses import dataclass

from .errors import CaseError, did_you_mean

#: Reference for the linear roughness-growth model.
AGING_MODEL_REFERENCE = (
    "Colebrook, C. F. & White, C. M. (1937). The reduction of carrying capacity of pipes "
    "with age. J. Inst. Civ. Eng. 7(1), 99-118 (linear growth eps = eps0 + alpha t)"
)
AGING_RATE_SOURCE = (
    "common practice: order of magnitude after Lamont, P. A. (1981), J. AWWA 73(5):274-280 "
    "(from memory); depends on the water, set roughness_growth for your case"
)
#: Basis of the wave speeds used only for the surge screening figure.
WAVE_SPEED_SOURCE = (
    "common practice orders of magnitude (from memory): about 1000-1300 m/s in steel and "
    "iron, 200-500 m/s in PVC and HDPE; the real value depends on wall thickness and restraint"
)
#: Hazen-Williams C never drops below this in the aged scenarios (common practice floor).
HAZEN_WILLIAMS_C_FLOOR = 60.0

_MOODY = (
    "Moody (1944) Trans. ASME 66:671-684 chart; Munson Table 8.1; White Table 6.1 (from memory)"
)


@dataclass(frozen=True)
class Material:
    """A pipe material: new roughness and its growth, Hazen-Williams C and its decline."""

    name: str
    label: str
    roughness: float  # [m], new pipe
    roughness_source: str
    roughness_growth: float  # [m/year]
    hazen_williams_c: float  # [-], new pipe
    hazen_williams_c_source: str
    hazen_williams_c_decline: float  # [1/year]
    wave_speed: float = 1000.0  # [m/s], pressure-wave speed for surge screening

    def roughness_at(self, age_years: float) -> float:
        """Absolute roughness after `age_years`, linear growth. [m]"""
        return self.roughness + self.roughness_growth * age_years


@dataclass(frozen=True)
class Fitting:
    """A fitting or valve with a constant loss coefficient on its pipe's velocity head."""

    name: str
    label: str
    k: float  # [-], on the velocity head of the segment it sits in
    source: str


MATERIALS: dict[str, Material] = {
    m.name: m
    for m in (
        Material(
            "pvc",
            "PVC (plastic)",
            0.0015e-3,
            "White, Fluid Mechanics, Table 6.1, plastic/drawn tubing 0.0015 mm (from memory)",
            0.0,
            150.0,
            "AWWA M23 design value 150 (from memory)",
            0.0,
            400.0,
        ),
        Material(
            "hdpe",
            "HDPE (polyethylene)",
            0.007e-3,
            "common practice: 0.0015-0.007 mm quoted; upper value taken",
            0.0,
            150.0,
            "AWWA M55 design value 150 (from memory)",
            0.0,
            300.0,
        ),
        Material(
            "steel-commercial",
            "Commercial steel, unlined",
            0.045e-3,
            _MOODY,
            0.05e-3,
            120.0,
            "Williams & Hazen tables; textbooks 120-140 new (from memory)",
            1.0,
            1200.0,
        ),
        Material(
            "steel-galvanized",
            "Galvanized steel",
            0.15e-3,
            _MOODY,
            0.05e-3,
            120.0,
            "textbooks (from memory)",
            1.0,
            1200.0,
        ),
        Material(
            "stainless-steel",
            "Stainless steel",
            0.002e-3,
            "Cengel & Cimbala, Fluid Mechanics, Table 8-2 (from memory)",
            0.0,
            140.0,
            "common practice",
            0.0,
            1200.0,
        ),
        Material(
            "cast-iron",
            "Cast iron, unlined",
            0.26e-3,
            _MOODY,
            0.10e-3,
            130.0,
            "Williams & Hazen (1920): 130 new, about 100 at 20 years (from memory)",
            1.5,
            1100.0,
        ),
        Material(
            "ductile-iron-lined",
            "Ductile iron, cement-mortar lined",
            0.033e-3,
            "Farshad & Rieke (2006) SPE Drill. & Compl. 21(3):212, cement lining",
            0.01e-3,
            140.0,
            "AWWA/DIPRA practice (common practice)",
            0.25,
            1100.0,
        ),
        Material(
            "concrete",
            "Concrete",
            0.3e-3,
            "Moody (1944): 0.3-3.0 mm, smooth end taken (from memory)",
            0.01e-3,
            130.0,
            "textbooks 120-140 (from memory)",
            0.5,
            1100.0,
        ),
        Material(
            "copper",
            "Copper / drawn tubing",
            0.0015e-3,
            _MOODY,
            0.0,
            140.0,
            "textbooks 130-140 (from memory)",
            0.25,
            1200.0,
        ),
    )
}

_MUNSON = "Munson, Fundamentals of Fluid Mechanics, Table 8.2 (from memory)"
_CENGEL = "Cengel & Cimbala, Fluid Mechanics, Table 8-4 (from memory)"

FITTINGS: dict[str, Fitting] = {
    f.name: f
    for f in (
        Fitting(
            "entrance-sharp",
            "Entrance, sharp-edged (flush)",
            0.5,
            f"{_MUNSON}; {_CENGEL}; Idelchik 0.50 via fluids.entrance_sharp",
        ),
        Fitting(
            "entrance-rounded",
            "Entrance, well rounded (r/D >= 0.2)",
            0.04,
            f"{_MUNSON}; Cengel gives 0.03",
        ),
        Fitting(
            "entrance-slightly-rounded",
            "Entrance, slightly rounded (r/D about 0.1)",
            0.2,
            f"{_MUNSON}; Cengel gives 0.12",
        ),
        Fitting(
            "entrance-reentrant",
            "Entrance, re-entrant (projecting)",
            0.8,
            f"{_MUNSON}; {_CENGEL}; White about 1.0 for a thin wall",
        ),
        Fitting(
            "elbow-90",
            "Elbow 90 deg, regular, threaded",
            0.9,
            f"{_CENGEL}; White Table 6.5 gives 0.95 for 2 in screwed",
        ),
        Fitting(
            "elbow-90-flanged",
            "Elbow 90 deg, regular, flanged",
            0.3,
            f"{_MUNSON}; {_CENGEL}; White Table 6.5 (4 in)",
        ),
        Fitting(
            "elbow-90-long",
            "Elbow 90 deg, long radius, flanged",
            0.2,
            f"{_MUNSON}; White Table 6.5 gives 0.19",
        ),
        Fitting("elbow-45", "Elbow 45 deg, regular, threaded", 0.4, f"{_MUNSON}; {_CENGEL}"),
        Fitting("bend-180", "Return bend 180 deg, threaded", 1.5, f"{_MUNSON}; {_CENGEL}"),
        Fitting("tee-run", "Tee, line (run) flow, threaded", 0.9, f"{_MUNSON}; {_CENGEL}"),
        Fitting("tee-run-flanged", "Tee, line (run) flow, flanged", 0.2, f"{_MUNSON}; {_CENGEL}"),
        Fitting("tee-branch", "Tee, branch flow, threaded", 2.0, f"{_MUNSON}; {_CENGEL}"),
        Fitting("tee-branch-flanged", "Tee, branch flow, flanged", 1.0, f"{_MUNSON}; {_CENGEL}"),
        Fitting("gate-valve", "Gate valve, fully open", 0.15, f"{_MUNSON}; Cengel 0.2; White 0.16"),
        Fitting("globe-valve", "Globe valve, fully open", 10.0, f"{_MUNSON}; {_CENGEL}"),
        Fitting("angle-valve", "Angle valve, fully open", 2.0, _MUNSON),
        Fitting("ball-valve", "Ball valve, fully open", 0.05, f"{_MUNSON}; {_CENGEL}"),
        Fitting(
            "butterfly-valve",
            "Butterfly valve, fully open",
            0.32,
            "Hooper 2-K method, Chem. Eng. Aug 24 1981 (K_inf 0.25) at 4 in, Re 1e5",
        ),
        Fitting(
            "check-valve-swing",
            "Swing check valve, forward flow",
            2.0,
            f"{_MUNSON}; {_CENGEL}; White 2.0 flanged",
        ),
        Fitting(
            "foot-valve-strainer",
            "Foot valve with strainer",
            5.0,
            "common practice planning figure (published values spread from about 1 to "
            "15 by design); use the valve maker's figure when known",
        ),
        Fitting(
            "exit",
            "Exit into a tank",
            1.0,
            "all texts (K = 1, turbulent); the engine already adds the outlet term",
        ),
    )
}


def _unknown(kind: str, name: str, names: list[str], key: str) -> CaseError:
    hint = did_you_mean(name, names)
    return CaseError(f'unknown {kind} "{name}"; {hint}known: {", ".join(names)}', key)


def get_material(name: str, key: str = "material") -> Material:
    """The material called `name`; an unknown name raises with the nearest names."""
    try:
        return MATERIALS[name]
    except (KeyError, TypeError):
        raise _unknown("material", name, list(MATERIALS), key) from None


def get_fitting(name: str, key: str = "fittings") -> Fitting:
    """The fitting called `name`; an unknown name raises with the nearest names."""
    try:
        return FITTINGS[name]
    except (KeyError, TypeError):
        raise _unknown("fitting", name, list(FITTINGS), key) from None


# --- transitions between segments of different diameter --------------------------------

TRANSITION_SOURCES = {
    "expansion": "Borda-Carnot, K = (1 - (d/D)^2)^2 on the upstream (smaller) velocity "
    "(momentum and energy balance; any fluid-mechanics text)",
    "contraction": "Rennels & Hudson (2012) Pipe Flow: A Practical and Comprehensive Guide, "
    "Wiley, sharp contraction, K on the downstream (smaller) velocity",
}


def expansion_k(small_diameter: float, large_diameter: float) -> float:
    """Sudden expansion loss coefficient (Borda-Carnot) on the SMALL pipe's velocity head.

    K = (1 - beta^2)^2 with beta = d/D.
    """
    beta2 = (small_diameter / large_diameter) ** 2
    return (1.0 - beta2) ** 2


def contraction_k(large_diameter: float, small_diameter: float) -> float:
    """Sudden (sharp) contraction loss coefficient on the SMALL pipe's velocity head.

    Rennels & Hudson (2012): K = 0.0696 (1 - beta^5) lambda^2 + (lambda - 1)^2,
    lambda = 1 + 0.622 (1 - 0.215 beta^2 - 0.785 beta^5), beta = d/D. About 0.5 for
    a large area ratio, like a sharp entrance; methods in the literature spread by
    up to about 1.6 times, so this is the method named in reports.
    """
    beta = small_diameter / large_diameter
    beta2 = beta * beta
    beta5 = beta2 * beta2 * beta
    lam = 1.0 + 0.622 * (1.0 - 0.215 * beta2 - 0.785 * beta5)
    return 0.0696 * (1.0 - beta5) * lam * lam + (lam - 1.0) ** 2


# --- pipe series with published inside diameters ----------------------------------------

#: ASME B36.10M Schedule 40 steel pipe: NPS -> (outside diameter, wall thickness) in mm.
#: Inside diameter = OD - 2 t. Dimensions from ASME B36.10M (from memory; the test
#: suite checks them against the tables of the `fluids` library).
_SCH40_MM = {
    "1/2": (21.3, 2.77),
    "3/4": (26.7, 2.87),
    "1": (33.4, 3.38),
    "1-1/4": (42.2, 3.56),
    "1-1/2": (48.3, 3.68),
    "2": (60.3, 3.91),
    "2-1/2": (73.0, 5.16),
    "3": (88.9, 5.49),
    "4": (114.3, 6.02),
    "5": (141.3, 6.55),
    "6": (168.3, 7.11),
    "8": (219.1, 8.18),
    "10": (273.1, 9.27),
    "12": (323.8, 10.31),
    "14": (355.6, 11.13),
    "16": (406.4, 12.70),
    "18": (457.0, 14.27),
    "20": (508.0, 15.09),
    "24": (610.0, 17.48),
}

PIPE_SERIES: dict[str, dict[str, float]] = {
    "steel-sch40": {
        f"NPS {nps} Sch 40": (od - 2 * t) / 1000.0 for nps, (od, t) in _SCH40_MM.items()
    },
}
PIPE_SERIES_SOURCES = {
    "steel-sch40": "ASME B36.10M, Schedule 40 (inside diameter = OD - 2 x wall)",
}


def get_series(name: str, key: str = "sizing.series") -> dict[str, float]:
    """A built-in pipe series: label -> inside diameter [m]."""
    try:
        return PIPE_SERIES[name]
    except (KeyError, TypeError):
        raise _unknown("pipe series", name, list(PIPE_SERIES), key) from None
