"""The form and the route grid <-> the case dict (dashboard.viewmodel, dashboard.problems).

Expected values:
* unit factors are analytic (exact definitions): 1 US gal = 3.785411784 L, so
  3.2 L/s = 50.7210 gpm; 1 ft = 0.3048 m; 1 in = 25.4 mm; degF = degC * 9/5 + 32;
* system heads and verdicts come from the engine on the invented demo case
  (regression, `syscurve analyze`); the round trips check that re-entering the whole
  case in the other unit system gives the same answer within the rounding of six
  significant figures;
* problem keys are what the engine reports (`syscurve.case`), checked here by
  running the engine on broken copies of the demo case.
"""

from __future__ import annotations

import copy
import math
from typing import Any

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from dashboard.formspec import FIELDS, FIELDS_BY_KEY
from dashboard.problems import FITTINGS_HINT, problem_map
from dashboard.segmentsview import (
    add_segment,
    apply_segment_edit,
    delete_segment,
    move_segment,
    parse_fittings,
    segment_rows,
)
from dashboard.viewmodel import (
    apply_form,
    for_engine,
    for_store,
    form_values,
    get_path,
    number_text,
    set_path,
    set_units,
    shown_text,
    stored_value,
    unit_labels,
    visible_fields,
)
from syscurve import analyze, case_from_dict
from syscurve.errors import CaseError
from syscurve.units import Display, parse_quantity, parse_temperature
from tests.dashboard.helpers import demo_data

SI, US = Display("SI"), Display("US")
QUANTITY_FIELDS = [f for f in FIELDS if f.parse not in ("text", "choice", "number")]


def heads_at_demand(data: dict[str, Any]) -> list[float]:
    report = analyze(case_from_dict(for_engine(data)))
    return [r.head_at_demand for r in report.scenarios]


def test_numbers_are_shown_with_six_significant_figures_and_no_trailing_zeros() -> None:
    assert number_text(3.2) == "3.2"
    assert number_text(50.72064119) == "50.7206"
    assert number_text(1812.0) == "1812"
    assert number_text(5944.881889) == "5944.88"
    assert number_text(0.0000015) == "0.0000015"
    assert number_text(0.0) == "0"
    assert number_text(-14.0) == "-14"


def test_a_value_in_the_display_unit_keeps_its_own_digits() -> None:
    assert shown_text("3.2 L/s", "flow", "flow", SI) == "3.2"
    assert shown_text("77.90 mm", "length", "diameter", SI) == "77.90"


def test_values_are_converted_to_the_display_units() -> None:
    # analytic: 3.2 L/s / 3.785411784 L * 60 = 50.7210 gpm; 3 in = 76.2 mm; 12 degC = 53.6 degF
    assert shown_text("3.2 L/s", "flow", "flow", US) == "50.721"
    assert shown_text("3 in", "length", "diameter", SI) == "76.2"
    assert shown_text("12 degC", "temperature", "temperature", US) == "53.6"
    assert shown_text("1812 m", "length", "level", US) == "5944.88"
    assert shown_text("25 year", "duration", "duration", US) == "25"


def test_text_that_does_not_convert_is_shown_as_it_stands() -> None:
    assert shown_text("abc", "flow", "flow", SI) == "abc"
    assert shown_text("3 furlongs", "flow", "flow", SI) == "3 furlongs"
    # a residual requirement given as a head stays a head under the pressure label
    assert shown_text("10 m", "head_or_pressure", "pressure", SI) == "10 m"


def test_typed_numbers_are_stored_with_the_display_unit_and_other_text_as_typed() -> None:
    assert stored_value("3.2", "flow", "flow", SI) == "3.2 L/s"
    assert stored_value("30", "flow", "flow", US) == "30 gpm"
    assert stored_value("60", "temperature", "temperature", US) == "60 degF"
    assert stored_value("3 in", "length", "diameter", SI) == "3 in"
    assert stored_value("abc", "flow", "flow", SI) == "abc"
    assert stored_value("  ", "flow", "flow", SI) is None
    assert stored_value(None, "flow", "flow", SI) is None
    assert stored_value("1500", "number", "number", SI) == 1500
    assert stored_value("0.15", "number", "number", SI) == 0.15
    assert stored_value("lots", "number", "number", SI) == "lots"
    assert stored_value("25", "duration", "duration", SI) == "25 year"


