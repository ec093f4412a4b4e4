# SPDX-License-Identifier: MIT
"""The bill of materials workbook (openpyxl, write-only mode).

Sheets: ``Cover`` (scope, date, period, policy, totals, the caution and the basis notes),
``Order lines``, ``Vessel split``, ``Seal kits``, ``Oil and filters`` and ``Gear checks``.
"To order", packs, line totals, the oil package plan and the cover totals are live formulas over
"Required" and "On board", so a purchaser who edits an on-board count sees the order follow.
Text that starts with a formula character is written as a string cell (:mod:`kit.files.safe_text`).
The file is written to a temporary name beside the target and renamed into place, so a crash
never leaves half a workbook.
"""

from __future__ import annotations

import datetime as dt
import math
import textwrap
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Iterable

from openpyxl import Workbook
from openpyxl.cell import WriteOnlyCell
from openpyxl.styles import Alignment, Font, PatternFill
from openpyxl.utils import get_column_letter

from kit.engine.display_units import L_MIN_PER_M3_S, L_PER_M3, PA_PER_BAR, US_GAL_PER_M3
from kit.engine.bom import Order
from kit.safety import SAFETY
from kit.files.atomic import replace_atomically
from kit.files.print_setup import DEFAULT_PAPER, FONT_NAME, FONT_PT, SIDE_MARGIN_IN, fits_width, set_print, use_font
from kit.engine.oil_grades import density_kg_per_l
from kit.engine.report import seal_json
from kit.files.safe_text import CONTROL, TRIGGERS, is_risky, visible
from kit.engine.seal_kit import mm

HEADER_FONT = Font(name=FONT_NAME, size=FONT_PT, bold=True)
HEADER_FILL = PatternFill("solid", fgColor="DDE4EA")
WRAP = Alignment(wrap_text=True, vertical="top")
# A wrapped cell of a row: at the foot of the row like the unstyled cells beside it (a style on
# every cell of a large order would cost seconds).
WRAP_ROW = Alignment(wrap_text=True, vertical="bottom")
HEADER_LINE_PT = 13.0  # one line of the bold heading font, with its leading
BODY_LINE_PT = 13.0  # one line of the 10 pt default font, with its leading
# Characters of mixed text a wrapped line holds per unit of column width (a width counts the digit
# 0); Arial sets 1.4 to 1.6 of them (LibreOffice render), and capitals and wide words fewer: 1.1 leaves room.
WRAP_CHARS = 1.1
WIDE_CAPITALS = 1.35

# Number formats only on money, which a purchaser reads to the cent; quantities kit rounds itself
# (and the formulas over them) read as they are in General. A styled cell costs several times a
# plain one to write: in a 1,000-vessel order the quantity formats alone took about 0.5 s.
DATE = "yyyy-mm-dd"
# The columns a purchaser reads on paper come first and are the print area (A4 landscape, one page
# wide, at about 8 pt or more); the technical ones (standard, compound, rates, lead times, basis,
# the split and the part key) follow, outside it, for the screen and for look-ups.
ORDER_COLUMNS = (
    ("No", 4, None), ("Designation", 31, None), ("Required", 9, None), ("Per hull", 6, None), ("On board", 8, None), ("To order", 7, None),
    ("UoM", 5, None), ("Pack size", 6, None), ("Packs", 6, None), ("Supplier", 13, None), ("Supplier part no", 11, None),
    ("Price per pack", 9, "#,##0.00"), ("Currency", 9, None), ("Line total", 10, "#,##0.00"),
    ("Line total in base", 10, "#,##0.00"), ("Order by", 10, DATE), ("Late", 5, None), ("Why this supplier", 14, None), ("Hulls", 6, None),
    ("Standard", 18, None), ("Compound", 10, None), ("Rate to base", 10, None), ("Earliest arrival", 11, DATE),
    ("Delivery", 24, None), ("Lead time [days]", 10, None), ("Basis", 30, None), ("Vessels", 30, None),
    ("Part key", 40, None),
)
ORDER_PRINTED = [name for name, _, _ in ORDER_COLUMNS].index("Why this supplier") + 1  # No to Why this supplier
ORDER_WRAPPED = ("Designation", "Supplier", "Supplier part no", "Why this supplier")
LATE = "late"
COL = {name: get_column_letter(i) for i, (name, _, _) in enumerate(ORDER_COLUMNS, 1)}


@dataclass(frozen=True)
class Page:
    """What every printed page of the workbook says: the paper, and the page header's scope and date."""

    paper: str
    scope: str
    day: str


