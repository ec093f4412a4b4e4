# SPDX-License-Identifier: MIT
"""The pre-voyage check workbook: one sheet, laid out to print on one A4 page in portrait.

From the top: the title with the vessel, the voyage's days, the date and the spares policy; the
result in words; the shortfall (part, unit of measure, needed, on board, short, basis); then what
the check covered: the oil of each unit (charge, storage tank, top-up), each oil and each filter
element line, short or not; the notes and the caution. Header and footer name the check and
number the pages ("page N of M"). Figures are values, not formulas: the check is a record of what
the fleet database held on the day. Text from files is written as text, never as a formula
(:mod:`kit.files.safe_text`); the file is written whole or not at all (:func:`kit.files.workbook.save_atomically`).
"""

from __future__ import annotations

import datetime as dt
import textwrap
from pathlib import Path
from typing import Any

from openpyxl import Workbook
from openpyxl.styles import Alignment, Border, Font, PatternFill, Side
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.pagebreak import Break

from kit.engine.bom import Order
from kit.engine.preflight import CheckRow, covered_rows, short_words, shortfall_rows, unit_oil
from kit.files.print_setup import DEFAULT_PAPER, set_print
from kit.files.safe_text import is_risky, visible
from kit.files.workbook import save_atomically
from kit.safety import SAFETY

TITLE = "Pre-voyage check"
SHEET = "Pre-voyage check"
# Six columns, their widths (characters of the default font) summing to what A4 portrait holds
# between 11 mm margins at over 90 % (the LibreOffice render is checked in
# tests/test_cli_glance.py). Arial, or a font with its metrics, is on every office machine.
COLUMNS = (("Part", 32), ("UoM", 5), ("Needed", 8), ("On board", 8), ("Short", 7), ("Basis", 21))
BODY = Font(name="Arial", size=10)
BOLD = Font(name="Arial", size=10, bold=True)
SHORT_FONT = Font(name="Arial", size=10, bold=True, color="B00000")
HEADING = Font(name="Arial", size=11, bold=True)
TITLE_FONT = Font(name="Arial", size=15, bold=True)
HEADER_FILL = PatternFill("solid", fgColor="DDE4EA")
THIN = Side(style="thin", color="808080")
GRID = Border(left=THIN, right=THIN, top=THIN, bottom=THIN)
WRAP = Alignment(wrap_text=True, vertical="top")
NUMBER = Alignment(vertical="top", horizontal="right", indent=1)
KEY_COLUMN = "Part key"  # right of the print area: the generic part's key, as in the order workbook
LINE_PT = 13.0  # one line of the 10 pt body font, with its leading
# The rows of one A4 portrait page between the margins, less the page header and footer, in points
# of row height before the fit-to-width scale (about 0.93): a little under the 800 LibreOffice fits.
PAGE_PT = 740.0
KEEP_ROWS = 3  # a table's heading goes to the next page unless this many of its rows follow it
TEXT_CHARS = 105  # a line of free text across the six columns (bold: fewer)


def _lines(text: str, width: int) -> int:
    """The lines ``text`` takes in a wrapped cell ``width`` characters wide. A width counts the
    digit 0 of the default font; Arial 10 sets 1.4 to 1.6 characters of mixed text in its place
    (LibreOffice render), so 1.3 leaves room for wide words without cutting them."""
    return len(textwrap.wrap(visible(text), max(int(width * 1.3) - 1, 1))) or 1


class _Page:
    """The one sheet, written row by row, each row's height set (a row does not grow by itself in
    every program) and counted, so a table's heading is kept with its first rows on one page."""

    def __init__(self, wb: Workbook):
        self.ws = wb.active
        self.ws.title = SHEET
        self.row = 0
        self.used = 0.0  # points of the current page taken
        for i, (_, width) in enumerate(COLUMNS, 1):
            self.ws.column_dimensions[get_column_letter(i)].width = width
        self.ws.column_dimensions[get_column_letter(len(COLUMNS) + 1)].width = 40

    def next_row(self, height: float = LINE_PT) -> None:
        self.row += 1
        self.ws.row_dimensions[self.row].height = height
        if self.used + height > PAGE_PT:  # the program starts a new page here by itself
            self.used = 0.0
        self.used += height

    def keep_together(self, height: float) -> None:
        """Start a new page after the current row unless ``height`` more points fit on this one."""
        if self.used and self.used + height > PAGE_PT:
            self.ws.row_breaks.append(Break(id=self.row))
            self.used = 0.0

    def cell(self, col: int, value: Any, font: Font = BODY, fmt: str | None = None, **style: Any) -> None:
        c = self.ws.cell(self.row, col)
        if isinstance(value, str):
            c.value = visible(value)
            if is_risky(value):
                c.data_type = "s"  # text from a file: never a formula
        else:
            c.value = value
        c.font = font
        if fmt:
            c.number_format = fmt
        for name, v in style.items():
            setattr(c, name, v)

    def text(self, text: str, font: Font = BODY, chars: int = TEXT_CHARS, height: float = LINE_PT) -> None:
        """Free text in column A, over as many rows as it needs (it runs on over the empty cells
        to its right)."""
        for part in textwrap.wrap(visible(text), chars) or [""]:
            self.next_row(height)
            self.cell(1, part, font)

    def table(self, heading: str, names: tuple[str, ...], rows: list[list[Any]], empty: str) -> None:
        """A titled grid: a header row, then ``rows`` (text wraps, the row as tall as its longest
        cell), or ``empty`` when there are none; the heading on the page of the first rows."""
        names = names + ((KEY_COLUMN,) if rows and len(rows[0]) > len(COLUMNS) else ())
        head = LINE_PT * max(_lines(n, w) for n, (_, w) in zip(names, COLUMNS)) + 2
        heights = [LINE_PT * max([1] + [_lines(v, w) for v, (_, w) in zip(values, COLUMNS) if isinstance(v, str)]) + 2
                   for values in rows]
        self.keep_together(2 * LINE_PT + head + sum(heights[:KEEP_ROWS]))
        self.next_row()
        self.text(heading, HEADING)
        self.next_row(head)
        for col, name in enumerate(names, 1):
            self.cell(col, name, BOLD, fill=HEADER_FILL, border=GRID, alignment=WRAP)
        if not rows:
            self.text(empty)
            return
        for values, height in zip(rows, heights):
            self.next_row(height)
            for col, value in enumerate(values, 1):
                fmt = None
                if isinstance(value, tuple):  # (number, format)
                    value, fmt = value
                if col > len(COLUMNS):  # the part key: outside the print area, for scripts and look-ups
                    self.cell(col, value, BODY)
                    continue
                self.cell(col, value, BODY, fmt, border=GRID, alignment=WRAP if isinstance(value, str) else NUMBER)


