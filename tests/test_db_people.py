# SPDX-License-Identifier: MIT
"""People, sign-in, sessions and the audit trail (kit/services/people.py, kit/services/audit.py),
on SQLite and PostgreSQL."""

from __future__ import annotations

import datetime as dt

import pytest
from sqlalchemy import text
from sqlalchemy.exc import DBAPIError

from kit.errors import ArgumentError
from kit.services.audit import Actor, read_audit
from kit.services.people import (Lock, SignInRefused, add_person, change_person, list_people, session_of, sign_in,
                                 sign_out)
from tests.db_support import db_url, dump, engine  # noqa: F401

PASSWORD = "plimsoll line 2026"


@pytest.fixture
def fleet(engine):  # noqa: F811
    from kit.services.fleet import load_particulars
    from kit.services.demo import demo_fleet_folder

    load_particulars(engine, demo_fleet_folder())
    return engine


def test_a_person_is_stored_with_an_argon2id_hash_and_never_the_password(fleet):
    add_person(fleet, "Ingrid.Vos", "Ingrid Vos", "vessel_keeper", PASSWORD, ["corvina-bay"])
    (p,) = list_people(fleet)
    assert (p.login, p.role, p.vessels) == ("ingrid.vos", "vessel_keeper", ("CORVINA-BAY",))
    assert p.password_hash.startswith("$argon2id$")  # RFC 9106's recommended variant
    assert PASSWORD not in repr(dump(fleet)) + repr(dump(fleet, {"audit_events"}))  # not in any table, the audit trail included


@pytest.mark.parametrize("login,name,role,password,field", [
    ("x", "X", "buyer", PASSWORD, "login"),
    ("a b", "X", "buyer", PASSWORD, "login"),
    ("ok.name", "X", "captain", PASSWORD, "role"),
    ("ok.name", "X", "buyer", "short", "password"),
    ("ok.name", "bad\x00name", "buyer", PASSWORD, "name"),
])
def test_bad_people_are_refused_and_nothing_is_written(fleet, login, name, role, password, field):
    before = dump(fleet)
    with pytest.raises(ArgumentError) as err:
        add_person(fleet, login, name, role, password)
    assert err.value.field == field
    assert dump(fleet) == before


def test_a_login_is_unique_in_any_letter_case(fleet):
    add_person(fleet, "marta", "Marta", "buyer", PASSWORD)
    with pytest.raises(ArgumentError, match="a login no one else has"):
        add_person(fleet, "MARTA", "Marta again", "reader", PASSWORD)


def test_sign_in_gives_a_new_session_each_time_and_a_wrong_password_says_nothing_more(fleet):
    add_person(fleet, "marta", "Marta", "buyer", PASSWORD)
    first = sign_in(fleet, "Marta", PASSWORD, "127.0.0.1")
    second = sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    assert first.cookie != second.cookie and first.csrf != second.csrf  # no fixation: a new id at each sign-in
    assert session_of(fleet, first.cookie).person.login == "marta"
    with pytest.raises(SignInRefused) as wrong_password:
        sign_in(fleet, "marta", PASSWORD + "x", "127.0.0.1")
    with pytest.raises(SignInRefused) as no_such_login:
        sign_in(fleet, "nobody", PASSWORD, "127.0.0.1")
    assert str(wrong_password.value) == str(no_such_login.value) == "sign-in refused: wrong login or password"
    assert first.cookie not in repr(dump(fleet))  # only its SHA-256 is stored


