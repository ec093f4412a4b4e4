# SPDX-License-Identifier: MIT
"""Uploads through the pages, checked against the command line on the same file.

The command line is the reference for every refusal: a page must show the line ``kit`` prints
for the same file (``kit: error: LINE``), said of the file by the name it was uploaded under
instead of the folder it lay in, with status 400 and the database as it was.
"""

from __future__ import annotations

import html
import re
from pathlib import Path

from click.testing import CliRunner

from tests.db_support import dump

REFUSAL = re.compile(r'<p class="refusal" role="alert">(.*?)</p>', re.S)


def refusal_of(response) -> str:
    """The one sentence of a refusal page, as the reader sees it."""
    found = REFUSAL.search(response.text)
    assert found, response.text[:500]
    return html.unescape(found.group(1))


def url_of(engine) -> str:
    return engine.url.render_as_string(hide_password=False)


def cli_line(engine, path: Path, *args: str) -> str:
    """The line ``kit ARGS --db URL`` prints refusing ``path`` (one of ARGS), minus its folder;
    the database is checked unchanged by it."""
    from kit.cli import main

    before = dump(engine)
    done = CliRunner().invoke(main, [*map(str, args), "--db", url_of(engine)])
    assert (done.exit_code, done.stdout) == (2, ""), done.output
    assert done.stderr.startswith("kit: error: ") and done.stderr.count("\n") == 1, done.stderr
    assert dump(engine) == before
    return done.stderr[len("kit: error: "):-1].replace(f"{path.parent}/", "")


def post_file(web, action: str, page: str, field: str, path: Path | None, name: str | None = None, **fields):
    """POST ``path`` (as ``name``, default its own) in ``field`` of the form on ``page``, with its CSRF token."""
    files = {field: (name or path.name, path.read_bytes(), "application/octet-stream")} if path else None
    return web.browser.post(action, data={"csrf": web.csrf(page), **fields}, files=files)


def refused_unchanged(engine, send) -> str:
    """``send()``'s refusal (status 400), the database unchanged by it: its sentence."""
    before = dump(engine)
    r = send()
    assert r.status_code == 400, (r.status_code, r.text[:300])
    assert "Traceback" not in r.text
    assert dump(engine) == before
    return refusal_of(r)


def followed_to(web, response, page: str):
    """The page a successful POST redirected to (303, post/redirect/get), as the browser gets it."""
    assert response.status_code == 303, (response.status_code, response.text[:400])
    assert response.headers["location"].startswith(f"{page}?done=")
    shown = web.browser.get(response.headers["location"])
    assert shown.status_code == 200
    return shown


def notice(page) -> str:
    """The text of the page's notice of what was done, as read."""
    found = re.search(r'<section class="notice".*?</section>', page.text, re.S)
    assert found, page.text[:400]
    return html.unescape(re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", found.group())))
