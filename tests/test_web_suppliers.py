# SPDX-License-Identifier: MIT
"""The suppliers page (kit/web/pages/suppliers.py) on both engines: the suppliers as
``kit supplier list`` knows them, a catalogue and an enquiry reply uploaded and read by the same
services as ``kit catalogue import`` and ``kit enquiry read``, and every refusal: no session, no
or a wrong CSRF token, too large, hostile files (the hostile suite's own builders), each said in
the line the command line prints for the same file, the database unchanged.

The command line is the reference here (what ``kit`` prints and stores for the same file); the
currencies are checked as ISO 4217 codes against the catalogue file they were read from.
"""

from __future__ import annotations

import csv
import html
import re
import zipfile
from pathlib import Path

import openpyxl
import pytest
from sqlalchemy import select

import kit.files.sheets
from catalog_schema.core_tables import CATALOGUE_ENTRIES
from tests.db_support import db_url, dump, engine  # noqa: F401  (fixtures)
from tests.upload_support import cli_line, followed_to, notice, post_file, refusal_of, refused_unchanged
from tests.web_support import CSRF_IN_FORM, PORT, TOKEN, client, logged_in, web  # noqa: F401  (fixture)

from benchmarks.hostile_workbooks import CASES, hostile
from test_enquiry import _enquiry_id, _fill, _rows
from test_hostile_sheets import BOMB, EXTERNAL, book, doctored

SEALS = "Northgate Marine Seals & Hydraulics (invented)"  # the demo's first supplier (kit.services.demo)
ISO_4217 = re.compile(r"^[A-Z]{3}$")  # ISO 4217: three capital letters


def entries(engine) -> list[tuple]:
    """The catalogue entries without their row ids (a re-import renumbers them)."""
    columns = [c for c in CATALOGUE_ENTRIES.c if c.name != "id"]
    with engine.connect() as conn:
        return sorted(tuple(r) for r in conn.execute(select(*columns)))


def mixed_catalogue(web, path: Path, unmatched: int = 2) -> Path:
    """Five rows of the demo's catalogue (their part keys are registered) and ``unmatched`` O-rings
    of sizes no demo vessel keeps, priced in EUR and USD."""
    rows = list(csv.reader((web.imports / "catalogue.csv").open(encoding="utf-8")))
    out = [rows[0] + ["part_kind", "id", "cs", "spec"]] + [r + [""] * 4 for r in rows[1:6]]
    for n in range(unmatched):
        out.append([f"WEB-OR-{n}", "", f"o-ring {431 + n} x 5.33", "", "10", "12.5", "EUR" if n % 2 == 0 else "USD", "9",
                    "o_ring", f"{431 + n} mm", "5.33 mm", "NBR"])
    with path.open("w", newline="", encoding="utf-8") as f:
        csv.writer(f).writerows(out)
    return path


def followed(web, response):
    return followed_to(web, response, "/suppliers")


# --- what the page shows ------------------------------------------------------------------------

def test_the_page_lists_the_suppliers_with_entries_and_currencies(web):
    from kit.services.purchasing import list_suppliers

    r = web.browser.get("/suppliers")
    assert r.status_code == 200
    listed = list_suppliers(web.engine)
    assert len(listed) == 2  # the demo's two invented suppliers
    cells = [html.unescape(re.sub(r"<[^>]+>", "", c)).strip()
             for c in re.findall(r"<td[^>]*>(.*?)</td>", r.text.split("<tbody>")[1], re.S)]
    for s in listed:
        i = cells.index(s.name)
        assert cells[i + 1:i + 4] == [f"{s.entries:,}", f"{s.matched:,}", ", ".join(s.currencies)]
    # the currencies are those the catalogue file was priced in (ISO 4217 codes)
    from_file = {row["currency"] for row in csv.DictReader((web.imports / "catalogue.csv").open(encoding="utf-8"))}
    seals = next(s for s in listed if s.name == SEALS)
    assert seals.currencies == sorted(from_file) and all(ISO_4217.match(c) for c in seals.currencies)
    # every input labelled: each id named by a <label for>
    for input_id in re.findall(r'<(?:input|select)[^>]* id="([^"]+)"', r.text):
        assert f'<label for="{input_id}"' in r.text, input_id


