"""The dashboard app: `create_app` builds it, `serve` runs it (``syscurve dashboard``).

Nothing happens at import: the app, its layout and its callbacks are made when
`create_app` is called.
"""

from __future__ import annotations

import contextlib
import io
import sys
import tomllib
from pathlib import Path
from typing import Any

from dash import Dash

EXIT_OK = 0
EXIT_INVALID = 2


def demo_case() -> dict[str, Any]:
    """The bundled demo case (invented), as the browser holds it."""
    from syscurve.cli import example_text

    from .viewmodel import for_store

    return for_store(tomllib.loads(example_text()))


def create_app(case_data: dict[str, Any] | None = None) -> Dash:
    """The Dash app, opened on `case_data` (a case dict; the demo case when None).

    The case is not validated here (`serve` does that); an invalid one opens with its
    problems shown beside the fields.
    """
    import pump_data

    from .callbacks import initial_values, register
    from .components import fill
    from .layout import page
    from .viewmodel import for_store

    demo = demo_case()
    data = demo if case_data is None else for_store(case_data)
    title = str(data.get("title", "case"))
    app = Dash(
        __name__,
        title=f"syscurve: {title}",
        assets_folder=str(Path(__file__).parent / "assets"),
        update_title="",
    )
    layout = page(data, pump_data.list_pumps())
    fill(layout, initial_values(data))  # results on the first paint, without a round trip
    app.layout = layout
    register(app, demo)
    return app


def load_case_file(case_path: str) -> dict[str, Any]:
    """Read, make self-contained (pump files inlined) and validate a case file.

    Raises
    ------
    CaseError
        With every problem of the file.
    """
    from syscurve.case import case_from_dict, read_toml

    from .files import inline_pump_files

    path = Path(case_path)
    data = inline_pump_files(read_toml(path), path.parent)
    case_from_dict(data, base_dir=path.parent)
    return data


def quiet_request_handler() -> Any:
    """A werkzeug request handler that writes no access log."""
    from werkzeug.serving import WSGIRequestHandler

    class QuietHandler(WSGIRequestHandler):
        def log_request(self, *args: Any, **kwargs: Any) -> None:
            """No access log: the terminal shows only what matters."""

    return QuietHandler


def serve(case_path: str | None, host: str = "127.0.0.1", port: int = 8050) -> int:
    """Serve the dashboard on `case_path` (the demo when None) until Ctrl+C.

    The server is werkzeug's, threaded, with Dash's debug mode off.

    Returns
    -------
    int
        0 when stopped; 2 when the case file is invalid (one line per problem on
        stderr) or the address cannot be used.
    """
    from werkzeug.serving import make_server

    from syscurve.errors import CaseError

    try:
        data = load_case_file(case_path) if case_path else None
    except CaseError as error:
        for problem in error.problems:
            print(str(problem), file=sys.stderr)
        return EXIT_INVALID
    app = create_app(data)
    said = io.StringIO()
    try:  # werkzeug prints its own lines and exits when the address is taken
        with contextlib.redirect_stderr(said):
            server = make_server(
                host, port, app.server, threaded=True, request_handler=quiet_request_handler()
            )
    except (OSError, SystemExit) as error:
        reason = said.getvalue().strip().splitlines()[:1] or [str(error)]
        print(
            f"syscurve dashboard: cannot serve on {host}:{port}: {reason[0]}; "
            "choose another with --port",
            file=sys.stderr,
        )
        return EXIT_INVALID
    title = app.title.removeprefix("syscurve: ")
    shown_host = f"[{host}]" if ":" in host else host
    print(
        f'syscurve dashboard: serving "{title}" on http://{shown_host}:{server.server_port}/ '
        "(Ctrl+C to stop)",
        flush=True,
    )
    try:
        server.serve_forever()
    except KeyboardInterrupt:
        pass
    finally:
        server.server_close()
    return EXIT_OK
