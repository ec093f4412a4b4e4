# SPDX-License-Identifier: MIT
"""A vessel's on-board stock from .xlsx or .csv, all or nothing; and the sheet kit writes for it.

Columns (sheet ``stock`` of a workbook, or a CSV file), as :func:`stock_template` writes them:

===============  ==============================================================================
``part_key``     the generic part's normalised key (required; the template lists them)
``designation``  what the part is, for the person counting (not read back)
``location``     where on board it is kept (optional; default ``unassigned``)
``quantity``     a number from 0 to 10**9 in the part's unit of measure (pcs, L, m); in ``adjust``
                 mode the change: + for a receipt, - for an issue
``counted_on``   the date of the count, YYYY-MM-DD and not after today (optional)
===============  ==============================================================================

Numbers are plain decimals in the file's decimal mark (:mod:`kit.files.numbers`), dates ISO 8601
calendar dates (:mod:`kit.files.dates`); a location holds no control characters.

In ``count`` mode each row sets the stock of its part at its location; in ``adjust`` mode it
adds to it, in the database (``quantity = quantity + change``), so two imports at once both
count. Stock that would go below zero is refused, and the database's CHECK refuses it too.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

from sqlalchemy import and_, bindparam, or_, select, update
from sqlalchemy.engine import Connection

from catalog_schema.conventions import DEFAULT_LOCATION
from catalog_schema.core_tables import PARTS, STOCK
from catalog_schema.refusals import located
from catalog_schema.sql import upsert
from kit.files.dates import iso_date
from kit.store.fleet_store import vessel_company
from kit.files.numbers import MAX_QUANTITY, DecimalMark, decimal_mark, number
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Sheet, Table, read_table

SHEET = "stock"
COLUMNS = ("part_key", "designation", "location", "quantity", "counted_on")
MODES = ("count", "adjust")
NOTES = {
    "part_key": "the generic part's key, as kit lists it; do not change it",
    "designation": "what the part is (for the person counting; not read back)",
    "location": f"where on board the part is kept; empty means {DEFAULT_LOCATION!r}",
    "quantity": "count mode: what is on board (>= 0); adjust mode: + received, - used",
    "counted_on": "date of the count, YYYY-MM-DD",
}


@dataclass(frozen=True)
class StockReport:
    vessel: str
    mode: str
    rows: int


def _date(table: Table, row: Row) -> dt.date | None:
    value = row.values.get("counted_on")
    if value is None:
        return None
    if isinstance(value, dt.datetime):  # a workbook's date cell
        day = value.date()
    elif isinstance(value, dt.date):
        day = value
    else:
        day = iso_date(value) if isinstance(value, str) else None
        if day is None:
            raise table.error(row, "counted_on", "a date, YYYY-MM-DD (ISO 8601)", value)
    if day > dt.date.today():
        raise table.error(row, "counted_on", f"the date of a count already made (today is {dt.date.today().isoformat()})",
                          day.isoformat())
    return day


def _rows(table: Table, mode: str, mark: DecimalMark) -> list[tuple[Row, str, str, float, dt.date | None]]:
    seen: dict[tuple[str, str], int] = {}
    out = []
    for row in table.rows:
        key = row.values.get("part_key")
        if key is None:
            raise table.error(row, "part_key", "the generic part's key (see kit template stock)", "an empty cell")
        location = str(row.values.get("location") or DEFAULT_LOCATION)
        if CONTROL.search(location):
            raise table.error(row, "location", NO_CONTROL, location)
        if (key, location) in seen:
            raise table.error(row, "part_key", f"each part once per location (already on {table.where(seen[key, location])})", key)
        seen[key, location] = row.line
        quantity = number(table, row, "quantity", mark, minimum=0.0 if mode == "count" else None, maximum=MAX_QUANTITY)
        if quantity is None:
            raise table.error(row, "quantity", "a number", "an empty cell")
        out.append((row, str(key), location, quantity, _date(table, row)))
    return out


@dataclass(frozen=True)
class StockFile:
    """A stock file read and checked, ready to write: its table and each row's (row, part key,
    location, quantity, counted_on)."""

    table: Table
    mode: str
    rows: list[tuple[Row, str, str, float, dt.date | None]]


def read_stock(path: str | Path, mode: str = "count", decimal: str | None = None) -> StockFile:
    """The stock rows of ``path``, every cell checked. ``decimal`` is the decimal mark of the
    file's numbers ("point" or "comma"; None: by the file's kind); ``mode`` one of :data:`MODES`,
    checked by the caller (:func:`kit.services.imports.import_stock`)."""
    table = read_table(path, SHEET, known=COLUMNS, required=("part_key", "quantity"))
    return StockFile(table, mode, _rows(table, mode, decimal_mark(table, decimal)))


def write_stock(conn: Connection, stock: StockFile, vessel_id: str) -> StockReport:
    """Write the checked rows for ``vessel_id`` in the caller's transaction."""
    table, mode, rows = stock.table, stock.mode, stock.rows
    vessel_company(conn, vessel_id)  # the vessel must exist
    keys = sorted({key for _, key, _, _, _ in rows})
    known = dict(conn.execute(select(PARTS.c.key, PARTS.c.id).where(PARTS.c.key.in_(keys))).all()) if keys else {}
    entries = []
    for row, key, location, quantity, counted in rows:
        if key not in known:
            raise table.error(row, "part_key", "the key of a generic part in the database (see kit template stock)", key)
        entries.append((row, {"vessel_id": vessel_id, "part_id": known[key], "location": location,
                              "quantity": quantity, "counted_on": counted}))
    # One lock order for every writer, so two imports cannot deadlock each other.
    entries.sort(key=lambda e: (e[1]["part_id"], e[1]["location"]))
    values = [v for _, v in entries]
    natural_key = ["vessel_id", "part_id", "location"]

    def upsert_located(chosen: list[tuple[Row, dict]], statement) -> None:
        """Run ``statement`` for the rows' values, naming the line of one the database refuses."""
        located(conn, STOCK, (), [v for _, v in chosen], lambda c, some: c.execute(statement, list(some)),
                lambda i: table.where(chosen[i][0].line), {"vessel_id": "vessel id", "part_id": "part_key"})

    if mode == "count":
        upsert_located(entries, upsert(conn, STOCK, natural_key, update=["quantity", "counted_on"]))
        return StockReport(vessel_id, mode, len(values))
    _refuse_negative(conn, table, vessel_id, entries)
    # An issue only changes a row that exists (checked above). It cannot go through
    # INSERT ... ON CONFLICT: both engines check the CHECK on the row proposed for insertion.
    issues = [{"d": v["quantity"], "v": v["vessel_id"], "p": v["part_id"], "l": v["location"]} for v in values if v["quantity"] < 0]
    upsert_located([(row, v) for row, v in entries if v["quantity"] >= 0], upsert(conn, STOCK, natural_key, add=["quantity"]))
    if issues:
        conn.execute(update(STOCK).where(STOCK.c.vessel_id == bindparam("v"), STOCK.c.part_id == bindparam("p"),
                                         STOCK.c.location == bindparam("l"))
                     .values(quantity=STOCK.c.quantity + bindparam("d")), issues)
    return StockReport(vessel_id, mode, len(values))


