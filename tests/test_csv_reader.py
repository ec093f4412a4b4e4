# SPDX-License-Identifier: MIT
"""The CSV reader's one-pass way (rows as wide as the header keyed as they are read, blank rows
dropped) gives the table the general way gives: every record through the csv module, each field
stripped and a formula-guarding quote dropped (kit.files.safe_text), then kit.files.sheets._table.
The refusals are compared too (line numbers included)."""

from __future__ import annotations

import csv

from hypothesis import given, settings
from hypothesis import strategies as st

from kit.errors import InputError
from kit.files.sheets import csv_cell, _table, read_table

FIELDS = ["", " ", "a", " b ", "RS-1", "'=1+2", "'", "' x", "12.5", "x y", "\t", "\u00a0c\u00a0", '"q"', "two\nlines"]
HEADERS = [["name", "value"], ["name", "value", ""], ["", ""], ["name", "name"], [" name ", "'value"], ["a"]]


def _general(path, text: str):
    """The table the general way: csv records, fields cleaned one by one, then _table."""
    def lines():
        reader = csv.reader(text.splitlines(keepends=True))
        start = 1
        for cells in reader:
            yield start, [csv_cell(c) if c else None for c in cells]
            start = reader.line_num + 1
    return _table(str(path), None, lines(), None, (), 5, clean=True)


def _outcome(read):
    try:
        table = read()
    except InputError as exc:
        return str(exc)
    return table.columns, [(r.line, r.values) for r in table.rows]


@settings(max_examples=200, deadline=None)
@given(st.integers(0, 2), st.sampled_from(HEADERS),
       st.lists(st.lists(st.sampled_from(FIELDS), min_size=0, max_size=4), max_size=7))
def test_the_one_pass_way_reads_as_the_general_way(tmp_path_factory, blank_lines, header, records):
    path = tmp_path_factory.mktemp("csv") / "sheet.csv"
    with path.open("w", newline="", encoding="utf-8") as f:
        f.write("\r\n" * blank_lines)
        out = csv.writer(f)
        out.writerow(header)
        out.writerows(records)
    text = path.read_text(encoding="utf-8-sig")
    got = _outcome(lambda: read_table(path, "sheet", max_rows=5))
    assert got == _outcome(lambda: _general(path, text)), (header, records)


def test_a_plain_file_is_keyed_by_its_header(tmp_path):
    path = tmp_path / "sheet.csv"
    path.write_text("name,value\r\n a ,1\r\n,\r\n'=2,\r\n", encoding="utf-8")
    table = read_table(path, "sheet")
    # the blank record is no row; the guarding quote is dropped (kit.files.safe_text.from_csv_field)
    assert [(r.line, r.values) for r in table.rows] == [(2, {"name": "a", "value": "1"}), (4, {"name": "=2", "value": None})]
