"""The installed `syscurve` command, run as a subprocess as a user would."""

from __future__ import annotations

import json
import shutil
import subprocess
import sys
import tomllib
from pathlib import Path
from typing import Any

import pytest
import tomli_w

SYSCURVE = shutil.which("syscurve")
pytestmark = pytest.mark.skipif(
    SYSCURVE is None, reason="the console script is not installed (pip install -e .)"
)


def run(*args: str, cwd: Path | None = None) -> subprocess.CompletedProcess[str]:
    assert SYSCURVE is not None
    return subprocess.run(
        [SYSCURVE, *args], capture_output=True, text=True, timeout=60, cwd=cwd, check=False
    )


@pytest.fixture
def demo_file(tmp_path: Path) -> Path:
    path = tmp_path / "demo.toml"
    result = run("example", "--output", str(path))
    assert result.returncode == 0, result.stderr
    return path


def write_case(tmp_path: Path, data: dict[str, Any]) -> Path:
    path = tmp_path / "case.toml"
    path.write_text(tomli_w.dumps(data), encoding="utf-8")
    return path


def test_example_prints_an_invented_case_that_parses() -> None:
    result = run("example")
    assert result.returncode == 0
    assert "Invented" in result.stdout
    assert tomllib.loads(result.stdout)["format"] == 1


def test_analyze_prints_the_verdict_scenarios_segments_warnings_and_cautions(
    demo_file: Path,
) -> None:
    result = run("analyze", str(demo_file))
    assert result.returncode == 0, result.stderr
    for heading in (
        "GRAVITY VERDICT",
        "SCENARIOS",
        "SEGMENTS AT THE DEMAND",
        "WARNINGS",
        "CAUTIONS",
    ):
        assert heading in result.stdout
    assert "does NOT meet the demand" in result.stdout
    assert "max-static" in result.stdout
    assert "[L/s]" in result.stdout and "[m]" in result.stdout
    assert "Steady state only" in result.stdout


def test_units_us_converts_the_summary(demo_file: Path) -> None:
    result = run("analyze", str(demo_file), "--units", "US")
    assert result.returncode == 0
    assert "[gpm]" in result.stdout and "[ft]" in result.stdout and "°F" in result.stdout
    assert "[L/s]" not in result.stdout
    warnings = result.stdout.split("WARNINGS", 1)[1].split("CAUTIONS", 1)[0]
    assert "ft/s" in warnings and "m/s" not in warnings


def test_json_report_carries_the_contract_keys(demo_file: Path) -> None:
    result = run("analyze", str(demo_file), "--json")
    assert result.returncode == 0, result.stderr
    report = json.loads(result.stdout)
    for key in (
        "format",
        "title",
        "liquid",
        "barometric_pressure_pa",
        "demand_m3_s",
        "scenarios",
        "operating_points",
        "warnings",
        "cautions",
    ):
        assert key in report
    assert set(report["liquid"]) >= {"density_kg_m3", "viscosity_pa_s", "vapor_pressure_pa"}
    scenario = report["scenarios"][0]
    for key in (
        "name",
        "source_level_m",
        "delivery_level_m",
        "static_head_m",
        "system_head_at_demand_m",
        "required_source_level_m",
        "gravity_flow_m3_s",
        "gravity_meets_demand",
        "segments_at_demand",
        "curve",
    ):
        assert key in scenario
    assert set(scenario["segments_at_demand"][0]) >= {
        "name",
        "velocity_m_s",
        "reynolds",
        "friction_factor",
        "friction_loss_m",
        "minor_loss_m",
    }
    assert [s["name"] for s in report["scenarios"]] == ["nominal", "max-static", "min-static"]
    assert report["cautions"]


def test_the_json_report_matches_the_python_api(demo_file: Path) -> None:
    import syscurve

    report = json.loads(run("analyze", str(demo_file), "--json").stdout)
    api = syscurve.analyze(syscurve.load_case(demo_file)).to_dict()
    assert report["scenarios"][1]["system_head_at_demand_m"] == pytest.approx(
        api["scenarios"][1]["system_head_at_demand_m"], rel=1e-12
    )


