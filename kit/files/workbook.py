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
from pathlib import Path
from typing import Any, Iterable

from openpyxl import Workbook
from openpyxl.cell import WriteOnlyCell
from openpyxl.styles import Alignment, Font, PatternFill
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.properties import PageSetupProperties

from kit.engine.display_units import L_MIN_PER_M3_S, L_PER_M3, PA_PER_BAR, US_GAL_PER_M3
from kit.engine.bom import Order
from kit.safety import SAFETY
from kit.files.atomic import replace_atomically
from kit.engine.oil_grades import density_kg_per_l
from kit.engine.report import seal_json
from kit.files.safe_text import CONTROL, TRIGGERS, is_risky, visible
from kit.engine.seal_kit import mm

HEADER_FONT = Font(bold=True)
HEADER_FILL = PatternFill("solid", fgColor="DDE4EA")
WRAP = Alignment(wrap_text=True, vertical="top")
HEADER_LINE_PT = 13.0  # one line of the bold heading font, with its leading

# Number formats only on money, which a purchaser reads to the cent; quantities kit rounds itself
# (and the formulas over them) read as they are in General. A styled cell costs several times a
# plain one to write: in a 1,000-vessel order the quantity formats alone took about 0.5 s.
DATE = "yyyy-mm-dd"
ORDER_COLUMNS = (
    ("No", 6, None), ("Designation", 60, None), ("Standard", 18, None), ("Compound", 10, None),
    ("Required", 11, None), ("Per hull", 9, None), ("Hulls", 7, None), ("On board", 11, None), ("To order", 11, None), ("UoM", 6, None),
    ("Pack size", 10, None), ("Packs", 8, None), ("Supplier", 18, None), ("Supplier part no", 18, None),
    ("Price per pack", 12, "#,##0.00"), ("Currency", 9, None), ("Line total", 13, "#,##0.00"),
    ("Rate to base", 10, None), ("Line total in base", 13, "#,##0.00"), ("Order by", 11, DATE), ("Late", 6, None),
    ("Earliest arrival", 11, DATE), ("Delivery", 24, None), ("Lead time [days]", 10, None),
    ("Why this supplier", 44, None), ("Basis", 30, None), ("Vessels", 30, None), ("Part key", 40, None),
)
LATE = "late"
COL = {name: get_column_letter(i) for i, (name, _, _) in enumerate(ORDER_COLUMNS, 1)}


class _Sheet:
    """A write-only sheet with a styled, frozen, filtered header row and print set-up."""

    def __init__(self, wb: Workbook, title: str, columns: Iterable[tuple[str, int, str | None]], header_row: bool = True,
                 fit_width: bool = True):
        self.ws = wb.create_sheet(title)
        self.table = header_row
        self._reused: dict[tuple[int, str], WriteOnlyCell] = {}
        self.columns = list(columns)
        self.formats = [fmt for _, _, fmt in self.columns]
        self._formatted = [i for i, fmt in enumerate(self.formats) if fmt]
        for i, (_, width, _) in enumerate(self.columns, 1):
            self.ws.column_dimensions[get_column_letter(i)].width = width
        ps = self.ws.page_setup
        ps.orientation = "landscape"
        ps.fitToWidth, ps.fitToHeight = (1 if fit_width else 0), 0
        self.ws.sheet_properties.pageSetUpPr = PageSetupProperties(fitToPage=fit_width)
        self.rows = 0
        if header_row:
            self.ws.freeze_panes = "A2"
            self.ws.print_title_rows = "1:1"
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
            for i in self._formatted:
                v = row[i] if i < len(row) else None
                if v is not None and (not isinstance(v, str) or isinstance(v, Formula)):
                    row[i] = self._styled(i, "fmt", v)
            for i, v in enumerate(row):
                if isinstance(v, str) and not isinstance(v, Formula):
                    if CONTROL.search(v):  # stored by another program: openpyxl would refuse the cell
                        row[i] = v = visible(v)
                    if v.startswith(TRIGGERS):
                        row[i] = self._styled(i, "text", v)
        self.ws.append(row)
        self.rows += 1
        return self.rows

    def finish(self) -> None:
        if self.rows > 1:
            self.ws.auto_filter.ref = f"A1:{get_column_letter(len(self.columns))}{self.rows}"


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