@settings(max_examples=60, deadline=None)
@given(
    si=st.floats(min_value=1e-4, max_value=1e4, allow_nan=False),
    kind=st.sampled_from(
        [
            ("flow", "flow", 1e-3),
            ("length", "level", 1.0),
            ("pressure", "pressure", 1e3),
            ("length", "diameter", 1e-3),
            ("velocity", "velocity", 1.0),
        ]
    ),
    system=st.sampled_from(["SI", "US"]),
)
def test_a_shown_value_written_back_is_the_same_quantity(
    si: float, kind: tuple[str, str, float], system: str
) -> None:
    parse, display_kind, scale = kind
    display = Display(system)
    value = si * scale
    original = f"{value!r} {Display('SI' if system == 'US' else 'US').unit(display_kind)}"
    text = shown_text(original, parse, display_kind, display)
    stored = stored_value(text, parse, display_kind, display)
    assert stored.endswith(" " + display.unit(display_kind))
    back = parse_quantity(stored, parse, "x")
    assert back == pytest.approx(parse_quantity(original, parse, "x"), rel=1e-5)


@settings(max_examples=40, deadline=None)
@given(celsius=st.floats(min_value=-20, max_value=150, allow_nan=False))
def test_temperatures_round_trip_between_celsius_and_fahrenheit(celsius: float) -> None:
    original = f"{celsius!r} degC"
    text = shown_text(original, "temperature", "temperature", US)
    stored = stored_value(text, "temperature", "temperature", US)
    assert stored.endswith(" degF")
    # six significant figures of up to 302 degF: within 0.0005 degF = 0.0003 K
    assert parse_temperature(stored, "x") == pytest.approx(celsius + 273.15, abs=3e-4)


def _blank_quantities(data: dict[str, Any]) -> dict[str, Any]:
    blank = copy.deepcopy(data)
    for spec in QUANTITY_FIELDS:
        set_path(blank, spec.path, None)
    return blank


def _re_entered(data: dict[str, Any], system: str) -> dict[str, Any]:
    """The case with every form value shown in `system` and typed back in."""
    switched = set_units(data, system)
    values = form_values(switched)
    rebuilt = apply_form(_blank_quantities(switched), values)
    assert rebuilt is not None
    return rebuilt


def test_the_whole_case_re_entered_in_us_units_and_back_gives_the_same_answer() -> None:
    data = for_store(demo_data())
    in_us = _re_entered(data, "US")
    assert get_path(in_us, ("delivery", "demand")) == "50.721 gpm"
    assert get_path(in_us, ("source", "level")) == "5944.88 ft"
    assert get_path(in_us, ("liquid", "temperature")) == "53.6 degF"
    assert get_path(in_us, ("display", "units")) == "US"
    back_in_si = _re_entered(in_us, "SI")
    assert get_path(back_in_si, ("delivery", "demand")) == "3.2 L/s"
    expected = heads_at_demand(data)
    # six significant figures of levels near 1800 m: within a few millimetres of head
    assert heads_at_demand(in_us) == pytest.approx(expected, abs=5e-3)
    assert heads_at_demand(back_in_si) == pytest.approx(expected, abs=5e-3)


def test_switching_units_changes_only_the_display_table() -> None:
    data = for_store(demo_data())
    switched = set_units(data, "US")
    assert switched["display"] == {"units": "US"}
    assert {k: v for k, v in switched.items() if k != "display"} == {
        k: v for k, v in data.items() if k != "display"
    }
    assert unit_labels(switched)["demand-input"] == "gpm"
    assert unit_labels(data)["demand-input"] == "L/s"
    assert unit_labels(switched)["source-level-input"] == "ft"


def test_unchanged_form_values_write_nothing() -> None:
    data = for_store(demo_data())
    assert apply_form(data, form_values(data)) is None
    assert apply_form(set_units(data, "US"), form_values(set_units(data, "US"))) is None


def test_an_edit_writes_only_its_own_key() -> None:
    data = for_store(demo_data())
    values = form_values(data) | {"demand-input": "2.5"}
    new = apply_form(data, values)
    assert new is not None
    assert new["delivery"]["demand"] == "2.5 L/s"
    new["delivery"]["demand"] = data["delivery"]["demand"]
    assert new == data
    assert data["delivery"]["demand"] == "3.2 L/s"  # the input dict is not changed


