"""PURE: a report -> the system-curve figure (a plotly figure as a plain dict).

The figure is built as a dict (what `dcc.Graph` takes) because that is several times
faster than assembling `plotly.graph_objects` on every edit; `as_plotly` turns it
into a `go.Figure` for the PNG and HTML files.

Visual language: the band below zero head is where gravity alone delivers the flow
(H_sys <= 0), shaded pale green with the zero line drawn heavy; system curves are
solid, one colour per scenario; pump and arrangement curves are dashed in warm
colours, their operating points filled circles and the best efficiency points
open diamonds; the demand is a vertical dotted rule with a cross on every system
curve.
"""

from __future__ import annotations

from typing import Any

import numpy as np

from syscurve.arrangement import Arrangement, Combined, mixed_parallel_flows
from syscurve.results import Report
from syscurve.units import Display

SCENARIO_COLOURS = ("#2c5878", "#a8452f", "#4d7c55", "#6b5b95", "#5c6b73")
PUMP_COLOURS = ("#b07d1e", "#7d4f8c", "#2f8a88", "#9c5a3c", "#55708f", "#8a8a2e")
GRAVITY_FILL = "rgba(77, 124, 85, 0.10)"
GRAVITY_TEXT = "#3f6b47"
INK = "#1f2a33"
MUTED = "#5b6770"
GRID = "#e3e7ea"
FONT = "Inter, 'Segoe UI', system-ui, -apple-system, sans-serif"
CURVE_POINTS = 80


def _colour(palette: tuple[str, ...], index: int) -> str:
    return palette[index % len(palette)]


def _list(values: Any) -> list[float | None]:
    return [None if not np.isfinite(v) else round(float(v), 6) for v in np.asarray(values)]


def _arrangement_curves(
    arrangement: Arrangement, speed_rpm: float | None
) -> tuple[np.ndarray, np.ndarray, tuple[float, float] | None]:
    """Total flow and head along an arrangement's curve (SI), and its BEP if it has one."""
    if arrangement.identical:
        units = arrangement.units_at(1.0)
        unit = units[0]
        if speed_rpm is not None and abs(speed_rpm - unit.speed_rpm) > 1e-9:
            unit = arrangement.pumps[0].at_speed(speed_rpm)
        combined = Combined(unit, arrangement.count, arrangement.connection)
        flow = np.linspace(combined.min_flow, combined.max_flow, CURVE_POINTS)
        head = combined.head(flow, extrapolate=False)
        bep = None
        if unit.bep_flow is not None and unit.bep_head is not None:
            bep = (
                unit.bep_flow * combined.parallel_units,
                unit.bep_head * combined.series_units,
            )
        return flow, head, bep
    top = max(u.shutoff_head for u in arrangement.pumps)  # above the weaker shutoffs one runs
    low = max(float(u.head[-1]) for u in arrangement.pumps)
    heads = np.linspace(max(low, 0.0), top, CURVE_POINTS)
    flows = np.array([sum(mixed_parallel_flows(arrangement.pumps, h)) for h in heads])
    order = np.argsort(flows)
    return flows[order], heads[order], None


def _short(text: str, length: int = 32) -> str:
    """A legend entry cut to `length` characters (the hover shows the whole name)."""
    return text if len(text) <= length else text[: length - 1].rstrip() + "…"


def _hover(flow: str, head: str, title: str, extra: str = "") -> str:
    return f"<b>{title}</b><br>Q = %{{x:.4g}} {flow}<br>H = %{{y:.4g}} {head}{extra}<extra></extra>"


