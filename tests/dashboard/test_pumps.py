"""Pumps and arrangements <-> the case dict (dashboard.pumpsview, dashboard.actions).

Expected values:
* pasted points are the demo case's own "booster B" points (invented); a pump added
  from them must give the same operating point as the demo's booster B (identity);
* an uploaded CSV is a bundled demo curve written by `syscurve.pumpcsv.write_pump_csv`:
  the points stored in the case must give back the same head (identity, within the
  ten significant figures written);
* error messages are the engine's (`syscurve.pump`, `syscurve.pumpcsv`).
"""

from __future__ import annotations

import base64
import math
from typing import Any

import pytest

import pump_data
from dashboard import actions, ids
from dashboard.pumpsview import (
    add_arrangement,
    add_pump,
    apply_arrangement_edit,
    arrangement_rows,
    delete_arrangement,
    delete_pump,
    library_table,
    pasted_pump_table,
    pump_names,
    pump_rows,
    rename_pump,
    uploaded_pump_table,
)
from dashboard.viewmodel import for_engine, for_store
from syscurve import analyze, case_from_dict
from syscurve.pumpcsv import write_pump_csv
from tests.dashboard.helpers import demo_data

BOOSTER_B = """flow, head, efficiency, npsh
0, 14.5, 0, 1.1
1, 14.3, 25.4, 1.18
2, 13.84, 43.5, 1.40
3, 13.15, 54.4, 1.77
4, 12.2, 58.0, 2.30
4.8, 11.26, 55.7, 2.83
5.6, 10.17, 48.7, 3.45
6.5, 8.75, 35.3, 4.27
"""


def points_of(data: dict[str, Any], arrangement: str) -> list[Any]:
    report = analyze(case_from_dict(for_engine(data)))
    return [p for p in report.operating_points if p.arrangement == arrangement]


def test_the_demo_pumps_and_arrangements_are_listed() -> None:
    data = for_store(demo_data())
    assert pump_names(data) == ["booster A", "booster B"]
    rows = pump_rows(data)
    assert rows[0]["origin"] == "demo library: inline booster A 2900 rpm"
    assert rows[0]["speed"] == "2900 rpm"  # from the bundled file's "# speed:" line
    assert rows[1]["origin"] == "8 points (L/s, m)" and rows[1]["speed"] == "2900 rpm"
    arrangements = arrangement_rows(data)
    assert [(r["pump"], r["count"], r["connection"], r["speed"]) for r in arrangements] == [
        ("booster A", 1, "single", ""),
        ("booster A", 2, "parallel", ""),
        ("booster B", 1, "single", "for-demand"),
    ]


def test_pasted_points_make_a_pump_that_runs_like_the_demo_booster() -> None:
    table, problems = pasted_pump_table("booster C", "2900", "L/s", "m", BOOSTER_B)
    assert problems == [] and table is not None
    assert table["flow"][:3] == [0.0, 1.0, 2.0] and table["npsh_required"][-1] == 4.27
    data = add_pump(for_store(demo_data()), table)
    assert data["arrangement"][-1] == {"pump": "booster C"}
    (ours,) = [p for p in points_of(data, "booster C") if p.scenario == "max-static"]
    demo = for_store(demo_data())
    demo["arrangement"].append({"pump": "booster B"})
    (theirs,) = [p for p in points_of(demo, "booster B") if p.scenario == "max-static"]
    assert ours.flow == pytest.approx(theirs.flow, rel=1e-12)
    assert ours.efficiency == pytest.approx(theirs.efficiency, rel=1e-12)


def test_pasted_points_with_faults_say_what_is_wrong() -> None:
    table, problems = pasted_pump_table("", "fast", "L/s", "m", "0, 10\n1, x\n")
    assert table is None
    assert problems == [
        "name: give the pump a name, e.g. booster C",
        "speed: expected the speed of the points in rpm, e.g. 2900; got 'fast'",
        "line 2: 'x' is not a number",
    ]
    table, problems = pasted_pump_table("p", "1450", "gpm", "ft", "0 10\n2 9\n1 8\n")
    assert table is None
    # the engine names flows in L/s: 1 gpm = 0.06309 L/s (analytic)
    assert problems == [
        "points.flow: must increase strictly; got 0.06309 L/s after 0.1262 L/s at point 3"
    ]


def test_blank_efficiency_and_npsh_at_shutoff_are_kept_as_unknown() -> None:
    table, problems = pasted_pump_table(
        "p", "2900", "L/s", "m", "0, 14.5, , \n2, 13.8, 43.5, 1.4\n4, 12.2, 58, 2.3\n"
    )
    assert problems == [] and table is not None
    assert table["efficiency"][0] is None and table["npsh_required"][0] is None
    engine = for_engine({"pump": [table]})["pump"][0]
    assert math.isnan(engine["npsh_required"][0])


def test_an_uploaded_csv_is_stored_as_points_with_the_same_curve() -> None:
    curve = pump_data.load("end-suction pump A 2900 rpm")  # shaft power, no efficiency
    table, problems = uploaded_pump_table(write_pump_csv(curve), "US")
    assert problems == [] and table is not None
    assert (table["flow_unit"], table["head_unit"], table["power_unit"]) == ("gpm", "ft", "kW")
    data = for_store(demo_data())
    data = add_pump(data, table)
    case = case_from_dict(for_engine(data))
    stored = [p for p in case.pump_part.pumps if p.name == curve.name][0]
    flows = [0.002, 0.01, 0.016]
    assert stored.head_at(flows) == pytest.approx(curve.head_at(flows), rel=1e-9)
    assert stored.efficiency_at(flows) == pytest.approx(curve.efficiency_at(flows), rel=1e-8)


