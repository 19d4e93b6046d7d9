"""Robust scalar root finding without scipy (scipy.optimize costs ~0.6 s to import).

`brent` is Brent's (1973) method: inverse quadratic interpolation and secant steps,
safeguarded by bisection, so it converges for any continuous function whose
bracket changes sign. `bracket_increasing` finds such a bracket for an increasing
function by doubling.
"""

from __future__ import annotations

import math
from collections.abc import Callable


class NoBracket(ValueError):
    """The function does not change sign where it was searched."""


def brent(
    function: Callable[[float], float],
    lower: float,
    upper: float,
    *,
    xtol: float = 1e-15,
    rtol: float = 4e-16,
    max_iterations: int = 200,
) -> float:
    """A root of `function` in [lower, upper], where the function changes sign.

    References
    ----------
    .. [1] Brent, R. P. (1973). Algorithms for Minimization without Derivatives,
       ch. 4. Prentice-Hall.
    """
    a, b = lower, upper
    fa, fb = function(a), function(b)
    if fa == 0.0:
        return a
    if fb == 0.0:
        return b
    if (fa > 0) == (fb > 0):
        raise NoBracket(f"no sign change between {a:g} and {b:g}")
    c, fc = a, fa
    d = e = b - a
    for _ in range(max_iterations):
        if (fb > 0) == (fc > 0):
            c, fc = a, fa
            d = e = b - a
        if abs(fc) < abs(fb):
            a, b, c = b, c, b
            fa, fb, fc = fb, fc, fb
        tolerance = 2.0 * rtol * abs(b) + 0.5 * xtol
        half = 0.5 * (c - b)
        if abs(half) <= tolerance or fb == 0.0:
            return b
        if abs(e) >= tolerance and abs(fa) > abs(fb):
            s = fb / fa
            if a == c:  # secant
                p = 2.0 * half * s
                q = 1.0 - s
            else:  # inverse quadratic interpolation
                q = fa / fc
                r = fb / fc
                p = s * (2.0 * half * q * (q - r) - (b - a) * (r - 1.0))
                q = (q - 1.0) * (r - 1.0) * (s - 1.0)
            if p > 0:
                q = -q
            else:
                p = -p
            if 2.0 * p < min(3.0 * half * q - abs(tolerance * q), abs(e * q)):
                e, d = d, p / q
            else:
                d = e = half
        else:
            d = e = half
        a, fa = b, fb
        b += d if abs(d) > tolerance else math.copysign(tolerance, half)
        fb = function(b)
    return b


def bracket_increasing(
    function: Callable[[float], float], lower: float, guess: float, max_doublings: int = 200
) -> tuple[float, float]:
    """[lower, upper] such that an increasing `function` is < 0 at lower and >= 0 at upper.

    Raises `NoBracket` when the function is already >= 0 at `lower` or never
    reaches 0 within `max_doublings` doublings of `guess`.
    """
    if function(lower) >= 0:
        raise NoBracket(f"function is not negative at {lower:g}")
    upper = max(guess, lower + 1e-12)
    low = lower
    for _ in range(max_doublings):
        if function(upper) >= 0:
            return low, upper
        low, upper = upper, 2.0 * upper
    raise NoBracket(f"function stays negative up to {upper:g}")