def _order_sheet(wb: Workbook, order: Order, oil_rows: dict[str, tuple[int, int]]) -> dict[str, int]:
    sheet = _Sheet(wb, "Order lines", ORDER_COLUMNS)
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
        sheet.append([
            line.number, line.designation, line.standard, line.compound,
            required, None if line.per_hull is None else round(line.per_hull, 3), line.hulls, round(line.on_board, 3),
            Formula(f"=MAX(0,{c['Required']}{r}-{c['On board']}{r})"), line.uom, pack, packs_cell,
            line.supplier, offer.part_number if offer else None, line.price, line.currency, total,
            line.rate, base_total, line.order_by, LATE if line.late else None, line.earliest_arrival,
            _delivery_text(line), line.lead_time_days, line.reason or None, line.basis,
            "; ".join(f"{v}: {q:g}" for v, q in line.split.items()), line.key,
        ])
        rows[line.key] = r
    sheet.finish()
    return rows


def _split_sheet(wb: Workbook, order: Order) -> None:
    sheet = _Sheet(wb, "Vessel split", (("No", 6, None), ("Designation", 60, None), ("Vessel", 20, None),
                                         ("Required", 11, None), ("UoM", 6, None)))
    for line in order.lines:
        for vessel, qty in line.split.items():
            sheet.append([line.number, line.designation, vessel, round(qty, 3), line.uom])
    sheet.finish()


def _seal_sheet(wb: Workbook, order: Order) -> None:
    cols = (("Vessel", 18, None), ("Unit", 10, None), ("Actuator", 11, None), ("Role", 8, None), ("Part", 40, None),
            ("d [mm]", 9, None), ("D [mm]", 9, None), ("L [mm]", 9, None), ("O-ring ID [mm]", 10, None),
            ("O-ring CS [mm]", 10, None), ("Strip t [mm]", 9, None), ("Cut length [mm]", 11, None),
            ("Qty per actuator", 10, None), ("Qty per unit", 9, None), ("Compound", 10, None), ("Standard", 22, None),
            ("Dimensions from", 34, None))
    sheet = _Sheet(wb, "Seal kits", cols)
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


def _oil_filter_sheet(wb: Workbook, order: Order, order_rows: dict[str, int], oil_rows: dict[str, tuple[int, int]]) -> None:
    """One row per pack of each fluid's plan (the engine's, :mod:`kit.engine.supplier_choice`): the
    counts are the plan; subtotal, supply and what is still short are formulas over them."""
    sheet = _Sheet(wb, "Oil and filters", OIL_COLUMNS)
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
                                             ("Spare sets", 10, None), ("Elements", 10, None)))
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


