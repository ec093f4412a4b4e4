# SPDX-License-Identifier: MIT
"""A real server and a real browser for the page flows: ``kit serve``'s application run by
uvicorn on 127.0.0.1 (a free port) in a thread, and Debian's chromium driven by Playwright.

The browser is the system's (``/usr/bin/chromium``, or ``KIT_CHROMIUM``); Playwright's own browser
download is never used. Without a browser the tests skip, except when ``KIT_REQUIRE_BROWSER=1``
(as under ``.ci/run``): then they fail. Screenshots go to ``test-artefacts/screens/`` to be
looked at.
"""

from __future__ import annotations

import os
import shutil
import socket
import threading
import time
from dataclasses import dataclass
from pathlib import Path

import pytest

from tests.db_support import db_url, engine  # noqa: F401  (fixtures used by name)

ROOT = Path(__file__).resolve().parents[1]
SCREENS = ROOT / "test-artefacts" / "screens"
TOKEN = "browser-start-token"


def chromium_path() -> str | None:
    given = os.environ.get("KIT_CHROMIUM")
    return given or shutil.which("chromium") or shutil.which("chromium-browser")


@dataclass
class Served:
    url: str  # http://127.0.0.1:PORT
    engine: object
    imports: Path

    @property
    def start(self) -> str:
        return f"{self.url}/?token={TOKEN}"


@pytest.fixture
def served(engine, tmp_path):  # noqa: F811
    """The demo fleet in a database of each engine, served by uvicorn on a free loopback port."""
    import uvicorn

    from kit.services.demo import fill_demo
    from kit.web.app import create_app

    imports = tmp_path / "imports"
    imports.mkdir()
    fill_demo(engine, imports)
    sock = socket.socket(socket.AF_INET, socket.SOCK_STREAM)
    sock.bind(("127.0.0.1", 0))
    sock.listen(64)
    port = sock.getsockname()[1]
    app = create_app(engine, token=TOKEN, host="127.0.0.1", port=port)
    server = uvicorn.Server(uvicorn.Config(app, log_level="warning", access_log=False))
    thread = threading.Thread(target=server.run, kwargs={"sockets": [sock]}, daemon=True)
    thread.start()
    deadline = time.monotonic() + 20
    while not server.started:
        if time.monotonic() > deadline or not thread.is_alive():
            pytest.fail("the test server did not start")
        time.sleep(0.02)
    try:
        yield Served(f"http://127.0.0.1:{port}", engine, imports)
    finally:
        server.should_exit = True
        thread.join(timeout=20)
        sock.close()


# One Playwright and one browser for the whole session. Each test module imports the fixture, and
# pytest keeps a session fixture per module that defines it, so a second module would start a
# second Playwright while the first runs, which Playwright's sync API refuses ("Sync API inside
# the asyncio loop"): the modules' fixtures share this one, and the last to finish closes it.
_SHARED: dict = {"users": 0}


@pytest.fixture(scope="session")
def chromium():
    """Debian's chromium under Playwright, shared by the session's tests."""
    path = chromium_path()
    if not path:
        if os.environ.get("KIT_REQUIRE_BROWSER") == "1":
            pytest.fail("KIT_REQUIRE_BROWSER=1 but no chromium was found (apt-get install chromium)")
        pytest.skip("no chromium on this machine (apt-get install chromium; KIT_CHROMIUM=PATH)")
    if "browser" not in _SHARED:
        from playwright.sync_api import sync_playwright

        _SHARED["playwright"] = sync_playwright().start()
        _SHARED["browser"] = _SHARED["playwright"].chromium.launch(executable_path=path,
                                                                   args=["--no-sandbox", "--disable-dev-shm-usage"])
    _SHARED["users"] += 1
    try:
        yield _SHARED["browser"]
    finally:
        _SHARED["users"] -= 1
        if _SHARED["users"] == 0:
            _SHARED.pop("browser").close()
            _SHARED.pop("playwright").stop()


@pytest.fixture
def page(chromium, served):
    """A new browser tab that has opened the server's start link (so it holds a session)."""
    context = chromium.new_context(viewport={"width": 1300, "height": 900}, accept_downloads=True)
    tab = context.new_page()
    tab.set_default_timeout(20_000)
    tab.goto(served.start)
    yield tab
    context.close()


def screenshot(tab, name: str) -> Path:
    """Save the whole page as ``test-artefacts/screens/NAME.png`` (and return its path)."""
    SCREENS.mkdir(parents=True, exist_ok=True)
    path = SCREENS / f"{name}.png"
    tab.screenshot(path=str(path), full_page=True)
    return path
