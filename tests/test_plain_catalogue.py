# SPDX-License-Identifier: MIT
"""A CSV catalogue read by the one-pass way (kit.files.plain_catalogue) gives what the row-by-row
check (kit.files.catalogue_sheet.check_rows over kit.files.sheets.read_table) gives: the same
entries, or the same one-line refusal (the one-pass way leaves every refusal to the other)."""

from __future__ import annotations

import csv

from hypothesis import given, settings
from hypothesis import strategies as st

from kit.errors import InputError
from kit.files.catalogue_sheet import COLUMNS, REQUIRED, SHEET, check_rows, read_catalogue
from kit.files.plain_catalogue import plain_entries
from kit.files.plain_csv import read_plain_csv
from kit.files.sheets import MAX_ROWS, read_table

# Good rows by part (kind, dimensions, spec, part_key, pack, pack_qty), then the other columns'
# good cells; a row is sometimes given an odd cell instead (refused, or not the plain case), so
# about half the files hold none and the one-pass way takes them.
PARTS = [
    ("rod_seal", {"d": "280 mm", "D": "300 mm", "L": "25 mm"}, "NBR", "", "", "2"),
    ("rod_seal", {"d": "11.02 in", "D": "12 in", "L": "1 in"}, "", "", "", ""),
    ("piston_seal", {"D": "300 mm", "d": "280 mm", "L": "25 mm"}, " AU ", "", "10 pcs", ""),
    ("o_ring", {"id": "187.3 mm", "cs": "5.33 mm"}, "nbr", "", "", " 12 "),
    ("guide_ring", {"d": "0.28 m", "D": "300 mm", "L": "25 mm", "t": "2.5 mm", "cut": "900 mm"}, "PTFE", "", "", "1"),
    ("vane_strip", {"length": "800 mm", "h": "400 mm"}, "", "", "", ""),
    ("oil", {}, "HM 46", "", "208 L", ""),
    ("oil", {}, "", "oil:hm 46", "20 L", ""),
    ("spare", {}, "valve seal kit", "", "1 set", ""),
    ("", {}, "", "filter_element:syn-0003:sg1:offline", "", "5"),
]
OTHER = {"description": ["", "seal, rod", "O'Ring kit", "filter element, return"],
         "price": ["", "12.50", "0", "86", ".5", "1000000", "12.", "+3"], "currency": ["EUR", "USD", "eur", " GBP "],
         "lead_time_days": ["", "0", "14", "365", "3650"]}
ODD = {
    "part_kind": ["seal", "ROD_SEAL", ""], "d": ["abc", "-5 mm", "0 mm", "25", "1e3 mm", "", "301 mm"], "D": ["1 mm", ""],
    "spec": ["bad\x07", "", "'=x"], "part_key": ["nothing:x", "rod_seal:d=1\x07", "oil:hm 46"], "description": ["bell\x07"],
    "pack": ["5 US_gal", "20 kg", "1 drum", "10 pcs", ""], "pack_qty": ["0", "x", "2.5", "1000001", "3"],
    "price": ["-1", "12,50", "1e3", "1.250.00", "inf", "9" * 41, "1" + "0" * 13], "currency": ["", "XAU", "euro"],
    "lead_time_days": ["-1", "3651", "7 days", "²"], "supplier_ref": ["", "R-0", " R-1 ", "'=R", "R\x07"],
}
NAMES = list(COLUMNS)


@st.composite
def _row(draw, i: int) -> list[str]:
    kind, dims, spec, key, pack, qty = draw(st.sampled_from(PARTS))
    cells = {"supplier_ref": f"R-{i}", "part_kind": kind, **dims, "spec": spec, "part_key": key, "pack": pack, "pack_qty": qty}
    cells.update({name: draw(st.sampled_from(values)) for name, values in OTHER.items()})
    if draw(st.integers(0, 4)) == 0:
        column = draw(st.sampled_from(sorted(ODD)))
        cells[column] = draw(st.sampled_from(ODD[column]))
    return [cells.get(name, "") for name in NAMES]


def _written(path, rows, separator: str) -> None:
    with path.open("w", newline="", encoding="utf-8") as f:
        out = csv.writer(f, delimiter=separator)
        out.writerow(NAMES)
        out.writerows(rows)


def _outcome(read):
    try:
        return read()
    except InputError as exc:
        return str(exc)


def _row_by_row(path, decimal):
    return check_rows(read_table(path, SHEET, known=COLUMNS, required=REQUIRED), decimal)


