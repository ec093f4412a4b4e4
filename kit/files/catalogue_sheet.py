# SPDX-License-Identifier: MIT
"""A supplier's catalogue from .xlsx or .csv read and checked, every cell.

One row per supplier part. Columns (sheet ``catalogue`` of a workbook, or a CSV file):

==================  ===========================================================================
``supplier_ref``    the supplier's part number (required, once per file)
``part_kind`` ...   the generic part by kind and dimensions, or ``part_key`` (see
                    :mod:`kit.files.part_keys`)
``description``     the supplier's own text (optional)
``pack``            the pack's content with its unit, in the part's unit of measure: a volume for
                    oil ("20 L", "208 L", "5 US_gal"), pieces for the rest ("10 pcs"); required for
                    oil (see :mod:`kit.files.packs`)
``pack_qty``        pieces per pack for parts counted in pieces, a whole number 1 to 1,000,000
                    (default 1); never for oil, whose pack is a volume
``price``           price per pack, a number 0 to 10**12 (optional)
``currency``        an ISO 4217 alphabetic code (required; see :mod:`kit.files.currencies`)
``lead_time_days``  whole days from order to dispatch, 0 to 3,650 (optional)
==================  ===========================================================================

Numbers are plain decimals in the file's decimal mark (:mod:`kit.files.numbers`); text holds no
control characters (:func:`kit.files.safe_text.checked_text`).

The import (:mod:`kit.store.catalogue_import`) replaces that supplier's whole catalogue in one transaction. Rows are matched to the
generic parts already in the database by their normalised key; rows that match nothing are kept
(so a part registered later finds them) and listed in the report.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from kit.files.numbers import MAX_CHARS, MAX_DAYS, MAX_PACK_QTY, MAX_PRICE, decimal_mark, number, plain_decimal, whole_number
from kit.files.packs import read_pack, uom_of_kind
from kit.files.part_keys import PART_COLUMNS, KeyReader
from kit.files.safe_text import NO_CONTROL, CONTROL
from kit.files.sheets import MAX_ROWS, Table, read_table

SHEET = "catalogue"
COLUMNS = ("supplier_ref", *PART_COLUMNS, "description", "pack", "pack_qty", "price", "currency", "lead_time_days")
REQUIRED = ("supplier_ref", "currency")
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
    "pack": 'one pack with its unit: "20 L", "208 L", "5 US_gal" for oil (required), "10 pcs" for pieces',
    "pack_qty": "pieces per pack (not for oil: use pack), a whole number, default 1",
    "price": "price per pack, a number", "currency": "ISO 4217 code, e.g. EUR",
    "lead_time_days": "whole days from order to dispatch",
}


# A checked row: its line, then the values of ENTRY_COLUMNS from supplier_ref on.
Entry = tuple[int, str, str, str | None, int, float | None, str, int | None, float | None, str | None]
ENTRY_COLUMNS = ("supplier_id", "part_id", "supplier_ref", "part_key", "description", "pack_qty", "price", "currency",
                 "lead_time_days", "pack_content", "pack_label")
OIL_PACK = 'a pack with its volume for oil, e.g. "208 L" (pack_qty counts pieces)'


def _pack(table: Table, row, key: str, pack_qty: int | None) -> tuple[int, float | None, str | None]:
    """(pack_qty, pack_content, pack_label) of a row: the ``pack`` column read in the part's unit
    of measure (:func:`kit.files.packs.read_pack`), or ``pack_qty`` for parts counted in pieces."""
    uom = uom_of_kind(key.split(":", 1)[0])
    text = row.values.get("pack")
    if text is None:
        if uom != "pcs":
            raise table.error(row, "pack", OIL_PACK, "an empty cell" if pack_qty is None else f"pack_qty {pack_qty}")
        return pack_qty or 1, None, None
    if pack_qty is not None:
        raise table.error(row, "pack_qty", "an empty cell when pack is given (one of the two)", pack_qty)
    where = table.where(row.line)
    content, label = read_pack(text if isinstance(text, str) else str(text), uom, where, "column pack")
    return max(1, round(content)), content, label


def pack_of(table: Table, row, key: str, pack_qty: int | None) -> tuple[int, float | None, str | None]:
    """(pack_qty, pack_content, pack_label) of a row naming the part ``key``, its ``pack_qty``
    cell already read (None when empty): pieces with no ``pack`` are counted by ``pack_qty``
    (1 when empty); any other row's ``pack`` is read by :func:`_pack`."""
    if row.values.get("pack") is None and key[:3] != "oil":
        return pack_qty or 1, None, None
    return _pack(table, row, key, pack_qty)


