# SPDX-License-Identifier: MIT
"""The plain CSV reader (kit.files.plain_csv) against the row-by-row reader (kit.files.sheets.read_table):
wherever it takes a file, each record's cells are that reader's row on the same line; wherever that
reader refuses a file, it takes none; and it takes the plain files it is for."""

from __future__ import annotations

import csv

from hypothesis import given, settings
from hypothesis import strategies as st

from kit.errors import InputError
from kit.files.plain_csv import read_plain_csv
from kit.files.sheets import read_table

NAMES = ["name", "value", "note"]
# Fields a plain file holds, and fields that make it another case; drawn so that about half the
# files are plain (a file with any odd field or record may still be read, or left, either way).
PLAIN = ["", " ", "a", " b ", "RS-1", "x 'y'", "12.5", "x, y", "\u00a0c\u00a0", '"q"', "O'Ring", "\u2028", "\x1c"]
ODD = ["'=1+2", "'", "' x", "\t", "two\nlines", "bell\x07", "cr\rhere"]
FIELDS = PLAIN * 12 + ODD
HEADERS = [["name", "value"], ["name", "value", "note"], ["name"], [" name ", "value"]] * 3 + [
    ["name", "value", ""], ["", ""], ["name", "name"], ["name", "other"], ["'name", "value"]]


def _written(path, blank_lines: int, header: list[str], records: list[list[str]], delimiter: str) -> None:
    with path.open("w", newline="", encoding="utf-8") as f:
        f.write("\r\n" * blank_lines)
        out = csv.writer(f, delimiter=delimiter)
        out.writerow(header)
        out.writerows(records)


def _rows(path):
    try:
        table = read_table(path, "sheet", known=NAMES, max_rows=5)
    except InputError:
        return None
    return table.columns, {r.line: r.values for r in table.rows}


@settings(max_examples=300, deadline=None)
@given(st.sampled_from([0] * 9 + [1]), st.sampled_from(HEADERS), st.sampled_from([",", ";", "\t"]), st.data())
def test_where_both_read_a_file_they_agree(tmp_path_factory, blank_lines, header, delimiter, data):
    width = st.sampled_from([len(header)] * 20 + [0, 1, 2, 3, 4])
    records = data.draw(st.lists(width.flatmap(lambda n: st.lists(st.sampled_from(FIELDS), min_size=n, max_size=n)), max_size=6))
    path = tmp_path_factory.mktemp("csv") / "sheet.csv"
    _written(path, blank_lines, header, records, delimiter)
    plain = read_plain_csv(path, known=NAMES, required=(), max_rows=5)
    rows = _rows(path)
    if plain is None:
        return
    assert rows is not None, "the plain reader took a file the row-by-row reader refuses"
    columns, by_line = rows
    assert plain.header == columns and plain.separator in ",;\t"
    for i, record in enumerate(plain.records):
        cells = {name: record[plain.position(name)].strip() or None for name in plain.header}
        line = i + 2
        if all(c is None for c in cells.values()):
            assert line not in by_line  # a blank record is no row there
        else:
            assert by_line[line] == cells, (line, record)
    assert set(by_line) <= {i + 2 for i in range(len(plain.records))}


def test_a_plain_file_is_taken(tmp_path):
    path = tmp_path / "sheet.csv"
    _written(path, 0, ["name", "value"], [["a", " 1 "], ["O'Ring 'x'", ""], ["c", "3"]], ",")
    plain = read_plain_csv(path, known=NAMES, required=("name",), max_rows=5)
    assert plain is not None
    # each record ends in an empty field standing for the known column the file lacks ("note")
    assert plain.header == ("name", "value") and plain.records == [["a", " 1 ", ""], ["O'Ring 'x'", "", ""], ["c", "3", ""]]
    assert [plain.position(name) for name in NAMES] == [0, 1, 2]


def test_what_is_not_plain_is_left_to_the_row_by_row_reader(tmp_path):
    cases = {
        "blank line above the header": "\r\nname,value\r\na,1\r\n",
        "a field over two lines": 'name,value\r\n"a\nb",1\r\n',
        "a short record": "name,value\r\na\r\n",
        "an empty record": "name,value\r\n\r\na,1\r\n",
        "a field that may be guarded": "name,value\r\n'=1+2,1\r\n",
        "a guard after space": "name,value\r\na, '=1\r\n",
        "a guard after a tab separator": "name\tvalue\r\na\t'=1\r\n",
        "a control character": "name,value\r\na\x07,1\r\n",
        "an unknown column": "name,colour\r\na,1\r\n",
        "a column twice": "name,name\r\na,1\r\n",
        "a required column missing": "value\r\n1\r\n",
        "too many rows": "name\r\n" + "a\r\n" * 6,
        "a tab in a quoted field of a tab file": 'name\tvalue\r\n"a\tb"\t1\r\n',
    }
    for what, text in cases.items():
        path = tmp_path / "sheet.csv"
        path.write_text(text, encoding="utf-8", newline="")
        assert read_plain_csv(path, known=NAMES, required=("name",), max_rows=5) is None, what
    path = tmp_path / "sheet.csv"
    path.write_bytes(b"name,value\r\n\xff,1\r\n")
    assert read_plain_csv(path, known=NAMES, required=("name",), max_rows=5) is None  # not UTF-8
    assert read_plain_csv(tmp_path / "missing.csv", known=NAMES, required=(), max_rows=5) is None