class _Sheet:
    """A write-only sheet with a styled, frozen, filtered header row and print set-up: the first
    ``printed`` columns (all by default) are the print area, fitted one page wide on A4 or Letter
    landscape; the text of the ``wrapped`` columns wraps, each row as tall as its longest text."""

    def __init__(self, wb: Workbook, title: str, columns: Iterable[tuple[str, int, str | None]], page: Page,
                 header_row: bool = True, fit_width: bool = True, printed: int | None = None,
                 wrapped: Iterable[str] = (), landscape: bool = True):
        self.ws = wb.create_sheet(title)
        self.table = header_row
        self._reused: dict[tuple[int, str], WriteOnlyCell] = {}
        self.columns = list(columns)
        self.formats = [fmt for _, _, fmt in self.columns]
        self._formatted = [i for i, fmt in enumerate(self.formats) if fmt]
        for i, (_, width, _) in enumerate(self.columns, 1):
            self.ws.column_dimensions[get_column_letter(i)].width = width
        names = [name for name, _, _ in self.columns]
        self.wrapped = {names.index(n): width for n, width in ((n, w) for n, w, _ in self.columns) if n in set(wrapped)}
        # per wrapped column, the longest text that fits on one line whatever its letters
        self._one_line = {i: width * WRAP_CHARS / WIDE_CAPITALS - 1 for i, width in self.wrapped.items()}
        # (column, text) -> the text as written and its lines: a large order repeats its designations,
        # parts and standards vessel by vessel, and wrapping one text costs a hundred plain cells
        self._lines: dict[tuple[int, str], tuple[str, int]] = {}
        self._plain: set[str] = set()  # text seen to hold no control character and start with no formula character
        self._wrap_cells = {i: WriteOnlyCell(self.ws) for i in self.wrapped}
        for cell in self._wrap_cells.values():
            cell.alignment = WRAP_ROW
        # fitted one page wide only where the text stays readable; else at full size across pages,
        # the first two columns on each (on a write-only sheet, set up before the rows are written)
        widths = [width for _, width, _ in self.columns[:printed or len(self.columns)]]
        fit = fit_width and fits_width(widths, page.paper, landscape)
        set_print(self.ws, paper=page.paper, what=f"Bill of materials, {title}", scope=page.scope, day=page.day,
                  landscape=landscape, fit_width=fit, title_rows="1:1" if header_row else None,
                  title_cols=None if fit else "A:B", margins=(SIDE_MARGIN_IN, 0.75, 0.3), font_size=FONT_PT)
        self.printed = printed
        self.rows = 0
        if header_row:
            self.ws.freeze_panes = "A2"
            # a wrapped heading's row does not grow by itself in every program: lines drawn over row 2
            lines = max(math.ceil(len(name) / max(width - 2, 1)) for name, width, _ in self.columns)
            self.ws.row_dimensions[1].height = HEADER_LINE_PT * lines
            self.append([name for name, _, _ in self.columns], header=True)

    def _header_cell(self, value: Any) -> WriteOnlyCell:
        c = WriteOnlyCell(self.ws, value=visible(value))
        if is_risky(value) and not isinstance(value, Formula):
            c.data_type = "s"  # user text: never a formula
        c.font, c.fill = HEADER_FONT, HEADER_FILL
        if self.table:  # column headings wrap; the cover's own lines do not
            c.alignment = WRAP
        return c

    def _styled(self, column: int, kind: str, value: Any) -> WriteOnlyCell:
        """A cell of ``column`` for a number format (``kind`` "fmt") or for text kept as text
        ("text"): one per column and kind, reused row by row, since a write-only sheet writes
        each row out as it is appended."""
        c = self._reused.get((column, kind))
        if c is None:
            c = self._reused[(column, kind)] = WriteOnlyCell(self.ws)
            if kind == "fmt":
                c.number_format = self.formats[column]
        c.value = value
        if kind == "text":
            c.data_type = "s"  # user or supplier text: never a formula
        return c

    def append(self, values: list[Any], header: bool = False) -> int:
        """Append a row. Plain values go to openpyxl as they are (a styled cell costs several
        times a plain one to write); only money in a formatted column and risky text get a cell."""
        if header:
            row = [self._header_cell(v) for v in values]
        else:
            row = list(values)
            if self.wrapped:
                self._wrap(row)
            for i in self._formatted:
                v = row[i] if i < len(row) else None
                if v is not None and (not isinstance(v, str) or isinstance(v, Formula)):
                    row[i] = self._styled(i, "fmt", v)
            plain = self._plain
            for i, v in enumerate(row):
                if isinstance(v, str) and v not in plain and not isinstance(v, Formula):
                    if CONTROL.search(v):  # stored by another program: openpyxl would refuse the cell
                        row[i] = v = visible(v)
                    if v.startswith(TRIGGERS):
                        row[i] = self._styled(i, "text", v)
                    else:
                        plain.add(v)
        self.ws.append(row)
        self.rows += 1
        return self.rows

    def _wrap(self, row: list[Any]) -> None:
        """Wrap the text of the wrapped columns that needs more than one line, and make the next
        row as tall as its longest text (a row does not grow by itself in every spreadsheet
        program). Text that fits on a line stays a plain value: a styled cell costs more to write."""
        lines = 1
        for i, width in self.wrapped.items():
            v = row[i] if i < len(row) else None
            if not isinstance(v, str) or isinstance(v, Formula) or len(v) <= self._one_line[i]:
                continue
            found = self._lines.get((i, v))
            if found is None:
                found = self._lines[(i, v)] = _wrapped_lines(visible(v), width)
            v, n = found
            if n > 1:
                lines = max(lines, n)
                cell = self._wrap_cells[i]
                cell.value, cell.data_type = v, "s"  # text: never a formula
                row[i] = cell
        if lines > 1:
            self.ws.row_dimensions[self.rows + 1].height = BODY_LINE_PT * lines + 2

    def finish(self) -> None:
        if self.printed:
            self.ws.print_area = f"A1:{get_column_letter(self.printed)}{max(self.rows, 1)}"
        if self.rows > 1:
            self.ws.auto_filter.ref = f"A1:{get_column_letter(len(self.columns))}{self.rows}"


