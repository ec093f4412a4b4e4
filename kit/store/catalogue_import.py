# SPDX-License-Identifier: MIT
"""A supplier's catalogue from .xlsx or .csv into the fleet database, all or nothing.

One row per supplier part. Columns (sheet ``catalogue`` of a workbook, or a CSV file):

==================  ===========================================================================
``supplier_ref``    the supplier's part number (required, once per file)
``part_kind`` ...   the generic part by kind and dimensions, or ``part_key`` (see
                    :mod:`kit.store.parts_store`)
``description``     the supplier's own text (optional)
``pack_qty``        pieces (or litres, metres) per pack, a whole number 1 to 1,000,000 (default 1)
``price``           price per pack, a number 0 to 10**12 (optional)
``currency``        an ISO 4217 alphabetic code (required; see :mod:`kit.files.currencies`)
``lead_time_days``  whole days from order to dispatch, 0 to 3,650 (optional)
==================  ===========================================================================

Numbers are plain decimals in the file's decimal mark (:mod:`kit.files.numbers`); text holds no
control characters (:func:`kit.files.safe_text.checked_text`).

An import replaces that supplier's whole catalogue in one transaction. Rows are matched to the
generic parts already in the database by their normalised key; rows that match nothing are kept
(so a part registered later finds them) and listed in the report.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from sqlalchemy import delete, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, SUPPLIERS
from catalog_schema.locks import hold
from catalog_schema.refusals import located
from catalog_schema.sql import insert_rows, upsert
from kit.files.numbers import MAX_DAYS, MAX_PACK_QTY, MAX_PRICE, decimal_mark, number, whole_number
from kit.store.parts_store import PART_COLUMNS, KeyReader, part_ids
from kit.files.safe_text import NO_CONTROL, CONTROL
from kit.files.sheets import Table, read_table

SHEET = "catalogue"
COLUMNS = ("supplier_ref", *PART_COLUMNS, "description", "pack_qty", "price", "currency", "lead_time_days")
NOTES = {
    "supplier_ref": "your part number, once per sheet",
    "part_key": "the generic part's key, if you have it (then the part columns may stay empty)",
    "part_kind": "rod_seal, piston_seal, stock_seal, wiper, guide_ring, o_ring, o_ring_cord, vane_strip, filter_element, oil, spare",
    "d": 'inner diameter, a length with a unit, e.g. "280 mm"',
    "D": 'outer diameter, e.g. "300 mm"',
    "L": 'housing length, e.g. "25 mm"',
    "t": "guide strip thickness", "cut": "cut length of a strip or cord", "id": "O-ring inside diameter",
    "cs": "O-ring cross-section", "length": "vane strip length", "h": "vane height",
    "spec": "seal compound (NBR, AU ...), oil grade (HM 46) or element/spare reference, as in the part key",
    "pack_qty": "pieces (or L, m) per pack, a whole number, default 1",
    "price": "price per pack, a number", "currency": "ISO 4217 code, e.g. EUR",
    "lead_time_days": "whole days from order to dispatch",
}
ENTRIES = CATALOGUE_ENTRIES


@dataclass
class CatalogueReport:
    supplier: str
    rows: int
    matched: int
    unmatched: list[tuple[str, str, str]] = field(default_factory=list)  # (where, supplier_ref, part key)


# A checked row: its line, then the values of ENTRY_COLUMNS from supplier_ref on.
Entry = tuple[int, str, str, str | None, int, float | None, str, int | None]
ENTRY_COLUMNS = ("supplier_id", "part_id", "supplier_ref", "part_key", "description", "pack_qty", "price", "currency",
                 "lead_time_days")


def _entries(table: Table, mark_option: str | None = None) -> list[Entry]:
    """Every row checked, as (line, supplier_ref, part_key, description, pack_qty, price,
    currency, lead_time_days); the first bad cell refuses the file. ``mark_option`` is the
    decimal mark the user stated (None: the file's default, see :mod:`kit.files.numbers`)."""
    from kit.files.currencies import currency_code

    mark = decimal_mark(table, mark_option)
    keys = KeyReader(table)
    seen: dict[str, int] = {}
    out: list[Entry] = []
    for row in table.rows:
        v = row.values
        ref = v.get("supplier_ref")
        if ref is None:
            raise table.error(row, "supplier_ref", "the supplier's part number", "an empty cell")
        if not isinstance(ref, str):
            ref = str(int(ref) if isinstance(ref, float) and ref.is_integer() else ref)
        if CONTROL.search(ref):
            raise table.error(row, "supplier_ref", NO_CONTROL, ref)
        if ref in seen:
            raise table.error(row, "supplier_ref", f"each part number once (already on {table.where(seen[ref])})", ref)
        seen[ref] = row.line
        currency = currency_code(table, row, v.get("currency"))
        description = v.get("description")
        if description is not None:
            description = str(description)
            if CONTROL.search(description):
                raise table.error(row, "description", NO_CONTROL, description)
        out.append((row.line, ref, keys.key(row), description,
                    whole_number(table, row, "pack_qty", 1, MAX_PACK_QTY, default=1),
                    number(table, row, "price", mark, maximum=MAX_PRICE), currency,
                    whole_number(table, row, "lead_time_days", 0, MAX_DAYS)))
    return out


@dataclass(frozen=True)
class CatalogueFile:
    """A catalogue file read and checked, ready to write."""

    path: str
    supplier: str
    table: Table
    entries: list[Entry]


def read_catalogue(path: str | Path, supplier: str, decimal: str | None = None) -> CatalogueFile:
    """``supplier``'s catalogue rows in ``path``, every cell checked. ``decimal`` is the decimal
    mark of the file's numbers ("point" or "comma"; None: by the file's kind, see :mod:`kit.files.numbers`).
    ``supplier`` is checked by the caller (:func:`kit.services.imports.import_catalogue`)."""
    table = read_table(path, SHEET, known=COLUMNS, required=("supplier_ref", "currency"))
    return CatalogueFile(str(path), supplier, table, _entries(table, decimal))


def write_catalogue(conn: Connection, catalogue: CatalogueFile) -> CatalogueReport:
    """Replace the supplier's catalogue by the checked rows, in the caller's transaction; report
    what matched no generic part."""
    path, supplier, table, entries = catalogue.path, catalogue.supplier, catalogue.table, catalogue.entries
    hold(conn, "part matching")  # so a register running at once cannot miss these rows (see register_parts)
    located(conn, SUPPLIERS, ["name"], [{"name": supplier}], lambda c, one: c.execute(upsert(c, SUPPLIERS, ["name"]), one),
            lambda _: path, {"name": "supplier name"})
    sid = conn.execute(select(SUPPLIERS.c.id).where(SUPPLIERS.c.name == supplier)).scalar_one()
    known = part_ids(conn)
    report = CatalogueReport(supplier, len(entries), 0)
    rows = []
    for line, ref, key, *rest in entries:
        pid = known.get(key)
        if pid is None:
            report.unmatched.append((table.where(line), ref, key))
        rows.append((sid, pid, ref, key, *rest))
    report.matched = len(rows) - len(report.unmatched)
    conn.execute(delete(ENTRIES).where(ENTRIES.c.supplier_id == sid))
    located(conn, ENTRIES, ENTRY_COLUMNS, rows, lambda c, some: insert_rows(c, ENTRIES, ENTRY_COLUMNS, some),
            lambda i: table.where(entries[i][0]), {"supplier_id": "supplier name", "part_id": "part_key"})
    return report