def test_a_supplier_priced_in_two_currencies_lists_both(web, tmp_path, monkeypatch):
    from kit.services.purchasing import list_suppliers

    monkeypatch.setattr("kit.web.pages.suppliers.SHOW_UNMATCHED", 1)
    sent = post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", mixed_catalogue(web, tmp_path / "c.csv"),
                     supplier="Web Test Seals")
    page = followed(web, sent)
    shown = next(s for s in list_suppliers(web.engine) if s.name == "Web Test Seals")
    assert shown.currencies == ["EUR", "USD"] and (shown.entries, shown.matched) == (7, 5)
    # one unmatched row listed, the other counted
    assert "c.csv, line 8" not in page.text and "c.csv, line 7" in page.text and "\u2026 and 1 more." in notice(page)
    # the notice is this session's only: another browser with a session of its own does not see it
    assert 'class="notice"' not in logged_in(web.app).get(sent.headers["location"]).text


# --- a catalogue import -------------------------------------------------------------------------

def test_a_catalogue_import_is_the_commands_with_its_unmatched_rows_listed(web, tmp_path):
    from kit.services.imports import import_catalogue

    path = mixed_catalogue(web, tmp_path / "web catalogue.csv")
    page = followed(web, post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path, supplier="Web Test Seals"))
    stored = entries(web.engine)
    # the same file through the command line's service (replacing what the page imported)
    report = import_catalogue(web.engine, path, "Web Test Seals")
    assert entries(web.engine) == stored
    said = notice(page)
    assert (f"Web Test Seals: {report.rows} row(s), {report.matched} matched a generic part, "
            f"{len(report.unmatched)} matched nothing") in said
    assert len(report.unmatched) == 2
    rows = re.findall(r"<tr><td>(.*?)</td><td>(.*?)</td><td>(.*?)</td></tr>", page.text)
    assert [tuple(html.unescape(c) for c in r) for r in rows] == [
        (where.replace(f"{path.parent}/", ""), ref, key) for where, ref, key in report.unmatched]
    assert rows[0][0] == "web catalogue.csv, line 7"  # as kit catalogue import names it, without its folder


def test_the_decimal_mark_is_the_commands_option(web, tmp_path):
    path = tmp_path / "semicolon.csv"
    path.write_text("supplier_ref;part_key;description;pack;price;currency\nSC-1;oil:hees 46;oil;20 L;96,50;EUR\n", encoding="utf-8")
    followed(web, post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path, supplier="Semicolon Oils"))
    with web.engine.connect() as conn:
        assert conn.execute(select(CATALOGUE_ENTRIES.c.price).where(CATALOGUE_ENTRIES.c.supplier_ref == "SC-1")).scalar() == 96.5
    line = cli_line(web.engine, path, "catalogue", "import", path, "--supplier", "Semicolon Oils", "--decimal-mark", "point")
    said = refused_unchanged(web.engine, lambda: post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path,
                                                                supplier="Semicolon Oils", decimal="point"))
    # the command line names its option where the page names its field
    assert said == line.replace("--decimal-mark", "decimal mark") and said.startswith("semicolon.csv, line 2: column price: expected")


def test_one_bad_row_refuses_the_whole_catalogue_in_the_commands_words(web, tmp_path):
    path = mixed_catalogue(web, tmp_path / "bad.csv")
    text = path.read_text(encoding="utf-8").replace("12.5,EUR", "12.5,EURO", 1)
    path.write_text(text, encoding="utf-8")
    line = cli_line(web.engine, path, "catalogue", "import", path, "--supplier", SEALS)
    said = refused_unchanged(web.engine, lambda: post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path,
                                                                supplier=SEALS))
    assert said == line and said.startswith("bad.csv, line 7: column currency: expected")


