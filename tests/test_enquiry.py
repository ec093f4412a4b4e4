# SPDX-License-Identifier: MIT
"""Enquiries end to end through the commands: written from the order (one workbook per supplier and
an open one), filled in as a supplier would with openpyxl, read back as that supplier's offers and
used by the next order; refused replies; nothing internal in what goes out; LibreOffice reads them.

The fleet, suppliers, prices and part numbers are invented for these plumbing tests.
"""

from __future__ import annotations

import csv
import datetime as dt
import re
import shutil
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner
from sqlalchemy import insert

from catalog_schema.core_tables import DELIVERIES
from catalog_schema.engine import make_engine
from db_support import db_url, dump  # noqa: F401  (fixtures)
from kit.cli import main
from kit.files.particulars_file import load_vessel
from kit.engine.requirements import assess_vessel
from kit.files.policy_file import load_policy
from kit.files.enquiry_workbook import HEADINGS, REPLY_COLUMNS
from kit.services.orders import build_order
from spreadsheet_program import recalculated_sheets

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"
VESSELS = ("corvina_bay.toml", "saltmere_crest.toml")
SEALS, SPARES = "Quayside Test Seals", "Harbourline Test Spares"
NEW_SUPPLIER = "Westreach Test Hydraulics"
SEAL_PRICE, SPARE_PRICE, DEARER = 11.37, 77.91, 93.29  # invented, distinct, so a scan finds them
COL = {name: i for i, name in enumerate(HEADINGS)}


def kit(db: str, *args: str):
    return CliRunner().invoke(main, [*args, "--db", db])


def _keys() -> dict[str, str]:
    """Part key -> kind of every line the two vessels need."""
    keys = {}
    for name in VESSELS:
        for li in assess_vessel(load_vessel(DEMO / name), 180, load_policy()).lines:
            keys[li.key] = li.kind
    return keys


def _catalogue(path: Path, rows: list[tuple[str, str, float, int]]) -> Path:
    with path.open("w", newline="", encoding="utf-8") as f:
        out = csv.writer(f)
        out.writerow(["supplier_ref", "part_key", "pack_qty", "price", "currency", "lead_time_days"])
        for ref, key, price, pack in rows:
            out.writerow([ref, key, pack, price, "EUR", 10])
    return path


@pytest.fixture
def fleet(db_url, tmp_path):
    """Two demo vessels (same valve block, same return filter element) in a database, their parts
    registered, seals offered by one supplier (and dearer by the other), spares by the other;
    filter elements offered by nobody; a delivery set for Corvina Bay."""
    for args in (["db", "upgrade"], *(["load", str(DEMO / n)] for n in VESSELS), ["parts", "register"]):
        result = kit(db_url, *args)
        assert result.exit_code == 0, result.output
    keys = _keys()
    seals = [k for k, kind in keys.items() if kind not in ("spare", "filter_element", "oil")]
    spares = [k for k, kind in keys.items() if kind == "spare"]
    rows_a = [(f"QS-{i:04d}", k, SEAL_PRICE, 2) for i, k in enumerate(seals)]
    rows_b = [(f"HB-{i:04d}", k, SPARE_PRICE, 1) for i, k in enumerate(spares)] + [(f"HB-S{i:04d}", k, DEARER, 2)
                                                                                 for i, k in enumerate(seals)]
    for supplier, rows in ((SEALS, rows_a), (SPARES, rows_b)):
        path = _catalogue(tmp_path / f"{supplier}.csv", rows)
        result = kit(db_url, "catalogue", "import", str(path), "--supplier", supplier)
        assert result.exit_code == 0, result.output
    engine = make_engine(db_url)
    with engine.begin() as conn:
        conn.execute(insert(DELIVERIES).values(vessel_id="CORVINA-BAY", port="Rotterdam", due_on=dt.date(2031, 3, 14)))
    yield db_url, engine, keys
    engine.dispose()


def _write(db: str, out: Path) -> dict[str, Path]:
    result = kit(db, "enquiry", "write", "--out", str(out), "--days", "180")
    assert result.exit_code == 0, result.output
    return {p.stem: p for p in out.glob("*.xlsx")}


def _written_and_ordered(fleet, tmp_path: Path) -> tuple[dict[str, Path], object, dict]:
    """The enquiries written, the order they came from, and its lines by designation."""
    db, engine, _ = fleet
    files = _write(db, tmp_path / "enquiries")
    order, _ = build_order(engine, [], 180)
    return files, order, {li.designation: li for li in order.lines}


