# SPDX-License-Identifier: MIT
"""The purchaser's records, written and listed: the base currency and handling margin, exchange
rates, preferred suppliers (for everything they offer, or for one part) and deliveries on board.

Each function takes a Connection and leaves the transaction to its caller (a function in
:mod:`kit.services.purchasing`), which checks the values first. Unknown names are refused here,
where the database is asked: a vessel with :class:`kit.errors.UnknownVesselError`, a supplier or a
part with an :class:`kit.errors.ArgumentError` naming where to look ("supplier name", "part key").
What an order reads of these records is :mod:`kit.store.purchasing_store`'s.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from typing import Iterable

from sqlalchemy import delete, func, select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import (CATALOGUE_ENTRIES, DELIVERIES, EXCHANGE_RATES, PART_SUPPLIERS, PARTS,
                                        PURCHASING, SUPPLIERS)
from catalog_schema.sql import upsert
from kit.engine.purchasing import DEFAULT_HANDLING_DAYS, Delivery, Rate
from kit.errors import ArgumentError

RATES = EXCHANGE_RATES


# --- base currency and handling margin ---------------------------------------------------------

@dataclass(frozen=True)
class Settings:
    """The purchasing settings as stored: ``handling_days`` None means kit's default
    (:data:`kit.engine.purchasing.DEFAULT_HANDLING_DAYS`)."""

    base_currency: str | None
    handling_days: int | None

    @property
    def handling_in_force(self) -> int:
        return DEFAULT_HANDLING_DAYS if self.handling_days is None else self.handling_days


def purchasing_settings(conn: Connection) -> Settings:
    """The one row of settings (both unset when none was ever written)."""
    row = conn.execute(select(PURCHASING.c.base_currency, PURCHASING.c.handling_days).where(PURCHASING.c.id == 1)).first()
    return Settings(None, None) if row is None else Settings(row.base_currency, row.handling_days)


def set_purchasing(conn: Connection, **values: object) -> Settings:
    """Write the settings given (``base_currency``, ``handling_days``; checked by the caller),
    keeping the others, and return them all."""
    if values:
        conn.execute(upsert(conn, PURCHASING, ["id"], update=sorted(values)), [{"id": 1, **values}])
    return purchasing_settings(conn)


# --- exchange rates ----------------------------------------------------------------------------

def rate_counts(conn: Connection) -> dict[str, int]:
    """Rates stored per base currency."""
    query = select(RATES.c.base, func.count()).group_by(RATES.c.base).order_by(RATES.c.base)
    return {base: count for base, count in conn.execute(query)}


def set_rates(conn: Connection, rates: Iterable[Rate]) -> int:
    """Store each rate, replacing one of the same currency, base and date; the number written."""
    rows = [{"currency": r.currency, "base": r.base, "rate": r.rate, "set_on": r.set_on, "source": r.source} for r in rates]
    if rows:
        conn.execute(upsert(conn, RATES, ["currency", "base", "set_on"], update=["rate", "source"]), rows)
    return len(rows)


def rates_in_force(conn: Connection, base: str, on: dt.date) -> list[Rate]:
    """For each currency with a rate into ``base``, the rate in force on ``on``: the latest set on
    or before that day. By currency."""
    query = (select(RATES.c.currency, RATES.c.rate, RATES.c.set_on, RATES.c.source)
             .where(RATES.c.base == base, RATES.c.set_on <= on).order_by(RATES.c.currency, RATES.c.set_on))
    latest: dict[str, Rate] = {}
    for row in conn.execute(query):  # ascending by date, so the last one per currency is in force
        latest[row.currency] = Rate(row.currency, base, row.rate, row.set_on, row.source)
    return list(latest.values())


# --- preferred suppliers -----------------------------------------------------------------------

LOOK_UP_SUPPLIERS = "the name of a supplier in the fleet database (kit supplier list shows them; kit catalogue import adds them)"
LOOK_UP_PARTS = "the key of a generic part in the fleet database (kit parts list shows them; kit parts register adds them)"


def supplier_named(conn: Connection, name: str) -> str | None:
    """The stored name of the supplier called ``name``: the same name, else the one name equal to it
    in any letter case and spacing (as a vessel id in any case is that vessel); None when none is."""
    if conn.execute(select(SUPPLIERS.c.id).where(SUPPLIERS.c.name == name)).first() is not None:
        return name
    wanted = " ".join(name.split()).casefold()
    found = [n for n in conn.execute(select(SUPPLIERS.c.name)).scalars() if " ".join(n.split()).casefold() == wanted]
    return found[0] if len(found) == 1 else None


def supplier_id(conn: Connection, name: str) -> int:
    """The id of the supplier called ``name`` (in any letter case, :func:`supplier_named`), or
    :class:`ArgumentError` ("supplier name")."""
    found = conn.execute(select(SUPPLIERS.c.id).where(SUPPLIERS.c.name == (supplier_named(conn, name) or name))).scalar()
    if found is None:
        raise ArgumentError("", "supplier name", LOOK_UP_SUPPLIERS, got=repr(name))
    return found


def part_id(conn: Connection, key: str) -> int:
    """The id of the generic part keyed ``key``, or :class:`ArgumentError` ("part key")."""
    found = conn.execute(select(PARTS.c.id).where(PARTS.c.key == key)).scalar()
    if found is None:
        raise ArgumentError("", "part key", LOOK_UP_PARTS, got=repr(key))
    return found


def set_preferred(conn: Connection, supplier: str, preferred: bool) -> bool:
    """Mark ``supplier`` preferred for everything it offers (or not); whether it was before."""
    sid = supplier_id(conn, supplier)
    was = bool(conn.execute(select(SUPPLIERS.c.preferred).where(SUPPLIERS.c.id == sid)).scalar())
    conn.execute(update(SUPPLIERS).where(SUPPLIERS.c.id == sid).values(preferred=preferred))
    return was


def prefer_for_part(conn: Connection, supplier: str, key: str, note: str | None) -> str | None:
    """Make ``supplier`` the one preferred for the part keyed ``key`` (one per part, so this
    replaces another); the supplier it replaced, if any."""
    sid, pid = supplier_id(conn, supplier), part_id(conn, key)
    before = conn.execute(select(SUPPLIERS.c.name).join(PART_SUPPLIERS, PART_SUPPLIERS.c.supplier_id == SUPPLIERS.c.id)
                          .where(PART_SUPPLIERS.c.part_id == pid)).scalar()
    conn.execute(upsert(conn, PART_SUPPLIERS, ["part_id"], update=["supplier_id", "note"]),
                 [{"part_id": pid, "supplier_id": sid, "note": note}])
    return before


def offers_part(conn: Connection, supplier: str, key: str) -> bool:
    """Whether ``supplier``'s catalogue (imported or from replies) has an entry for the part keyed ``key``."""
    query = (select(CATALOGUE_ENTRIES.c.id).where(CATALOGUE_ENTRIES.c.supplier_id == supplier_id(conn, supplier),
                                                  CATALOGUE_ENTRIES.c.part_key == key).limit(1))
    return conn.execute(query).first() is not None


