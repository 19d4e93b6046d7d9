"""Shared helpers of the dashboard tests: the demo case (invented) and its report."""

from __future__ import annotations

import tomllib
from typing import Any

from syscurve.cli import example_text


def demo_data() -> dict[str, Any]:
    """The bundled demo case (invented) as a dict."""
    return tomllib.loads(example_text())


def demo_report() -> Any:
    """The engine's report on the demo case."""
    from syscurve import analyze, case_from_dict

    return analyze(case_from_dict(demo_data()))