def _wrapped_lines(text: str, width: int) -> tuple[str, int]:
    """``text`` and the lines it wraps to in a column ``width`` wide: capitals set up to a third
    wider than the mixed text :data:`WRAP_CHARS` is for."""
    wide = 1 + (WIDE_CAPITALS - 1) * sum(map(str.isupper, text)) / len(text)
    chars = max(int(width * WRAP_CHARS / wide) - 1, 1)
    # no longer than a line: one line, as textwrap would say (visible() left no tab to expand)
    return text, 1 if len(text) <= chars else len(textwrap.wrap(text, chars))


class Formula(str):
    """A formula kit itself writes (never user text)."""


def _equal_to(text: str) -> str:
    """A SUMIF criterion, as a formula's string literal, that matches cells holding ``text`` as
    kit writes it (:func:`kit.files.safe_text.visible`) and nothing else: ``=`` first, so a stored
    ``>`` or ``<`` is no comparison, ``~`` before the wildcards ``*`` and ``?``, and ``"`` doubled
    (string literals: ECMA-376 Part 1, 18.17 Formulas; the criteria's ``=``, ``~`` and wildcards as
    SUMIF reads them: from memory, checked by recalculating in LibreOffice in the tests)."""
    escaped = "".join("~" + ch if ch in "~*?" else ch for ch in visible(text))
    return '"=' + escaped.replace('"', '""') + '"'


def _roundup(ratio: str) -> str:
    """Whole packs for ``ratio`` (a formula), never below 0; the 1e-9 keeps 3.0000000001 at 3."""
    return f"ROUNDUP(MAX(0,{ratio}-0.000000001),0)"


def _oil_layout(order: Order) -> dict[str, tuple[int, int]]:
    """Fluid key -> the first and last row of its packs on the Oil and filters sheet (one row a pack)."""
    rows, r = {}, 2
    for oil in order.oil:
        n = max(1, len(oil.plan.packs))
        rows[oil.fluid_key] = (r, r + n - 1)
        r += n
    return rows


def _delivery_text(line) -> str | None:
    d = line.delivery
    return None if d is None else f"{d.port}, {d.due_on.isoformat()} ({d.vessel_id})"


