# SPDX-License-Identifier: MIT
"""People of the office server: add, change, disable, assign vessels; sign in and out; sessions.

Passwords are hashed with argon2id (argon2-cffi's defaults, RFC 9106) and never stored, logged or
returned. A session cookie is a random 256-bit value; the database keeps only its SHA-256. Sign-in
is throttled per login and per address (:data:`LOCK`), and the refusal says until when.
"""

from __future__ import annotations

import datetime as dt
import hashlib
import secrets
from dataclasses import dataclass

from sqlalchemy.engine import Engine

from kit.errors import ArgumentError, KitError
from kit.services.audit import Actor, audit, now

MIN_PASSWORD = 12  # characters; NIST SP 800-63B asks at least 8 and recommends longer (from memory)
IDLE = dt.timedelta(minutes=30)  # a session unused this long ends (common practice)
ABSOLUTE = dt.timedelta(hours=12)  # and any session after this long (common practice: one working day)
TOUCH_EVERY = dt.timedelta(seconds=30)  # a session's last use is written at most this often (idle time to within it)


@dataclass(frozen=True)
class Lock:
    """Failed sign-ins allowed within ``window`` before sign-in is refused until the window after
    the oldest of them has passed (common practice)."""

    per_login: int = 5
    per_address: int = 20
    window: dt.timedelta = dt.timedelta(minutes=15)


LOCK = Lock()


class SignInRefused(KitError, PermissionError):
    """A sign-in refused: a wrong login or password (never which), or too many failures."""

    def __init__(self, text: str, locked: bool = False):
        super().__init__(text)
        self.text, self.locked = text, locked  # locked: too many failures, until the time ``text`` states

    def __str__(self) -> str:
        return self.text


def _hasher():
    from argon2 import PasswordHasher

    return PasswordHasher()


def _checked(login: str, name: str | None, role: str | None, password: str | None) -> None:
    from kit.engine.access import ROLES
    from kit.engine.text_checks import checked_text

    if not (2 <= len(login) <= 64) or not all(c.isalnum() or c in "._-" for c in login):
        raise ArgumentError("", "login", "2 to 64 letters, digits, '.', '_' or '-'", got=repr(login))
    if name is not None:
        checked_text(name, source="", field="name", error=ArgumentError)
        if not name.strip() or len(name) > 200:
            raise ArgumentError("", "name", "a name of 1 to 200 characters", got=repr(name))
    if role is not None and role not in ROLES:
        raise ArgumentError("", "role", "one of " + ", ".join(ROLES), got=role)
    if password is not None and not (MIN_PASSWORD <= len(password) <= 1024):
        raise ArgumentError("", "password", f"a password of at least {MIN_PASSWORD} characters", got=f"{len(password)} characters")


def _shown(p) -> dict:
    """A person as the audit trail records them: never the hash."""
    return {"login": p.login, "name": p.name, "role": p.role, "vessels": list(p.vessels),
            "disabled": p.disabled_at is not None}


def add_person(engine: Engine, login: str, name: str, role: str, password: str, vessels=(), actor: Actor | None = None):
    """Add someone who may sign in, with a role and (a vessel keeper) the vessels they keep."""
    from catalog_schema.engine import write_transaction
    from kit.store import people as store
    from kit.store.vessel_ids import resolve_vessel_ids

    _checked(login, name, role, password)
    digest = _hasher().hash(password)

    def work(conn):
        store.add_person(conn, login, name.strip(), role, digest, now())
        if vessels:
            store.assign_vessels(conn, login, list(resolve_vessel_ids(conn, list(vessels))), keep=True)
        added = store.known_person(conn, login)
        audit(conn, actor, "add person", added.login, None, _shown(added))
        return added

    return write_transaction(engine, work)


def change_person(engine: Engine, login: str, *, role: str | None = None, name: str | None = None,
                  password: str | None = None, disable: bool = False, enable: bool = False,
                  keep: tuple = (), drop: tuple = (), actor: Actor | None = None):
    """Change someone's role, name or password, disable or enable them, or add (``keep``) and remove
    (``drop``) vessels they keep. A new password, role or disabling ends their open sessions."""
    from catalog_schema.engine import write_transaction
    from kit.store import people as store
    from kit.store.vessel_ids import resolve_vessel_ids

    _checked(login, name, role, password)
    digest = _hasher().hash(password) if password is not None else None

    def work(conn):
        before = store.known_person(conn, login)
        values = {k: v for k, v in (("role", role), ("name", name and name.strip()), ("password_hash", digest)) if v is not None}
        if disable:
            values["disabled_at"] = now()
        elif enable:
            values["disabled_at"] = None
        if values:
            store.change_person(conn, login, **values)
        if keep:
            store.assign_vessels(conn, login, list(resolve_vessel_ids(conn, list(keep))), keep=True)
        if drop:
            store.assign_vessels(conn, login, list(resolve_vessel_ids(conn, list(drop))), keep=False)
        if role is not None or password is not None or disable:
            store.end_sessions_of(conn, before.id, now())
        after = store.known_person(conn, login)
        shown = _shown(after) | ({"password": "changed"} if password is not None else {})
        audit(conn, actor, "change person", after.login, _shown(before), shown)
        return after

    return write_transaction(engine, work)