def test_a_bad_supplier_name_is_refused_as_by_the_command(web, tmp_path):
    path = mixed_catalogue(web, tmp_path / "c.csv")
    for name in ("Skerrow \x1b[31mSeals", "Skerrow\x85Seals", "   "):  # an escape sequence, a C1 control, nothing
        line = cli_line(web.engine, path, "catalogue", "import", path, "--supplier", name)
        said = refused_unchanged(web.engine, lambda name=name: post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path,
                                                                    supplier=name))
        # the command line names its option where the page names its field
        assert said == line.replace("--supplier", "supplier name") and said.startswith("c.csv: supplier name: expected")


def test_stored_script_in_a_supplier_name_and_part_number_is_shown_as_text(web, tmp_path):
    evil = "<script>alert('kit')</script>"
    path = mixed_catalogue(web, tmp_path / "c.csv")
    path.write_text(path.read_text(encoding="utf-8").replace("WEB-OR-0", "<script>x()</script>"), encoding="utf-8")
    page = followed(web, post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path, supplier=evil))
    for shown in (page, web.browser.get("/suppliers")):
        assert "<script" not in shown.text
    assert "&lt;script&gt;alert(&#39;kit&#39;)&lt;/script&gt;" in page.text
    assert "&lt;script&gt;x()&lt;/script&gt;" in page.text  # the unmatched row's part number


def test_a_formula_in_a_catalogue_is_kept_as_text(web, tmp_path):
    """OWASP, "CSV Injection": a cell starting with = is data, stored and shown as it was typed."""
    path = mixed_catalogue(web, tmp_path / "c.csv")
    path.write_text(path.read_text(encoding="utf-8").replace("o-ring 431 x 5.33", '"=HYPERLINK(""http://x"",""y"")"'),
                    encoding="utf-8")
    followed(web, post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path, supplier="Formula Seals"))
    with web.engine.connect() as conn:
        assert conn.execute(select(CATALOGUE_ENTRIES.c.description).where(CATALOGUE_ENTRIES.c.supplier_ref == "WEB-OR-0")
                            ).scalar() == '=HYPERLINK("http://x","y")'


def test_the_catalogue_template_filled_in_imports(web, tmp_path):
    """The downloaded template is the one ``kit template catalogue`` writes: filled with the demo
    catalogue's rows by column name, it imports all of them."""
    r = web.browser.get("/suppliers/catalogue-template.xlsx")
    assert r.status_code == 200 and 'filename="catalogue-template.xlsx"' in r.headers["content-disposition"]
    path = tmp_path / "filled.xlsx"
    path.write_bytes(r.content)
    wb = openpyxl.load_workbook(path)
    ws = wb["catalogue"]
    header = [c.value for c in ws[1]]
    rows = list(csv.DictReader((web.imports / "catalogue.csv").open(encoding="utf-8")))
    for row in rows:
        ws.append([row.get(h) or None for h in header])
    wb.save(path)
    page = followed(web, post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path, supplier="Template Seals"))
    assert f"Template Seals: {len(rows)} row(s), {len(rows)} matched a generic part, 0 matched nothing" in notice(page)
    csv_template = web.browser.get("/suppliers/catalogue-template.csv")
    assert csv_template.status_code == 200 and csv_template.text.splitlines()[0] == ",".join(header)


# --- an enquiry reply ---------------------------------------------------------------------------

@pytest.fixture
def enquiry(web, tmp_path):
    """The demo order's enquiry to its first supplier, as ``kit enquiry write`` writes it."""
    from kit.services.enquiries import write_enquiries

    written = write_enquiries(web.engine, [], 90, tmp_path / "enquiries")
    return next(Path(p) for e, p in written.written if e.supplier == SEALS)


