# SPDX-License-Identifier: MIT
"""The audit trail: who changed what, when, with the before and after.

Every service that changes the fleet database takes an :class:`Actor` (who asks, and through which
face) and writes its audit row in the same transaction as the change (:func:`audit`). The command
line acts as the operating-system user who typed it; a page acts as the person signed in.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from sqlalchemy.engine import Connection, Engine


@dataclass(frozen=True)
class Actor:
    person: str  # a login, or the operating-system user of the command line
    via: str  # "web" or "command line"


def command_line() -> Actor:
    """The command line's actor: the operating-system user running kit."""
    import getpass

    try:
        user = getpass.getuser()
    except (OSError, KeyError):  # no user name in the environment or the password database
        user = "unknown"
    return Actor(user, "command line")


def now() -> dt.datetime:
    """The present moment in UTC, without a zone, as the database stores it."""
    return dt.datetime.now(dt.timezone.utc).replace(tzinfo=None, microsecond=0)


def audit(conn: Connection, actor: Actor | None, action: str, subject: str, before=None, after=None) -> None:
    """Write one audit row for a change made in ``conn``'s transaction (``actor`` None: the command line)."""
    from kit.store.audit import record

    who = actor or command_line()
    record(conn, at=now(), person=who.person, via=who.via, action=action, subject=subject, before=before, after=after)


def read_audit(engine: Engine, *, since: dt.datetime | None = None, person: str | None = None,
               subject: str | None = None, limit: int = 200) -> list:
    """The latest audit events first (:class:`kit.store.audit.AuditEvent`)."""
    from kit.store.audit import events

    with engine.connect() as conn:
        return events(conn, since=since, person=person, subject=subject, limit=limit)


def stock_snapshot(conn: Connection, vessel_id: str) -> dict:
    """A vessel's stock as the audit trail records it: "part key @ location" -> [quantity, counted on]."""
    from kit.store.stock_import import vessel_stock

    return {f"{r.key} @ {r.location}": [r.quantity, None if r.counted_on is None else r.counted_on.isoformat()]
            for r in vessel_stock(conn, vessel_id)}


def deliveries_snapshot(conn: Connection, vessel_id: str) -> list:
    """A vessel's deliveries, past ones too: [due on, port, note]."""
    from kit.store.purchasing_records import list_deliveries

    return [[d.delivery.due_on.isoformat(), d.delivery.port, d.note] for d in list_deliveries(conn, vessel_id)]
