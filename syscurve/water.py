"""Liquid water properties from the IAPWS formulations, vectorised with numpy.

Three published formulations are evaluated here in plain numpy:

* the saturation line of IAPWS-IF97 region 4 (vapour pressure and boiling temperature),
* the Gibbs free energy of IAPWS-IF97 region 1 (density of compressed liquid water),
* the IAPWS 2008 correlation for the dynamic viscosity of ordinary water.

Every public function takes SI inputs (K, Pa, kg/m^3) as a float or as a numpy array and
returns SI outputs of the same shape (a float for float input). Arrays of any shape are
evaluated in one call by broadcasting against the coefficient tables.

The module imports only numpy and the project's error type: no scipy and no
third-party property package, so that importing it costs next to nothing at program
start.

References
----------
.. [1] IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for
   the Thermodynamic Properties of Water and Steam", International Association for the
   Properties of Water and Steam, 2012.
.. [2] IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary
   Water Substance", International Association for the Properties of Water and Steam, 2008.
"""

from __future__ import annotations

import math
from typing import Any, overload

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .errors import CaseError

FloatArray = NDArray[np.float64]
#: A scalar or an array of floats; every public function returns the kind it is given.
Values = float | FloatArray

#: Lowest temperature of the IF97 region 1 liquid density, 0 degC. [K]
MIN_TEMPERATURE = 273.15
#: Highest temperature of the IF97 region 1 liquid density (region 1/3 boundary). [K]
MAX_TEMPERATURE = 623.15
#: Highest pressure of IF97 region 1. [Pa]
MAX_PRESSURE = 100.0e6

#: Critical temperature of water, IAPWS R7-97(2012) section 2 (and IAPWS R12-08). [K]
CRITICAL_TEMPERATURE = 647.096
#: Critical pressure of water, IAPWS R7-97(2012) section 2. [Pa]
CRITICAL_PRESSURE = 22.064e6
#: Critical density of water, IAPWS R7-97(2012) section 2 (and IAPWS R12-08). [kg/m^3]
CRITICAL_DENSITY = 322.0

#: Saturation pressure at 273.15 K from eq. 30 of IAPWS R7-97(2012); the lower end of the
#: saturation line as IF97 defines it. [Pa]
MIN_SATURATION_PRESSURE = 611.212677

# Specific gas constant of IAPWS-IF97, R7-97(2012) section 2. [J/(kg K)]
_GAS_CONSTANT = 461.526

# ---------------------------------------------------------------------------------------
# IAPWS R7-97(2012), Table 34: coefficients n1 ... n10 of the dimensionless saturation
# equations of region 4 (eqs. 29 to 31). Reducing quantities: p* = 1 MPa, T* = 1 K.
# ---------------------------------------------------------------------------------------
_N1, _N2, _N3, _N4, _N5, _N6, _N7, _N8, _N9, _N10 = (
    0.11670521452767e4,
    -0.72421316703206e6,
    -0.17073846940092e2,
    0.12020824702470e5,
    -0.32325550322333e7,
    0.14915108613530e2,
    -0.48232657361591e4,
    0.40511340542057e6,
    -0.23855557567849,
    0.65017534844798e3,
)
_SATURATION_REFERENCE_PRESSURE = 1.0e6  # p* of region 4. [Pa]

# ---------------------------------------------------------------------------------------
# IAPWS R7-97(2012), Table 2: exponents I_i, J_i and coefficients n_i of the dimensionless
# Gibbs free energy of region 1 (eq. 7). Reducing quantities: p* = 16.53 MPa, T* = 1386 K.
# ---------------------------------------------------------------------------------------
_REGION1_TABLE = np.array(
    [
        # I,   J,   n
        (0, -2, 0.14632971213167),
        (0, -1, -0.84548187169114),
        (0, 0, -0.37563603672040e1),
        (0, 1, 0.33855169168385e1),
        (0, 2, -0.95791963387872),
        (0, 3, 0.15772038513228),
        (0, 4, -0.16616417199501e-1),
        (0, 5, 0.81214629983568e-3),
        (1, -9, 0.28319080123804e-3),
        (1, -7, -0.60706301565874e-3),
        (1, -1, -0.18990068218419e-1),
        (1, 0, -0.32529748770505e-1),
        (1, 1, -0.21841717175414e-1),
        (1, 3, -0.52838357969930e-4),
        (2, -3, -0.47184321073267e-3),
        (2, 0, -0.30001780793026e-3),
        (2, 1, 0.47661393906987e-4),
        (2, 3, -0.44141845330846e-5),
        (2, 17, -0.72694996297594e-15),
        (3, -4, -0.31679644845054e-4),
        (3, 0, -0.28270797985312e-5),
        (3, 6, -0.85205128120103e-9),
        (4, -5, -0.22425281908000e-5),
        (4, -2, -0.65171222895601e-6),
        (4, 10, -0.14341729937924e-12),
        (5, -8, -0.40516996860117e-6),
        (8, -11, -0.12734301741641e-8),
        (8, -6, -0.17424871230634e-9),
        (21, -29, -0.68762131295531e-18),
        (23, -31, 0.14478307828521e-19),
        (29, -38, 0.26335781662795e-22),
        (30, -39, -0.11947622640071e-22),
        (31, -40, 0.18228094581404e-23),
        (32, -41, -0.93537087292458e-25),
    ]
)
_REGION1_REFERENCE_PRESSURE = 16.53e6  # p* of region 1. [Pa]
_REGION1_REFERENCE_TEMPERATURE = 1386.0  # T* of region 1. [K]

