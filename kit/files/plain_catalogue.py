# SPDX-License-Identifier: MIT
"""A plain CSV catalogue (:mod:`kit.files.plain_csv`) checked in one pass over its records: the
common case of a 100,000-row import, without a dictionary per row.

The row-by-row check (:func:`kit.files.catalogue_sheet.check_rows`) is the definition of a good
row and words every refusal. This pass gives the same entries for a file it takes: a cell at a
time by column position, each distinct field of a column (currency, pack_qty, lead time, price,
part kind, dimensions, spec, part key, description, pack) worked out once, on first sight, by the
functions that check calls; only the part number is new on every row. At the
first cell it does not take as plainly good it stops and gives None, and the caller checks the
file row by row, which words the refusal. tests/test_plain_catalogue.py holds the two to each other.
"""

from __future__ import annotations

from operator import itemgetter
from typing import Any, Callable

from kit.errors import InputError
from kit.files.catalogue_sheet import COLUMNS, pack_of
from kit.files.numbers import MAX_CHARS, MAX_DAYS, MAX_PACK_QTY, MAX_PRICE, decimal_mark, number, plain_decimal, whole_number
from kit.files.part_keys import KeyReader, shape_of
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


class _Cells(dict):
    """Each distinct field of one column worked out once, on first sight: ``check(cell)`` of its
    cell (the field stripped, empty as None). A refusal there stops this pass; the row-by-row
    check then words it, so the row these checks are shown is a placeholder."""

    def __init__(self, check: Callable[[str | None], Any]):
        super().__init__()
        self._check = check

    def __missing__(self, field: str) -> Any:
        value = self[field] = self._check(field.strip() or None)
        return value


def _entries(plain: PlainCsv, mark_option: str | None) -> list:
    from kit.files.currencies import codes, currency_code

    table = plain.table()
    mark = decimal_mark(table, mark_option)
    plain_number = plain_decimal(mark.name).fullmatch
    comma = mark.name == "comma"
    records = plain.records
    at = {name: plain.position(name) for name in COLUMNS}

    def row(column: str, cell: str | None, line: int = 0) -> Row:
        return Row(line, {column: cell})

    def price_of(cell: str | None) -> float | None:
        if cell is None:
            return None
        if len(cell) <= MAX_CHARS and plain_number(cell) is not None:  # the row-by-row check's own short way
            value = float(cell.replace(",", ".") if comma else cell)
            if 0.0 <= value <= MAX_PRICE:
                return value
        return number(table, row("price", cell), "price", mark, maximum=MAX_PRICE)

    known_codes = codes()
    keys = KeyReader(table)
    currencies = _Cells(lambda cell: cell if cell in known_codes else currency_code(table, row("currency", cell), cell))
    pack_qtys = _Cells(lambda cell: whole_number(table, row("pack_qty", cell), "pack_qty", 1, MAX_PACK_QTY))
    leads = _Cells(lambda cell: whole_number(table, row("lead_time_days", cell), "lead_time_days", 0, MAX_DAYS))
    prices = _Cells(price_of)
    given_keys = _Cells(lambda cell: keys.key(row("part_key", cell)) if cell is not None else None)
    specs = _Cells(lambda cell: cell.lower() if cell is not None else None)  # as KeyReader.key makes a stripped cell
    cells = _Cells(lambda cell: cell)  # descriptions and packs: the stripped text, or None
    kinds = _Cells(lambda cell: _Shape(cell, at))
    lengths = _Lengths(keys)  # one for every dimension column: a text is read alike in each
    mm = lengths.mm

    i_ref, i_key, i_kind, i_spec = at["supplier_ref"], at["part_key"], at["part_kind"], at["spec"]
    i_desc, i_pack, i_qty, i_price, i_cur, i_lead = (at[n] for n in ("description", "pack", "pack_qty", "price", "currency", "lead_time_days"))
    refs: set[str] = set()
    add_ref = refs.add
    out: list[tuple] = []
    append = out.append
    for line, r in enumerate(records, 2):
        ref = r[i_ref].strip()
        if not ref:
            raise _NotPlain  # an empty (or blank) row
        add_ref(ref)
        key = given_keys[r[i_key]]
        if key is None:
            shape = kinds[r[i_kind]]
            key = shape.template.format(*map(lengths.__getitem__, shape.fields(r)))
            pair = shape.pair
            if pair is not None and mm[r[pair[0]]] >= mm[r[pair[1]]]:
                raise _NotPlain  # an inner diameter not smaller than the outer
            spec = specs[r[i_spec]]
            if spec is not None:
                key = f"{key}:{spec}"
            elif not shape.dimensioned:
                raise _NotPlain  # a kind without dimensions names its part by its spec
        qty = pack_qtys[r[i_qty]]
        pack = cells[r[i_pack]]
        if pack is None and key[:3] != "oil":
            quantity, content, label = qty or 1, None, None
        else:
            quantity, content, label = pack_of(table, row("pack", pack, line), key, qty)
        append((line, ref, key, cells[r[i_desc]], quantity, prices[r[i_price]], currencies[r[i_cur]], leads[r[i_lead]], content, label))
    if len(refs) != len(out):
        raise _NotPlain  # a part number twice
    return out


class _Shape:
    """What a part kind's key is made of here: a function giving the fields of its dimensions, the
    key as a template of their numbers as the key writes them ("rod_seal:d={}:D={}:L={}"; the
    spec, if any, follows), and the positions of the two diameters that must be inner and outer."""

    def __init__(self, kind: str | None, at: dict[str, int]):
        shape = shape_of(kind)
        if shape is None:
            raise _NotPlain  # no part kind: the row-by-row check names the kinds
        names, prefixes, pair = shape
        positions = tuple(at[name] for name in names)
        self.dimensioned = bool(names)
        self.fields: Callable[[list[str]], tuple[str, ...]]
        if len(names) > 1:
            self.fields = itemgetter(*positions)
        elif names:
            self.fields = lambda r, i=positions[0]: (r[i],)
        else:
            self.fields = lambda r: ()
        self.template = ":".join([str(kind), *(prefix + "{}" for prefix in prefixes)])
        self.pair = None if pair is None else (positions[pair[0]], positions[pair[1]])


class _Lengths(dict):
    """The dimension columns' distinct fields, each worked out once by the key reader's own way
    (:meth:`kit.files.part_keys.KeyReader.length`) whatever its column: the mm as the key writes
    them, and in ``mm`` the mm themselves."""

    def __init__(self, keys: KeyReader):
        super().__init__()
        self._keys = keys
        self.mm: dict[str, float] = {}

    def __missing__(self, field: str) -> str:
        cell = field.strip()
        if not cell:
            raise _NotPlain  # an empty dimension
        worked = self._keys.length(cell)
        if worked.__class__ is str:
            raise _NotPlain  # a length refused
        self.mm[field], self[field] = worked  # type: ignore[misc]
        return worked[1]