def unprefer_for_part(conn: Connection, supplier: str, key: str) -> bool:
    """Drop ``supplier`` as the one preferred for the part keyed ``key``; whether it was."""
    sid, pid = supplier_id(conn, supplier), part_id(conn, key)
    done = conn.execute(delete(PART_SUPPLIERS).where(PART_SUPPLIERS.c.part_id == pid, PART_SUPPLIERS.c.supplier_id == sid))
    return done.rowcount > 0


@dataclass(frozen=True)
class SupplierListed:
    name: str
    entries: int  # catalogue entries
    matched: int  # of them, matched to a generic part
    preferred: bool
    parts: list[tuple[str, str | None]] = field(default_factory=list)  # (part key, note) it is preferred for
    currencies: list[str] = field(default_factory=list)  # ISO 4217 codes its entries are priced in, sorted


def list_suppliers(conn: Connection) -> list[SupplierListed]:
    """Every supplier by name, with its entry counts, preferred flag, the parts it is preferred for and
    the currencies its entries are priced in."""
    counts = (select(CATALOGUE_ENTRIES.c.supplier_id, func.count().label("entries"),
                     func.count(CATALOGUE_ENTRIES.c.part_id).label("matched"))
              .group_by(CATALOGUE_ENTRIES.c.supplier_id).subquery())
    query = (select(SUPPLIERS.c.id, SUPPLIERS.c.name, SUPPLIERS.c.preferred, counts.c.entries, counts.c.matched)
             .outerjoin(counts, counts.c.supplier_id == SUPPLIERS.c.id).order_by(SUPPLIERS.c.name))
    parts: dict[int, list[tuple[str, str | None]]] = {}
    for sid, key, note in conn.execute(select(PART_SUPPLIERS.c.supplier_id, PARTS.c.key, PART_SUPPLIERS.c.note)
                                       .join(PARTS, PARTS.c.id == PART_SUPPLIERS.c.part_id).order_by(PARTS.c.key)):
        parts.setdefault(sid, []).append((key, note))
    currencies: dict[int, list[str]] = {}
    for sid, code in conn.execute(select(CATALOGUE_ENTRIES.c.supplier_id, CATALOGUE_ENTRIES.c.currency).distinct()
                                  .order_by(CATALOGUE_ENTRIES.c.supplier_id, CATALOGUE_ENTRIES.c.currency)):
        currencies.setdefault(sid, []).append(code)
    return [SupplierListed(row.name, row.entries or 0, row.matched or 0, bool(row.preferred), parts.get(row.id, []),
                           currencies.get(row.id, []))
            for row in conn.execute(query)]


