# SPDX-License-Identifier: MIT
"""A workbook's parts measured before openpyxl builds anything from them.

openpyxl's read-only reader believes what a sheet says of itself: a cell at ``XFD1048576``, a row
numbered ``999999999`` or a row of 100,000 empty ``<c/>`` elements makes it hand out billions of
empty cells, and it keeps every shared string (``<si>``) in a list. So every XML part of the
archive is streamed first and the workbook is refused when a part declares or holds more than
:class:`Limits` allows: row elements and row numbers, columns, cells in a row, cells counted the
way openpyxl pads them (each row to its last cell), the used range (``<dimension ref>``), and the
shared strings (``<sst count uniqueCount>`` and the ``<si>`` themselves).

Two readings, one set of counts:

- the quick one, over the bytes, for a part written as spreadsheet programs write it (UTF-8; no
  DTD, comment, CDATA or processing instruction; rows ``<row r="7" ...>`` not inside rows); its
  cell counts are bounds that never fall below openpyxl's, and a bound past a limit is no refusal.
  It is a few C-speed searches per chunk and per row (on the benchmark's 100,000-row catalogue,
  58 MB of sheet XML, about 1.15 s; a search whose endings cannot occur, such as
  ``<si`` in a sheet, is skipped once one search finds none);
- the exact one, through defusedxml's expat parser with a target that keeps only counts (no tree),
  for any part the quick reading cannot vouch for. It follows openpyxl's own rules: every child
  element of a row is a cell, a cell without ``r`` takes the next column.

The quick reading hands a part over at the first thing it is not sure of, so an odd file costs
time, never a count below openpyxl's. Any part may be a sheet (openpyxl finds sheets and the shared strings
through relationships, whatever the part is called), so every part that starts like XML is read.
"""

from __future__ import annotations

import re
import zipfile
from functools import lru_cache
from itertools import repeat
from operator import add, sub
from dataclasses import dataclass, field

from kit.errors import InputError

CHUNK = 1 << 20
# the quick reading holds one row at a time; a longer one is left to the exact reading
MAX_PENDING = 4 << 20
MAX_DEPTH = 1_000  # XML nesting; sheets are a few levels deep
MAIN = "{http://schemas.openxmlformats.org/spreadsheetml/2006/main}"


@dataclass(frozen=True)
class Limits:
    """What one workbook may hold; :mod:`kit.files.sheets` sets the figures (and documents them)."""

    rows: int  # row elements in a sheet, and the highest row number
    data_rows: int  # what the user is told the row limit is for
    columns: int  # highest column, and cells in one row
    cells: int  # cells of the workbook, each row counted to its last cell; also a used range's area
    strings: int  # shared strings


def column_letters(index: int) -> str:
    letters = ""
    while index:
        index, rest = divmod(index - 1, 26)
        letters = chr(65 + rest) + letters
    return letters


def _column(letters: str) -> int:
    index = 0
    for ch in letters.upper():
        index = index * 26 + ord(ch) - 64
    return index


REF = re.compile(r"([A-Za-z]{1,3})([0-9]{1,15})")
RANGE = re.compile(r"([A-Za-z]{1,3})([0-9]{1,15})(?::([A-Za-z]{1,3})([0-9]{1,15}))?")


class _Exact(Exception):
    """The quick reading met something it does not vouch for."""