def test_a_blank_optional_field_removes_its_key() -> None:
    data = for_store(demo_data())
    new = apply_form(data, form_values(data) | {"source-level-min-input": ""})
    assert new is not None and "level_min" not in new["source"]


def test_a_custom_liquid_drops_the_water_only_keys_and_shows_its_own_fields() -> None:
    data = for_store(demo_data())
    values = form_values(data) | {"liquid-kind-input": "custom", "liquid-density-input": "870"}
    new = apply_form(data, values)
    assert new is not None
    assert new["liquid"] == {
        "kind": "custom",
        "temperature": "12 degC",
        "density": "870 kg/m**3",
    }
    visible = visible_fields(new)
    assert visible["liquid-density-input"] and not visible["liquid-temperature-max-input"]
    with pytest.raises(CaseError) as error:
        case_from_dict(for_engine(new))
    assert [p.key for p in error.value.problems] == ["liquid.viscosity"]


def test_a_pressure_outlet_drops_the_tank_gauge_pressure() -> None:
    data = for_store(demo_data())
    data["delivery"]["gauge_pressure"] = "5 kPa"
    values = form_values(data) | {
        "delivery-outlet-input": "pressure",
        "delivery-residual-pressure-input": "100",
    }
    new = apply_form(data, values)
    assert new is not None
    assert "gauge_pressure" not in new["delivery"]
    assert new["delivery"]["residual_pressure"] == "100 kPa"


def test_every_field_has_a_unique_id_and_a_key_the_engine_knows() -> None:
    assert len({f.field_id for f in FIELDS}) == len(FIELDS)
    from syscurve.case import SEGMENT_KEYS, TOP_KEYS

    for spec in FIELDS:
        assert spec.path[0] in TOP_KEYS
    assert FIELDS_BY_KEY["delivery.demand"].field_id == "demand-input"
    assert {"name", "length", "diameter", "material", "fittings", "k_extra", "suction"} <= set(
        SEGMENT_KEYS
    )


# --- the route grid -----------------------------------------------------------------------


def test_segment_rows_show_the_route_in_display_units() -> None:
    data = for_store(demo_data())
    rows = segment_rows(data)
    assert [r["name"] for r in rows] == ["intake", "spring main", "tank inlet"]
    assert rows[1]["diameter"] == "77.9" and rows[1]["length"] == "2300"
    assert rows[1]["fittings"] == "elbow-90: 6, gate-valve: 2, check-valve-swing: 1"
    assert rows[0]["suction"] is True and rows[1]["suction"] is False
    us_rows = segment_rows(set_units(data, "US"))
    assert us_rows[1]["diameter"] == "3.06693"  # analytic: 77.9 mm / 25.4
    assert us_rows[1]["length"] == "7545.93"  # analytic: 2300 m / 0.3048


def test_fittings_text_is_read_into_a_table() -> None:
    assert parse_fittings("elbow-90: 6, gate-valve") == {"elbow-90": 6, "gate-valve": 1}
    assert parse_fittings("elbow-90=2; elbow-90 x 1") == {"elbow-90": 3}
    assert parse_fittings("elbow-90: 1.5") == {"elbow-90": 1.5}
    assert parse_fittings("elbow-90: many") == "elbow-90: many"


def test_grid_edits_are_written_back_to_the_segment() -> None:
    data = for_store(demo_data())
    new = apply_segment_edit(data, 1, "diameter", "90")
    assert new["segment"][1]["diameter"] == "90 mm"
    new = apply_segment_edit(new, 1, "fittings", "elbow-90: 2")
    assert new["segment"][1]["fittings"] == {"elbow-90": 2}
    new = apply_segment_edit(new, 0, "suction", False)
    assert "suction" not in new["segment"][0]
    new = apply_segment_edit(new, 1, "roughness", "")
    assert "roughness" not in new["segment"][1]
    new = apply_segment_edit(new, 1, "k_extra", "1.5")
    assert new["segment"][1]["k_extra"] == 1.5
    new = apply_segment_edit(new, 1, "name", "main line")
    assert new["sizing"]["segments"] == ["main line"]  # the sizing list follows the name
    assert data["segment"][1]["diameter"] == "77.9 mm"


