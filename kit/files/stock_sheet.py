# SPDX-License-Identifier: MIT
"""A vessel's on-board stock from .xlsx or .csv, read and checked; and the sheet kit writes for it.

Columns (sheet ``stock`` of a workbook, or a CSV file), as :func:`stock_sheet` writes them:

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

The import (:mod:`kit.store.stock_import`): in ``count`` mode each row sets the stock of its part
at its location; in ``adjust`` mode it adds to it, in the database (``quantity = quantity +
change``), so two imports at once both count. Stock that would go below zero is refused, and the database's CHECK refuses it too.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

from catalog_schema.conventions import DEFAULT_LOCATION
from kit.files.dates import iso_date
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


def stock_sheet(rows: list[list]) -> Sheet:
    """The stock sheet to fill in, from rows in :data:`COLUMNS` order
    (:func:`kit.store.stock_import.stock_rows`)."""
    return Sheet(SHEET, COLUMNS, rows, NOTES)