def test_a_bad_csv_lists_its_problems() -> None:
    table, problems = uploaded_pump_table("flow [L/s],head [m]\n0,10\n1,x\n", "SI")
    assert table is None
    assert any("line 3" in p and "not a number" in p for p in problems)
    assert any("speed" in p for p in problems)


def test_names_stay_unique_and_renames_reach_the_arrangements() -> None:
    data = for_store(demo_data())
    data = add_pump(data, library_table("inline booster A 2900 rpm"))
    data = add_pump(data, library_table("inline booster A 2900 rpm"))
    assert pump_names(data)[-2:] == ["inline booster A 2900 rpm", "inline booster A 2900 rpm (2)"]
    renamed = rename_pump(data, 0, "booster A1")
    assert [a.get("pump") for a in renamed["arrangement"][:2]] == ["booster A1", "booster A1"]
    assert analyze(case_from_dict(for_engine(renamed))).operating_points


def test_deleting_a_pump_deletes_the_arrangements_that_use_it() -> None:
    data = for_store(demo_data())
    data = delete_pump(data, 0)
    assert pump_names(data) == ["booster B"]
    assert data["arrangement"] == [{"pump": "booster B", "speed": "for-demand"}]
    data = delete_pump(data, 0)
    assert "pump" not in data and "arrangement" not in data
    case_from_dict(for_engine(data))  # still a valid case


def test_arrangement_cells_are_written_as_the_case_file_wants_them() -> None:
    data = for_store(demo_data())
    data = apply_arrangement_edit(data, 0, "speed", "2600")
    assert data["arrangement"][0]["speed"] == "2600 rpm"
    data = apply_arrangement_edit(data, 0, "speed", "for demand")
    assert data["arrangement"][0]["speed"] == "for-demand"
    data = apply_arrangement_edit(data, 0, "count", "3")
    assert data["arrangement"][0]["count"] == 3
    assert data["arrangement"][0]["connection"] == "parallel"
    data = apply_arrangement_edit(data, 0, "connection", "series")
    data = apply_arrangement_edit(data, 0, "pump", "booster A + booster B")
    assert data["arrangement"][0]["pumps"] == ["booster A", "booster B"]
    assert "count" not in data["arrangement"][0]
    data = apply_arrangement_edit(data, 1, "count", "1")
    assert data["arrangement"][1] == {"pump": "booster A", "count": 1}
    assert arrangement_rows(data)[0]["pump"] == "booster A + booster B"


def test_implicit_arrangements_become_explicit_when_edited() -> None:
    data = for_store(demo_data())
    data.pop("arrangement")
    assert [r["pump"] for r in arrangement_rows(data)] == ["booster A", "booster B"]
    added = add_arrangement(data)
    assert added["arrangement"] == [
        {"pump": "booster A"},
        {"pump": "booster B"},
        {"pump": "booster A", "count": 2, "connection": "parallel"},
    ]
    assert delete_arrangement(added, 0)["arrangement"][0] == {"pump": "booster B"}


def _upload(text: str) -> str:
    return "data:text/csv;base64," + base64.b64encode(text.encode()).decode()


def test_the_pump_actions_return_new_grids_and_messages() -> None:
    data = for_store(demo_data())
    inputs: dict[str, Any] = {
        "library": "small booster 2900 rpm",
        "points": ("booster C", "2900", "L/s", "m", BOOSTER_B),
        "upload": (_upload(write_pump_csv(pump_data.load("small booster 2900 rpm"))), "sb.csv"),
        "pump_selected": [{"row": "1"}],
        "arrangement_selected": [{"row": "0"}],
        "arrangement_changes": [{"rowId": "0", "colId": "speed", "value": "2500"}],
        "pump_changes": [{"rowId": "0", "colId": "name", "value": "A"}],
    }
    result = actions.pump_action(data, ids.LIBRARY_ADD, inputs)
    assert result["pump_rows"][-1]["name"] == "small booster 2900 rpm"
    result = actions.pump_action(data, ids.POINTS_ADD, inputs)
    assert result["points_message"] == ['added pump "booster C"']
    result = actions.pump_action(data, ids.PUMP_UPLOAD, inputs)
    assert result["upload_message"] == ['added pump "small booster 2900 rpm" from sb.csv']
    assert result["arrangement_rows"][-1]["pump"] == "small booster 2900 rpm"
    result = actions.pump_action(data, ids.PUMP_DELETE, inputs)
    assert pump_names(result["data"]) == ["booster A"]
    result = actions.pump_action(data, ids.ARRANGEMENT_GRID, inputs)
    assert result["data"]["arrangement"][0]["speed"] == "2500 rpm"
    assert "arrangement_rows" not in result  # the grid already shows the edit
    result = actions.pump_action(data, ids.PUMP_GRID, inputs)
    assert result["data"]["arrangement"][1]["pump"] == "A"
    result = actions.pump_action(data, ids.PUMP_UPLOAD, inputs | {"upload": ("nonsense", "x")})
    assert result["data"] is None and result["upload_message"] == ["x: nothing was received"]


def test_blank_arrangement_names_show_the_name_the_engine_gives() -> None:
    data = for_store(demo_data())
    data["arrangement"] += [
        {"pump": "booster A", "count": 2, "connection": "series", "speed": "2600 rpm"},
        {"pumps": ["booster A", "booster B"]},
    ]
    engine_names = [a.name for a in case_from_dict(for_engine(data)).pump_part.arrangements]
    assert [r["automatic"] for r in arrangement_rows(data)] == engine_names
    assert engine_names[3] == "2 x booster A series at 2600 rpm"  # regression
