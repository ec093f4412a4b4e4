# SPDX-License-Identifier: MIT
"""What an order's supplier choice reads of the office's purchasing records (read side only).

:func:`purchasing_context` gathers, as of a day: the base currency and handling margin (the one
``purchasing`` row; kit's default margin when none is set), the rate in force for each currency into
the base currency (the latest set on or before the day), the suppliers preferred for everything,
the supplier preferred for each part (by part key), and each vessel's next delivery (the first due
on or after the day). The values are :mod:`kit.engine.purchasing`'s.
"""

from __future__ import annotations

import datetime as dt
from typing import Iterable

from sqlalchemy import select
from sqlalchemy.engine import Connection

from catalog_schema.sql import in_batches
from catalog_schema.core_tables import DELIVERIES, EXCHANGE_RATES, PART_SUPPLIERS, PARTS, PURCHASING, SUPPLIERS
from kit.engine.purchasing import DEFAULT_HANDLING_DAYS, Delivery, Purchasing, Rate


def _day(value) -> dt.date:
    """A DATE column's value (SQLite hands back text in some drivers, datetime in others)."""
    if isinstance(value, dt.datetime):
        return value.date()
    if isinstance(value, dt.date):
        return value
    return dt.date.fromisoformat(str(value)[:10])


def purchasing_context(conn: Connection, vessel_ids: Iterable[str], today: dt.date) -> Purchasing:
    """The office's purchasing settings and records in force on ``today`` for ``vessel_ids``."""
    settings = conn.execute(select(PURCHASING.c.base_currency, PURCHASING.c.handling_days)).first()
    base = settings.base_currency if settings else None
    handling = settings.handling_days if settings and settings.handling_days is not None else DEFAULT_HANDLING_DAYS
    rates: dict[str, Rate] = {}
    if base:
        query = (select(EXCHANGE_RATES.c.currency, EXCHANGE_RATES.c.rate, EXCHANGE_RATES.c.set_on, EXCHANGE_RATES.c.source)
                 .where(EXCHANGE_RATES.c.base == base, EXCHANGE_RATES.c.set_on <= today)
                 .order_by(EXCHANGE_RATES.c.currency, EXCHANGE_RATES.c.set_on))
        for currency, rate, set_on, source in conn.execute(query):
            rates[currency] = Rate(currency, base, float(rate), _day(set_on), source)  # the latest wins
    preferred = frozenset(conn.execute(select(SUPPLIERS.c.name).where(SUPPLIERS.c.preferred.is_(True))).scalars())
    part_suppliers = dict(conn.execute(select(PARTS.c.key, SUPPLIERS.c.name)
                                       .join(PART_SUPPLIERS, PART_SUPPLIERS.c.part_id == PARTS.c.id)
                                       .join(SUPPLIERS, SUPPLIERS.c.id == PART_SUPPLIERS.c.supplier_id)).all())
    deliveries: dict[str, Delivery] = {}
    for batch in in_batches(conn, sorted(set(vessel_ids))):  # a bounded number of ids a statement
        query = (select(DELIVERIES.c.vessel_id, DELIVERIES.c.port, DELIVERIES.c.due_on)
                 .where(DELIVERIES.c.vessel_id.in_(batch), DELIVERIES.c.due_on >= today)
                 .order_by(DELIVERIES.c.vessel_id, DELIVERIES.c.due_on.desc()))
        for vessel_id, port, due_on in conn.execute(query):
            deliveries[vessel_id] = Delivery(vessel_id, port, _day(due_on))  # the earliest wins
    return Purchasing(today, base, rates, preferred, part_suppliers, handling, deliveries)
