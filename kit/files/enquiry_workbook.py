# SPDX-License-Identifier: MIT
"""An enquiry (request for quotation) as a workbook a supplier fills in and sends back.

Sheets: ``Enquiry`` (from whom, our enquiry reference, the dates, to whom, how to reply and the
caution) and ``Lines`` (one row per line asked: our line reference, the generic designation,
standard, compound, service conditions, quantity, packs, vessels and units, delivery port and
date, then the columns the supplier fills in). The sheets are protected: only the supplier's
columns (and, in an open enquiry, the cell for the supplier's name) are unlocked, so what we asked
comes back as we wrote it; :mod:`kit.files.enquiry_reply` checks that it did. Printed on A4
(or Letter) landscape, one page wide, the heading row on every page and page numbers in the footer.
Text that starts with a formula character is written as a string cell (:mod:`kit.files.safe_text`).
"""

from __future__ import annotations

import math
import re
import textwrap
from pathlib import Path
from typing import Any, Callable

from openpyxl import Workbook
from openpyxl.styles import Alignment, Font, PatternFill, Protection
from openpyxl.utils import get_column_letter

from kit.engine.enquiry import Enquiry
from kit.files.print_setup import DEFAULT_PAPER, FONT_NAME, fits_width, set_print, use_font
from kit.files.safe_text import is_risky, visible
from kit.safety import SAFETY

COVER = "Enquiry"
LINES = "Lines"
# (heading, width, wrapped); the supplier's columns come last. Each width holds its heading's
# longest word in bold, so a heading is never broken inside a word.
ASKED_COLUMNS = (
    ("Line ref", 19, False), ("Designation", 40, True), ("Standard", 14, True), ("Compound", 11, True),
    ("Service conditions", 14, True), ("Quantity", 10, False), ("UoM", 5, False), ("Pack", 8, False), ("Packs", 8, False),
    ("Vessels (units)", 18, True), ("Delivery port", 13, True), ("Deliver by", 12, False),
)
REPLY_COLUMNS = (
    ("Your part number", 14, True), ("Unit price (per your pack)", 11, False), ("Currency", 11, False),
    ("Your pack", 9, False), ("Lead time [days]", 9, False), ("Remarks", 18, True),
)
COLUMNS = ASKED_COLUMNS + REPLY_COLUMNS
HEADINGS = tuple(name for name, _, _ in COLUMNS)
# Cover labels the reply reader finds its values by.
REFERENCE = "Enquiry reference"
SUPPLIER = "To"
YOUR_NAME = "Your company name"
OPEN_TO = "any supplier (an open enquiry)"

HEADER_FONT = Font(name=FONT_NAME, bold=True)
HEADER_FILL = PatternFill("solid", fgColor="DDE4EA")
FILL_IN = PatternFill("solid", fgColor="FFF6CC")  # the cells the supplier fills in
WRAP = Alignment(wrap_text=True, vertical="top")
TOP = Alignment(vertical="top")
LINE_PT = 13.0  # one line of 10-11 pt text with its leading
MAX_NAME = 80


def file_names(supplier_names: list[str | None]) -> list[str]:
    """A workbook name for each enquiry: the supplier's name made safe for a file name on any
    system (a character Windows or a POSIX system refuses in a name, ``<>:"/\\|?*`` and control
    characters, becomes ``_``; runs of white space one space; no leading or trailing dot or space;
    a device name such as ``CON`` gets a leading ``_``), ``any-supplier`` for the open enquiry,
    each name once (case ignored) with `` (2)`` added to a repeat."""
    open_name = "any-supplier"
    taken: set[str] = {open_name} if None in supplier_names else set()
    names = []
    for supplier in supplier_names:
        if supplier is None:
            names.append(open_name + ".xlsx")
            continue
        base = re.sub(r'[<>:"/\\|?*\x00-\x1f\x7f-\x9f]', "_", " ".join(supplier.split()))
        base = base.strip(" .")[:MAX_NAME].strip(" .") or "supplier"
        if base.upper().split(".")[0] in _RESERVED:
            base = "_" + base
        name, n = base, 1
        while name.casefold() in taken:
            n += 1
            name = f"{base} ({n})"
        taken.add(name.casefold())
        names.append(name + ".xlsx")
    return names


# Names Windows keeps for devices, whatever the suffix.
_RESERVED = {"CON", "PRN", "AUX", "NUL", *(f"COM{i}" for i in range(1, 10)), *(f"LPT{i}" for i in range(1, 10))}


def _put(ws, row: int, column: int, value: Any, **style: Any):
    cell = ws.cell(row, column, visible(value))
    if is_risky(value):
        cell.data_type = "s"  # our text or the supplier's: never a formula
    for name, v in style.items():
        setattr(cell, name, v)
    return cell


def _print_setup(ws, enquiry: Enquiry, landscape: bool, paper: str, **more: Any) -> None:
    to = enquiry.supplier if enquiry.supplier is not None else OPEN_TO
    set_print(ws, paper=paper, what=f"Enquiry {enquiry.id}", scope=f"{enquiry.company} to {to}",
              day=enquiry.written_on.isoformat(), landscape=landscape, footer=f"Enquiry {enquiry.id}", **more)


def _protect(ws) -> None:
    """Lock every cell but those unlocked; the supplier may still widen columns and rows."""
    ws.protection.sheet = True
    ws.protection.formatColumns = False
    ws.protection.formatRows = False
    ws.protection.selectLockedCells = False
    ws.protection.selectUnlockedCells = False


