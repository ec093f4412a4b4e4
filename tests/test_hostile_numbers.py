# SPDX-License-Identifier: MIT
"""Numbers and currencies in imports and options, at their worst: a decimal comma read as a
thousands separator (12,50 stored as 1250), grouping separators, infinity, NaN, overflow, whole
numbers past what a database column holds, and currency codes that are no currency. Each is
refused with one line naming the file, line and column, exit status 2, and nothing written;
the plain forms are read as written."""

from __future__ import annotations

import pytest
from sqlalchemy import select

from catalog_schema.core_tables import CATALOGUE_ENTRIES, STOCK
from db_support import db_url  # noqa: F401  (fixture)
from hostile_support import Fleet, refused_without_db, workbook

POINT = ("a plain number with a decimal point, e.g. 12.50, and no grouping separators (decimal point: {why}; "
         "--decimal-mark comma reads 12,50)")
COMMA = ("a plain number with a decimal comma, e.g. 12,50, and no grouping separators (decimal comma: {why}; "
         "--decimal-mark point reads 12.50)")
SEMICOLON_CSV = COMMA.format(why="the default for a semicolon-separated CSV")
COMMA_CSV = POINT.format(why="the default for a comma-separated CSV")


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    yield f
    f.engine.dispose()


def prices(fleet) -> dict[str, float]:
    with fleet.engine.connect() as conn:
        return dict(conn.execute(select(CATALOGUE_ENTRIES.c.supplier_ref, CATALOGUE_ENTRIES.c.price)).all())


def quantities(fleet) -> list[float]:
    with fleet.engine.connect() as conn:
        return list(conn.execute(select(STOCK.c.quantity)).scalars())


def catalogue(fleet, sep: str, price: str, name: str = "cat.csv", **extra: str):
    columns = ["supplier_ref", "part_key", "price", "currency", *extra]
    cells = ["A1", fleet.key, price, "EUR", *extra.values()]
    return fleet.file(name, sep.join(columns) + "\n" + sep.join(cells) + "\n")


def test_a_semicolon_csv_is_read_with_a_decimal_comma(fleet):
    path = catalogue(fleet, ";", "12,50")
    assert fleet.kit("catalogue", "import", path, "--supplier", "S").exit_code == 0
    assert prices(fleet) == {"A1": 12.5}
    stock = fleet.file("stock.csv", f"part_key;quantity\n{fleet.key};1,5\n")
    assert fleet.kit("stock", "import", stock, "--vessel", "TEST-ONE").exit_code == 0
    assert quantities(fleet) == [1.5]


def test_a_decimal_comma_in_a_comma_separated_csv_is_refused_not_read_as_thousands(fleet):
    path = catalogue(fleet, ",", '"12,50"')
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column price: expected {COMMA_CSV} (got '12,50')")
    stock = fleet.file("stock.csv", f'part_key,quantity\n{fleet.key},"1,5"\n')
    fleet.refused(["stock", "import", stock, "--vessel", "TEST-ONE"],
                  f"{stock}, line 2: column quantity: expected {COMMA_CSV} (got '1,5')")


def test_a_tab_separated_csv_is_read_with_a_decimal_point(fleet):
    path = catalogue(fleet, "\t", "12.50", name="cat.tsv.csv")
    assert fleet.kit("catalogue", "import", path, "--supplier", "S").exit_code == 0
    assert prices(fleet) == {"A1": 12.5}


@pytest.mark.parametrize(("sep", "mark", "text"), [(",", "comma", '"12,50"'), (";", "point", "12.50")])
def test_the_decimal_mark_option_states_the_style(fleet, sep, mark, text):
    path = catalogue(fleet, sep, text)
    done = fleet.kit("catalogue", "import", path, "--supplier", "S", "--decimal-mark", mark)
    assert done.exit_code == 0, done.output
    assert prices(fleet) == {"A1": 12.5}


def test_the_option_in_force_is_named_when_it_refuses(fleet):
    path = catalogue(fleet, ";", "12,50")
    why = POINT.format(why="--decimal-mark point")
    fleet.refused(["catalogue", "import", path, "--supplier", "S", "--decimal-mark", "point"],
                  f"{path}, line 2: column price: expected {why} (got '12,50')")


def test_the_library_names_the_setting_and_the_command_line_its_option(fleet):
    """Read through the library, the refusal names the decimal mark as a setting (no option); the
    command line (above) names its --decimal-mark in the same places."""
    from kit.errors import ArgumentError
    from kit.files.stock_sheet import read_stock

    stock = fleet.file("stock.csv", f'part_key;quantity\n{fleet.key};1.5\n')
    with pytest.raises(ArgumentError) as raised:
        read_stock(stock, decimal="dot")
    assert str(raised.value) == f"{stock}: decimal mark: expected one of point, comma (got 'dot')"
    with pytest.raises(ValueError) as refused:
        read_stock(stock, decimal="comma")
    neutral = COMMA.replace("--decimal-mark", "decimal mark").format(why="decimal mark comma")
    assert str(refused.value) == f"{stock}, line 2: column quantity: expected {neutral} (got '1.5')"
    fleet.refused(["stock", "import", stock, "--vessel", "TEST-ONE", "--decimal-mark", "comma"],
                  f"{stock}, line 2: column quantity: expected {COMMA.format(why='--decimal-mark comma')} (got '1.5')")


