"""The app, its callbacks' wiring and `serve` (dashboard.app, dashboard.callbacks).

Expected values: the command line's contract (README: exit 2 and one line per
problem on stderr for an invalid case), the component ids the issue names
(``system-plot``, ``verdict``, ``demand-input``), and the demo case's verdict
(regression, `syscurve analyze`).
"""

from __future__ import annotations

import importlib
import shutil
import subprocess
from pathlib import Path
from typing import Any

import pytest
import tomli_w
from dash import Dash, no_update

from dashboard import app as app_module
from dashboard import callbacks, ids
from dashboard.viewmodel import for_store, form_values
from tests.dashboard.helpers import demo_data


def component_ids(layout: Any) -> set[str]:
    found: set[str] = set()

    def walk(node: Any) -> None:
        if isinstance(node, (list, tuple)):
            for child in node:
                walk(child)
            return
        if hasattr(node, "to_plotly_json"):
            if isinstance(getattr(node, "id", None), str):
                found.add(node.id)
            walk(getattr(node, "children", None))

    walk(layout)
    return found


def test_importing_the_app_module_builds_nothing() -> None:
    module = importlib.reload(app_module)
    assert not any(isinstance(value, Dash) for value in vars(module).values())


def test_the_app_has_the_named_components_and_starts_on_the_demo() -> None:
    app = app_module.create_app()
    found = component_ids(app.layout)
    assert {"system-plot", "verdict", "demand-input", "segment-grid", "units-switch"} <= found
    assert {ids.unit_id("demand-input"), ids.message_id("demand-input")} <= found
    store = [c for c in app.layout.children if getattr(c, "id", None) == ids.CASE_STORE][0]
    assert store.data == for_store(demo_data())
    assert app.title == "syscurve: Invented demo: hillside spring to school tank"


def test_two_apps_in_one_process_each_have_every_callback() -> None:
    first, second = app_module.create_app(), app_module.create_app({"format": 1})
    assert len(first.callback_map) == len(second.callback_map) == 8


def test_the_render_callback_returns_one_value_per_output() -> None:
    app = app_module.create_app()
    (render_key,) = [k for k in app.callback_map if ids.SYSTEM_PLOT in k]
    outputs = render_key.strip(".").split("...")
    data = for_store(demo_data())
    values = callbacks.render(data)
    assert len(values) == len(outputs)
    figure = values[outputs.index(f"{ids.SYSTEM_PLOT}.figure")]
    assert figure["layout"]["xaxis"]["title"]["text"] == "Flow Q [L/s]"
    assert values[outputs.index(f"{ids.RESULTS_PANEL}.className")] == "results"


def test_an_invalid_case_keeps_the_results_and_marks_them_out_of_date() -> None:
    app = app_module.create_app()
    (render_key,) = [k for k in app.callback_map if ids.SYSTEM_PLOT in k]
    outputs = render_key.strip(".").split("...")
    data = for_store(demo_data())
    data["delivery"]["demand"] = "-1 L/s"
    values = callbacks.render(data)
    assert values[outputs.index(f"{ids.SYSTEM_PLOT}.figure")] is no_update
    assert values[outputs.index(f"{ids.GOOD_STORE}.data")] is no_update
    assert values[outputs.index(f"{ids.RESULTS_PANEL}.className")] == "results stale"
    message = values[outputs.index(f"{ids.message_id('demand-input')}.children")]
    assert message[0].children == 'must be > 0, got "-1 L/s"'


def test_the_field_callback_writes_only_real_edits() -> None:
    data = for_store(demo_data())
    values = form_values(data)
    assert callbacks.edit_fields(*values.values(), data) is no_update
    values["demand-input"] = "2"
    new = callbacks.edit_fields(*values.values(), data)
    assert new["delivery"]["demand"] == "2 L/s"


def test_save_returns_the_toml_the_command_line_reads() -> None:
    download, message = callbacks.save_case(1, for_store(demo_data()))
    assert message == []
    assert download["filename"] == "invented-demo-hillside-spring-to-school-tank.toml"
    import tomllib

    assert tomllib.loads(download["content"]) == demo_data()


