# SPDX-License-Identifier: MIT
"""What an order's supplier choice reads of the office's purchasing records (read side only).

:func:`purchasing_context` gathers, as of a day: the base currency and handling margin (the one
``purchasing`` row; kit's default margin when none is set), the rate in force for each currency into
the base currency (the latest set on or before the day), the suppliers preferred for everything,
the supplier preferred for each part (by part key), and each vessel's next delivery (the first due
on or after the day). The values are :mod:`kit.engine.purchasing`'s. The settings and the rates in
force are read by :mod:`kit.store.purchasing_records`' functions, as ``kit purchasing show`` and
``kit rates list`` read them: one query for each rule.
"""

from __future__ import annotations

import datetime as dt
from typing import Iterable

from sqlalchemy import select
from sqlalchemy.engine import Connection

from catalog_schema.sql import in_batches
from catalog_schema.core_tables import DELIVERIES, PART_SUPPLIERS, PARTS, SUPPLIERS
from kit.engine.purchasing import Delivery, Purchasing
from kit.store.purchasing_records import purchasing_settings, rates_in_force


def next_deliveries(conn: Connection, vessel_ids: Iterable[str], today: dt.date) -> dict[str, Delivery]:
    """Vessel id -> its first delivery due on or after ``today`` (vessels with none are left out)."""
    found: dict[str, Delivery] = {}
    for chunk in in_batches(conn, sorted(set(vessel_ids))):  # a bounded number of ids a statement
        query = (select(DELIVERIES.c.vessel_id, DELIVERIES.c.port, DELIVERIES.c.due_on)
                 .where(DELIVERIES.c.vessel_id.in_(chunk), DELIVERIES.c.due_on >= today)
                 .order_by(DELIVERIES.c.vessel_id, DELIVERIES.c.due_on))
        for vessel_id, port, due_on in conn.execute(query):
            found.setdefault(vessel_id, Delivery(vessel_id, port, due_on))
    return found


def purchasing_context(conn: Connection, vessel_ids: Iterable[str], today: dt.date) -> Purchasing:
    """The office's purchasing settings and records in force on ``today`` for ``vessel_ids``."""
    settings = purchasing_settings(conn)
    base = settings.base_currency
    rates = {r.currency: r for r in rates_in_force(conn, base, today)} if base else {}
    preferred = frozenset(conn.execute(select(SUPPLIERS.c.name).where(SUPPLIERS.c.preferred.is_(True))).scalars())
    part_suppliers = dict(conn.execute(select(PARTS.c.key, SUPPLIERS.c.name)
                                       .join(PART_SUPPLIERS, PART_SUPPLIERS.c.part_id == PARTS.c.id)
                                       .join(SUPPLIERS, SUPPLIERS.c.id == PART_SUPPLIERS.c.supplier_id)).all())
    return Purchasing(today, base, rates, preferred, part_suppliers, settings.handling_in_force,
                      next_deliveries(conn, vessel_ids, today))
