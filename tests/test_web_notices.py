# SPDX-License-Identifier: MIT
"""What a POST did, carried by the browser to the page it redirects to (kit/web/notices.py): no
server keeps it, so another server in front of the same database shows it; it is bounded, shown
escaped, and only with the key of the redirect that set it. On SQLite and PostgreSQL."""

from __future__ import annotations

import base64
import json

from kit.web.notices import BOUND, COOKIE, decoded, encoded
from tests.db_support import TOML_CYLINDER, db_url, engine  # noqa: F401  (fixtures)
from tests.test_web_people import office, sign_in  # noqa: F401  (fixture)
from tests.web_support import CSRF_IN_FORM, PORT, TOKEN, client


def test_a_notice_set_by_one_server_is_shown_by_another(office, engine):  # noqa: F811
    from kit.web.app import create_app

    other = create_app(engine, token=TOKEN, port=PORT)  # a second server on the same database
    browser, _ = sign_in(office, "ada")
    csrf = CSRF_IN_FORM.search(browser.get("/").text).group(1)
    r = browser.post("/particulars", data={"csrf": csrf}, files={"particulars": ("test_one.toml", TOML_CYLINDER.encode())})
    assert r.status_code == 303
    set_cookie = r.headers["set-cookie"]
    assert f"{COOKIE}=" in set_cookie and "HttpOnly" in set_cookie and "Max-Age=60" in set_cookie
    assert "samesite=strict" in set_cookie.lower()
    there = client(other)
    for name in ("kit_session", COOKIE):
        there.cookies.set(name, browser.cookies.get(name))
    shown = there.get(r.headers["location"])
    assert shown.status_code == 200 and "Particulars loaded: test_one.toml" in shown.text
    assert "Particulars loaded" not in there.get("/particulars?done=another-key").text  # only with its own key


def test_a_notice_is_bounded_and_keeps_its_totals():
    ids = [f"VESSEL-{n:05d}" for n in range(2000)]
    text = encoded("k", {"filename": "fleet.toml", "ids": ids, "vessels": len(ids)})
    assert len(text) <= BOUND
    back = decoded(text, "k")
    assert back.vessels == 2000 and 0 < len(back.ids) < 2000 and back.ids == ids[:len(back.ids)]


def test_an_altered_notice_is_shown_as_text_or_not_at_all(office):  # noqa: F811
    browser, _ = sign_in(office, "ada")
    forged = {"key": "k", "value": {"filename": "<script>alert(1)</script>", "ids": ["<b>X</b>"], "vessels": 1,
                                    "registered": None, "not_registered": None}}
    browser.cookies.set(COOKIE, base64.urlsafe_b64encode(json.dumps(forged).encode()).decode())
    page = browser.get("/particulars?done=k").text
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in page and "<script>alert" not in page and "&lt;b&gt;X&lt;/b&gt;" in page
    for junk in ("not base64 at all!", base64.urlsafe_b64encode(b"[1, 2]").decode(), base64.urlsafe_b64encode(b"{").decode()):
        browser.cookies.set(COOKIE, junk)
        r = browser.get("/particulars?done=k")
        assert r.status_code == 200 and "Particulars loaded" not in r.text