def _amount(value: float | None, uom: str) -> tuple[float | None, str]:
    return (None if value is None else round(value, 3), "#,##0.0" if uom == "L" else "#,##0")


def _rows(found: list[CheckRow]) -> list[list[Any]]:
    return [[r.part, r.uom, _amount(r.needed, r.uom), _amount(r.on_board, r.uom), _amount(r.short, r.uom), r.basis, r.key]
            for r in found]


def write_check_workbook(check: Any, path: str | Path, on: dt.date | None = None, paper: str = DEFAULT_PAPER) -> Path:
    """Write the pre-voyage check ``check`` (a :class:`kit.services.orders.VoyageCheck`) to ``path``
    atomically, dated ``on`` (default today), to print on ``paper`` ("a4" or "letter")."""
    path = Path(path)
    day = (on or dt.date.today()).isoformat()
    vessel, days, short = check.vessel, check.days, check.short
    full: Order = check.full if check.full is not None else short
    result = short.results[0] if short.results else None
    wb = Workbook()
    page = _Page(wb)
    ws = page.ws

    page.text(f"{TITLE}: {vessel.name} ({vessel.id})", TITLE_FONT, chars=60, height=21)
    page.text(f"Vessel: {vessel.name} ({vessel.id}), {vessel.ship_type}, {vessel.gross_tonnage:,.0f} GT")
    page.text(f"Voyage: {days:g} days. Checked on {day} against the stock on board in the fleet database.")
    if result is not None:
        page.text(f"Spares policy: {result.policy.name} ({result.policy.source})")
    words = short_words(short)
    if words:
        page.text(f"SHORT for a {days:g}-day voyage: " + "; ".join(words) + ".", SHORT_FONT)
    else:
        page.text(f"Nothing short: everything a {days:g}-day voyage needs is on board.", BOLD)

    page.table("1. Shortfall", tuple(name for name, _ in COLUMNS), _rows(shortfall_rows(short)),
               "Nothing short.")
    oil_rows = [[f"unit {u.unit}: {u.fluid}", "L", _amount(u.charge_l, "L"),
                 _amount(u.storage_tank_l, "L") if u.storage_tank_l is not None else "none",
                 _amount(u.top_up_l, "L"), u.charge_basis] for u in (unit_oil(result) if result else [])]
    page.table(f"2. Oil of each unit (top-up over {days:g} days)", ("Unit and fluid", "UoM", "Charge", "Storage tank", "Top-up",
                                        "Charge from"), oil_rows, "No units.")
    page.table("3. Oil covered (storage tank and top-up, per fluid)", ("Oil", "UoM", "Needed", "On board", "Short", "Basis"),
               _rows(covered_rows(full, "oil")), "No oil line under this policy.")
    page.table("4. Filter elements covered", ("Element", "UoM", "Needed", "On board", "Short", "Basis"),
               _rows(covered_rows(full, "filter_element")), "No filter positions in the particulars.")

    notes = ("Needed: what the voyage needs under the spares policy (storage tank: SOLAS II-1/29.12.3; top-up: "
              "leakage rate x days; filter elements: changes due over the voyage plus the policy's spare sets). "
              "On board: the stock in the fleet database, summed over its locations. Short: needed less on board.")
    caution = textwrap.wrap(SAFETY, TEXT_CHARS - 10)
    page.keep_together(LINE_PT * (2 + len(textwrap.wrap(notes, TEXT_CHARS)) + len(caution)))
    page.next_row()
    page.text(notes)
    page.next_row()
    for line in caution:
        page.text(line, BOLD, chars=TEXT_CHARS)

    # A4 (or Letter) portrait, one page wide; margins 11 mm at the sides (0.45 in)
    set_print(ws, paper=paper, what=TITLE, scope=f"{vessel.name} ({vessel.id}), {days:g} days", day=day,
              area=f"A1:{get_column_letter(len(COLUMNS))}{page.row}", margins=(0.45, 0.75, 0.3),
              footer="CAUTION: high hydraulic pressure; secure the rudder before opening the gear")
    save_atomically(wb, path)
    return path


__all__ = ["write_check_workbook"]
