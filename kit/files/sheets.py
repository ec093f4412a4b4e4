# SPDX-License-Identifier: MIT
"""Spreadsheets in and out: .xlsx workbooks and .csv files, read safely.

Reading refuses, with one line naming the file, what would be dangerous or is simply not a
table: a file that is not a workbook, XML entity tricks (openpyxl parses through defusedxml,
which is a dependency and is checked here), a workbook whose parts unpack past
:data:`MAX_UNPACKED_BYTES`, more than ``max_rows`` data rows, a duplicated or unknown column.
Writing goes to a temporary file that replaces the target only when complete (:mod:`kit.files.atomic`).
Text that starts with a formula character is written as a string cell in a workbook and with a
leading ``'`` in a CSV (:mod:`kit.files.safe_text`); reading a CSV drops that ``'`` again.
"""

from __future__ import annotations

import csv
import itertools
import zipfile
from dataclasses import dataclass, replace
from pathlib import Path
from typing import Any, Iterable, Sequence

from kit.files.atomic import replace_atomically
from kit.errors import InputError
from kit.files.input_files import PARTICULARS_XLSX, SHEET_CSV, SHEET_XLSX, check_input, open_text
from kit.files.safe_text import csv_field, from_csv_field, is_risky, visible

# Data rows read from one sheet, refused at the first row past the limit. A CSV is read line by
# line; a workbook's rows are counted before it is read (kit.files.xlsx_limits), then read by
# python-calamine (one sheet at a time, held whole but bounded) or openpyxl's read-only reader.
MAX_ROWS = 100_000
MAX_UNPACKED_BYTES = 512 * 1024 * 1024
# Every XML part is streamed before openpyxl reads it (kit.files.xlsx_limits), and a workbook that
# declares or holds more than these is refused: openpyxl's reader would hand out every cell a
# reference, a row number or a used range implies, and keeps the shared strings in a list.
MAX_COLUMNS = 256  # A to IV; also the cells of one row
MAX_CELLS = 5_000_000  # in a workbook, each row counted to its last cell; also a used range's area
MAX_SHARED_STRINGS = 1_000_000
# openpyxl holds a workbook's shared-string table (the text of its cells) whole while the rows
# stream past, so that one part has a tighter limit of its own.
MAX_SHARED_STRINGS_BYTES = 64 * 1024 * 1024
WORKBOOK = "an .xlsx workbook (Office Open XML spreadsheet)"


@dataclass(frozen=True)
class Row:
    line: int  # the row number a spreadsheet program shows (the header is row 1)
    values: dict[str, Any]


@dataclass(frozen=True)
class Table:
    """The data rows of one sheet (or CSV file) under its header row."""

    path: str
    sheet: str | None
    columns: tuple[str, ...]
    rows: list[Row]
    separator: str | None = None  # a CSV's field separator (see :func:`csv_separator`); None for a workbook

    def where(self, line: int | None = None) -> str:
        """``file, sheet S, row N`` (xlsx) or ``file, line N`` (CSV), for error messages."""
        place = self.path if self.sheet is None else f"{self.path}, sheet {self.sheet}"
        if line is None:
            return place
        return f"{place}, {'line' if self.sheet is None else 'row'} {line}"

    def error(self, row: Row | None, column: str, expected: str, got: Any = None) -> InputError:
        shown = None if got is None else repr(got)
        return InputError(self.where(row.line if row else None), f"column {column}", expected, got=shown)


def _clean(value: Any) -> Any:
    if isinstance(value, str):
        value = value.strip()
        return value or None
    return value


def csv_cell(text: str) -> str | None:
    """A CSV field as :func:`_clean` leaves a cell, with a formula-guarding quote dropped
    (:func:`kit.files.safe_text.from_csv_field`); one pass, since a catalogue has millions of fields."""
    text = text.strip()
    if not text:
        return None
    return from_csv_field(text) if text[0] == "'" else text


