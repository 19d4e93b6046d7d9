"""syscurve: system curves, gravity verdicts and pump operating points for liquid pipelines.

The public API::

    case = syscurve.load_case("case.toml")
    report = syscurve.analyze(case)
    report.to_dict()                                   # the JSON report
    syscurve.system_head(case, [0.0, 0.002], "max-static")   # heads in metres

Modules load lazily so that the command line starts quickly.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

__version__ = "0.1.0"

__all__ = [
    "CaseError",
    "analyze",
    "case_from_dict",
    "load_case",
    "system_head",
    "__version__",
]

if TYPE_CHECKING:
    import numpy as np
    from numpy.typing import ArrayLike

    from .analysis import analyze
    from .case import Case, case_from_dict, load_case
    from .errors import CaseError

_LAZY = {
    "analyze": ("analysis", "analyze"),
    "load_case": ("case", "load_case"),
    "case_from_dict": ("case", "case_from_dict"),
    "CaseError": ("errors", "CaseError"),
}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        from importlib import import_module

        module, attribute = _LAZY[name]
        return getattr(import_module(f".{module}", __name__), attribute)
    raise AttributeError(f"module 'syscurve' has no attribute {name!r}")


def system_head(case: Case, flow_m3_s: ArrayLike, scenario: str = "nominal") -> np.ndarray:
    """System head in metres at each flow (m^3/s) in the named scenario.

    Raises `KeyError` naming the known scenarios when `scenario` does not exist.
    """
    for candidate in case.scenarios:
        if candidate.name == scenario:
            return case.pipeline.at(candidate).head(flow_m3_s)
    known = ", ".join(s.name for s in case.scenarios)
    raise KeyError(f'no scenario "{scenario}" in this case; it has: {known}')
