"""Serve the dashboard in-process and drive Debian's Chromium (screenshots, browser tests).

    python -m dashboard.screenshot docs/screenshot.png

writes a 1400x900 screenshot of the dashboard on the demo case. The browser is the
system's (``/usr/bin/chromium``); nothing is downloaded.
"""

from __future__ import annotations

import sys
import threading
from collections.abc import Iterator
from contextlib import contextmanager
from typing import Any

CHROMIUM = "/usr/bin/chromium"
CHROMIUM_ARGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
]


@contextmanager
def local_server(app: Any) -> Iterator[str]:
    """Serve a Dash app on a free loopback port in a thread; yields its address."""
    from werkzeug.serving import make_server

    from .app import quiet_request_handler

    server = make_server(
        "127.0.0.1", 0, app.server, threaded=True, request_handler=quiet_request_handler()
    )
    thread = threading.Thread(target=server.serve_forever, daemon=True)
    thread.start()
    try:
        yield f"http://127.0.0.1:{server.server_port}/"
    finally:
        server.shutdown()
        thread.join(timeout=5)


def open_dashboard(page: Any, address: str) -> None:
    """Load the dashboard and wait until the verdict and the plot are drawn."""
    page.goto(address)
    page.wait_for_selector("#verdict .verdict-lead", timeout=30_000)
    page.wait_for_selector("#system-plot .main-svg .scatterlayer .trace", timeout=30_000)


def take_screenshot(path: str, width: int = 1400, height: int = 900) -> None:
    """A screenshot of the dashboard on the demo case."""
    from playwright.sync_api import sync_playwright

    from .app import create_app

    with local_server(create_app()) as address, sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        try:
            page = browser.new_page(viewport={"width": width, "height": height})
            open_dashboard(page, address)
            page.wait_for_timeout(800)  # let the plot settle its layout
            page.screenshot(path=path)
        finally:
            browser.close()


if __name__ == "__main__":
    take_screenshot(sys.argv[1] if len(sys.argv) > 1 else "docs/screenshot.png")
