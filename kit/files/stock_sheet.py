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

The count sheet :func:`write_count_sheet` writes for one vessel (``kit template stock --vessel``)
holds the same sheet with more columns: ``uom`` (unit of measure), ``needed`` (for the voyage),
``on_board`` and ``as_of`` (what the database last had, and its count date), not read back;
``counted``, what was counted, in place of ``quantity`` (a blank cell: not counted, reported and
left as it was); and ``vessel``, the vessel it was made for, which the import checks. The key
columns ``part_key`` and ``vessel`` stand right of the print area. Its sheet ``filter_hours``
lists the vessel's filter positions (``unit``, ``position``, the ``element``, the maker's
``interval_h``, the hours last recorded and their date: ``hours_last``, ``last_on``) with ``hours_since_change`` to fill in
(a blank cell: not read) and ``counted_on``; a blank ``counted_on`` in a count sheet is the day
of the import.

Numbers are plain decimals in the file's decimal mark (:mod:`kit.files.numbers`), dates ISO 8601
calendar dates (:mod:`kit.files.dates`); a location holds no control characters.

The import (:mod:`kit.store.stock_import`): in ``count`` mode each row sets the stock of its part
at its location; in ``adjust`` mode it adds to it, in the database (``quantity = quantity +
change``), so two imports at once both count. Stock that would go below zero is refused, and the database's CHECK refuses it too.
"""

from __future__ import annotations

import datetime as dt
import math
from dataclasses import dataclass, field
from pathlib import Path

from typing import Any, Mapping, Sequence

from catalog_schema.conventions import DEFAULT_LOCATION
from kit.errors import InputError
from kit.files.dates import iso_date
from kit.files.numbers import MAX_CHARS, MAX_QUANTITY, DecimalMark, decimal_mark, number, parse_decimal
from kit.files.safe_text import CONTROL, NO_CONTROL, is_risky, visible
from kit.files.sheets import Row, Sheet, Table, read_table, sheet_names

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
# The count sheet of one vessel: printed columns first, then the keys the import reads.
COUNT_COLUMNS = ("designation", "uom", "location", "needed", "on_board", "as_of", "counted", "counted_on", "part_key", "vessel")
PRINTED = 8  # columns A to H
KNOWN = COLUMNS + tuple(c for c in COUNT_COLUMNS if c not in COLUMNS)  # what an import reads or passes over
FILTER_SHEET = "filter_hours"
FILTER_COLUMNS = ("unit", "position", "element", "interval_h", "hours_last", "last_on",
                  "hours_since_change", "counted_on", "vessel")
FILTER_PRINTED = 8
FONT = "Arial"  # 10 pt on the sheet; a spreadsheet program shows Liberation Sans or Arial
LINE_POINTS = 12.75  # a line of 10 pt text
WIDTH_CHARS = 1.25  # characters of 10 pt text per unit of column width (a 11 pt "0"), with room to spare
MAX_FILTER_HOURS = 100_000.0  # as kit.engine.particulars.MAX_FILTER_RUN_S
COUNT_NOTES = {
    "designation": "what the part is",
    "uom": "unit of measure of every quantity on the row: pcs (pieces), L (litres), m (metres)",
    "location": f"where on board the part is kept; empty means {DEFAULT_LOCATION!r}; add a row for another place",
    "needed": "what the voyage needs of the part, all locations together (on the part's first row)",
    "on_board": "what the database last had on board at this location (not read back)",
    "as_of": "the date of that figure (not read back)",
    "counted": "what you count on board, in the row's uom; leave it empty for a part not counted",
    "counted_on": "date of the count, YYYY-MM-DD; empty: the day of the import",
    "part_key": "the generic part's key; do not change it (outside the print area)",
    "vessel": "the vessel this sheet was made for; the import refuses another vessel's sheet",
    "unit": "the unit's id in the particulars",
    "position": "the filter position on the unit, as in the particulars",
    "element": "the element the position takes",
    "interval_h": "the maker's change interval, running hours",
    "hours_last": "running hours since the last change as kit last had them (not read back)",
    "last_on": "the date of that figure (not read back)",
    "hours_since_change": "running hours of the element in place since it was changed (hour meter or log); empty: not read",
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


def _rows(table: Table, mode: str, mark: DecimalMark, column: str = "quantity",
          skipped: list[Row] | None = None) -> list[tuple[Row, str, str, float, dt.date | None]]:
    """Each row's (row, key, location, quantity, day); a row whose ``column`` is blank is not
    counted: it goes to ``skipped`` (its other cells still checked)."""
    seen: dict[tuple[str, str], int] = {}
    out = []
    default_day = dt.date.today() if column == "counted" else None
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
        quantity = number(table, row, column, mark, minimum=0.0 if mode == "count" else None, maximum=MAX_QUANTITY)
        day = _date(table, row)
        if quantity is None:
            if skipped is not None:
                skipped.append(row)
            continue
        out.append((row, str(key), location, quantity, day or default_day))
    return out


def _vessel(tables: Sequence[Table]) -> str | None:
    """The one vessel the rows were made for (column ``vessel``), or None when none says."""
    found: tuple[str, int] | None = None
    for table in tables:
        for row in table.rows:
            value = row.values.get("vessel")
            if value is None:
                continue
            text = str(value)
            if CONTROL.search(text):
                raise table.error(row, "vessel", NO_CONTROL, text)
            if found is None:
                found = (text, row.line)
            elif text != found[0]:
                raise table.error(row, "vessel", f"the vessel of every other row, {found[0]!r} (row {found[1]} of sheet {SHEET})", text)
    return None if found is None else found[0]


def _filter_rows(table: Table, mark: DecimalMark, skipped: list[Row]) -> list[tuple[Row, str, str, float, dt.date]]:
    """The filter positions whose hours were read: (row, unit, position, running seconds, day)."""
    seen: dict[tuple[str, str], int] = {}
    out = []
    for row in table.rows:
        names = []
        for column in ("unit", "position"):
            value = row.values.get(column)
            if value is None or CONTROL.search(str(value)):
                raise table.error(row, column, f"the {column} as the particulars name it ({NO_CONTROL})",
                                  "an empty cell" if value is None else str(value))
            names.append(str(value))
        unit, position = names
        if (unit, position) in seen:
            raise table.error(row, "position", f"each filter position once (already on {table.where(seen[unit, position])})", position)
        seen[unit, position] = row.line
        hours = number(table, row, "hours_since_change", mark, minimum=0.0, maximum=MAX_FILTER_HOURS)
        day = _date(table, row)
        if hours is None:
            skipped.append(row)
            continue
        out.append((row, unit, position, hours * 3600.0, day or dt.date.today()))
    return out


@dataclass(frozen=True)
class StockFile:
    """A stock file read and checked, ready to write: its table and each row's (row, part key,
    location, quantity, counted_on); the rows not counted (blank), the vessel the file names
    (None: none), and a count sheet's filter hours: (row, unit, position, running s, day)."""

    table: Table
    mode: str
    rows: list[tuple[Row, str, str, float, dt.date | None]]
    not_counted: tuple[Row, ...] = ()
    vessel: str | None = None
    filter_table: Table | None = None
    filter_hours: tuple[tuple[Row, str, str, float, dt.date], ...] = ()
    filters_not_read: tuple[Row, ...] = ()

    def refuse_other_vessel(self, vessel_id: str) -> None:
        """Refuse a file made for another vessel than ``vessel_id``, at its first row naming one."""
        if self.vessel is None or self.vessel.casefold() == vessel_id.casefold():
            return
        table, row = next((t, r) for t in (self.table, self.filter_table) if t is not None
                          for r in t.rows if r.values.get("vessel") is not None)
        raise table.error(row, "vessel", f"{vessel_id!r}, the vessel of this import (this file was made for another vessel)",
                          self.vessel)


