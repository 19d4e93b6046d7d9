"""Bundled pump curves: invented demo data in the syscurve pump CSV format.

Every curve here is invented for demonstrations and tests; none describes a real
pump. Each file ``<slug>.csv`` holds one curve; its ``# name:`` line is the name
users see (e.g. "inline booster A 2900 rpm"). See README.md in this folder.

    import pump_data
    pump_data.list_pumps()                        # the names
    curve = pump_data.load("inline booster A 2900 rpm")   # or the slug
"""

from __future__ import annotations

from difflib import get_close_matches
from functools import cache
from importlib.resources import files
from pathlib import Path
from typing import TYPE_CHECKING

from syscurve.errors import CaseError

if TYPE_CHECKING:
    from syscurve.pump import PumpCurve

__all__ = ["list_pumps", "load", "path"]

_NAME_PREFIX = "# name:"


@cache
def _catalogue() -> dict[str, str]:
    """Name -> file name, from the ``# name:`` line of each bundled file (no full parse)."""
    names: dict[str, str] = {}
    for entry in sorted(files(__name__).iterdir(), key=lambda e: e.name):
        if not entry.name.endswith(".csv"):
            continue
        name = entry.name[: -len(".csv")]
        for line in entry.read_text(encoding="utf-8").splitlines():
            if line.startswith(_NAME_PREFIX):
                name = line[len(_NAME_PREFIX) :].strip()
                break
        names[name] = entry.name
    return names


def list_pumps() -> list[str]:
    """The names of the bundled pump curves, sorted."""
    return sorted(_catalogue())


def _file_name(name: str, key: str) -> str:
    catalogue = _catalogue()
    if name in catalogue:
        return catalogue[name]
    slugs = {file_name[: -len(".csv")]: file_name for file_name in catalogue.values()}
    if name in slugs:
        return slugs[name]
    close = get_close_matches(name, [*catalogue, *slugs], n=3, cutoff=0.5)
    hint = f"did you mean {' or '.join(repr(c) for c in close)}?" if close else ""
    raise CaseError(
        f'no bundled pump "{name}"; {hint or "known: " + ", ".join(sorted(catalogue))}', key
    )


def path(name: str, key: str = "pump") -> Path:
    """The file of the bundled pump `name` (its name or slug).

    The package is installed as ordinary files, so this is a real path.

    Raises
    ------
    CaseError
        For an unknown name, with the nearest known names.
    """
    return Path(str(files(__name__).joinpath(_file_name(name, key))))


def load(name: str, key: str = "pump") -> PumpCurve:
    """The bundled pump curve `name` (its name or its slug, e.g. "small-booster-2900").

    Raises
    ------
    CaseError
        For an unknown name, with the nearest known names.
    """
    from syscurve.pumpcsv import read_pump_csv

    file_name = _file_name(name, key)
    text = files(__name__).joinpath(file_name).read_text(encoding="utf-8")
    return read_pump_csv(text, key=f"pump_data/{file_name}")
