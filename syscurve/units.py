"""Units at the edges: parse "value unit" strings to SI floats, and convert SI to display units.

Inside the engine every number is an SI float (or array): m, m^3/s, Pa, kg/m^3, Pa s,
W, K; two exceptions keep their trade units because only their ratios matter:
rotational speed in rpm and pipe age in years. pint is used here only, for
parsing and for conversion factors, never in a hot loop (a pint scalar
conversion costs ~26 us; a float multiplication ~30 ns).

Head is always a length of the flowing liquid. A pressure becomes a head through
that liquid's density (`head_from_pressure`), never through a fixed water density.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from functools import cache
from typing import TYPE_CHECKING, Any

from .errors import CaseError

if TYPE_CHECKING:
    import pint

#: Standard acceleration of gravity (3rd CGPM, 1901). [m/s^2]
G = 9.80665
#: Standard atmosphere at sea level (US Standard Atmosphere 1976). [Pa]
P_STANDARD = 101325.0
#: 0 degC in kelvin.
ZERO_CELSIUS = 273.15

# Definitions pint lacks (measured: pint 0.25 has no gpm, MGD or psig). `gallon` is the
# US liquid gallon (231 in^3, NIST SP 811); the imperial gallon stays a separate unit.
_DEFINITIONS = (
    "gallon_per_minute = gallon / minute = gpm = usgpm",
    "imperial_gallon_per_minute = imperial_gallon / minute = igpm",
    "million_gallon_per_day = 1e6 * gallon / day = MGD",
    "thousand_gallon = 1000 * gallon = kgal",
    "psi_gauge = psi = psig",
    "psi_absolute = psi = psia",
)


@cache
def registry() -> pint.UnitRegistry:
    """The one unit registry of the process (created on first use, ~0.03 s cached)."""
    import pint

    ureg: pint.UnitRegistry
    try:
        ureg = pint.UnitRegistry(cache_folder=":auto:")
    except Exception:  # an unwritable cache folder must not stop the program
        ureg = pint.UnitRegistry()
    for definition in _DEFINITIONS:
        ureg.define(definition)
    return ureg


@dataclass(frozen=True)
class Kind:
    """A kind of physical quantity the case file may hold."""

    dimensionality: str
    internal_unit: str
    description: str
    example: str


KINDS: dict[str, Kind] = {
    "length": Kind("[length]", "m", "a length", "80 mm"),
    "flow": Kind("[length] ** 3 / [time]", "m ** 3 / s", "a volumetric flow", "3.2 L/s"),
    "pressure": Kind("[mass] / [length] / [time] ** 2", "Pa", "a pressure", "100 kPa"),
    "density": Kind("[mass] / [length] ** 3", "kg / m ** 3", "a density", "998 kg/m^3"),
    "viscosity": Kind("[mass] / [length] / [time]", "Pa * s", "a dynamic viscosity", "1.2 cP"),
    "velocity": Kind("[length] / [time]", "m / s", "a velocity", "1.5 m/s"),
    "duration": Kind("[time]", "year", "a duration", "20 year"),
    "rotational_speed": Kind("1 / [time]", "revolution / minute", "a rotational speed", "2900 rpm"),
    "power": Kind("[mass] * [length] ** 2 / [time] ** 3", "W", "a power", "15 kW"),
    "roughness_growth": Kind("[length] / [time]", "m / year", "a growth rate", "0.02 mm/year"),
}

_NUMBER_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")

_TEMPERATURE_UNITS = {
    "degc": "degC",
    "°c": "degC",
    "celsius": "degC",
    "degf": "degF",
    "°f": "degF",
    "fahrenheit": "degF",
    "k": "K",
    "kelvin": "K",
    "degr": "degR",
    "°r": "degR",
    "rankine": "degR",
}

# Units that parse but are almost always a slip for something else.
_HINTS = {
    "cp": 'lower-case "cp" is a cup; centipoise is "cP"',
    "c": '"C" is the coulomb; write "degC" for degrees Celsius',
    "f": '"F" is the farad; write "degF" for degrees Fahrenheit',
    "hz": "write the shaft speed in rpm",
}


def split_value_unit(text: str, key: str, example: str) -> tuple[float, str]:
    """Split "3.2 L/s" into (3.2, "L/s"); a clear error names `key` otherwise."""
    match = _NUMBER_UNIT.match(text)
    if not match:
        raise CaseError(f'expected "value unit", got "{text}"; write e.g. "{example}"', key)
    return float(match.group(1)), match.group(2)


def _require_string(value: Any, key: str, kind: Kind) -> str:
    if isinstance(value, bool) or not isinstance(value, (str, int, float)):
        raise CaseError(
            f"expected {kind.description} as a string with a unit, got {value!r}; "
            f'write e.g. "{kind.example}"',
            key,
        )
    if not isinstance(value, str):
        raise CaseError(
            f"expected {kind.description} with a unit, got a bare number {value!r}; "
            f'write e.g. "{kind.example}"',
            key,
        )
    return value


@cache
def _unit_factor(unit_text: str, kind_name: str) -> float:
    """Factor from `unit_text` to the kind's internal unit (cached: pint is slow)."""
    ureg = registry()
    kind = KINDS[kind_name]
    units = ureg.parse_units(unit_text)
    quantity = ureg.Quantity(1.0, units)
    if quantity.dimensionality != ureg.get_dimensionality(kind.dimensionality):
        raise ValueError(str(quantity.dimensionality))
    return float(quantity.to(kind.internal_unit).magnitude)


