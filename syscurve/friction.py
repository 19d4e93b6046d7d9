"""Darcy friction factors: the correlations and one registry of models.

Every correlation is a small pure function over ``float | ndarray``. The registry
`MODELS` holds, per model, its function, its validity range and its reference;
dispatch (`friction_factor`), range warnings (`range_warnings`), the dashboard's
choices and the documentation all read that one table.

Regimes
-------
Below ``LAMINAR_LIMIT`` (Re 2000) the flow is laminar and f = 64/Re exactly
(Hagen-Poiseuille). Above ``TURBULENT_LIMIT`` (Re 4000) the model's turbulent
correlation applies. In the band between, where the flow may be either, f is
interpolated linearly in Re from the laminar value at Re 2000 to the turbulent
model's value at Re 4000: continuous at both ends and rising with Re, so head
loss stays continuous and increasing with flow (root finders rely on that). The
band is flagged with a warning because real losses there are uncertain.
Churchill's correlation covers all regimes by itself and is used as it is.
Hazen-Williams is an empirical water formula, expressed here as the equivalent
Darcy factor; it has no laminar branch.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .units import G

FloatArray = NDArray[np.float64]

#: Upper Reynolds number of laminar flow used here (common practice: 2000-2300).
LAMINAR_LIMIT = 2000.0
#: Lower Reynolds number of fully turbulent flow used here (common practice).
TURBULENT_LIMIT = 4000.0
#: Reynolds numbers below this are treated as this (avoids 64/0 at zero flow;
#: the loss there is f V^2 -> 0 either way).
_RE_FLOOR = 1e-9

# Elements per block in the Colebrook solver: small enough that its temporaries stay
# in the CPU cache, large enough that numpy's per-call overhead is amortised.
_BLOCK = 4096

# Constants of Clamond's solution, written for the Colebrook form
# 1/sqrt(f) = -2 log10(eD/3.7 + 2.51/(Re sqrt(f))).
_CLAMOND_X1 = math.log(10.0) / 18.574
_CLAMOND_X2 = math.log(5.02 / math.log(10.0))
_CLAMOND_F = (0.5 * math.log(10.0)) ** 2


def reynolds(velocity: ArrayLike, diameter: ArrayLike, kinematic_viscosity: float) -> FloatArray:
    """Reynolds number of pipe flow.

    Parameters
    ----------
    velocity : float or ndarray
        Mean velocity. [m/s]
    diameter : float or ndarray
        Inside diameter. [m]
    kinematic_viscosity : float
        Kinematic viscosity of the liquid. [m^2/s]

    Returns
    -------
    ndarray
        Re = V D / nu. [-]
    """
    return np.abs(np.asarray(velocity, dtype=float)) * np.asarray(diameter) / kinematic_viscosity


def laminar(reynolds: ArrayLike) -> FloatArray:
    """Darcy friction factor of laminar flow, f = 64/Re (Hagen-Poiseuille).

    Exact for fully developed laminar flow in a round pipe, Re below about 2000.
    """
    Re = np.maximum(np.asarray(reynolds, dtype=float), _RE_FLOOR)
    return 64.0 / Re


def _clamond_block(Re: FloatArray, eD: FloatArray, out: FloatArray) -> None:
    # Two steps of a third-order (Halley-like) iteration on the Lambert-W form of
    # Colebrook, from Clamond's starting point; in place to limit temporaries.
    X1 = eD * Re
    X1 *= _CLAMOND_X1
    X2 = np.log(Re)
    X2 -= _CLAMOND_X2
    F = X2 - 0.2
    X1F = X1 + F
    X1F1 = X1F + 1.0
    E = np.log(X1F)
    E -= 0.2
    E /= X1F1
    num = 0.5 * E
    num += X1F1
    num *= E
    num *= X1F
    den = E / 3.0
    den += 1.0
    den *= E
    den += X1F1
    num /= den
    F -= num
    np.add(X1, F, out=X1F)
    np.add(X1F, 1.0, out=X1F1)
    np.log(X1F, out=E)
    E += F
    E -= X2
    E /= X1F1
    np.divide(E, 3.0, out=den)
    den += 1.0
    den *= E
    den += X1F1  # den is now b
    np.multiply(E, 0.5, out=num)
    num += X1F1
    num *= E
    num *= X1F
    np.multiply(den, F, out=X1)
    X1 -= num
    np.divide(den, X1, out=F)  # F = 1/sqrt(f) * ln(10)/2 ... squared below
    np.multiply(F, F, out=out)
    out *= _CLAMOND_F


def _clamond_scalar(Re: float, eD: float) -> float:
    # The same two steps as `_clamond_block` on Python floats (one point costs ~2 us
    # here against ~90 us through numpy's per-call overhead).
    X1 = eD * Re * _CLAMOND_X1
    X2 = math.log(Re) - _CLAMOND_X2
    F = X2 - 0.2
    X1F = X1 + F
    X1F1 = 1.0 + X1F
    E = (math.log(X1F) - 0.2) / X1F1
    F -= (X1F1 + 0.5 * E) * E * X1F / (X1F1 + E * (1.0 + E / 3.0))
    X1F = X1 + F
    X1F1 = 1.0 + X1F
    E = (math.log(X1F) + F - X2) / X1F1
    b = X1F1 + E * (1.0 + E / 3.0)
    F = b / (b * F - (X1F1 + 0.5 * E) * E * X1F)
    return _CLAMOND_F * F * F


def colebrook(reynolds: ArrayLike, relative_roughness: ArrayLike) -> FloatArray:
    """Darcy friction factor from the Colebrook-White equation, solved exactly.

    Parameters
    ----------
    reynolds : float or ndarray
        Reynolds number, turbulent range. [-]
    relative_roughness : float or ndarray
        Absolute roughness over inside diameter, eps/D. [-]

    Returns
    -------
    ndarray
        Darcy friction factor f. [-]

    Notes
    -----
    Solves 1/sqrt(f) = -2 log10(eps/(3.7 D) + 2.51/(Re sqrt(f))) with Clamond's
    two-step third-order scheme on its Lambert-W form [2]_: the relative residual is
    at the level of double-precision rounding (below 1e-12, tested) with three
    logarithms a point and no iteration count to tune. Valid as a physical law for
    turbulent flow, Re above about 4000, and eps/D up to about 0.05.

    References
    ----------
    .. [1] Colebrook, C. F. (1939). Turbulent flow in pipes, with particular
       reference to the transition region between the smooth and rough pipe laws.
       J. Inst. Civil Eng. 11(4), 133-156.
    .. [2] Clamond, D. (2009). Efficient resolution of the Colebrook equation.
       Ind. Eng. Chem. Res. 48(7), 3665-3671. doi:10.1021/ie801626g
    """
    Re_in, eD_in = np.broadcast_arrays(
        np.maximum(np.asarray(reynolds, dtype=float), _RE_FLOOR),
        np.asarray(relative_roughness, dtype=float),
    )
    if Re_in.size == 1:
        return np.full(Re_in.shape, _clamond_scalar(float(Re_in.flat[0]), float(eD_in.flat[0])))
    out = np.empty(Re_in.shape)
    Re_flat = np.ascontiguousarray(Re_in).reshape(-1)
    eD_flat = np.ascontiguousarray(eD_in).reshape(-1)
    out_flat = out.reshape(-1)
    for start in range(0, Re_flat.size, _BLOCK):
        stop = start + _BLOCK
        _clamond_block(Re_flat[start:stop], eD_flat[start:stop], out_flat[start:stop])
    return out


def colebrook_residual(
    friction: ArrayLike, reynolds: ArrayLike, relative_roughness: ArrayLike
) -> FloatArray:
    """Residual of Colebrook's equation in its 1/sqrt(f) form, relative to 1/sqrt(f).

    r = (x + 2 log10(eps/(3.7 D) + 2.51 x / Re)) / x with x = 1/sqrt(f); zero at the root.
    """
    x = 1.0 / np.sqrt(np.asarray(friction, dtype=float))
    Re = np.asarray(reynolds, dtype=float)
    return (x + 2.0 * np.log10(np.asarray(relative_roughness) / 3.7 + 2.51 * x / Re)) / x


def swamee_jain(reynolds: ArrayLike, relative_roughness: ArrayLike) -> FloatArray:
    """Darcy friction factor, Swamee-Jain explicit approximation of Colebrook.

    f = 0.25 / [log10(eps/(3.7 D) + 5.74/Re^0.9)]^2

    Notes
    -----
    Stated range 5000 <= Re <= 1e8, 1e-6 <= eps/D <= 1e-2. Often quoted as within
    1 % of Colebrook; measured against exact Colebrook the largest error in that box
    is 2.8 % (at Re 5000, eps/D 0.01), so expect a few per cent.

    References
    ----------
    .. [1] Swamee, P. K. & Jain, A. K. (1976). Explicit equations for pipe-flow
       problems. J. Hydraul. Div. ASCE 102(HY5), 657-664.
    """
    Re = np.maximum(np.asarray(reynolds, dtype=float), _RE_FLOOR)
    eD = np.asarray(relative_roughness, dtype=float)
    return 0.25 / np.log10(eD / 3.7 + 5.74 / Re**0.9) ** 2


def haaland(reynolds: ArrayLike, relative_roughness: ArrayLike) -> FloatArray:
    """Darcy friction factor, Haaland explicit approximation of Colebrook.

    1/sqrt(f) = -1.8 log10[(eps/(3.7 D))^1.11 + 6.9/Re]

    Notes
    -----
    Within about 1.5 % of Colebrook for 4000 <= Re <= 1e8, eps/D <= 0.05
    (measured here: 1.42 %).

    References
    ----------
    .. [1] Haaland, S. E. (1983). Simple and explicit formulas for the friction
       factor in turbulent pipe flow. J. Fluids Eng. 105(1), 89-90.
    """
    Re = np.maximum(np.asarray(reynolds, dtype=float), _RE_FLOOR)
    eD = np.asarray(relative_roughness, dtype=float)
    inverse_sqrt = -1.8 * np.log10((eD / 3.7) ** 1.11 + 6.9 / Re)
    return 1.0 / inverse_sqrt**2


def churchill(reynolds: ArrayLike, relative_roughness: ArrayLike) -> FloatArray:
    """Darcy friction factor, Churchill's (1977) equation for all flow regimes.

    f = 8 [(8/Re)^12 + (A + B)^-1.5]^(1/12),
    A = [2.457 ln(1/((7/Re)^0.9 + 0.27 eps/D))]^16, B = (37530/Re)^16

    Notes
    -----
    Equals 64/Re in laminar flow, bridges the transition smoothly, and stays within
    about 3 % of Colebrook for Re >= 4000.

    References
    ----------
    .. [1] Churchill, S. W. (1977). Friction-factor equation spans all fluid-flow
       regimes. Chem. Eng. 84(24), 91-92.
    """
    Re = np.maximum(np.asarray(reynolds, dtype=float), 1e-6)
    eD = np.asarray(relative_roughness, dtype=float)
    A = (2.457 * np.log(1.0 / ((7.0 / Re) ** 0.9 + 0.27 * eD))) ** 16
    B = (37530.0 / Re) ** 16
    return 8.0 * ((8.0 / Re) ** 12 + (A + B) ** -1.5) ** (1.0 / 12.0)


#: SI constant of Hazen-Williams' velocity form V = k C R^0.63 S^0.54: the US constant
#: 1.318 (ft, s) converted exactly, 1.318 * 0.3048^0.37 = 0.8492 (texts round to 0.849).
HAZEN_WILLIAMS_K_SI = 1.318 * 0.3048**0.37


def hazen_williams_gradient(velocity: ArrayLike, diameter: ArrayLike, c: ArrayLike) -> FloatArray:
    """Friction slope S = h_f / L from the Hazen-Williams formula.

    Parameters
    ----------
    velocity : float or ndarray
        Mean velocity. [m/s]
    diameter : float or ndarray
        Inside diameter. [m]
    c : float or ndarray
        Hazen-Williams coefficient. [-]

    Returns
    -------
    ndarray
        Head loss per length. [m/m]

    Notes
    -----
    V = 0.8492 C R^0.63 S^0.54 with hydraulic radius R = D/4 (SI). Equivalent to
    h_f = 10.67 L Q^1.852 / (C^1.852 D^4.87). Water at ordinary temperatures in
    turbulent flow only.

    References
    ----------
    .. [1] Williams, G. S. & Hazen, A. (1920). Hydraulic Tables, 3rd ed. Wiley.
    """
    V = np.abs(np.asarray(velocity, dtype=float))
    R = np.asarray(diameter, dtype=float) / 4.0
    return (V / (HAZEN_WILLIAMS_K_SI * np.asarray(c) * R**0.63)) ** (1.0 / 0.54)


def hazen_williams(velocity: ArrayLike, diameter: ArrayLike, c: ArrayLike) -> FloatArray:
    """Darcy friction factor equivalent to the Hazen-Williams head loss.

    f = 2 g D S / V^2, with S from `hazen_williams_gradient`. [-]
    """
    V = np.maximum(np.abs(np.asarray(velocity, dtype=float)), 1e-12)
    D = np.asarray(diameter, dtype=float)
    return 2.0 * G * D * hazen_williams_gradient(V, D, c) / V**2


@dataclass(frozen=True)
class FrictionModel:
    """One friction model: its function, validity range and reference.

    `turbulent` is the correlation for Re above `TURBULENT_LIMIT` (Darcy models);
    for "hazen-williams" the model is evaluated from velocity, diameter and C instead.
    """

    name: str
    label: str
    turbulent: Callable[[ArrayLike, ArrayLike], FloatArray] | None
    reynolds_range: tuple[float, float]
    relative_roughness_range: tuple[float, float]
    all_regimes: bool
    reference: str
    note: str = ""


MODELS: dict[str, FrictionModel] = {
    model.name: model
    for model in (
        FrictionModel(
            "colebrook",
            "Colebrook-White (exact)",
            colebrook,
            (TURBULENT_LIMIT, 1e8),
            (0.0, 0.05),
            False,
            "Colebrook (1939) J. Inst. Civ. Eng. 11(4):133-156; solved by Clamond (2009) "
            "Ind. Eng. Chem. Res. 48(7):3665-3671",
        ),
        FrictionModel(
            "swamee-jain",
            "Swamee-Jain (explicit)",
            swamee_jain,
            (5e3, 1e8),
            (1e-6, 1e-2),
            False,
            "Swamee & Jain (1976) J. Hydraul. Div. ASCE 102(HY5):657-664",
            "within about 3 % of Colebrook in its range",
        ),
        FrictionModel(
            "haaland",
            "Haaland (explicit)",
            haaland,
            (TURBULENT_LIMIT, 1e8),
            (0.0, 0.05),
            False,
            "Haaland (1983) J. Fluids Eng. 105(1):89-90",
            "within about 1.5 % of Colebrook in its range",
        ),
        FrictionModel(
            "churchill",
            "Churchill (all regimes)",
            churchill,
            (0.0, 1e8),
            (0.0, 0.05),
            True,
            "Churchill (1977) Chem. Eng. 84(24):91-92",
            "laminar, transitional and turbulent in one formula",
        ),
        FrictionModel(
            "hazen-williams",
            "Hazen-Williams (water only)",
            None,
            (TURBULENT_LIMIT, 1e8),
            (0.0, 1.0),
            True,
            "Williams & Hazen (1920) Hydraulic Tables, 3rd ed.",
            "empirical; water at ordinary temperatures, turbulent flow",
        ),
    )
}

#: Temperatures within which Hazen-Williams is used without a warning (common practice:
#: the formula was fitted to cold-water data; this band is a planning choice). [K]
HAZEN_WILLIAMS_TEMPERATURE_RANGE = (273.15 + 5.0, 273.15 + 30.0)


def get_model(name: str) -> FrictionModel:
    """The friction model called `name`; an unknown name raises with the nearest names."""
    from .errors import CaseError, did_you_mean

    try:
        return MODELS[name]
    except KeyError:
        hint = did_you_mean(name, MODELS)
        raise CaseError(
            f'unknown friction model "{name}"; {hint}choose one of: {", ".join(MODELS)}',
            "pipe.friction",
        ) from None


def friction_factor(
    model: FrictionModel | str,
    reynolds: ArrayLike,
    relative_roughness: ArrayLike,
    *,
    velocity: ArrayLike | None = None,
    diameter: ArrayLike | None = None,
    hazen_williams_c: ArrayLike | None = None,
) -> FloatArray:
    """Darcy friction factor of `model` over any regime.

    Parameters
    ----------
    model : FrictionModel or str
        An entry of `MODELS` or its name.
    reynolds : float or ndarray
        Reynolds number. [-]
    relative_roughness : float or ndarray
        eps/D. [-]
    velocity, diameter, hazen_williams_c
        Needed by "hazen-williams" only. [m/s], [m], [-]

    Returns
    -------
    ndarray
        Darcy friction factor. [-]

    Notes
    -----
    Laminar below Re 2000 (64/Re); the model's turbulent correlation above Re 4000;
    linear interpolation in Re between the two ends in the band (see module notes).
    """
    if isinstance(model, str):
        model = get_model(model)
    if model.name == "hazen-williams":
        if velocity is None or diameter is None or hazen_williams_c is None:
            raise ValueError("hazen-williams needs velocity, diameter and hazen_williams_c")
        return hazen_williams(velocity, diameter, hazen_williams_c)
    assert model.turbulent is not None
    Re = np.asarray(reynolds, dtype=float)
    if model.all_regimes:
        return model.turbulent(Re, relative_roughness)
    f = model.turbulent(np.maximum(Re, TURBULENT_LIMIT), relative_roughness)
    if Re.size and Re.min() < TURBULENT_LIMIT:
        f = np.array(f, dtype=float, copy=True)
        Re_b = np.broadcast_to(Re, f.shape)
        low = Re_b < TURBULENT_LIMIT
        laminar_part = Re_b <= LAMINAR_LIMIT
        f[laminar_part] = laminar(Re_b[laminar_part])
        band = low & ~laminar_part
        if band.any():
            # f already holds the turbulent model at max(Re, 4000), i.e. its value at 4000.
            f_turbulent_end = f[band]
            f_laminar_end = 64.0 / LAMINAR_LIMIT
            weight = (Re_b[band] - LAMINAR_LIMIT) / (TURBULENT_LIMIT - LAMINAR_LIMIT)
            f[band] = f_laminar_end + weight * (f_turbulent_end - f_laminar_end)
    return f


def range_warnings(
    model: FrictionModel, reynolds: float, relative_roughness: float, where: str
) -> list[str]:
    """Warnings for one evaluated point that lies outside `model`'s published range.

    Parameters
    ----------
    model
        The model used.
    reynolds, relative_roughness
        The point. [-]
    where
        Text naming the place, e.g. "nominal, segment 'spring main' at demand".
    """
    warnings: list[str] = []
    Re = float(reynolds)
    if LAMINAR_LIMIT < Re < TURBULENT_LIMIT and model.name != "hazen-williams":
        warnings.append(
            f"{where}: transitional flow (Re {Re:,.0f}, between {LAMINAR_LIMIT:,.0f} and "
            f"{TURBULENT_LIMIT:,.0f}); the friction factor is interpolated and the real loss "
            "may be lower (laminar) or higher (turbulent)"
        )
        return warnings
    if Re <= LAMINAR_LIMIT and not model.all_regimes:
        return warnings  # 64/Re is exact; no model range applies
    low, high = model.reynolds_range
    if Re < low or Re > high:
        warnings.append(
            f"{where}: Re {Re:,.0f} is outside the {model.label} range "
            f"{low:,.0f}-{high:,.0g}; the result is extrapolated"
        )
    e_low, e_high = model.relative_roughness_range
    eD = float(relative_roughness)
    if model.name != "hazen-williams" and (eD > e_high or (e_low > 0 and 0 < eD < e_low)):
        warnings.append(
            f"{where}: relative roughness {eD:.2g} is outside the {model.label} range "
            f"{e_low:g}-{e_high:g}; the result is extrapolated"
        )
    return warnings
