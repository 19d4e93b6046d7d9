"""Reading values out of a case dict, collecting every problem with its key path.

A `Reader` never raises while reading: each accessor returns None when the value is
missing or wrong and records a problem; `Reader.done()` raises them all at once.
"""

from __future__ import annotations

import math
from typing import Any

from .errors import CaseError, Problems, did_you_mean
from .units import KINDS, parse_head_or_pressure, parse_quantity, parse_temperature


class Reader:
    """Accessors over TOML tables that record problems instead of raising."""

    def __init__(self) -> None:
        self.problems = Problems()
        self.warnings: list[str] = []

    def add(self, key: str, message: str) -> None:
        self.problems.add(key, message)

    def done(self) -> None:
        self.problems.raise_if_any()

    def table(self, data: dict[str, Any], name: str, *, required: bool = False) -> dict[str, Any]:
        value = data.get(name)
        if value is None:
            if required:
                self.add(name, f"missing; add a [{name}] table")
            return {}
        if not isinstance(value, dict):
            self.add(name, f"expected a table [{name}], got {type(value).__name__}")
            return {}
        return value

    def known_keys(self, table: dict[str, Any], allowed: tuple[str, ...], path: str) -> None:
        """Record every key of `table` that is not in `allowed`, with the nearest names."""
        for key in table:
            if key in allowed:
                continue
            hint = did_you_mean(key, allowed).strip() or f"known keys: {', '.join(allowed)}"
            self.add(f"{path}.{key}" if path else key, f"unknown key; {hint}")

    def quantity(
        self,
        table: dict[str, Any],
        name: str,
        path: str,
        kind: str,
        *,
        required: bool = False,
        positive: bool = False,
        non_negative: bool = False,
    ) -> float | None:
        """A "value unit" string of `kind`, in its internal unit."""
        key = f"{path}.{name}"
        if name not in table:
            if required:
                self.add(key, f'missing; write e.g. {name} = "{KINDS[kind].example}"')
            return None
        return self.value(table[name], key, kind, positive=positive, non_negative=non_negative)

    def value(
        self,
        raw: Any,
        key: str,
        kind: str,
        *,
        positive: bool = False,
        non_negative: bool = False,
    ) -> float | None:
        """Parse one raw "value unit" of `kind` reported under `key`."""
        try:
            value = parse_quantity(raw, kind, key)
        except CaseError as error:
            self.problems.extend(error)
            return None
        if not math.isfinite(value):
            self.add(key, f'must be a finite number, got "{raw}"')
            return None
        if positive and not value > 0:
            self.add(key, f'must be > 0, got "{raw}"')
            return None
        if non_negative and value < 0:
            self.add(key, f'must be >= 0, got "{raw}"')
            return None
        return value

    def temperature(
        self, table: dict[str, Any], name: str, path: str, *, required: bool = False
    ) -> float | None:
        key = f"{path}.{name}"
        if name not in table:
            if required:
                self.add(key, f'missing; write e.g. {name} = "12 degC"')
            return None
        try:
            kelvin = parse_temperature(table[name], key)
        except CaseError as error:
            self.problems.extend(error)
            return None
        if kelvin <= 0:
            self.add(key, f'is below absolute zero: "{table[name]}"')
            return None
        return kelvin

    def head_or_pressure(
        self, table: dict[str, Any], name: str, path: str, density: float | None
    ) -> float | None:
        """A pressure or a head of the liquid, as head [m] (needs the liquid's density)."""
        key = f"{path}.{name}"
        if name not in table or density is None:
            return None
        try:
            return parse_head_or_pressure(table[name], key, density)
        except CaseError as error:
            self.problems.extend(error)
            return None

    def number(
        self,
        table: dict[str, Any],
        name: str,
        path: str,
        *,
        default: float | None = None,
        minimum: float | None = None,
        exclusive_minimum: float | None = None,
        maximum: float | None = None,
    ) -> float | None:
        """A plain (dimensionless) number."""
        key = f"{path}.{name}"
        if name not in table:
            return default
        raw = table[name]
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            hint = " (a plain number, no unit)" if isinstance(raw, str) else ""
            self.add(key, f"expected a number{hint}, got {raw!r}")
            return None
        value = float(raw)
        if not math.isfinite(value):
            self.add(key, f"must be a finite number, got {raw!r}")
        elif minimum is not None and value < minimum:
            self.add(key, f"must be >= {minimum:g}, got {raw!r}")
        elif exclusive_minimum is not None and value <= exclusive_minimum:
            self.add(key, f"must be > {exclusive_minimum:g}, got {raw!r}")
        elif maximum is not None and value > maximum:
            self.add(key, f"must be <= {maximum:g}, got {raw!r}")
        else:
            return value
        return None

    def string(
        self,
        table: dict[str, Any],
        name: str,
        path: str,
        *,
        default: str | None = None,
        choices: tuple[str, ...] | None = None,
        required: bool = False,
    ) -> str | None:
        key = f"{path}.{name}" if path else name
        if name not in table:
            if required:
                example = f'"{choices[0]}"' if choices else '"..."'
                self.add(key, f"missing; write e.g. {name} = {example}")
            return default
        raw = table[name]
        if not isinstance(raw, str):
            self.add(key, f"expected a string, got {raw!r}")
            return None
        if choices is not None and raw not in choices:
            hint = did_you_mean(raw, choices)
            self.add(key, f'unknown value "{raw}"; {hint}use one of: {", ".join(choices)}')
            return None
        return raw

    def boolean(self, table: dict[str, Any], name: str, path: str, default: bool) -> bool:
        if name not in table:
            return default
        raw = table[name]
        if not isinstance(raw, bool):
            self.add(f"{path}.{name}", f"expected true or false, got {raw!r}")
            return default
        return raw

    def string_list(self, table: dict[str, Any], name: str, path: str) -> list[str] | None:
        if name not in table:
            return None
        raw = table[name]
        if not isinstance(raw, list) or not all(isinstance(v, str) for v in raw):
            self.add(f"{path}.{name}", f'expected a list of strings, e.g. ["a", "b"], got {raw!r}')
            return None
        return list(raw)
