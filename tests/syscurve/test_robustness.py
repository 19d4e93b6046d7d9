"""Whatever a case file holds, reading it gives a case or a CaseError: never a crash."""

from __future__ import annotations

import copy
import tomllib
from typing import Any

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from syscurve import analyze, case_from_dict
from syscurve.cli import example_text
from syscurve.errors import CaseError

junk = st.one_of(
    st.none(),
    st.booleans(),
    st.integers(-(10**6), 10**6),
    st.floats(allow_nan=True, allow_infinity=True),
    st.text(max_size=12),
    st.sampled_from(
        [
            "0 m",
            "-1 m",
            "1e400 m",
            "nan m",
            "3 L/s",
            "12 degC",
            "2900 rpm",
            "0 rpm",
            "5 kPa",
            "abc def",
            "1/0 m",
            "for-demand",
            "",
            "inf L/s",
        ]
    ),
    st.lists(st.integers(-5, 50), max_size=5),
    st.dictionaries(st.text(max_size=5), st.integers(-2, 5), max_size=2),
)


def paths(data: Any, prefix: tuple[Any, ...] = ()) -> list[tuple[Any, ...]]:
    """Every key path of a nested dict/list structure."""
    found = []
    if isinstance(data, dict):
        for key, value in data.items():
            found.append((*prefix, key))
            found += paths(value, (*prefix, key))
    elif isinstance(data, list):
        for index, value in enumerate(data):
            found.append((*prefix, index))
            found += paths(value, (*prefix, index))
    return found


DEMO = tomllib.loads(example_text())


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(data=st.data())
def test_any_value_anywhere_gives_a_case_or_a_case_error(data: st.DataObject) -> None:
    case_data = copy.deepcopy(DEMO)
    for _ in range(data.draw(st.integers(1, 3))):
        found = paths(case_data)
        if not found:
            break
        path = data.draw(st.sampled_from(found))
        target = case_data
        for step in path[:-1]:
            target = target[step]
        if data.draw(st.booleans()):
            target[path[-1]] = data.draw(junk)
        elif isinstance(target, dict):
            del target[path[-1]]
        else:
            target.pop(path[-1])
    try:
        case = case_from_dict(case_data)
    except CaseError as error:
        assert error.problems and all(p.message for p in error.problems)
        return
    analyze(case).to_dict()


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(data=st.data())
def test_the_dashboard_update_places_every_problem_and_never_fails(data: st.DataObject) -> None:
    from dashboard.resultsview import update
    from dashboard.viewmodel import for_store

    case_data = copy.deepcopy(DEMO)
    path = data.draw(st.sampled_from(paths(case_data)))
    target = case_data
    for step in path[:-1]:
        target = target[step]
    target[path[-1]] = data.draw(junk)
    view = update(for_store(case_data))
    if not view["ok"]:
        general = " ".join(view["problems"]["general"])
        assert "unexpected problem" not in general