def _cover(wb: Workbook, enquiry: Enquiry, paper: str) -> None:
    ws = wb.active
    ws.title = COVER
    ws.column_dimensions["A"].width = 24
    ws.column_dimensions["B"].width = 80
    to = enquiry.supplier if enquiry.supplier is not None else OPEN_TO
    rows: list[tuple[str | None, Any]] = [
        ("From", enquiry.company), (REFERENCE, enquiry.id), ("Date", enquiry.written_on),
        ("Reply by", enquiry.reply_by), (SUPPLIER, to),
    ]
    if enquiry.supplier is None:
        rows.append((YOUR_NAME, None))
    rows.append(("Lines", len(enquiry.lines)))
    for i, d in enumerate(sorted(enquiry.deliveries, key=lambda d: (d.due_on, d.vessel_id))):
        rows.append(("Deliveries on board" if i == 0 else None, f"{d.vessel_id}: {d.port} by {d.due_on.isoformat()}"))
    if not enquiry.deliveries:
        rows.append(("Deliveries on board", "port and date to be agreed"))
    _put(ws, 1, 1, "Enquiry: steering gear and hydraulic spares", font=Font(name=FONT_NAME, bold=True, size=13))
    r = 3
    for label, value in rows:
        _put(ws, r, 1, label, font=HEADER_FONT, alignment=TOP)
        cell = _put(ws, r, 2, value, alignment=Alignment(horizontal="left", vertical="top"))
        if label == YOUR_NAME:
            cell.protection, cell.fill = Protection(locked=False), FILL_IN
        if hasattr(value, "isoformat"):
            cell.number_format = "yyyy-mm-dd"
        r += 1
    how = ("Please quote each line on the Lines sheet in the shaded columns: your part number, the unit price per "
           "your pack, the currency (ISO 4217 code, e.g. EUR), your pack with its content and unit (e.g. \"10 pcs\", "
           "\"20 L\", \"5 US_gal\"), the lead time in days from order to dispatch, and any remarks. Leave a line blank if "
           "you do not quote it. Please keep our line references, designations and quantities as they are, and send "
           "this workbook back.")
    if enquiry.supplier is None:
        how += f" Write your company name beside \"{YOUR_NAME}\" above."
    for label, text in (("How to reply", how),
                        ("Designations", "Generic and dimensional: seal housing sizes in mm (d inner, D outer, L length), "
                                         "to the standard named; please quote a part that fits the housing and the "
                                         "service conditions (working pressure and fluid) stated."),
                        ("CAUTION", SAFETY)):
        r += 1
        for i, part in enumerate(textwrap.wrap(text, 85)):
            if i == 0:
                _put(ws, r, 1, label, font=HEADER_FONT)
            _put(ws, r, 2, part)
            r += 1
    _print_setup(ws, enquiry, False, paper, area=f"A1:B{r}")
    _protect(ws)


def _height(values: list[Any]) -> float:
    """The row's height for its longest wrapped text: rows do not grow by themselves in every program."""
    lines = 1
    for (_, width, wrapped), value in zip(COLUMNS, values):
        if wrapped and isinstance(value, str):
            lines = max(lines, sum(math.ceil(max(len(part), 1) / max(width - 1, 1)) for part in value.split("\n")))
    return LINE_PT * lines + 2


def _lines(wb: Workbook, enquiry: Enquiry, paper: str) -> None:
    ws = wb.create_sheet(LINES)
    reply_from = len(ASKED_COLUMNS) + 1
    for i, (name, width, _) in enumerate(COLUMNS, 1):
        ws.column_dimensions[get_column_letter(i)].width = width
        _put(ws, 1, i, name, font=HEADER_FONT, fill=FILL_IN if i >= reply_from else HEADER_FILL, alignment=WRAP)
    ws.row_dimensions[1].height = LINE_PT * max(math.ceil(len(n) / max(w - 2, 1)) for n, w, _ in COLUMNS) + 2
    for r, li in enumerate(enquiry.lines, 2):
        values = [li.ref, li.designation, li.standard, li.compound, li.service, li.quantity, li.uom, li.pack_label,
                  li.packs, li.vessels, li.port, li.due_on]
        for i, value in enumerate(values, 1):
            cell = _put(ws, r, i, value if value != "" else None, alignment=WRAP if COLUMNS[i - 1][2] else TOP)
            if li.due_on is not None and i == len(values):
                cell.number_format = "yyyy-mm-dd"
        for i in range(reply_from, len(COLUMNS) + 1):
            cell = ws.cell(r, i)
            cell.protection, cell.fill = Protection(locked=False), FILL_IN
            cell.alignment = WRAP if COLUMNS[i - 1][2] else TOP
            if HEADINGS[i - 1] in ("Your part number", "Currency", "Your pack", "Remarks"):
                cell.number_format = "@"  # typed as text: a part number "0012" keeps its zeros
        ws.row_dimensions[r].height = _height(values)
    ws.freeze_panes = "B2"
    # one page wide where the text stays readable, else across pages with the line reference on each
    fit = fits_width([w for _, w, _ in COLUMNS], paper, landscape=True)
    _print_setup(ws, enquiry, True, paper, title_rows="1:1", grid=True, fit_width=fit, title_cols=None if fit else "A:A")
    _protect(ws)


def enquiry_writer(enquiry: Enquiry, paper: str = DEFAULT_PAPER) -> Callable[[Path], None]:
    """A function that writes ``enquiry``'s workbook, to print on ``paper`` ("a4" or "letter"), to
    the path it is given (see :func:`kit.files.atomic.staged`)."""

    def write(path: Path) -> None:
        wb = Workbook()
        use_font(wb)
        _cover(wb, enquiry, paper)
        _lines(wb, enquiry, paper)
        wb.save(path)

    return write