def read_stock(path: str | Path, mode: str = "count", decimal: str | None = None) -> StockFile:
    """The stock rows of ``path``, every cell checked. ``decimal`` is the decimal mark of the
    file's numbers ("point" or "comma"; None: by the file's kind); ``mode`` one of :data:`MODES`,
    checked by the caller (:func:`kit.services.imports.import_stock`). The quantity is in column
    ``quantity`` or (a count sheet) ``counted``; a blank one is not counted."""
    table = read_table(path, SHEET, known=KNOWN, required=("part_key",))
    if "counted" in table.columns and "quantity" in table.columns:
        raise InputError(table.where(), "column counted", "either quantity or counted, not both", got="both")
    column = "counted" if "counted" in table.columns else "quantity"
    if column not in table.columns:
        raise InputError(table.where(), "column quantity", "this column in the header row", got="no such column")
    mark = decimal_mark(table, decimal)
    skipped: list[Row] = []
    rows = _rows(table, mode, mark, column, skipped)
    filters, filters_skipped, filter_rows = None, [], []
    if str(path).lower().endswith(".xlsx") and FILTER_SHEET in sheet_names(path):
        filters = read_table(path, FILTER_SHEET, known=FILTER_COLUMNS, required=("unit", "position", "hours_since_change"))
        filter_rows = _filter_rows(filters, decimal_mark(filters, decimal), filters_skipped)
    vessel = _vessel([table] + ([filters] if filters is not None else []))
    return StockFile(table, mode, rows, tuple(skipped), vessel, filters, tuple(filter_rows), tuple(filters_skipped))