def _table(path: str, sheet: str | None, lines: Iterable[tuple[int, Sequence[Any]]], known: Sequence[str] | None,
           required: Sequence[str], max_rows: int, clean: bool = False) -> Table:
    """The rows below the header of ``lines``; ``clean`` says the cells are already stripped,
    with empty text as None (CSV fields are, see :func:`csv_cell`)."""
    where = path if sheet is None else f"{path}, sheet {sheet}"
    it = iter(lines)
    header: list[str] = []
    for _, cells in it:
        header = ["" if c is None else str(c).strip() for c in cells]
        if any(header):
            break
    while header and not header[-1]:
        header.pop()
    if not header:
        raise InputError(where, "header row", "a first row naming the columns", got="an empty sheet")
    seen: set[str] = set()
    for name in header:
        if not name:
            raise InputError(where, "header row", "a name above every column", got="an empty header cell")
        if name in seen:
            raise InputError(where, f"column {name}", "each column named once", got="a second column of that name")
        if known is not None and name not in known:
            raise InputError(where, f"column {name}", "one of " + ", ".join(known), got="an unknown column")
        seen.add(name)
    for name in required:
        if name not in seen:
            raise InputError(where, f"column {name}", "this column in the header row", got="no such column")
    rows: list[Row] = []
    append = rows.append
    width = len(header)
    for line, cells in it:
        if cells.__class__ is dict:  # a row the CSV reader keyed by this header itself (see _read_csv)
            if len(rows) >= max_rows:
                raise InputError(where, "rows", f"at most {max_rows:,} data rows", got="more")
            append(Row(line, cells))
            continue
        values = cells if clean else [_clean(c) for c in cells]
        if len(values) != width:  # most rows are as wide as the header: no slices for them
            if any(v is not None for v in values[width:]):
                raise InputError(f"{where}, {'line' if sheet is None else 'row'} {line}", "cells",
                                 f"no values right of the last named column ({header[-1]})", got="a value there")
            values = [*values[:width], *[None] * (width - len(values))]
        if values.count(None) == width:
            continue
        if len(rows) >= max_rows:
            raise InputError(where, "rows", f"at most {max_rows:,} data rows", got="more")
        append(Row(line, dict(zip(header, values))))
    return Table(path, sheet, tuple(header), rows)


def _open_workbook(path: Path) -> "_Book":
    """The workbook at ``path``, every part measured first (:mod:`kit.files.xlsx_limits`), then
    opened with python-calamine, or with openpyxl's read-only reader where calamine would read
    it differently (see :class:`_CalamineBook`)."""
    from defusedxml import DefusedXmlException
    from openpyxl.xml import DEFUSEDXML

    from kit.files.xlsx_limits import Limits, measure_workbook

    source = str(path)
    if not DEFUSEDXML:
        raise InputError(source, "file", "defusedxml installed, so workbooks are parsed safely", got="it is missing")
    if not zipfile.is_zipfile(path):
        raise InputError(source, "file", WORKBOOK, got="a file that is not one")
    try:
        with zipfile.ZipFile(path) as archive:
            # sizes first, from the archive's directory, before anything is decompressed
            unpacked = sum(info.file_size for info in archive.infolist())
            strings = sum(info.file_size for info in archive.infolist() if info.filename.lower().endswith("sharedstrings.xml"))
            if unpacked > MAX_UNPACKED_BYTES:
                raise InputError(source, "file", f"a workbook that unpacks to at most {MAX_UNPACKED_BYTES >> 20} MiB",
                                 got=f"{unpacked >> 20} MiB")
            if strings > MAX_SHARED_STRINGS_BYTES:
                raise InputError(source, "file", f"cell text (shared strings) of at most {MAX_SHARED_STRINGS_BYTES >> 20} MiB unpacked",
                                 got=f"{strings / 2**20:.1f} MiB")
            measures = measure_workbook(source, archive, Limits(rows=_row_scan_limit(), data_rows=MAX_ROWS, columns=MAX_COLUMNS,
                                                                cells=MAX_CELLS, strings=MAX_SHARED_STRINGS))
    except DefusedXmlException as exc:
        raise _refusal(source, exc) from None
    except (zipfile.BadZipFile, OSError) as exc:
        raise InputError(source, "file", WORKBOOK, got=str(exc)) from None
    if measures.area <= MAX_CELLS and not measures.errors and not measures.exact:
        return _CalamineBook(path)
    return _OpenpyxlBook(path)


