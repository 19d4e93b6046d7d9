"""Monotone piecewise cubic Hermite interpolation (PCHIP) in numpy, and the checks of
the pump points it is fitted to (used by `syscurve.pump`).

Pump data are a handful of measured points; the curve between them is drawn by
PCHIP: a cubic on each interval, fixed by the values and slopes at its two ends.
The slopes are chosen so that no interval overshoots its end values:

* at an interior point, zero when the data turn there (the neighbouring secant
  slopes differ in sign or one is zero), otherwise the weighted harmonic mean of
  the two secant slopes (Fritsch & Butland 1984), which lies in the region where
  the cubic stays monotone (Fritsch & Carlson 1980);
* at the two end points, the one-sided three-point estimate, set to zero when its
  sign differs from the end secant and limited to three times that secant when
  the data turn at the next point (the shape-preserving end rule of Moler's
  ``pchiptx``).

This is the derivative choice of ``scipy.interpolate.PchipInterpolator``; the tests
compare against it. scipy is not imported here: importing it costs the command line
about 0.6 s.

References
----------
.. [1] Fritsch, F. N. & Carlson, R. E. (1980). Monotone piecewise cubic
   interpolation. SIAM J. Numer. Anal. 17(2), 238-246.
.. [2] Fritsch, F. N. & Butland, J. (1984). A method for constructing local monotone
   piecewise cubic interpolants. SIAM J. Sci. Stat. Comput. 5(2), 300-304.
.. [3] Moler, C. (2004). Numerical Computing with MATLAB, sec. 3.6. SIAM.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .errors import Problems

FloatArray = NDArray[np.float64]

#: Bisection steps of the inverse: 2^-64 of an interval is below double precision.
_BISECTIONS = 64


def pchip_slopes(x: FloatArray, y: FloatArray) -> FloatArray:
    """Slopes dy/dx at the points, by the PCHIP rule (see the module notes).

    Parameters
    ----------
    x : ndarray
        Abscissae, strictly increasing, at least two.
    y : ndarray
        Ordinates, same length.

    Returns
    -------
    ndarray
        The slope at each point. With two points both are the secant slope (a line).
    """
    h = np.diff(x)
    m = np.diff(y) / h
    if len(x) == 2:
        return np.array([m[0], m[0]])
    d = np.zeros_like(y)
    turn = (np.sign(m[1:]) != np.sign(m[:-1])) | (m[1:] == 0) | (m[:-1] == 0)
    w1 = 2.0 * h[1:] + h[:-1]
    w2 = h[1:] + 2.0 * h[:-1]
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):  # 1/inf -> 0: flat
        harmonic = (w1 / m[:-1] + w2 / m[1:]) / (w1 + w2)
        d[1:-1] = np.where(turn, 0.0, 1.0 / harmonic)
    d[0] = _end_slope(h[0], h[1], m[0], m[1])
    d[-1] = _end_slope(h[-1], h[-2], m[-1], m[-2])
    return d


def _end_slope(h0: float, h1: float, m0: float, m1: float) -> float:
    """One-sided three-point slope at an end, limited to keep the shape."""
    d = ((2.0 * h0 + h1) * m0 - h0 * m1) / (h0 + h1)
    if np.sign(d) != np.sign(m0):
        return 0.0
    if np.sign(m0) != np.sign(m1) and abs(d) > 3.0 * abs(m0):
        return 3.0 * m0
    return float(d)


@dataclass(frozen=True, eq=False)
class Pchip:
    """A PCHIP interpolant through points (x, y), with linear continuation outside.

    Parameters
    ----------
    x : ndarray
        Abscissae, strictly increasing, at least two (checked by the caller).
    y : ndarray
        Ordinates.
    """

    x: FloatArray
    y: FloatArray
    slopes: FloatArray = field(init=False, repr=False)
    _coefficients: FloatArray = field(init=False, repr=False)

    def __post_init__(self) -> None:
        x = np.array(self.x, dtype=float)
        y = np.array(self.y, dtype=float)
        if x.ndim != 1 or x.shape != y.shape or len(x) < 2 or not np.all(np.diff(x) > 0):
            raise ValueError("PCHIP needs two or more points with strictly increasing x")
        d = pchip_slopes(x, y)
        h = np.diff(x)
        m = np.diff(y) / h
        # Power form on each interval in the local variable t = (x - x_i) / h_i, in [0, 1]:
        # y = ((c0 t + c1) t + c2) t + c3 (no h^2 that could underflow).
        c = np.empty((4, len(h)))
        c[0] = (d[:-1] + d[1:] - 2.0 * m) * h
        c[1] = (3.0 * m - 2.0 * d[:-1] - d[1:]) * h
        c[2] = d[:-1] * h
        c[3] = y[:-1]
        for array in (x, y, d, c):
            array.flags.writeable = False
        object.__setattr__(self, "x", x)
        object.__setattr__(self, "y", y)
        object.__setattr__(self, "slopes", d)
        object.__setattr__(self, "_coefficients", c)

    def __call__(self, xq: ArrayLike, extrapolate: bool = False) -> FloatArray:
        """Values at `xq`; outside [x[0], x[-1]] NaN, or the end tangent line if `extrapolate`."""
        xq = np.asarray(xq, dtype=float)
        x, c = self.x, self._coefficients
        i = np.minimum(np.maximum(np.searchsorted(x, xq, side="right") - 1, 0), len(x) - 2)
        t = (xq - x[i]) / (x[i + 1] - x[i])
        values = ((c[0, i] * t + c[1, i]) * t + c[2, i]) * t + c[3, i]
        below, above = xq < x[0], xq > x[-1]
        if extrapolate:
            values = np.where(below, self.y[0] + self.slopes[0] * (xq - x[0]), values)
            values = np.where(above, self.y[-1] + self.slopes[-1] * (xq - x[-1]), values)
        else:
            values = np.where(below | above, np.nan, values)
        return np.asarray(values, dtype=float)

    def solve(self, target: ArrayLike, first_interval: int = 0) -> FloatArray:
        """The largest x in [x[first_interval], x[-1]] where the interpolant equals `target`.

        Every interval of a PCHIP is monotone between its end values, so a target
        lies in an interval exactly when it lies between that interval's end values,
        and there the root is unique (on a flat interval any x is a root; its right
        end is returned). Roots are found by bisection on the interval, vectorised.

        Returns
        -------
        ndarray
            x, or NaN where no interval from `first_interval` on reaches `target`.
        """
        target = np.asarray(target, dtype=float)
        flat = target.ravel()
        x, y, c = self.x, self.y, self._coefficients
        interval = np.full(flat.shape, -1)
        for i in range(first_interval, len(x) - 1):
            low, high = min(y[i], y[i + 1]), max(y[i], y[i + 1])
            interval = np.where((flat >= low) & (flat <= high), i, interval)
        found = interval >= 0
        j = np.where(found, interval, 0)
        rising = y[j + 1] > y[j]
        lower = np.zeros(flat.shape)
        upper = np.ones(flat.shape)
        for _ in range(_BISECTIONS):
            t = 0.5 * (lower + upper)
            value = ((c[0, j] * t + c[1, j]) * t + c[2, j]) * t + c[3, j]
            go_right = (value < flat) == rising
            lower = np.where(go_right, t, lower)
            upper = np.where(go_right, upper, t)
        roots = np.where(found, x[j] + 0.5 * (lower + upper) * (x[j + 1] - x[j]), np.nan)
        return roots.reshape(target.shape)


def leave_one_out(x: FloatArray, y: FloatArray) -> FloatArray:
    """Residuals y_i minus the PCHIP through all other points, at x_i; NaN at both ends."""
    residuals = np.full(len(x), np.nan)
    for i in range(1, len(x) - 1):
        fit = Pchip(np.delete(x, i), np.delete(y, i))
        residuals[i] = y[i] - float(fit(x[i]))
    return residuals


# --- checks of pump points --------------------------------------------------------------

QUANTITIES = ("head", "efficiency", "shaft_power", "npsh_required")


def flow_text(flow: float) -> str:
    """A flow [m^3/s] as text in L/s, for messages."""
    return f"{flow * 1e3:.4g} L/s"


def check_points(
    problems: Problems,
    key: str,
    name: Any,
    speed_rpm: Any,
    arrays: dict[str, FloatArray | None],
    labels: Sequence[str] | None,
) -> None:
    """Record every problem of a pump curve's points.

    `arrays` maps "flow" and the names in `QUANTITIES` to float arrays or None (not
    given); keys of problems are ``f"{key}.{quantity}"``; `labels` name the points in
    messages (default "point 1", ...).
    """
    if not isinstance(name, str) or not name.strip():
        problems.add(f"{key}.name", f"expected a non-empty name, got {name!r}")
    if isinstance(speed_rpm, bool) or not isinstance(speed_rpm, (int, float, np.number)):
        problems.add(f"{key}.speed", f"expected a number of rpm, got {speed_rpm!r}")
    elif not (np.isfinite(speed_rpm) and speed_rpm > 0):
        problems.add(f"{key}.speed", f"must be > 0 rpm, got {speed_rpm!r}")
    flow = arrays["flow"]
    if flow is None:
        return
    n = len(flow)

    def point(i: int) -> str:
        return labels[i] if labels is not None and i < len(labels) else f"point {i + 1}"

    if n < 3:
        problems.add(f"{key}.flow", f"needs at least 3 points, got {n}; a curve needs shape")
        if n == 0:
            return
    good: dict[str, FloatArray] = {}
    for quantity, values in arrays.items():
        if values is None:
            continue
        if len(values) != n:
            problems.add(
                f"{key}.{quantity}",
                f"has {len(values)} values but flow has {n}; give one value per flow",
            )
            continue
        bad = [
            i
            for i in range(n)
            if not np.isfinite(values[i])
            and not (quantity in ("efficiency", "npsh_required") and flow[i] == 0)
        ]
        for i in bad:
            problems.add(f"{key}.{quantity}", f"{point(i)} is not a finite number ({values[i]})")
        if not bad:
            good[quantity] = values
    flow_ok = "flow" in good
    if flow_ok:
        if flow[0] < 0:
            problems.add(f"{key}.flow", f"must be >= 0; got {flow_text(flow[0])} at {point(0)}")
        for i in range(1, n):
            if not flow[i] > flow[i - 1]:
                got, before = flow_text(flow[i]), flow_text(flow[i - 1])
                problems.add(
                    f"{key}.flow", f"must increase strictly; got {got} after {before} at {point(i)}"
                )
    if "head" in good:
        head = good["head"]
        for i in np.flatnonzero(head < 0).tolist():
            problems.add(f"{key}.head", f"must be >= 0; got {head[i]:g} m at {point(i)}")
        if n >= 2 and not head[-1] < head.max():
            problems.add(
                f"{key}.head",
                f"does not fall with flow: the head at the highest flow ({head[-1]:g} m) must "
                f"be below the highest head ({head.max():g} m); check the order of the points",
            )
    if "efficiency" in good and flow_ok:
        for i, eta in enumerate(good["efficiency"]):
            if flow[i] == 0:
                if np.isfinite(eta) and eta != 0:
                    problems.add(
                        f"{key}.efficiency",
                        f"must be 0 (or blank) at zero flow, got {eta * 100:g} % at {point(i)}",
                    )
            elif not 0 < eta <= 1:
                hint = " (efficiency is a fraction here: 0.72 for 72 %)" if eta >= 5 else ""
                problems.add(
                    f"{key}.efficiency",
                    f"must be above 0 and at most 100 % where the flow is positive; "
                    f"got {eta * 100:g} % at {point(i)}{hint}",
                )
    if "shaft_power" in good:
        for i in np.flatnonzero(~(good["shaft_power"] > 0)).tolist():
            problems.add(
                f"{key}.shaft_power", f"must be > 0; got {good['shaft_power'][i]:g} W at {point(i)}"
            )
    if "npsh_required" in good:
        for i in np.flatnonzero(good["npsh_required"] < 0).tolist():
            problems.add(
                f"{key}.npsh_required",
                f"must be >= 0; got {good['npsh_required'][i]:g} m at {point(i)}",
            )


def as_points(raw: Any, problems: Problems, key: str) -> FloatArray | None:
    """`raw` as a 1-d float array, or None with a problem recorded."""
    try:
        array = np.array(raw, dtype=float)
    except (TypeError, ValueError):
        problems.add(key, f"expected a list of numbers, got {raw!r}")
        return None
    if array.ndim != 1:
        problems.add(key, f"expected a flat list of numbers, got shape {array.shape}")
        return None
    return array
