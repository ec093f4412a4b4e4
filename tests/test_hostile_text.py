# SPDX-License-Identifier: MIT
"""Control characters in text, at their worst: a NUL, an escape sequence, a C1 control, a byte
that is not UTF-8. Every text kit stores refuses them with one line and exit status 2; and text
already stored by another program straight into the database reaches no workbook, CSV, JSON or
terminal raw, and makes no command crash (openpyxl refuses most C0 characters in a cell)."""

from __future__ import annotations

import json
import re
import sqlite3
import zipfile

import openpyxl
import pytest

from hostile_support import Fleet

NO_CONTROL = "text without control characters (tab, newline, NUL, escape and the like) or bytes that are not UTF-8"

# C0 (U+0000 to U+001F), DEL and C1 (U+0080 to U+009F): Unicode 15.0, section 23.1.
RAW = re.compile(r"[\x00-\x1f\x7f-\x9f]")
# One of each kind: NUL, a bell, an escape sequence that clears a terminal, DEL, a C1 "next line".
NASTY = "\x00\x07\x1b[2J\x7f\x85"


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    yield f
    f.engine.dispose()


def no_control(text: str) -> str:
    return text if len(text) <= 40 else text[:40] + "..."


@pytest.mark.parametrize(("text", "code", "at"), [("S\x00", "0000", 2), ("S\x1b[31m", "001B", 2), ("Sea\x85", "0085", 4),
                                                   ("S\tT", "0009", 2), ("S\x7f", "007F", 2)])
def test_a_supplier_name_with_a_control_character_is_refused(fleet, text, code, at):
    path = fleet.file("c.csv", f"supplier_ref,part_key,currency\nA1,{fleet.key},EUR\n")
    fleet.refused(["catalogue", "import", path, "--supplier", text],
                  f"{path}: --supplier: expected {NO_CONTROL} (got {text!r}, U+{code} at character {at})")


@pytest.mark.parametrize(("column", "value"), [("supplier_ref", "A\x01"), ("description", "seal\x7f"),
                                               ("description", "seal\x9b2J"), ("part_key", "{key}\x02")])
def test_catalogue_text_with_a_control_character_is_refused(fleet, column, value):
    value = value.format(key=fleet.key)
    row = {"supplier_ref": "A1", "part_key": fleet.key, "currency": "EUR", "description": "d"} | {column: value}
    path = fleet.folder / "c.csv"
    path.write_text(",".join(row) + "\n" + ",".join(row.values()) + "\n", encoding="utf-8")
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column {column}: expected {NO_CONTROL} (got {value!r})")


def test_a_spec_with_a_control_character_is_refused(fleet):
    path = fleet.file("c.csv", "supplier_ref,part_kind,spec,currency\nA1,oil,HM 46\x1b,EUR\n")
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column spec: expected {NO_CONTROL} (got 'HM 46\\x1b')")


def test_a_stock_location_with_a_control_character_is_refused(fleet):
    path = fleet.file("s.csv", f"part_key,location,quantity\n{fleet.key},store\x00,1\n")
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE"], f"{path}, line 2: column location: expected {NO_CONTROL} (got 'store\\x00')")


@pytest.mark.parametrize("option", ["--name", "--note", "--company"])
@pytest.mark.parametrize(("text", "code"), [("p\x1b]0;x\x07", "001B"), ("p\x85", "0085"), ("p\udc85", "DC85")],
                         ids=["osc", "c1", "not-utf8"])
def test_policy_options_with_a_control_character_are_refused(fleet, option, text, code):
    args = {"--name": "p", "--company": None, "--vessel": "TEST-ONE"}
    args[option] = text
    if option == "--company":
        del args["--vessel"]
    flat = [x for k, v in args.items() if v is not None for x in (k, v)]
    fleet.refused(["policy", "set", *flat, "--days", "90", "--from", "2025-01-01"],
                  f"kit policy set: {option}: expected {NO_CONTROL} (got {text!r}, U+{code} at character 2)")


def test_a_c1_control_in_a_particulars_name_is_refused(fleet):
    from db_support import TOML_CYLINDER

    path = fleet.file("c1.toml", TOML_CYLINDER.replace('name = "Test One"', 'name = "Test\\u0085One"'))
    fleet.refused(["load", path], f"{path}: vessel.name: expected one line of at most 200 characters, no control characters "
                                  "(got 'Test\\x85One')")


def test_a_lookup_argument_that_is_not_utf8_gets_one_line(fleet):
    fleet.refused(["check", "X\udc85", "--days", "1"], "command line: argument: expected text in UTF-8 (got '\\udc85')")


# --- text already stored by another program ----------------------------------------------------