class _Book:
    """An open workbook: its sheet names, and each sheet's rows as (row number, cells)."""

    source: str
    sheetnames: list[str]

    def lines(self, name: str) -> Iterable[tuple[int, Sequence[Any]]]:
        raise NotImplementedError

    def close(self) -> None:
        raise NotImplementedError


class _OpenpyxlBook(_Book):
    """openpyxl's read-only reader (data only: a formula cell gives the value last calculated, an
    error cell its text such as ``#N/A``): for workbooks the quick measuring did not vouch for,
    whose rectangle is large, or that hold error cells."""

    def __init__(self, path: Path):
        import openpyxl
        from openpyxl.utils.exceptions import InvalidFileException

        self.source = str(path)
        try:
            self.wb = openpyxl.load_workbook(path, read_only=True, data_only=True)
        except (InvalidFileException, zipfile.BadZipFile, KeyError, OSError, ValueError) as exc:
            raise _refusal(self.source, exc) from None
        self.sheetnames = self.wb.sheetnames

    def lines(self, name: str) -> Iterable[tuple[int, Sequence[Any]]]:
        return _safely(self.source, _xlsx_lines(self.wb[name]))

    def close(self) -> None:
        self.wb.close()


# Whole numbers a double holds exactly: a number cell within them that is whole is read as an int.
_EXACT_INTEGERS = 2.0**53


class _CalamineBook(_Book):
    """python-calamine (Rust), about twenty times openpyxl's speed, for a workbook that every part
    of passed the quick measuring. calamine holds a sheet as one rectangle (from its first to its
    last row and column), which the measuring bounded (:attr:`Measures.area`), and reads an error
    cell as an empty one, so a workbook with error cells goes to openpyxl, which reads their text.

    Cells come as openpyxl gives them: text stripped and empty as None, a whole number as an int
    (calamine gives every number as a float; openpyxl an int when the XML writes no decimal
    point), dates and times as calamine reads them (a date cell at midnight as a ``date``).
    """

    def __init__(self, path: Path):
        from python_calamine import CalamineError, CalamineWorkbook

        self.source = str(path)
        self.failure = (CalamineError, ValueError, KeyError, OSError)
        try:
            self.wb = CalamineWorkbook.from_path(str(path))
        except self.failure as exc:
            raise _refusal(self.source, exc) from None
        self.sheetnames = list(self.wb.sheet_names)

    def lines(self, name: str) -> Iterable[tuple[int, Sequence[Any]]]:
        try:
            rows = self.wb.get_sheet_by_name(name).to_python(skip_empty_area=False)
        except self.failure as exc:
            raise _refusal(self.source, exc) from None
        top = _EXACT_INTEGERS
        for line, cells in enumerate(rows, start=1):
            rows[line - 1] = None  # type: ignore[call-overload]  # let each row go once read
            yield line, [(c.strip() or None) if c.__class__ is str else
                         int(c) if c.__class__ is float and c.is_integer() and -top < c < top else c for c in cells]

    def close(self) -> None:
        self.wb.close()


def _row_scan_limit() -> int:
    return 2 * MAX_ROWS + 100  # the data rows, the header and room for blank rows


