# SPDX-License-Identifier: MIT
"""Dates, at their worst: forms that Python reads as some day but that are not the ISO 8601
calendar date YYYY-MM-DD the README promises (``date.fromisoformat`` in Python 3.11 takes
``20261205`` and the week date ``2026-W49-1``; ``strptime("%Y-%m-%d")`` takes ``2026-1-5``), days
that do not exist, and a stock count dated in the future. Each is refused with one line and exit
status 2; nothing is written. A workbook's date cell is a date and is read as one."""

from __future__ import annotations

import datetime as dt

import pytest
from sqlalchemy import select

from catalog_schema.core_tables import STOCK
from hostile_support import Fleet, workbook

EXPECTED = "a date, YYYY-MM-DD (ISO 8601)"
# ISO 8601-1:2019, 5.2.2.1 (calendar date, extended format): four-digit year, two-digit month
# and day joined by hyphens. The basic format (5.2.2.1 a) and week dates (5.2.3) are other forms.
NOT_CALENDAR_DATES = ["2026-1-5", "20261205", "2026-W49-1", "2026-W49", "2026-339", "2026-02-30", "2026-13-01",
                      "05.12.2026", "12/05/2026", "2026-12-05T10:00", "２０２６-１２-０５"]


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    yield f
    f.engine.dispose()


def counted_on(fleet) -> list[dt.date]:
    with fleet.engine.connect() as conn:
        return list(conn.execute(select(STOCK.c.counted_on)).scalars())


@pytest.mark.parametrize("text", NOT_CALENDAR_DATES)
def test_a_count_date_that_is_not_an_iso_calendar_date_is_refused(fleet, text):
    path = fleet.file("s.csv", f"part_key,quantity,counted_on\n{fleet.key},1,{text}\n")
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE"], f"{path}, line 2: column counted_on: expected {EXPECTED} (got {text!r})")


def test_a_count_date_in_the_future_is_refused(fleet):
    today = dt.date.today()
    tomorrow = (today + dt.timedelta(days=1)).isoformat()
    path = fleet.file("s.csv", f"part_key,quantity,counted_on\n{fleet.key},1,{tomorrow}\n")
    fleet.refused(["stock", "import", path, "--vessel", "TEST-ONE"],
                  f"{path}, line 2: column counted_on: expected the date of a count already made (today is {today.isoformat()}) "
                  f"(got {tomorrow!r})")
    book = workbook(fleet.folder / "s.xlsx", "stock", [["part_key", "quantity", "counted_on"], [fleet.key, 1, dt.datetime(2099, 1, 1)]])
    fleet.refused(["stock", "import", book, "--vessel", "TEST-ONE"],
                  f"{book}, sheet stock, row 2: column counted_on: expected the date of a count already made "
                  f"(today is {today.isoformat()}) (got '2099-01-01')")


def test_todays_count_and_a_workbook_date_cell_are_read(fleet):
    path = fleet.file("s.csv", f"part_key,quantity,counted_on\n{fleet.key},1,{dt.date.today().isoformat()}\n")
    assert fleet.kit("stock", "import", path, "--vessel", "TEST-ONE").exit_code == 0
    assert counted_on(fleet) == [dt.date.today()]
    book = workbook(fleet.folder / "s.xlsx", "stock", [["part_key", "quantity", "counted_on"], [fleet.key, 2, dt.datetime(2025, 3, 4)]])
    assert fleet.kit("stock", "import", book, "--vessel", "TEST-ONE").exit_code == 0
    assert counted_on(fleet) == [dt.date(2025, 3, 4)]


@pytest.mark.parametrize("text", NOT_CALENDAR_DATES)
def test_policy_dates_that_are_not_iso_calendar_dates_are_refused(fleet, text):
    fleet.refused(["policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", "90", "--from", text],
                  f"kit policy set: --from: expected {EXPECTED} (got {text!r})")
    fleet.refused(["policy", "show", "--vessel", "TEST-ONE", "--on", text], f"kit policy show: --on: expected {EXPECTED} (got {text!r})")


def test_a_policy_may_come_into_force_in_the_future(fleet):
    """Only a count must lie in the past: a policy is often recorded before it starts."""
    assert fleet.kit("policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", "90", "--from", "2099-01-01").exit_code == 0
    shown = fleet.kit("policy", "show", "--vessel", "TEST-ONE", "--on", "2099-01-02")
    assert shown.stdout.splitlines()[0] == "TEST-ONE: p (vessel policy from 2099-01-01), 90 days of cover"
