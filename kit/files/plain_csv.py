# SPDX-License-Identifier: MIT
"""A plain CSV read whole, for an import of 100,000 rows to check in one pass over the csv
module's records, with no per-row dictionary.

Only the plain case is read this way (:func:`read_plain_csv`): the header on the first line,
naming each column once and only columns the caller knows; below it records of one line each,
every one as wide as the header; no control character but the line ends (and no quoted field in
a tab-separated file, where a tab could hide in one); and no field that may start with a
formula-guarding quote. Any other file, and any file the row-by-row reader would refuse, gives
None: the caller then reads it with :func:`kit.files.sheets.read_table`, which reads every CSV
and words every refusal.

In a plain file a field's cell, as that reader makes it (:func:`kit.files.sheets.csv_cell`), is
the field stripped, empty as None: no field starts with a quote, so there is none to drop. A
record whose every field is blank is no row to that reader (it drops it and counts on): it is
kept here, and a caller that takes a blank field in a column every row fills as a reason to read
row by row never meets one. tests/test_plain_csv.py holds both readers to each other.
"""

from __future__ import annotations

import csv
import io
import re
from dataclasses import dataclass
from pathlib import Path
from typing import Sequence

from kit.errors import InputError
from kit.files.input_files import SHEET_CSV, read_bytes
from kit.files.sheets import Table, csv_cell, csv_separator

# Control characters the row-by-row checks refuse in any cell (kit.engine.text_checks.CONTROL),
# found in the file's UTF-8 bytes (the lone surrogates there cannot be decoded from UTF-8): C0 and
# DEL as single bytes, less the line ends, which end records here (a field holding one spans
# lines: not plain), and the tab of a tab-separated file without quoted fields; C1 as C2 80 to C2 9F.
_C0 = bytes([*range(0x00, 0x0A), 0x0B, 0x0C, *range(0x0E, 0x20), 0x7F])
_C0_BUT_TAB = _C0.replace(b"\t", b"")
_C1 = re.compile(rb"\xc2[\x80-\x9f]")


def _may_guard(text: str, separator: str) -> bool:
    """True if a quote may start a field of ``text`` (after the start, a line end, the separator or
    an opening double quote, and any space): such a field may be guarded against formulas, and its
    cell is not the stripped field. A quote inside a quoted text may count too: that file is
    simply read row by row."""
    starts = "\n\r" + separator + '"'
    at = text.find("'")
    while at >= 0:
        before = at - 1
        while before >= 0 and text[before] not in starts and text[before].isspace():  # a tab may be the separator
            before -= 1
        if before < 0 or text[before] in starts:
            return True
        at = text.find("'", at + 1)
    return False


@dataclass(frozen=True)
class PlainCsv:
    """A plain CSV's header and data records, record ``i`` on line ``i + 2`` of the file."""

    path: str
    separator: str
    header: tuple[str, ...]
    records: list[list[str]]  # each ends in one empty field more when the header lacks a known column

    def position(self, name: str) -> int:
        """Where a record holds the field of column ``name``: for a known column the file lacks,
        the empty field after the header's."""
        return self.header.index(name) if name in self.header else len(self.header)

    def table(self) -> Table:
        """The file as a :class:`kit.files.sheets.Table` for placing a line in a message; it holds
        no rows (they are the records)."""
        return Table(self.path, None, self.header, [], self.separator)


def read_plain_csv(path: str | Path, *, known: Sequence[str], required: Sequence[str], max_rows: int) -> PlainCsv | None:
    """The plain CSV at ``path`` (see the module's docstring), or None: not plain, or refused by
    the row-by-row reader (which the caller then runs, to word the refusal)."""
    try:
        return _read(Path(path), known, required, max_rows)
    except (InputError, csv.Error, UnicodeDecodeError):
        return None


def _read(path: Path, known: Sequence[str], required: Sequence[str], max_rows: int) -> PlainCsv | None:
    source = str(path)
    data = read_bytes(path, SHEET_CSV)  # at most SHEET_CSV's size, read in one go
    text = data.decode("utf-8-sig")
    first = text[:text.find("\n") + 1] if "\n" in text else text
    if not first.strip() or text.count("\n") > max_rows + 1:
        return None  # blank lines above the header (skipped row by row), or too many lines to be in bounds
    separator = csv_separator(source, first)
    c0 = _C0_BUT_TAB if separator == "\t" and b'"' not in data else _C0
    if len(data.translate(None, c0)) != len(data) or _C1.search(data) or _may_guard(text, separator):
        return None
    reader = csv.reader(io.StringIO(text, newline=""), delimiter=separator)
    records = list(reader)
    if reader.line_num != len(records) or not records or len(records) - 1 > max_rows:
        return None  # a record over more than one line (its line would need counting), or too many rows
    header = tuple(csv_cell(field) for field in records[0])
    width = len(header)
    names = set(header)
    if None in names or len(names) != width or not names <= set(known) or not set(required) <= names:
        return None
    body = records[1:]
    if body and set(map(len, body)) != {width}:
        return None  # a short, long or empty record
    if names != set(known):
        for record in body:
            record.append("")
    return PlainCsv(source, separator, header, body)  # type: ignore[arg-type]  (no None in header)
