# SPDX-License-Identifier: MIT
"""People, the vessels they keep, their signed-in sessions and failed sign-ins.

Each function takes a Connection and leaves the transaction to its caller
(:mod:`kit.services.people`), which checks values and hashes passwords first. A session is found by
the SHA-256 of its cookie (the caller hashes it), so the table never holds a cookie that would
let someone in. Times are UTC without a zone, as the caller gives them.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from sqlalchemy import and_, delete, func, insert, select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import LOGIN_FAILURES, PEOPLE, PERSON_VESSELS, VESSELS, WEB_SESSIONS
from kit.errors import ArgumentError


@dataclass(frozen=True)
class Person:
    id: int
    login: str
    name: str
    role: str
    password_hash: str
    created_at: dt.datetime
    disabled_at: dt.datetime | None
    vessels: tuple[str, ...]  # the vessels a vessel keeper keeps, sorted


def _vessels_of(conn: Connection, person_ids: list[int]) -> dict[int, tuple[str, ...]]:
    found: dict[int, list[str]] = {}
    if person_ids:
        rows = conn.execute(select(PERSON_VESSELS.c.person_id, PERSON_VESSELS.c.vessel_id)
                            .where(PERSON_VESSELS.c.person_id.in_(person_ids)).order_by(PERSON_VESSELS.c.vessel_id))
        for pid, vid in rows:
            found.setdefault(pid, []).append(vid)
    return {pid: tuple(v) for pid, v in found.items()}


def _people(conn: Connection, where=None) -> list[Person]:
    query = select(PEOPLE).order_by(PEOPLE.c.login)
    if where is not None:
        query = query.where(where)
    rows = conn.execute(query).all()
    vessels = _vessels_of(conn, [r.id for r in rows])
    return [Person(r.id, r.login, r.name, r.role, r.password_hash, r.created_at, r.disabled_at, vessels.get(r.id, ()))
            for r in rows]


def person(conn: Connection, login: str) -> Person | None:
    found = _people(conn, PEOPLE.c.login == login.lower())
    return found[0] if found else None


def known_person(conn: Connection, login: str) -> Person:
    found = person(conn, login)
    if found is None:
        raise ArgumentError("", "login", "the login of someone kit knows (kit people list)", got=login)
    return found


def people(conn: Connection) -> list[Person]:
    return _people(conn)


def anyone(conn: Connection) -> bool:
    """Whether the database holds at least one person who is not disabled."""
    return conn.execute(select(func.count()).select_from(PEOPLE).where(PEOPLE.c.disabled_at.is_(None))).scalar_one() > 0


def add_person(conn: Connection, login: str, name: str, role: str, password_hash: str, now: dt.datetime) -> int:
    if person(conn, login) is not None:
        raise ArgumentError("", "login", "a login no one else has", got=login)
    return conn.execute(insert(PEOPLE).values(login=login.lower(), name=name, role=role, password_hash=password_hash,
                                              created_at=now).returning(PEOPLE.c.id)).scalar_one()


def change_person(conn: Connection, login: str, **values) -> None:
    """Set ``values`` (role, name, password_hash, disabled_at) of the person ``login``."""
    known_person(conn, login)
    conn.execute(update(PEOPLE).where(PEOPLE.c.login == login.lower()).values(**values))


def assign_vessels(conn: Connection, login: str, vessel_ids: list[str], keep: bool) -> None:
    """Add (``keep``) or remove the vessels a person keeps; every vessel id must exist."""
    who = known_person(conn, login)
    known = set(conn.execute(select(VESSELS.c.id).where(VESSELS.c.id.in_(vessel_ids))).scalars())
    for vid in vessel_ids:
        if vid not in known:
            from kit.errors import UnknownVesselError

            raise UnknownVesselError(vid)
    if keep:
        have = set(who.vessels)
        rows = [{"person_id": who.id, "vessel_id": v} for v in dict.fromkeys(vessel_ids) if v not in have]
        if rows:
            conn.execute(insert(PERSON_VESSELS), rows)
    else:
        conn.execute(delete(PERSON_VESSELS).where(and_(PERSON_VESSELS.c.person_id == who.id,
                                                       PERSON_VESSELS.c.vessel_id.in_(vessel_ids))))


# --- sessions -------------------------------------------------------------------------------------

@dataclass(frozen=True)
class StoredSession:
    person: Person
    csrf: str
    started_at: dt.datetime
    seen_at: dt.datetime
    ended_at: dt.datetime | None


def start_session(conn: Connection, digest: str, person_id: int, csrf: str, now: dt.datetime) -> None:
    conn.execute(insert(WEB_SESSIONS).values(id=digest, person_id=person_id, csrf=csrf, started_at=now, seen_at=now))


def session(conn: Connection, digest: str) -> StoredSession | None:
    row = conn.execute(select(WEB_SESSIONS).where(WEB_SESSIONS.c.id == digest)).first()
    if row is None:
        return None
    found = _people(conn, PEOPLE.c.id == row.person_id)
    return StoredSession(found[0], row.csrf, row.started_at, row.seen_at, row.ended_at) if found else None


def touch_session(conn: Connection, digest: str, now: dt.datetime) -> None:
    conn.execute(update(WEB_SESSIONS).where(WEB_SESSIONS.c.id == digest).values(seen_at=now))


def end_session(conn: Connection, digest: str, now: dt.datetime) -> None:
    conn.execute(update(WEB_SESSIONS).where(and_(WEB_SESSIONS.c.id == digest, WEB_SESSIONS.c.ended_at.is_(None)))
                 .values(ended_at=now))


def end_sessions_of(conn: Connection, person_id: int, now: dt.datetime) -> None:
    """End every open session of a person (a new password, a new role, disabled)."""
    conn.execute(update(WEB_SESSIONS).where(and_(WEB_SESSIONS.c.person_id == person_id, WEB_SESSIONS.c.ended_at.is_(None)))
                 .values(ended_at=now))


# --- failed sign-ins ----------------------------------------------------------------------------

def record_failure(conn: Connection, login: str, address: str, now: dt.datetime) -> None:
    conn.execute(insert(LOGIN_FAILURES).values(login=login.lower()[:200], address=address[:100], at=now))


def failures_since(conn: Connection, since: dt.datetime, *, login: str | None = None, address: str | None = None) -> list[dt.datetime]:
    """The times of the failed sign-ins since ``since`` for a login or an address, oldest first."""
    query = select(LOGIN_FAILURES.c.at).where(LOGIN_FAILURES.c.at >= since).order_by(LOGIN_FAILURES.c.at)
    if login is not None:
        query = query.where(LOGIN_FAILURES.c.login == login.lower()[:200])
    if address is not None:
        query = query.where(LOGIN_FAILURES.c.address == address[:100])
    return list(conn.execute(query).scalars())