@dataclass
class _Part:
    """Counts for one part, checked as they grow; the workbook's cells so far come in ``before``."""

    source: str
    part: str
    limits: Limits
    before: int = 0
    rows: int = 0
    number: int = 0  # openpyxl's row counter
    cells: int = 0
    strings: int = 0
    # the sheet's extent (highest row and column any row or cell names) and its error cells, for
    # choosing the reader (see :class:`Measures`); bounds, never below the true figures
    top_row: int = 0
    top_column: int = 0
    errors: int = 0
    exact: bool = False  # measured by the parser (XML the quick reading does not vouch for)
    # for each open row (rows may nest in XML): [cells so far, the last cell's column]
    open_rows: list[list[int]] = field(default_factory=list)

    def where(self) -> str:
        return f"{self.source}, {self.part}"

    def at_row(self) -> str:
        return f"{self.where()}, row {self.number}"

    def row(self, r: str | None) -> None:
        self.count_rows(1)
        if r is None:
            self.number += 1
        elif r.isascii() and r.isdigit() and len(r) <= 15:
            self.number = int(r)
        else:
            raise InputError(self.where(), "row number", 'a whole number (r="7")', got=repr(r[:40]))
        self.check_number(self.number)
        self.top_row = max(self.top_row, self.number)
        self.open_rows.append([0, 0])

    def count_rows(self, count: int) -> None:
        lim = self.limits
        self.rows += count
        if self.rows > lim.rows:
            raise InputError(self.where(), "rows", f"at most {lim.data_rows:,} data rows (and a few blank ones)",
                             got=f"more than {lim.rows:,} rows")

    def check_number(self, number: int) -> None:
        lim = self.limits
        if not 1 <= number <= lim.rows:
            raise InputError(self.where(), "row number", f"1 to {lim.rows:,} (kit reads at most {lim.data_rows:,} data rows)",
                             got=f"row {number:,}")

    def count_cells(self, count: int) -> None:
        state = self.open_rows[-1]
        state[0] += count
        if state[0] > self.limits.columns:
            raise InputError(self.at_row(), "cells", f"at most {self.limits.columns} cells in a row", got="more")

    def cell(self, r: str | None) -> None:
        """One cell, placed as openpyxl places it: at its reference, or next to the last one."""
        self.count_cells(1)
        self.place(r)

    def place(self, r: str | None) -> None:
        state = self.open_rows[-1]
        if r is None:
            state[1] += 1
            self._check_column(state[1], column_letters(state[1]) + str(self.number))
        else:
            state[1] = self.reference(r)
        self.top_column = max(self.top_column, state[1])

    def reference(self, r: str) -> int:
        """The column of cell reference ``r``, refused past the limits."""
        found = REF.fullmatch(r)
        if found is None:
            raise InputError(self.at_row(), "cell reference", "a reference such as B7", got=repr(r[:40]))
        column = _column(found[1])
        self._check_column(column, r)
        if int(found[2]) > self.limits.rows:
            raise InputError(self.at_row(), f"cell {r}", f"a row number of at most {self.limits.rows:,}",
                             got=f"row {int(found[2]):,}")
        self.top_row = max(self.top_row, int(found[2]))
        return column

    def _check_column(self, column: int, ref: str) -> None:
        top = self.limits.columns
        if column > top:
            raise InputError(self.at_row(), f"cell {ref}", f"a column from A to {column_letters(top)} (at most {top})",
                             got=f"column {column:,}")

    def row_end(self) -> None:
        """openpyxl pads a row to its last cell's column, so that many cells count."""
        self.cells += self.open_rows.pop()[1]
        if self.before + self.cells > self.limits.cells:
            raise InputError(self.where(), "cells", f"at most {self.limits.cells:,} cells in the workbook "
                             "(each row counted to its last cell)", got="more")

    def dimension(self, ref: str | None) -> None:
        lim = self.limits
        found = RANGE.fullmatch(ref or "")
        expected = f"a used range within A1:{column_letters(lim.columns)}{lim.rows} of at most {lim.cells:,} cells"
        if found is None:
            raise InputError(self.where(), "dimension", expected, got=repr((ref or "")[:40]))
        first_col, first_row = _column(found[1]), int(found[2])
        last_col, last_row = (_column(found[3]), int(found[4])) if found[3] else (first_col, first_row)
        area = (abs(last_col - first_col) + 1) * (abs(last_row - first_row) + 1)
        if max(first_col, last_col) > lim.columns or max(first_row, last_row) > lim.rows or area > lim.cells:
            raise InputError(self.where(), "dimension", expected, got=repr(ref))

    def table(self, attributes: dict[str, str]) -> None:
        """``<sst count= uniqueCount=>``: the strings declared, and the cells said to use them."""
        for name, limit in (("uniqueCount", self.limits.strings), ("count", self.limits.cells)):
            value = attributes.get(name)
            if value is None:
                continue
            if not (value.isascii() and value.isdigit()) or len(value) > 15 or int(value) > limit:
                raise InputError(self.where(), f"shared strings {name}", f"a whole number of at most {limit:,}",
                                 got=repr(value[:40]))

    def string(self, count: int = 1) -> None:
        self.strings += count
        if self.strings > self.limits.strings:
            raise InputError(self.where(), "shared strings", f"at most {self.limits.strings:,} strings", got="more")


