# SPDX-License-Identifier: MIT
"""The purchaser's records (revision 0006) through the command line, on SQLite and PostgreSQL:
base currency and handling margin, exchange rates, preferred suppliers, deliveries, and ``--days``
of ``kit bom`` and ``kit check`` defaulting to the policies' days of cover.

The rate in force on a day is the latest set on or before it (the rule of
:class:`catalog_schema.tables.ExchangeRateRow`); the handling margin's default of 7 days is
common practice (:data:`kit.engine.purchasing.DEFAULT_HANDLING_DAYS`). Every value here is an
invented one for testing the plumbing; exchange rates are not real quotations.
"""

from __future__ import annotations

import datetime as dt
import json

import openpyxl
import pytest
from sqlalchemy import insert

from catalog_schema.core_tables import DELIVERIES
from db_support import TOML_CYLINDER, db_url, dump  # noqa: F401  (fixtures)
from hostile_support import Fleet
from kit.engine.purchasing import DEFAULT_HANDLING_DAYS

TODAY = dt.date.today()
SECOND = TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "TEST-TWO"').replace('name = "Test One"', 'name = "Test Two"')
NOT_MONEY = "expected an ISO 4217 currency code such as EUR, USD, NOK or JPY"


def day(offset: int) -> str:
    return (TODAY + dt.timedelta(days=offset)).isoformat()


@pytest.fixture
def fleet(db_url, tmp_path):  # noqa: F811
    """Two vessels of one company with their parts registered, and one supplier's catalogue."""
    f = Fleet(tmp_path, db_url)
    f.file("two.toml", SECOND)
    assert f.kit("load", tmp_path / "two.toml").exit_code == 0
    rows = "".join(f"H-{i},{key},10,EUR,5\n" for i, key in enumerate(f.keys[:2]))
    f.file("cat.csv", "supplier_ref,part_key,price,currency,lead_time_days\n" + rows + "H-X,rod_seal:d=1mm:D=2mm:L=3mm,1,EUR,\n")
    assert f.kit("catalogue", "import", tmp_path / "cat.csv", "--supplier", "Skerrow Seal Supply").exit_code == 0
    f.file("cat2.csv", f"supplier_ref,part_key,price,currency\nQ-1,{f.keys[0]},9,USD\n")
    assert f.kit("catalogue", "import", tmp_path / "cat2.csv", "--supplier", "Quillon Marine").exit_code == 0
    yield f
    f.engine.dispose()


def ok(fleet, *args) -> str:
    done = fleet.kit(*args)
    assert done.exit_code == 0, done.output
    return done.stdout


# --- base currency and handling margin ---------------------------------------------------------

def test_purchasing_settings_start_unset_with_the_default_margin(fleet):
    assert ok(fleet, "purchasing", "show") == (
        "base currency: none set (kit purchasing set --base-currency CODE)\n"
        f"handling margin: {DEFAULT_HANDLING_DAYS} days (kit's default, common practice)\n")


def test_purchasing_set_keeps_the_setting_not_given(fleet):
    ok(fleet, "purchasing", "set", "--base-currency", "eur")
    assert ok(fleet, "purchasing", "set", "--handling-days", "10") == (
        "base currency: EUR\nhandling margin: 10 days\nrates into EUR in force today: 0\n")
    assert dump(fleet.engine, ["purchasing"])["purchasing"] == [(1, "EUR", 10)]


@pytest.mark.parametrize(("args", "line"), [
    (["--base-currency", "EUX"], f"kit purchasing set: --base-currency: {NOT_MONEY} (got 'EUX')"),
    (["--base-currency", "XTS"], f"kit purchasing set: --base-currency: {NOT_MONEY}, not a code reserved for testing (got 'XTS')"),
    (["--handling-days", "366"], "kit purchasing set: --handling-days: expected a whole number of days from 0 to 365, e.g. 90 (got '366')"),
    (["--handling-days", "-1"], "kit purchasing set: --handling-days: expected a whole number of days from 0 to 365, e.g. 90 (got '-1')"),
    ([], "kit purchasing set: --base-currency/--handling-days: expected at least one of the two (got neither)"),
], ids=["unknown", "XTS", "366-days", "negative", "neither"])
def test_purchasing_set_refusals(fleet, args, line):
    ok(fleet, "purchasing", "set", "--base-currency", "NOK", "--handling-days", "3")
    fleet.refused(["purchasing", "set", *args], line)


