# SPDX-License-Identifier: MIT
"""Hostile values in the count sheet's new cells (issue 14): counted, vessel, the filter hours;
and the particulars' filter hours. Each is one line naming the file, sheet, row and column, exit
status 2, nothing written."""

from __future__ import annotations

import datetime as dt

import openpyxl
import pytest

from db_support import TOML_CYLINDER
from hostile_support import Fleet
from kit.errors import InputError
from kit.engine.particulars import vessel_from_dict
from kit.files.safe_text import NO_CONTROL
from kit.files.toml_text import parse_toml


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    done = f.kit("template", "stock", tmp_path / "count.xlsx", "--vessel", "TEST-ONE", "--days", "30")
    assert done.exit_code == 0, done.output
    yield f
    f.engine.dispose()


def edit(path, sheet: str, column: str, value, row: int = 2):
    wb = openpyxl.load_workbook(path)
    ws = wb[sheet]
    head = {c.value: c.column for c in ws[1]}
    ws.cell(row, head[column]).value = value
    wb.save(path)
    return path


@pytest.mark.parametrize(("value", "expected"), [
    ("ten", "a plain number with a decimal point"),
    (-1, "a number from 0 to 1,000,000,000 (got -1)"),
    (1e300, "a number from 0 to 1,000,000,000 (got 1e+300)"),
])
def test_counted_cell(fleet, value, expected):
    path = edit(fleet.folder / "count.xlsx", "stock", "counted", value)
    before = fleet.kit("stock", "import", path)
    assert before.exit_code == 2 and before.stdout == ""
    assert before.stderr.startswith(f"kit: error: {path}, sheet stock, row 2: column counted: expected {expected}")
    fleet.refused(["stock", "import", path], before.stderr.removeprefix("kit: error: ").rstrip("\n"))


def test_counted_formula_without_a_value_is_not_counted(fleet):
    path = edit(fleet.folder / "count.xlsx", "stock", "counted", "=1+1")  # saved by openpyxl: no cached value
    done = fleet.kit("stock", "import", path)
    assert done.exit_code == 0 and f"{path}, sheet stock, row 2: " in done.stdout.splitlines()[2]


@pytest.mark.parametrize(("value", "expected"), [
    ("TEST-ONE\x7f", f"expected {NO_CONTROL} (got 'TEST-ONE\\x7f')"),
    ("OTHER", "expected the vessel of every other row, 'TEST-ONE' (row 2 of sheet stock) (got 'OTHER')"),
])
def test_vessel_cell(fleet, value, expected):
    path = edit(fleet.folder / "count.xlsx", "stock", "vessel", value, row=3)
    done = fleet.kit("stock", "import", path)
    assert done.exit_code == 2 and done.stdout == ""
    assert done.stderr == f"kit: error: {path}, sheet stock, row 3: column vessel: {expected}\n"


@pytest.mark.parametrize(("column", "value", "expected"), [
    ("hours_since_change", "lots", "column hours_since_change: expected a plain number with a decimal point"),
    ("hours_since_change", 100001, "column hours_since_change: expected a number from 0 to 100,000 (got 100001)"),
    ("hours_since_change", -5, "column hours_since_change: expected a number from 0 to 100,000 (got -5)"),
    ("position", "bypass", "column position: expected a filter position of unit SG1 in TEST-ONE's particulars (got 'bypass')"),
    ("position", "ret\x7furn", f"column position: expected the position as the particulars name it ({NO_CONTROL}) (got 'ret\\x7furn')"),
    ("counted_on", "2999-01-01", "column counted_on: expected the date of a count already made"),
])
def test_filter_hours_cells(fleet, column, value, expected):
    path = fleet.folder / "count.xlsx"
    edit(path, "filter_hours", "hours_since_change", 10)
    edit(path, "filter_hours", column, value)
    done = fleet.kit("stock", "import", path)
    assert done.exit_code == 2 and done.stdout == "", done.output
    assert done.stderr.startswith(f"kit: error: {path}, sheet filter_hours, row 2: {expected}"), done.stderr
    fleet.refused(["stock", "import", path], done.stderr.removeprefix("kit: error: ").rstrip("\n"))


FILTER = 'change_interval = "2000 h"\n'


@pytest.mark.parametrize(("extra", "expected"), [
    ('hours_since_change = "-3 h"', "unit[0].filter[0].hours_since_change: expected a time of zero or more"),
    ('hours_since_change = "200000 h"', "unit[0].filter[0].hours_since_change: expected a time of at most 100,000 h"),
    ("hours_since_change = 1200", "unit[0].filter[0].hours_since_change: expected"),
    ('hours_since_change = "1200 h"\nhours_read_on = 2999-01-01', "unit[0].filter[0].hours_read_on: expected a date, YYYY-MM-DD, not after today"),
    ('hours_since_change = "1200 h"\nhours_read_on = "yesterday"', "unit[0].filter[0].hours_read_on: expected a date, YYYY-MM-DD"),
    ("hours_read_on = 2026-01-01", "unit[0].filter[0].hours_since_change: expected the running hours the date hours_read_on is for"),
])
def test_particulars_filter_hours(extra, expected):
    text = TOML_CYLINDER.replace(FILTER, FILTER + extra + "\n")
    with pytest.raises(InputError) as err:
        vessel_from_dict(parse_toml(text, "v.toml"), "v.toml")
    assert str(err.value).startswith(f"v.toml: {expected}"), str(err.value)


def test_particulars_filter_hours_read():
    text = TOML_CYLINDER.replace(FILTER, FILTER + 'hours_since_change = "1200 h"\nhours_read_on = 2026-01-05\n')
    f = vessel_from_dict(parse_toml(text, "v.toml"), "v.toml").units[0].filters[0]
    assert (f.run_since_change, f.run_read_on) == (1200 * 3600.0, dt.date(2026, 1, 5))