# --- the exact reading ----------------------------------------------------------------------


class _Counter:
    """An expat target (no tree): every child element of a row is a cell, as openpyxl reads it."""

    def __init__(self, tally: _Part):
        self.tally = tally
        self.stack: list[bool] = []  # for each open element: is it a row?

    def start(self, tag: str, attrib: dict[str, str]) -> None:
        tally = self.tally
        if self.stack and self.stack[-1]:
            tally.cell(attrib.get("r"))
            if attrib.get("t") == "e":
                tally.errors += 1
        is_row = tag == MAIN + "row"
        if is_row:
            tally.row(attrib.get("r"))
        elif tag == MAIN + "dimension":
            tally.dimension(attrib.get("ref"))
        elif tag == MAIN + "sst":
            tally.table(attrib)
        elif tag == MAIN + "si":
            tally.string()
        if len(self.stack) >= MAX_DEPTH:
            raise InputError(tally.where(), "XML", f"elements nested at most {MAX_DEPTH:,} deep", got="deeper")
        self.stack.append(is_row)

    def end(self, tag: str) -> None:
        if self.stack.pop():
            self.tally.row_end()

    def close(self) -> None:
        return None


def _exactly(tally: _Part, stream) -> None:
    """Count through defusedxml's parser. XML it cannot parse is left to openpyxl, which refuses
    it when it reads that part; the counts up to that point have been checked."""
    from xml.etree.ElementTree import ParseError

    from defusedxml.ElementTree import DefusedXMLParser

    tally.exact = True
    parser = DefusedXMLParser(target=_Counter(tally))
    try:
        while chunk := stream.read(CHUNK):
            parser.feed(chunk)
        parser.close()
    except ParseError:
        return


# --- the quick reading ----------------------------------------------------------------------

_ATTRS = rb"""(?:\s+[^\s=/<>]+\s*=\s*(?:"[^"<]*"|'[^'<]*'))*+"""
TAG = re.compile(rb"<([^\s/<>!?]+)(" + _ATTRS + rb")\s*(/?)>")
ATTR = re.compile(rb"""([^\s=/<>]+)\s*=\s*(?:"([^"<]*)"|'([^'<]*)')""")
DIMENSION = re.compile(rb"<dimension[\s/>]")
TABLE = re.compile(rb"<sst[\s/>]")
ROW_START = re.compile(rb"<row(?=[\s/>])")
ROW_NUMBER = re.compile(rb'<row r="([0-9]{1,15})"')
CELL = b'<c r="'
CELL_ENDS = (b" ", b">", b"/", b"\t", b"\n", b"\r")  # what may follow the name of a <c> element
SPACED_R = (b'\tr="', b'\nr="', b'\rr="')
XML_DECLARATION = re.compile(rb"<\?xml\s[^<>]*\?>")
ENCODING = re.compile(rb"""encoding\s*=\s*["']([^"']*)["']""")
QUICK_ENCODINGS = {b"utf-8", b"utf8", b"us-ascii", b"ascii"}
OVERLAP = 64  # bytes of the previous chunk searched again, for a marker cut in two


