# SPDX-License-Identifier: MIT
"""The purchasing records an order reads (rates in force, preferences, next deliveries), old
catalogue rows without a pack content, and the order built from them, on SQLite and PostgreSQL.

Rates, prices and dates are invented for the tests (plumbing)."""

from __future__ import annotations

import datetime as dt

import pytest
from sqlalchemy import insert, select, update

from catalog_schema.core_tables import (CATALOGUE_ENTRIES, DELIVERIES, EXCHANGE_RATES, PART_SUPPLIERS, PARTS, PURCHASING,
                                        SUPPLIERS)
from catalog_schema.engine import write_transaction
from db_support import db_url, engine  # noqa: F401  (fixtures)
from hostile_support import Fleet
from kit.engine.purchasing import DEFAULT_HANDLING_DAYS
from kit.services.orders import build_order, check_voyage
from kit.store.order_sources import catalogue_offers
from kit.store.purchasing_store import purchasing_context

TODAY = dt.date.today()


@pytest.fixture
def fleet(db_url, tmp_path):
    f = Fleet(tmp_path, db_url)
    yield f
    f.engine.dispose()


def day(n: int) -> dt.date:
    return TODAY + dt.timedelta(days=n)


def test_nothing_set_reads_as_kits_defaults(fleet):
    with fleet.engine.connect() as conn:
        p = purchasing_context(conn, ["TEST-ONE"], TODAY)
    assert (p.base_currency, dict(p.rates), p.preferred_suppliers, dict(p.part_suppliers), dict(p.deliveries)) == \
        (None, {}, frozenset(), {}, {})
    assert p.handling_days == DEFAULT_HANDLING_DAYS == 7 and p.today == TODAY


def test_rate_in_force_preferences_and_next_delivery(fleet):
    rod = next(k for k in fleet.keys if k.startswith("rod_seal"))

    def setup(conn):
        conn.execute(insert(PURCHASING).values(id=1, base_currency="EUR", handling_days=5))
        conn.execute(insert(EXCHANGE_RATES), [
            {"currency": "USD", "base": "EUR", "rate": 0.90, "set_on": day(-30), "source": "old"},
            {"currency": "USD", "base": "EUR", "rate": 0.92, "set_on": day(-2), "source": "in force"},
            {"currency": "USD", "base": "EUR", "rate": 0.99, "set_on": day(3), "source": "not yet"},
            {"currency": "GBP", "base": "NOK", "rate": 13.0, "set_on": day(-2), "source": "another base"}])
        conn.execute(insert(SUPPLIERS), [{"name": "Liked", "preferred": True}, {"name": "Chosen", "preferred": False}])
        sid = conn.execute(select(SUPPLIERS.c.id).where(SUPPLIERS.c.name == "Chosen")).scalar_one()
        pid = conn.execute(select(PARTS.c.id).where(PARTS.c.key == rod)).scalar_one()
        conn.execute(insert(PART_SUPPLIERS).values(part_id=pid, supplier_id=sid))
        conn.execute(insert(DELIVERIES), [
            {"vessel_id": "TEST-ONE", "port": "Past", "due_on": day(-1)},
            {"vessel_id": "TEST-ONE", "port": "Next", "due_on": day(12)},
            {"vessel_id": "TEST-ONE", "port": "Later", "due_on": day(40)}])

    write_transaction(fleet.engine, setup)
    with fleet.engine.connect() as conn:
        p = purchasing_context(conn, ["TEST-ONE"], TODAY)
    assert (p.base_currency, p.handling_days) == ("EUR", 5)
    assert {c: (r.rate, r.source) for c, r in p.rates.items()} == {"USD": (0.92, "in force")}
    assert p.rates["USD"].set_on == day(-2)
    assert p.preferred_suppliers == {"Liked"} and dict(p.part_suppliers) == {rod: "Chosen"}
    assert (p.deliveries["TEST-ONE"].port, p.deliveries["TEST-ONE"].due_on) == ("Next", day(12))