def test_a_larger_spring_main_lets_gravity_meet_the_demand() -> None:
    # regression: the demo's sizing names 90 mm as the smallest candidate that works
    data = for_store(demo_data())
    assert max(heads_at_demand(data)) > 0
    assert max(heads_at_demand(apply_segment_edit(data, 1, "diameter", "90"))) < 0


def test_segments_are_added_below_deleted_and_moved() -> None:
    data = for_store(demo_data())
    added, position = add_segment(data, 0)
    assert position == 1
    assert [s["name"] for s in added["segment"]] == [
        "intake",
        "segment 1",
        "spring main",
        "tank inlet",
    ]
    assert added["segment"][1]["diameter"] == "77.9 mm"  # copied from the one above
    assert added["segment"][1]["material"] == "steel-galvanized"
    moved, index = move_segment(added, 1, 1)
    assert index == 2 and moved["segment"][2]["name"] == "segment 1"
    unchanged, index = move_segment(moved, 0, -1)
    assert index == 0 and unchanged == moved
    removed = delete_segment(moved, 2)
    assert removed["segment"] == data["segment"]
    without_main = delete_segment(data, 1)
    assert "segments" not in without_main["sizing"]
    at_end, position = add_segment(data, None)
    assert position == 3 and at_end["segment"][3]["length"] == "100 m"


def test_missing_pump_values_travel_as_null_and_return_as_nan() -> None:
    data = {"pump": [{"name": "p", "npsh_required": [math.nan, 1.0], "flow": [0.0, 1.0]}]}
    stored = for_store(data)
    assert stored["pump"][0]["npsh_required"] == [None, 1.0]
    back = for_engine(stored)
    assert math.isnan(back["pump"][0]["npsh_required"][0])


# --- problems beside their fields ---------------------------------------------------------


def problems_of(data: dict[str, Any]) -> dict[str, Any]:
    with pytest.raises(CaseError) as error:
        case_from_dict(for_engine(data))
    return problem_map([(p.key, p.message) for p in error.value.problems], data)


def test_engine_problems_go_beside_their_fields_and_cells() -> None:
    data = for_store(demo_data())
    data["delivery"]["demand"] = "-1 L/s"
    data["source"]["level"] = "abc"
    data["segment"][1]["diameter"] = "0 mm"
    data["segment"][2]["fittings"] = {"elbow-9O": 1}
    data["arrangement"][2]["speed"] = "fast"
    data["colour"] = "blue"
    placed = problems_of(data)
    assert placed["fields"]["demand-input"] == ['must be > 0, got "-1 L/s"']
    assert "source-level-input" in placed["fields"]
    assert placed["segments"] == {"diameter": [1], "fittings": [2]}
    assert placed["segment_list"][0].startswith("Segment 2 (spring main), inside diameter:")
    assert "elbow-9O" in placed["segment_list"][1]
    assert placed["arrangements"] == {"speed": [2]}
    assert placed["arrangement_list"][0].startswith("Arrangement 3, speed:")
    assert placed["general"] == ["colour: unknown key; did you mean 'source'?"]


def test_unreadable_fittings_text_gets_a_plain_hint() -> None:
    data = for_store(demo_data())
    data["segment"][0]["fittings"] = "elbow-90: many"
    placed = problems_of(data)
    assert placed["segments"] == {"fittings": [0]}
    assert placed["segment_list"] == [f"Segment 1 (intake), fittings: {FITTINGS_HINT}"]


def test_problems_without_a_field_go_to_the_general_area() -> None:
    placed = problem_map([("", "something odd"), ("site.altitude", "too high")], {})
    assert placed["general"] == ["something odd"]
    assert placed["fields"] == {"site-altitude-input": ["too high"]}
    placed = problem_map([("segment", "a case needs at least one [[segment]]")], {})
    assert placed["segment_list"] == ["a case needs at least one [[segment]]"]
    placed = problem_map([("pump[1].flow", "must increase")], {"pump": [{"name": "B"}]})
    assert placed["pumps"] == ["Pump 1 (B), flow: must increase"]