def test_a_reply_is_read_as_by_kit_enquiry_read(web, tmp_path, enquiry):
    from kit.services.enquiries import read_enquiry_reply

    lines = _rows(enquiry)
    reply = _fill(enquiry, tmp_path / "reply.xlsx", {0: ("NMS-NEW-1", 9.5, "EUR", "4 pcs", 21, "next week")})
    page = followed(web, post_file(web, "/suppliers/reply", "/suppliers", "reply", reply))
    stored = entries(web.engine)
    report = read_enquiry_reply(web.engine, reply)  # the command's service, on the same file
    assert entries(web.engine) == stored
    said = notice(page)
    assert f"{SEALS}: enquiry {_enquiry_id(enquiry)}, 1 line(s) quoted, {len(lines) - 1} not quoted" in said
    assert (report.quoted, len(report.skipped)) == (1, len(lines) - 1)
    assert "Not quoted: " + ", ".join(report.skipped) in said
    with web.engine.connect() as conn:
        price = conn.execute(select(CATALOGUE_ENTRIES.c.price).where(CATALOGUE_ENTRIES.c.supplier_ref == "NMS-NEW-1")).scalar()
    assert price == 9.5


def test_a_reply_with_a_changed_line_reference_is_refused_whole(web, tmp_path, enquiry):
    reply = _fill(enquiry, tmp_path / "reply.xlsx", {0: ("NMS-X", 9.5, "EUR", "2 pcs", 3, None)})
    wb = openpyxl.load_workbook(reply)
    wb["Lines"].cell(2, 1, "E000101-000000-001")
    wb.save(reply)
    line = cli_line(web.engine, reply, "enquiry", "read", reply)
    said = refused_unchanged(web.engine, lambda: post_file(web, "/suppliers/reply", "/suppliers", "reply", reply))
    assert said == line and said.startswith("reply.xlsx, sheet Lines, row 2: column Line ref: expected a line reference")


# --- hostile files, through the page and through the command line -------------------------------

def both_refuse(web, path: Path, action: str, field: str, args: list, **fields) -> str:
    line = cli_line(web.engine, path, *args)
    said = refused_unchanged(web.engine, lambda: post_file(web, action, "/suppliers", field, path, **fields))
    assert said == line
    assert str(path.parent) not in said and "kit-upload-" not in said  # never the temporary folder
    return said


def catalogue_refused(web, path: Path) -> str:
    return both_refuse(web, path, "/suppliers/catalogue", "catalogue", ["catalogue", "import", path, "--supplier", SEALS],
                       supplier=SEALS)


def test_a_hostile_workbook_is_refused_in_the_commands_line(web, tmp_path):
    """Each of benchmarks/hostile_workbooks.py's cases (one fleet database for all of them: the
    demo fleet takes seconds to fill)."""
    for case in CASES:
        folder = tmp_path / f"case{CASES.index(case)}"
        folder.mkdir()
        path = hostile(folder, case, "oil:hees 46")
        said = catalogue_refused(web, path)
        assert said == f"hostile.xlsx, {case.part}{case.refusal}", case.name
        both_refuse(web, path, "/suppliers/reply", "reply", ["enquiry", "read", path])


def test_xml_entity_tricks_are_refused(web, tmp_path):
    """A billion laughs and an external entity (test_hostile_sheets.py) in each XML part kit reads."""
    for part in ("xl/worksheets/sheet1.xml", "xl/workbook.xml", "[Content_Types].xml"):
        for prolog in (BOMB, EXTERNAL):
            path = doctored(tmp_path, part, prolog)
            said = catalogue_refused(web, path)
            assert said == "evil.xlsx: file: expected a workbook without XML entity declarations (got EntitiesForbidden)", part
            both_refuse(web, path, "/suppliers/reply", "reply", ["enquiry", "read", path])


@pytest.fixture(scope="module")
def zip_bomb(tmp_path_factory):
    """A catalogue workbook of a few hundred kilobytes with a part that unpacks to 600 MiB of zeros,
    past kit's limit of 512 MiB (kit.files.sheets.MAX_UNPACKED_BYTES)."""
    folder = tmp_path_factory.mktemp("bomb")
    good = book(folder / "good.xlsx", {"catalogue": [["supplier_ref", "part_key", "price", "currency"]]})
    path = folder / "bomb.xlsx"
    with zipfile.ZipFile(good) as src, zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED, compresslevel=9) as dst:
        for info in src.infolist():
            dst.writestr(info, src.read(info.filename), zipfile.ZIP_DEFLATED)
        with dst.open("xl/media/zeros.bin", "w", force_zip64=True) as out:
            block = bytes(1 << 20)
            for _ in range(600):
                out.write(block)
    return path