def _order_sheet(wb: Workbook, order: Order, oil_rows: dict[str, tuple[int, int]], page: Page) -> dict[str, int]:
    sheet = _Sheet(wb, "Order lines", ORDER_COLUMNS, page, printed=ORDER_PRINTED, wrapped=ORDER_WRAPPED)
    rows: dict[str, int] = {}
    c = COL
    for line in order.lines:
        r = sheet.rows + 1
        offer = line.offer
        if line.plan is not None:  # oil: the fluid's one plan, its packs on the Oil and filters sheet
            first, last = oil_rows[line.key]
            pack: Any = line.pack_label
            packs_cell: Any = Formula(f"=SUM('Oil and filters'!{OIL_COL['Packs']}{first}:{OIL_COL['Packs']}{last})")
            total: Any = (Formula(f"=SUM('Oil and filters'!{OIL_COL['Subtotal']}{first}:{OIL_COL['Subtotal']}{last})")
                          if line.line_total is not None else None)
        else:
            pack = line.pack_size
            packs = _roundup(f"{c['To order']}{r}/{c['Pack size']}{r}")
            packs_cell = Formula(f'=IF({c["Pack size"]}{r}="","",{packs})')
            total = Formula(f'=IF(OR({c["Price per pack"]}{r}="",{c["Packs"]}{r}=""),"",'
                            f'{c["Packs"]}{r}*{c["Price per pack"]}{r})')
        base_total = Formula(f'=IF(OR({c["Line total"]}{r}="",{c["Rate to base"]}{r}=""),"",'
                             f'{c["Line total"]}{r}*{c["Rate to base"]}{r})')
        required: Any = round(line.required, 3)
        if line.hulls:  # a series line: the total is per hull x hulls, live
            required = Formula(f"={c['Per hull']}{r}*{c['Hulls']}{r}")
        values = {
            "No": line.number, "Designation": line.designation, "Standard": line.standard, "Compound": line.compound,
            "Required": required,
            "Per hull": None if line.per_hull is None else round(line.per_hull, 3), "Hulls": line.hulls, "On board": round(line.on_board, 3),
            "To order": Formula(f"=MAX(0,{c['Required']}{r}-{c['On board']}{r})"), "UoM": line.uom,
            "Pack size": pack, "Packs": packs_cell, "Supplier": line.supplier,
            "Supplier part no": offer.part_number if offer else None, "Price per pack": line.price,
            "Currency": line.currency, "Line total": total, "Rate to base": line.rate, "Line total in base": base_total,
            "Order by": line.order_by, "Late": LATE if line.late else None, "Earliest arrival": line.earliest_arrival,
            "Delivery": _delivery_text(line), "Lead time [days]": line.lead_time_days,
            "Why this supplier": line.reason or None, "Basis": line.basis,
            "Vessels": "; ".join(f"{v}: {q:g}" for v, q in line.split.items()), "Part key": line.key,
        }
        sheet.append([values[name] for name, _, _ in ORDER_COLUMNS])
        rows[line.key] = r
    sheet.finish()
    return rows


def _split_sheet(wb: Workbook, order: Order, page: Page) -> None:
    sheet = _Sheet(wb, "Vessel split", (("No", 6, None), ("Designation", 60, None), ("Vessel", 20, None),
                                         ("Required", 11, None), ("UoM", 6, None)), page, wrapped=("Designation",),
                   landscape=False)
    for line in order.lines:
        for vessel, qty in line.split.items():
            sheet.append([line.number, line.designation, vessel, round(qty, 3), line.uom])
    sheet.finish()


def _seal_sheet(wb: Workbook, order: Order, page: Page) -> None:
    cols = (("Vessel", 18, None), ("Unit", 10, None), ("Actuator", 11, None), ("Role", 8, None), ("Part", 40, None),
            ("d [mm]", 9, None), ("D [mm]", 9, None), ("L [mm]", 9, None), ("O-ring ID [mm]", 10, None),
            ("O-ring CS [mm]", 10, None), ("Strip t [mm]", 9, None), ("Cut length [mm]", 11, None),
            ("Qty per actuator", 10, None), ("Qty per unit", 9, None), ("Compound", 10, None), ("Standard", 22, None),
            ("Dimensions from", 34, None))
    sheet = _Sheet(wb, "Seal kits", cols, page, wrapped=("Part", "Standard", "Dimensions from"))
    for r in order.results:
        for u in r.units:
            g = u.unit.geometry
            vane = (mm(g.hub_diameter), mm(g.housing_bore)) if u.unit.actuator == "rotary_vane" else None
            for s in u.kit.lines:
                j = seal_json(s, u.kit, vane)
                sheet.append([r.vessel.id, u.unit.id, u.unit.actuator, j["role"], j["part"], j["d_mm"], j["D_mm"], j["L_mm"],
                              j.get("id_mm"), j.get("cs_mm"), j.get("strip_thickness_mm"), j.get("cut_length_mm"),
                              j["qty_per_actuator"], j["qty"], j["compound"], j["standard"], j["origin"]])
    sheet.finish()


OIL_COLUMNS = (
    ("Fluid", 30, None), ("Required [L]", 12, "#,##0.0"), ("On board [L]", 12, "#,##0.0"), ("To order [L]", 12, "#,##0.0"),
    ("To order [kg]", 12, "#,##0.0"), ("To order [US gal]", 12, "#,##0.0"), ("Pack", 16, None), ("Pack content [L]", 10, None),
    ("Packs", 8, None), ("Supplier", 18, None), ("Supplier part no", 16, None), ("Price per pack", 12, "#,##0.00"),
    ("Currency", 9, None), ("Subtotal", 13, "#,##0.00"), ("Supply [L]", 12, "#,##0.0"), ("Short [L]", 10, None),
)
OIL_COL = {name: get_column_letter(i) for i, (name, _, _) in enumerate(OIL_COLUMNS, 1)}


