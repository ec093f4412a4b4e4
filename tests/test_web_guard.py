# SPDX-License-Identifier: MIT
"""What the server refuses before any page runs (kit/web/guard.py): no session, a wrong start
token, another Host (DNS rebinding), a POST without its CSRF token, an oversized body; and the
security headers and cookie flags on what it answers."""

from __future__ import annotations

import pytest

from tests.web_support import BASE, PORT, TOKEN, client, logged_in, web  # noqa: F401
from tests.db_support import db_url, engine  # noqa: F401

PAGES = ["/", "/alive"]


@pytest.fixture
def app(tmp_path):
    from catalog_schema.engine import make_engine
    from kit.services.database import upgrade_database
    from kit.web.app import create_app

    eng = make_engine(f"sqlite:///{tmp_path / 'fleet.sqlite'}")
    upgrade_database(eng)
    yield create_app(eng, token=TOKEN, port=PORT)
    eng.dispose()


@pytest.mark.parametrize("path", PAGES)
def test_no_session_is_refused(app, path):
    r = client(app).get(path)
    assert r.status_code == 401
    assert "kit: serving http://127.0.0.1:N/?token=" in r.text  # says what to open instead
    assert "Fleet</h1>" not in r.text


def test_a_wrong_token_starts_no_session(app):
    browser = client(app)
    r = browser.get("/?token=" + "x" * len(TOKEN))
    assert r.status_code == 401 and "set-cookie" not in r.headers
    assert browser.get("/").status_code == 401


def test_the_start_link_sets_a_strict_httponly_cookie_and_drops_the_token(app):
    browser = client(app)
    r = browser.get(f"/?token={TOKEN}")
    assert r.status_code == 303 and r.headers["location"] == "/"  # the token leaves the address bar
    cookie = r.headers["set-cookie"]
    assert "HttpOnly" in cookie and "SameSite=Strict" in cookie and "Path=/" in cookie
    assert browser.get("/").status_code == 200
    assert browser.get("/alive").text == "kit: serving\n"


def test_the_start_link_never_sends_the_browser_elsewhere(app):
    r = client(app).get(f"//elsewhere.example/?token={TOKEN}")
    assert r.status_code == 303 and r.headers["location"] == "/"


@pytest.mark.parametrize("host", ["evil.example:8750", "127.0.0.1:9999", "localhost.evil.example:8750", ""])
def test_another_host_header_is_refused(app, host):
    browser = logged_in(app)
    r = browser.get("/", headers={"host": host})
    assert r.status_code == 400
    assert "answers only for its own address" in r.text


def test_localhost_by_name_is_this_pc(app):
    browser = client(app, base_url=f"http://localhost:{PORT}")
    assert browser.get(f"/?token={TOKEN}").status_code == 303
    assert browser.get("/").status_code == 200


def test_every_answer_carries_the_security_headers(app):
    for r in (client(app).get("/"), logged_in(app).get("/"), logged_in(app).get("/static/kit.css")):
        assert "script-src 'self'" in r.headers["content-security-policy"]
        assert "unsafe-inline" not in r.headers["content-security-policy"]
        assert "frame-ancestors 'none'" in r.headers["content-security-policy"]
        assert r.headers["x-content-type-options"] == "nosniff"
        assert r.headers["referrer-policy"] == "no-referrer"


def test_a_body_over_the_limit_is_refused_as_it_arrives(tmp_path):
    from catalog_schema.engine import make_engine
    from kit.services.database import upgrade_database
    from kit.web.app import create_app

    eng = make_engine(f"sqlite:///{tmp_path / 'fleet.sqlite'}")
    upgrade_database(eng)
    app = create_app(eng, token=TOKEN, port=PORT, upload_limit=1000)
    browser = logged_in(app)
    r = browser.post("/alive", content=b"x" * 1001, headers={"content-type": "application/octet-stream"})
    assert r.status_code == 413 and "larger than the limit" in r.text
    eng.dispose()


def test_a_bad_query_value_is_one_sentence(app):
    r = logged_in(app).get("/?p=abc")
    assert r.status_code == 422
    assert "p: expected" in r.text and "Traceback" not in r.text


def test_an_unknown_page_is_404_with_a_page(app):
    r = logged_in(app).get("/no-such-page")
    assert r.status_code == 404 and "no such page" in r.text


def test_the_fleet_page_lists_the_demo_fleet(web):
    r = web.browser.get("/")
    assert r.status_code == 200
    assert "CORVINA-BAY" in r.text and "6 vessel(s)" in r.text
    assert web.browser.get("/?q=corvina").text.count('href="/vessel/') == 1
