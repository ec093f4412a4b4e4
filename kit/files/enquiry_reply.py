# SPDX-License-Identifier: MIT
"""A supplier's reply to an enquiry (the workbook :mod:`kit.files.enquiry_workbook` wrote, filled
in), read and checked as a catalogue import checks its rows: every cell, all or nothing, one line
per error naming the file, sheet, row, column and what was expected.

:func:`read_reply` reads the workbook (safely, as every workbook is read: :mod:`kit.files.sheets`)
and finds our enquiry reference on its cover; :func:`check_reply` then holds it against the
enquiry as it was recorded: every line reference must be one of that enquiry's, and the cells we
locked (headings, designation, standard, compound, service conditions, quantity, unit) must be as
we wrote them (the three texts where the enquiry was recorded with them, revision 0010 on). A row whose supplier
cells are all empty was not quoted: it is skipped and listed. A quoted row gives the supplier's
part number, the unit price per pack and the currency (all three required: a quote without a price
would replace the supplier's priced offer for the part), the pack (its content in the
part's unit, :func:`kit.files.packs.read_pack`; a part counted in pieces may leave it empty for
one piece), the lead time in whole days and remarks: one catalogue entry of that supplier.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Sequence

from kit.engine.enquiry import Asked
from kit.errors import InputError
from kit.files.catalogue_sheet import CatalogueFile
from kit.files.enquiry_workbook import COVER, HEADINGS, LINES, REFERENCE, REPLY_COLUMNS, YOUR_NAME
from kit.files.numbers import MAX_DAYS, MAX_PRICE, decimal_mark, number, whole_number
from kit.files.packs import read_pack
from kit.files.safe_text import CONTROL, NO_CONTROL, checked_text
from kit.files.sheets import Row, Table, read_sheets

REF, DESIGNATION, QUANTITY, UOM = "Line ref", "Designation", "Quantity", "UoM"
# The locked text cells beside the designation, and the recorded line's field each was written from.
WRITTEN_TEXT = (("Standard", "standard"), ("Compound", "compound"), ("Service conditions", "service"))
PART_NO, PRICE, CURRENCY, PACK, LEAD, REMARKS = (name for name, _, _ in REPLY_COLUMNS)
LOCKED = "as we wrote it (a locked cell)"


@dataclass(frozen=True)
class ReplyFile:
    """A reply workbook read, not yet held against its enquiry."""

    path: str
    enquiry_id: str
    supplier_name: Any  # the cover's cell for it (an open enquiry), None when empty or absent
    table: Table


@dataclass
class CheckedReply:
    """A reply checked against its enquiry: the supplier's offers, ready to write."""

    catalogue: CatalogueFile
    quoted: int
    skipped: list[str] = field(default_factory=list)  # line references not quoted


def _cover_value(lines: Sequence[tuple[int, Sequence[Any]]], label: str) -> tuple[int, Any] | None:
    for line, cells in lines:
        if cells and cells[0] == label:
            return line, cells[1] if len(cells) > 1 else None
    return None


def read_reply(path: str | Path) -> ReplyFile:
    """The reply workbook ``path``: its enquiry reference and its Lines sheet under the headings we wrote."""
    source = str(path)
    sheets = read_sheets(path)
    for name in (COVER, LINES):
        if name not in sheets:
            raise InputError(source, "sheet", f"a sheet named {name!r}, as in the enquiry kit wrote", got="none")
    found = _cover_value(sheets[COVER], REFERENCE)
    if found is None or found[1] is None:
        raise InputError(f"{source}, sheet {COVER}", REFERENCE, "our enquiry reference, as we wrote it (a locked cell)",
                         got="none")
    enquiry_id = str(found[1])
    name = _cover_value(sheets[COVER], YOUR_NAME)
    lines = sheets[LINES]
    header = list(lines[0][1]) if lines else []
    header += [None] * (len(HEADINGS) - len(header))
    for i, heading in enumerate(HEADINGS):
        if header[i] != heading:
            from openpyxl.utils import get_column_letter

            raise InputError(f"{source}, sheet {LINES}, row 1", f"column {get_column_letter(i + 1)}",
                             f"the heading {heading!r} {LOCKED}", got=repr(header[i]))
    extra = [c for c in header[len(HEADINGS):] if c is not None]
    if extra:
        raise InputError(f"{source}, sheet {LINES}, row 1", "header row", f"no column after {HEADINGS[-1]!r}", got=repr(extra[0]))
    rows = []
    for line, cells in lines[1:]:
        values = dict(zip(HEADINGS, cells))
        if any(v is not None for v in cells[len(HEADINGS):]):
            raise InputError(f"{source}, sheet {LINES}, row {line}", "cells", f"no values right of {HEADINGS[-1]!r}", got="a value there")
        if any(v is not None for v in values.values()):
            rows.append(Row(line, values))
    return ReplyFile(source, enquiry_id, None if name is None else name[1], Table(source, LINES, HEADINGS, rows))


