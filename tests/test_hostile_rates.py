# SPDX-License-Identifier: MIT
"""Hostile exchange-rate files for ``kit rates import``: every bad cell refused in one line naming
file, line, column and what was expected, exit status 2, nothing stored (not even the good rows).

Currency codes against ISO 4217 (``XTS`` is reserved there for testing, ``XXX`` means no currency);
dates against ISO 8601-1:2019, 5.2.2.1 (the extended calendar form YYYY-MM-DD); numbers as kit
reads every import (:mod:`kit.files.numbers`: plain decimals, the file's decimal mark, no
grouping, no exponent, finite).
"""

from __future__ import annotations

import datetime as dt

import pytest

from hostile_support import Fleet

TODAY = dt.date.today()
YESTERDAY = (TODAY - dt.timedelta(days=1)).isoformat()
CURRENCY = "expected an ISO 4217 currency code such as EUR, USD, NOK or JPY"
POINT = ("expected a plain number with a decimal point, e.g. 12.50, and no grouping separators (decimal point: the "
         "default for a comma-separated CSV; --decimal-mark comma reads 12,50)")
RATE = "expected units of the base currency one unit of the currency is worth, a number above 0 and at most 1,000,000,000"
DATE = "expected a date, YYYY-MM-DD (ISO 8601)"


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    done = f.kit("purchasing", "set", "--base-currency", "EUR")
    assert done.exit_code == 0, done.output
    good = f.file("good.csv", f"currency,rate,set_on,source\nUSD,0.92,{YESTERDAY},bank reference rate\n")
    assert f.kit("rates", "import", good).exit_code == 0  # a rate already stored, which a refusal must leave alone
    yield f
    f.engine.dispose()


def bad_line(fleet, cells: str, name: str = "rates.csv"):
    """A file whose first row is good and whose second (line 3) is ``cells``."""
    return fleet.file(name, f"currency,rate,set_on,source\nGBP,1.17,{YESTERDAY},bank\n{cells}\n")


@pytest.mark.parametrize(("cells", "column", "expected"), [
    (f"EURO,0.5,{YESTERDAY},bank", "currency", f"{CURRENCY} (got 'EURO')"),
    (f"XTS,0.5,{YESTERDAY},bank", "currency", f"{CURRENCY}, not a code reserved for testing (got 'XTS')"),
    (f"XXX,0.5,{YESTERDAY},bank", "currency", f"{CURRENCY}, not the code for no currency (got 'XXX')"),
    (f",0.5,{YESTERDAY},bank", "currency", CURRENCY),
    (f"EUR,1,{YESTERDAY},bank", "currency", "expected a currency other than the base currency EUR (its rate is 1) (got 'EUR')"),
    (f"SEK,0,{YESTERDAY},bank", "rate", f"{RATE} (got '0')"),
    (f"SEK,-0.09,{YESTERDAY},bank", "rate", f"{RATE} (got '-0.09')"),
    (f"SEK,,{YESTERDAY},bank", "rate", f"{RATE} (got 'an empty cell')"),
    (f"SEK,1000000001,{YESTERDAY},bank", "rate", f"{RATE} (got '1000000001')"),
    (f"SEK,inf,{YESTERDAY},bank", "rate", f"{POINT} (got 'inf')"),
    (f"SEK,nan,{YESTERDAY},bank", "rate", f"{POINT} (got 'nan')"),
    (f"SEK,1e-1,{YESTERDAY},bank", "rate", f"{POINT} (got '1e-1')"),
    (f'SEK,"1,250.5",{YESTERDAY},bank', "rate", f"{POINT} (got '1,250.5')"),
    (f'SEK,"0,09",{YESTERDAY},bank', "rate", f"{POINT} (got '0,09')"),
    (f"SEK,0.09,{(TODAY + dt.timedelta(days=1)).isoformat()},bank", "set_on",
     f"expected the day the rate was set, not after today ({TODAY.isoformat()}): kit records rates, it forecasts none "
     f"(got '{(TODAY + dt.timedelta(days=1)).isoformat()}')"),
    ("SEK,0.09,2026-1-5,bank", "set_on", f"{DATE} (got '2026-1-5')"),
    ("SEK,0.09,20261130,bank", "set_on", f"{DATE} (got '20261130')"),
    ("SEK,0.09,2025-02-29,bank", "set_on", f"{DATE} (got '2025-02-29')"),
    ("SEK,0.09,,bank", "set_on", f"{DATE} (got 'an empty cell')"),
    (f"SEK,0.09,{YESTERDAY},", "source", "expected where the rate came from, e.g. bank reference rate (got 'an empty cell')"),
    (f"SEK,0.09,{YESTERDAY},bank\x1b[2J", "source", "expected text without control characters (tab, newline, NUL, escape "
     "and the like) or bytes that are not UTF-8 (got 'bank\\x1b[2J')"),
    (f"GBP,1.18,{YESTERDAY},other bank", "currency", "expected each currency once per day (already on {path}, line 2) (got 'GBP')"),
], ids=["not-a-code", "XTS", "XXX", "empty-currency", "the-base", "zero", "negative", "empty-rate", "too-large", "inf", "nan",
        "exponent", "grouping", "other-decimal-mark", "future", "short-date", "basic-date", "no-such-day", "empty-date",
        "empty-source", "escape-sequence", "twice-a-day"])
def test_a_bad_cell_refuses_the_whole_file(fleet, cells, column, expected):
    path = bad_line(fleet, cells)
    fleet.refused(["rates", "import", path], f"{path}, line 3: column {column}: {expected.format(path=path)}")


def test_the_point_in_a_semicolon_file_is_refused_not_guessed(fleet):
    path = fleet.file("semi.csv", f"currency;rate;set_on;source\nSEK;0.09;{YESTERDAY};bank\n")
    fleet.refused(["rates", "import", path], f"{path}, line 2: column rate: expected a plain number with a decimal comma, "
                  "e.g. 12,50, and no grouping separators (decimal comma: the default for a semicolon-separated CSV; "
                  "--decimal-mark point reads 12.50) (got '0.09')")


@pytest.mark.parametrize(("text", "line"), [
    ("currency,rate,set_on\nSEK,0.09,2026-01-05\n", "{path}: column source: expected this column in the header row (got no such column)"),
    ("currency,rate,set_on,source,base\n", "{path}: column base: expected one of currency, rate, set_on, source (got an unknown column)"),
    ("currency,rate,set_on,source\n", "{path}: rows: expected at least one rate below the header row (got none)"),
], ids=["missing-column", "unknown-column", "no-rows"])
def test_the_header_and_rows_are_checked(fleet, text, line):
    path = fleet.file("rates.csv", text)
    fleet.refused(["rates", "import", path], line.format(path=path))


def test_only_a_csv_file_is_read(fleet):
    path = fleet.file("rates.xlsx", "not a workbook")
    fleet.refused(["rates", "import", path], f"{path}: file: expected a .csv file of exchange rates (got '.xlsx')")
    fleet.refused(["rates", "import", fleet.folder], f"{fleet.folder}: file: expected a .csv file of exchange rates (got 'no suffix')")
