# SPDX-License-Identifier: MIT
"""A plain CSV catalogue (:mod:`kit.files.plain_csv`) checked in one pass over its records: the
common case of a 100,000-row import, without a dictionary per row.

The row-by-row check (:func:`kit.files.catalogue_sheet.check_rows`) is the definition of a good
row and words every refusal. This pass gives the same entries for a file it takes: a cell at a
time by column position, each distinct text of the short columns (currency, pack_qty, lead time,
part kind, dimensions, spec, part key) worked out once by the functions that check calls. At the
first cell it does not take as plainly good it stops and gives None, and the caller checks the
file row by row, which words the refusal. tests/test_plain_catalogue.py holds the two to each other.
"""

from __future__ import annotations

from typing import Any, Callable

from kit.errors import InputError
from kit.files.numbers import MAX_CHARS, MAX_DAYS, MAX_PACK_QTY, MAX_PRICE, decimal_mark, number, plain_decimal, whole_number
from kit.files.part_keys import DIMENSIONS, KeyReader, shape_of
from kit.files.plain_csv import PlainCsv
from kit.files.sheets import Row


class _NotPlain(Exception):
    """A cell this pass leaves to the row-by-row check."""


def plain_entries(plain: PlainCsv, mark_option: str | None) -> list | None:
    """The entries :func:`kit.files.catalogue_sheet.check_rows` gives for ``plain``'s rows, or None
    where some cell is not plainly good (the caller then checks row by row). ``mark_option`` as there."""
    try:
        return _entries(plain, mark_option)
    except (_NotPlain, InputError):
        return None


class _Cells:
    """Each distinct field of one column worked out once: ``check(cell, line)`` of its cell (the
    field stripped, empty as None); a refusal there means the row-by-row check words it."""

    def __init__(self, check: Callable[[str | None, int], Any]):
        self._check, self.found = check, {}

    def miss(self, field: str, line: int) -> Any:
        value = self.found[field] = self._check(field.strip() or None, line)
        return value