# gamma_pi = sum_i -n_i I_i (7.1 - pi)^(I_i - 1) (tau - 1.222)^J_i  (R7-97(2012) Table 4).
# Terms with I_i = 0 do not contribute. Each remaining term is written as
# exp((I_i - 1) ln(7.1 - pi) + J_i ln(tau - 1.222)); both bases are positive throughout
# region 1 (7.1 - pi >= 1.05 for p <= 100 MPa, tau - 1.222 >= 1.002 for T <= 623.15 K).
_GAMMA_PI_ROWS = _REGION1_TABLE[_REGION1_TABLE[:, 0] > 0]
_GAMMA_PI_PI_EXPONENTS = np.ascontiguousarray(_GAMMA_PI_ROWS[:, 0] - 1.0)  # I_i - 1
_GAMMA_PI_TAU_EXPONENTS = np.ascontiguousarray(_GAMMA_PI_ROWS[:, 1])  # J_i
_GAMMA_PI_FACTORS = np.ascontiguousarray(-_GAMMA_PI_ROWS[:, 2] * _GAMMA_PI_ROWS[:, 0])

# ---------------------------------------------------------------------------------------
# IAPWS R12-08, Table 1: coefficients H_i of the dilute-gas viscosity mu0 (eq. 11).
# ---------------------------------------------------------------------------------------
_DILUTE_GAS_H = (1.67752, 2.20462, 0.6366564, -0.241605)

# IAPWS R12-08, Table 2: coefficients H_ij of the residual viscosity mu1 (eq. 12), as rows
# i = 0..5 of coefficients for j = 0, 1, 2, ...; the coefficients not listed are zero.
_RESIDUAL_H: tuple[tuple[float, ...], ...] = (
    (0.520094, 0.222531, -0.281378, 0.161913, -0.325372e-1),  # i = 0, j = 0..4
    (0.850895e-1, 0.999115, -0.906851, 0.257399),  # i = 1, j = 0..3
    (-0.108374e1, 0.188797e1, -0.772479),  # i = 2, j = 0..2
    (-0.289555, 0.126613e1, -0.489837, 0.0, 0.698452e-1, 0.0, -0.435673e-2),  # i = 3, j = 0..6
    (0.0, 0.0, -0.257040, 0.0, 0.0, 0.872102e-2),  # i = 4, j = 0..5
    (0.0, 0.120573, 0.0, 0.0, 0.0, 0.0, -0.593264e-3),  # i = 5, j = 0..6
)
_REFERENCE_VISCOSITY = 1.0e-6  # mu* of IAPWS R12-08. [Pa s]


def _values(values: ArrayLike) -> Values:
    """Input as a Python float (for a scalar) or as a float64 array.

    Scalars go through the kernels as Python floats, which is several times faster than
    0-d arrays; arrays go through them element-wise with broadcasting.
    """
    array = np.asarray(values, dtype=np.float64)
    return float(array) if array.ndim == 0 else array


def _result(values: Values | np.floating[Any]) -> Values:
    """A scalar result as a Python float, anything else as a float64 array."""
    if np.ndim(values) == 0:
        return float(values)
    return np.asarray(values, dtype=np.float64)


def _check_range(
    values: Values, low: float, high: float, name: str, unit: str, formulation: str
) -> None:
    """Raise `CaseError` when any value is outside [low, high] or is not a number."""
    if isinstance(values, float):
        if low <= values <= high:
            return
        bad = values
    else:
        inside = (values >= low) & (values <= high)
        if inside.all():
            return
        bad = float(values[~inside].flat[0])
    raise CaseError(
        f"{name} {bad:.6g} {unit} is outside {low:.6g} {unit} to {high:.6g} {unit}, "
        f"the range of {formulation}"
    )