def _oil_filter_sheet(wb: Workbook, order: Order, order_rows: dict[str, int], oil_rows: dict[str, tuple[int, int]],
                      page: Page) -> None:
    """One row per pack of each fluid's plan (the engine's, :mod:`kit.engine.supplier_choice`): the
    counts are the plan; subtotal, supply and what is still short are formulas over them."""
    sheet = _Sheet(wb, "Oil and filters", OIL_COLUMNS, page, wrapped=("Fluid", "Supplier", "Supplier part no"))
    k = OIL_COL
    for oil in order.oil:
        o = order_rows[oil.fluid_key]
        first, last = oil_rows[oil.fluid_key]
        category = oil.fluid_key.split(":")[1].split()[0].upper()
        for pack in oil.plan.packs or (None,):
            r = sheet.rows + 1
            to_order = f"{k['To order [L]']}{r}"
            offer = pack.offer if pack else None
            sheet.append([
                oil.designation, Formula(f"='Order lines'!{COL['Required']}{o}"), Formula(f"='Order lines'!{COL['On board']}{o}"),
                Formula(f"='Order lines'!{COL['To order']}{o}"), Formula(f"={to_order}*{density_kg_per_l(category)}"),
                Formula(f"={to_order}/{L_PER_M3 / US_GAL_PER_M3}"),
                pack.label if pack else None, pack.content if pack else None, pack.count if pack else 0,
                offer.supplier if offer else None, offer.part_number if offer else None,
                offer.price if offer else None, offer.currency if offer else None,
                Formula(f'=IF({k["Price per pack"]}{r}="","",{k["Packs"]}{r}*{k["Price per pack"]}{r})'),
                Formula(f"={k['Packs']}{r}*N({k['Pack content [L]']}{r})"),
                Formula(f"=MAX(0,{to_order}-SUM({k['Supply [L]']}{first}:{k['Supply [L]']}{last}))"),
            ])
    sheet.finish()
    filters = _Sheet(wb, "Filter elements", (("Vessel", 18, None), ("Unit", 10, None), ("Position", 12, None),
                                             ("Element", 20, None), ("Elements per change", 10, None), ("Changes due", 10, None),
                                             ("Spare sets", 10, None), ("Elements", 10, None)), page,
                     wrapped=("Element",), landscape=False)
    for r in order.results:
        for u in r.units:
            for f in u.filters:
                filters.append([r.vessel.id, u.unit.id, f.position, f.element_ref, f.elements_per_change, f.changes,
                                f.spare_sets, Formula(f"=E{filters.rows + 1}*(F{filters.rows + 1}+G{filters.rows + 1})")])
    filters.finish()


# One column a rule of SOLAS II-1/29 (kit.engine.solas.judge and the storage tank), each cell its verdict.
RULE_COLUMNS = ("SOLAS II-1/29.3.2", "SOLAS II-1/29.6.1.1", "SOLAS II-1/29.6.1.2", "SOLAS II-1/29.6.1.3",
                "SOLAS II-1/29.16.1", "SOLAS II-1/29.6.1.3 reduced mode", "SOLAS II-1/29.3.3", "SOLAS II-1/29.4.3",
                "SOLAS II-1/29.2.2", "SOLAS II-1/29.2.3", "SOLAS II-1/29.12.3")


def rule_cells(rules: list) -> list[str | None]:
    """The verdict of each of ``RULE_COLUMNS`` (blank where the rule was not judged), with the
    reduced mode's figures in its cell since its verdict is only "info"."""
    found = {r.clause: (r.text if r.verdict == "info" else r.verdict) for r in rules}
    return [found.get(clause) for clause in RULE_COLUMNS]


def rule_summary(rules: list) -> str | None:
    """The SOLAS II-1/29 verdicts of a unit grouped: how many rules are met, then the clauses (short,
    "29.6.1.1") of each other verdict, e.g. "8 met; not met: 29.3.2; not shown: 29.16.1"."""
    if not rules:
        return None
    groups: dict[str, list[str]] = {}
    for r in rules:
        if r.verdict != "info":
            groups.setdefault(r.verdict, []).append(r.clause.replace("SOLAS II-1/", ""))
    parts = [f"{len(groups.pop('met', []))} met"]
    parts += [f"{verdict}: {', '.join(clauses)}" for verdict, clauses in groups.items()]
    return "; ".join(parts)