def list_people(engine: Engine) -> list:
    from kit.store.people import people

    with engine.connect() as conn:
        return people(conn)


def anyone_signs_in(engine: Engine) -> bool:
    """Whether the database holds people (then the server asks them to sign in)."""
    from catalog_schema.engine import read_transaction
    from kit.store.people import anyone

    with read_transaction(engine) as conn:
        return anyone(conn)


# --- signing in ---------------------------------------------------------------------------------

@dataclass(frozen=True)
class SignedIn:
    cookie: str  # the session cookie's value, to set in the browser; not stored
    csrf: str
    person: object  # kit.store.people.Person


def digest_of(cookie: str) -> str:
    return hashlib.sha256(cookie.encode("utf-8", "replace")).hexdigest()


def _locked_until(conn, login: str, address: str, at: dt.datetime, lock: Lock) -> tuple[str, dt.datetime] | None:
    from kit.store.people import failures_since

    since = at - lock.window
    for what, times, most in (("this login", failures_since(conn, since, login=login), lock.per_login),
                              ("this address", failures_since(conn, since, address=address), lock.per_address)):
        if len(times) >= most:
            return what, times[-most] + lock.window
    return None


def sign_in(engine: Engine, login: str, password: str, address: str, lock: Lock = LOCK) -> SignedIn:
    """A new session for ``login`` if the password is right and sign-in is not locked for the login
    or the address; else :class:`SignInRefused` (which never says whether the login exists)."""
    from catalog_schema.engine import write_transaction
    from kit.store import people as store

    at = now()
    login = (login or "").strip().lower()[:200]

    def check(conn):
        locked = _locked_until(conn, login, address, at, lock)
        if locked:
            what, until = locked
            return ("locked", f"sign-in refused: too many failed sign-ins from {what}; try again after "
                              f"{until:%Y-%m-%d %H:%M} UTC")
        who = store.person(conn, login) if login else None
        ok = False
        if who is not None and who.disabled_at is None:
            from argon2.exceptions import InvalidHashError, VerificationError

            try:
                ok = _hasher().verify(who.password_hash, password or "")
            except (VerificationError, InvalidHashError):
                ok = False
        else:
            _hasher().hash(password or "")  # as long as a real check, so the time says nothing
        if not ok:
            store.record_failure(conn, login, address, at)
            return ("wrong", "sign-in refused: wrong login or password")
        cookie, csrf = secrets.token_urlsafe(32), secrets.token_urlsafe(32)
        store.start_session(conn, digest_of(cookie), who.id, csrf, at)
        audit(conn, Actor(who.login, "web"), "sign in", who.login, None, {"address": address})
        return ("ok", SignedIn(cookie, csrf, who))

    outcome, value = write_transaction(engine, check)
    if outcome != "ok":
        raise SignInRefused(value, locked=outcome == "locked")
    return value


@dataclass(frozen=True)
class OpenSession:
    person: object  # kit.store.people.Person
    csrf: str


def session_of(engine: Engine, cookie: str | None, idle: dt.timedelta = IDLE, absolute: dt.timedelta = ABSOLUTE) -> OpenSession | None:
    """The open session of a cookie, its last use moved to now; None (and the session ended) when
    it is unknown, ended, idle too long, past its absolute limit or its person disabled."""
    from catalog_schema.engine import write_transaction
    from kit.store import people as store

    if not cookie or len(cookie) > 100:
        return None
    digest, at = digest_of(cookie), now()
    from catalog_schema.engine import read_transaction

    with read_transaction(engine) as conn:  # a read without the write lock: most requests write nothing
        found = store.session(conn, digest)
    if found is None or found.ended_at is not None:
        return None
    if at - found.seen_at > idle or at - found.started_at > absolute or found.person.disabled_at is not None:
        write_transaction(engine, lambda conn: store.end_session(conn, digest, at))
        return None
    if at - found.seen_at >= TOUCH_EVERY:
        write_transaction(engine, lambda conn: store.touch_session(conn, digest, at))
    return OpenSession(found.person, found.csrf)


def sign_out(engine: Engine, cookie: str | None) -> None:
    from catalog_schema.engine import write_transaction
    from kit.store import people as store

    if cookie:
        write_transaction(engine, lambda conn: store.end_session(conn, digest_of(cookie), now()))
