# SPDX-License-Identifier: MIT
"""The particulars page (kit/web/pages/particulars.py) on both engines: a particulars file (TOML)
or particulars workbook uploaded and saved by the same service as ``kit load`` (and its parts
registered as by ``kit parts register``), the empty workbook downloaded, and every refusal in the
line the command line prints for the same file (the hostile particulars suite's own cases), the
database unchanged; no session, no or a wrong CSRF token, too large.

The command line is the reference: what ``kit load`` prints and stores for the same file.
"""

from __future__ import annotations

import re
from pathlib import Path

import openpyxl
from tests.db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401  (fixtures)
from tests.upload_support import cli_line, followed_to, notice, post_file, refusal_of, refused_unchanged
from tests.web_support import CSRF_IN_FORM, PORT, TOKEN, client, logged_in, web  # noqa: F401  (fixture)

from test_hostile_inputs import DEEP, nested
from test_hostile_particulars import CASES, _book_cases
from test_hostile_sheets import BOMB, doctored


def toml(tmp_path: Path, name: str = "new.toml", text: str = TOML_CYLINDER) -> Path:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def load(web, path: Path, **fields):
    return post_file(web, "/particulars", "/particulars", "particulars", path, **({"register": "yes"} | fields))


def followed(web, response):
    return followed_to(web, response, "/particulars")


def test_the_page_has_a_labelled_upload_form(web):
    r = web.browser.get("/particulars")
    assert r.status_code == 200 and "Particulars</h1>" in r.text
    ids = re.findall(r'<input[^>]* id="([^"]+)"', r.text)
    assert ids == ["particulars", "register"]
    for input_id in ids:
        assert f'<label for="{input_id}"' in r.text


def test_a_new_vessel_is_loaded_as_by_kit_load_and_its_parts_registered(web, tmp_path):
    from kit.services.fleet import load_particulars, register_parts

    path = toml(tmp_path)
    page = followed(web, load(web, path))
    said = notice(page)
    assert "Particulars loaded: new.toml" in said and "1 vessel(s) added or updated: TEST-ONE" in said
    assert 'href="/vessel/TEST-ONE"' in page.text
    stored = dump(web.engine, audit=False)
    # the vessel records the file by the name it was uploaded under, never the temporary folder
    assert [v[-1] for v in stored["vessels"] if v[0] == "TEST-ONE"] == ["new.toml"]
    # the command line's services on the same file change nothing more: the page did what they do
    assert load_particulars(web.engine, path, source="new.toml") == ["TEST-ONE"]
    again = register_parts(web.engine, ["TEST-ONE"])
    assert dump(web.engine, audit=False) == stored
    assert f"{again.parts} generic part(s) for 1 vessel(s)" in said
    # and the fleet page lists it
    assert "TEST-ONE" in web.browser.get("/?q=test-one").text


def test_without_the_box_ticked_no_part_is_registered(web, tmp_path):
    from kit.services.fleet import list_parts

    before = list_parts(web.engine)
    said = notice(followed(web, load(web, toml(tmp_path), register="")))
    assert "not registered yet" in said and list_parts(web.engine) == before


def test_an_existing_vessel_is_updated_by_its_id(web, tmp_path):
    from kit.services.fleet import list_vessels

    followed(web, load(web, toml(tmp_path)))
    followed(web, load(web, toml(tmp_path, "renamed.toml", TOML_CYLINDER.replace('name = "Test One"', 'name = "Test Renamed"'))))
    names = {v.id: v.name for v in list_vessels(web.engine)}
    assert names["TEST-ONE"] == "Test Renamed" and len(names) == 7  # the demo's six and this one


def test_the_particulars_workbook_downloaded_filled_in_and_uploaded(web, tmp_path):
    """The download is the empty workbook of ``kit template particulars``: its sheets are those of
    a workbook filled from a .toml by the same writer, and that filled workbook loads."""
    from kit.services.templates import write_particulars_template

    r = web.browser.get("/particulars/template.xlsx")
    assert r.status_code == 200 and 'filename="particulars.xlsx"' in r.headers["content-disposition"]
    empty = tmp_path / "empty.xlsx"
    empty.write_bytes(r.content)
    filled = tmp_path / "filled.xlsx"
    write_particulars_template(filled, toml(tmp_path, text=TOML_CYLINDER.replace("TEST-ONE", "TEST-BOOK")))
    assert openpyxl.load_workbook(empty).sheetnames == openpyxl.load_workbook(filled).sheetnames
    said = notice(followed(web, load(web, filled)))
    assert "Particulars loaded: filled.xlsx" in said and "1 vessel(s) added or updated: TEST-BOOK" in said
    letter = web.browser.get("/particulars/template.xlsx?paper=letter")
    path = tmp_path / "letter.xlsx"
    path.write_bytes(letter.content)
    assert openpyxl.load_workbook(path).active.page_setup.paperSize in (1, "1")  # ECMA-376 Part 1, 18.3.1.63: 1 = Letter


def test_a_stored_script_in_a_vessel_name_is_shown_as_text(web, tmp_path):
    evil = "<script>alert('kit')</script>"
    followed(web, load(web, toml(tmp_path, text=TOML_CYLINDER.replace('name = "Test One"', f'name = "{evil}"'))))
    fleet = web.browser.get("/?q=test-one")
    assert "<script" not in fleet.text and "&lt;script&gt;alert(&#39;kit&#39;)&lt;/script&gt;" in fleet.text


# --- refusals, in the words of kit load -----------------------------------------------------------