# The Gear checks sheet: the verdicts a reader looks for first, the print area (A4 landscape, one
# page wide); the figures behind them and each rule's own column follow, outside it.
CHECK_COLUMNS = (
    ("Vessel", 17, None), ("Unit", 9, None), ("Service", 12, None), ("Actuator", 12, None), ("Swing judged [s]", 9, None),
    ("Limit [s]", 7, None), ("28 s rule", 8, None), ("Travel within stroke", 9, None), ("Pressure within ratings", 9, None),
    ("Margin over rudder torque [%]", 10, None), ("Auxiliary steering gear required", 12, None),
    ("SOLAS II-1/29 verdicts", 27, None), ("Warnings", 33, None),
    ("Ship type", 10, None), ("Torque midships [kNm]", 12, None), ("Torque at max angle [kNm]", 12, None),
    ("Swing 35-30 one pump [s]", 11, None), ("Swing 35-30 all pumps [s]", 11, None), ("Judged on", 40, None),
    ("Travel [mm]", 10, None), ("Stroke [mm]", 10, None), ("Working pressure [bar]", 11, None), ("Torque basis", 40, None),
    ("Rudder torque ahead [kNm]", 12, None), ("Rudder torque astern [kNm]", 12, None), ("Gear torque at 35 deg [kNm]", 12, None),
    ("Gear torque pressure [bar]", 11, None), ("Rudder angle reachable [deg]", 10, None),
    ("Pump flow needed each [L/min]", 11, None), *((clause, 14, None) for clause in RULE_COLUMNS),
)
CHECKS_PRINTED = 13  # Vessel to Warnings


def _checks_sheet(wb: Workbook, order: Order, page: Page) -> None:
    sheet = _Sheet(wb, "Gear checks", CHECK_COLUMNS, page, printed=CHECKS_PRINTED,
                   wrapped=("Vessel", "SOLAS II-1/29 verdicts", "Warnings", "Auxiliary steering gear required"))
    yes = {True: "yes", False: "NO", None: None}
    k = lambda x: None if x is None else round(x / 1000, 1)  # noqa: E731
    s = lambda x: None if x is None else round(x, 1)  # noqa: E731
    for r in order.results:
        for u in r.units:
            c = u.checks
            load = c.rudder_load
            values = {
                "Vessel": r.vessel.id, "Ship type": r.vessel.ship_type, "Unit": u.unit.id, "Service": u.unit.service,
                "Actuator": u.unit.actuator, "Torque midships [kNm]": k(c.torque_midships),
                "Torque at max angle [kNm]": k(c.torque_max_angle), "Swing 35-30 one pump [s]": s(c.swing_time_one_pump),
                "Swing 35-30 all pumps [s]": s(c.swing_time_all_pumps), "Swing judged [s]": s(c.swing_time_judged),
                "Judged on": c.judging_case, "Limit [s]": 28 if u.unit.is_steering else None,
                "28 s rule": yes[c.swing_rule_met], "Travel [mm]": None if c.travel is None else round(c.travel * 1000),
                "Stroke [mm]": None if c.stroke is None else round(c.stroke * 1000), "Travel within stroke": yes[c.travel_ok],
                "Working pressure [bar]": round(u.unit.working_pressure / PA_PER_BAR, 1),
                "Pressure within ratings": yes[c.pressure_ok], "Warnings": " | ".join(u.warnings) or None,
                "Torque basis": c.torque_basis, "Rudder torque ahead [kNm]": k(load and load.torque_ahead),
                "Rudder torque astern [kNm]": k(load and load.torque_astern), "Gear torque at 35 deg [kNm]": k(c.gear_torque_35),
                "Gear torque pressure [bar]": None if c.gear_torque_pressure is None else round(c.gear_torque_pressure / PA_PER_BAR, 1),
                "Margin over rudder torque [%]": None if c.rudder_margin is None else round(100 * c.rudder_margin, 1),
                "Rudder angle reachable [deg]": s(c.reachable_angle and math.degrees(c.reachable_angle)),
                "Pump flow needed each [L/min]": s(c.pump_flow_needed and c.pump_flow_needed * L_MIN_PER_M3_S),
                "Auxiliary steering gear required": None if not u.unit.is_steering else {
                    True: "yes", False: "no", None: "unless 29.6.1.3 shown"}[c.auxiliary_gear_required],
                "SOLAS II-1/29 verdicts": rule_summary(c.rules),
                **dict(zip(RULE_COLUMNS, rule_cells(c.rules))),
            }
            sheet.append([values[name] for name, _, _ in CHECK_COLUMNS])
    sheet.finish()