def _greater(number: int) -> bytes:
    """A pattern of the decimal numbers greater than ``number`` (leading zeros count as greater)."""
    digits = str(number)
    found = [rb"[0-9]{%d,}" % (len(digits) + 1)]
    for i, digit in enumerate(digits):
        if digit != "9":
            rest = len(digits) - i - 1
            found.append(digits[:i].encode() + b"[%d-9]" % (int(digit) + 1) + (b"[0-9]{%d}" % rest if rest else b""))
    return b"(?:" + b"|".join(found) + b")"


@lru_cache(maxsize=64)
def _past(row: int, column: int) -> re.Pattern[bytes]:
    """A cell reference ``<c r="...`` past ``row`` or past ``column`` (references of three letters
    and more are checked one by one by the quick reading, so two letters at most here)."""
    letters = column_letters(column) if column else ""
    later = []  # letters after those of ``column``, with as many of them
    if len(letters) == 1:
        later = [b"[A-Z]{2}"] + ([b"[%c-Z]" % (ord(letters) + 1)] if letters != "Z" else [])
    elif len(letters) == 2:
        later = ([b"[%c-Z][A-Z]" % (ord(letters[0]) + 1)] if letters[0] != "Z" else []) + \
                ([letters[0].encode() + b"[%c-Z]" % (ord(letters[1]) + 1)] if letters[1] != "Z" else [])
    elif not letters:
        later = [b"[A-Z]{1,2}"]
    columns = b"(?:[A-Z]{3,}|" + b"|".join(later) + b")[0-9]" if later else b"[A-Z]{3,}"
    return re.compile(b'<c r="(?:' + columns + b"|[A-Z]+" + _greater(row) + b'")')


def _attributes(raw: bytes) -> dict[str, str]:
    found = {}
    for name, double, single in ATTR.findall(raw):
        value = double or single
        if b"&" in value:
            raise _Exact  # a character reference: let the parser decode it
        found[name.decode("ascii", "replace")] = value.decode("utf-8", "replace")
    return found


