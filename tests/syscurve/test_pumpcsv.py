"""The pump curve CSV format: round trips, units in headers and the error messages.

Sources of expected values:
* published: NIST SP 811 (2008), appendix B: 1 US gallon = 3.785411784e-3 m^3 exactly,
  so 1 gpm = 6.30901964e-5 m^3/s exactly; 1 ft = 0.3048 m exactly;
  1 hp (550 ft lbf/s) = 550 x 0.3048 m x 0.45359237 kg x 9.80665 m/s^2 per s
  = 745.69987158227022 W (from the exact definitions of the foot, pound and g_n);
* analytic: write then read returns the same points;
* the curves below are invented test data.
"""

from __future__ import annotations

import numpy as np
import pytest

from syscurve.errors import CaseError
from syscurve.pump import PumpCurve
from syscurve.pumpcsv import read_pump_csv, write_pump_csv

GPM = 6.30901964e-5  # m^3/s, published (NIST SP 811), exact
FOOT = 0.3048  # m, published (NIST SP 811), exact
HP = 550 * 0.3048 * 0.45359237 * 9.80665  # W, analytic from exact definitions

GOOD = """\
# syscurve pump curve, format 1
# name: test pump 2900 rpm
# speed: 2900 rpm
# source: invented test data (not a real pump)
flow [L/s],head [m],efficiency [%],npsh_required [m]
0,32.0,,
1.0,31.2,35,1.1
2.0,29.0,55,1.4

# a comment among the rows
3.0,25.5,63,1.9
4.0,20.6,60,2.6
"""


def problems_of(error: pytest.ExceptionInfo[CaseError]) -> list[tuple[str, str]]:
    return [(p.key, p.message) for p in error.value.problems]


def test_reads_the_documented_example() -> None:
    curve = read_pump_csv(GOOD)
    assert curve.name == "test pump 2900 rpm" and curve.speed_rpm == 2900.0
    assert curve.source == "invented test data (not a real pump)"
    np.testing.assert_allclose(curve.flow, [0.0, 1e-3, 2e-3, 3e-3, 4e-3], rtol=1e-14)
    np.testing.assert_allclose(curve.head, [32.0, 31.2, 29.0, 25.5, 20.6])
    assert curve.efficiency is not None and curve.efficiency[0] == 0.0  # blank at shutoff
    np.testing.assert_allclose(curve.efficiency[1:], [0.35, 0.55, 0.63, 0.60], rtol=1e-14)
    assert curve.npsh_required is not None and np.isnan(curve.npsh_required[0])
    assert read_pump_csv(GOOD, name="other").name == "other"


@pytest.mark.parametrize(("flow_unit", "head_unit"), [("L/s", "m"), ("gpm", "ft"), ("m^3/h", "m")])
def test_write_then_read_returns_the_points(flow_unit: str, head_unit: str) -> None:
    flow = np.array([0.0, 1.0, 2.0, 3.0, 4.0]) * 1e-3
    head = np.array([32.0, 31.2, 29.0, 25.5, 20.6])
    efficiency = np.array([0.0, 0.35, 0.55, 0.63, 0.60])
    power = 998.2 * 9.80665 * flow * head / np.where(efficiency > 0, efficiency, 1.0)
    power[0] = 400.0
    original = PumpCurve.from_points(
        "round trip pump",
        2900.0,
        flow,
        head,
        efficiency,
        power,
        [np.nan, 1.1, 1.4, 1.9, 2.6],
        source="invented test data",
    )
    text = write_pump_csv(original, flow_unit=flow_unit, head_unit=head_unit)
    assert text.startswith("# syscurve pump curve, format 1\n")
    back = read_pump_csv(text)
    assert (back.name, back.speed_rpm, back.source) == (
        original.name,
        original.speed_rpm,
        original.source,
    )
    for attribute in ("flow", "head", "efficiency", "shaft_power", "npsh_required"):
        np.testing.assert_allclose(
            getattr(back, attribute), getattr(original, attribute), rtol=1e-9, atol=1e-15
        )


def test_units_in_headers_convert() -> None:
    text = """\
# name: us pump
# speed: 1750 rpm
flow [gpm],head [ft],shaft_power [hp],npsh_required [ft]
0,100,2,10
50,95,3,11
100,80,4,13
"""
    curve = read_pump_csv(text)
    # published: 1 gpm = 6.30901964e-5 m^3/s, 1 ft = 0.3048 m; analytic: 1 hp in W
    np.testing.assert_allclose(curve.flow, np.array([0, 50, 100]) * GPM, rtol=1e-12)
    np.testing.assert_allclose(curve.head, np.array([100, 95, 80]) * FOOT, rtol=1e-12)
    assert curve.shaft_power is not None and curve.npsh_required is not None
    np.testing.assert_allclose(curve.shaft_power, np.array([2, 3, 4]) * HP, rtol=1e-12)
    np.testing.assert_allclose(curve.npsh_required, np.array([10, 11, 13]) * FOOT, rtol=1e-12)


SPEED_NAME = "# name: p\n# speed: 2900 rpm\n"