BAD_INPUTS = [
    (("segment", 0, "diameter"), 80, "segment[1].diameter: expected a length with a unit"),
    (("segment", 0, "length"), "-5 m", 'segment[1].length: must be > 0, got "-5 m"'),
    (("segment", 0, "diameter"), "3 L/s", "segment[1].diameter: expected a length, got a"),
    (("segment", 0, "material"), "pvcc", 'segment[1].material: unknown material "pvcc"'),
    (("pipe", "friction"), "colebrok", 'pipe.friction: unknown value "colebrok"'),
    (("liquid", "temperature"), "-3 degC", "liquid.temperature: water at -3.00 degC would be"),
    (("delivery", "demand"), "5 lps", 'delivery.demand: unknown unit "lps"'),
]


@pytest.mark.parametrize(("path", "value", "expected"), BAD_INPUTS)
def test_bad_input_exits_2_with_one_line_naming_the_key(
    tmp_path: Path, path: tuple[Any, ...], value: Any, expected: str
) -> None:
    import copy

    from tests.conftest import MINIMAL

    data = copy.deepcopy(MINIMAL)
    target: Any = data
    for step in path[:-1]:
        target = target.setdefault(step, {}) if isinstance(step, str) else target[step]
    target[path[-1]] = value
    result = run("analyze", str(write_case(tmp_path, data)))
    assert result.returncode == 2
    assert "Traceback" not in result.stderr
    assert result.stderr.startswith(expected), result.stderr
    assert result.stdout == ""


def test_missing_demand_and_no_segments_are_reported_together(tmp_path: Path) -> None:
    import copy

    from tests.conftest import MINIMAL

    data = copy.deepcopy(MINIMAL)
    del data["delivery"]["demand"]
    del data["segment"]
    result = run("analyze", str(write_case(tmp_path, data)))
    assert result.returncode == 2
    lines = result.stderr.strip().splitlines()
    assert any(line.startswith("delivery.demand: missing") for line in lines)
    assert any(line.startswith("segment: a case needs at least one") for line in lines)
    assert "Traceback" not in result.stderr


def test_a_file_that_is_not_toml_exits_2(tmp_path: Path) -> None:
    path = tmp_path / "notes.toml"
    path.write_text("this is not = = toml\n", encoding="utf-8")
    result = run("analyze", str(path))
    assert result.returncode == 2
    assert "not valid TOML" in result.stderr and "Traceback" not in result.stderr


def test_a_missing_file_exits_2(tmp_path: Path) -> None:
    result = run("analyze", str(tmp_path / "absent.toml"))
    assert result.returncode == 2 and "no such file" in result.stderr


def test_catalogue_lists_models_materials_and_fittings() -> None:
    result = run("catalogue")
    assert result.returncode == 0
    for name in ("colebrook", "hazen-williams", "ductile-iron-lined", "foot-valve-strainer"):
        assert name in result.stdout


def test_module_entry_point_works_too(demo_file: Path) -> None:
    result = subprocess.run(
        [sys.executable, "-m", "syscurve.cli", "analyze", str(demo_file), "--json"],
        capture_output=True,
        text=True,
        timeout=60,
        check=False,
    )
    assert result.returncode == 0 and json.loads(result.stdout)["format"] == 1


# --- pumps ------------------------------------------------------------------------------


def test_summary_shows_duty_pumps_and_operating_points(demo_file: Path) -> None:
    result = run("analyze", str(demo_file))
    assert result.returncode == 0
    assert "Required pump duty:" in result.stdout
    assert "OPERATING POINTS" in result.stdout
    for arrangement in ("booster A", "2 x booster A parallel", "booster B at speed for demand"):
        assert arrangement in result.stdout


def test_json_operating_points_cover_every_arrangement_and_scenario(demo_file: Path) -> None:
    report = json.loads(run("analyze", str(demo_file), "--json").stdout)
    points = report["operating_points"]
    assert len(points) == 9  # 3 arrangements x 3 scenarios
    contract = {
        "arrangement",
        "pump",
        "count",
        "connection",
        "speed_rpm",
        "scenario",
        "status",
        "flow_m3_s",
        "head_m",
        "flow_per_pump_m3_s",
        "head_per_pump_m",
        "efficiency",
        "shaft_power_w",
        "bep_flow_ratio",
        "npsh_available_m",
        "npsh_required_m",
        "npsh_margin_ratio",
        "meets_demand",
        "warnings",
    }
    for point in points:
        assert contract <= set(point)
        assert point["status"] in {
            "ok",
            "no-intersection",
            "several-intersections",
            "outside-curve",
            "not-needed",
        }
    running = [p for p in points if p["status"] == "ok"]
    assert all(p["efficiency"] and p["shaft_power_w"] and p["npsh_available_m"] for p in running)