def stock_sheet(rows: list[list]) -> Sheet:
    """The stock sheet to fill in, from rows in :data:`COLUMNS` order
    (:func:`kit.store.stock_import.stock_rows`)."""
    return Sheet(SHEET, COLUMNS, rows, NOTES)


@dataclass(frozen=True)
class CountLine:
    """One row of a count sheet: a part at a location (None: not yet stored anywhere)."""

    key: str
    designation: str
    uom: str
    location: str | None
    needed: float | None  # on the part's first row only
    on_board: float | None
    as_of: dt.date | None


@dataclass(frozen=True)
class FilterLine:
    unit: str
    position: str
    element: str
    interval_h: float
    hours: float | None
    recorded_on: dt.date | None


@dataclass(frozen=True)
class CountSheet:
    vessel_id: str
    vessel_name: str
    days: float
    made_on: dt.date
    lines: Sequence[CountLine]
    filters: Sequence[FilterLine]


def _page_setup(ws, title: str, count: CountSheet, columns: int, rows: int, paper: str) -> None:
    """A4 (or Letter) portrait, fitted to the page width, the header row repeated, a grid, the
    vessel and date in the page header and "page N of M" in the footer."""
    from openpyxl.utils import get_column_letter

    from kit.files.print_setup import set_print

    set_print(ws, paper=paper, what=title, scope=f"{count.vessel_name} ({count.vessel_id})",
              day=f"made {count.made_on.isoformat()}, voyage {count.days:g} days", title_rows="1:1",
              area=f"A1:{get_column_letter(columns)}{max(rows, 1)}", margins=(0.3, 0.6, 0.25), centred=True,
              footer="counted by: ____________   signed: ____________", font_size=10)
    ws.oddFooter.left.size = ws.oddFooter.right.size = 9


def _table_sheet(wb, name: str, columns: Sequence[str], printed: int, widths: Sequence[float], rows: list[list[Any]],
                 wrap: set[int], entry: set[int], count: CountSheet, title: str, paper: str) -> None:
    from openpyxl.styles import Alignment, Border, Font, PatternFill, Side

    ws = wb.create_sheet(name)
    thin = Side(style="thin", color="808080")
    grid = Border(left=thin, right=thin, top=thin, bottom=thin)
    ws.append(list(columns))
    for i, cell in enumerate(ws[1], start=1):
        cell.font = Font(name=FONT, bold=True, size=10)
        cell.alignment = Alignment(vertical="center")
        if i <= printed:
            cell.border = grid
            cell.fill = PatternFill("solid", fgColor="D9D9D9")
    for values in rows:
        ws.append([visible(v) for v in values])
        for i, cell in enumerate(ws[ws.max_row], start=1):
            if is_risky(cell.value):
                cell.data_type = "s"  # user text: never a formula
            cell.font = Font(name=FONT, size=10, color=None if i <= printed else "808080")
            cell.alignment = Alignment(wrap_text=i in wrap, vertical="top")
            if isinstance(cell.value, dt.date):
                cell.number_format = "yyyy-mm-dd"
            if i <= printed:
                cell.border = grid
    widths = [max(w, len(c) + 2.5) for w, c in zip(widths, columns)]
    for i, width in enumerate(widths, start=1):
        ws.column_dimensions[ws.cell(1, i).column_letter].width = width
    for r, values in enumerate(rows, start=2):  # room for wrapped text: spreadsheet programs do not always grow a row
        lines = max([math.ceil(len(str(values[i - 1])) / max(widths[i - 1] * WIDTH_CHARS, 1)) for i in wrap
                     if values[i - 1] is not None] + [1])
        if lines > 1:
            ws.row_dimensions[r].height = LINE_POINTS * lines + 2
    ws.freeze_panes = "A2"
    _page_setup(ws, title, count, printed, len(rows) + 1, paper)
    for i in entry:  # the cells to fill in stand out on screen
        for r in range(2, len(rows) + 2):
            ws.cell(r, i).fill = PatternFill("solid", fgColor="FFF2CC")