def system_figure(report: Report, display: Display) -> dict[str, Any]:
    """The system curves, pump curves, operating points and the demand, in display units.

    Every trace carries ``meta = {"role": ..., ...}`` with role ``system-curve``
    (and ``scenario``), ``gravity-flow``, ``demand``, ``pump-curve`` (and
    ``arrangement``), ``operating-points`` (and ``arrangement``) or ``bep``.
    """
    d = display
    flow_label, head_label = d.label("flow"), d.label("head")
    traces: list[dict[str, Any]] = []
    x_max = 0.0
    heads: list[float] = [0.0]
    for index, result in enumerate(report.scenarios):
        x = d.value("flow", np.asarray(result.curve_flow))
        y = d.value("head", np.asarray(result.curve_head))
        x_max = max(x_max, float(np.max(x)))
        heads += [float(np.min(y)), float(np.max(y))]
        traces.append(
            {
                "type": "scatter",
                "mode": "lines",
                "name": f"system, {result.name}",
                "x": _list(x),
                "y": _list(y),
                "line": {"color": _colour(SCENARIO_COLOURS, index), "width": 2.6},
                "hovertemplate": _hover(flow_label, head_label, f"System curve, {result.name}"),
                "meta": {"role": "system-curve", "scenario": result.name},
            }
        )
    gravity = [r for r in report.scenarios if r.gravity_flow > 0]
    if gravity:
        traces.append(
            {
                "type": "scatter",
                "mode": "markers",
                "name": "gravity flow (H_sys = 0)",
                "x": [round(float(d.value("flow", r.gravity_flow)), 6) for r in gravity],
                "y": [0.0] * len(gravity),
                "text": [r.name for r in gravity],
                "marker": {
                    "symbol": "circle-open",
                    "size": 11,
                    "line": {"width": 2},
                    "color": [
                        _colour(SCENARIO_COLOURS, report.scenarios.index(r)) for r in gravity
                    ],
                },
                "hovertemplate": (
                    f"<b>Gravity flow, %{{text}}</b><br>Q = %{{x:.4g}} {flow_label}<extra></extra>"
                ),
                "meta": {"role": "gravity-flow"},
            }
        )
    demand = float(d.value("flow", report.case.demand))
    traces.append(
        {
            "type": "scatter",
            "mode": "markers",
            "name": f"demand {d.text('flow', report.case.demand)}",
            "x": [round(demand, 6)] * len(report.scenarios),
            "y": [round(float(d.value("head", r.head_at_demand)), 6) for r in report.scenarios],
            "text": [r.name for r in report.scenarios],
            "marker": {"symbol": "x-thin", "size": 13, "line": {"width": 2.5, "color": INK}},
            "hovertemplate": (
                f"<b>At the demand, %{{text}}</b><br>Q = %{{x:.4g}} {flow_label}"
                f"<br>H_sys = %{{y:.4g}} {head_label}<extra></extra>"
            ),
            "meta": {"role": "demand"},
        }
    )
    x_max = max(x_max, demand * 1.1)
    pump_traces, pump_heads, pump_flows = _pump_traces(report, d, x_max)
    traces += pump_traces
    heads += pump_heads
    x_max = max([x_max, *(q * 1.05 for q in pump_flows if q < 2.0 * x_max)])
    low, high = min(heads), max(heads)
    pad = 0.08 * max(high - low, 1.0)
    y_range = [low - pad, high + pad]
    return {"data": traces, "layout": _layout(d, x_max, y_range, demand)}


def _pump_traces(
    report: Report, d: Display, x_limit: float
) -> tuple[list[dict[str, Any]], list[float], list[float]]:
    """Pump curves, operating points and BEPs; heads on the curves up to `x_limit` and the
    operating flows (display units), for the axis ranges."""
    flow_label, head_label = d.label("flow"), d.label("head")
    traces: list[dict[str, Any]] = []
    heads: list[float] = []
    flows: list[float] = []
    beps: list[tuple[float, float, str]] = []
    points_by_arrangement: dict[str, list[Any]] = {}
    for point in report.operating_points:
        points_by_arrangement.setdefault(point.arrangement, []).append(point)
    for index, arrangement in enumerate(report.case.pump_part.arrangements):
        colour = _colour(PUMP_COLOURS, index)
        points = points_by_arrangement.get(arrangement.name, [])
        if arrangement.for_demand:
            speeds = [(p.scenario, p.speed_rpm) for p in points if p.speed_rpm is not None]
        else:
            speeds = [("", arrangement.speed_rpm)]
        for scenario, speed in speeds:
            flow, head, bep = _arrangement_curves(arrangement, speed)
            x, y = d.value("flow", flow), d.value("head", head)
            finite = np.isfinite(y)
            heads += [float(v) for v, q in zip(y[finite], x[finite], strict=True) if q <= x_limit]
            name = arrangement.name if not scenario else f"{arrangement.name}, {scenario}"
            speed_note = f" at {speed:.0f} rpm" if speed is not None else ""
            legend = (
                f"{arrangement.pump_label} {speed:.0f} rpm, {scenario}"
                if scenario and speed
                else arrangement.name
            )
            traces.append(
                {
                    "type": "scatter",
                    "mode": "lines",
                    "name": _short(legend),
                    "x": _list(x),
                    "y": _list(y),
                    "line": {
                        "color": colour,
                        "width": 2,
                        "dash": "dash" if not scenario else "dot",
                    },
                    "hovertemplate": _hover(flow_label, head_label, f"{name}{speed_note}"),
                    "meta": {"role": "pump-curve", "arrangement": arrangement.name},
                }
            )
            if bep is not None and not scenario:
                beps.append((bep[0], bep[1], arrangement.name))
        solved = [p for p in points if p.flow is not None and p.head is not None]
        if solved:
            traces.append(_operating_trace(solved, d, colour, arrangement.name, index))
            flows += [float(d.value("flow", p.flow)) for p in solved]
    if beps:
        traces.append(
            {
                "type": "scatter",
                "mode": "markers",
                "name": "best efficiency point",
                "x": [round(float(d.value("flow", b[0])), 6) for b in beps],
                "y": [round(float(d.value("head", b[1])), 6) for b in beps],
                "text": [b[2] for b in beps],
                "marker": {"symbol": "diamond-open", "size": 10, "color": MUTED},
                "hovertemplate": (
                    f"<b>BEP, %{{text}}</b><br>Q = %{{x:.4g}} {flow_label}"
                    f"<br>H = %{{y:.4g}} {head_label}<extra></extra>"
                ),
                "meta": {"role": "bep"},
            }
        )
    return traces, heads, flows


