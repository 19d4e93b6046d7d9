"""Files in and out (dashboard.files, dashboard.actions.load_action).

Expected values:
* a saved case must be read back by the installed ``syscurve analyze`` with the same
  verdict (identity with the engine's summary of the original);
* the table files must hold `syscurve.tables.operating_table` (identity);
* PNG files start with the PNG signature (ISO/IEC 15948: 89 50 4E 47 0D 0A 1A 0A);
  XLSX files are ZIP archives ("PK\\x03\\x04").
"""

from __future__ import annotations

import base64
import csv
import io
import os
import shutil
import subprocess
import tomllib
from pathlib import Path
from typing import Any

import pytest

from dashboard import actions, ids
from dashboard.files import (
    case_toml,
    decode_upload,
    file_stem,
    inline_pump_files,
    open_case,
    plot_file,
    table_file,
)
from dashboard.viewmodel import for_store
from syscurve.tables import operating_table
from tests.dashboard.helpers import demo_data, demo_report


def upload(text: str | bytes) -> str:
    raw = text.encode() if isinstance(text, str) else text
    return "data:application/octet-stream;base64," + base64.b64encode(raw).decode()


def run_cli(*args: str) -> subprocess.CompletedProcess[str]:
    command = shutil.which("syscurve")
    if command is None:
        pytest.skip("the console script is not installed (pip install -e .)")
    return subprocess.run([command, *args], capture_output=True, text=True, timeout=60, check=False)


def test_a_saved_case_is_read_back_by_the_command_line(tmp_path: Path) -> None:
    data = for_store(demo_data())
    data["delivery"]["demand"] = "50 gpm"
    data["display"]["units"] = "US"
    path = tmp_path / "saved.toml"
    path.write_text(case_toml(data), encoding="utf-8")
    assert tomllib.loads(path.read_text(encoding="utf-8")) == data
    result = run_cli("analyze", str(path))
    assert result.returncode == 0, result.stderr
    assert "demand of 50.0 gpm" in result.stdout


def test_a_saved_case_keeps_unknown_npsh_at_shutoff_as_nan(tmp_path: Path) -> None:
    data = for_store(demo_data())
    data["pump"][1]["npsh_required"][0] = None
    text = case_toml(data)
    assert "npsh_required = [\n    nan," in text or "npsh_required = [nan," in text
    path = tmp_path / "nan.toml"
    path.write_text(text, encoding="utf-8")
    assert run_cli("analyze", str(path)).returncode == 0


def test_an_uploaded_case_is_opened_and_bad_ones_say_what_is_wrong() -> None:
    from syscurve.cli import example_text

    opened, problems = open_case(upload(example_text()), "demo.toml")
    assert problems == [] and opened == for_store(demo_data())
    opened, problems = open_case(upload("format = 1\ntitle = \n"), "broken.toml")
    assert opened is None and problems[0].startswith("broken.toml is not valid TOML")
    opened, problems = open_case(upload('format = 1\n[source]\nlevel = "12"\n'), "bad.toml")
    assert opened is None
    assert 'source.level: expected a length with a unit; write e.g. "80 mm"' in problems
    assert "delivery: missing; add a [delivery] table" in problems
    opened, problems = open_case(upload(b"\xff\xfe\x00"), "binary.toml")
    assert opened is None and problems == ["binary.toml: not a UTF-8 text file"]


def test_a_case_with_pump_files_is_refused_from_the_browser() -> None:
    text = case_toml(for_store(demo_data())).replace(
        'library = "inline booster A 2900 rpm"', 'file = "/etc/hostname"'
    )
    opened, problems = open_case(upload(text), "files.toml")
    assert opened is None
    assert problems[0].startswith("pump[1].file: pump files cannot be opened from the browser")


