# SPDX-License-Identifier: MIT
"""Fixtures for the page tests: the invented demo fleet in a database of each engine, and a
FastAPI TestClient that has opened the start link (so it holds a session), as a browser would.

``web``    a :class:`Web` over the demo fleet, on SQLite and on PostgreSQL (see db_support)
``csrf``   the CSRF token a page's form carries, read from the page as a browser sends it
"""

from __future__ import annotations

import re
import warnings
from dataclasses import dataclass
from pathlib import Path

import pytest

from tests.db_support import db_url, engine  # noqa: F401  (fixtures used by name)

HOST, PORT, TOKEN = "127.0.0.1", 8750, "start-token-of-the-tests"
BASE = f"http://{HOST}:{PORT}"
CSRF_IN_FORM = re.compile(r'name="csrf" value="([^"]+)"')


def client(app, base_url: str = BASE):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # starlette's note on which HTTP client it prefers
        from fastapi.testclient import TestClient
    return TestClient(app, base_url=base_url, follow_redirects=False)


@dataclass
class Web:
    app: object
    engine: object
    browser: object  # a TestClient with a session
    imports: Path  # the demo's invented catalogue and count files

    def csrf(self, path: str = "/") -> str:
        """The CSRF token in the form of ``path`` as the session's browser receives it."""
        page = self.browser.get(path)
        found = CSRF_IN_FORM.search(page.text)
        assert found, f"no CSRF field in the form of {path}"
        return found.group(1)


def logged_in(app):
    browser = client(app)
    opened = browser.get(f"/?token={TOKEN}")
    assert opened.status_code == 303, opened.text
    return browser


@pytest.fixture
def web(engine, tmp_path):  # noqa: F811
    from kit.services.demo import fill_demo
    from kit.web.app import create_app

    imports = tmp_path / "imports"
    imports.mkdir()
    fill_demo(engine, imports)
    app = create_app(engine, token=TOKEN, host=HOST, port=PORT)
    return Web(app, engine, logged_in(app), imports)