def test_old_rows_without_pack_content_take_pack_qty(fleet):
    rod = next(k for k in fleet.keys if k.startswith("rod_seal"))

    def setup(conn):
        conn.execute(insert(SUPPLIERS).values(name="Old Supplier"))
        sid = conn.execute(select(SUPPLIERS.c.id)).scalar_one()
        pid = conn.execute(select(PARTS.c.id).where(PARTS.c.key == rod)).scalar_one()
        # as revision 0005 wrote it: no pack_content, no pack_label
        conn.execute(insert(CATALOGUE_ENTRIES).values(supplier_id=sid, supplier_ref="OLD-4", part_key=rod, part_id=pid,
                                                      pack_qty=4, price=40.0, currency="EUR", lead_time_days=9))

    write_transaction(fleet.engine, setup)
    with fleet.engine.connect() as conn:
        (offer,) = catalogue_offers(conn, [rod])[rod]
    assert (offer.pack_content, offer.pack_label, offer.price, offer.lead_time_days) == (4.0, "4", 40.0, 9)
    order, _ = build_order(fleet.engine, ["TEST-ONE"], 90)
    line = next(li for li in order.lines if li.key == rod)
    assert line.pack_size == 4 and line.packs == -(-line.to_order // 4)


def test_the_order_uses_rates_preferences_and_the_delivery(fleet):
    rod = next(k for k in fleet.keys if k.startswith("rod_seal"))
    oil = next(k for k in fleet.keys if k.startswith("oil"))
    rows = "\n".join([
        "supplier_ref,part_key,pack,price,currency,lead_time_days",
        f"U-ROD,{rod},,79,USD,5", f"U-20,{oil},20 L,100,USD,5", f"U-208,{oil},208 L,900,USD,5"])
    fleet_file = fleet.file("usd.csv", rows + "\n")
    assert fleet.kit("catalogue", "import", fleet_file, "--supplier", "Dollar Seals").exit_code == 0
    euro = fleet.file("eur.csv", "\n".join(["supplier_ref,part_key,pack,price,currency,lead_time_days",
                                            f"E-ROD,{rod},,86.50,EUR,30", f"E-20,{oil},20 L,96,EUR,30"]) + "\n")
    assert fleet.kit("catalogue", "import", euro, "--supplier", "Euro Seals").exit_code == 0
    order, _ = build_order(fleet.engine, ["TEST-ONE"], 90)
    # no base currency: compared in the currency of most offers (3 in USD, 2 in EUR); EUR is not compared
    assert (order.currency, order.missing_rates) == ("USD", ("EUR",))
    write_transaction(fleet.engine, lambda conn: (
        conn.execute(insert(PURCHASING).values(id=1, base_currency="EUR")),
        conn.execute(insert(EXCHANGE_RATES).values(currency="USD", base="EUR", rate=0.92, set_on=day(-1), source="test")),
        conn.execute(insert(DELIVERIES).values(vessel_id="TEST-ONE", port="Rotterdam", due_on=day(20)))))
    order, _ = build_order(fleet.engine, ["TEST-ONE"], 90)
    line = next(li for li in order.lines if li.key == rod)
    # Euro Seals (30 days + 7 handling) cannot arrive by day 20; Dollar Seals at 79 x 0.92 is cheaper anyway
    assert (line.supplier, line.late, line.order_by) == ("Dollar Seals", False, day(20 - 5 - 7))
    assert line.line_total_base == pytest.approx(line.line_total * 0.92)
    oil_line = next(li for li in order.lines if li.key == oil)
    assert oil_line.supplier == "Dollar Seals" and {p.offer.supplier for p in oil_line.plan.packs} == {"Dollar Seals"}
    write_transaction(fleet.engine, lambda conn: conn.execute(update(SUPPLIERS).where(SUPPLIERS.c.name == "Euro Seals")
                                                              .values(preferred=True)))
    check = check_voyage(fleet.engine, "TEST-ONE", 90)
    line = next(li for li in check.short.lines if li.key == rod)
    assert (line.supplier, line.reason, line.late) == ("Euro Seals", "preferred supplier", True)
    assert line.earliest_arrival == day(30 + 7)


def test_only_to_order_leaves_out_lines_with_nothing_to_order(fleet, tmp_path):
    import csv

    rod = next(k for k in fleet.keys if k.startswith("rod_seal"))
    stock = fleet.file("stock.csv", f"part_key,quantity\n{rod},1000\n")
    assert fleet.kit("stock", "import", stock, "--vessel", "TEST-ONE").exit_code == 0
    full, short = tmp_path / "full.csv", tmp_path / "short.csv"
    for out, extra in ((full, []), (short, ["--only-to-order"])):
        done = fleet.kit("bom", "--days", "90", "--out", str(out.with_suffix(".xlsx")), "--csv", str(out), *extra)
        assert done.exit_code == 0, done.output
    with open(full, newline="", encoding="utf-8") as fh:
        every = list(csv.DictReader(fh))
    with open(short, newline="", encoding="utf-8") as fh:
        some = list(csv.DictReader(fh))
    assert any(r["part_key"] == rod and float(r["to_order"]) == 0 for r in every)
    assert [r["part_key"] for r in some] == [r["part_key"] for r in every if float(r["to_order"]) > 0]
    assert [int(r["number"]) for r in some] == list(range(1, len(some) + 1))
