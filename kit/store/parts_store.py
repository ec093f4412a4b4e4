# SPDX-License-Identifier: MIT
"""Generic parts in the fleet database.

A generic part is one row per normalised key (:func:`kit.engine.parts.part_key`). Parts come from the
engine's line items (:func:`register_parts`), so the same housing on two vessels is one row;
catalogue and stock sheets then refer to them by kind and dimensions, or by key (the columns:
:mod:`kit.files.part_keys`).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Iterable

from sqlalchemy import select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, PARTS
from catalog_schema.locks import hold
from catalog_schema.sql import in_batches, upsert
from kit.engine.parts import LineItem

ENTRIES = CATALOGUE_ENTRIES



@dataclass(frozen=True)
class Registered:
    parts: int  # distinct part keys of the items (new or already there)
    entries_matched: int  # catalogue entries that matched nothing before and match one of them now


def register_parts(conn: Connection, items: Iterable[LineItem]) -> Registered:
    """Add the generic part of every line item not yet in the database, and match to them the
    catalogue entries imported before they were registered (kept with their key, see
    :mod:`kit.store.catalogue_import`).

    Matching is done twice, from each side: a catalogue import looks up the ids of the parts
    registered so far, and this updates the entries still unmatched. Two such transactions
    running at once on PostgreSQL could each miss the other's uncommitted rows (the import read
    the ids before this committed; this updated before the import's rows were committed), leaving
    the whole import unmatched. So both hold the lock ``part matching`` (:mod:`catalog_schema.locks`)
    from their first statement: one runs after the other has committed, and the second sees the
    first's rows, whichever order they come in. One statement per transaction, not per row; a
    set-based UPDATE after the insert would still need the lock, as it cannot see uncommitted parts.
    """
    rows = {i.key: {"key": i.key, "kind": i.kind, "designation": i.designation, "standard": i.standard or None}
            for i in items}
    if not rows:
        return Registered(0, 0)
    hold(conn, "part matching")
    keys = sorted(rows)
    # A part registered again takes its designation and standard as kit words them now (the key
    # is the part; its wording follows kit, e.g. an oil part that is its fluid alone).
    conn.execute(upsert(conn, PARTS, ["key"], update=["designation", "standard"]), [rows[k] for k in keys])
    part_id = select(PARTS.c.id).where(PARTS.c.key == ENTRIES.c.part_key).scalar_subquery()
    matched = 0
    for batch in in_batches(conn, keys):
        done = conn.execute(update(ENTRIES).where(ENTRIES.c.part_id.is_(None), ENTRIES.c.part_key.in_(batch))
                            .values(part_id=part_id))
        matched += done.rowcount
    return Registered(len(rows), matched)


def part_ids(conn: Connection) -> dict[str, int]:
    """Every generic part's key and id."""
    return dict(conn.execute(select(PARTS.c.key, PARTS.c.id)).all())


def list_parts(conn: Connection, kind: str | None = None) -> list[tuple[str, str]]:
    """Every generic part (or those of ``kind``) as (key, designation), by kind then key."""
    query = select(PARTS.c.key, PARTS.c.designation).order_by(PARTS.c.kind, PARTS.c.key)
    if kind:
        query = query.where(PARTS.c.kind == kind)
    return [tuple(row) for row in conn.execute(query)]