@pytest.mark.parametrize(
    ("text", "key", "words"),
    [
        (
            SPEED_NAME + "flow [L/s],efficiency [%]\n0,0\n1,50\n2,60\n",
            "pump CSV header",
            "missing the column 'head [unit]'",
        ),
        (SPEED_NAME + "head [m]\n10\n9\n8\n", "pump CSV header", "'flow [unit]'"),
        (
            SPEED_NAME + "flow [L/s],head [L/s]\n0,10\n1,9\n2,8\n",
            "pump CSV column 'head [L/s]'",
            "expected a length, got a volumetric flow",
        ),
        (
            SPEED_NAME + "flow [m],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV column 'flow [m]'",
            "expected a volumetric flow",
        ),
        (
            SPEED_NAME + "flow [L/s],head [ft/s]\n0,10\n1,9\n2,8\n",
            "pump CSV column 'head [ft/s]'",
            "expected a length, got a velocity",
        ),
        (
            SPEED_NAME + "flow [L/s],head [furlongz]\n0,10\n1,9\n2,8\n",
            "pump CSV column 'head [furlongz]'",
            'unknown unit "furlongz"',
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],efficiency [-]\n0,10,0\n1,9,50\n2,8,60\n",
            "pump CSV column 'efficiency [-]'",
            "efficiency [%]",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],speed [rpm]\n0,10,1\n1,9,1\n2,8,1\n",
            "pump CSV column 'speed [rpm]'",
            "unknown column 'speed'",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],efficency [%]\n0,10,0\n1,9,50\n2,8,60\n",
            "pump CSV column 'efficency [%]'",
            "did you mean 'efficiency'?",
        ),
        (
            SPEED_NAME + "flow [L/s],head\n0,10\n1,9\n2,8\n",
            "pump CSV column 'head'",
            "'quantity [unit]'",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],head [ft]\n0,10,1\n1,9,1\n2,8,1\n",
            "pump CSV column 'head [ft]'",
            "appears twice",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,nine\n2,8\n",
            "pump CSV line 5",
            "head: 'nine' is not a number",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,9 m\n2,8\n",
            "pump CSV line 5",
            "'9 m' is not a number",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,nan\n2,8\n",
            "pump CSV line 5",
            "not a finite number",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,\n2,8\n",
            "pump CSV line 5",
            "head: blank cell",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],npsh_required [m]\n0,10,\n1,9,\n2,8,2\n",
            "pump CSV line 5",
            "npsh_required: blank cell",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,9,8\n2,8\n",
            "pump CSV line 5",
            "has 3 cells but the header has 2",
        ),
        (
            "# name: p\nflow [L/s],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV metadata",
            "missing the line '# speed: 2900 rpm'",
        ),
        (
            "# name: p\n# speed: 2900\nflow [L/s],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV line 2",
            "with a unit",
        ),
        (
            "# name: p\n# speed: 50 Hz\nflow [L/s],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV line 2",
            "rpm",
        ),
        (
            "# speed: 2900 rpm\nflow [L/s],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV metadata",
            "'# name:",
        ),
        (
            "# name: p\n# sped: 2900 rpm\nflow [L/s],head [m]\n0,10\n1,9\n2,8\n",
            "pump CSV line 2",
            "did you mean 'speed'?",
        ),
        (
            "# syscurve pump curve, format 2\n" + SPEED_NAME + "flow [L/s],head [m]\n0,10\n",
            "pump CSV line 1",
            "format 2 is not supported",
        ),
        (SPEED_NAME, "pump CSV", "no header line"),
        (
            SPEED_NAME + "flow [L/s],head [m]\n0,10\n2,9\n1,8\n",
            "pump CSV.flow",
            "must increase strictly; got 1 L/s after 2 L/s at line 6",
        ),
        (
            SPEED_NAME + "flow [L/s],head [m],efficiency [%]\n0,10,0\n1,9,50\n2,8,120\n",
            "pump CSV.efficiency",
            "got 120 % at line 6",
        ),
        (SPEED_NAME + "flow [L/s],head [m]\n0,10\n1,9\n", "pump CSV.flow", "at least 3 points"),
    ],
)
def test_csv_errors_name_the_line_or_column(text: str, key: str, words: str) -> None:
    with pytest.raises(CaseError) as error:
        read_pump_csv(text)
    assert any(k == key and words in m for k, m in problems_of(error)), problems_of(error)


def test_all_csv_errors_come_at_once() -> None:
    text = "# name: p\nflow [L/s],head [m/s],efficiency [%]\n0,10,0\n1,x,50\n"
    with pytest.raises(CaseError) as error:
        read_pump_csv(text, key="pump[2].file")
    keys = [k for k, _ in problems_of(error)]
    assert keys == [
        "pump[2].file column 'head [m/s]'",
        "pump[2].file metadata",
    ]


def test_an_unusable_unit_is_reported_once_per_column() -> None:
    text = SPEED_NAME + "flow [L/s],head [L/s]\n0,10\n1,9\n2,8\n"
    with pytest.raises(CaseError) as error:
        read_pump_csv(text)
    assert len(error.value.problems) == 1