def describe_dimensionality(dimensionality: str) -> str:
    """A readable name for a dimensionality, e.g. "a volumetric flow"."""
    ureg = registry()
    for kind in KINDS.values():
        if str(ureg.get_dimensionality(kind.dimensionality)) == dimensionality:
            return kind.description
    if dimensionality == "dimensionless":
        return "a plain number"
    return dimensionality


def unit_factor(unit_text: str, kind_name: str, key: str = "") -> float:
    """Factor that converts a value in `unit_text` to the internal unit of `kind_name`.

    Raises `CaseError` naming `key` for an unknown unit or a unit of the wrong dimension.
    """
    kind = KINDS[kind_name]
    if not unit_text:
        raise CaseError(
            f'expected {kind.description} with a unit; write e.g. "{kind.example}"', key
        )
    if kind_name == "rotational_speed" and unit_text.strip().lower() in ("hz", "1/s", "s^-1"):
        raise CaseError(
            f'"{unit_text}" is ambiguous for a shaft speed; write it in rpm, e.g. "{kind.example}"',
            key,
        )
    try:
        return _unit_factor(unit_text, kind_name)
    except ValueError as exc:  # wrong dimension
        got = describe_dimensionality(str(exc))
        hint = _HINTS.get(unit_text.strip().lower())
        extra = f" ({hint})" if hint else ""
        raise CaseError(
            f'expected {kind.description}, got {got} "{unit_text}"{extra}; '
            f'write e.g. "{kind.example}"',
            key,
        ) from None
    except Exception:  # pint's UndefinedUnitError, DefinitionSyntaxError, ...
        hint = _HINTS.get(unit_text.strip().lower())
        extra = f" ({hint})" if hint else ""
        raise CaseError(
            f'unknown unit "{unit_text}"{extra}; write e.g. "{kind.example}"', key
        ) from None


def parse_quantity(value: Any, kind_name: str, key: str) -> float:
    """Parse a "value unit" string of the given kind to its internal unit.

    Parameters
    ----------
    value
        The raw value from the case, e.g. "3.2 L/s".
    kind_name
        A key of `KINDS`: "length", "flow", "pressure", ...
    key
        The key path, for error messages.

    Returns
    -------
    float
        The value in the kind's internal unit (SI, rpm for speeds, year for durations).
    """
    kind = KINDS[kind_name]
    text = _require_string(value, key, kind)
    number, unit_text = split_value_unit(text, key, kind.example)
    return number * unit_factor(unit_text, kind_name, key)