def test_failures_lock_the_login_and_the_refusal_says_until_when(fleet):
    add_person(fleet, "marta", "Marta", "buyer", PASSWORD)
    lock = Lock(per_login=3, per_address=100, window=dt.timedelta(minutes=15))
    for _ in range(3):
        with pytest.raises(SignInRefused, match="wrong login or password"):
            sign_in(fleet, "marta", "guess guess guess", "10.0.0.7", lock)
    with pytest.raises(SignInRefused, match=r"too many failed sign-ins from this login; try again after \d{4}-\d\d-\d\d \d\d:\d\d UTC"):
        sign_in(fleet, "marta", PASSWORD, "10.0.0.8", lock)  # the right password too, from elsewhere
    # once the window has passed (here: a window ending before now; times are kept to the second),
    # the failures no longer count
    passed = Lock(per_login=3, per_address=100, window=dt.timedelta(seconds=-1))
    assert sign_in(fleet, "marta", PASSWORD, "10.0.0.8", passed).person.login == "marta"


def test_failures_from_one_address_lock_that_address_for_every_login(fleet):
    add_person(fleet, "marta", "Marta", "buyer", PASSWORD)
    lock = Lock(per_login=100, per_address=4)
    for n in range(4):
        with pytest.raises(SignInRefused, match="wrong"):
            sign_in(fleet, f"guess{n}", PASSWORD, "10.0.0.66", lock)
    with pytest.raises(SignInRefused, match="from this address"):
        sign_in(fleet, "marta", PASSWORD, "10.0.0.66", lock)
    assert sign_in(fleet, "marta", PASSWORD, "10.0.0.67", lock).person.login == "marta"


def test_sessions_end_on_sign_out_idle_absolute_and_a_new_password(fleet):
    add_person(fleet, "marta", "Marta", "buyer", PASSWORD)
    s = sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    assert session_of(fleet, s.cookie) is not None
    sign_out(fleet, s.cookie)
    assert session_of(fleet, s.cookie) is None
    s = sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    assert session_of(fleet, s.cookie, idle=dt.timedelta(seconds=-1)) is None  # idle past its limit: ended
    assert session_of(fleet, s.cookie) is None  # and stays ended
    s = sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    assert session_of(fleet, s.cookie, absolute=dt.timedelta(seconds=-1)) is None
    s = sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    change_person(fleet, "marta", password="a new one of fourteen")
    assert session_of(fleet, s.cookie) is None
    with pytest.raises(SignInRefused):
        sign_in(fleet, "marta", PASSWORD, "127.0.0.1")
    s = sign_in(fleet, "marta", "a new one of fourteen", "127.0.0.1")
    change_person(fleet, "marta", disable=True)
    assert session_of(fleet, s.cookie) is None
    with pytest.raises(SignInRefused):
        sign_in(fleet, "marta", "a new one of fourteen", "127.0.0.1")
    assert session_of(fleet, "") is None and session_of(fleet, "x" * 500) is None


def test_changes_to_people_are_in_the_audit_trail_with_before_and_after(fleet):
    admin = Actor("ada", "web")
    add_person(fleet, "ingrid", "Ingrid Vos", "vessel_keeper", PASSWORD, ["CORVINA-BAY"], actor=admin)
    change_person(fleet, "ingrid", keep=("oxbow-lantern",), drop=("corvina-bay",), actor=admin)
    changed, added = read_audit(fleet, subject="ingrid")
    assert (added.action, added.person, added.via, added.before) == ("add person", "ada", "web", None)
    assert changed.before["vessels"] == ["CORVINA-BAY"] and changed.after["vessels"] == ["OXBOW-LANTERN"]
    assert "password" not in changed.after


def test_the_database_refuses_to_rewrite_the_audit_trail(fleet):
    add_person(fleet, "ingrid", "Ingrid Vos", "reader", PASSWORD)
    for statement in ("UPDATE audit_events SET person = 'someone else'", "DELETE FROM audit_events"):
        with pytest.raises(DBAPIError, match="never updated or deleted"):
            with fleet.begin() as conn:
                conn.execute(text(statement))
    (kept,) = read_audit(fleet, subject="ingrid")
    assert kept.action == "add person" and kept.person != "someone else"
    assert len(read_audit(fleet)) == 7  # the six vessels loaded, then ingrid: nothing deleted