MAX_VESSELS_LISTED = 12
COVER_LINE_CHARS = 90  # of the Value column's 100: bold text is wider, and a line never runs past the page


def _long(sheet: _Sheet, item: str, text: str, header: bool = False) -> None:
    """Long cover text over as many rows as it needs: row heights do not grow by themselves in
    every spreadsheet program, so a wrapped cell could hide its end."""
    import textwrap

    for i, part in enumerate(textwrap.wrap(text, COVER_LINE_CHARS) or [""]):
        sheet.append([item if i == 0 else None, part], header=header and i == 0)


def policy_groups(order: Order) -> list[tuple[str, list[str]]]:
    """One entry per distinct spares policy of the order, first vessel's first: "name (source)"
    and the ids of the vessels worked out under it."""
    found: dict[str, list[str]] = {}
    for r in order.results:
        found.setdefault(f"{r.policy.name} ({r.policy.source})", []).append(r.vessel.id)
    return list(found.items())


def _cover(wb: Workbook, order: Order, days: float, scope: str, page: Page) -> None:
    sheet = _Sheet(wb, "Cover", (("Item", 34, None), ("Value", 100, None)), page, header_row=False)
    policies = policy_groups(order)
    sheet.append(["Bill of materials: steering gear and hydraulic spares"], header=True)
    sheet.append(["Scope", scope])
    if len(order.results) <= MAX_VESSELS_LISTED:
        _long(sheet, "Vessels", ", ".join(f"{r.vessel.name} ({r.vessel.id})" for r in order.results))
    else:
        sheet.append(["Vessels", f"{len(order.results)} vessels: see the Vessel split sheet"])
    _series_rows(sheet, order)
    sheet.append(["Prepared on", dt.date.today().isoformat()])
    sheet.append(["Period [days]", days])
    if len(policies) <= 1:
        sheet.append(["Spares policy in force", policies[0][0] if policies else ""])
    else:
        for text, ids in policies:
            vessels = ", ".join(ids) if len(ids) <= MAX_VESSELS_LISTED else f"{len(ids)} vessels"
            _long(sheet, "Spares policy in force", f"{text}: {vessels}")
        first = order.results[0].policy
        _long(sheet, "Oil packages bought", f"from the first vessel's policy, {first.name}: "
              + ", ".join(f"{p.name} {p.volume * L_PER_M3:g} L" for p in order.packages))
    n = len(order.lines) + 1
    sheet.append(["Order lines", len(order.lines)])
    sheet.append(["Lines with something to order", Formula(f"=COUNTIF('Order lines'!{COL['To order']}2:{COL['To order']}{n},\">0\")")])
    _money_rows(sheet, order, n)
    _date_rows(sheet, order, n)
    sheet.append([])
    _long(sheet, "CAUTION", SAFETY, header=True)
    notes = [
        ("Series housings", "Seal housings and O-rings sized from the ISO series (ISO 5597, ISO 6195, ISO 10766, ISO 3601) "
                            "are to be checked against the maker's drawing before ordering; rows of kit's tables marked "
                            "'from memory' are not confirmed from the standard's text."),
        ("Basis of each line", "SOLAS II-1/29.12.3: storage tank able to recharge one power actuating system including "
                               "its reservoir. 'common practice': a trade rule of thumb. 'company policy': the company's "
                               "spares policy file."),
        ("Live formulas", "To order = MAX(0, Required - On board); Packs = To order / Pack size, rounded up; "
                          "Line total = Packs x Price per pack; Line total in base = Line total x Rate to base. "
                          "Edit 'On board' and the order follows."),
        ("Oil packs", "Planned once per fluid over the whole order in the chosen supplier's packs: the cheapest mix that "
                      "is never short and overshoots by less than the smallest pack; the spares policy's packages where "
                      "no supplier offers the oil. The counts are the plan (Oil and filters sheet); if an edited "
                      "on-board count needs more, 'Short [L]' there says how much."),
        ("Supplier choice", "A supplier preferred for the part, then a preferred supplier, wins over price; otherwise "
                            "the cheapest offer in the base currency that arrives in time (today + lead time + handling "
                            "days by the delivery date), else the fastest, marked late. Order by = delivery date - lead "
                            "time - handling days. Sort the Order lines sheet by 'Order by' with its filter."),
    ]
    for item, text in notes:
        _long(sheet, item, text)