def check_rows(table: Table, mark_option: str | None = None) -> list[Entry]:
    """Every row checked, as (line, supplier_ref, part_key, description, pack_qty, price,
    currency, lead_time_days, pack_content, pack_label); the first bad cell refuses the file. ``mark_option`` is the
    decimal mark the user stated (None: the file's default, see :mod:`kit.files.numbers`).

    The common cells are taken by a short way that gives what the checking functions give (a
    plain part number, currency, whole number or decimal; a part counted in pieces with no
    ``pack``); anything else goes to those functions, which word the refusal."""
    from kit.files.currencies import codes, currency_code

    mark = decimal_mark(table, mark_option)
    plain = plain_decimal(mark.name).fullmatch
    comma = mark.name == "comma"
    keys = KeyReader(table)
    key_of = keys.key
    seen: dict[str, int] = {}
    out: list[Entry] = []
    append = out.append
    known_codes = codes()
    control = CONTROL.search
    error = table.error
    for row in table.rows:
        v = row.values
        ref = v.get("supplier_ref")
        if ref is None:
            raise error(row, "supplier_ref", "the supplier's part number", "an empty cell")
        if ref.__class__ is not str:
            ref = str(int(ref) if isinstance(ref, float) and ref.is_integer() else ref)
        if control(ref):
            raise error(row, "supplier_ref", NO_CONTROL, ref)
        if ref in seen:
            raise error(row, "supplier_ref", f"each part number once (already on {table.where(seen[ref])})", ref)
        seen[ref] = row.line
        currency = v.get("currency")
        if currency.__class__ is not str or currency not in known_codes:
            currency = currency_code(table, row, currency)
        description = v.get("description")
        if description is not None:
            if description.__class__ is not str:
                description = str(description)
            if control(description):
                raise error(row, "description", NO_CONTROL, description)
        key = key_of(row)
        pack = v.get("pack_qty")
        if not (pack.__class__ is str and pack.isascii() and pack.isdigit() and len(pack) < 7
                and 1 <= (pack := int(pack)) <= MAX_PACK_QTY):
            pack = whole_number(table, row, "pack_qty", 1, MAX_PACK_QTY)
        pack_qty, content, label = pack_of(table, row, key, pack)
        lead = v.get("lead_time_days")
        if lead is not None and not (lead.__class__ is str and lead.isascii() and lead.isdigit() and len(lead) < 5
                                     and (lead := int(lead)) <= MAX_DAYS):
            lead = whole_number(table, row, "lead_time_days", 0, MAX_DAYS)
        price = v.get("price")
        if price is not None and not (price.__class__ is str and len(price) <= MAX_CHARS and plain(price) is not None
                                      and 0.0 <= (price := float(price.replace(",", ".") if comma else price)) <= MAX_PRICE):
            price = number(table, row, "price", mark, maximum=MAX_PRICE)
        append((row.line, ref, key, description, pack_qty, price, currency, lead, content, label))
    return out


@dataclass(frozen=True)
class CatalogueFile:
    """A catalogue file read and checked, ready to write."""

    path: str
    supplier: str
    table: Table  # for placing a line in a message; read by column, it holds no rows
    entries: list[Entry]  # each row's line, then the values of ENTRY_COLUMNS from supplier_ref on


def read_catalogue(path: str | Path, supplier: str, decimal: str | None = None) -> CatalogueFile:
    """``supplier``'s catalogue rows in ``path``, every cell checked. ``decimal`` is the decimal
    mark of the file's numbers ("point" or "comma"; None: by the file's kind, see :mod:`kit.files.numbers`).
    ``supplier`` is checked by the caller (:func:`kit.services.imports.import_catalogue`)."""
    if Path(path).suffix.lower() == ".csv":  # the common case first, in one pass (kit.files.plain_catalogue)
        from kit.files.plain_catalogue import plain_entries
        from kit.files.plain_csv import read_plain_csv

        plain = read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS)
        entries = None if plain is None else plain_entries(plain, decimal)
        if plain is not None and entries is not None:
            return CatalogueFile(str(path), supplier, plain.table(), entries)
    table = read_table(path, SHEET, known=COLUMNS, required=REQUIRED)
    return CatalogueFile(str(path), supplier, table, check_rows(table, decimal))