def store_nasty_rows(fleet) -> None:
    """What another program could write straight into the database: every text kit shows."""
    path = fleet.file("c.csv", "supplier_ref,part_key,pack,price,currency\n"
                      + "".join(f"R{i},{k},{'20 L' if k.startswith('oil:') else ''},2.5,EUR\n" for i, k in enumerate(fleet.keys)))
    assert fleet.kit("catalogue", "import", path, "--supplier", "S").exit_code == 0
    stock = fleet.file("s.csv", f"part_key,quantity\n{fleet.key},1\n")
    assert fleet.kit("stock", "import", stock, "--vessel", "TEST-ONE").exit_code == 0
    assert fleet.kit("policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", "90", "--from", "2025-01-01").exit_code == 0
    fleet.engine.dispose()
    with sqlite3.connect(fleet.folder / "fleet.sqlite") as db:
        db.execute("UPDATE parts SET designation = designation || ?", (NASTY + "[/b]",))
        db.execute("UPDATE vessels SET name = ?", ("Test" + NASTY + "[/]",))
        db.execute("UPDATE companies SET name = ?", ("Co" + NASTY,))
        db.execute("UPDATE suppliers SET name = ?", ("S" + NASTY,))
        db.execute("UPDATE catalogue_entries SET supplier_ref = supplier_ref || ?, description = ?, currency = ?",
                   (NASTY, "d" + NASTY, "E\x01R"))
        db.execute("UPDATE stock SET location = ?", ("hold" + NASTY,))
        db.execute("UPDATE spares_policies SET name = ?, note = ?", ("p\x1b]0;owned\x07", "n" + NASTY))


def workbook_text(path) -> list[str]:
    wb = openpyxl.load_workbook(path, read_only=True)
    try:
        return [c for ws in wb.worksheets for row in ws.iter_rows(values_only=True) for c in row if isinstance(c, str)]
    finally:
        wb.close()


def raw_in_xml(path) -> bool:
    """A control character anywhere in the workbook's XML, raw or as openpyxl's _xHHHH_ escape."""
    with zipfile.ZipFile(path) as z:
        text = "".join(z.read(n).decode("utf-8") for n in z.namelist() if n.endswith(".xml"))
    return bool(re.search(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f]|_x00[01][0-9A-Fa-f]_", text))


def test_stored_control_characters_are_neutralised_by_every_writer(fleet):
    store_nasty_rows(fleet)
    out = fleet.folder
    bom = fleet.kit("bom", "--days", "90", "--out", out / "b.xlsx", "--csv", out / "b.csv", "--json", out / "b.json")
    assert (bom.exit_code, bom.stderr) == (0, ""), bom.output
    cells = workbook_text(out / "b.xlsx")
    assert not raw_in_xml(out / "b.xlsx") and not any(RAW.search(c) for c in cells)
    assert any("\ufffd" in c for c in cells)  # U+FFFD stands where each control character was
    csv_text = (out / "b.csv").read_text(encoding="utf-8")
    assert not RAW.search(csv_text.replace("\n", "")) and "\ufffd" in csv_text
    doc = json.loads((out / "b.json").read_text(encoding="utf-8"))
    texts = re.findall(r'"((?:[^"\\]|\\.)*)"', json.dumps(doc, ensure_ascii=False))
    assert not any(RAW.search(t) for t in texts) and "\\u0000" not in (out / "b.json").read_text()
    assert any("\ufffd" in str(line["supplier_part_number"]) for line in doc["lines"])

    check = fleet.kit("check", "TEST-ONE", "--days", "90", "--out", out / "c.xlsx")
    assert check.exit_code == 1 and check.stderr == ""  # 1: something is short
    assert not RAW.search(check.stdout.replace("\n", "")) and "Test\ufffd" in check.stdout and "[/]" in check.stdout
    assert not raw_in_xml(out / "c.xlsx")

    shown = fleet.kit("policy", "show", "--vessel", "TEST-ONE", "--on", "2025-06-01")
    assert shown.exit_code == 0 and shown.stderr == ""
    assert shown.stdout.splitlines()[0] == "TEST-ONE: p\ufffd]0;owned\ufffd (vessel policy from 2025-01-01), 90 days of cover; n\ufffd\ufffd\ufffd[2J\ufffd\ufffd"

    listed = fleet.kit("parts", "list")
    assert listed.exit_code == 0 and listed.stderr == ""
    assert all(not RAW.search(line.replace("\t", "", 1)) for line in listed.stdout.splitlines())
    assert all(line.endswith("\ufffd\ufffd\ufffd[2J\ufffd\ufffd[/b]") for line in listed.stdout.splitlines())

    template = fleet.kit("template", "stock", out / "t.xlsx", "--vessel", "TEST-ONE", "--days", "90")
    assert template.exit_code == 0 and not raw_in_xml(out / "t.xlsx")
    template = fleet.kit("template", "stock", out / "t.csv", "--vessel", "TEST-ONE", "--days", "90")
    assert template.exit_code == 0 and not RAW.search((out / "t.csv").read_text(encoding="utf-8").replace("\n", ""))