def _check_positive(values: Values, name: str, unit: str) -> None:
    """Raise `CaseError` when any value is not a positive finite number."""
    if isinstance(values, float):
        if 0.0 < values < math.inf:
            return
        bad = values
    else:
        positive = (values > 0.0) & (values < math.inf)
        if positive.all():
            return
        bad = float(values[~positive].flat[0])
    raise CaseError(f"{name} {bad:.6g} {unit} must be a positive finite number")


def _check_liquid_state(temperature: Values, pressure: Values) -> None:
    """Check the temperature and pressure ranges of the IF97 region 1 density."""
    formulation = "the IAPWS-IF97 region 1 liquid density"
    _check_range(temperature, MIN_TEMPERATURE, MAX_TEMPERATURE, "temperature", "K", formulation)
    _check_positive(pressure, "pressure", "Pa")
    _check_range(pressure, 0.0, MAX_PRESSURE, "pressure", "Pa", formulation)


# The kernels below take floats or arrays (broadcast against each other) and use only
# arithmetic, so one code path serves both. Inputs are assumed already checked.


def _saturation_pressure(temperature: Values) -> Values:
    # IAPWS R7-97(2012) eqs. 29b and 30.
    theta = temperature + _N9 / (temperature - _N10)
    a = (theta + _N1) * theta + _N2
    b = (_N3 * theta + _N4) * theta + _N5
    c = (_N6 * theta + _N7) * theta + _N8
    ratio = 2.0 * c / (-b + np.sqrt(b * b - 4.0 * a * c))
    squared = ratio * ratio
    return _result(squared * squared * _SATURATION_REFERENCE_PRESSURE)


def _saturation_temperature(pressure: Values) -> Values:
    # IAPWS R7-97(2012) eqs. 29a and 31.
    beta = np.sqrt(np.sqrt(pressure / _SATURATION_REFERENCE_PRESSURE))
    e = (beta + _N3) * beta + _N6
    f = (_N1 * beta + _N4) * beta + _N7
    g = (_N2 * beta + _N5) * beta + _N8
    d = 2.0 * g / (-f - np.sqrt(f * f - 4.0 * e * g))
    sum_ = _N10 + d
    return _result((sum_ - np.sqrt(sum_ * sum_ - 4.0 * (_N9 + _N10 * d))) / 2.0)


def _density(temperature: Values, pressure: Values) -> Values:
    # IAPWS R7-97(2012): gamma_pi from eq. 7 (Table 4) and v = pi gamma_pi R T / p
    # (Table 3), that is v = R T gamma_pi / p*. Each term of gamma_pi is evaluated as
    # exp((I_i - 1) ln(7.1 - pi) + J_i ln(tau - 1.222)), with the terms on a last axis.
    log_pi_term = np.log(7.1 - pressure / _REGION1_REFERENCE_PRESSURE)
    log_tau_term = np.log(_REGION1_REFERENCE_TEMPERATURE / temperature - 1.222)
    terms = np.multiply.outer(log_pi_term, _GAMMA_PI_PI_EXPONENTS) + np.multiply.outer(
        log_tau_term, _GAMMA_PI_TAU_EXPONENTS
    )
    np.exp(terms, out=terms)  # in place: saves one (..., 26) temporary for large arrays
    gamma_pi = terms @ _GAMMA_PI_FACTORS
    return _result(_REGION1_REFERENCE_PRESSURE / (_GAS_CONSTANT * temperature * gamma_pi))


def _viscosity(temperature: Values, density: Values) -> Values:
    reduced_temperature = temperature / CRITICAL_TEMPERATURE
    reduced_density = density / CRITICAL_DENSITY
    inverse = 1.0 / reduced_temperature
    # IAPWS R12-08 eq. 11: mu0 = 100 sqrt(Tr) / sum_i H_i / Tr^i, in Horner form.
    h0, h1, h2, h3 = _DILUTE_GAS_H
    dilute_gas = (
        100.0 * np.sqrt(reduced_temperature) / (h0 + inverse * (h1 + inverse * (h2 + inverse * h3)))
    )
    # IAPWS R12-08 eq. 12: mu1 = exp(rho_r sum_i (1/Tr - 1)^i sum_j H_ij (rho_r - 1)^j),
    # both sums in Horner form.
    temperature_term = inverse - 1.0
    density_term = reduced_density - 1.0
    double_sum: Values = 0.0
    for row in reversed(_RESIDUAL_H):
        row_sum: Values = row[-1]
        for coefficient in reversed(row[:-1]):
            row_sum = row_sum * density_term + coefficient
        double_sum = double_sum * temperature_term + row_sum
    residual = np.exp(reduced_density * double_sum)
    return _result(dilute_gas * residual * _REFERENCE_VISCOSITY)


