# SPDX-License-Identifier: MIT
"""The purchaser's records: base currency and handling margin, exchange rates, preferred
suppliers and deliveries on board. One function per thing the purchaser does; each checks its
values, then opens its own transaction (:mod:`kit.store.purchasing_records` writes and lists).

kit fetches nothing from the internet: every rate is one the purchaser entered, with the day it
was set and where it came from.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

from sqlalchemy.engine import Engine

from kit.errors import ArgumentError
from kit.services.audit import Actor, audit, deliveries_snapshot

MAX_HANDLING_DAYS = 365  # as the database's check on purchasing.handling_days
NO_BASE = "a base currency set first (kit purchasing set sets it)"


def _text(value: str | None, field: str, *, required: bool = False) -> str | None:
    """``value`` trimmed and checked for control characters; None stays None unless ``required``."""
    from kit.files.safe_text import checked_text

    if value is None:
        return None
    text = checked_text(value, source="", field=field, error=ArgumentError).strip()
    if required and not text:
        raise ArgumentError("", field, f"a {field}", got="an empty text")
    return text or None


# --- base currency and handling margin ---------------------------------------------------------

@dataclass(frozen=True)
class PurchasingShown:
    settings: object  # kit.store.purchasing_records.Settings
    rate_counts: dict[str, int]  # rates stored per base currency
    rates_today: int  # rates into the base currency in force today
    today: dt.date


def _shown(conn, today: dt.date) -> PurchasingShown:
    from kit.store.purchasing_records import purchasing_settings, rate_counts, rates_in_force

    settings = purchasing_settings(conn)
    base = settings.base_currency
    return PurchasingShown(settings, rate_counts(conn), len(rates_in_force(conn, base, today)) if base else 0, today)


def set_purchasing(engine: Engine, *, base_currency: str | None = None, handling_days: int | None = None,
                   actor: Actor | None = None) -> PurchasingShown:
    """Set the base currency offers are compared in and/or the handling margin in days (0 to
    :data:`MAX_HANDLING_DAYS`); the other setting is kept. Rates stored into another base stay
    stored (each carries its base); the result counts them so a face can say so."""
    from catalog_schema.engine import write_transaction
    from kit.files.currencies import iso_currency
    from kit.store.purchasing_records import set_purchasing as record

    values: dict[str, object] = {}
    if base_currency is None and handling_days is None:
        raise ArgumentError("", "base currency or handling days", "at least one of the two", got="neither")
    if base_currency is not None:
        values["base_currency"] = iso_currency(base_currency, source="", field="base currency", error=ArgumentError)
    if handling_days is not None:
        if isinstance(handling_days, bool) or not isinstance(handling_days, int) or not 0 <= handling_days <= MAX_HANDLING_DAYS:
            raise ArgumentError("", "handling days", f"a whole number of days from 0 to {MAX_HANDLING_DAYS}",
                                got=repr(handling_days))
        values["handling_days"] = handling_days

    def work(conn):
        from kit.store.purchasing_records import purchasing_settings

        before = purchasing_settings(conn)
        after = record(conn, **values)
        audit(conn, actor, "set purchasing", "purchasing", _settings(before), _settings(after))
        return _shown(conn, dt.date.today())

    return write_transaction(engine, work)


def _settings(s) -> dict:
    return {"base currency": s.base_currency, "handling days": s.handling_days}


def show_purchasing(engine: Engine) -> PurchasingShown:
    """The purchasing settings and how many rates are stored per base currency."""
    with engine.connect() as conn:
        return _shown(conn, dt.date.today())


# --- exchange rates ----------------------------------------------------------------------------

def _base(conn) -> str:
    from kit.errors import InputError
    from kit.store.purchasing_records import purchasing_settings

    base = purchasing_settings(conn).base_currency
    if base is None:
        raise InputError("fleet database", "base currency", NO_BASE, got="none set")
    return base


def set_rate(engine: Engine, currency: str, rate: float, on: dt.date | None = None, source: str = "", actor: Actor | None = None):
    """Record that one unit of ``currency`` is worth ``rate`` units of the base currency, as set on
    ``on`` (default today, never after it) from ``source``: the :class:`kit.engine.purchasing.Rate`
    stored. The same currency and day again replaces the rate."""
    import math

    from catalog_schema.engine import write_transaction
    from kit.engine.purchasing import Rate
    from kit.files.currencies import iso_currency
    from kit.files.rates_sheet import RATE_EXPECTED, checked_rate, rate_date_expected
    from kit.store.purchasing_records import set_rates

    today = dt.date.today()
    day = on or today
    code = iso_currency(currency, source="", field="currency", error=ArgumentError)
    if isinstance(rate, bool) or not isinstance(rate, (int, float)) or not math.isfinite(rate) or not checked_rate(rate):
        raise ArgumentError("", "rate", RATE_EXPECTED, got=repr(rate))
    if day > today:
        raise ArgumentError("", "date set", rate_date_expected(today), got=day.isoformat())
    text = _text(source, "source", required=True)

    def work(conn):
        base = _base(conn)
        if code == base:
            raise ArgumentError("", "currency", f"a currency other than the base currency {base} (its rate is 1)", got=code)
        stored = Rate(code, base, float(rate), day, text)
        before = _rates_snapshot(conn, base, [code])
        set_rates(conn, [stored])
        audit(conn, actor, "set rate", code, before, _rates_snapshot(conn, base, [code]))
        return stored

    return write_transaction(engine, work)


@dataclass(frozen=True)
class RatesImported:
    path: str
    base: str
    rates: list  # the kit.engine.purchasing.Rate rows written


def _rates_snapshot(conn, base: str, currencies) -> dict:
    """The rates in force today into ``base`` for ``currencies``: code -> [rate, set on, source]."""
    from kit.store.purchasing_records import rates_in_force

    wanted = set(currencies)
    return {r.currency: [r.rate, r.set_on.isoformat(), r.source]
            for r in rates_in_force(conn, base, dt.date.today()) if r.currency in wanted}


def import_rates(engine: Engine, path: str | Path, decimal: str | None = None, actor: Actor | None = None) -> RatesImported:
    """Store every rate of the CSV file ``path`` (columns currency, rate, set_on, source; see
    :mod:`kit.files.rates_sheet`) into the base currency, all or nothing."""
    from catalog_schema.engine import write_transaction
    from kit.files.rates_sheet import read_rates
    from kit.store.purchasing_records import set_rates

    with engine.connect() as conn:
        base = _base(conn)
    rates = read_rates(path, base, decimal)  # the whole file checked before the transaction opens

    def work(conn):
        if _base(conn) != base:  # changed by someone else meanwhile: the file was checked against the old one
            from kit.errors import InputError

            raise InputError("fleet database", "base currency", f"still {base} while the rates were written",
                             got=_base(conn))
        codes = {r.currency for r in rates}
        before = _rates_snapshot(conn, base, codes)
        set_rates(conn, rates)
        audit(conn, actor, "import rates", Path(path).name, before, _rates_snapshot(conn, base, codes))
        return RatesImported(str(path), base, rates)

    return write_transaction(engine, work)


@dataclass(frozen=True)
class RatesListed:
    base: str
    on: dt.date
    rates: list  # kit.engine.purchasing.Rate in force on ``on``, by currency
    other_bases: dict[str, int]  # rates kept for other base currencies


def list_rates(engine: Engine, on: dt.date | None = None) -> RatesListed:
    """The rate in force on ``on`` (default today) for each currency: the latest set on or before it."""
    from kit.store.purchasing_records import rate_counts, rates_in_force

    day = on or dt.date.today()
    with engine.connect() as conn:
        base = _base(conn)
        others = {b: n for b, n in rate_counts(conn).items() if b != base}
        return RatesListed(base, day, rates_in_force(conn, base, day), others)


# --- preferred suppliers -----------------------------------------------------------------------

@dataclass(frozen=True)
class Preference:
    supplier: str
    part_key: str | None  # None: preferred for everything it offers
    done: bool  # False: nothing changed (already so, or nothing to undo)
    replaced: str | None = None  # the supplier preferred for that part before
    offered: bool = True  # False: the supplier offers nothing for that part (yet), so it cannot be chosen


def prefer_supplier(engine: Engine, supplier: str, part_key: str | None = None, note: str | None = None,
                    actor: Actor | None = None) -> Preference:
    """Prefer ``supplier`` over price: for everything it offers, or with ``part_key`` for that one
    part (one supplier per part; it wins over a supplier preferred for everything)."""
    from catalog_schema.engine import write_transaction
    from kit.store.purchasing_records import offers_part, prefer_for_part, set_preferred, supplier_named

    given = _text(supplier, "supplier name", required=True)
    key = _text(part_key, "part key", required=True)
    remark = _text(note, "note")
    if key is None and remark is not None:
        raise ArgumentError("", "note", "a note only with a part (a preference for one part)", got=repr(remark))

    def work(conn):
        name = supplier_named(conn, given) or given
        if key is None:
            done = Preference(name, None, not set_preferred(conn, name, True))
            audit(conn, actor, "prefer supplier", name, None, {"for": "everything it offers"})
            return done
        before = prefer_for_part(conn, name, key, remark)
        audit(conn, actor, "prefer supplier", name, {"part": key, "preferred": before}, {"part": key, "preferred": name, "note": remark})
        return Preference(name, key, True, before if before != name else None, offers_part(conn, name, key))

    return write_transaction(engine, work)


def unprefer_supplier(engine: Engine, supplier: str, part_key: str | None = None, actor: Actor | None = None) -> Preference:
    """Undo :func:`prefer_supplier`: for everything, or with ``part_key`` for that part only."""
    from catalog_schema.engine import write_transaction
    from kit.store.purchasing_records import set_preferred, supplier_named, unprefer_for_part

    given = _text(supplier, "supplier name", required=True)
    key = _text(part_key, "part key", required=True)

    def work(conn):
        name = supplier_named(conn, given) or given
        if key is None:
            done = Preference(name, None, set_preferred(conn, name, False))
        else:
            done = Preference(name, key, unprefer_for_part(conn, name, key))
        audit(conn, actor, "unprefer supplier", name, None, {"for": key or "everything it offers"})
        return done

    return write_transaction(engine, work)


def list_suppliers(engine: Engine) -> list:
    """Every supplier (:class:`kit.store.purchasing_records.SupplierListed`), by name."""
    from kit.store.purchasing_records import list_suppliers as listed

    with engine.connect() as conn:
        return listed(conn)


# --- deliveries --------------------------------------------------------------------------------

@dataclass(frozen=True)
class DeliverySet:
    vessel_id: str
    port: str
    due_on: dt.date
    replaced: str | None  # the port set before for that vessel and day


def set_delivery(engine: Engine, vessel_id: str, port: str, due_on: dt.date, note: str | None = None,
                 actor: Actor | None = None) -> DeliverySet:
    """Record where (``port``) and when (``due_on``, today or later) an order must be on board
    ``vessel_id``; the same vessel and day again replaces the port."""
    from catalog_schema.engine import write_transaction
    from kit.store.purchasing_records import set_delivery as record

    today = dt.date.today()
    if due_on < today:
        raise ArgumentError("", "delivery date", f"today ({today.isoformat()}) or later", got=due_on.isoformat())
    where = _text(port, "port", required=True)
    remark = _text(note, "note")
    vessel = _text(vessel_id, "vessel id", required=True)
    from kit.store.vessel_ids import resolve_vessel_id

    def write(conn):
        stored = resolve_vessel_id(conn, vessel)  # any letter case, as every command takes an id
        before = deliveries_snapshot(conn, stored)
        replaced = record(conn, stored, where, due_on, remark)
        audit(conn, actor, "set delivery", stored, before, deliveries_snapshot(conn, stored))
        return stored, replaced

    stored, replaced = write_transaction(engine, write)
    return DeliverySet(stored, where, due_on, replaced)


def remove_delivery(engine: Engine, vessel_id: str, due_on: dt.date, actor: Actor | None = None) -> str:
    """Remove ``vessel_id``'s delivery on ``due_on``: the port it had (:class:`ArgumentError` when
    there is none that day)."""
    from catalog_schema.engine import write_transaction
    from kit.store.purchasing_records import remove_delivery as remove

    from kit.store.vessel_ids import resolve_vessel_id

    def work(conn):
        stored = resolve_vessel_id(conn, vessel_id)
        before = deliveries_snapshot(conn, stored)
        gone = remove(conn, stored, due_on)
        if gone is not None:
            audit(conn, actor, "remove delivery", stored, before, deliveries_snapshot(conn, stored))
        return gone

    port = write_transaction(engine, work)
    if port is None:
        raise ArgumentError("", "delivery date", f"the day of one of {vessel_id}'s deliveries (kit delivery list shows them)",
                            got=due_on.isoformat())
    return port


def list_deliveries(engine: Engine, vessel_id: str | None = None, include_past: bool = False) -> list:
    """Deliveries (:class:`kit.store.purchasing_records.DeliveryListed`) by date: upcoming ones
    (today or later), or all with ``include_past``; every vessel's, or ``vessel_id``'s."""
    from kit.store.purchasing_records import list_deliveries as listed

    from kit.store.vessel_ids import resolve_vessel_id

    with engine.connect() as conn:
        stored = None if vessel_id is None else resolve_vessel_id(conn, vessel_id)
        return listed(conn, stored, None if include_past else dt.date.today())