def zip_bomb_refused(web, zip_bomb):
    assert zip_bomb.stat().st_size < 2 * 1024 * 1024  # it fits the upload limit: kit's reader must refuse it
    said = catalogue_refused(web, zip_bomb)
    assert said == "bomb.xlsx: file: expected a workbook that unpacks to at most 512 MiB (got 600 MiB)"


def huge_catalogue(path: Path, rows: int) -> Path:
    """As test_hostile_sheets.huge_sheet, with a catalogue's columns: a workbook written without
    a dimension record, so only counting the rows finds how many there are."""
    if path.suffix == ".csv":
        path.write_text("supplier_ref,part_key,price,currency\n" + "".join(f"R{i},oil:hees 46,1,EUR\n" for i in range(rows)))
        return path
    wb = openpyxl.Workbook(write_only=True)
    ws = wb.create_sheet("catalogue")
    ws.append(["supplier_ref", "part_key", "price", "currency"])
    for i in range(rows):
        ws.append([f"R{i}", "oil:hees 46", 1, "EUR"])
    wb.save(path)
    return path


def past_the_row_limit_refused(web, tmp_path, monkeypatch):
    monkeypatch.setattr(kit.files.sheets, "MAX_ROWS", 500)
    for suffix in (".csv", ".xlsx"):
        path = huge_catalogue(tmp_path / f"huge{suffix}", 2_000)
        said = catalogue_refused(web, path)
        assert "rows: expected at most 500 data rows" in said


def not_utf8_refused(web, tmp_path):
    path = tmp_path / "latin1.csv"
    path.write_bytes("supplier_ref,part_key,description,price,currency\nNMS-1,oil:hees 46,Öl für Ruder,9,EUR\n".encode("latin-1"))
    said = catalogue_refused(web, path)
    assert said.startswith("latin1.csv") and "UTF-8" in said


def no_workbook_refused(web, tmp_path):
    path = tmp_path / "fake.xlsx"
    path.write_bytes(b"PK\x03\x04 this is no zip at all")
    assert catalogue_refused(web, path) == ("fake.xlsx: file: expected an .xlsx workbook (Office Open XML spreadsheet) "
                                            "(got a file that is not one)")
    both_refuse(web, path, "/suppliers/reply", "reply", ["enquiry", "read", path])


def test_a_zip_bomb_a_sheet_past_the_row_limit_bad_encoding_and_a_fake_workbook_are_refused(web, tmp_path, zip_bomb, monkeypatch):
    """One fleet database for them all (the demo fleet takes seconds to fill)."""
    zip_bomb_refused(web, zip_bomb)
    not_utf8_refused(web, tmp_path)
    no_workbook_refused(web, tmp_path)
    past_the_row_limit_refused(web, tmp_path, monkeypatch)


# --- what the form itself refuses ---------------------------------------------------------------

def suffix_refused(web, tmp_path):
    path = tmp_path / "catalogue.txt"
    path.write_text("supplier_ref,part_key\n", encoding="utf-8")
    assert catalogue_refused(web, path) == "catalogue.txt: file: expected a file ending in .xlsx or .csv (got '.txt')"
    reply = tmp_path / "reply.csv"
    reply.write_text("x\n", encoding="utf-8")
    said = refused_unchanged(web.engine, lambda: post_file(web, "/suppliers/reply", "/suppliers", "reply", reply))
    assert said == "reply.csv: file: expected a file ending in .xlsx (got '.csv')"