class _Quick:
    """Rows, cells and strings of a part counted over its bytes, with C-speed searches only.

    Without comments, CDATA, processing instructions or namespace tricks every ``<`` opens or
    closes an element, so the elements a row holds are its ``<`` less its ``</``: a bound on its
    cells. Without whitespace or a quote other than ``"`` around any ``=``, every reference is
    spelt ``r="...`` after a space, so the long ones (the only ones that can pass a limit) are
    found by one search. A row is counted to its last ``<c r="`` plus every element it holds that
    is not a ``<c r="``, so the quick count never falls below openpyxl's. A bound past a limit, or
    anything else the quick reading does not follow, hands the part to the exact reading.
    """

    def __init__(self, tally: _Part, stream, first: bytes):
        self.tally, self.stream = tally, stream
        self.first = first
        self.root_end = 0
        lim = tally.limits
        top = column_letters(lim.columns)
        self.columns = {}  # the two bytes after '<c r="' -> the column, up to the limit
        for index in range(1, lim.columns + 1):
            letters = column_letters(index).encode()
            for key in ([letters + bytes([d]) for d in b"0123456789"] if len(letters) == 1 else [letters]):
                self.columns[key] = index
        # references with as many letters as the last column, or as many digits as the last row
        self.long_refs = re.compile(rb' r="(?![A-Z]{0,%d}[0-9]{1,%d}")([^"]*)"' % (len(top) - 1, len(str(lim.rows)) - 1))

    def _vouch(self, data: bytes, at: int) -> None:
        """``data`` starts at offset ``at`` of the part, past the XML declaration."""
        if b"<!" in data or b"<?" in data or data.find(b"xmlns", max(0, self.root_end - at)) != -1:
            raise _Exact

    def run(self) -> None:
        data = self.first[3:] if self.first.startswith(b"\xef\xbb\xbf") else self.first
        declaration = XML_DECLARATION.match(data)
        body = declaration.end() if declaration else 0
        if declaration:
            encoding = ENCODING.search(declaration.group())
            if encoding and encoding[1].lower() not in QUICK_ENCODINGS:
                raise _Exact
        root = TAG.search(data, body)
        if root is None:
            raise _Exact
        self.root_end = root.end()
        for name, value in _attributes(root[2]).items():
            if name.startswith("xmlns:") and value == MAIN[1:-1]:
                raise _Exact  # rows may be spelt <x:row>
        self._vouch(data[body:], body)
        pending, read, tail = data, len(data), data[-OVERLAP:]
        while True:
            chunk = self.stream.read(CHUNK)
            if chunk:
                self._vouch(tail + chunk, read - len(tail))
                read += len(chunk)
                tail = chunk[-OVERLAP:]
                pending += chunk
                cut = pending.rfind(b"<row")
                if cut <= 0 and not pending.startswith(b"<row"):
                    cut = pending.rfind(b"<")  # no row here: any tag is a place to cut
                if cut <= 0:
                    if len(pending) > MAX_PENDING:
                        raise _Exact  # one row of megabytes
                    continue
                region, pending = pending[:cut], pending[cut:]
            else:
                region, pending = pending, b""
            self._region(region)
            if not chunk:
                return

    def _region(self, region: bytes) -> None:
        """Whole rows (and what lies between them), one C-speed pass per figure."""
        tally, lim = self.tally, self.tally.limits
        for pattern, check in ((DIMENSION, lambda a: tally.dimension(a.get("ref"))), (TABLE, tally.table)):
            for found in pattern.finditer(region):
                tag = TAG.match(region, found.start())
                if tag is None:
                    raise _Exact
                check(_attributes(tag[2]))
        # a sheet holds no "<si" at all: one search instead of one per ending
        tally.string(region.count(b"<si") and sum(region.count(b"<si" + end) for end in (b">", b" ", b"/", b"\t", b"\n", b"\r")))
        begin = ROW_START.search(region)
        if begin is None:
            return
        at = begin.start()
        if region.count(b"=", at) != region.count(b'="', at) or any(region.find(r, at) != -1 for r in SPACED_R):
            raise _Exact
        rows = ROW_START.split(region[at:])[1:]  # each starts just after "<row"
        numbers = ROW_NUMBER.findall(region, at)
        if len(numbers) != len(rows):
            raise _Exact  # a row without r="..." first: numbered by counting, which the parser does
        tally.count_rows(len(rows))
        for number in (min(map(int, numbers)), max(map(int, numbers))):
            tally.check_number(number)
        for found in self.long_refs.finditer(region, at):  # the only references that can pass a limit
            row = ROW_NUMBER.match(region, region.rfind(b'<row r="', 0, found.start()))
            tally.number = int(row[1]) if row else 0
            value = found[1].decode()
            tally.check_number(int(value)) if value.isdigit() and len(value) <= 15 else tally.reference(value)
        ends = list(map(bytes.count, rows, repeat(b"</row>")))
        if region.count(b"</row") != sum(ends) + region.count(b"</rowBreaks"):
            raise _Exact  # an end tag spelt another way
        for i in [i for i, n in enumerate(ends) if n != 1]:  # an empty row <row r="7"/>, or rows in rows
            if ends[i] or not rows[i][:rows[i].find(b">") + 1].endswith(b"/>"):
                raise _Exact
        # bounds, not counts: past a limit, the exact reading decides
        elements = list(map(sub, map(bytes.count, rows, repeat(b"<")), map(bytes.count, rows, repeat(b"</"))))
        cells = list(map(bytes.count, rows, repeat(CELL)))
        keys = [row[p + 6:p + 8] for row, p in zip(rows, map(bytes.rfind, rows, repeat(CELL)))]
        widths = list(map(self.columns.get, keys, repeat(0)))
        if any(n and not w for n, w in zip(cells, widths)):
            raise _Exact
        # a row is padded to its last cell; an element without a reference may take the next column
        bounds = list(map(add, widths, map(sub, elements, cells)))
        if max(elements) > lim.columns or max(bounds) > lim.columns:
            raise _Exact
        total = sum(bounds)
        if tally.before + tally.cells + total > lim.cells:
            raise _Exact
        tally.cells += total
        self._extent(region, at, max(map(int, numbers)), max(widths), sum(cells))

    def _extent(self, region: bytes, at: int, last_row: int, last_column: int, cells: int) -> None:
        """The highest row and column named in ``region`` (from ``at``, holding ``cells`` '<c r="'), and its error cells. Every
        cell is checked against its row's number and the last cell's column by one search for a
        reference past them; a cell without a reference, or one past them, makes the extent the
        whole of the limits (bounds, not counts: never below the true extent)."""
        tally, lim = self.tally, self.tally.limits
        tally.errors += region.count(b'="e"', at)  # t="e", or any attribute of that value
        row, column = max(tally.top_row, last_row), max(tally.top_column, last_column)
        # every <c> has a reference (``cells`` counts the '<c r="' from ``at``, row by row): where
        # every "<c" opens one, one search tells it
        unreferenced = region.count(b"<c", at) != cells and sum(region.count(b"<c" + end, at) for end in CELL_ENDS) != cells
        if unreferenced or _past(row, column).search(region, at):
            row, column = lim.rows, lim.columns
        tally.top_row, tally.top_column = row, column