def _entries(plain: PlainCsv, mark_option: str | None) -> list:
    from kit.files.catalogue_sheet import pack_of
    from kit.files.currencies import codes, currency_code

    table = plain.table()
    mark = decimal_mark(table, mark_option)
    plain_number = plain_decimal(mark.name).fullmatch
    comma = mark.name == "comma"
    records = plain.records
    width = len(plain.header)
    where = {name: i for i, name in enumerate(plain.header)}
    if len(where) < len(_ALL):
        for record in records:  # an empty field at the end stands for every column the file leaves out
            record.append("")
    at = {name: where.get(name, width) for name in _ALL}

    def row(line: int, column: str, cell: str | None) -> Row:
        return Row(line, {column: cell})

    known_codes = codes()
    currencies = _Cells(lambda cell, line: cell if cell in known_codes else currency_code(table, row(line, "currency", cell), cell))
    pack_qtys = _Cells(lambda cell, line: whole_number(table, row(line, "pack_qty", cell), "pack_qty", 1, MAX_PACK_QTY))
    leads = _Cells(lambda cell, line: whole_number(table, row(line, "lead_time_days", cell), "lead_time_days", 0, MAX_DAYS))
    keys = KeyReader(table)
    given_keys = _Cells(lambda cell, line: keys.key(row(line, "part_key", cell)) if cell is not None else None)
    specs = _Cells(lambda cell, line: cell.lower() if cell is not None else None)  # as KeyReader.key, of a stripped cell
    lengths = {name: _Cells(_length_of(keys)) for name in DIMENSIONS}
    kinds = _Cells(lambda cell, line: _Shape(cell, at, lengths))

    i_ref, i_key, i_kind, i_spec = at["supplier_ref"], at["part_key"], at["part_kind"], at["spec"]
    i_desc, i_pack, i_qty, i_price, i_cur, i_lead = (at[n] for n in ("description", "pack", "pack_qty", "price", "currency", "lead_time_days"))
    cur_found, qty_found, lead_found, given_found, spec_found, kind_found = (
        c.found for c in (currencies, pack_qtys, leads, given_keys, specs, kinds))
    seen: set[str] = set()
    out: list[tuple] = []
    append = out.append
    line = 1
    for r in records:
        line += 1
        ref = r[i_ref].strip()
        if not ref or ref in seen:
            raise _NotPlain  # an empty (or blank) row, or a part number again
        seen.add(ref)
        field = r[i_cur]
        currency = cur_found[field] if field in cur_found else currencies.miss(field, line)
        field = r[i_key]
        key = given_found[field] if field in given_found else given_keys.miss(field, line)
        if key is None:
            field = r[i_kind]
            shape = kind_found[field] if field in kind_found else kinds.miss(field, line)
            parts = [shape.kind]
            for i, prefix, column, found in shape.dimensions:
                field = r[i]
                worked = found[field] if field in found else column.miss(field, line)
                parts.append(prefix + worked[1])
            pair = shape.pair
            if pair is not None and pair[1][r[pair[0]]][0] >= pair[3][r[pair[2]]][0]:
                raise _NotPlain  # an inner diameter not smaller than the outer
            field = r[i_spec]
            spec = spec_found[field] if field in spec_found else specs.miss(field, line)
            if spec is not None:
                parts.append(spec)
            elif not shape.dimensions:
                raise _NotPlain  # a kind without dimensions names its part by its spec
            key = ":".join(parts)
        field = r[i_qty]
        qty = qty_found[field] if field in qty_found else pack_qtys.miss(field, line)
        pack = r[i_pack].strip() or None
        if pack is None and key[:3] != "oil":
            quantity, content, label = qty or 1, None, None
        else:
            quantity, content, label = pack_of(table, row(line, "pack", pack), key, qty)
        field = r[i_lead]
        lead = lead_found[field] if field in lead_found else leads.miss(field, line)
        price: float | None = r[i_price].strip() or None
        if price is not None and not (len(price) <= MAX_CHARS and plain_number(price) is not None  # type: ignore[arg-type]
                                      and 0.0 <= (price := float(price.replace(",", ".") if comma else price)) <= MAX_PRICE):  # type: ignore[union-attr]
            price = number(table, row(line, "price", price), "price", mark, maximum=MAX_PRICE)  # type: ignore[arg-type]
        append((line, ref, key, r[i_desc].strip() or None, quantity, price, currency, lead, content, label))
    return out


class _Shape:
    """What a part kind's key is made of here: its name, each dimension as (its field's position,
    its "name=" in the key, its column's cells and those worked out), and the two diameters that
    must be inner and outer as (position, worked out, position, worked out)."""

    def __init__(self, kind: str | None, at: dict[str, int], lengths: dict[str, _Cells]):
        shape = shape_of(kind)
        if shape is None:
            raise _NotPlain  # no part kind: the row-by-row check names the kinds
        names, prefixes, pair = shape
        self.kind = kind
        self.dimensions = tuple((at[name], prefix, lengths[name], lengths[name].found) for name, prefix in zip(names, prefixes))
        self.pair = None
        if pair is not None:
            inner, outer = names[pair[0]], names[pair[1]]
            self.pair = (at[inner], lengths[inner].found, at[outer], lengths[outer].found)


def _length_of(keys: KeyReader) -> Callable[[str | None, int], tuple[float, str]]:
    """A dimension's cell as (mm, as the key writes it), by the key reader's own way."""
    def worked(cell: str | None, line: int) -> tuple[float, str]:
        if cell is None:
            raise _NotPlain  # an empty dimension
        found = keys.length(cell)
        if found.__class__ is str:
            raise _NotPlain  # a length refused
        return found  # type: ignore[return-value]
    return worked


# Every column a catalogue may have, so a missing one reads as an empty field.
_ALL = ("supplier_ref", "part_key", "part_kind", *DIMENSIONS, "spec", "description", "pack", "pack_qty", "price", "currency",
        "lead_time_days")