@pytest.mark.parametrize(("sep", "text", "shown", "expected"), [
    (",", '"1,250.00"', "1,250.00", COMMA_CSV),
    (";", "1.250,00", "1.250,00", SEMICOLON_CSV),
    (";", "1 250", "1 250", SEMICOLON_CSV),
    (";", "1'250", "1'250", SEMICOLON_CSV),
    (",", "1 250.5", "1 250.5", COMMA_CSV),
    (";", "12.50", "12.50", SEMICOLON_CSV),  # the other decimal mark
    (",", "inf", "inf", COMMA_CSV),
    (",", "-Infinity", "-Infinity", COMMA_CSV),
    (",", "NaN", "NaN", COMMA_CSV),
    (",", "1e400", "1e400", COMMA_CSV),
    (",", "1e3", "1e3", COMMA_CSV),
    (",", "9" * 400, "9" * 40 + "...", COMMA_CSV),
    (",", "١٢", "١٢", COMMA_CSV),  # Arabic-Indic digits: float() reads them, a plain decimal is ASCII
], ids=["grouped point", "grouped comma", "space", "apostrophe", "space point", "other mark", "inf", "-inf", "nan",
        "overflow", "exponent", "huge", "arabic digits"])
def test_grouping_other_marks_and_non_finite_prices_are_refused(fleet, sep, text, shown, expected):
    path = catalogue(fleet, sep, text)
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column price: expected {expected} (got {shown!r})")


@pytest.mark.parametrize(("column", "text", "expected"), [
    ("pack_qty", "0", "a whole number from 1 to 1,000,000 (got '0')"),
    ("pack_qty", "1000001", "a whole number from 1 to 1,000,000 (got '1000001')"),
    ("pack_qty", "99999999999999999999", "a whole number from 1 to 1,000,000 (got '99999999999999999999')"),
    ("lead_time_days", "3651", "a whole number from 0 to 3,650 (got '3651')"),
    ("lead_time_days", "9223372036854775808", "a whole number from 0 to 3,650 (got '9223372036854775808')"),  # 2**63
    ("price", "1000000000000.01", "a number from 0 to 1,000,000,000,000 (got 1000000000000.01)"),
])
def test_whole_numbers_and_prices_past_their_bounds_are_refused(fleet, column, text, expected):
    path = catalogue(fleet, ",", "1" if column != "price" else text, **({} if column == "price" else {column: text}))
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column {column}: expected {expected}")


@pytest.mark.parametrize(("column", "value", "expected"), [
    ("price", 1e300, "a number from 0 to 1,000,000,000,000 (got 1e+300)"),
    ("pack_qty", 1e300, "a whole number from 1 to 1,000,000 (got 1e+300)"),
    ("lead_time_days", 2.0 ** 63, "a whole number from 0 to 3,650 (got 9.223372036854776e+18)"),
])
def test_workbook_cells_holding_huge_floats_are_refused(fleet, column, value, expected):
    path = workbook(fleet.folder / "cat.xlsx", "catalogue", [["supplier_ref", "part_key", "currency", column], ["A1", fleet.key, "EUR", value]])
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, sheet catalogue, row 2: column {column}: expected {expected}")


def test_stock_quantities_are_bounded_both_ways(fleet):
    path = fleet.file("s.csv", f"part_key,quantity\n{fleet.key},1000000001\n")
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE"],
                  f"{path}, line 2: column quantity: expected a number from 0 to 1,000,000,000 (got 1000000001.0)")
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE", "--mode", "adjust"],
                  f"{path}, line 2: column quantity: expected a number from -1,000,000,000 to 1,000,000,000 (got 1000000001.0)")
    workbook(fleet.folder / "s.xlsx", "stock", [["part_key", "quantity"], [fleet.key, 1e300]])
    fleet.refused(["stock", "import", fleet.folder / "s.xlsx", "--vessel", "TEST-ONE"],
                  f"{fleet.folder / 's.xlsx'}, sheet stock, row 2: column quantity: expected a number from 0 to 1,000,000,000 (got 1e+300)")


def test_the_largest_values_allowed_fit_both_engines(db_url, tmp_path):  # noqa: F811
    """PostgreSQL's integer is 32-bit (2,147,483,647): every bound kit documents fits it."""
    fleet = Fleet(tmp_path, db_url)
    try:
        path = catalogue(fleet, ",", "1000000000000", pack_qty="1000000", lead_time_days="3650")
        assert fleet.kit("catalogue", "import", path, "--supplier", "S").exit_code == 0
        with fleet.engine.connect() as conn:
            row = conn.execute(select(CATALOGUE_ENTRIES.c.pack_qty, CATALOGUE_ENTRIES.c.lead_time_days,
                                      CATALOGUE_ENTRIES.c.price)).one()
        assert tuple(row) == (1_000_000, 3650, 1e12)
        stock = fleet.file("s.csv", f"part_key,quantity\n{fleet.key},1000000000\n")
        assert fleet.kit("stock", "import", stock, "--vessel", "TEST-ONE").exit_code == 0
        assert quantities(fleet) == [1e9]
    finally:
        fleet.engine.dispose()


