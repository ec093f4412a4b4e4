# SPDX-License-Identifier: MIT
"""The two workbook readers behind kit.files.sheets: python-calamine for a workbook whose every
part the quick measuring vouched for, openpyxl's read-only reader otherwise. Both must hand the
sheet checks the same cells, and every workbook calamine would read differently (an error cell,
which calamine reads as empty; a rectangle past the cell limit, which calamine would allocate
whole; XML only the parser follows) must go to openpyxl."""

from __future__ import annotations

import datetime as dt
from pathlib import Path

import pytest

import kit.files.sheets as sheets
from benchmarks.hostile_workbooks import hostile, sheet_xml
from hostile_support import Fleet, workbook
from kit.files.sheets import _CalamineBook, _OpenpyxlBook, _open_workbook, read_table

CATALOGUE = ["supplier_ref", "part_key", "description", "pack_qty", "price", "currency", "lead_time_days"]


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    yield f
    f.engine.dispose()


def reader(path: Path):
    book = _open_workbook(path)
    book.close()
    return type(book)


def both(path: Path, sheet: str) -> tuple[list, list]:
    """The (row, cells) of ``sheet`` as each reader hands them to the checks, cells as _table cleans them."""
    found = []
    for kind in (_CalamineBook, _OpenpyxlBook):
        book = kind(path)
        try:
            found.append([(line, [sheets._clean(c) for c in cells]) for line, cells in book.lines(sheet)])
        finally:
            book.close()
    return found[0], found[1]


def trimmed(lines: list) -> list:
    """Rows without their empty cells at the right, and empty rows at the end dropped (openpyxl
    gives each row to its last cell and a row for each row element; calamine a rectangle)."""
    out = []
    for line, cells in lines:
        while cells and cells[-1] is None:
            cells = cells[:-1]
        out.append((line, cells))
    while out and not out[-1][1]:
        out.pop()
    return out


def test_a_plain_workbook_is_read_by_calamine_with_openpyxls_cells(tmp_path):
    rows = [CATALOGUE, ["A-1", "o_ring 10 x 2 NBR", "  padded text  ", 10, 12.5, "EUR", 14],
            [1234, "o_ring 11 x 2 NBR", None, 1, 0.1, "usd", None], [], [None, None, "after a blank row", 2, -3.25, "", 0],
            ["A-3", True, 1e300, 2**52, 7.0, "NOK", 1.5]]
    path = workbook(tmp_path / "c.xlsx", "catalogue", rows)
    assert reader(path) is _CalamineBook
    calamine, pyxl = both(path, "catalogue")
    assert trimmed(calamine) == trimmed(pyxl)
    # the types, not only the values: a whole number is an int, as openpyxl gives it
    assert [type(c) for c in calamine[1][1]] == [str, str, str, int, float, str, int]
    assert calamine[5][1][4] == 7 and type(calamine[5][1][4]) is int and calamine[5][1][2] == 1e300


def test_a_date_cell_reads_as_the_same_day(tmp_path):
    path = workbook(tmp_path / "s.xlsx", "stock", [["part_key", "quantity", "counted_on"], ["k", 1, dt.datetime(2025, 3, 4)]])
    calamine, pyxl = both(path, "stock")
    day = calamine[1][1][2]
    assert isinstance(day, dt.date) and day == pyxl[1][1][2].date() == dt.date(2025, 3, 4)


def test_a_workbook_with_an_error_cell_goes_to_openpyxl_and_the_error_is_refused(fleet):
    """calamine reads #N/A as an empty cell, which would make a bad price an absent one; openpyxl
    reads its text, which the checks refuse as they always did."""
    path = hostile(fleet.folder, None, fleet.key, sheet=sheet_xml(fleet.key, '<row r="3"><c r="A3" t="inlineStr"><is><t>'
                                                                  f'{fleet.keys[1]}</t></is></c><c r="C3" t="e"><v>#N/A</v></c></row>'))
    assert reader(path) is _OpenpyxlBook
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE"],
                  f"{path}, sheet stock, row 3: column quantity: expected a plain number with a decimal point, e.g. 12.50, and no "
                  "grouping separators (decimal point: the default for text in a workbook's cells; --decimal-mark comma reads "
                  "12,50) (got '#N/A')")


@pytest.mark.parametrize("rows", [
    '<row r="3"><c r="IV3"><v>1</v></c><c r="A3" t="inlineStr"><is><t>k</t></is></c></row>',  # a cell left of the one before
    '<row r="3"><c r="A9999"><v>1</v></c></row>',  # a cell below its row
    '<row r="3"><c><v>1</v></c></row>',  # a cell without a reference
], ids=["column out of order", "row out of order", "no reference"])
def test_a_rectangle_calamine_cannot_be_sure_of_goes_to_openpyxl(tmp_path, rows):
    """Measured by the bytes, the extent is a bound: a cell the quick search cannot place counts
    as the whole of the limits, more than calamine may hold, so openpyxl (which streams) reads it."""
    assert reader(hostile(tmp_path, None, "k", sheet=sheet_xml("k", rows))) is _OpenpyxlBook


def test_the_rectangle_is_bounded_by_the_cell_limit(tmp_path, monkeypatch):
    """Rows 3 to 40 in column A, and row 41 reaching column IU: calamine would hold 41 x 255 cells."""
    rows = "".join(f'<row r="{n}"><c r="A{n}"><v>{n}</v></c></row>' for n in range(3, 41)) + '<row r="41"><c r="IU41"><v>1</v></c></row>'
    path = hostile(tmp_path, None, "k", sheet=sheet_xml("k", rows))
    monkeypatch.setattr(sheets, "MAX_CELLS", 41 * 255)
    assert reader(path) is _CalamineBook
    monkeypatch.setattr(sheets, "MAX_CELLS", 41 * 255 - 1)
    assert reader(path) is _OpenpyxlBook


def test_xml_only_the_parser_follows_goes_to_openpyxl(tmp_path):
    path = hostile(tmp_path, None, "k", sheet=sheet_xml("k", "", prefix="x"))
    assert reader(path) is _OpenpyxlBook
    table = read_table(path, "stock")
    assert [r.values for r in table.rows] == [{"part_key": "k", "location": None, "quantity": 1}]


def test_calamine_reads_every_row_past_a_small_used_range(tmp_path):
    rows = "".join(f'<row r="{n}"><c r="A{n}" t="inlineStr"><is><t>k{n}</t></is></c><c r="C{n}"><v>{n}</v></c></row>'
                   for n in range(3, 7))
    path = hostile(tmp_path, None, "k", sheet=sheet_xml("k", rows, dimension="A1:B2"))
    assert reader(path) is _CalamineBook
    assert [r.values["quantity"] for r in read_table(path, "stock").rows] == [1, 3, 4, 5, 6]