def measure_part(source: str, archive: zipfile.ZipFile, part: str, limits: Limits, before: int) -> _Part:
    """Refuse ``part`` if it passes ``limits``; return its counts (``cells`` is what it adds to the workbook's)."""
    tally = _Part(source, part, limits, before)
    with archive.open(part) as stream:
        first = stream.read(CHUNK)
        if first.startswith((b"\xff\xfe", b"\xfe\xff")) or b"\x00" in first[:4]:
            _exactly(tally, _Prepend(first, stream))  # UTF-16 or wider: the parser decodes it
            return tally
        if first.lstrip(b"\xef\xbb\xbf \t\r\n")[:1] != b"<":
            return tally  # not XML: no reader can read it as a sheet or string table either
        try:
            _Quick(tally, stream, first).run()
            return tally
        except _Exact:
            pass
    tally = _Part(source, part, limits, before)
    with archive.open(part) as stream:
        _exactly(tally, stream)
    return tally


class _Prepend:
    """A stream whose first chunk has already been read."""

    def __init__(self, first: bytes, stream):
        self.first, self.stream = first, stream

    def read(self, size: int) -> bytes:
        if self.first:
            out, self.first = self.first, b""
            return out
        return self.stream.read(size)


@dataclass(frozen=True)
class Measures:
    """What the measuring found in a workbook that passed: ``area``, the cells of every part's
    rectangle from A1 to its highest row and column (what a reader that holds a sheet as one
    rectangle allocates, at most); ``errors``, cells holding an error value (``t="e"``); ``exact``,
    whether any part was XML the quick reading does not vouch for (read by the parser)."""

    area: int
    errors: int
    exact: bool


def measure_workbook(source: str, archive: zipfile.ZipFile, limits: Limits) -> Measures:
    """Every part of the archive, measured; the cells are counted over the whole workbook."""
    cells = area = errors = 0
    exact = False
    for info in archive.infolist():
        if not info.is_dir():
            tally = measure_part(source, archive, info.filename, limits, cells)
            cells += tally.cells
            area += tally.top_row * tally.top_column
            errors += tally.errors
            exact = exact or tally.exact
    return Measures(area, errors, exact)