def _rows(path: Path) -> list[tuple]:
    ws = openpyxl.load_workbook(path)["Lines"]
    return [r for r in ws.iter_rows(min_row=2, values_only=True)]


def _enquiry_id(path: Path) -> str:
    ws = openpyxl.load_workbook(path)["Enquiry"]
    return next(r[1] for r in ws.iter_rows(values_only=True) if r[0] == "Enquiry reference")


def _fill(path: Path, target: Path, quotes: dict[int, tuple], name: str | None = None) -> Path:
    """Fill the supplier's cells of the data rows ``quotes`` (row index from 0 -> part number, price,
    currency, pack, lead time), as a supplier would, and save as ``target``."""
    wb = openpyxl.load_workbook(path)
    ws = wb["Lines"]
    for i, values in quotes.items():
        for heading, value in zip((n for n, _, _ in REPLY_COLUMNS), values):
            ws.cell(i + 2, COL[heading] + 1, value)
    if name is not None:
        cover = wb["Enquiry"]
        row = next(r for r in cover.iter_rows() if r[0].value == "Your company name")
        row[1].value = name
    wb.save(target)
    return target


def test_round_trip_reply_becomes_the_suppliers_offer(fleet, tmp_path):
    db, engine, _ = fleet
    files = _write(db, tmp_path / "enquiries")
    assert set(files) == {SEALS, SPARES, "any-supplier"}
    order, _ = build_order(engine, [], 180)
    by_designation = {li.designation: li for li in order.lines}
    seal_rows = _rows(files[SEALS])
    # Only that supplier's lines, each with something to order.
    assert {r[COL["Designation"]] for r in seal_rows} == {li.designation for li in order.lines
                                                         if li.supplier == SEALS and li.to_order > 0}
    first = by_designation[seal_rows[0][COL["Designation"]]]
    reply = _fill(files[SEALS], tmp_path / "reply.xlsx", {0: ("QS-NEW-1", 9.5, "EUR", "4 pcs", 21, "next week")})
    result = kit(db, "enquiry", "read", str(reply))
    assert result.exit_code == 0, result.output
    eid = _enquiry_id(files[SEALS])
    assert result.output.splitlines()[0] == f"{SEALS}: enquiry {eid}, 1 line(s) quoted, {len(seal_rows) - 1} not quoted"
    # An open enquiry's line, quoted by a supplier kit has not heard of.
    open_rows = _rows(files["any-supplier"])
    open_line = by_designation[open_rows[0][COL["Designation"]]]
    assert open_line.supplier is None
    reply2 = _fill(files["any-supplier"], tmp_path / "reply2.xlsx", {0: ("WR 100", "4.25", "usd", None, 5, None)}, NEW_SUPPLIER)
    result = kit(db, "enquiry", "read", str(reply2))
    assert result.exit_code == 0, result.output
    after = {li.key: li for li in build_order(engine, [], 180)[0].lines}
    m = after[first.key].offer
    assert (m.supplier, m.part_number, m.price, m.currency, m.pack_content, m.lead_time_days) == (SEALS, "QS-NEW-1", 9.5, "EUR", 4, 21)
    m = after[open_line.key].offer
    assert (m.supplier, m.part_number, m.price, m.currency, m.pack_content) == (NEW_SUPPLIER, "WR 100", 4.25, "USD", 1)
    # The rest of the seal supplier's catalogue stays: its other lines still come from it at its price.
    second = by_designation[seal_rows[1][COL["Designation"]]]
    assert (after[second.key].supplier, after[second.key].price) == (SEALS, SEAL_PRICE)


