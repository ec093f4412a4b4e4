# SPDX-License-Identifier: MIT
"""Particulars files typed by hand, at their worst: each gets exit status 2 and one line naming
the file, the field and what was expected; no traceback; nothing written to the database or disk."""

from __future__ import annotations

import pytest
from click.testing import CliRunner

from catalog_schema.engine import make_engine
from db_support import TOML_CYLINDER, dump
from kit.cli import main

LENGTH = 'a length with a unit, e.g. "280 mm" or "11 in"'
TAIL = TOML_CYLINDER[TOML_CYLINDER.index("[[unit]]"):]

# (case, text replaced -> replacement, field, expected and got as the line ends)
CASES = [
    ("malformed TOML", ('bore = "160 mm"', 'bore = "160 mm'), "file",
     "valid TOML (got Illegal character '\\n' (at line 16, column 15))"),
    ("missing field", ('bore = "160 mm"\n', ""), "unit[0].bore", "a value (field is required) (got nothing)"),
    ("number without unit", ('bore = "160 mm"', "bore = 160"), "unit[0].bore", f"{LENGTH} (got 160)"),
    ("unit of the wrong kind", ('working_pressure = "160 bar"', 'working_pressure = "180 mm"'), "unit[0].working_pressure",
     "a pressure with a unit, e.g. \"160 bar\" or \"2400 psi\" (got '180 mm')"),
    ("negative", ('bore = "160 mm"', 'bore = "-160 mm"'), "unit[0].bore", "a positive length (got '-160 mm')"),
    ("zero", ('stroke = "400 mm"', 'stroke = "0 mm"'), "unit[0].stroke", "a positive length (got '0 mm')"),
    ("NaN", ('bore = "160 mm"', 'bore = "nan mm"'), "unit[0].bore", f"{LENGTH} (got 'nan mm')"),
    ("NaN tonnage", ("gross_tonnage = 4200", "gross_tonnage = nan"), "vessel.gross_tonnage", "a number of at least 1 (got nan)"),
    ("absurd tonnage", ("gross_tonnage = 4200", "gross_tonnage = 1e308"), "vessel.gross_tonnage",
     "a number of at most 1e+06 (got 1e+308)"),
    ("5 m cylinder", ('bore = "160 mm"', 'bore = "5 m"'), "unit[0].bore", "a length of at most 2 m (got '5 m')"),
    ("rod not smaller than bore", ('rod = "90 mm"', 'rod = "160 mm"'), "unit[0].rod",
     "a rod diameter smaller than the bore (got 160 mm)"),
    ("unknown actuator", ('actuator = "cylinder"', 'actuator = "screw"'), "unit[0].actuator",
     "one of ram, rotary_vane, cylinder (got 'screw')"),
    ("duplicate unit ids", ("[[unit]]", TAIL + "\n[[unit]]"), "unit[1].id", "a unit id not used before in this file (got 'SG1')"),
    ("0 pumps", ("pumps = 2", "pumps = 0"), "unit[0].pumps", "a whole number of at least 1 (got 0)"),
    ("pumps past any gear", ("pumps = 2", "pumps = 99999999999999999999"), "unit[0].pumps",
     "a whole number of at most 1000 (got 99999999999999999999)"),
    ("arithmetic that never ends", ('bore = "160 mm"', 'bore = "9**9**9 mm"'), "unit[0].bore", f"{LENGTH} (got '9**9**9 mm')"),
    ("arithmetic that overflows", ('bore = "160 mm"', 'bore = "160 mm * 10**400"'), "unit[0].bore",
     f"{LENGTH} (got '160 mm * 10**400')"),
    ("NUL in a name", ('name = "Test One"', 'name = "Test\\u0000One"'), "vessel.name",
     "one line of at most 200 characters, no control characters (got 'Test\\x00One')"),
    ("newline in a name", ('name = "Test One"', 'name = "Test\\nOne"'), "vessel.name",
     "one line of at most 200 characters, no control characters (got 'Test\\nOne')"),
    ("superscript grade", ('fluid = "HM 46"', 'fluid = "HM ²"'), "unit[0].fluid",  # a Unicode digit int() refuses
     "an ISO 3448 viscosity grade (e.g. 32, 46, 68) (got '²')"),
    ("unknown field", ('stroke = "400 mm"', 'stroke = "400 mm"\nstrok = "400 mm"'), "unit[0].strok",
     "a known field (see the README's particulars format) (got an unknown field)"),
]


@pytest.fixture
def db(tmp_path):
    """A SQLite fleet database holding the valid vessel, to show nothing more is written."""
    url = f"sqlite:///{tmp_path / 'fleet.sqlite'}"
    good = tmp_path / "good.toml"
    good.write_text(TOML_CYLINDER)
    assert CliRunner().invoke(main, ["load", str(good), "--db", url]).exit_code == 0
    engine = make_engine(url)
    yield url, engine
    engine.dispose()