def _checks_sheet(wb: Workbook, order: Order) -> None:
    cols = (("Vessel", 18, None), ("Ship type", 10, None), ("Unit", 10, None), ("Service", 11, None), ("Actuator", 11, None),
            ("Torque midships [kNm]", 12, None), ("Torque at max angle [kNm]", 12, None),
            ("Swing 35-30 one pump [s]", 11, None), ("Swing 35-30 all pumps [s]", 11, None),
            ("Swing judged [s]", 10, None), ("Judged on", 40, None), ("Limit [s]", 8, None), ("28 s rule", 9, None),
            ("Travel [mm]", 10, None), ("Stroke [mm]", 10, None), ("Travel within stroke", 10, None),
            ("Working pressure [bar]", 11, None), ("Pressure within ratings", 10, None), ("Warnings", 80, None),
            ("Torque basis", 40, None), ("Rudder torque ahead [kNm]", 12, None), ("Rudder torque astern [kNm]", 12, None),
            ("Gear torque at 35 deg [kNm]", 12, None), ("Gear torque pressure [bar]", 11, None),
            ("Margin over rudder torque [%]", 11, None),
            ("Rudder angle reachable [deg]", 10, None), ("Pump flow needed each [L/min]", 11, None),
            ("Auxiliary steering gear required", 12, None), *((clause, 14, None) for clause in RULE_COLUMNS))
    # some 40 columns: fitted to one page wide they print at a fifth of their size; print them
    # across pages instead, each with the vessel and unit
    sheet = _Sheet(wb, "Gear checks", cols, fit_width=False)
    sheet.ws.print_title_cols = "A:C"
    yes = {True: "yes", False: "NO", None: None}
    for r in order.results:
        for u in r.units:
            c = u.checks
            k = lambda x: None if x is None else round(x / 1000, 1)  # noqa: E731
            s = lambda x: None if x is None else round(x, 1)  # noqa: E731
            sheet.append([r.vessel.id, r.vessel.ship_type, u.unit.id, u.unit.service, u.unit.actuator,
                          k(c.torque_midships), k(c.torque_max_angle), s(c.swing_time_one_pump), s(c.swing_time_all_pumps),
                          s(c.swing_time_judged), c.judging_case, 28 if u.unit.is_steering else None,
                          yes[c.swing_rule_met], None if c.travel is None else round(c.travel * 1000),
                          None if c.stroke is None else round(c.stroke * 1000), yes[c.travel_ok],
                          round(u.unit.working_pressure / PA_PER_BAR, 1), yes[c.pressure_ok], " | ".join(u.warnings),
                          *_rudder_cells(c),
                          s(c.reachable_angle and math.degrees(c.reachable_angle)),
                          s(c.pump_flow_needed and c.pump_flow_needed * L_MIN_PER_M3_S),
                          None if not u.unit.is_steering else {True: "yes", False: "no", None: "unless 29.6.1.3 shown"}[c.auxiliary_gear_required],
                          *rule_cells(c.rules)])
    sheet.finish()


def _rudder_cells(c) -> list:
    """Torque basis and the gear against the rudder (kNm, bar, %), blank where not worked out."""
    load = c.rudder_load
    k = lambda x: None if x is None else round(x / 1000, 1)  # noqa: E731
    return [c.torque_basis, k(load and load.torque_ahead), k(load and load.torque_astern), k(c.gear_torque_35),
            None if c.gear_torque_pressure is None else round(c.gear_torque_pressure / PA_PER_BAR, 1),
            None if c.rudder_margin is None else round(100 * c.rudder_margin, 1)]


MAX_VESSELS_LISTED = 12
COVER_LINE_CHARS = 110


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


def _cover(wb: Workbook, order: Order, days: float, scope: str) -> None:
    sheet = _Sheet(wb, "Cover", (("Item", 34, None), ("Value", 100, None)), header_row=False)
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


def write_workbook(order: Order, path: str | Path, days: float, scope: str) -> Path:
    """Write the bill of materials workbook of ``order`` to ``path`` atomically."""
    path = Path(path)
    wb = Workbook(write_only=True)
    _cover(wb, order, days, scope)
    oil_rows = _oil_layout(order)
    rows = _order_sheet(wb, order, oil_rows)
    _split_sheet(wb, order)
    _seal_sheet(wb, order)
    _oil_filter_sheet(wb, order, rows, oil_rows)
    _checks_sheet(wb, order)
    save_atomically(wb, path)
    return path


def save_atomically(wb: Workbook, path: Path) -> None:
    """Save ``wb`` to a temporary file beside ``path`` and rename it into place."""
    replace_atomically(path, wb.save)


__all__ = ["write_workbook", "save_atomically"]
