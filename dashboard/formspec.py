"""What the form edits: one `FieldSpec` per case key, and the columns of the route grid.

A field knows its key path in the case dict, how the engine reads it (``parse``),
how it is shown (``display``: a kind of `syscurve.units.Display`, or one of the
extra kinds below), its label and when it applies (water or custom liquid, outlet
type). Everything else (reading values for display, writing edits back) lives in
`dashboard.viewmodel` and works from these specifications.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

from . import ids

#: Kinds the engine's `Display` does not convert: same unit in both systems.
FIXED_UNITS: dict[str, tuple[str, str]] = {
    "duration": ("year", "years"),
    "rotational_speed": ("rpm", "rpm"),
    "percent": ("", "%"),
    "number": ("", ""),
    "text": ("", ""),
    "choice": ("", ""),
    "boolean": ("", ""),
}


def _liquid_kind(data: dict[str, Any]) -> str:
    liquid = data.get("liquid")
    kind = liquid.get("kind", "water") if isinstance(liquid, dict) else "water"
    return kind if isinstance(kind, str) else "water"


def _outlet(data: dict[str, Any]) -> str:
    delivery = data.get("delivery")
    outlet = delivery.get("outlet") if isinstance(delivery, dict) else None
    return outlet if isinstance(outlet, str) else "tank"


def _always(data: dict[str, Any]) -> bool:
    return True


def _water(data: dict[str, Any]) -> bool:
    return _liquid_kind(data) == "water"


def _custom(data: dict[str, Any]) -> bool:
    return _liquid_kind(data) == "custom"


def _pressure_outlet(data: dict[str, Any]) -> bool:
    return _outlet(data) == "pressure"


def _tank_outlet(data: dict[str, Any]) -> bool:
    return _outlet(data) == "tank"


@dataclass(frozen=True)
class FieldSpec:
    """One editable value of the case.

    Parameters
    ----------
    key : str
        Key path in the case dict, e.g. ``delivery.demand`` (also the engine's problem key).
    label : str
        What the form calls it.
    parse : str
        How the engine reads it: a kind of `syscurve.units.KINDS`, ``temperature``,
        ``head_or_pressure``, ``number``, ``text`` or ``choice``.
    display : str
        The display kind: a kind of `syscurve.units.DISPLAY_SYSTEMS` or of `FIXED_UNITS`.
    field_id : str
        The component id.
    section : str
        Which block of the form it sits in.
    choices : tuple of str
        For ``choice`` fields.
    default : str
        Shown when the key is absent and the engine uses a default (choices only).
    note : str
        A short hint under the field.
    applies : callable
        Whether the field belongs to the case as it stands (e.g. density: custom liquid).
    """

    key: str
    label: str
    parse: str
    display: str
    field_id: str
    section: str
    choices: tuple[str, ...] = ()
    default: str = ""
    note: str = ""
    applies: Callable[[dict[str, Any]], bool] = _always

    @property
    def path(self) -> tuple[str, ...]:
        return tuple(self.key.split("."))


def _field(key: str, label: str, parse: str, display: str, section: str, **extra: Any) -> FieldSpec:
    field_id = extra.pop("field_id", key.replace(".", "-").replace("_", "-") + "-input")
    return FieldSpec(key, label, parse, display, field_id, section, **extra)


def _friction_models() -> tuple[str, ...]:
    from syscurve.friction import MODELS

    return tuple(MODELS)


LIQUID = "Liquid and site"
ENDS = "Source, delivery and demand"
PIPE = "Pipe"
STATION = "Pump station and energy"

FIELDS: tuple[FieldSpec, ...] = (
    _field("title", "Title", "text", "text", "header", field_id=ids.TITLE_INPUT),
    _field(
        "liquid.kind",
        "Liquid",
        "choice",
        "choice",
        LIQUID,
        choices=("water", "custom"),
        default="water",
    ),
    _field("liquid.temperature", "Temperature", "temperature", "temperature", LIQUID),
    _field(
        "liquid.temperature_max",
        "Warmest temperature",
        "temperature",
        "temperature",
        LIQUID,
        note="optional; NPSH is checked at it",
        applies=_water,
    ),
    _field("liquid.name", "Name", "text", "text", LIQUID, applies=_custom),
    _field("liquid.density", "Density", "density", "density", LIQUID, applies=_custom),
    _field("liquid.viscosity", "Viscosity", "viscosity", "viscosity", LIQUID, applies=_custom),
    _field(
        "liquid.vapor_pressure",
        "Vapour pressure",
        "pressure",
        "pressure",
        LIQUID,
        note="needed for NPSH",
        applies=_custom,
    ),
    _field(
        "liquid.vapor_pressure_max",
        "Vapour pressure, warmest",
        "pressure",
        "pressure",
        LIQUID,
        applies=_custom,
    ),
    _field("site.altitude", "Site altitude", "length", "level", LIQUID),
    _field(
        "site.barometric_pressure",
        "Barometric pressure",
        "pressure",
        "pressure",
        LIQUID,
        note="optional; overrides the altitude",
    ),
    _field("source.level", "Source level", "length", "level", ENDS),
    _field("source.level_min", "Source level, lowest", "length", "level", ENDS),
    _field("source.level_max", "Source level, highest", "length", "level", ENDS),
    _field(
        "source.gauge_pressure",
        "Source gauge pressure",
        "pressure",
        "pressure",
        ENDS,
        note="closed vessel only",
    ),
    _field(
        "delivery.outlet",
        "Outlet",
        "choice",
        "choice",
        ENDS,
        choices=("tank", "free", "pressure"),
        default="tank",
    ),
    _field("delivery.level", "Delivery level", "length", "level", ENDS),
    _field("delivery.level_min", "Delivery level, lowest", "length", "level", ENDS),
    _field("delivery.level_max", "Delivery level, highest", "length", "level", ENDS),
    _field(
        "delivery.residual_pressure",
        "Residual pressure",
        "head_or_pressure",
        "pressure",
        ENDS,
        note='or a head, e.g. "10 m"',
        applies=_pressure_outlet,
    ),
    _field(
        "delivery.gauge_pressure",
        "Tank gauge pressure",
        "pressure",
        "pressure",
        ENDS,
        note="closed vessel only",
        applies=_tank_outlet,
    ),
    _field("delivery.demand", "Demand", "flow", "flow", ENDS, field_id=ids.DEMAND_INPUT),
    _field(
        "pipe.friction",
        "Friction model",
        "choice",
        "choice",
        PIPE,
        choices=_friction_models(),
        default="colebrook",
    ),
    _field("pipe.age", "Pipe age", "duration", "duration", PIPE, note="aged scenarios"),
    _field(
        "pipe.transitions",
        "Diameter changes",
        "choice",
        "choice",
        PIPE,
        choices=("auto", "none"),
        default="auto",
        note="auto: expansion and contraction losses",
    ),
    _field(
        "checks.velocity_min",
        "Velocity, lowest",
        "velocity",
        "velocity",
        PIPE,
        note="checked at the demand; blank: common practice",
    ),
    _field(
        "checks.velocity_max",
        "Velocity, highest",
        "velocity",
        "velocity",
        PIPE,
        note="blank: common practice",
    ),
    _field(
        "pump_station.inlet_elevation",
        "Pump inlet elevation",
        "length",
        "level",
        STATION,
        note="needed for NPSH available",
    ),
    _field("operation.hours_per_year", "Hours per year", "number", "number", STATION),
    _field("operation.tariff", "Tariff per kWh", "number", "number", STATION),
    _field("operation.currency", "Currency", "text", "text", STATION),
    _field("operation.motor_efficiency", "Motor efficiency", "number", "percent", STATION),
)

FIELDS_BY_KEY: dict[str, FieldSpec] = {f.key: f for f in FIELDS}
SECTIONS: tuple[str, ...] = (LIQUID, ENDS, PIPE, STATION)


@dataclass(frozen=True)
class ColumnSpec:
    """One column of the route grid: a key of a ``[[segment]]`` table."""

    key: str
    header: str
    parse: str
    display: str
    width: int
    label: str = ""  # how messages name the column (default: the header in lower case)

    @property
    def name(self) -> str:
        return self.label or self.header.lower()


SEGMENT_COLUMNS: tuple[ColumnSpec, ...] = (
    ColumnSpec("name", "Name", "text", "text", 130),
    ColumnSpec("length", "Length", "length", "length", 90),
    ColumnSpec("diameter", "Inside diameter", "length", "diameter", 100),
    ColumnSpec("material", "Material", "choice", "choice", 140),
    ColumnSpec("roughness", "Roughness (override)", "length", "roughness", 110, "roughness"),
    ColumnSpec("fittings", "Fittings (name: count, ...)", "fittings", "text", 260, "fittings"),
    ColumnSpec("k_extra", "Extra K", "number", "number", 75),
    ColumnSpec("suction", "Suction", "boolean", "boolean", 80),
    ColumnSpec("elevation_end", "End elevation", "length", "level", 100),
    ColumnSpec("pressure_rating", "Pressure rating", "pressure", "pressure", 100),
    ColumnSpec("wave_speed", "Wave speed", "velocity", "velocity", 90, "wave speed"),
    ColumnSpec("hazen_williams_c", "H-W C", "number", "number", 70, "Hazen-Williams C"),
)
SEGMENT_COLUMNS_BY_KEY: dict[str, ColumnSpec] = {c.key: c for c in SEGMENT_COLUMNS}