@overload
def saturation_pressure(temperature: float) -> float: ...
@overload
def saturation_pressure(temperature: FloatArray) -> FloatArray: ...
def saturation_pressure(temperature: float | FloatArray) -> float | FloatArray:
    """Saturation (vapour) pressure of water at a temperature.

    Evaluates the saturation-pressure equation of IAPWS-IF97 region 4.

    Parameters
    ----------
    temperature : float or ndarray
        Temperature [K], within 273.15 K to 647.096 K (the critical temperature).

    Returns
    -------
    float or ndarray
        Saturation pressure [Pa], same shape as `temperature`.

    Raises
    ------
    CaseError
        If a temperature is outside the range of the equation or is not a number.

    References
    ----------
    IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for the
    Thermodynamic Properties of Water and Steam", eq. 30 with the coefficients of Table 34.
    """
    temperatures = _values(temperature)
    _check_range(
        temperatures,
        MIN_TEMPERATURE,
        CRITICAL_TEMPERATURE,
        "temperature",
        "K",
        "the IAPWS-IF97 saturation-pressure equation",
    )
    return _saturation_pressure(temperatures)


@overload
def saturation_temperature(pressure: float) -> float: ...
@overload
def saturation_temperature(pressure: FloatArray) -> FloatArray: ...
def saturation_temperature(pressure: float | FloatArray) -> float | FloatArray:
    """Saturation (boiling) temperature of water at a pressure.

    Evaluates the backward saturation-temperature equation of IAPWS-IF97 region 4.

    Parameters
    ----------
    pressure : float or ndarray
        Absolute pressure [Pa], within 611.212677 Pa (saturation at 273.15 K) to
        22.064 MPa (the critical pressure).

    Returns
    -------
    float or ndarray
        Saturation temperature [K], same shape as `pressure`.

    Raises
    ------
    CaseError
        If a pressure is outside the range of the equation or is not a number.

    References
    ----------
    IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for the
    Thermodynamic Properties of Water and Steam", eq. 31 with the coefficients of Table 34.
    """
    pressures = _values(pressure)
    _check_range(
        pressures,
        MIN_SATURATION_PRESSURE,
        CRITICAL_PRESSURE,
        "pressure",
        "Pa",
        "the IAPWS-IF97 saturation-temperature equation",
    )
    return _saturation_temperature(pressures)


@overload
def density(temperature: float, pressure: float) -> float: ...
@overload
def density(temperature: FloatArray, pressure: float | FloatArray) -> FloatArray: ...
@overload
def density(temperature: float, pressure: FloatArray) -> FloatArray: ...
def density(temperature: float | FloatArray, pressure: float | FloatArray) -> float | FloatArray:
    """Density of liquid water at a temperature and pressure.

    Evaluates the specific volume of IAPWS-IF97 region 1 (compressed liquid) from the
    pressure derivative gamma_pi of the dimensionless Gibbs free energy.

    Parameters
    ----------
    temperature : float or ndarray
        Temperature [K], within `MIN_TEMPERATURE` (273.15 K) to `MAX_TEMPERATURE`
        (623.15 K).
    pressure : float or ndarray
        Absolute pressure of the liquid [Pa], above 0 and at most 100 MPa; broadcast
        against `temperature`.

    Returns
    -------
    float or ndarray
        Density [kg/m^3], of the broadcast shape of the inputs.

    Raises
    ------
    CaseError
        If a temperature or pressure is outside the ranges above or is not a number.

    Notes
    -----
    IF97 region 1 is valid for ``saturation_pressure(T) <= p <= 100 MPa``. This function
    does not check the lower bound: for a temperature slightly above the boiling
    temperature at `pressure` it returns the density of metastable (superheated) liquid
    from the same equation, which is continuous across the saturation line. Callers that
    must know whether the liquid boils compare `pressure` with `saturation_pressure`.

    References
    ----------
    IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for the
    Thermodynamic Properties of Water and Steam", eq. 7 with the coefficients of Table 2,
    and the relations of Tables 3 and 4.
    """
    temperatures = _values(temperature)
    pressures = _values(pressure)
    _check_liquid_state(temperatures, pressures)
    return _density(temperatures, pressures)