def test_table_csv_has_units_in_the_headers_and_a_row_per_point(
    demo_file: Path, tmp_path: Path
) -> None:
    import csv

    out = tmp_path / "ops.csv"
    result = run("analyze", str(demo_file), "--table", str(out), "--units", "US")
    assert result.returncode == 0, result.stderr
    rows = list(csv.reader(out.open(encoding="utf-8")))
    header = rows[0]
    assert "flow [gpm]" in header and "head [ft]" in header and "shaft power [hp]" in header
    assert "NPSH available [ft]" in header and "demand met" in header and "warnings" in header
    assert len(rows) == 1 + 9


def test_table_xlsx_reads_back(demo_file: Path, tmp_path: Path) -> None:
    from openpyxl import load_workbook

    out = tmp_path / "ops.xlsx"
    assert run("analyze", str(demo_file), "--table", str(out)).returncode == 0
    sheet = load_workbook(out)["operating points"]
    rows = list(sheet.iter_rows(values_only=True))
    assert rows[0][3] == "flow [L/s]"
    assert len(rows) == 10
    flows = [r[3] for r in rows[1:] if r[2] == "ok"]
    assert all(isinstance(v, float) and v > 0 for v in flows)


def test_table_with_an_unknown_suffix_exits_2(demo_file: Path, tmp_path: Path) -> None:
    result = run("analyze", str(demo_file), "--table", str(tmp_path / "ops.ods"))
    assert result.returncode == 2 and "write the table as .csv or .xlsx" in result.stderr


@pytest.mark.parametrize(
    ("pump", "arrangement", "expected"),
    [
        ({"flow": [0, 1]}, None, "pump[1].flow: needs at least 3 points"),
        ({"flow": [0, 2, 1, 3]}, None, "pump[1].flow: must increase strictly"),
        ({"head": [30, 29]}, None, "pump[1].head: has 2 values but flow has 4"),
        ({"efficiency": [0, 40, 101, 50]}, None, "pump[1].efficiency: must be above 0"),
        ({}, {"pump": "nobody"}, 'arrangement[1].pump: no pump is named "nobody"'),
        ({}, {"pump": "p", "count": 0}, "arrangement[1].count: must be a whole number"),
        ({"speed": "2900 kW"}, None, "pump[1].speed: expected a rotational speed"),
    ],
)
def test_bad_pump_input_exits_2_naming_the_key(
    tmp_path: Path, pump: dict[str, Any], arrangement: dict[str, Any] | None, expected: str
) -> None:
    import copy

    from tests.conftest import MINIMAL, PUMP_POINTS

    data = copy.deepcopy(MINIMAL)
    base = PUMP_POINTS
    data["pump"] = [{**base, **pump}]
    if arrangement:
        data["arrangement"] = [arrangement]
    result = run("analyze", str(write_case(tmp_path, data)))
    assert result.returncode == 2
    assert "Traceback" not in result.stderr
    assert result.stderr.startswith(expected), result.stderr


@pytest.mark.parametrize(
    ("csv_text", "fragment"),
    [
        ("# name: p\n# speed: 2900 rpm\nflow [L/s],efficiency [%]\n0,0\n1,40\n2,60\n", "head"),
        ("# name: p\n# speed: 2900 rpm\nflow [L/s],head [L/s]\n0,30\n1,29\n2,26\n", "head [L/s]"),
    ],
)
def test_a_bad_pump_csv_exits_2_naming_the_file(
    tmp_path: Path, csv_text: str, fragment: str
) -> None:
    import copy

    from tests.conftest import MINIMAL

    (tmp_path / "pump.csv").write_text(csv_text, encoding="utf-8")
    data = copy.deepcopy(MINIMAL)
    data["pump"] = [{"name": "p", "file": "pump.csv"}]
    result = run("analyze", str(write_case(tmp_path, data)))
    assert result.returncode == 2
    assert result.stderr.startswith("pump[1].file (pump.csv)")
    assert fragment in result.stderr and "Traceback" not in result.stderr