@pytest.mark.parametrize(("case", "edit", "field", "expected"), CASES, ids=[c[0] for c in CASES])
def test_bad_particulars_one_line_exit_2_nothing_written(db, tmp_path, case, edit, field, expected):
    url, engine = db
    old, new = edit
    assert TOML_CYLINDER.count(old) >= 1
    path = tmp_path / "bad.toml"
    path.write_text(TOML_CYLINDER.replace(old, new, 1), encoding="utf-8")
    before = dump(engine)
    out = tmp_path / "bom.xlsx"
    for args in (["load", str(path), "--db", url], ["calc", str(path), "--days", "90"],
                 ["bom", "--days", "90", "--particulars", str(path), "--out", str(out), "--db", url]):
        done = CliRunner().invoke(main, args)
        assert done.exit_code == 2, (args, done.output)
        assert done.stderr == f"kit: error: {path}: {field}: expected {expected}\n"
        assert done.stdout == ""
    assert dump(engine) == before
    assert not out.exists()


def test_non_ascii_names_are_kept(db, tmp_path):
    url, engine = db
    path = tmp_path / "nordic.toml"
    path.write_text(TOML_CYLINDER.replace('name = "Test One"', 'name = "Ærø Ørn 船"'), encoding="utf-8")
    done = CliRunner().invoke(main, ["load", str(path), "--db", url])
    assert (done.exit_code, done.stdout) == (0, "loaded 1 vessel(s): TEST-ONE\n")
    assert ("TEST-ONE", "Ærø Ørn 船") in [row[:2] for row in dump(engine, ["vessels"])["vessels"]]


def test_a_folder_with_one_bad_file_loads_nothing(db, tmp_path):
    url, engine = db
    folder = tmp_path / "fleet"
    folder.mkdir()
    (folder / "a.toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-A"))
    (folder / "b.toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-B").replace("pumps = 2", "pumps = 0"))
    before = dump(engine)
    done = CliRunner().invoke(main, ["load", str(folder), "--db", url])
    assert (done.exit_code, done.stderr) == (2, f"kit: error: {folder / 'b.toml'}: unit[0].pumps: expected a whole number of at least 1 (got 0)\n")
    assert dump(engine) == before


# --- the particulars workbook (kit template particulars, read by kit load) ---------------------

def _book_cases():
    from kit.files.particulars_sheet import UNIT_SHEET_COLUMNS as UNIT_COLUMNS
    from openpyxl.utils import get_column_letter as letter

    width = len(UNIT_COLUMNS)
    bore, past = letter(UNIT_COLUMNS.index("bore") + 1), letter(width + 1)
    return [
        ("duplicated column", lambda wb: wb["units"].cell(1, width + 1, "bore") and wb["units"].cell(2, width + 1, "200 mm"),
         f", sheet units, row 1: column bore: expected each column named once (first in column {bore}) "
         f"(got a second one in column {past})"),
        ("value under a blank header", lambda wb: wb["units"].cell(2, width + 2, "200 mm"),
         f", sheet units, row 2: cell {letter(width + 2)}2: expected a value only under a column named in row 1 (got '200 mm')"),
        ("blank header over a vessel value", lambda wb: wb["vessel"].cell(3, 3, "Other Name"),
         ", sheet vessel, row 3: cell C3: expected a value only under a column named in row 1 (got 'Other Name')"),
        ("header moved down a row", lambda wb: wb["filters"].insert_rows(1),
         ", sheet filters, row 2: cell A2: expected a value only under a column named in row 1 (got 'unit')"),
        ("vessel field given twice", lambda wb: wb["vessel"].append(["name", "Other Name"]),
         ", sheet vessel, row 7: column field: expected each field on one row (row 3 gives name) (got 'name')"),
    ]


@pytest.mark.parametrize(("case", "edit", "line"), _book_cases(), ids=[c[0] for c in _book_cases()])
def test_bad_particulars_workbook_one_line_exit_2_nothing_written(db, tmp_path, case, edit, line):
    """Each of these was read before: the second column or row silently won, a value under no
    header was dropped. Now the one line names the file, sheet, row or cell, and the field."""
    import openpyxl

    from kit.files.particulars_sheet import write_particulars_template

    url, engine = db
    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-BOOK"))
    book = tmp_path / "v.xlsx"
    write_particulars_template(book, toml)
    wb = openpyxl.load_workbook(book)
    edit(wb)
    wb.save(book)
    before = dump(engine)
    done = CliRunner().invoke(main, ["load", str(book), "--db", url])
    assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {book}{line}\n", "")
    assert dump(engine) == before


def test_the_untouched_particulars_workbook_still_loads(db, tmp_path):
    from kit.files.particulars_sheet import write_particulars_template

    url, _ = db
    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-BOOK"))
    book = tmp_path / "v.xlsx"
    write_particulars_template(book, toml)
    done = CliRunner().invoke(main, ["load", str(book), "--db", url])
    assert (done.exit_code, done.stdout) == (0, "loaded 1 vessel(s): TEST-BOOK\n")