def _refusal(source: str, exc: BaseException) -> InputError:
    """One line for a workbook openpyxl could not read; entity tricks named as such."""
    from defusedxml import DefusedXmlException

    cause: BaseException | None = exc
    while cause is not None:
        if isinstance(cause, DefusedXmlException):
            return InputError(source, "file", "a workbook without XML entity declarations", got=type(cause).__name__)
        cause = cause.__cause__ or cause.__context__
    first = str(exc).strip().splitlines()[0] if str(exc).strip() else ""
    return InputError(source, "file", WORKBOOK, got=type(exc).__name__ + (f": {first}" if first else ""))


def _xlsx_lines(ws) -> Iterable[tuple[int, Sequence[Any]]]:
    ws.reset_dimensions()  # a used range (<dimension>) smaller than the data would hide rows and columns
    for line, cells in enumerate(ws.iter_rows(values_only=True), start=1):
        yield line, cells


def _safely(path: str, lines: Iterable[tuple[int, Sequence[Any]]]) -> Iterable[tuple[int, Sequence[Any]]]:
    """Sheet XML is parsed lazily; turn a refused entity or broken XML into an input error."""
    from defusedxml import DefusedXmlException

    try:
        yield from lines
    except (DefusedXmlException, SyntaxError, KeyError, ValueError, zipfile.BadZipFile) as exc:
        raise _refusal(path, exc) from None  # ElementTree.ParseError is a SyntaxError


def read_table(path: str | Path, sheet: str, *, known: Sequence[str] | None = None, required: Sequence[str] = (),
               max_rows: int | None = None) -> Table:
    """Read the sheet called ``sheet`` of an .xlsx workbook (or its only sheet), or a .csv file.

    ``known`` lists the columns allowed (None: any), ``required`` those that must be there.
    """
    path = Path(path)
    source = str(path)
    max_rows = MAX_ROWS if max_rows is None else max_rows
    check_input(path, SHEET_CSV if path.suffix.lower() == ".csv" else SHEET_XLSX)
    if path.suffix.lower() == ".csv":
        return _read_csv(path, known, required, max_rows)
    if path.suffix.lower() != ".xlsx":
        raise InputError(source, "file", "a file ending in .xlsx or .csv", got=repr(path.suffix or "no suffix"))
    wb = _open_workbook(path)
    try:
        names = wb.sheetnames
        if sheet in names:
            name = sheet
        elif len(names) == 1:
            name = names[0]
        else:
            raise InputError(source, "sheet", f"a sheet named {sheet!r}", got="sheets " + ", ".join(map(repr, names)))
        return _table(source, name, wb.lines(name), known, required, max_rows, clean=isinstance(wb, _CalamineBook))
    finally:
        wb.close()


def sheet_names(path: str | Path) -> list[str]:
    """The names of a workbook's sheets, the workbook checked as :func:`read_table` checks it."""
    path = Path(path)
    check_input(path, SHEET_XLSX)
    wb = _open_workbook(path)
    try:
        return list(wb.sheetnames)
    finally:
        wb.close()


def read_sheets(path: str | Path) -> dict[str, list[tuple[int, Sequence[Any]]]]:
    """Every sheet of a workbook as raw (row number, cells) lists, for multi-sheet templates."""
    path = Path(path)
    source = str(path)
    check_input(path, PARTICULARS_XLSX)
    wb = _open_workbook(path)
    try:
        found = {}
        for name in wb.sheetnames:
            lines = []
            for line, cells in wb.lines(name):
                if line > MAX_ROWS:
                    raise InputError(f"{source}, sheet {name}", "rows", f"at most {MAX_ROWS:,} rows", got="more")
                lines.append((line, tuple(_clean(c) for c in cells)))
            found[name] = lines
        return found
    finally:
        wb.close()