DAYS = "a plain number of days from 0 to 3650, e.g. 90"


@pytest.mark.parametrize("value", ["inf", "nan", "1e400", "-1", "3651", "1e3", "9" * 30])
@pytest.mark.parametrize(("args", "option"), [
    (["bom", "--out", "{tmp}/b.xlsx", "--db", "{db}"], "--days"), (["check", "TEST-ONE", "--db", "{db}"], "--days"),
    (["calc", "{tmp}/v.toml"], "--days"), (["demo", "--out", "{tmp}/d"], "--days"), (["demo", "--out", "{tmp}/d"], "--check-days"),
], ids=["bom", "check", "calc", "demo", "demo-check"])
def test_days_options_refuse_non_finite_and_unbounded_values(tmp_path, args, option, value):
    (tmp_path / "v.toml").write_text("")
    args = [a.format(tmp=tmp_path, db=f"sqlite:///{tmp_path / 'f.sqlite'}") for a in args]
    refused_without_db([*args, option, value], f"kit {args[0]}: {option}: expected {DAYS} (got {value!r})")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["v.toml"]  # no database, no output


@pytest.mark.parametrize("value", ["9.5", "99999999999", "-1", "3651", "inf"])
def test_days_of_cover_of_a_policy_are_a_bounded_whole_number(fleet, value):
    fleet.refused(["policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", value, "--from", "2025-01-01"],
                  f"kit policy set: --days: expected a whole number of days from 0 to 3650, e.g. 90 (got {value!r})")


# --- currencies -------------------------------------------------------------------------------

CURRENCY = "an ISO 4217 currency code such as EUR, USD, NOK or JPY"


@pytest.mark.parametrize("code", ["EUR", "USD", "NOK", "JPY", "eur", "Sek"])
def test_real_currency_codes_are_taken_in_capitals(fleet, code):
    # ISO 4217 (list of the maintenance agency): EUR euro, USD US dollar, NOK Norwegian krone,
    # JPY yen, SEK Swedish krona; lower case is the same code.
    path = fleet.file("c.csv", f"supplier_ref,part_key,currency\nA1,{fleet.key},{code}\n")
    assert fleet.kit("catalogue", "import", path, "--supplier", "S").exit_code == 0
    with fleet.engine.connect() as conn:
        assert conn.execute(select(CATALOGUE_ENTRIES.c.currency)).scalar_one() == code.upper()


@pytest.mark.parametrize(("code", "why"), [
    ("XYZ", ""), ("ABC", ""), ("EU", ""), ("EURO", ""), ("E R", ""), ("DEM", ""),  # DEM: withdrawn with the euro (2002)
    ("XTS", ", not a code reserved for testing"), ("XXX", ", not the code for no currency"),
])
def test_three_letters_that_are_no_currency_are_refused(fleet, code, why):
    path = fleet.file("c.csv", f"supplier_ref,part_key,currency\nA1,{fleet.key},{code}\n")
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column currency: expected {CURRENCY}{why} (got {code!r})")


def test_the_currency_table_names_its_source():
    from kit.engine.standard_tables import load_table

    rows = load_table("iso4217_2015_currency_codes.csv")
    assert {r["source"] for r in rows} == {"Debian iso-codes iso_4217.json (pycountry 26.2.16)"}
    by_code = {r["code"]: r for r in rows}
    # ISO 4217: numeric codes of EUR 978, USD 840, NOK 578, JPY 392.
    assert {c: by_code[c]["numeric"] for c in ("EUR", "USD", "NOK", "JPY")} == {"EUR": "978", "USD": "840", "NOK": "578", "JPY": "392"}
    assert all(len(c) == 3 and c.isascii() and c.isalpha() and c.isupper() for c in by_code)


def test_the_bounds_are_documented():
    """SECURITY.md states every bound kit enforces on a number, and the README the decimal-mark rule."""
    from pathlib import Path

    from kit.files import numbers

    from kit.engine import spares

    root = Path(__file__).resolve().parents[1]
    security = (root / "SECURITY.md").read_text()
    for figure in (numbers.MAX_PACK_QTY, numbers.MAX_DAYS, int(numbers.MAX_PRICE), int(numbers.MAX_QUANTITY),
                   spares.MAX_SPARE_SETS, spares.MAX_ITEM_QUANTITY, spares.MAX_RATING_BAR):
        assert f"{figure:,}" in security, figure
    assert f"at least {spares.MIN_PACKAGE_L:g} L" in security
    readme = (root / "README.md").read_text()
    assert "--decimal-mark point|comma" in readme and "semicolon-separated" in readme and "YYYY-MM-DD" in readme