# --- deliveries --------------------------------------------------------------------------------

@dataclass(frozen=True)
class DeliveryListed:
    delivery: Delivery
    note: str | None


def _known_vessel(conn: Connection, vessel_id: str) -> None:
    """:class:`kit.errors.UnknownVesselError` unless ``vessel_id`` is in the database. The fleet's
    store is imported here, not with this module, which a catalogue import loads for its suppliers."""
    from kit.store.fleet_store import vessel_company

    vessel_company(conn, vessel_id)


def set_delivery(conn: Connection, vessel_id: str, port: str, due_on: dt.date, note: str | None) -> str | None:
    """Record where and when an order must be on board ``vessel_id`` (:class:`UnknownVesselError`
    for a vessel not in the database); the same vessel and day again replaces the port and note.
    The port it replaced, if any."""
    _known_vessel(conn, vessel_id)
    before = conn.execute(select(DELIVERIES.c.port).where(DELIVERIES.c.vessel_id == vessel_id,
                                                          DELIVERIES.c.due_on == due_on)).scalar()
    conn.execute(upsert(conn, DELIVERIES, ["vessel_id", "due_on"], update=["port", "note"]),
                 [{"vessel_id": vessel_id, "port": port, "due_on": due_on, "note": note}])
    return before


def remove_delivery(conn: Connection, vessel_id: str, due_on: dt.date) -> str | None:
    """Remove ``vessel_id``'s delivery on ``due_on``; its port, or None when there was none."""
    _known_vessel(conn, vessel_id)
    port = conn.execute(select(DELIVERIES.c.port).where(DELIVERIES.c.vessel_id == vessel_id,
                                                        DELIVERIES.c.due_on == due_on)).scalar()
    if port is not None:
        conn.execute(delete(DELIVERIES).where(DELIVERIES.c.vessel_id == vessel_id, DELIVERIES.c.due_on == due_on))
    return port


def list_deliveries(conn: Connection, vessel_id: str | None = None, since: dt.date | None = None) -> list[DeliveryListed]:
    """Deliveries by date then vessel: all, or ``vessel_id``'s; those due on or after ``since`` when given."""
    query = select(DELIVERIES).order_by(DELIVERIES.c.due_on, DELIVERIES.c.vessel_id)
    if vessel_id is not None:
        _known_vessel(conn, vessel_id)
        query = query.where(DELIVERIES.c.vessel_id == vessel_id)
    if since is not None:
        query = query.where(DELIVERIES.c.due_on >= since)
    return [DeliveryListed(Delivery(row.vessel_id, row.port, row.due_on), row.note) for row in conn.execute(query)]
