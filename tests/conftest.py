"""Shared fixtures: the demo case as a dict and a tiny valid case to mutate."""

from __future__ import annotations

import copy
import tomllib
from typing import Any

import pytest

from syscurve.cli import example_text


@pytest.fixture
def demo_data() -> dict[str, Any]:
    """The bundled demo case (invented), parsed."""
    return tomllib.loads(example_text())


MINIMAL: dict[str, Any] = {
    "format": 1,
    "title": "minimal invented case",
    "liquid": {"kind": "water", "temperature": "15 degC"},
    "source": {"level": "100 m"},
    "delivery": {"outlet": "tank", "level": "80 m", "demand": "5 L/s"},
    "segment": [
        {
            "name": "main",
            "length": "1000 m",
            "diameter": "100 mm",
            "material": "pvc",
            "fittings": {"entrance-sharp": 1, "elbow-90": 2},
        },
    ],
}


#: A small pump given by points (invented), for tests that add or break pumps.
PUMP_POINTS: dict[str, Any] = {
    "name": "p",
    "speed": "2900 rpm",
    "flow_unit": "L/s",
    "head_unit": "m",
    "flow": [0, 1, 2, 3],
    "head": [30, 29, 26, 20],
    "efficiency": [0, 40, 60, 55],
}


@pytest.fixture
def minimal() -> dict[str, Any]:
    """A small valid case (invented) that tests change one key at a time."""
    return copy.deepcopy(MINIMAL)