def _read_csv(path: Path, known: Sequence[str] | None, required: Sequence[str], max_rows: int) -> Table:
    source = str(path)
    handle = open_text(path, SHEET_CSV, encoding="utf-8-sig", newline="")
    with handle:
        head = _leading_lines(source, handle)
        separator = csv_separator(source, head[-1] if head else "")
        reader = csv.reader(itertools.chain(head, handle), delimiter=separator)

        def lines() -> Iterable[tuple[int, Sequence[Any] | dict[str, Any]]]:
            """Each record's cells stripped, empty ones None. Below the header row (the first
            with a name in it, as :func:`_table` takes it), a record as wide as the header and
            with no quote in it comes keyed by the header, and one with nothing in it not at all:
            what :func:`_table` would make of it, in one pass."""
            start = 1
            header: list[str] = []
            width = -1
            try:
                for cells in reader:
                    joined = "".join(cells)
                    if "'" in joined:  # a quote that may guard a formula: the field by field way
                        values = [csv_cell(c) if c else None for c in cells]
                    elif len(cells) == width:
                        if joined.strip():  # (otherwise every cell is blank: no row)
                            yield start, {h: (c.strip() or None) if c else None for h, c in zip(header, cells)}
                        start = reader.line_num + 1
                        continue
                    else:
                        values = [(c.strip() or None) if c else None for c in cells]
                    if width < 0:
                        header = ["" if v is None else str(v).strip() for v in values]  # as _table reads it
                        while header and not header[-1]:
                            header.pop()
                        width = len(header) if header else -1
                    yield start, values
                    start = reader.line_num + 1
            except csv.Error as exc:
                raise InputError(f"{source}, line {reader.line_num}", "cells", "well-formed CSV", got=str(exc)) from None
            except UnicodeDecodeError:
                raise InputError(source, "file", "UTF-8 text", got="undecodable bytes") from None

        return replace(_table(source, None, lines(), known, required, max_rows, clean=True), separator=separator)


# A CSV's field separator: the one of these its header line holds (column names hold none).
SEPARATORS = (",", ";", "\t")


def _leading_lines(source: str, handle) -> list[str]:
    """The lines up to and including the first that is not blank (the header line)."""
    head: list[str] = []
    try:
        for line in handle:
            head.append(line)
            if line.strip():
                break
    except UnicodeDecodeError:
        raise InputError(source, "file", "UTF-8 text", got="undecodable bytes") from None
    return head


def csv_separator(source: str, header: str) -> str:
    """The separator of a CSV whose header line is ``header``: comma, semicolon or tab, whichever
    it holds (a comma when it holds none: one column). Never guessed between two.

    >>> csv_separator("c.csv", "supplier_ref;price;currency"), csv_separator("c.csv", "part_key")
    (';', ',')
    """
    found = [s for s in SEPARATORS if s in header]
    if len(found) > 1:
        names = {",": "commas", ";": "semicolons", "\t": "tabs"}
        raise InputError(f"{source}, line 1", "header row", "column names separated by one of comma, semicolon or tab",
                         got=" and ".join(names[s] for s in found))
    return found[0] if found else ","


# --- writing -------------------------------------------------------------------------------


@dataclass(frozen=True)
class Sheet:
    """A sheet to write: its name, header row, data rows, and a note for each column."""

    name: str
    columns: Sequence[str]
    rows: Sequence[Sequence[Any]] = ()
    notes: dict[str, str] | None = None