def test_changing_the_base_keeps_the_old_rates_and_says_so(fleet):
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")
    ok(fleet, "rates", "set", "USD", "0.92", "--on", day(-1), "--source", "bank reference rate")
    shown = ok(fleet, "purchasing", "set", "--base-currency", "USD")
    assert "1 rate(s) into EUR stay stored (each rate carries its base) and are not used while the base currency is USD" in shown
    assert len(dump(fleet.engine, ["exchange_rates"])["exchange_rates"]) == 1
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")  # back again: the rate is in force again
    assert ok(fleet, "rates", "list").startswith(f"1 USD = 0.92 EUR, set on {day(-1)}, source: bank reference rate\n")


# --- exchange rates ----------------------------------------------------------------------------

def test_rates_need_a_base_currency_first(fleet):
    line = "fleet database: base currency: expected a base currency set first (kit purchasing set sets it) (got none set)"
    fleet.refused(["rates", "set", "USD", "0.92", "--source", "bank"], line)
    fleet.refused(["rates", "list"], line)
    fleet.file("r.csv", "currency,rate,set_on,source\nUSD,0.92,2026-01-02,bank\n")
    fleet.refused(["rates", "import", fleet.folder / "r.csv"], line)


def test_rate_in_force_is_the_latest_set_on_or_before_the_day(fleet):
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")
    for on, rate in ((-30, "0.90"), (-10, "0.95"), (-1, "0.92")):
        ok(fleet, "rates", "set", "usd", rate, "--on", day(on), "--source", f"bank {on}")
    ok(fleet, "rates", "set", "GBP", "1.17", "--on", day(-10), "--source", "invoice")
    assert ok(fleet, "rates", "list", "--on", day(-31)) == "no rates into EUR in force on " + day(-31) + "\n"
    assert ok(fleet, "rates", "list", "--on", day(-30)) == f"1 USD = 0.9 EUR, set on {day(-30)}, source: bank -30\n"
    assert ok(fleet, "rates", "list", "--on", day(-2)) == (f"1 GBP = 1.17 EUR, set on {day(-10)}, source: invoice\n"
                                                           f"1 USD = 0.95 EUR, set on {day(-10)}, source: bank -10\n")
    assert ok(fleet, "rates", "list").endswith(f"1 USD = 0.92 EUR, set on {day(-1)}, source: bank -1\n")
    ok(fleet, "rates", "set", "USD", "0.93", "--on", day(-1), "--source", "corrected")  # same day: replaced
    assert ok(fleet, "rates", "list").endswith(f"1 USD = 0.93 EUR, set on {day(-1)}, source: corrected\n")
    assert len(dump(fleet.engine, ["exchange_rates"])["exchange_rates"]) == 4


@pytest.mark.parametrize(("args", "line"), [
    (["EUR", "1"], "kit rates set: CURRENCY: expected a currency other than the base currency EUR (its rate is 1) (got EUR)"),
    (["XTS", "1"], f"kit rates set: CURRENCY: {NOT_MONEY}, not a code reserved for testing (got 'XTS')"),
    (["USD", "0"], "kit rates set: RATE: expected units of the base currency one unit of the currency is worth, a number "
                   "above 0 and at most 1,000,000,000 (got 0.0)"),
    (["USD", "0,92"], "kit rates set: RATE: expected units of the base currency one unit of the currency is worth, a number "
                      "above 0 and at most 1,000,000,000, with a decimal point and no grouping separators (got '0,92')"),
    (["USD", "inf"], "kit rates set: RATE: expected units of the base currency one unit of the currency is worth, a number "
                     "above 0 and at most 1,000,000,000, with a decimal point and no grouping separators (got 'inf')"),
    (["USD", "0.92", "--on", day(1)], f"kit rates set: --on: expected the day the rate was set, not after today "
                                      f"({TODAY.isoformat()}): kit records rates, it forecasts none (got {day(1)})"),
    (["USD", "0.92", "--source", " "], "kit rates set: --source: expected a source (got an empty text)"),
], ids=["base", "XTS", "zero", "comma", "inf", "future", "no-source"])
def test_rates_set_refusals(fleet, args, line):
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")
    source = [] if "--source" in args else ["--source", "bank"]
    fleet.refused(["rates", "set", *args, *source], line)


