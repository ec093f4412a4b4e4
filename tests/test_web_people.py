# SPDX-License-Identifier: MIT
"""The office server's sign-in (kit/web/pages/signin.py, kit/web/guard.py in people mode): sign-in
and out, a new session id at each sign-in, throttling stated in the refusal, the start token no
longer enough, roles on the fleet and audit pages; on SQLite and PostgreSQL."""

from __future__ import annotations

import re

import pytest

from kit.services.people import add_person
from tests.db_support import db_url, engine  # noqa: F401
from tests.web_support import PORT, TOKEN, client

PASSWORD = "bollard pull 4400 kN"
CHECK = re.compile(r'name="check" value="([^"]+)"')


@pytest.fixture
def office(engine, tmp_path):  # noqa: F811
    from kit.services.demo import fill_demo
    from kit.web.app import create_app

    fill_demo(engine, tmp_path)
    add_person(engine, "ada", "Ada Lind", "administrator", PASSWORD)
    add_person(engine, "marta", "Marta Koivu", "buyer", PASSWORD)
    add_person(engine, "ingrid", "Ingrid Vos", "vessel_keeper", PASSWORD, ["CORVINA-BAY"])
    add_person(engine, "rolf", "Rolf Haug", "reader", PASSWORD)
    return create_app(engine, token=TOKEN, port=PORT)


def sign_in(app, login: str, password: str = PASSWORD, browser=None):
    browser = browser or client(app)
    form = browser.get("/sign-in")
    check = CHECK.search(form.text).group(1)
    answer = browser.post("/sign-in", data={"login": login, "password": password, "check": check, "next": "/"})
    return browser, answer


def test_without_a_session_a_page_asks_to_sign_in_and_the_token_is_not_enough(office):
    browser = client(office)
    r = browser.get("/?p=1")
    assert r.status_code == 303 and r.headers["location"] == "/sign-in?next=/"
    assert browser.get(f"/?token={TOKEN}").status_code == 303  # to the sign-in page, no session
    assert "set-cookie" not in browser.get(f"/alive?token={TOKEN}").headers or browser.get("/alive").status_code == 303
    assert browser.post("/sign-out", data={}).status_code == 401


def test_sign_in_sets_a_new_strict_httponly_session_each_time(office):
    browser, r = sign_in(office, "Marta")
    assert r.status_code == 303 and r.headers["location"] == "/"
    first = browser.cookies.get("kit_session")
    assert "HttpOnly" in r.headers["set-cookie"] and "SameSite=strict" in r.headers["set-cookie"].replace("Strict", "strict")
    assert browser.get("/").status_code == 200
    browser, r = sign_in(office, "marta", browser=browser)
    assert browser.cookies.get("kit_session") != first  # no session fixation
    other = client(office)
    other.cookies.set("kit_session", first)
    assert other.get("/").status_code == 200  # the earlier session is still its own (not replaced by a known id)


def test_a_wrong_password_is_refused_without_saying_which_part_was_wrong(office):
    _, wrong_password = sign_in(office, "marta", "not the password at all")
    _, no_such = sign_in(office, "nobody", PASSWORD)
    assert wrong_password.status_code == no_such.status_code == 401
    assert "wrong login or password" in wrong_password.text and "wrong login or password" in no_such.text


def test_the_sign_in_form_needs_its_own_check_value(office):
    browser = client(office)
    browser.get("/sign-in")
    r = browser.post("/sign-in", data={"login": "marta", "password": PASSWORD, "check": "forged", "next": "/"})
    assert r.status_code == 403 and "kit_session" not in r.headers.get("set-cookie", "")


def test_too_many_failures_lock_the_login_and_say_until_when(office):
    for _ in range(5):
        sign_in(office, "marta", "wrong wrong wrong")
    browser, r = sign_in(office, "marta")
    assert r.status_code == 429
    assert re.search(r"too many failed sign-ins from this login; try again after \d{4}-\d\d-\d\d \d\d:\d\d UTC", r.text)


def test_sign_out_ends_the_session_everywhere(office):
    browser, _ = sign_in(office, "rolf")
    cookie = browser.cookies.get("kit_session")
    csrf = re.search(r'name="csrf" value="([^"]+)"', browser.get("/").text).group(1)
    assert browser.post("/sign-out", data={"csrf": csrf}).status_code == 303
    stale = client(office)
    stale.cookies.set("kit_session", cookie)
    assert stale.get("/").status_code == 303  # back to the sign-in page


def test_a_vessel_keeper_sees_only_the_vessels_they_keep(office):
    browser, _ = sign_in(office, "ingrid")
    page = browser.get("/").text
    assert "CORVINA-BAY" in page and "TIDEWHISTLE" not in page and "1 vessel(s)" in page
    assert browser.get("/?q=tidewhistle").text.count('href="/vessel/') == 0


@pytest.mark.parametrize("login,status", [("ada", 200), ("marta", 403), ("ingrid", 403), ("rolf", 403)])
def test_only_an_administrator_reads_the_audit_trail(office, login, status):
    browser, _ = sign_in(office, login)
    r = browser.get("/audit")
    assert r.status_code == status
    if status == 200:
        assert "add person" in r.text and "ingrid" in r.text
        assert PASSWORD not in r.text
    else:
        assert "may not view audit" in r.text


def test_the_navigation_shows_each_role_its_pages(office):
    for login, shown, hidden in (("ada", ["Audit trail", "Particulars"], []), ("ingrid", ["Fleet"], ["Order", "Suppliers", "Audit trail"]),
                                 ("rolf", ["Order"], ["Audit trail"])):
        browser, _ = sign_in(office, login)
        nav = browser.get("/").text.split("</nav>")[0]
        assert all(f">{s}</a>" in nav for s in shown) and not any(f">{h}</a>" in nav for h in hidden)
