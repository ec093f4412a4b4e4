# SPDX-License-Identifier: MIT
"""Every change to the fleet database leaves one audit row, in the same transaction, with who,
through which face, and the before and after (kit/services/audit.py); a refused change leaves
none. On SQLite and PostgreSQL."""

from __future__ import annotations

import datetime as dt

import pytest

from kit.errors import KitError
from kit.services.audit import Actor, read_audit
from kit.services.demo import DEMO_SUPPLIER
from tests.db_support import db_url, engine  # noqa: F401

BUYER = Actor("marta", "web")


@pytest.fixture
def demo(engine, tmp_path):  # noqa: F811
    from kit.services.demo import fill_demo

    fill_demo(engine, tmp_path)
    return engine, tmp_path


def latest(engine, **match):
    return read_audit(engine, limit=1, **match)[0]


def test_the_command_line_is_recorded_as_the_operating_system_user(demo):
    import getpass

    engine, _ = demo
    event = latest(engine, subject="CORVINA-BAY")
    assert (event.person, event.via) == (getpass.getuser(), "command line")
    assert event.action == "stock count"  # the demo's invented count, imported as a user would


def test_a_stock_count_records_the_vessel_stock_before_and_after(demo, tmp_path):
    from kit.services.imports import import_stock

    engine, imports = demo
    sheet = imports / "count-corvina-bay.xlsx"
    before_rows = latest(engine, subject="CORVINA-BAY").after
    import_stock(engine, sheet, None, actor=Actor("ingrid", "web"))
    event = latest(engine, subject="CORVINA-BAY")
    assert (event.person, event.via, event.action) == ("ingrid", "web", "stock count")
    assert event.after["file"] == sheet.name
    assert {k: v for k, v in event.before.items()} == {k: v for k, v in before_rows.items() if k != "file"}


def test_a_catalogue_import_records_the_entries_before_and_after(demo):
    from kit.services.imports import import_catalogue

    engine, imports = demo
    first = latest(engine, subject=DEMO_SUPPLIER)
    import_catalogue(engine, imports / "catalogue.csv", DEMO_SUPPLIER.upper(), actor=BUYER)
    event = latest(engine, subject=DEMO_SUPPLIER)
    assert event.before == {"entries": first.after["entries"]} and event.after["entries"] == first.after["entries"]
    assert event.person == "marta"


def test_deliveries_rates_and_settings_are_recorded_and_a_refusal_records_nothing(demo):
    from kit.services.purchasing import remove_delivery, set_delivery, set_purchasing, set_rate

    engine, _ = demo
    due = dt.date.today() + dt.timedelta(days=30)
    set_delivery(engine, "corvina-bay", "Rotterdam", due, actor=BUYER)
    event = latest(engine, subject="CORVINA-BAY")
    assert event.action == "set delivery" and event.before == [] and event.after == [[due.isoformat(), "Rotterdam", None]]
    remove_delivery(engine, "CORVINA-BAY", due, actor=BUYER)
    assert latest(engine, subject="CORVINA-BAY").after == []
    set_purchasing(engine, base_currency="EUR", actor=BUYER)
    assert latest(engine, subject="purchasing").after["base currency"] == "EUR"
    set_rate(engine, "USD", 0.92, source="bank notice", actor=BUYER)
    event = latest(engine, subject="USD")
    assert event.before == {} and event.after["USD"][0] == 0.92
    count = len(read_audit(engine, limit=100_000))
    with pytest.raises(KitError):
        set_rate(engine, "USD", -1.0, source="typo", actor=BUYER)
    with pytest.raises(KitError):
        set_delivery(engine, "NO-SUCH-VESSEL", "Rotterdam", due, actor=BUYER)
    assert len(read_audit(engine, limit=100_000)) == count


def test_a_policy_records_its_scope_and_values(demo):
    from kit.services.policies import set_policy

    engine, _ = demo
    set_policy(engine, name="winter", cover_days=120, in_force_from=dt.date(2026, 12, 1), vessel="tidewhistle",
               actor=Actor("ada", "web"))
    event = latest(engine, subject="TIDEWHISTLE")
    assert event.action == "set policy" and event.after["days of cover"] == 120 and event.person == "ada"