def test_pump_files_are_inlined_when_the_server_opens_a_case(tmp_path: Path) -> None:
    import pump_data
    from syscurve.pumpcsv import write_pump_csv

    curve = pump_data.load("small booster 2900 rpm")
    (tmp_path / "pump.csv").write_text(write_pump_csv(curve), encoding="utf-8")
    data = demo_data()
    data["pump"][0] = {"name": "booster A", "file": "pump.csv"}
    inlined = inline_pump_files(data, tmp_path)
    table = inlined["pump"][0]
    assert table["name"] == "booster A" and "file" not in table
    assert table["head"] == pytest.approx(list(curve.head), rel=1e-9)
    assert data["pump"][0]["file"] == "pump.csv"  # the input is not changed


def test_uploads_that_do_not_decode_say_so() -> None:
    assert decode_upload(None, "a.csv") == (None, "a.csv: nothing was received")
    assert decode_upload("data:x;base64,@@@", "a.csv") == (
        None,
        "a.csv: the upload was damaged; try again",
    )
    assert decode_upload(upload("é"), "a.csv") == ("é", "")


def test_the_operating_point_table_files_hold_the_engine_table() -> None:
    from openpyxl import load_workbook

    data = for_store(demo_data())
    headers, rows = operating_table(demo_report())
    name, content = table_file(data, "csv")
    assert name == "invented-demo-hillside-spring-to-school-tank-operating-points.csv"
    table = list(csv.reader(io.StringIO(content.decode("utf-8"))))
    assert table[0] == headers and len(table) == len(rows) + 1
    name, content = table_file(data, "xlsx")
    assert name.endswith(".xlsx") and content[:4] == b"PK\x03\x04"
    sheet = load_workbook(io.BytesIO(content))["operating points"]
    assert [c.value for c in sheet[1]] == headers
    assert [c.value for c in sheet[2]][:2] == rows[0][:2]


def test_the_plot_is_a_self_contained_html_file() -> None:
    name, content = plot_file(for_store(demo_data()), "html")
    assert name == "invented-demo-hillside-spring-to-school-tank-system-curve.html"
    html = content.decode("utf-8")
    assert len(content) > 1_000_000  # plotly.js is inside
    assert 'src="http' not in html  # no script from the network
    assert "System curve, max-static" in html
    assert "Flow Q [L\\u002fs]" in html  # plotly writes "/" as \\u002f in its JSON


@pytest.mark.browser
def test_the_plot_is_a_png_image() -> None:
    if not Path("/usr/bin/chromium").exists():
        if os.environ.get("SYSCURVE_REQUIRE_BROWSER") == "1":
            pytest.fail("SYSCURVE_REQUIRE_BROWSER=1 but no Chromium at /usr/bin/chromium")
        pytest.skip("kaleido needs Chromium at /usr/bin/chromium (Debian package chromium)")
    name, content = plot_file(for_store(demo_data()), "png")
    assert name.endswith("-system-curve.png")
    assert content[:8] == b"\x89PNG\r\n\x1a\n"
    width, height = int.from_bytes(content[16:20], "big"), int.from_bytes(content[20:24], "big")
    assert (width, height) == (1200, 700)


def test_file_names_come_from_the_title() -> None:
    assert file_stem({"title": "Invented: ridge spring / school"}) == "invented-ridge-spring-school"
    assert file_stem({}) == "case"


def test_loading_refills_the_editor_or_keeps_the_work() -> None:
    data = for_store(demo_data())
    demo = for_store(demo_data())
    result = actions.load_action(data, ids.UNITS_SWITCH, "US", (None, None), demo)
    assert result["data"]["display"]["units"] == "US"
    assert result["fields"]["demand-input"] == "50.721"
    assert result["units"]["demand-input"] == "gpm"
    assert result["segment_rows"][1]["length"] == "7545.93"
    same = actions.load_action(data, ids.UNITS_SWITCH, "SI", (None, None), demo)
    assert same["data"] is None  # already SI: nothing to do
    bad = actions.load_action(data, ids.CASE_UPLOAD, None, (upload("x = "), "x.toml"), demo)
    assert bad["data"] is None
    assert bad["message"][0] == "x.toml was not opened; the current case stays. What is wrong:"
    edited: dict[str, Any] = dict(data, title="edited")
    back = actions.load_action(edited, ids.LOAD_DEMO, None, (None, None), demo)
    assert back["data"] == demo and back["fields"]["title-input"] == demo["title"]
