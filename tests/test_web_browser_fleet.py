# SPDX-License-Identifier: MIT
"""The fleet page in a real browser: reached from the start link, searched and used by keyboard."""

from __future__ import annotations

from tests.browser_support import chromium, page, screenshot, served  # noqa: F401
from tests.db_support import db_url, engine  # noqa: F401


def test_the_start_link_opens_the_fleet_and_search_finds_one_vessel(page, served):
    assert page.url == served.url + "/"  # the token has left the address bar
    assert page.get_by_role("heading", name="Fleet").is_visible()
    assert page.locator("tbody tr").count() == 6
    screenshot(page, f"fleet-{served.engine.dialect.name}")
    page.get_by_label("Find a vessel").fill("tidewhistle")
    page.keyboard.press("Enter")
    page.wait_for_url("**/?q=tidewhistle")
    rows = page.locator("tbody tr")
    assert rows.count() == 1 and "TIDEWHISTLE" in rows.first.inner_text()


def test_no_inline_script_runs_and_nothing_comes_from_elsewhere(page, served):
    requests = []
    page.on("request", lambda r: requests.append(r.url))
    page.reload()
    assert requests and all(u.startswith(served.url) for u in requests)