def _series_rows(sheet: _Sheet, order: Order) -> None:
    """Which vessels are sister ships built alike (see :mod:`kit.engine.series_of_hulls`)."""
    names = {r.vessel.id: r.vessel.name for r in order.results}
    for s in order.series[:MAX_VESSELS_LISTED]:
        hulls = ", ".join(f"{names[h]} ({h})" for h in s.hulls) if len(s.hulls) <= MAX_VESSELS_LISTED else f"{len(s.hulls)} vessels"
        _long(sheet, "Series of hulls", f"the {s.lead} series, {len(s.hulls)} hulls built alike: {hulls}")
    if len(order.series) > MAX_VESSELS_LISTED:
        sheet.append(["Series of hulls", f"and {len(order.series) - MAX_VESSELS_LISTED} more series"])
    if order.series:
        _long(sheet, "Per hull, Hulls", "on the Order lines sheet where every hull of one series needs the same "
              "quantity: Required = Per hull x Hulls; blank where the vessels of a line are not one series or need "
              "different quantities (see the Vessel split sheet)")


def _range(name: str, n: int) -> str:
    return f"'Order lines'!{COL[name]}2:{COL[name]}{n}"


def _money_rows(sheet: _Sheet, order: Order, n: int) -> None:
    """Totals per currency and in the base currency, the rates used and those missing."""
    currencies = sorted({line.currency for line in order.lines if line.currency})
    for cur in currencies:
        sheet.append([f"Total of priced lines [{cur}]",
                      Formula(f"=SUMIF({_range('Currency', n)},{_equal_to(cur)},{_range('Line total', n)})")])
    base, cur = order.base_currency, order.currency
    if base:
        sheet.append(["Base currency", base])
    elif cur:
        _long(sheet, "Base currency", f"none set: offers compared in {cur}, the currency of most offers"
              + ("; offers in other currencies were not compared on price" if order.missing_rates else ""))
    else:
        sheet.append(["Base currency", "none set"])
    if cur:
        sheet.append([f"Total in base currency [{cur}]", Formula(f"=SUM({_range('Line total in base', n)})")])
        rated = sorted({line.currency for line in order.lines if line.currency and line.currency != cur and line.rate})
        if rated and order.purchasing:
            rates = order.purchasing.rates
            _long(sheet, "Exchange rates used", "; ".join(
                f"1 {c} = {rates[c].rate:g} {cur} (set {rates[c].set_on.isoformat()}, {rates[c].source})" for c in rated if c in rates))
    unconverted = sum(1 for line in order.lines if line.line_total is not None and line.line_total_base is None)
    sheet.append(["Priced lines left out of the base total", unconverted])
    if order.missing_rates:
        _long(sheet, "Missing exchange rates", f"no rate into {cur} for {', '.join(order.missing_rates)}: offers in "
              f"{'it' if len(order.missing_rates) == 1 else 'them'} were ranked after the offers compared on price "
              "(set the rates, then write the order again)")
    unpriced = sum(1 for line in order.lines if line.line_total is None)
    sheet.append(["Lines with no catalogue price", unpriced])


def _date_rows(sheet: _Sheet, order: Order, n: int) -> None:
    """Handling margin, late lines and the first order-by date."""
    purchasing = order.purchasing
    if purchasing is None:
        return
    sheet.append(["Handling days (dispatch to on board)", purchasing.handling_days])
    sheet.append(["Late lines (cannot arrive in time)", Formula(f'=COUNTIF({_range("Late", n)},"{LATE}")')])
    dates = [line.order_by for line in order.lines if line.order_by]
    if dates:
        sheet.append(["First order-by date", min(dates).isoformat()])
    elif not purchasing.deliveries:
        sheet.append(["Order-by dates", "no delivery set for these vessels (kit delivery set)"])


def write_workbook(order: Order, path: str | Path, days: float, scope: str, paper: str = DEFAULT_PAPER) -> Path:
    """Write the bill of materials workbook of ``order`` to ``path`` atomically, to print on
    ``paper`` ("a4" or "letter") with ``scope`` and today's date in every page header."""
    path = Path(path)
    page = Page(paper, scope, dt.date.today().isoformat())
    wb = Workbook(write_only=True)
    use_font(wb)
    _cover(wb, order, days, scope, page)
    oil_rows = _oil_layout(order)
    rows = _order_sheet(wb, order, oil_rows, page)
    _split_sheet(wb, order, page)
    _seal_sheet(wb, order, page)
    _oil_filter_sheet(wb, order, rows, oil_rows, page)
    _checks_sheet(wb, order, page)
    save_atomically(wb, path)
    return path


def save_atomically(wb: Workbook, path: Path) -> None:
    """Save ``wb`` to a temporary file beside ``path`` and rename it into place."""
    replace_atomically(path, wb.save)


__all__ = ["write_workbook", "save_atomically"]