@overload
def viscosity(temperature: float, density: float) -> float: ...
@overload
def viscosity(temperature: FloatArray, density: float | FloatArray) -> FloatArray: ...
@overload
def viscosity(temperature: float, density: FloatArray) -> FloatArray: ...
def viscosity(temperature: float | FloatArray, density: float | FloatArray) -> float | FloatArray:
    """Dynamic viscosity of water at a temperature and density.

    Evaluates the IAPWS 2008 viscosity formulation as ``mu = mu0(T) * mu1(T, rho)``, that
    is with the critical enhancement factor ``mu2`` of the release set to 1.

    Parameters
    ----------
    temperature : float or ndarray
        Temperature [K], positive.
    density : float or ndarray
        Density [kg/m^3], positive; broadcast against `temperature`. For liquid water
        take it from `density`.

    Returns
    -------
    float or ndarray
        Dynamic viscosity [Pa s], of the broadcast shape of the inputs.

    Raises
    ------
    CaseError
        If a temperature or density is not a positive finite number.

    Notes
    -----
    The critical enhancement ``mu2`` of IAPWS R12-08 grows large only in a small region
    around the critical point (647.096 K, 322 kg/m^3). Liquid water below 623.15 K lies
    far from it, so setting ``mu2 = 1`` changes nothing of engineering significance:
    compared with the full formulation (as evaluated by the reference package used in
    the tests) the relative difference on the liquid side of saturation is below 1e-11
    up to 440 K, about 1e-8 at 500 K, 4e-6 at 600 K and 5e-5 at 623.15 K.

    The release covers liquid water from the melting curve to 1173.15 K at pressures up
    to 1000 MPa; this function checks only that the inputs are positive and finite.

    References
    ----------
    IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary
    Water Substance", eqs. 10 to 12 with the coefficients of Tables 1 and 2.
    """
    temperatures = _values(temperature)
    densities = _values(density)
    _check_positive(temperatures, "temperature", "K")
    _check_positive(densities, "density", "kg/m^3")
    return _viscosity(temperatures, densities)


@overload
def properties(temperature: float, pressure: float) -> tuple[float, float, float]: ...
@overload
def properties(
    temperature: FloatArray, pressure: float | FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray]: ...
@overload
def properties(
    temperature: float, pressure: FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray]: ...
def properties(
    temperature: float | FloatArray, pressure: float | FloatArray
) -> tuple[float, float, float] | tuple[FloatArray, FloatArray, FloatArray]:
    """Density, dynamic viscosity and vapour pressure of liquid water.

    Parameters
    ----------
    temperature : float or ndarray
        Temperature [K], within 273.15 K to 623.15 K.
    pressure : float or ndarray
        Absolute pressure of the liquid [Pa], above 0 and at most 100 MPa; broadcast
        against `temperature`.

    Returns
    -------
    density : float or ndarray
        Density [kg/m^3], IAPWS-IF97 region 1 (see `density`).
    viscosity : float or ndarray
        Dynamic viscosity [Pa s], IAPWS 2008 without critical enhancement (see
        `viscosity`).
    vapor_pressure : float or ndarray
        Saturation pressure at `temperature` [Pa], IAPWS-IF97 region 4 (see
        `saturation_pressure`), broadcast to the shape of the other two.

    Raises
    ------
    CaseError
        If a temperature or pressure is outside the ranges above or is not a number.

    References
    ----------
    IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation 1997 for the
    Thermodynamic Properties of Water and Steam", eqs. 7 and 30.
    IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary
    Water Substance", eqs. 10 to 12.
    """
    temperatures = _values(temperature)
    pressures = _values(pressure)
    _check_liquid_state(temperatures, pressures)
    densities = _density(temperatures, pressures)
    viscosities = _viscosity(temperatures, densities)
    vapor_pressures = _saturation_pressure(temperatures)
    if isinstance(densities, float):
        return densities, float(viscosities), float(vapor_pressures)
    viscosity_array = np.asarray(viscosities, dtype=np.float64)
    vapor_pressure_array = np.asarray(vapor_pressures, dtype=np.float64)
    if vapor_pressure_array.shape != densities.shape:
        # A pressure array with a scalar (or lower-dimensional) temperature.
        vapor_pressure_array = np.broadcast_to(vapor_pressure_array, densities.shape).copy()
    return densities, viscosity_array, vapor_pressure_array