def write_case(tmp_path: Path, data: dict[str, Any]) -> Path:
    path = tmp_path / "case.toml"
    path.write_text(tomli_w.dumps(data), encoding="utf-8")
    return path


def test_serve_refuses_an_invalid_case_with_one_line_per_problem(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    data = demo_data()
    data["delivery"]["demand"] = 3.2
    data["segment"][1]["diameter"] = "0 mm"
    assert app_module.serve(str(write_case(tmp_path, data))) == 2
    err = capsys.readouterr().err.splitlines()
    assert err[0].startswith("delivery.demand: expected a volumetric flow with a unit")
    assert err[1] == 'segment[2].diameter: must be > 0, got "0 mm"'
    assert app_module.serve(str(tmp_path / "missing.toml")) == 2
    assert capsys.readouterr().err.startswith("no such file:")


class FakeServer:
    """Stands in for werkzeug's server: records what `serve` does with it."""

    server_port = 8123

    def __init__(self, host: str, port: int, application: Any, **options: Any) -> None:
        self.arguments = (host, port, application, options)
        self.served = self.closed = False
        FakeServer.last = self

    def serve_forever(self) -> None:
        self.served = True
        raise KeyboardInterrupt  # Ctrl+C

    def server_close(self) -> None:
        self.closed = True


def test_serve_prints_the_address_and_stops_cleanly_on_ctrl_c(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]
) -> None:
    import werkzeug.serving

    monkeypatch.setattr(werkzeug.serving, "make_server", FakeServer)
    assert app_module.serve(str(write_case(tmp_path, demo_data())), port=8123) == 0
    server = FakeServer.last
    host, port, application, options = server.arguments
    assert (host, port, options["threaded"]) == ("127.0.0.1", 8123, True)
    assert server.served and server.closed
    assert capsys.readouterr().out == (
        'syscurve dashboard: serving "Invented demo: hillside spring to school tank" on '
        "http://127.0.0.1:8123/ (Ctrl+C to stop)\n"
    )


def test_serve_says_when_the_port_is_taken(capsys: pytest.CaptureFixture[str]) -> None:
    import socket

    with socket.socket() as taken:
        taken.bind(("127.0.0.1", 0))
        taken.listen()
        port = taken.getsockname()[1]
        assert app_module.serve(None, port=port) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"syscurve dashboard: cannot serve on 127.0.0.1:{port}:")
    assert "choose another with --port" in err and "Traceback" not in err


def test_the_command_line_passes_the_exit_status_through(tmp_path: Path) -> None:
    command = shutil.which("syscurve")
    if command is None:
        pytest.skip("the console script is not installed (pip install -e .)")
    data = demo_data()
    data["source"]["level"] = "high"
    result = subprocess.run(
        [command, "dashboard", str(write_case(tmp_path, data))],
        capture_output=True,
        text=True,
        timeout=60,
        check=False,
    )
    assert result.returncode == 2
    assert result.stderr.strip() == (
        'source.level: expected "value unit", got "high"; write e.g. "80 mm"'
    )
    assert "Traceback" not in result.stderr


def test_an_unexpected_error_in_an_action_leaves_the_case_and_says_so(
    monkeypatch: pytest.MonkeyPatch,
) -> None:
    from dashboard import actions

    def broken(*args: Any) -> Any:
        raise KeyError("segment")

    monkeypatch.setattr(actions, "add_segment", broken)
    monkeypatch.setattr(actions, "add_pump", broken)
    monkeypatch.setattr(actions, "open_case", broken)
    data = for_store(demo_data())
    result = actions.segment_action(data, ids.SEGMENT_ADD, None, None)
    assert result["data"] is None
    assert result["message"] == ["unexpected problem (KeyError: 'segment'); nothing was changed"]
    result = actions.pump_action(data, ids.LIBRARY_ADD, {"library": "x"})
    assert result["data"] is None and result["points_message"][0].startswith("unexpected")
    result = actions.load_action(data, ids.CASE_UPLOAD, None, ("x", "x.toml"), data)
    assert result["data"] is None and result["message"][0].startswith("unexpected")
