"""Pump curves as CSV text: the syscurve pump curve format, version 1.

A pump curve file is plain CSV (RFC 4180, comma separated, UTF-8) with a few
metadata lines before the header::

    # syscurve pump curve, format 1
    # name: inline booster A 2900 rpm
    # speed: 2900 rpm
    # source: invented demo data (not a real pump)
    flow [L/s],head [m],efficiency [%],npsh_required [m]
    0,12.5,,
    1.0,12.3,27,1.1
    ...

Metadata
    Lines starting with ``#`` before the header. A line ``# key: value`` sets a
    metadata key: ``name`` (the user-facing name; a generic description),
    ``speed`` (required: the shaft speed at which the points were measured, with a
    unit, e.g. ``2900 rpm``), ``source`` (where the points come from) and ``notes``
    (free text). The line ``# syscurve pump curve, format N`` names the format; it
    is optional, but a format other than 1 is refused. Other ``#`` lines are
    comments; one whose key looks like a misspelt metadata key is an error.
Header
    The first line that is not blank and not a comment. Each column is
    ``quantity [unit]``:

    ===============  ============================  =====================================
    quantity         unit                          notes
    ===============  ============================  =====================================
    flow             any volumetric flow unit      required; L/s, m^3/h, gpm, ...
    head             any length unit               required; head of the pumped liquid
    efficiency       ``%``                         optional; pump efficiency
    shaft_power      any power unit                optional; kW, hp, ...; as measured on
                                                   cold water (998.2 kg/m^3)
    npsh_required    any length unit               optional; NPSH required
    ===============  ============================  =====================================

    Units are read by pint (``syscurve.units``), so ``m^3/h``, ``ft`` or ``hp`` work.
Rows
    One measured point per row, flows strictly increasing from zero or more. Every
    cell holds a plain number (``.`` as decimal point, no unit, no thousands
    separator). Only two cells may be blank, both on the zero-flow row: efficiency
    (it is 0 there by definition) and NPSH required (not measured at shutoff; its
    fit then uses the other points). Blank lines and ``#`` lines among the rows are
    skipped.

Errors name the line (``pump CSV line 7``) or the column (``pump CSV column
'head [L/s]'``), all at once.
"""

from __future__ import annotations

import csv
import math
import re
from difflib import get_close_matches

import numpy as np

from .errors import CaseError, Problems
from .pump import PumpCurve
from .units import parse_quantity, unit_factor

FORMAT = 1
#: Column quantity -> kind of `syscurve.units` ("percent" is handled here).
COLUMNS = {
    "flow": "flow",
    "head": "length",
    "efficiency": "percent",
    "shaft_power": "power",
    "npsh_required": "length",
}
METADATA_KEYS = ("name", "speed", "source", "notes")
_BLANK_AT_SHUTOFF = ("efficiency", "npsh_required")
_EXAMPLE_UNITS = {"flow": "L/s", "head": "m", "shaft_power": "kW", "npsh_required": "m"}
_EXAMPLE = re.compile(r'; write e\.g\. "[^"]*"$')

_HEADER_CELL = re.compile(r"^\s*([A-Za-z_ ]+?)\s*\[\s*(.*?)\s*\]\s*$")
_METADATA = re.compile(r"^#\s*([A-Za-z_]+)\s*:\s*(.*?)\s*$")
_FORMAT_LINE = re.compile(r"^#\s*syscurve pump curve\s*,\s*format\s+(\S+)\s*$", re.IGNORECASE)


def read_pump_csv(text: str, key: str = "pump CSV", name: str | None = None) -> PumpCurve:
    """Read a pump curve from CSV text in the format of this module.

    Parameters
    ----------
    text : str
        The file's text.
    key : str
        How messages name the file, e.g. ``pump[2].file``.
    name : str, optional
        Overrides the ``# name:`` metadata.

    Raises
    ------
    CaseError
        One problem per fault, naming the line or column.
    """
    problems = Problems()
    metadata: dict[str, tuple[str, int]] = {}
    columns: list[str | None] | None = None
    factors: list[float] = []
    rows: list[tuple[int, list[float | None]]] = []
    for number, line in enumerate(text.splitlines(), start=1):
        where = f"{key} line {number}"
        stripped = line.strip()
        if not stripped:
            continue
        if stripped.startswith("#"):
            if columns is None:
                _read_comment(stripped, where, metadata, number, problems)
            continue
        cells = next(csv.reader([line]))
        if columns is None:
            columns, factors = _read_header(cells, key, problems)
            continue
        if len(cells) != len(columns):
            problems.add(where, f"has {len(cells)} cells but the header has {len(columns)}")
            continue
        rows.append((number, _read_row(cells, columns, factors, where, problems)))

    if columns is None:
        problems.add(key, "no header line; write e.g. 'flow [L/s],head [m]' before the points")
    speed = None
    if "speed" in metadata:
        value, number = metadata["speed"]
        try:
            speed = parse_quantity(value, "rotational_speed", f"{key} line {number}")
        except CaseError as error:
            problems.extend(error)
    else:
        problems.add(
            f"{key} metadata",
            "missing the line '# speed: 2900 rpm' (the speed at which the points were measured)",
        )
    if name is None:
        if "name" in metadata and metadata["name"][0]:
            name = metadata["name"][0]
        else:
            problems.add(f"{key} metadata", "missing the line '# name: <generic description>'")
    problems.raise_if_any()
    assert columns is not None and speed is not None and name is not None

    values: dict[str, list[float]] = {c: [] for c in columns if c is not None}
    for _, cells_read in rows:
        for column, cell in zip(columns, cells_read, strict=True):
            if column is not None:
                values[column].append(math.nan if cell is None else cell)
    return PumpCurve.from_points(
        name,
        speed,
        values["flow"],
        values["head"],
        values.get("efficiency"),
        values.get("shaft_power"),
        values.get("npsh_required"),
        key=key,
        source=metadata.get("source", ("", 0))[0],
        point_labels=[f"line {number}" for number, _ in rows],
    )