def count_rows(count: CountSheet) -> list[list[Any]]:
    """The count sheet's rows in :data:`COUNT_COLUMNS` order (also the .csv form)."""
    return [[li.designation, li.uom, li.location, li.needed, li.on_board, li.as_of, None, None, li.key, count.vessel_id]
            for li in count.lines]


def write_count_sheet(path: str | Path, count: CountSheet, safety: str, paper: str = "a4") -> None:
    """The count sheet of one vessel: ``.xlsx`` (sheets stock, filter_hours, notes; printed on A4)
    or ``.csv`` (the stock rows only); ``paper`` "a4" or "letter"."""
    from kit.files.atomic import replace_atomically
    from kit.files.sheets import write_csv

    path = Path(path)
    rows = count_rows(count)
    if path.suffix.lower() == ".csv":
        write_csv(path, COUNT_COLUMNS, [[v.isoformat() if isinstance(v, dt.date) else v for v in r] for r in rows])
        return
    if path.suffix.lower() != ".xlsx":
        raise InputError(str(path), "output file", "a name ending in .xlsx or .csv", got=repr(path.suffix or "no suffix"))

    def write(tmp: Path) -> None:
        from openpyxl import Workbook
        from openpyxl.styles import Alignment, Font

        from kit.files.print_setup import use_font

        wb = Workbook()
        use_font(wb)  # Arial 10: the column widths print as wide wherever the sheet is opened
        wb.remove(wb.active)
        _table_sheet(wb, SHEET, COUNT_COLUMNS, PRINTED, (33, 5.5, 12, 8, 10.5, 10.5, 9.5, 12.5, 30, 14), rows,
                     {1, 3}, {7, 8}, count, "Stock count", paper)
        filters = [[f.unit, f.position, f.element, f.interval_h, f.hours, f.recorded_on, None, None, count.vessel_id]
                   for f in count.filters]
        _table_sheet(wb, FILTER_SHEET, FILTER_COLUMNS, FILTER_PRINTED, (7, 9, 16, 12.5, 12.5, 10.5, 20.5, 12.5, 14), filters,
                     {2, 3}, {7, 8}, count, "Filter hours", paper)
        ws = wb.create_sheet("notes")
        ws.append(["sheet", "column", "what it holds"])
        for cell in ws[1]:
            cell.font = Font(bold=True)
        for sheet, columns in ((SHEET, COUNT_COLUMNS), (FILTER_SHEET, FILTER_COLUMNS)):
            for c in columns:
                ws.append([sheet, c, COUNT_NOTES.get(c, "")])
        ws.append([])
        ws.append(["safety", "", safety])
        ws.column_dimensions["A"].width = 13
        ws.column_dimensions["B"].width = 19
        ws.column_dimensions["C"].width = 66
        for row in ws.iter_rows(min_row=2):
            row[2].alignment = Alignment(wrap_text=True, vertical="top")
            row[2].font = Font(name=FONT, size=10)
            if row[2].value:
                ws.row_dimensions[row[2].row].height = LINE_POINTS * math.ceil(len(row[2].value) / (66 * WIDTH_CHARS)) + 2
        _page_setup(ws, "Stock count notes", count, 3, ws.max_row, paper)
        wb.save(tmp)

    replace_atomically(path, write)