def write_sheets(path: str | Path, sheets: Sequence[Sheet], what: str = "Template", paper: str = "a4") -> None:
    """Write an .xlsx with one sheet per :class:`Sheet` plus a ``notes`` sheet explaining columns.

    Printed on ``paper`` ("a4" or "letter") with ``what`` and the date in the page header and
    "page N of M" in the footer: a sheet fitted one page wide where its text stays readable
    (:func:`kit.files.print_setup.fits_width`), else at full size across pages with its first column
    repeated; the notes wrapped in their column, every row as tall as its text."""
    import datetime as dt
    import math
    import textwrap

    from openpyxl import Workbook
    from openpyxl.styles import Alignment, Font
    from openpyxl.utils import get_column_letter

    from kit.files.print_setup import FONT_NAME, fits_width, set_print, use_font

    day = dt.date.today().isoformat()
    wrap = Alignment(wrap_text=True, vertical="top")

    def write(tmp: Path) -> None:
        wb = Workbook()
        use_font(wb)
        wb.remove(wb.active)
        bold = Font(name=FONT_NAME, bold=True)
        notes = []
        for sheet in sheets:
            ws = wb.create_sheet(sheet.name)
            ws.append(list(sheet.columns))
            for cell in ws[1]:
                cell.font = bold
                cell.alignment = wrap
            for row in sheet.rows:
                ws.append([visible(v) for v in row])
                for cell in ws[ws.max_row]:
                    if is_risky(cell.value):
                        cell.data_type = "s"  # user text: never a formula
            ws.freeze_panes = "A2"
            # a heading wraps between its words only (a name such as isolation_valves is one word,
            # never cut): the column as wide as its longest word in bold, at least 10
            widths = [max(10, math.ceil(max(len(w) for w in name.split()) * 1.1) + 2) for name in sheet.columns]
            for i, width in enumerate(widths, start=1):
                ws.column_dimensions[ws.cell(1, i).column_letter].width = width
            ws.row_dimensions[1].height = 13 * max(len(textwrap.wrap(n, w - 2)) or 1 for n, w in zip(sheet.columns, widths)) + 2
            landscape = not fits_width(widths, paper)
            fit = fits_width(widths, paper, landscape)
            set_print(ws, paper=paper, what=what, scope=f"sheet {sheet.name}", day=day, landscape=landscape, fit_width=fit,
                      title_rows="1:1", title_cols=None if fit else "A:A", grid=True,
                      area=f"A1:{get_column_letter(len(widths))}{max(ws.max_row, 2)}")
            notes += [(sheet.name, c, (sheet.notes or {}).get(c, "")) for c in sheet.columns]
        ws = wb.create_sheet("notes")
        ws.append(["sheet", "column", "what to enter"])
        for cell in ws[1]:
            cell.font = bold
        for note in notes:
            ws.append(list(note))
            for cell in ws[ws.max_row]:
                if is_risky(cell.value):
                    cell.data_type = "s"
                cell.alignment = wrap
            lines = max(len(textwrap.wrap(str(visible(note[2])), 72)), len(textwrap.wrap(str(visible(note[1])), 26)), 1)
            ws.row_dimensions[ws.max_row].height = 13 * lines + 2
        ws.column_dimensions["A"].width = 12
        ws.column_dimensions["B"].width = 24
        ws.column_dimensions["C"].width = 60
        set_print(ws, paper=paper, what=what, scope="notes", day=day, title_rows="1:1", area=f"A1:C{ws.max_row}")
        wb.save(tmp)

    replace_atomically(Path(path), write)


def write_csv(path: str | Path, columns: Sequence[str], rows: Iterable[Sequence[Any]] = ()) -> Path:
    """A CSV file: a header row, then the rows, each value made formula-safe; written whole or not at all."""
    def write(tmp: Path) -> None:
        with tmp.open("w", newline="", encoding="utf-8") as f:
            out = csv.writer(f)
            out.writerow(columns)
            out.writerows([csv_field(v) for v in row] for row in rows)

    return replace_atomically(Path(path), write)


def write_sheet(path: str | Path, sheet: Sheet, what: str = "Template", paper: str = "a4") -> None:
    """One table, as .xlsx or .csv by the file's suffix (``what`` and ``paper``: see :func:`write_sheets`)."""
    path = Path(path)
    suffix = path.suffix.lower()
    if suffix == ".csv":
        write_csv(path, sheet.columns, sheet.rows)
    elif suffix == ".xlsx":
        write_sheets(path, [sheet], what, paper)
    else:
        raise InputError(str(path), "output file", "a name ending in .xlsx or .csv", got=repr(path.suffix or "no suffix"))