def test_rates_import_stores_the_file_and_is_all_or_nothing(fleet):
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")
    good = fleet.file("good.csv", f"currency,rate,set_on,source\nUSD,0.92,{day(-2)},bank reference rate\nNOK,0.085,{day(-2)},bank\n")
    assert ok(fleet, "rates", "import", good) == f"2 rate(s) into EUR stored from {good}\n"
    assert ok(fleet, "rates", "list") == (f"1 NOK = 0.085 EUR, set on {day(-2)}, source: bank\n"
                                          f"1 USD = 0.92 EUR, set on {day(-2)}, source: bank reference rate\n")
    bad = fleet.file("bad.csv", f"currency,rate,set_on,source\nUSD,0.5,{day(-1)},bank\nGBP,1.1,{day(-1)},bank\n"
                                f"SEK,-0.09,{day(-1)},bank\n")
    fleet.refused(["rates", "import", bad], f"{bad}, line 4: column rate: expected units of the base currency one unit of "
                                            "the currency is worth, a number above 0 and at most 1,000,000,000 (got '-0.09')")
    assert len(dump(fleet.engine, ["exchange_rates"])["exchange_rates"]) == 2  # the good lines of bad.csv are not stored


def test_rates_import_reads_a_semicolon_file_with_a_decimal_comma(fleet):
    ok(fleet, "purchasing", "set", "--base-currency", "EUR")
    path = fleet.file("r.csv", f"currency;rate;set_on;source\nUSD;0,92;{day(-1)};bank\n")
    ok(fleet, "rates", "import", path)
    assert ok(fleet, "rates", "list") == f"1 USD = 0.92 EUR, set on {day(-1)}, source: bank\n"


# --- preferred suppliers -----------------------------------------------------------------------

def test_supplier_list_prefer_and_undo(fleet):
    key = fleet.keys[0]
    assert ok(fleet, "supplier", "list") == ("Quillon Marine\t1 entries, 1 matched\t-\n"
                                             "Skerrow Seal Supply\t3 entries, 2 matched\t-\n")
    assert ok(fleet, "supplier", "prefer", "Quillon Marine") == "Quillon Marine: preferred for everything it offers\n"
    assert ok(fleet, "supplier", "prefer", "Quillon Marine").endswith("(already)\n")
    ok(fleet, "supplier", "prefer", "Skerrow Seal Supply", "--part", key, "--note", "maker-approved")
    assert ok(fleet, "supplier", "prefer", "Quillon Marine", "--part", key) == (
        f"Quillon Marine: preferred for {key} (instead of Skerrow Seal Supply)\n")  # one supplier per part
    assert ok(fleet, "supplier", "list") == ("Quillon Marine\t1 entries, 1 matched\tpreferred\n"
                                             f"  preferred for {key}\n"
                                             "Skerrow Seal Supply\t3 entries, 2 matched\t-\n")
    assert ok(fleet, "supplier", "unprefer", "Quillon Marine", "--part", key) == f"Quillon Marine: no longer preferred for {key}\n"
    assert ok(fleet, "supplier", "unprefer", "Quillon Marine", "--part", key) == (
        f"Quillon Marine: was not preferred for {key}; nothing changed\n")
    ok(fleet, "supplier", "unprefer", "Quillon Marine")
    assert dump(fleet.engine, ["part_suppliers"])["part_suppliers"] == []
    assert [row[2] for row in dump(fleet.engine, ["suppliers"])["suppliers"]] == [False, False]


def test_prefer_for_a_part_the_supplier_does_not_offer_says_so(fleet):
    # Quillon Marine's catalogue offers keys[0] only: the preference is kept (a catalogue may come
    # later) but the purchaser is told it cannot choose that supplier yet
    assert ok(fleet, "supplier", "prefer", "Quillon Marine", "--part", fleet.keys[1]) == (
        f"Quillon Marine: preferred for {fleet.keys[1]}\n"
        "  note: Quillon Marine offers nothing for this part (no catalogue entry or quoted reply matches it): "
        "the order chooses among the other offers until it does\n")
    assert ok(fleet, "supplier", "prefer", "Quillon Marine", "--part", fleet.keys[0]) == (
        f"Quillon Marine: preferred for {fleet.keys[0]}\n")


def test_supplier_refusals_name_what_to_look_at(fleet):
    ok(fleet, "supplier", "prefer", "Skerrow Seal Supply", "--part", fleet.keys[1], "--note", "kept")
    fleet.refused(["supplier", "prefer", "Harlow Seals"],
                  "kit supplier prefer: NAME: expected the name of a supplier in the fleet database (kit supplier list "
                  "shows them; kit catalogue import adds them) (got 'Harlow Seals')")
    fleet.refused(["supplier", "prefer", "Skerrow Seal Supply", "--part", "o_ring:nothing"],
                  "kit supplier prefer: --part: expected the key of a generic part in the fleet database (kit parts list "
                  "shows them; kit parts register adds them) (got 'o_ring:nothing')")
    fleet.refused(["supplier", "unprefer", "Nobody", "--part", fleet.keys[1]],
                  "kit supplier unprefer: NAME: expected the name of a supplier in the fleet database (kit supplier list "
                  "shows them; kit catalogue import adds them) (got 'Nobody')")
    fleet.refused(["supplier", "prefer", "Quillon Marine", "--note", "why"],
                  "kit supplier prefer: --note: expected a note only with a part (a preference for one part) (got 'why')")
    fleet.refused(["supplier", "prefer", "Quillon Marine", "--part", fleet.keys[0], "--note", "a\x1b[2Jb"],
                  "kit supplier prefer: --note: expected text without control characters (tab, newline, NUL, escape and "
                  "the like) or bytes that are not UTF-8 (got 'a\\x1b[2Jb', U+001B at character 2)")