@settings(max_examples=1000, deadline=None)
@given(st.sampled_from([",", ";", "\t"]), st.sampled_from([None, None, "point", "comma"]), st.data())
def test_the_one_pass_way_gives_the_row_by_row_outcome(tmp_path_factory, separator, decimal, data):
    rows = [data.draw(_row(i)) for i in range(data.draw(st.integers(1, 6)))]
    path = tmp_path_factory.mktemp("cat") / "catalogue.csv"
    _written(path, rows, separator)
    expected = _outcome(lambda: _row_by_row(path, decimal))
    assert _outcome(lambda: read_catalogue(path, "Acme", decimal).entries) == expected
    plain = read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS)
    taken = None if plain is None else plain_entries(plain, decimal)
    if taken is not None:
        assert taken == expected  # the one-pass way took the file: it gives the entries


def _file(path, rows: list[dict]) -> None:
    _written(path, [[row.get(name, "") for name in NAMES] for row in rows], ",")


def test_a_plain_catalogue_is_taken_in_one_pass(tmp_path):
    path = tmp_path / "catalogue.csv"
    _file(path, [
        {"supplier_ref": "RS-1", "part_kind": "rod_seal", "d": "280 mm", "D": "300 mm", "L": "25 mm", "spec": "NBR",
         "description": "rod seal", "pack_qty": "2", "price": "12.50", "currency": "EUR", "lead_time_days": "14"},
        {"supplier_ref": "O-1", "part_kind": "o_ring", "id": "187.3 mm", "cs": "5.33 mm", "spec": "nbr", "price": ".5", "currency": "usd"},
        {"supplier_ref": "F-1", "part_key": "filter_element:syn-0003:sg1:offline", "description": "O'Ring", "currency": "EUR"},
        {"supplier_ref": "OIL-208", "part_kind": "oil", "spec": "HM 46", "pack": "208 L", "price": "800", "currency": "EUR",
         "lead_time_days": "7"},
    ])
    plain = read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS)
    assert plain is not None
    entries = plain_entries(plain, None)
    assert entries == _row_by_row(path, None)
    assert entries == [
        (2, "RS-1", "rod_seal:d=280:D=300:L=25:nbr", "rod seal", 2, 12.5, "EUR", 14, None, None),
        (3, "O-1", "o_ring:id=187.3:cs=5.33:nbr", None, 1, 0.5, "USD", None, None, None),
        (4, "F-1", "filter_element:syn-0003:sg1:offline", "O'Ring", 1, None, "EUR", None, None, None),
        (5, "OIL-208", "oil:hm 46", None, 208, 800.0, "EUR", 7, 208.0, "208 L"),
    ]


def test_a_refusal_is_worded_by_the_row_by_row_check(tmp_path):
    path = tmp_path / "catalogue.csv"
    _file(path, [{"supplier_ref": "RS-1", "part_kind": "rod_seal", "d": "300 mm", "D": "280 mm", "L": "25 mm", "currency": "EUR"}])
    plain = read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS)
    assert plain is not None and plain_entries(plain, None) is None
    refusal = _outcome(lambda: read_catalogue(path, "Acme"))
    assert refusal == _outcome(lambda: _row_by_row(path, None))
    assert "line 2" in refusal and "d smaller than D" in refusal


def test_a_catalogue_with_few_columns_is_taken_in_one_pass(tmp_path):
    path = tmp_path / "catalogue.csv"
    path.write_text("supplier_ref;part_key;price;currency\r\nF-1;filter_element:syn-0003:sg1:offline;12,50;EUR\r\n"
                    "K-1;spare:valve_seal_kit:x; 3 ;usd\r\n", encoding="utf-8", newline="")
    plain = read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS)
    assert plain is not None
    # a semicolon-separated file's numbers have a decimal comma (kit.files.numbers)
    assert plain_entries(plain, None) == _row_by_row(path, None) == [
        (2, "F-1", "filter_element:syn-0003:sg1:offline", None, 1, 12.5, "EUR", None, None, None),
        (3, "K-1", "spare:valve_seal_kit:x", None, 1, 3.0, "USD", None, None, None)]


def test_a_guarded_field_after_a_tab_is_left_to_the_row_by_row_reader(tmp_path):
    # A tab is a separator and a space alike: the quote after it may guard a formula
    # (kit.files.safe_text), which the row-by-row reader drops; found by a red-team pass.
    for i, text in enumerate(("currency\tsupplier_ref\tpart_key\nEUR\t'=A\tspare:x\n",
                              "currency\tsupplier_ref\tpart_kind\tspec\nEUR\tA-1\tspare\t'=x\n",
                              "currency\tsupplier_ref\tpart_key\nEUR\t=A\tspare:x\nEUR\t'=A\tspare:y\n")):
        path = tmp_path / f"catalogue-{i}.csv"
        path.write_text(text, encoding="utf-8", newline="")
        assert read_plain_csv(path, known=COLUMNS, required=REQUIRED, max_rows=MAX_ROWS) is None, text
        assert _outcome(lambda: read_catalogue(path, "Acme").entries) == _outcome(lambda: _row_by_row(path, None))  # noqa: B023