def test_lines_carry_quantity_packs_vessels_delivery_and_service(fleet, tmp_path):
    files, order, lines = _written_and_ordered(fleet, tmp_path)
    for name, path in files.items():
        for row in _rows(path):
            line = lines[row[COL["Designation"]]]
            assert row[COL["Quantity"]] == pytest.approx(line.to_order) and row[COL["UoM"]] == line.uom
            if name == "any-supplier":
                assert row[COL["Packs"]] is None and row[COL["Pack"]] is None
            else:
                assert row[COL["Packs"]] == line.packs and row[COL["Pack"]] == line.pack_label
            vessels = row[COL["Vessels (units)"]]
            assert all(v in vessels for v in line.split)
            if "CORVINA-BAY" in line.split:
                assert row[COL["Deliver by"]].date() == dt.date(2031, 3, 14) and "Rotterdam" in row[COL["Delivery port"]]
            else:
                assert row[COL["Deliver by"]] is None and row[COL["Delivery port"]] is None
            # service conditions: the working pressure and fluid of the units it is for
            assert re.fullmatch(r"(\d+(\.\d+)? bar, H[A-Z]+ \d+)(; \d+(\.\d+)? bar, H[A-Z]+ \d+)*", row[COL["Service conditions"]])
    everything = [r for p in files.values() for r in _rows(p)]
    # A line with nothing to order is in no enquiry.
    assert len(everything) == sum(1 for li in order.lines if li.to_order > 0)
    # The return filter element both vessels use (same reference) is one line for both.
    element = [r for r in everything if "Tarnwick RF-160-10" in r[COL["Designation"]]]
    assert len(element) == 1 and "CORVINA-BAY (SG1)" in element[0][COL["Vessels (units)"]] \
        and "SALTMERE-CREST (SG1)" in element[0][COL["Vessels (units)"]]
    # A filter element with no reference names its vessel and unit.
    assert any(r[COL["Designation"]] == "filter element, pressure filter, steering unit SG1, vessel CORVINA-BAY" for r in everything)
    # Policy items name the maker and model of the valve block the particulars give.
    kits = [r for r in everything if r[COL["Designation"]].startswith("valve block seal kit")]
    assert [r[COL["Designation"]] for r in kits] == ["valve block seal kit, valve block Tarnwick Hydraulik TVB-16 twin"]
    assert kits[0][COL["Quantity"]] == 4  # 1 kit a block x 2 blocks, on each of the two vessels (kit default policy)


def test_nothing_internal_goes_out(fleet, tmp_path):
    db, engine, keys = fleet
    files = _write(db, tmp_path / "enquiries")
    for name, path in files.items():
        wb = openpyxl.load_workbook(path)
        cells = [c.value for ws in wb.worksheets for row in ws.iter_rows() for c in row if c.value is not None]
        text = [str(v) for v in cells]
        for key in keys:
            assert not any(key in t for t in text), (name, key)
        others = {SEALS, SPARES} - {name}
        assert not any(o in t for o in others for t in text), name
        prices = {SEAL_PRICE, SPARE_PRICE, DEARER}
        assert not any(isinstance(v, float) and v in prices for v in cells), name
        assert not any(str(p) in t for p in prices for t in text), name
        assert not any(t.startswith(("QS-", "HB-")) for t in text), name  # no catalogue part numbers of anyone
        for heading in ("Part key", "On board", "Required", "Price per pack", "Line total", "Supplier"):
            assert heading not in HEADINGS
        for ws in wb.worksheets:
            assert ws.protection.sheet
        ws = wb["Lines"]
        reply_from = len(HEADINGS) - len(REPLY_COLUMNS)
        for row in ws.iter_rows(min_row=2):
            assert [not c.protection.locked for c in row] == [i >= reply_from for i in range(len(HEADINGS))]
        cover = wb["Enquiry"]
        unlocked = [c.coordinate for row in cover.iter_rows() for c in row if not c.protection.locked]
        assert (unlocked != []) == (name == "any-supplier")


def test_libreoffice_opens_every_enquiry_with_kits_figures(fleet, tmp_path):
    files, order, lines = _written_and_ordered(fleet, tmp_path)
    for name, path in files.items():
        work = tmp_path / f"lo-{len(name)}"
        work.mkdir()
        plain = work / "enquiry.xlsx"  # LibreOffice names its CSVs after the file
        shutil.copy(path, plain)
        sheets = recalculated_sheets(plain, work)
        assert set(sheets) == {"Enquiry", "Lines"}
        rows = sheets["Lines"]
        assert tuple(rows[0]) == HEADINGS
        assert len(rows) - 1 == len(_rows(path))
        for row in rows[1:]:
            line = lines[row[COL["Designation"]]]
            assert float(row[COL["Quantity"]]) == pytest.approx(line.to_order)
            assert (row[COL["Packs"]] == "") == (name == "any-supplier")
            if row[COL["Packs"]]:
                assert int(row[COL["Packs"]]) == line.packs
        assert any("CAUTION" in cell for row in sheets["Enquiry"] for cell in row)