# --- deliveries --------------------------------------------------------------------------------

def test_delivery_set_replaces_the_port_of_the_same_day_and_lists_by_date(fleet):
    assert ok(fleet, "delivery", "set", "TEST-TWO", "--port", "Rotterdam", "--on", day(20), "--note", "agent: Kessel") == (
        f"TEST-TWO: on board at Rotterdam by {day(20)}\n")
    ok(fleet, "delivery", "set", "TEST-ONE", "--port", "Gdansk", "--on", day(5))
    assert ok(fleet, "delivery", "set", "TEST-TWO", "--port", "Antwerp", "--on", day(20)) == (
        f"TEST-TWO: on board at Antwerp by {day(20)} (instead of Rotterdam)\n")
    ok(fleet, "delivery", "set", "TEST-ONE", "--port", "Gdansk", "--on", day(0))  # today is not in the past
    with fleet.engine.begin() as conn:  # a delivery that has passed (the command refuses to set one)
        conn.execute(insert(DELIVERIES).values(vessel_id="TEST-ONE", port="Bergen", due_on=TODAY - dt.timedelta(days=3)))
    assert ok(fleet, "delivery", "list") == (f"{day(0)}\tTEST-ONE\tGdansk\n{day(5)}\tTEST-ONE\tGdansk\n{day(20)}\tTEST-TWO\tAntwerp\n")
    assert ok(fleet, "delivery", "list", "--vessel", "TEST-ONE", "--all") == (
        f"{day(-3)}\tTEST-ONE\tBergen\n{day(0)}\tTEST-ONE\tGdansk\n{day(5)}\tTEST-ONE\tGdansk\n")
    assert ok(fleet, "delivery", "remove", "TEST-ONE", "--on", day(5)) == f"TEST-ONE: delivery at Gdansk on {day(5)} removed\n"
    assert ok(fleet, "delivery", "list", "--vessel", "TEST-ONE") == f"{day(0)}\tTEST-ONE\tGdansk\n"


def test_delivery_refusals(fleet):
    ok(fleet, "delivery", "set", "TEST-ONE", "--port", "Gdansk", "--on", day(5))
    fleet.refused(["delivery", "set", "TEST-NINE", "--port", "Gdansk", "--on", day(5)],
                  "kit delivery set: VESSEL: expected the id of a vessel in the database (kit vessels lists them; letter case does not matter) (got 'TEST-NINE')")
    fleet.refused(["delivery", "set", "TEST-ONE", "--port", "Gdansk", "--on", day(-1)],
                  f"kit delivery set: --on: expected today ({TODAY.isoformat()}) or later (got {day(-1)})")
    fleet.refused(["delivery", "set", "TEST-ONE", "--port", "", "--on", day(6)], "kit delivery set: --port: expected a port (got an empty text)")
    fleet.refused(["delivery", "set", "TEST-ONE", "--port", "Gdansk", "--on", "2026-1-5"],
                  "kit delivery set: --on: expected a date, YYYY-MM-DD (ISO 8601) (got '2026-1-5')")
    fleet.refused(["delivery", "list", "--vessel", "TEST-NINE"],
                  "kit delivery list: --vessel: expected the id of a vessel in the database (kit vessels lists them; letter case does not matter) (got 'TEST-NINE')")
    fleet.refused(["delivery", "remove", "TEST-ONE", "--on", day(6)],
                  f"kit delivery remove: --on: expected the day of one of TEST-ONE's deliveries (kit delivery list shows them) (got {day(6)})")


# --- days of cover -----------------------------------------------------------------------------

def order_days(fleet, *args) -> tuple[float, str]:
    out = fleet.folder / "order.json"
    done = fleet.kit("bom", "--out", fleet.folder / "order.xlsx", "--json", out, *args)
    assert done.exit_code == 0, done.output
    return json.loads(out.read_text())["days"], done.stderr