def _read_comment(
    line: str, where: str, metadata: dict[str, tuple[str, int]], number: int, problems: Problems
) -> None:
    """Record a metadata line, check a format line; other comments pass."""
    format_match = _FORMAT_LINE.match(line)
    if format_match:
        if format_match.group(1) != str(FORMAT):
            problems.add(
                where,
                f"format {format_match.group(1)} is not supported; this version reads format 1",
            )
        return
    match = _METADATA.match(line)
    if not match:
        return
    name, value = match.group(1).lower(), match.group(2)
    if name in METADATA_KEYS:
        if name in metadata:
            problems.add(where, f"'{name}' is given twice (first on line {metadata[name][1]})")
        metadata[name] = (value, number)
        return
    close = get_close_matches(name, METADATA_KEYS, n=1, cutoff=0.75)
    if close:
        problems.add(where, f"unknown metadata key '{name}'; did you mean '{close[0]}'?")


def _read_header(
    cells: list[str], key: str, problems: Problems
) -> tuple[list[str | None], list[float]]:
    """Columns (None for a column in error) and their factors to SI."""
    columns: list[str | None] = []
    factors: list[float] = []
    for cell in cells:
        where = f"{key} column '{cell.strip()}'"
        columns.append(None)
        factors.append(math.nan)
        match = _HEADER_CELL.match(cell)
        if not match:
            problems.add(where, "write each column as 'quantity [unit]', e.g. 'head [m]'")
            continue
        quantity = match.group(1).strip().lower().replace(" ", "_")
        unit = match.group(2)
        if quantity not in COLUMNS:
            close = get_close_matches(quantity, COLUMNS, n=1, cutoff=0.6)
            hint = f"did you mean '{close[0]}'? " if close else ""
            problems.add(where, f"unknown column '{quantity}'; {hint}known: {', '.join(COLUMNS)}")
            continue
        if quantity in columns:
            problems.add(where, f"'{quantity}' appears twice")
            continue
        kind = COLUMNS[quantity]
        if kind == "percent":
            if unit != "%":
                problems.add(where, "efficiency is given in percent; write 'efficiency [%]'")
                continue
            factor = 0.01
        else:
            try:
                factor = unit_factor(unit, kind, where)
            except CaseError as error:
                example = f"'{quantity} [{_EXAMPLE_UNITS[quantity]}]'"
                for problem in error.problems:
                    problems.add(where, _EXAMPLE.sub(f"; write e.g. {example}", problem.message))
                continue
        columns[-1] = quantity
        factors[-1] = factor
    for required in ("flow", "head"):
        if required not in columns and not any(
            c.strip().lower().startswith(required) for c in cells
        ):
            problems.add(f"{key} header", f"missing the column '{required} [unit]'")
    return columns, factors


def _read_row(
    cells: list[str],
    columns: list[str | None],
    factors: list[float],
    where: str,
    problems: Problems,
) -> list[float | None]:
    """The row's values in SI (None for blank or wrong cells); problems recorded."""
    values: list[float | None] = []
    for column, factor, cell in zip(columns, factors, cells, strict=True):
        text = cell.strip()
        if column is None or not text:
            values.append(None)
            continue
        try:
            number = float(text)
        except ValueError:
            problems.add(where, f"{column}: '{text}' is not a number (write e.g. 3.2, no unit)")
            values.append(None)
            continue
        if not math.isfinite(number):
            problems.add(where, f"{column}: '{text}' is not a finite number")
            values.append(None)
            continue
        values.append(number * factor)
    flow = values[columns.index("flow")] if "flow" in columns else None
    for column, cell in zip(columns, cells, strict=True):
        if column is None or cell.strip():
            continue
        if column in _BLANK_AT_SHUTOFF and flow == 0:
            continue
        allowed = "only efficiency and npsh_required may be blank, and only at zero flow"
        problems.add(where, f"{column}: blank cell; {allowed}")
    return values


def write_pump_csv(curve: PumpCurve, flow_unit: str = "L/s", head_unit: str = "m") -> str:
    """The curve as CSV text in the format of this module.

    Flow is written in `flow_unit`, head and NPSH required in `head_unit`,
    efficiency in percent and shaft power in kW; a NaN is a blank cell.
    """
    flow_factor = unit_factor(flow_unit, "flow", "flow unit")
    head_factor = unit_factor(head_unit, "length", "head unit")
    lines = [
        f"# syscurve pump curve, format {FORMAT}",
        f"# name: {curve.name}",
        f"# speed: {curve.speed_rpm:.10g} rpm",
    ]
    if curve.source:
        lines.append(f"# source: {curve.source}")
    header = [f"flow [{flow_unit}]", f"head [{head_unit}]"]
    table = [curve.flow / flow_factor, curve.head / head_factor]
    for column, values, unit, factor in (
        ("efficiency", curve.efficiency, "%", 0.01),
        ("shaft_power", curve.shaft_power, "kW", 1e3),
        ("npsh_required", curve.npsh_required, head_unit, head_factor),
    ):
        if values is not None:
            header.append(f"{column} [{unit}]")
            table.append(values / factor)
    lines.append(",".join(header))
    for row in np.column_stack(table):
        lines.append(",".join("" if np.isnan(v) else f"{v:.10g}" for v in row))
    return "\n".join(lines) + "\n"
