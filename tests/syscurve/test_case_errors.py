"""Bad input: every problem is one line naming the key and the fix; never a traceback."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import pytest

from syscurve.case import case_from_dict, load_case
from syscurve.errors import CaseError
from tests.conftest import PUMP_POINTS


def problems(data: dict[str, Any]) -> list[str]:
    with pytest.raises(CaseError) as error:
        case_from_dict(data)
    return [str(p) for p in error.value.problems]


def only(data: dict[str, Any]) -> str:
    found = problems(data)
    assert len(found) == 1, found
    return found[0]


def test_the_minimal_case_is_valid(minimal: dict[str, Any]) -> None:
    case = case_from_dict(minimal)
    assert case.demand == pytest.approx(0.005)


def test_bare_number_where_a_quantity_belongs(minimal: dict[str, Any]) -> None:
    minimal["segment"][0]["diameter"] = 80
    assert only(minimal) == (
        "segment[1].diameter: expected a length with a unit, got a bare number 80; "
        'write e.g. "80 mm"'
    )


@pytest.mark.parametrize("key", ["length", "diameter"])
@pytest.mark.parametrize("value", ["0 m", "-80 mm"])
def test_zero_or_negative_length_or_diameter(minimal: dict[str, Any], key: str, value: str) -> None:
    minimal["segment"][0][key] = value
    assert only(minimal) == f'segment[1].{key}: must be > 0, got "{value}"'


def test_quantity_of_the_wrong_dimension(minimal: dict[str, Any]) -> None:
    minimal["segment"][0]["diameter"] = "3 L/s"
    message = only(minimal)
    assert message.startswith("segment[1].diameter: expected a length, got a volumetric flow")


@pytest.mark.parametrize(
    ("where", "value", "key", "suggestion"),
    [
        ("material", "pvcc", "segment[1].material", "'pvc'"),
        ("material", "steel", "segment[1].material", "'steel-commercial'"),
        ("fitting", "elbow90", "segment[1].fittings.elbow90", "'elbow-90'"),
        ("friction", "colebrok", "pipe.friction", "'colebrook'"),
    ],
)
def test_unknown_names_suggest_the_nearest_and_are_never_substituted(
    minimal: dict[str, Any], where: str, value: str, key: str, suggestion: str
) -> None:
    if where == "material":
        minimal["segment"][0]["material"] = value
    elif where == "fitting":
        minimal["segment"][0]["fittings"] = {value: 2}
    else:
        minimal["pipe"] = {"friction": value}
    message = only(minimal)
    assert message.startswith(f"{key}: unknown")
    assert suggestion in message


def test_missing_demand(minimal: dict[str, Any]) -> None:
    del minimal["delivery"]["demand"]
    assert only(minimal) == 'delivery.demand: missing; write e.g. demand = "3.2 L/s"'


@pytest.mark.parametrize(
    ("temperature", "fragment"),
    [("-2 degC", "would be ice"), ("28 degF", "would be ice"), ("100 degC", "would boil")],
)
def test_water_below_freezing_or_above_boiling(
    minimal: dict[str, Any], temperature: str, fragment: str
) -> None:
    minimal["liquid"]["temperature"] = temperature
    message = only(minimal)
    assert message.startswith("liquid.temperature: ")
    assert fragment in message


def test_water_that_boils_at_altitude_but_not_at_sea_level(minimal: dict[str, Any]) -> None:
    # At 3000 m the standard atmosphere gives 70.1 kPa, where water boils near 90 C
    # (IAPWS-IF97 saturation line).
    minimal["liquid"]["temperature"] = "95 degC"
    case_from_dict(minimal)  # fine at sea level (boils at 99.97 C)
    minimal["site"] = {"altitude": "3000 m"}
    assert "would boil" in only(minimal)


def test_a_case_with_no_segments(minimal: dict[str, Any]) -> None:
    del minimal["segment"]
    assert only(minimal).startswith("segment: a case needs at least one [[segment]]")


def test_a_file_that_is_not_toml(tmp_path: Path) -> None:
    path = tmp_path / "broken.toml"
    path.write_text('format = 1\n[liquid\nkind = "water"\n', encoding="utf-8")
    with pytest.raises(CaseError, match="is not valid TOML"):
        load_case(path)


def test_a_missing_file(tmp_path: Path) -> None:
    with pytest.raises(CaseError, match="no such file"):
        load_case(tmp_path / "nope.toml")


def test_an_unknown_unit(minimal: dict[str, Any]) -> None:
    minimal["delivery"]["demand"] = "5 lps"
    assert only(minimal) == 'delivery.demand: unknown unit "lps"; write e.g. "3.2 L/s"'


def test_all_problems_are_reported_at_once(minimal: dict[str, Any]) -> None:
    minimal["segment"][0]["diameter"] = 80
    minimal["segment"][0]["material"] = "pvcc"
    minimal["delivery"]["demand"] = "5 lps"
    del minimal["format"]
    keys = {message.split(":")[0] for message in problems(minimal)}
    assert keys == {"format", "segment[1].diameter", "segment[1].material", "delivery.demand"}


def test_misspelt_keys_are_not_silently_ignored(minimal: dict[str, Any]) -> None:
    minimal["source"]["level_mn"] = "99 m"
    message = only(minimal)
    assert message.startswith("source.level_mn: unknown key; did you mean 'level_min'")


def test_a_segment_needs_a_material_or_roughness(minimal: dict[str, Any]) -> None:
    del minimal["segment"][0]["material"]
    assert only(minimal).startswith("segment[1].material: missing; give material")


def test_hazen_williams_refuses_a_custom_liquid(minimal: dict[str, Any]) -> None:
    minimal["liquid"] = {"kind": "custom", "density": "850 kg/m^3", "viscosity": "5 cP"}
    minimal["pipe"] = {"friction": "hazen-williams"}
    assert "water only" in only(minimal)


def test_residual_pressure_needs_a_pressure_outlet(minimal: dict[str, Any]) -> None:
    minimal["delivery"]["residual_pressure"] = "10 m"
    assert only(minimal).startswith("delivery.residual_pressure: applies to outlet")


def test_suction_segments_come_first(minimal: dict[str, Any]) -> None:
    minimal["segment"].append(
        {"name": "late", "length": "5 m", "diameter": "100 mm", "material": "pvc", "suction": True}
    )
    assert only(minimal).startswith("segment[2].suction: suction segments come first")


def test_level_ranges_must_bracket_the_nominal_level(minimal: dict[str, Any]) -> None:
    minimal["source"]["level_min"] = "101 m"
    assert only(minimal).startswith("source.level_min: is above level")


def test_an_exit_fitting_is_accepted_with_a_double_counting_warning(
    minimal: dict[str, Any],
) -> None:
    minimal["segment"][0]["fittings"]["exit"] = 1
    case = case_from_dict(minimal)
    assert any("double-counts" in w for w in case.warnings)


# --- pumps and arrangements -------------------------------------------------------------

PUMP: dict[str, Any] = PUMP_POINTS


def with_pump(
    minimal: dict[str, Any], arrangement: dict[str, Any] | None = None, **changes: Any
) -> dict[str, Any]:
    minimal["pump"] = [{**PUMP, **changes}]
    if arrangement is not None:
        minimal["arrangement"] = [arrangement]
    return minimal


def test_a_pump_by_points_is_valid(minimal: dict[str, Any]) -> None:
    case = case_from_dict(with_pump(minimal))
    assert case.pump_part.pumps[0].name == "p"
    assert [a.name for a in case.pump_part.arrangements] == ["p"]


@pytest.mark.parametrize(
    ("changes", "expected"),
    [
        (
            {"flow": [0, 1], "head": [30, 29], "efficiency": [0, 40]},
            "pump[1].flow: needs at least 3 points, got 2",
        ),
        ({"flow": [0, 2, 1, 3]}, "pump[1].flow: must increase strictly; got 1 L/s after 2 L/s"),
        ({"head": [30, 29, 26]}, "pump[1].head: has 3 values but flow has 4"),
        (
            {"efficiency": [0, 40, 160, 55]},
            "pump[1].efficiency: must be above 0 and at most 100 % where the flow is positive; "
            "got 160 % at point 3",
        ),
        (
            {"efficiency": [0, 0, 60, 55]},
            "pump[1].efficiency: must be above 0 and at most 100 % where the flow is positive; "
            "got 0 % at point 2",
        ),
        ({"speed": "2900 m"}, "pump[1].speed: expected a rotational speed, got a length"),
        ({"flow_unit": "m"}, "pump[1].flow_unit: expected a volumetric flow, got a length"),
    ],
)
def test_bad_pump_points_name_the_key(
    minimal: dict[str, Any], changes: dict[str, Any], expected: str
) -> None:
    message = only(with_pump(minimal, **changes))
    assert message.startswith(expected), message


@pytest.mark.parametrize(
    ("arrangement", "expected"),
    [
        ({"pump": "q"}, 'arrangement[1].pump: no pump is named "q"'),
        ({"pump": "p", "count": 0}, "arrangement[1].count: must be a whole number of pumps, 1 or"),
        (
            {"pump": "p", "speed": "50 L/s"},
            "arrangement[1].speed: expected a rotational speed, got a volumetric flow",
        ),
        (
            {"pump": "p", "count": 2, "connection": "sideways"},
            'arrangement[1].connection: unknown value "sideways"',
        ),
    ],
)
def test_bad_arrangements_name_the_key(
    minimal: dict[str, Any], arrangement: dict[str, Any], expected: str
) -> None:
    message = only(with_pump(minimal, arrangement))
    assert message.startswith(expected), message


def load_with_pump_csv(minimal: dict[str, Any], tmp_path: Path, csv_text: str) -> str:
    """Load the minimal case with a pump from `csv_text`; the error message."""
    import tomli_w

    (tmp_path / "p.csv").write_text(csv_text, encoding="utf-8")
    minimal["pump"] = [{"name": "p", "file": "p.csv"}]
    path = tmp_path / "case.toml"
    path.write_text(tomli_w.dumps(minimal), encoding="utf-8")
    with pytest.raises(CaseError) as error:
        load_case(path)
    return str(error.value)


def test_a_pump_csv_with_a_missing_column(minimal: dict[str, Any], tmp_path: Path) -> None:
    csv_text = "# name: p\n# speed: 2900 rpm\nflow [L/s],efficiency [%]\n0,0\n1,40\n2,60\n"
    message = load_with_pump_csv(minimal, tmp_path, csv_text)
    assert message.startswith("pump[1].file (p.csv)")
    assert "head" in message


def test_a_pump_csv_with_a_unit_that_does_not_fit(minimal: dict[str, Any], tmp_path: Path) -> None:
    csv_text = "# name: p\n# speed: 2900 rpm\nflow [L/s],head [L/s]\n0,30\n1,29\n2,26\n"
    message = load_with_pump_csv(minimal, tmp_path, csv_text)
    assert "head [L/s]" in message and "length" in message


def test_a_library_pump_that_does_not_exist_suggests_names(minimal: dict[str, Any]) -> None:
    minimal["pump"] = [{"name": "x", "library": "small booster"}]
    message = only(minimal)
    assert message.startswith('pump[1].library: no bundled pump "small booster"')
    assert "small booster 2900 rpm" in message