def test_days_default_to_the_policies_days_of_cover_the_largest_where_they_differ(fleet):
    fleet.refused(["bom", "--out", fleet.folder / "o.xlsx"],
                  "kit bom: --days: expected a number of days (no spares policy with days of cover is in force for "
                  "TEST-ONE and 1 other vessel(s); kit policy set records one)")
    ok(fleet, "policy", "set", "--company", "Brackwater Test Shipping", "--name", "fleet", "--days", "60", "--from", day(-5))
    assert order_days(fleet) == (60, "")
    ok(fleet, "policy", "set", "--vessel", "TEST-TWO", "--name", "long", "--days", "150", "--from", day(-5))
    assert order_days(fleet) == (150, "kit: --days not given: 150 days, the largest days of cover of the spares policies "
                                      "in force (150 for TEST-TWO; 60 for TEST-ONE)\n")
    assert order_days(fleet, "--vessel", "TEST-ONE") == (60, "")
    assert order_days(fleet, "--days", "7") == (7, "")  # given, it wins
    ok(fleet, "policy", "set", "--vessel", "TEST-ONE", "--name", "later", "--days", "300", "--from", day(1))
    assert order_days(fleet, "--vessel", "TEST-ONE") == (60, "")  # a policy not yet in force counts for nothing


def test_check_days_default_to_the_vessels_policy(fleet):
    ok(fleet, "policy", "set", "--vessel", "TEST-ONE", "--name", "voyage", "--days", "45", "--from", day(-1))
    out = fleet.folder / "short.xlsx"
    done = fleet.kit("check", "TEST-ONE", "--out", out)
    assert done.exit_code == 1, done.output  # nothing on board, so something is short
    texts = [c for ws in openpyxl.load_workbook(out) for row in ws.iter_rows(values_only=True) for c in row if isinstance(c, str)]
    assert any("Voyage: 45 days." in t for t in texts)
    fleet.refused(["check", "TEST-TWO"], "kit check: --days: expected a number of days (no spares policy with days of "
                                         "cover is in force for TEST-TWO; kit policy set records one)")


def test_a_policy_file_states_no_days_of_cover(fleet):
    ok(fleet, "policy", "set", "--company", "Brackwater Test Shipping", "--name", "fleet", "--days", "60", "--from", day(-5))
    line = ("kit bom: --days: expected a number of days (a spares policy file holds no days of cover; kit policy set "
            "records them in the fleet database)")
    fleet.refused(["bom", "--particulars", fleet.folder / "v.toml", "--out", fleet.folder / "o.xlsx"], line)
    policy = fleet.file("p.toml", '[policy]\nname = "two sets"\nspare_filter_sets = 2\n')
    fleet.refused(["bom", "--policy", policy, "--out", fleet.folder / "o.xlsx"], line)
    assert not (fleet.folder / "o.xlsx").exists()


def test_a_supplier_is_the_same_in_any_letter_case(fleet, tmp_path):
    # As vessel ids: a supplier typed in other letter case (a command, a catalogue import, an open
    # enquiry's reply) is the supplier already stored, never a second one.
    assert ok(fleet, "supplier", "prefer", "quillon  MARINE") == "Quillon Marine: preferred for everything it offers\n"
    fleet.file("cat3.csv", f"supplier_ref,part_key,price,currency\nQ-2,{fleet.keys[1]},8,USD\n")
    assert ok(fleet, "catalogue", "import", tmp_path / "cat3.csv", "--supplier", "QUILLON MARINE").startswith("Quillon Marine: 1 row(s)")
    assert ok(fleet, "supplier", "list") == ("Quillon Marine\t1 entries, 1 matched\tpreferred\n"
                                             "Skerrow Seal Supply\t3 entries, 2 matched\t-\n")


def test_registering_again_gives_an_oil_part_its_fluid_alone(fleet):
    # A database registered before an oil part was its fluid alone (it kept the first unit's
    # "storage tank charge" or "top-up for N days") is put right by registering again.
    from sqlalchemy import select, update

    from catalog_schema.core_tables import PARTS

    key = next(k for k in fleet.keys if k.startswith("oil:"))
    with fleet.engine.begin() as conn:
        conn.execute(update(PARTS).where(PARTS.c.key == key).values(designation="hydraulic oil HM 46, storage tank charge"))
    ok(fleet, "parts", "register")
    with fleet.engine.connect() as conn:
        assert conn.execute(select(PARTS.c.designation).where(PARTS.c.key == key)).scalar() == "hydraulic oil HM 46"
