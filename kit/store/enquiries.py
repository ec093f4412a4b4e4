# SPDX-License-Identifier: MIT
"""Enquiries in the fleet database: what was asked of whom, so a reply can be matched line by
line (the next delivery on board each vessel, which an enquiry states, is
:func:`kit.store.purchasing_store.next_deliveries`, as an order reads it)."""

from __future__ import annotations

from typing import Iterable

from sqlalchemy import insert, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import ENQUIRIES, ENQUIRY_LINES
from kit.engine.enquiry import Asked, AskedLine, Enquiry


def enquiry_ids_starting(conn: Connection, prefix: str) -> set[str]:
    """The references of the enquiries stored that start with ``prefix`` (a day's, ``E261202-``)."""
    return set(conn.execute(select(ENQUIRIES.c.id).where(ENQUIRIES.c.id.startswith(prefix, autoescape=True))).scalars())


def record_enquiries(conn: Connection, written: Iterable[Enquiry]) -> None:
    """Record each enquiry and its lines (with the part keys they ask for), in the caller's transaction."""
    written = list(written)
    if not written:
        return
    conn.execute(insert(ENQUIRIES), [{"id": e.id, "supplier": e.supplier, "written_on": e.written_on, "reply_by": e.reply_by}
                                     for e in written])
    rows = [{"enquiry_id": e.id, "line": li.number, "ref": li.ref, "part_key": li.key, "designation": li.designation,
             "quantity": li.quantity, "uom": li.uom, "standard": li.standard, "compound": li.compound, "service": li.service}
            for e in written for li in e.lines]
    if rows:
        conn.execute(insert(ENQUIRY_LINES), rows)


def asked(conn: Connection, enquiry_id: str) -> Asked | None:
    """The enquiry recorded as ``enquiry_id``; None when kit wrote no such enquiry to this database."""
    head = conn.execute(select(ENQUIRIES.c.supplier).where(ENQUIRIES.c.id == enquiry_id)).first()
    if head is None:
        return None
    c = ENQUIRY_LINES.c
    query = (select(c.ref, c.part_key, c.designation, c.quantity, c.uom, c.standard, c.compound, c.service)
             .where(c.enquiry_id == enquiry_id).order_by(c.line))
    return Asked(enquiry_id, head.supplier, {r.ref: AskedLine(*r) for r in conn.execute(query)})