@pytest.mark.parametrize("change", ["wrong line ref", "foreign enquiry", "designation", "quantity", "Standard", "Compound",
                                    "Service conditions"])
def test_refused_replies_store_nothing(fleet, tmp_path, change):
    db, engine, _ = fleet
    files = _write(db, tmp_path / "enquiries")
    path = files[SEALS]
    eid = _enquiry_id(path)
    reply = _fill(path, tmp_path / "reply.xlsx", {0: ("QS-X", 9.5, "EUR", "2 pcs", 3, None)})
    wb = openpyxl.load_workbook(reply)
    ws = wb["Lines"]
    designation = ws.cell(2, COL["Designation"] + 1).value
    quantity = ws.cell(2, COL["Quantity"] + 1).value
    if change == "wrong line ref":
        ws.cell(2, 1, "E000101-000000-001")
        expected = (f"{reply}, sheet Lines, row 2: column Line ref: expected a line reference of enquiry {eid} "
                    "as we wrote it (a locked cell) (got 'E000101-000000-001')")
    elif change == "foreign enquiry":
        cover = wb["Enquiry"]
        next(r for r in cover.iter_rows() if r[0].value == "Enquiry reference")[1].value = "E000101-ABCDEF"
        expected = (f"{reply}, sheet Enquiry: Enquiry reference: expected the reference of an enquiry written from this "
                    "fleet database (kit enquiry write) (got 'E000101-ABCDEF')")
    elif change == "designation":
        ws.cell(2, COL["Designation"] + 1, designation + " (any make)")
        expected = (f"{reply}, sheet Lines, row 2: column Designation: expected {designation!r} as we wrote it "
                    f"(a locked cell) (got {designation + ' (any make)'!r})")
    elif change in ("Standard", "Compound", "Service conditions"):
        # a quote for another compound (or standard, or service) would be stored as an offer for the part asked
        written = ws.cell(2, COL[change] + 1).value
        ws.cell(2, COL[change] + 1, "FKM")
        shown = f"{written!r}" if written else "an empty cell"
        expected = f"{reply}, sheet Lines, row 2: column {change}: expected {shown} as we wrote it (a locked cell) (got 'FKM')"
    else:
        ws.cell(2, COL["Quantity"] + 1, quantity + 1)
        expected = (f"{reply}, sheet Lines, row 2: column Quantity: expected {quantity:g} as we wrote it (a locked cell) "
                    f"(got {float(quantity + 1)!r})" if isinstance(quantity, float) else
                    f"{reply}, sheet Lines, row 2: column Quantity: expected {quantity:g} as we wrote it (a locked cell) "
                    f"(got {quantity + 1!r})")
    wb.save(reply)
    before = dump(engine)
    result = kit(db, "enquiry", "read", str(reply))
    assert (result.exit_code, result.output) == (2, f"kit: error: {expected}\n")
    assert dump(engine) == before


@pytest.mark.parametrize(("quote", "column", "expected"), [
    (("QS-X", 9.5, "EUR", "ten", 3, None), "Your pack", 'a whole number of pieces, e.g. "10 pcs" or "1 set" (the part is counted in pieces)'),
    (("QS-X", 9.5, "XYZ", "2 pcs", 3, None), "Currency", None),
    ((None, 9.5, "EUR", "2 pcs", 3, None), "Your part number", "your part number for a line you quote"),
    (("QS-X", -1, "EUR", "2 pcs", 3, None), "Unit price (per your pack)", None),
    # a quote with no price (or a formula saved without its value) would replace the supplier's
    # priced offer for that part with an unpriced one: refused
    (("QS-X", None, "EUR", "2 pcs", 3, None), "Unit price (per your pack)",
     "your unit price per your pack for a line you quote (a number; a formula's value must be saved with it) (got an empty cell)"),
    (("QS-X", "=2*4", "EUR", "2 pcs", 3, None), "Unit price (per your pack)",
     "your unit price per your pack for a line you quote (a number; a formula's value must be saved with it) (got an empty cell)"),
])
def test_bad_reply_cells_are_refused_like_a_catalogues(fleet, tmp_path, quote, column, expected):
    db, engine, _ = fleet
    path = _write(db, tmp_path / "enquiries")[SEALS]
    reply = _fill(path, tmp_path / "reply.xlsx", {0: ("QS-OK", 1.0, "EUR", None, 1, None), 1: quote})
    before = dump(engine)
    result = kit(db, "enquiry", "read", str(reply))
    assert result.exit_code == 2
    assert result.output.startswith(f"kit: error: {reply}, sheet Lines, row 3: column {column}: expected "
                                    + (expected or "")), result.output
    assert len(result.output.splitlines()) == 1
    assert dump(engine) == before


