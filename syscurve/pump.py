"""A pump curve from measured points: head, efficiency, shaft power and NPSHr.

The points are joined by monotone piecewise cubic Hermite interpolation (PCHIP,
`syscurve.pumpfit`), one fit per quantity. PCHIP passes through every point and
never overshoots the data between them: each interval is monotone between its end
values. A least-squares polynomial, the usual alternative, misses the points and
wiggles between them; near the best efficiency point (BEP) it can put the peak
between points and above every measured value, or turn a falling head curve into
a rising one, so an operating point read from it would be misquoted.

Shaft power data are taken as measured on cold water of density `TEST_DENSITY`
(998.2 kg/m^3, water at 20 degC); the power on another liquid is scaled by the
density ratio. Efficiency is taken as independent of the liquid (no viscosity
correction is made).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import ArrayLike, NDArray

from .errors import CaseError, Problems
from .pumpfit import (
    QUANTITIES,
    FloatArray,
    Pchip,
    as_points,
    check_points,
    leave_one_out,
)
from .units import Display, G

#: Density of the test liquid of shaft-power data: water at 20 degC (IAPWS-95 gives
#: 998.21 kg/m^3). [kg/m^3]
TEST_DENSITY = 998.2
#: A head at the lowest flow more than this fraction below the maximum head makes the
#: curve unstable (rising from shutoff to a hump).
UNSTABLE_MARGIN = 0.005
#: Efficiencies given and derived from measured power may differ by this fraction.
CONSISTENCY_TOLERANCE = 0.05


@dataclass(frozen=True, eq=False)
class PumpCurve:
    """A pump's curves at one speed, from measured points; all values SI.

    Build it with `PumpCurve.from_points`, which reports every input problem at once.

    Parameters
    ----------
    name : str
        A generic description, e.g. "inline booster A 2900 rpm".
    speed_rpm : float
        Shaft speed at which the points were measured. [rpm]
    flow : ndarray
        Flows, strictly increasing, flow[0] >= 0, three or more. [m^3/s]
    head : ndarray
        Pump head at each flow. [m]
    efficiency : ndarray or None
        Pump efficiency, a fraction in (0, 1]; 0 at zero flow. [-]
    shaft_power : ndarray or None
        Shaft power as measured on cold water of density `TEST_DENSITY`. [W]
    npsh_required : ndarray or None
        Net positive suction head required. [m]; NaN allowed at zero flow only
        (unknown there), the fit then uses the other points.
    source : str
        Where the points come from (free text).
    """

    name: str
    speed_rpm: float
    flow: FloatArray
    head: FloatArray
    efficiency: FloatArray | None = None
    shaft_power: FloatArray | None = None
    npsh_required: FloatArray | None = None
    source: str = ""
    _fits: dict[str, Pchip] = field(init=False, repr=False)

    def __post_init__(self) -> None:
        arrays: dict[str, FloatArray | None] = {}
        for quantity in ("flow", *QUANTITIES):
            raw = getattr(self, quantity)
            arrays[quantity] = None if raw is None else np.array(raw, dtype=float)
        problems = Problems()
        check_points(problems, "pump", self.name, self.speed_rpm, arrays, None)
        problems.raise_if_any()
        flow = arrays["flow"]
        assert flow is not None
        efficiency = arrays["efficiency"]
        if efficiency is not None:  # no flow, no useful work: efficiency 0 at shutoff
            efficiency[flow == 0] = 0.0
        fits: dict[str, Pchip] = {}
        for quantity, values in arrays.items():
            if values is None:
                continue
            values.flags.writeable = False
            object.__setattr__(self, quantity, values)
            if quantity != "flow":
                known = np.isfinite(values)
                fits[quantity] = Pchip(flow[known], values[known])
        object.__setattr__(self, "speed_rpm", float(self.speed_rpm))
        object.__setattr__(self, "_fits", fits)

    @classmethod
    def from_points(
        cls,
        name: str,
        speed_rpm: float,
        flow: ArrayLike,
        head: ArrayLike,
        efficiency: ArrayLike | None = None,
        shaft_power: ArrayLike | None = None,
        npsh_required: ArrayLike | None = None,
        key: str = "pump[1]",
        *,
        source: str = "",
        point_labels: Sequence[str] | None = None,
    ) -> PumpCurve:
        """Validate measured points and build the curve.

        Parameters
        ----------
        name, speed_rpm, flow, head, efficiency, shaft_power, npsh_required, source
            As the class attributes: SI units, efficiency a FRACTION (the case and
            CSV readers convert percent). Efficiency and NPSHr may be NaN at zero
            flow (efficiency is then 0, NPSHr unknown there).
        key : str
            Key path for error messages, e.g. "pump[2]".
        point_labels : sequence of str, optional
            How messages name each point, e.g. "line 7" (default "point 1", ...).

        Raises
        ------
        CaseError
            One problem per fault, e.g. ``pump[2].flow: must increase strictly; got
            3 L/s after 4 L/s at point 5``.
        """
        problems = Problems()
        arrays: dict[str, FloatArray | None] = {}
        raw_values = (flow, head, efficiency, shaft_power, npsh_required)
        for quantity, raw in zip(("flow", *QUANTITIES), raw_values, strict=True):
            arrays[quantity] = (
                None if raw is None else as_points(raw, problems, f"{key}.{quantity}")
            )
        if arrays["flow"] is None or arrays["head"] is None:
            problems.raise_if_any()
        check_points(problems, key, name, speed_rpm, arrays, point_labels)
        problems.raise_if_any()
        flow_array, head_array = arrays["flow"], arrays["head"]
        assert flow_array is not None and head_array is not None
        return cls(
            name,
            float(speed_rpm),
            flow_array,
            head_array,
            arrays["efficiency"],
            arrays["shaft_power"],
            arrays["npsh_required"],
            source=source,
        )

    # --- evaluation -------------------------------------------------------------------

    def head_at(self, flow: ArrayLike, extrapolate: bool = False) -> FloatArray:
        """Pump head at each flow. [m]

        Outside the measured flows (below flow[0] or above flow[-1]) the result is NaN,
        unless `extrapolate`: then the fit continues as a straight line with its end
        slope. That continuation is no data; it exists so that a solver can find where
        a system curve would meet the pump and report the status ``outside-curve``.
        """
        return self._fits["head"](flow, extrapolate)

    def in_range(self, flow: ArrayLike) -> NDArray[np.bool_]:
        """True where `flow` lies within the measured flows."""
        flow = np.asarray(flow, dtype=float)
        return (flow >= self.flow[0]) & (flow <= self.flow[-1])

    def efficiency_at(self, flow: ArrayLike, extrapolate: bool = False) -> FloatArray:
        """Pump efficiency at each flow, a fraction. [-]

        From the efficiency points when given; otherwise derived from measured power,
        eta = TEST_DENSITY g Q H / P; NaN when the curve has neither (or outside the
        data, see `head_at`).
        """
        flow = np.asarray(flow, dtype=float)
        if "efficiency" in self._fits:
            return self._fits["efficiency"](flow, extrapolate)
        if "shaft_power" in self._fits:
            power = self._fits["shaft_power"](flow, extrapolate)
            return TEST_DENSITY * G * flow * self.head_at(flow, extrapolate) / power
        return np.full(flow.shape, np.nan)

    def shaft_power_at(
        self, flow: ArrayLike, density: float, extrapolate: bool = False
    ) -> FloatArray:
        """Shaft power at each flow when pumping a liquid of `density` [kg/m^3]. [W]

        P = density g Q H / eta when efficiency is given. At zero efficiency (shutoff)
        that is undetermined: the measured power, scaled, is used when given,
        otherwise NaN. With measured power only: P_measured density / TEST_DENSITY.
        """
        flow = np.asarray(flow, dtype=float)
        measured = None
        if "shaft_power" in self._fits:
            measured = self._fits["shaft_power"](flow, extrapolate) * (density / TEST_DENSITY)
        if "efficiency" not in self._fits:
            return measured if measured is not None else np.full(flow.shape, np.nan)
        eta = self._fits["efficiency"](flow, extrapolate)
        useful = density * G * flow * self.head_at(flow, extrapolate)
        with np.errstate(divide="ignore", invalid="ignore"):
            power = np.where(eta > 0, useful / np.where(eta > 0, eta, 1.0), np.nan)
        if measured is not None:
            power = np.where(eta > 0, power, measured)
        return np.asarray(power, dtype=float)

    def npsh_required_at(self, flow: ArrayLike, extrapolate: bool = False) -> FloatArray:
        """NPSH required at each flow [m]; NaN without NPSHr data or outside its points."""
        if "npsh_required" not in self._fits:
            return np.full(np.shape(flow), np.nan)
        return self._fits["npsh_required"](flow, extrapolate)

    # --- characteristic values --------------------------------------------------------

    @property
    def max_flow(self) -> float:
        """Highest measured flow. [m^3/s]"""
        return float(self.flow[-1])

    @property
    def shutoff_extrapolated(self) -> bool:
        """True when no point is at zero flow and `shutoff_head` is extrapolated."""
        return bool(self.flow[0] > 0)

    @property
    def shutoff_head(self) -> float:
        """Head at zero flow [m]; extrapolated linearly when flow[0] > 0 (see flag)."""
        return float(self.head_at(0.0, extrapolate=True))

    @property
    def max_head(self) -> float:
        """Highest head of the curve [m] (PCHIP never overshoots: a data point)."""
        return float(self.head.max())

    @property
    def unstable(self) -> bool:
        """True when the head rises from the lowest flow to a hump (by more than 0.5 %).

        Pumps with such curves can hunt between two flows, notably in parallel.
        """
        return bool(self.head.max() > self.head[0] * (1.0 + UNSTABLE_MARGIN))

    def _point_efficiency(self) -> FloatArray | None:
        if self.efficiency is not None:
            return self.efficiency
        if self.shaft_power is not None:
            return TEST_DENSITY * G * self.flow * self.head / self.shaft_power
        return None

    def _bep_index(self) -> int | None:
        eta = self._point_efficiency()
        return None if eta is None else int(np.argmax(eta))

    @property
    def bep_flow(self) -> float | None:
        """Flow of the best efficiency point [m^3/s]; None without efficiency or power data.

        PCHIP never overshoots, so the fitted efficiency peaks at a data point: the BEP
        is the point of highest efficiency (given, or derived from measured power).
        """
        i = self._bep_index()
        return None if i is None else float(self.flow[i])

    @property
    def bep_head(self) -> float | None:
        """Head at the best efficiency point [m]; None without efficiency or power data."""
        i = self._bep_index()
        return None if i is None else float(self.head[i])

    @property
    def bep_efficiency(self) -> float | None:
        """Best efficiency, a fraction; None without efficiency or power data."""
        eta = self._point_efficiency()
        return None if eta is None else float(eta.max())

    # --- quality of the data ----------------------------------------------------------

    def head_residuals(self) -> FloatArray:
        """Leave-one-out head residuals: data minus prediction without that point. [m]

        An interpolant passes through every point, so its residuals there are zero
        and say nothing. Instead each interior point is left out, the curve is fitted
        to the others and evaluated at the point's flow: a large residual marks a
        point out of line with its neighbours (a misread or mistyped value) or points
        too sparse to pin the shape. The two end points cannot be predicted without
        extrapolating; their residual is NaN.
        """
        return leave_one_out(self.flow, self.head)

    @property
    def max_head_residual(self) -> float:
        """Largest absolute leave-one-out head residual (see `head_residuals`). [m]"""
        return float(np.nanmax(np.abs(self.head_residuals())))

    def consistency_warnings(self, display: Display | None = None) -> list[str]:
        """Points where given efficiency and measured power disagree by more than 5 %."""
        d = display or Display()
        if self.efficiency is None or self.shaft_power is None:
            return []
        messages = []
        derived = TEST_DENSITY * G * self.flow * self.head / self.shaft_power
        for i in np.flatnonzero(self.flow > 0):
            given = self.efficiency[i]
            if abs(derived[i] - given) > CONSISTENCY_TOLERANCE * given:
                messages.append(
                    f'pump "{self.name}" point {i + 1} ({d.text("flow", self.flow[i])}): '
                    "efficiency "
                    f"{given * 100:.1f} % given, but the measured shaft power gives "
                    f"{derived[i] * 100:.1f} % (rho g Q H / P with rho = {TEST_DENSITY} kg/m^3); "
                    f"check the power unit or the efficiency column"
                )
        return messages

    def warnings(self, display: Display | None = None) -> list[str]:
        """Everything worth a second look: unstable shape, extrapolated shutoff, data.

        Numbers are written in `display` units (SI by default).
        """
        d = display or Display()
        messages = []
        if self.unstable:
            messages.append(
                f'pump "{self.name}": the head rises from {d.text("head", self.head[0])} at '
                f"{d.text('flow', self.flow[0])} to {d.text('head', self.max_head)} (an "
                "unstable, drooping "
                f"curve); left of the head maximum it can hunt between two flows, notably in "
                f"parallel"
            )
        if self.shutoff_extrapolated:
            messages.append(
                f'pump "{self.name}": no point at zero flow; the shutoff head '
                f"{d.text('head', self.shutoff_head)} is extrapolated from "
                f"{d.text('flow', self.flow[0])}"
            )
        return messages + self.consistency_warnings(d)

    # --- speed ------------------------------------------------------------------------

    def at_speed(self, speed_rpm: float) -> PumpCurve:
        """The curve at another speed, by the affinity laws.

        Q ~ N, H ~ N^2, P ~ N^3, NPSHr ~ N^2 (approximate: suction performance follows
        the law less closely), efficiency kept (an approximation that holds for modest
        speed changes on larger pumps). Returns a new curve with the same name.
        """
        if not (np.isfinite(speed_rpm) and speed_rpm > 0):
            raise CaseError(f"must be > 0 rpm, got {speed_rpm!r}", "pump.speed")
        r = speed_rpm / self.speed_rpm

        def scaled(values: FloatArray | None, power: int) -> FloatArray | None:
            return None if values is None else values * r**power

        return PumpCurve(
            self.name,
            float(speed_rpm),
            self.flow * r,
            self.head * r**2,
            None if self.efficiency is None else self.efficiency.copy(),
            scaled(self.shaft_power, 3),
            scaled(self.npsh_required, 2),
            source=self.source,
        )


def flow_at_head(curve: PumpCurve, head: ArrayLike, extrapolate: bool = False) -> FloatArray:
    """Flow at which the pump delivers `head`: the inverse of `PumpCurve.head_at`.

    Only the falling part of the curve is inverted: from the (last) point of highest
    head to the end. On an unstable curve that is the branch right of the hump, where
    a pump runs stably. Where the head is never reached on that branch the result is
    NaN: above the maximum head always; below the head at the highest flow unless
    `extrapolate`, which continues the curve as the straight line of `head_at`. With
    `extrapolate` a head between the first point's and the shutoff head of a falling
    curve whose data start above zero flow is also found on the straight line.

    Parameters
    ----------
    curve : PumpCurve
    head : float or ndarray
        Heads [m].
    extrapolate : bool
        Continue the curve linearly beyond its points (see `PumpCurve.head_at`).

    Returns
    -------
    ndarray
        Flows [m^3/s], NaN where the head is not reached.
    """
    head = np.asarray(head, dtype=float)
    fit = curve._fits["head"]
    n = len(curve.head)
    top = n - 1 - int(np.argmax(curve.head[::-1]))
    flows = fit.solve(head, top)
    if extrapolate:
        end_slope = fit.slopes[-1]
        if end_slope < 0:
            beyond = curve.flow[-1] + (head - curve.head[-1]) / end_slope
            flows = np.where(head < curve.head[-1], beyond, flows)
        start_slope = fit.slopes[0]
        if top == 0 and start_slope < 0 and curve.flow[0] > 0:
            before = curve.flow[0] + (head - curve.head[0]) / start_slope
            flows = np.where((head > curve.head[0]) & (before >= 0), before, flows)
    return flows