def fill_count(path: str | Path, counted: Mapping[str, float], hours: Mapping[tuple[str, str], float] = {},
               location: str | None = None, on: dt.date | None = None) -> None:
    """Type a count into a count sheet kit wrote (as a person would): ``counted`` by part key on
    the part's first row, ``hours`` by (unit, position), an empty location set to ``location`` and
    the count date ``on``. Parts and positions not given stay blank (not counted)."""
    from openpyxl import load_workbook

    from kit.files.atomic import replace_atomically

    def write(tmp: Path) -> None:
        wb = load_workbook(path)
        ws = wb[SHEET]
        head = {c.value: c.column for c in ws[1]}
        done: set[str] = set()
        for r in range(2, ws.max_row + 1):
            key = ws.cell(r, head["part_key"]).value
            if key in counted and key not in done:
                done.add(key)
                ws.cell(r, head["counted"]).value = counted[key]
                ws.cell(r, head["counted_on"]).value = on
                if location and not ws.cell(r, head["location"]).value:
                    ws.cell(r, head["location"]).value = location
        ws = wb[FILTER_SHEET]
        head = {c.value: c.column for c in ws[1]}
        for r in range(2, ws.max_row + 1):
            place = (ws.cell(r, head["unit"]).value, ws.cell(r, head["position"]).value)
            if place in hours:
                ws.cell(r, head["hours_since_change"]).value = hours[place]
                ws.cell(r, head["counted_on"]).value = on
        wb.save(tmp)

    replace_atomically(Path(path), write)


@dataclass(frozen=True)
class EnteredTable(Table):
    """Rows typed into a form rather than read from a file: a refusal names the row by what it
    holds (``names``, by row number: the part and its location), as a file's names its line."""

    names: Mapping[int, str] = field(default_factory=dict)

    def where(self, line: int | None = None) -> str:
        if line is None:
            return self.path
        return f"{self.path}, {self.names.get(line, f'entry {line}')}"


TYPED = "a plain number of at least 0 with a decimal point, e.g. 12.50 (no exponent, no grouping separators)"
_TYPED_MARK = DecimalMark("point", "the mark of a number typed on a page")


def _typed_numbers(table: Table, column: str) -> None:
    """Refuse a typed entry that is not a plain decimal with a point, before the file readers'
    checks (which would name the decimal mark setting a file has and a form has not)."""
    for row in table.rows:
        value = row.values.get(column)
        if isinstance(value, str) and parse_decimal(value, "point") is None:
            raise table.error(row, column, TYPED, value if len(value) <= MAX_CHARS else value[:MAX_CHARS] + "...")


def read_count_entries(source: str, counts: Sequence[tuple[str, str | None, Any]], counted_on: Any,
                       location: str | None = None,
                       hours: Sequence[tuple[str, str, Any]] = ()) -> StockFile:
    """A count typed in a form, checked as a count sheet's rows are (:func:`read_stock`): each of
    ``counts`` a (part key, location or None, counted) where counted is a number or its text, blank
    (None or "") for a part not counted; ``counted_on`` the day of the count (a date or its ISO text;
    blank: today; never after today); ``location`` where a part with none goes (blank:
    :data:`DEFAULT_LOCATION`); ``hours`` (unit, position, running hours since the filter change).
    ``source`` names the form in refusals, e.g. ``count of CORVINA-BAY, part_key ... at ...: column
    counted: expected ...``."""
    day = counted_on.isoformat() if isinstance(counted_on, dt.date) else counted_on
    blank = lambda v: None if v is None or (isinstance(v, str) and not v.strip()) else (v.strip() if isinstance(v, str) else v)  # noqa: E731
    place = blank(location)
    rows, names = [], {}
    for n, (key, where, counted) in enumerate(counts, start=1):
        spot = blank(where) or place
        rows.append(Row(n, {"part_key": blank(key), "location": spot, "counted": blank(counted), "counted_on": blank(day)}))
        names[n] = f"part_key {key!r} at {(spot or DEFAULT_LOCATION)!r}"
    table = EnteredTable(source, None, ("part_key", "location", "counted", "counted_on"), rows, None, names)
    _typed_numbers(table, "counted")
    skipped: list[Row] = []
    counted_rows = _rows(table, "count", _TYPED_MARK, "counted", skipped)
    filter_rows, names = [], {}
    for n, (unit, position, run) in enumerate(hours, start=1):
        filter_rows.append(Row(n, {"unit": blank(unit), "position": blank(position), "hours_since_change": blank(run),
                                   "counted_on": blank(day)}))
        names[n] = f"unit {unit!r} filter {position!r}"
    filters = EnteredTable(source, None, ("unit", "position", "hours_since_change", "counted_on"), filter_rows, None, names)
    _typed_numbers(filters, "hours_since_change")
    filters_skipped: list[Row] = []
    filter_hours = _filter_rows(filters, _TYPED_MARK, filters_skipped)
    return StockFile(table, "count", counted_rows, tuple(skipped), None, filters, tuple(filter_hours), tuple(filters_skipped))