def test_an_open_reply_from_a_known_supplier_in_other_letter_case_is_that_supplier(fleet, tmp_path):
    db, engine, _ = fleet
    files = _write(db, tmp_path / "enquiries")
    reply = _fill(files["any-supplier"], tmp_path / "reply.xlsx", {0: ("HB-F1", 4.5, "EUR", None, 5, None)}, SPARES.upper())
    result = kit(db, "enquiry", "read", str(reply))
    assert result.exit_code == 0 and result.output.startswith(f"{SPARES}: enquiry "), result.output
    assert sorted(row[1] for row in dump(engine, ["suppliers"])["suppliers"]) == sorted([SEALS, SPARES])


def test_open_reply_needs_the_suppliers_name(fleet, tmp_path):
    db, engine, _ = fleet
    path = _write(db, tmp_path / "enquiries")["any-supplier"]
    reply = _fill(path, tmp_path / "reply.xlsx", {0: ("WR 1", 2.0, "EUR", None, 1, None)})
    result = kit(db, "enquiry", "read", str(reply))
    assert (result.exit_code, result.output) == (
        2, f"kit: error: {reply}, sheet Enquiry: Your company name: expected the name of the supplier replying to this "
           "open enquiry (got None)\n")


def test_an_enquiry_reference_already_stored_is_drawn_again(fleet, tmp_path, monkeypatch):
    # References are E, the date and 3 random bytes: a draw that repeats a stored one (1 in 16.7
    # million a pair) is drawn again, not refused by the database's unique key.
    import kit.services.enquiries as service

    db, engine, _ = fleet
    draws = iter(["00000A", "00000B", "00000C"])
    monkeypatch.setattr(service.secrets, "token_hex", lambda n: next(draws))
    first = {_enquiry_id(p) for p in _write(db, tmp_path / "one").values()}
    draws = iter(["00000A", "00000B", "00000D", "00000C", "00000E", "00000F"])
    second = {_enquiry_id(p) for p in _write(db, tmp_path / "two").values()}
    today = f"E{dt.date.today():%y%m%d}"
    assert first == {f"{today}-00000A", f"{today}-00000B", f"{today}-00000C"}
    assert second == {f"{today}-00000D", f"{today}-00000E", f"{today}-00000F"}
    assert len(dump(engine, ["enquiries"])["enquiries"]) == 6


def test_a_reply_by_date_already_past_is_refused(fleet, tmp_path):
    db, engine, _ = fleet
    before = dump(engine)
    yesterday = dt.date.today() - dt.timedelta(days=1)
    result = kit(db, "enquiry", "write", "--out", str(tmp_path / "e"), "--days", "180", "--reply-by", yesterday.isoformat())
    assert (result.exit_code, result.output) == (
        2, f"kit: error: kit enquiry write: --reply-by: expected today ({dt.date.today()}) or later (got {yesterday})\n")
    assert dump(engine) == before and not (tmp_path / "e").exists()


def test_an_enquiry_recorded_before_its_texts_were_kept_is_held_to_the_rest(fleet, tmp_path):
    # Enquiry lines written before schema revision 0010 hold no standard, compound or service
    # conditions: a reply to one is held to its designation, quantity and unit only.
    from sqlalchemy import update

    from catalog_schema.core_tables import ENQUIRY_LINES

    db, engine, _ = fleet
    path = _write(db, tmp_path / "enquiries")[SEALS]
    with engine.begin() as conn:
        conn.execute(update(ENQUIRY_LINES).values(standard=None, compound=None, service=None))
    reply = _fill(path, tmp_path / "reply.xlsx", {0: ("QS-OLD", 9.5, "EUR", "2 pcs", 3, None)})
    wb = openpyxl.load_workbook(reply)
    wb["Lines"].cell(2, COL["Compound"] + 1, "FKM")
    wb.save(reply)
    result = kit(db, "enquiry", "read", str(reply))
    assert result.exit_code == 0, result.output