def _operating_trace(
    points: list[Any], d: Display, colour: str, name: str, index: int
) -> dict[str, Any]:
    def efficiency(p: Any) -> str:
        return "n/a" if p.efficiency is None else f"{100 * p.efficiency:.0f} %"

    return {
        "type": "scatter",
        "mode": "markers",
        "name": f"operating points, {name}",
        "x": [round(float(d.value("flow", p.flow)), 6) for p in points],
        "y": [round(float(d.value("head", p.head)), 6) for p in points],
        "customdata": [[p.scenario, efficiency(p), p.status] for p in points],
        "marker": {"size": 10, "color": colour, "line": {"color": "white", "width": 1.5}},
        "hovertemplate": (
            f"<b>{name}</b>, %{{customdata[0]}}<br>Q = %{{x:.4g}} {d.label('flow')}"
            f"<br>H = %{{y:.4g}} {d.label('head')}<br>efficiency %{{customdata[1]}}"
            "<br>status %{customdata[2]}<extra></extra>"
        ),
        "meta": {"role": "operating-points", "arrangement": name},
        "showlegend": False,
    }


def _layout(d: Display, x_max: float, y_range: list[float], demand: float) -> dict[str, Any]:
    axis: dict[str, Any] = {
        "gridcolor": GRID,
        "linecolor": "#aab4bb",
        "ticks": "outside",
        "tickcolor": "#aab4bb",
        "zeroline": False,
        "mirror": True,
        "showline": True,
        "title": {"font": {"size": 13, "color": INK}},
    }
    return {
        "font": {"family": FONT, "size": 12, "color": INK},
        "paper_bgcolor": "white",
        "plot_bgcolor": "white",
        "margin": {"l": 60, "r": 18, "t": 26, "b": 40},
        "hovermode": "closest",
        "xaxis": {
            **axis,
            "title": {**axis["title"], "text": f"Flow Q [{d.label('flow')}]"},
            "range": [0, x_max * 1.02],
        },
        "yaxis": {
            **axis,
            "title": {**axis["title"], "text": f"Head H [{d.label('head')}]"},
            "range": y_range,
        },
        "legend": {
            "orientation": "h",
            "x": 0,
            "y": -0.14,
            "yanchor": "top",
            "font": {"size": 11},
            "entrywidth": 0.33,
            "entrywidthmode": "fraction",
        },
        "shapes": [
            {
                "type": "rect",
                "xref": "x",
                "yref": "y",
                "x0": 0,
                "x1": x_max * 1.02,
                "y0": y_range[0],
                "y1": 0,
                "fillcolor": GRAVITY_FILL,
                "line": {"width": 0},
                "layer": "below",
            },
            {
                "type": "line",
                "xref": "x",
                "yref": "y",
                "x0": 0,
                "x1": x_max * 1.02,
                "y0": 0,
                "y1": 0,
                "line": {"color": GRAVITY_TEXT, "width": 2},
                "layer": "below",
            },
            {
                "type": "line",
                "xref": "x",
                "yref": "paper",
                "x0": demand,
                "x1": demand,
                "y0": 0,
                "y1": 1,
                "line": {"color": INK, "width": 1.2, "dash": "dot"},
            },
        ],
        "annotations": [
            {
                "xref": "paper",
                "yref": "y",
                "x": 0.01,
                "y": y_range[0],
                "yanchor": "bottom",
                "xanchor": "left",
                "showarrow": False,
                "text": "H_sys ≤ 0: gravity alone delivers these flows",
                "font": {"size": 11, "color": GRAVITY_TEXT},
            },
            {
                "xref": "x",
                "yref": "paper",
                "x": demand,
                "y": 1,
                "yanchor": "top",
                "xanchor": "left",
                "xshift": 4,
                "showarrow": False,
                "text": f"demand {d.text('flow', d.to_si('flow', demand))}",
                "font": {"size": 11, "color": INK},
            },
        ],
    }


def as_plotly(figure: dict[str, Any]) -> Any:
    """The figure dict as a `plotly.graph_objects.Figure` (validated)."""
    import plotly.graph_objects as go

    return go.Figure(figure)


def empty_figure(message: str) -> dict[str, Any]:
    """A blank figure that says why there is nothing to plot."""
    return {
        "data": [],
        "layout": {
            "font": {"family": FONT, "color": MUTED},
            "paper_bgcolor": "white",
            "plot_bgcolor": "white",
            "xaxis": {"visible": False},
            "yaxis": {"visible": False},
            "annotations": [
                {
                    "text": message,
                    "showarrow": False,
                    "xref": "paper",
                    "yref": "paper",
                    "x": 0.5,
                    "y": 0.5,
                    "font": {"size": 14},
                }
            ],
        },
    }