def parse_temperature(value: Any, key: str) -> float:
    """Parse "12 degC", "54 degF" or "285 K" to kelvin.

    The number is split from the unit before pint sees it: pint refuses
    ``Quantity("12 degC")`` as a product with an offset unit.
    """
    example = "12 degC"
    if isinstance(value, bool) or not isinstance(value, str):
        what = "a bare number" if isinstance(value, (int, float)) else repr(value)
        raise CaseError(
            f'expected a temperature with a unit, got {what} {value!r}; write e.g. "{example}"'
            if isinstance(value, (int, float))
            else f'expected a temperature such as "{example}", got {what}',
            key,
        )
    number, unit_text = split_value_unit(value, key, example)
    unit = _TEMPERATURE_UNITS.get(unit_text.strip().lower())
    if unit is None:
        hint = _HINTS.get(unit_text.strip().lower())
        extra = f" ({hint})" if hint else ""
        raise CaseError(
            f'expected a temperature in degC, degF or K, got "{unit_text}"{extra}; '
            f'write e.g. "{example}"',
            key,
        )
    return temperature_to_kelvin(number, unit)


def temperature_to_kelvin(number: float, unit: str) -> float:
    """Convert a temperature in degC, degF, degR or K to kelvin (exact arithmetic)."""
    if unit == "degC":
        return number + ZERO_CELSIUS
    if unit == "degF":
        return (number - 32.0) * 5.0 / 9.0 + ZERO_CELSIUS
    if unit == "degR":
        return number * 5.0 / 9.0
    return number


def kelvin_to(value_k: float, unit: str) -> float:
    """Convert kelvin to degC, degF or K."""
    if unit == "degC":
        return value_k - ZERO_CELSIUS
    if unit == "degF":
        return (value_k - ZERO_CELSIUS) * 9.0 / 5.0 + 32.0
    return value_k


def parse_head_or_pressure(value: Any, key: str, density: float) -> float:
    """Parse a residual requirement given as a pressure ("100 kPa") or a head ("10 m").

    Returns the head of the flowing liquid in metres: a pressure is divided by
    ``density * G`` of that liquid.
    """
    kind = KINDS["length"]
    text = _require_string(value, key, kind)
    number, unit_text = split_value_unit(text, key, "10 m")
    try:
        return number * unit_factor(unit_text, "length", key)
    except CaseError:
        pass
    try:
        pascals = number * unit_factor(unit_text, "pressure", key)
    except CaseError:
        raise CaseError(
            f'expected a pressure ("100 kPa") or a head of the liquid ("10 m"), got "{text}"',
            key,
        ) from None
    return head_from_pressure(pascals, density)


def head_from_pressure(pressure: float, density: float) -> float:
    """Head of a liquid of `density` [kg/m^3] equal to `pressure` [Pa], in metres."""
    return pressure / (density * G)


def pressure_from_head(head: float, density: float) -> float:
    """Pressure [Pa] of a column `head` [m] of a liquid of `density` [kg/m^3]."""
    return head * density * G


# --- display ---------------------------------------------------------------------------

#: Display units per system: kind -> (pint unit, label). Labels are what users read.
DISPLAY_SYSTEMS: dict[str, dict[str, tuple[str, str]]] = {
    "SI": {
        "flow": ("L/s", "L/s"),
        "head": ("m", "m"),
        "level": ("m", "m"),
        "length": ("m", "m"),
        "diameter": ("mm", "mm"),
        "roughness": ("mm", "mm"),
        "velocity": ("m/s", "m/s"),
        "pressure": ("kPa", "kPa"),
        "power": ("kW", "kW"),
        "density": ("kg/m**3", "kg/m³"),
        "viscosity": ("mPa*s", "mPa·s"),
        "temperature": ("degC", "°C"),
        "energy": ("kWh", "kWh"),
        "volume": ("m**3", "m³"),
        "specific_energy": ("kWh/m**3", "kWh/m³"),
    },
    "US": {
        "flow": ("gpm", "gpm"),
        "head": ("ft", "ft"),
        "level": ("ft", "ft"),
        "length": ("ft", "ft"),
        "diameter": ("in", "in"),
        "roughness": ("in", "in"),
        "velocity": ("ft/s", "ft/s"),
        "pressure": ("psi", "psi"),
        "power": ("hp", "hp"),
        "density": ("lb/ft**3", "lb/ft³"),
        "viscosity": ("cP", "cP"),
        "temperature": ("degF", "°F"),
        "energy": ("kWh", "kWh"),
        "volume": ("gallon", "US gal"),
        "specific_energy": ("kWh/kgal", "kWh/1000 US gal"),
    },
}