def not_ours(reply: ReplyFile) -> InputError:
    """The refusal of a reply whose enquiry reference is none of this fleet database's."""
    return InputError(f"{reply.path}, sheet {COVER}", REFERENCE,
                      "the reference of an enquiry written from this fleet database (kit enquiry write)",
                      got=repr(reply.enquiry_id))


def _same_number(value: Any, expected: float) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool) and abs(value - expected) <= 1e-9 * max(1.0, abs(expected))


def _supplier(reply: ReplyFile, asked: Asked) -> str:
    if asked.supplier is not None:
        return asked.supplier
    name = reply.supplier_name
    where = f"{reply.path}, sheet {COVER}"
    if not isinstance(name, str) or not name.strip():
        raise InputError(where, YOUR_NAME, "the name of the supplier replying to this open enquiry", got=repr(name))
    return checked_text(name, source=where, field=YOUR_NAME).strip()


def check_reply(reply: ReplyFile, asked: Asked) -> CheckedReply:
    """``reply`` held against the enquiry it answers (see the module docstring); the first bad cell refuses it."""
    from kit.files.currencies import currency_code

    supplier = _supplier(reply, asked)
    table = reply.table
    mark = decimal_mark(table, None)
    seen: dict[str, int] = {}
    part_numbers: dict[str, int] = {}
    entries = []
    skipped = []
    for row in table.rows:
        v = row.values
        ref = v[REF]
        line = asked.lines.get(ref) if isinstance(ref, str) else None
        if line is None:
            raise table.error(row, REF, f"a line reference of enquiry {asked.id} {LOCKED}", ref)
        if ref in seen:
            raise table.error(row, REF, f"each line reference once (already on {table.where(seen[ref])})", ref)
        seen[ref] = row.line
        if v[DESIGNATION] != line.designation:
            raise table.error(row, DESIGNATION, f"{line.designation!r} {LOCKED}", v[DESIGNATION])
        if not _same_number(v[QUANTITY], line.quantity):
            raise table.error(row, QUANTITY, f"{line.quantity:g} {LOCKED}", v[QUANTITY])
        if v[UOM] != line.uom:
            raise table.error(row, UOM, f"{line.uom!r} {LOCKED}", v[UOM])
        for column, name in WRITTEN_TEXT:
            written = getattr(line, name)
            if written is not None and v[column] != (written.strip() or None):  # as the sheet reader leaves a cell
                raise table.error(row, column, f"{written!r} {LOCKED}" if written.strip() else f"an empty cell {LOCKED}", v[column])
        if all(v[name] is None for name, _, _ in REPLY_COLUMNS):
            skipped.append(ref)
            continue
        part_no = v[PART_NO]
        if part_no is None:
            raise table.error(row, PART_NO, "your part number for a line you quote", "an empty cell")
        if not isinstance(part_no, str):
            part_no = str(int(part_no) if isinstance(part_no, float) and part_no.is_integer() else part_no)
        if CONTROL.search(part_no):
            raise table.error(row, PART_NO, NO_CONTROL, part_no)
        if part_no in part_numbers:
            raise table.error(row, PART_NO, f"each part number once (already on {table.where(part_numbers[part_no])})", part_no)
        part_numbers[part_no] = row.line
        try:
            currency = currency_code(table, row, v[CURRENCY])
        except InputError as exc:
            raise table.error(row, CURRENCY, exc.expected, v[CURRENCY]) from None
        pack = v[PACK]
        if pack is None and line.uom != "L":
            pack = f"1 {line.uom}"  # a pack left blank: one piece (oil must say its volume)
        elif isinstance(pack, (int, float)) and not isinstance(pack, bool) and line.uom in ("pcs", "set") \
                and float(pack).is_integer():
            pack = f"{int(pack)} {line.uom}"  # a bare count of pieces, as a supplier may type it
        content, label = read_pack(pack, line.uom, table.where(row.line), f"column {PACK}")
        remarks = v[REMARKS]
        if remarks is not None:
            remarks = str(remarks)
            if CONTROL.search(remarks):
                raise table.error(row, REMARKS, NO_CONTROL, remarks)
        price = number(table, row, PRICE, mark, maximum=MAX_PRICE)
        if price is None:
            raise InputError(table.where(row.line), f"column {PRICE}", "your unit price per your pack for a line you "
                             "quote (a number; a formula's value must be saved with it)", got="an empty cell")
        entries.append((row.line, part_no, line.part_key, remarks, max(1, round(content)), price, currency,
                        whole_number(table, row, LEAD, 0, MAX_DAYS), content, label))
    catalogue = CatalogueFile(reply.path, supplier, table, entries)
    return CheckedReply(catalogue, len(entries), skipped)