def empty_none_or_two_refused(web, tmp_path, action, field, fields):
    empty = tmp_path / "empty.xlsx"
    empty.write_bytes(b"")
    said = refused_unchanged(web.engine, lambda: post_file(web, action, "/suppliers", field, empty, **fields))
    assert said == "empty.xlsx: file: expected a file with something in it (got an empty file)"
    what = "catalogue file" if field == "catalogue" else "enquiry reply"
    kinds = ".xlsx or .csv" if field == "catalogue" else ".xlsx"
    said = refused_unchanged(web.engine, lambda: web.browser.post(action, data={"csrf": web.csrf("/suppliers"), **fields},
                                                                       files={field: ("", b"", "application/octet-stream")}))
    assert said == f"{what}: expected a {kinds} file (got no file)"
    two = [(field, ("a.xlsx", b"PK", "application/octet-stream")), (field, ("b.xlsx", b"PK", "application/octet-stream"))]
    said = refused_unchanged(web.engine, lambda: web.browser.post(action, data={"csrf": web.csrf("/suppliers"), **fields},
                                                                       files=two))
    assert said == f"{what}: expected one {kinds} file (got 2 files)"


def bad_fields_refused(web, tmp_path):
    path = mixed_catalogue(web, tmp_path / "c.csv")
    said = refused_unchanged(web.engine, lambda: post_file(web, "/suppliers/catalogue", "/suppliers", "catalogue", path,
                                                                supplier=SEALS, decimal="dot"))
    assert said == "decimal mark: expected one of '', 'point', 'comma' (got 'dot')"
    said = refused_unchanged(web.engine, lambda: web.browser.post(
        "/suppliers/catalogue", data={"csrf": web.csrf("/suppliers")},
        files=[("catalogue", ("c.csv", path.read_bytes(), "text/csv")), ("supplier", ("n.txt", b"x", "text/plain"))]))
    assert said == "supplier name: expected text (got a file)"


def test_the_form_refuses_another_suffix_an_empty_file_no_file_two_files_and_bad_fields(web, tmp_path):
    suffix_refused(web, tmp_path)
    empty_none_or_two_refused(web, tmp_path, "/suppliers/catalogue", "catalogue", {"supplier": SEALS})
    empty_none_or_two_refused(web, tmp_path, "/suppliers/reply", "reply", {})
    bad_fields_refused(web, tmp_path)


# --- the guard in front -------------------------------------------------------------------------

def test_without_a_session_or_its_csrf_token_nothing_is_shown_or_done(web, tmp_path):
    before = dump(web.engine)
    stranger = client(web.app)
    content = mixed_catalogue(web, tmp_path / "c.csv").read_bytes()
    for r in (stranger.get("/suppliers"), stranger.get("/suppliers/catalogue-template.xlsx"),
              stranger.post("/suppliers/catalogue", data={"supplier": SEALS}, files={"catalogue": ("c.csv", content)}),
              stranger.post("/suppliers/reply", files={"reply": ("r.xlsx", content)})):
        assert r.status_code == 401 and "Suppliers</h1>" not in r.text
    assert dump(web.engine) == before
    path = mixed_catalogue(web, tmp_path / "c.csv")
    for action, field in (("/suppliers/catalogue", "catalogue"), ("/suppliers/reply", "reply")):
        for token in (None, "", "forged", web.csrf("/suppliers") + "x"):
            data = {"supplier": SEALS} | ({} if token is None else {"csrf": token})
            r = web.browser.post(action, data=data, files={field: (path.name, path.read_bytes())})
            assert r.status_code == 403 and "check token" in refusal_of(r), (action, token)
    assert dump(web.engine) == before


def test_an_upload_over_the_limit_is_refused_with_413(web, tmp_path):
    from kit.web.app import create_app

    app = create_app(web.engine, token=TOKEN, port=PORT, upload_limit=1024 * 1024)
    browser = logged_in(app)
    path = mixed_catalogue(web, tmp_path / "big.csv")
    path.write_text(path.read_text(encoding="utf-8") + "\n" * (1100 * 1024), encoding="utf-8")
    csrf = CSRF_IN_FORM.search(browser.get("/suppliers").text).group(1)
    before = dump(web.engine)
    r = browser.post("/suppliers/catalogue", data={"csrf": csrf, "supplier": SEALS}, files={"catalogue": (path.name, path.read_bytes())})
    assert r.status_code == 413 and refusal_of(r) == "The upload is larger than the limit of 1 MB."
    assert dump(web.engine) == before