# Internal (SI) unit of each display kind.
_SI_OF_DISPLAY_KIND = {
    "flow": "m**3/s",
    "head": "m",
    "level": "m",
    "length": "m",
    "diameter": "m",
    "roughness": "m",
    "velocity": "m/s",
    "pressure": "Pa",
    "power": "W",
    "density": "kg/m**3",
    "viscosity": "Pa*s",
    "energy": "J",
    "volume": "m**3",
    "specific_energy": "J/m**3",
}


@cache
def _display_factor(system: str, kind: str) -> float:
    ureg = registry()
    unit, _ = DISPLAY_SYSTEMS[system][kind]
    return float(ureg.Quantity(1.0, _SI_OF_DISPLAY_KIND[kind]).to(unit).magnitude)


@dataclass(frozen=True)
class Display:
    """Conversion from internal SI values to one display system ("SI" or "US")."""

    system: str = "SI"

    def __post_init__(self) -> None:
        if self.system not in DISPLAY_SYSTEMS:
            raise CaseError(
                f'unknown unit system "{self.system}"; use "SI" or "US"', "display.units"
            )

    def label(self, kind: str) -> str:
        """The unit label of `kind`, e.g. "L/s"."""
        return DISPLAY_SYSTEMS[self.system][kind][1]

    def unit(self, kind: str) -> str:
        """The pint unit of `kind` in this system, e.g. "gpm"."""
        return DISPLAY_SYSTEMS[self.system][kind][0]

    def factor(self, kind: str) -> float:
        """Multiply an SI value of `kind` by this to get display units."""
        return _display_factor(self.system, kind)

    def value(self, kind: str, si_value: Any) -> Any:
        """An SI value (float or array) of `kind` in display units; None stays None."""
        if si_value is None:
            return None
        if kind == "temperature":
            return kelvin_to(si_value, self.unit("temperature"))
        return si_value * self.factor(kind)

    def to_si(self, kind: str, display_value: Any) -> Any:
        """A display value (float or array) of `kind` back in SI."""
        if display_value is None:
            return None
        if kind == "temperature":
            return temperature_to_kelvin(display_value, self.unit("temperature"))
        return display_value / self.factor(kind)

    def text(self, kind: str, si_value: float | None, digits: int = 3) -> str:
        """Text such as "12.3 L/s": the value in display units with `digits` significant figures."""
        if si_value is None:
            return "n/a"
        return f"{format_number(self.value(kind, si_value), digits)} {self.label(kind)}"

    def quantity_string(self, kind: str, si_value: float, digits: int = 6) -> str:
        """A case-file string for `si_value`, e.g. "3.2 L/s" (the unit pint reads back)."""
        unit = self.unit(kind)
        return f"{format_number(self.value(kind, si_value), digits)} {unit}"


def format_number(value: float, digits: int = 3) -> str:
    """A number with `digits` significant figures, never in exponent form for ordinary sizes."""
    if value != value:  # NaN
        return "n/a"
    if value == 0:
        return "0"
    magnitude = abs(value)
    if 1e-4 <= magnitude < 1e9:
        from math import floor, log10

        decimals = max(digits - 1 - floor(log10(magnitude)), 0)
        text = f"{value:.{decimals}f}"
        return text
    return f"{value:.{digits - 1}e}"