def _refuse_negative(conn: Connection, table: Table, vessel_id: str, entries: list[tuple[Row, dict]]) -> None:
    """Lock the rows an adjustment takes from and refuse one that would go below zero."""
    issues = [(row, v) for row, v in entries if v["quantity"] < 0]
    if not issues:
        return
    query = (select(STOCK.c.part_id, STOCK.c.location, STOCK.c.quantity)
             .where(STOCK.c.vessel_id == vessel_id,
                    or_(*[and_(STOCK.c.part_id == v["part_id"], STOCK.c.location == v["location"]) for _, v in issues]))
             .order_by(STOCK.c.part_id, STOCK.c.location).with_for_update())
    held = {(r.part_id, r.location): r.quantity for r in conn.execute(query)}
    for row, v in issues:
        have = held.get((v["part_id"], v["location"]), 0.0)
        if have + v["quantity"] < 0:
            raise table.error(row, "quantity", f"an issue of at most {have:g} (what is on board at {v['location']})", v["quantity"])


def stock_template(conn: Connection, vessel_id: str | None) -> Sheet:
    """The stock sheet: one row per generic part, with the vessel's current stock filled in."""
    parts = conn.execute(select(PARTS.c.id, PARTS.c.key, PARTS.c.designation).order_by(PARTS.c.kind, PARTS.c.key)).all()
    held: dict[int, list] = {}
    if vessel_id is not None:
        vessel_company(conn, vessel_id)  # the vessel must exist
        for r in conn.execute(select(STOCK).where(STOCK.c.vessel_id == vessel_id).order_by(STOCK.c.location)):
            held.setdefault(r.part_id, []).append(r)
    rows = []
    for p in parts:
        for s in held.get(p.id, [None]):
            rows.append([p.key, p.designation, None if s is None else s.location, None if s is None else s.quantity,
                         None if s is None or s.counted_on is None else s.counted_on.isoformat()])
    return Sheet(SHEET, COLUMNS, rows, NOTES)
