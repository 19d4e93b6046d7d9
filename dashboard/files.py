"""PURE (apart from kaleido's browser for PNG): files in and out of the dashboard.

In: a case file (TOML) and pump CSV files, as `dcc.Upload` hands them over
(``data:<type>;base64,<bytes>``). Out: the case as TOML (what ``syscurve analyze``
reads), the operating-point table as CSV and XLSX (`syscurve.tables`) and the plot
as PNG (kaleido) and as a self-contained HTML file.
"""

from __future__ import annotations

import base64
import binascii
import re
from pathlib import Path
from typing import Any

from syscurve.errors import CaseError, Problem

from .viewmodel import display_of, for_engine, for_store


def decode_upload(contents: str | None, filename: str | None) -> tuple[str | None, str]:
    """The text of an uploaded file, or None and a message saying why not."""
    name = filename or "the file"
    if not contents or "," not in contents:
        return None, f"{name}: nothing was received"
    try:
        raw = base64.b64decode(contents.split(",", 1)[1], validate=True)
    except (binascii.Error, ValueError):
        return None, f"{name}: the upload was damaged; try again"
    try:
        return raw.decode("utf-8-sig"), ""
    except UnicodeDecodeError:
        return None, f"{name}: not a UTF-8 text file"


def open_case(
    contents: str | None, filename: str | None
) -> tuple[dict[str, Any] | None, list[str]]:
    """An uploaded case file, validated: the case dict, or None and what is wrong with it.

    The file must be valid TOML and a valid case (every problem is listed, each
    naming its key). Pumps given by ``file =`` cannot be opened from the browser.
    """
    from syscurve.case import case_from_dict, parse_toml

    name = filename or "case file"
    text, message = decode_upload(contents, filename)
    if text is None:
        return None, [message]
    try:
        data = parse_toml(text, name)
        pumps = data.get("pump")
        file_pumps = [
            Problem(
                f"pump[{i}].file",
                "pump files cannot be opened from the browser; upload "
                "the case without them and add the pump CSV under Pumps",
            )
            for i, table in enumerate(pumps if isinstance(pumps, list) else [], start=1)
            if isinstance(table, dict) and "file" in table
        ]
        if file_pumps:
            raise CaseError(file_pumps)
        case_from_dict(data)
    except CaseError as error:
        return None, [str(p) for p in error.problems]
    except Exception as error:  # never a traceback
        return None, [f"{name}: could not be read ({type(error).__name__}: {error})"]
    return for_store(data), []


def inline_pump_files(data: dict[str, Any], base_dir: Path) -> dict[str, Any]:
    """The case with every ``file = "pump.csv"`` pump replaced by its points.

    Raises
    ------
    CaseError
        When a pump file cannot be read or is not a valid pump curve.
    """
    from syscurve.pumpcsv import read_pump_csv

    from .pumpsview import curve_table

    pumps = data.get("pump")
    if not isinstance(pumps, list):
        return data
    result = dict(data)
    tables = []
    for number, table in enumerate(pumps, start=1):
        if not isinstance(table, dict) or not isinstance(table.get("file"), str):
            tables.append(table)
            continue
        key = f"pump[{number}].file"
        path = Path(table["file"])
        path = path if path.is_absolute() else base_dir / path
        try:
            text = path.read_text(encoding="utf-8")
        except OSError as exc:
            raise CaseError(f"cannot read {path}: {exc.strerror}", key) from None
        curve = read_pump_csv(text, f"{key} ({path.name})", name=table.get("name"))
        tables.append(curve_table(curve, "L/s", "m"))
    result["pump"] = tables
    return result


def file_stem(data: dict[str, Any]) -> str:
    """A file name stem from the case title (lower case, hyphens)."""
    title = data.get("title")
    stem = re.sub(r"[^a-z0-9]+", "-", str(title).lower()).strip("-") if title else ""
    return stem[:60] or "case"


def case_toml(data: dict[str, Any]) -> str:
    """The case as a TOML file, as the command line reads it."""
    import tomli_w

    return tomli_w.dumps(for_engine(data))


def table_file(data: dict[str, Any], kind: str) -> tuple[str, bytes]:
    """The operating-point table of the case as ("name.csv" | "name.xlsx", bytes)."""
    from syscurve.tables import table_csv, table_xlsx

    from .resultsview import analyse

    report = analyse(data)
    system = display_of(data).system
    name = f"{file_stem(data)}-operating-points"
    if kind == "csv":
        return f"{name}.csv", table_csv(report, system).encode("utf-8")
    return f"{name}.xlsx", table_xlsx(report, system)


def plot_file(data: dict[str, Any], kind: str) -> tuple[str, bytes]:
    """The system-curve plot as ("name.png", PNG bytes) or ("name.html", HTML bytes)."""
    from .figures import as_plotly, system_figure
    from .resultsview import analyse

    report = analyse(data)
    figure = system_figure(report, display_of(data))
    figure["layout"]["title"] = {"text": str(data.get("title", "")), "x": 0.01}
    figure["layout"]["margin"]["t"] = 48
    plotly_figure = as_plotly(figure)
    name = f"{file_stem(data)}-system-curve"
    if kind == "png":
        return f"{name}.png", plotly_figure.to_image(format="png", width=1200, height=700, scale=1)
    html = plotly_figure.to_html(include_plotlyjs=True, full_html=True)
    return f"{name}.html", html.encode("utf-8")