def both_refuse(web, path: Path) -> str:
    line = cli_line(web.engine, path, "load", path)
    said = refused_unchanged(web.engine, lambda: load(web, path))
    assert said == line
    assert str(path.parent) not in said and "kit-upload-" not in said
    return said


def test_bad_and_hostile_particulars_are_refused_in_the_commands_line(web, tmp_path):
    """Every case of test_hostile_particulars.py, TOML nested past the limit, not UTF-8, an entity
    bomb (one fleet database for them all: the demo fleet takes seconds to fill)."""
    for case, (old, new), field, expected in CASES:
        path = toml(tmp_path, "bad.toml", TOML_CYLINDER.replace(old, new, 1))
        assert both_refuse(web, path) == f"bad.toml: {field}: expected {expected}", case
    bad_workbooks_refused(web, tmp_path)
    too_deep_refused(web, tmp_path)
    not_utf8_or_entities_refused(web, tmp_path)


def bad_workbooks_refused(web, tmp_path):
    from kit.files.particulars_sheet import write_particulars_template

    source = toml(tmp_path, text=TOML_CYLINDER.replace("TEST-ONE", "TEST-BOOK"))
    for case, edit, line in _book_cases():
        path = tmp_path / "v.xlsx"
        write_particulars_template(path, source)
        wb = openpyxl.load_workbook(path)
        edit(wb)
        wb.save(path)
        assert both_refuse(web, path) == f"v.xlsx{line}", case


def too_deep_refused(web, tmp_path):
    for kind in ("arrays", "inline tables", "dotted key"):
        path = toml(tmp_path, "deep.toml", TOML_CYLINDER.replace("[vessel]", nested(5000, kind) + "\n\n[vessel]"))
        line = TOML_CYLINDER[:TOML_CYLINDER.index("[vessel]")].count("\n") + 1
        assert both_refuse(web, path) == f"deep.toml: file: expected {DEEP} (got deeper at line {line})", kind


def not_utf8_or_entities_refused(web, tmp_path):
    path = tmp_path / "latin1.toml"
    path.write_bytes(TOML_CYLINDER.replace("Test One", "Tést Øne").encode("latin-1"))
    assert both_refuse(web, path) == "latin1.toml: file: expected UTF-8 text (got undecodable bytes)"

    evil = doctored(tmp_path, "xl/workbook.xml", BOMB)  # a stock workbook: refused before any sheet is looked for
    assert both_refuse(web, evil) == "evil.xlsx: file: expected a workbook without XML entity declarations (got EntitiesForbidden)"


def test_the_form_refuses_another_suffix_an_empty_file_no_file_two_or_a_bad_box(web, tmp_path):
    txt = toml(tmp_path, "vessel.txt")
    said = refused_unchanged(web.engine, lambda: load(web, txt))
    assert said == "vessel.txt: file: expected a file ending in .toml or .xlsx (got '.txt')"
    empty = toml(tmp_path, "empty.toml", "")
    said = refused_unchanged(web.engine, lambda: load(web, empty))
    assert said == "empty.toml: file: expected a file with something in it (got an empty file)"
    said = refused_unchanged(web.engine, lambda: web.browser.post(
        "/particulars", data={"csrf": web.csrf("/particulars")}, files={"particulars": ("", b"")}))
    assert said == "particulars file: expected a .toml or .xlsx file (got no file)"
    good = TOML_CYLINDER.encode()
    said = refused_unchanged(web.engine, lambda: web.browser.post(
        "/particulars", data={"csrf": web.csrf("/particulars")},
        files=[("particulars", ("a.toml", good)), ("particulars", ("b.toml", good.replace(b"TEST-ONE", b"TEST-TWO")))]))
    assert said == "particulars file: expected one .toml or .xlsx file (got 2 files)"
    said = refused_unchanged(web.engine, lambda: load(web, toml(tmp_path), register="maybe"))
    assert said == "register the parts: expected one of '', 'yes' (got 'maybe')"


def test_without_a_session_or_its_csrf_token_nothing_is_shown_or_done(web, tmp_path):
    before = dump(web.engine)
    stranger = client(web.app)
    for r in (stranger.get("/particulars"), stranger.get("/particulars/template.xlsx"),
              stranger.post("/particulars", files={"particulars": ("v.toml", TOML_CYLINDER.encode())})):
        assert r.status_code == 401 and "Particulars</h1>" not in r.text
    assert dump(web.engine) == before
    for token in (None, "", "forged", web.csrf("/particulars") + "x"):
        data = {} if token is None else {"csrf": token}
        r = web.browser.post("/particulars", data=data, files={"particulars": ("v.toml", TOML_CYLINDER.encode())})
        assert r.status_code == 403 and "check token" in refusal_of(r), token
    assert dump(web.engine) == before


def test_an_upload_over_the_limit_is_refused_with_413(web, tmp_path):
    from kit.web.app import create_app

    browser = logged_in(create_app(web.engine, token=TOKEN, port=PORT, upload_limit=1024 * 1024))
    csrf = CSRF_IN_FORM.search(browser.get("/particulars").text).group(1)
    before = dump(web.engine)
    big = (TOML_CYLINDER + "#" * (1100 * 1024) + "\n").encode()
    r = browser.post("/particulars", data={"csrf": csrf}, files={"particulars": ("big.toml", big)})
    assert r.status_code == 413 and refusal_of(r) == "The upload is larger than the limit of 1 MB."
    assert dump(web.engine) == before
