# SPDX-License-Identifier: MIT
"""A vessel's on-board stock, read and checked by :mod:`kit.files.stock_sheet`, written into the
fleet database all or nothing; and the rows of the sheet kit writes for it.

In ``count`` mode each row sets the stock of its part at its location; in ``adjust`` mode it
adds to it, in the database (``quantity = quantity + change``), so two imports at once both
count. Stock that would go below zero is refused, and the database's CHECK refuses it too.
"""

from __future__ import annotations

from dataclasses import dataclass

from sqlalchemy import and_, bindparam, or_, select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import FILTER_POSITIONS, PARTS, STOCK, UNITS
from catalog_schema.refusals import located
from catalog_schema.sql import upsert
from kit.files.stock_sheet import StockFile
from kit.store.fleet_store import save_filter_counts, vessel_company


@dataclass(frozen=True)
class StockReport:
    vessel: str
    mode: str
    rows: int
    not_counted: tuple[str, ...] = ()  # the rows left blank: "row N: designation" (or the key)
    filter_hours: int = 0  # filter positions whose running hours were recorded


def _blank(table, row) -> str:
    what = row.values.get("designation") or row.values.get("part_key") or row.values.get("position")
    if row.values.get("unit") is not None and row.values.get("position") is not None and table.sheet != "stock":
        what = f"unit {row.values['unit']}, {row.values['position']} filter hours"
    return f"{table.where(row.line)}: {what}"


def write_stock(conn: Connection, stock: StockFile, vessel_id: str) -> StockReport:
    """Write the checked rows for ``vessel_id`` in the caller's transaction, and a count
    sheet's filter hours."""
    table, mode, rows = stock.table, stock.mode, stock.rows
    vessel_company(conn, vessel_id)  # the vessel must exist
    stock.refuse_other_vessel(vessel_id)
    hours = _filter_hours(conn, stock, vessel_id)
    blank = tuple(_blank(table, r) for r in stock.not_counted)
    if stock.filter_table is not None:
        blank += tuple(_blank(stock.filter_table, r) for r in stock.filters_not_read)
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

    def upsert_located(chosen: list[tuple], statement) -> None:
        """Run ``statement`` for the rows' values, naming the line of one the database refuses."""
        located(conn, STOCK, (), [v for _, v in chosen], lambda c, some: c.execute(statement, list(some)),
                lambda i: table.where(chosen[i][0].line), {"vessel_id": "vessel id", "part_id": "part_key"})

    if mode == "count":
        if entries:
            upsert_located(entries, upsert(conn, STOCK, natural_key, update=["quantity", "counted_on"]))
        return StockReport(vessel_id, mode, len(values), blank, hours)
    _refuse_negative(conn, table, vessel_id, entries)
    # An issue only changes a row that exists (checked above). It cannot go through
    # INSERT ... ON CONFLICT: both engines check the CHECK on the row proposed for insertion.
    issues = [{"d": v["quantity"], "v": v["vessel_id"], "p": v["part_id"], "l": v["location"]} for v in values if v["quantity"] < 0]
    receipts = [(row, v) for row, v in entries if v["quantity"] >= 0]
    if receipts:
        upsert_located(receipts, upsert(conn, STOCK, natural_key, add=["quantity"]))
    if issues:
        conn.execute(update(STOCK).where(STOCK.c.vessel_id == bindparam("v"), STOCK.c.part_id == bindparam("p"),
                                         STOCK.c.location == bindparam("l"))
                     .values(quantity=STOCK.c.quantity + bindparam("d")), issues)
    return StockReport(vessel_id, mode, len(values), blank, hours)


def _filter_hours(conn: Connection, stock: StockFile, vessel_id: str) -> int:
    """Record the count sheet's filter hours, each row naming a filter position of the vessel."""
    if not stock.filter_hours:
        return 0
    query = (select(UNITS.c.ref, FILTER_POSITIONS.c.position).join(FILTER_POSITIONS, FILTER_POSITIONS.c.unit_id == UNITS.c.id)
             .where(UNITS.c.vessel_id == vessel_id))
    known = {(r.ref, r.position) for r in conn.execute(query)}
    for row, unit, position, _, _ in stock.filter_hours:
        if (unit, position) not in known:
            raise stock.filter_table.error(row, "position", f"a filter position of unit {unit} in {vessel_id}'s particulars", position)
    save_filter_counts(conn, vessel_id, [(unit, position, run, day) for _, unit, position, run, day in stock.filter_hours])
    return len(stock.filter_hours)


def _refuse_negative(conn: Connection, table, vessel_id: str, entries: list[tuple]) -> None:
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


def stock_rows(conn: Connection, vessel_id: str | None) -> list[list]:
    """The stock sheet's rows (:data:`kit.files.stock_sheet.COLUMNS`): one per generic part, with the
    vessel's current stock filled in."""
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
    return rows


def vessel_stock(conn: Connection, vessel_id: str) -> list:
    """The vessel's stock rows with their part: key, kind, designation, location, quantity,
    counted_on (by location, then part)."""
    vessel_company(conn, vessel_id)  # the vessel must exist
    query = (select(PARTS.c.key, PARTS.c.kind, PARTS.c.designation, STOCK.c.location, STOCK.c.quantity, STOCK.c.counted_on)
             .join(PARTS, PARTS.c.id == STOCK.c.part_id).where(STOCK.c.vessel_id == vessel_id)
             .order_by(STOCK.c.location, PARTS.c.key))
    return conn.execute(query).all()


def registered_parts(conn: Connection, keys: list[str]) -> dict[str, tuple[str, str]]:
    """key -> (kind, designation) of those of ``keys`` registered as generic parts."""
    from catalog_schema.sql import in_batches

    found = {}
    for chunk in in_batches(conn, sorted(set(keys))):
        query = select(PARTS.c.key, PARTS.c.kind, PARTS.c.designation).where(PARTS.c.key.in_(chunk))
        found.update({r.key: (r.kind, r.designation) for r in conn.execute(query)})
    return found
