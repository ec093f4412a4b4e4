# SPDX-License-Identifier: MIT
"""The audit trail: one row per change, only ever inserted (the database refuses an update or a
delete, revision 0009). The caller writes the row in the same transaction as the change, so a
change and its record stand or fall together."""

from __future__ import annotations

import datetime as dt
import json
from dataclasses import dataclass

from sqlalchemy import insert, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import AUDIT_EVENTS


@dataclass(frozen=True)
class AuditEvent:
    id: int
    at: dt.datetime
    person: str
    via: str
    action: str
    subject: str
    before: object  # the JSON value stored, or None
    after: object


def _json(value) -> str | None:
    return None if value is None else json.dumps(value, sort_keys=True, default=str, ensure_ascii=False)


def record(conn: Connection, *, at: dt.datetime, person: str, via: str, action: str, subject: str,
           before=None, after=None) -> None:
    conn.execute(insert(AUDIT_EVENTS).values(at=at, person=person, via=via, action=action, subject=subject,
                                             before=_json(before), after=_json(after)))


def events(conn: Connection, *, since: dt.datetime | None = None, person: str | None = None,
           subject: str | None = None, limit: int = 200) -> list[AuditEvent]:
    """The latest events first, at most ``limit``, filtered by time, person and subject."""
    query = select(AUDIT_EVENTS).order_by(AUDIT_EVENTS.c.id.desc()).limit(limit)
    if since is not None:
        query = query.where(AUDIT_EVENTS.c.at >= since)
    if person is not None:
        query = query.where(AUDIT_EVENTS.c.person == person)
    if subject is not None:
        query = query.where(AUDIT_EVENTS.c.subject == subject)
    return [AuditEvent(r.id, r.at, r.person, r.via, r.action, r.subject,
                       None if r.before is None else json.loads(r.before), None if r.after is None else json.loads(r.after))
            for r in conn.execute(query)]
