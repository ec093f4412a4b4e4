# SPDX-License-Identifier: MIT
"""Supplier choice and oil in offered packs: money in the base currency, preferences, order-by
dates and late lines; the cheapest pack mix checked against every mix by brute force.

Prices, rates, lead times and dates here are invented for the tests (plumbing), except where a
source is named beside the check.
"""

from __future__ import annotations

import copy
import datetime as dt
import itertools
import math

import pytest

from kit.engine.bom import consolidate, only_to_order
from kit.engine.particulars import vessel_from_dict
from kit.engine.purchasing import Delivery, Offer, Purchasing, Rate
from kit.engine.requirements import assess_vessel
from kit.files.policy_file import load_policy
from kit.engine.supplier_choice import PackPlan, cheapest_mix, choose, plan_in_offers

TODAY = dt.date(2026, 3, 2)
US_GAL_L = 231 * 2.54**3 / 1000  # 1 US gallon = 231 in^3, 1 in = 2.54 cm exactly (NIST Handbook 44, Appendix C)

from test_bom import UNIT  # noqa: E402


def vessel(vid: str, **unit_changes):
    unit = copy.deepcopy(UNIT)
    unit.update(unit_changes)
    return vessel_from_dict({"vessel": {"id": vid, "name": vid.title(), "ship_type": "cargo", "gross_tonnage": 6000},
                             "unit": [unit]}, f"{vid}.toml")


def brute_force(need: float, packs: list[tuple[float, float]]) -> float:
    """The least cost of every mix with need <= supply < need + smallest pack (each count tried)."""
    smallest = min(c for c, _ in packs)
    ranges = [range(math.ceil(need / c) + 2) for c, _ in packs]
    best = math.inf
    for counts in itertools.product(*ranges):
        supply = sum(n * c for n, (c, _) in zip(counts, packs))
        if need - 1e-9 <= supply < need + smallest - 1e-9:
            best = min(best, sum(n * p for n, (_, p) in zip(counts, packs)))
    return best


PACK_SETS = [
    [(20.0, 96.0), (208.0, 905.0)],  # pail and drum: the drum cheaper per litre
    [(20.0, 80.0), (208.0, 905.0)],  # the pail cheaper per litre
    [(20.0, 96.0), (60.0, 270.0), (208.0, 905.0)],
    [(5 * US_GAL_L, 88.0), (20.0, 96.0), (208.0, 905.0)],  # "5 US_gal" beside metric packs
    [(1.0, 6.5), (20.0, 96.0), (208.0, 905.0), (1000.0, 4150.0)],
]


@pytest.mark.parametrize("packs", PACK_SETS)
@pytest.mark.parametrize("need", [0.0, 1.0, 19.0, 20.0, 21.0, 187.5, 208.0, 409.0, 773.0, 1111.1])
def test_cheapest_mix_is_never_short_never_a_pack_over_and_cheapest(need, packs):
    counts = cheapest_mix(need, packs)
    supply = sum(n * c for n, (c, _) in zip(counts, packs))
    smallest = min(c for c, _ in packs)
    assert need - 1e-9 <= supply < need + smallest  # never short, overshoot less than the smallest pack
    assert sum(n * p for n, (_, p) in zip(counts, packs)) == pytest.approx(brute_force(need, packs))


def test_773_litres_are_not_774_packs():
    # issue 13: a pack quantity of 1 turned 773 L into 774 packs at the pail price
    offers = [Offer("A", "A-20", 20.0, "20 L", 96.0, "EUR", 7), Offer("A", "A-208", 208.0, "208 L", 905.0, "EUR", 7)]
    plan = plan_in_offers(773.0, offers, "EUR", Purchasing(TODAY))
    assert plan.packages < 20 and 773.0 <= plan.supply < 793.0
    assert plan.price == pytest.approx(brute_force(773.0, [(20.0, 96.0), (208.0, 905.0)]))


@pytest.fixture(scope="module")
def policy():
    return load_policy()


def oil_offers(supplier: str, pail: float, drum: float, lead: int = 10, currency: str = "EUR") -> list[Offer]:
    return [Offer(supplier, f"{supplier}-20", 20.0, "20 L", pail, currency, lead),
            Offer(supplier, f"{supplier}-208", 208.0, "208 L", drum, currency, lead)]


def test_oil_is_planned_once_in_the_chosen_suppliers_packs(policy):
    results = [assess_vessel(vessel(v), 30, policy) for v in ("ALPHA", "BRAVO", "CHARLIE")]
    key = next(li.key for li in results[0].lines if li.kind == "oil")
    offers = {key: oil_offers("Dearer", 99.0, 950.0) + oil_offers("Cheaper", 96.0, 905.0)}
    order = consolidate(results, {}, offers, Purchasing(TODAY))
    (oil,) = order.oil
    line = next(li for li in order.lines if li.kind == "oil")
    assert line.plan is oil.plan  # the one plan every output shows
    assert line.supplier == "Cheaper" and {p.offer.supplier for p in oil.plan.packs} == {"Cheaper"}
    assert oil.to_order_l <= oil.plan.supply < oil.to_order_l + 20
    assert line.line_total == pytest.approx(brute_force(oil.to_order_l, [(20.0, 96.0), (208.0, 905.0)]))
    assert line.packs == oil.plan.packages


def test_oil_nobody_offers_is_planned_in_the_policys_packages(policy):
    order = consolidate([assess_vessel(vessel("ALPHA"), 30, policy)], {}, {}, Purchasing(TODAY))
    (oil,) = order.oil
    line = next(li for li in order.lines if li.kind == "oil")
    assert line.plan is oil.plan and line.supplier is None and line.line_total is None
    assert {p.label for p in oil.plan.packs} == {f"{p.name} {p.volume * 1000:g} L" for p in order.packages}
    assert oil.to_order_l <= oil.plan.supply < oil.to_order_l + min(p.volume * 1000 for p in order.packages)


def rod_line(policy, offers, purchasing, vessels=("ALPHA",), stock=None):
    results = [assess_vessel(vessel(v), 90, policy) for v in vessels]
    key = next(li.key for li in results[0].lines if li.kind == "rod_seal")
    order = consolidate(results, stock or {}, {key: offers}, purchasing)
    return order, next(li for li in order.lines if li.key == key), key


EUR_8650 = Offer("Euro Seals", "E-1", 1, "1 pcs", 86.50, "EUR", 10)
USD_79 = Offer("Dollar Seals", "D-1", 1, "1 pcs", 79.0, "USD", 10)
USD_90 = Offer("Dollar Seals", "D-2", 1, "1 pcs", 90.0, "USD", 10)


def eur_base(rate: float | None) -> Purchasing:
    rates = {"USD": Rate("USD", "EUR", rate, TODAY - dt.timedelta(days=3), "test rate")} if rate else {}
    return Purchasing(TODAY, "EUR", rates)


@pytest.mark.parametrize("usd, rate, winner", [
    (USD_79, 0.92, "Dollar Seals"),  # USD 79 = EUR 72.68 < EUR 86.50
    (USD_90, 0.92, "Dollar Seals"),  # USD 90 = EUR 82.80 < EUR 86.50
    (USD_79, 1.20, "Euro Seals"),  # USD 79 = EUR 94.80 > EUR 86.50
    (USD_90, 1.00, "Euro Seals"),  # USD 90 = EUR 90.00 > EUR 86.50: issue 13 saw USD 90 lose and 79 win unconverted
])
def test_offers_are_compared_in_the_base_currency_at_the_rate_in_force(policy, usd, rate, winner):
    order, line, _ = rod_line(policy, [EUR_8650, usd], eur_base(rate))
    assert line.supplier == winner
    assert order.missing_rates == ()
    assert line.reason.startswith("cheapest (no delivery date set), EUR ")
    expected = line.line_total * (rate if winner == "Dollar Seals" else 1.0)
    assert line.line_total_base == pytest.approx(expected)
    assert order.total_in_currency() == pytest.approx(sum(li.line_total_base or 0 for li in order.lines))


def test_an_offer_with_no_rate_is_never_compared_silently(policy):
    order, line, _ = rod_line(policy, [EUR_8650, USD_79], eur_base(None))
    assert line.supplier == "Euro Seals"  # the cheaper-looking USD 79 is not compared on price
    assert order.missing_rates == ("USD",)
    assert "offers in USD not compared (no rate into EUR)" in line.reason
    # only the USD offer: chosen (it is the only one), priced in USD, left out of the base total
    order, line, _ = rod_line(policy, [USD_79], eur_base(None))
    assert (line.supplier, line.reason, line.currency, line.line_total_base) == ("Dollar Seals", "only offer", "USD", None)
    assert order.missing_rates == ("USD",) and order.totals_by_currency() == {"USD": pytest.approx(line.line_total)}


def test_without_a_base_currency_only_the_most_common_currency_compares(policy):
    other = Offer("Euro Two", "E-2", 1, "1 pcs", 95.0, "EUR", 10)
    order, line, _ = rod_line(policy, [EUR_8650, other, USD_79], Purchasing(TODAY))
    assert order.currency == "EUR" and order.missing_rates == ("USD",)
    assert line.supplier == "Euro Seals"


def test_preferred_for_the_part_then_preferred_supplier_win_over_price(policy):
    cheap = Offer("Cheap Seals", "C-1", 1, "1 pcs", 50.0, "EUR", 10)
    liked = Offer("Liked Seals", "L-1", 1, "1 pcs", 70.0, "EUR", 10)
    chosen = Offer("Chosen Seals", "S-1", 1, "1 pcs", 99.0, "EUR", 10)
    offers = [cheap, liked, chosen]
    _, line, key = rod_line(policy, offers, Purchasing(TODAY))
    assert line.supplier == "Cheap Seals"
    _, line, _ = rod_line(policy, offers, Purchasing(TODAY, preferred_suppliers=frozenset({"Liked Seals"})))
    assert (line.supplier, line.reason) == ("Liked Seals", "preferred supplier")
    both = Purchasing(TODAY, preferred_suppliers=frozenset({"Liked Seals"}), part_suppliers={key: "Chosen Seals"})
    _, line, _ = rod_line(policy, offers, both)
    assert (line.supplier, line.reason) == ("Chosen Seals", "preferred for this part")
    # a part preference for a supplier that does not offer the part falls through to the rules
    elsewhere = Purchasing(TODAY, part_suppliers={key: "Nobody"})
    assert rod_line(policy, offers, elsewhere)[1].supplier == "Cheap Seals"


def test_the_cheapest_in_time_else_the_fastest_marked_late(policy):
    due = TODAY + dt.timedelta(days=30)
    slow = Offer("Slow Cheap", "S-1", 1, "1 pcs", 50.0, "EUR", 28)  # arrives today + 28 + 7 = 35 days: late
    quick = Offer("Quick Dear", "Q-1", 1, "1 pcs", 70.0, "EUR", 14)  # today + 21: in time
    quicker = Offer("Quicker Dearer", "R-1", 1, "1 pcs", 90.0, "EUR", 5)
    purchasing = Purchasing(TODAY, "EUR", handling_days=7, deliveries={"ALPHA": Delivery("ALPHA", "Rotterdam", due)})
    _, line, _ = rod_line(policy, [slow, quick, quicker], purchasing)
    assert line.supplier == "Quick Dear" and not line.late
    assert line.reason.startswith("cheapest in time, EUR ") and "(Quicker Dearer)" in line.reason
    assert line.order_by == due - dt.timedelta(days=14 + 7)  # delivery less lead time less handling days
    assert line.delivery.port == "Rotterdam"
    tight = Purchasing(TODAY, "EUR", handling_days=7, deliveries={"ALPHA": Delivery("ALPHA", "Rotterdam", TODAY + dt.timedelta(days=10))})
    _, line, _ = rod_line(policy, [slow, quick, quicker], tight)
    assert (line.supplier, line.late, line.reason) == ("Quicker Dearer", True, "fastest; none arrives in time")
    assert line.earliest_arrival == TODAY + dt.timedelta(days=5 + 7)
    assert line.order_by == TODAY + dt.timedelta(days=10 - 5 - 7)  # already past: ordered today it is 2 days late


def test_several_vessels_on_a_line_take_the_earliest_delivery(policy):
    early = Delivery("BRAVO", "Gdansk", TODAY + dt.timedelta(days=20))
    late = Delivery("ALPHA", "Rotterdam", TODAY + dt.timedelta(days=60))
    purchasing = Purchasing(TODAY, "EUR", deliveries={"ALPHA": late, "BRAVO": early})
    offer = Offer("Only Seals", "O-1", 1, "1 pcs", 50.0, "EUR", 10)
    _, line, _ = rod_line(policy, [offer], purchasing, vessels=("ALPHA", "BRAVO"))
    assert line.delivery == early and line.order_by == early.due_on - dt.timedelta(days=10 + 7)


def test_nothing_to_order_has_no_date_and_can_be_left_out(policy):
    results = [assess_vessel(vessel("ALPHA"), 90, policy)]
    full = {("ALPHA", li.key): 1e6 for li in results[0].lines}
    key = next(li.key for li in results[0].lines if li.kind == "rod_seal")
    due = Delivery("ALPHA", "Rotterdam", TODAY + dt.timedelta(days=3))
    order = consolidate(results, full, {key: [Offer("S", "S-1", 1, "1 pcs", 5.0, "EUR", 30)]},
                        Purchasing(TODAY, deliveries={"ALPHA": due}))
    line = next(li for li in order.lines if li.key == key)
    assert line.to_order == 0 and line.order_by is None and not line.late and line.supplier == "S"
    assert only_to_order(order).lines == []
    short = dict(full)
    short[("ALPHA", key)] = 0
    order = consolidate(results, short, {}, Purchasing(TODAY))
    assert [li.key for li in only_to_order(order).lines] == [key] and only_to_order(order).lines[0].number == 1


def test_choose_without_offers_is_none():
    assert choose("rod_seal:x", 3, [], Purchasing(TODAY), "EUR", ["A"]) is None
    assert PackPlan(0, ()).describe() == "none"


@pytest.mark.parametrize("rate", [None, 0.92])
def test_a_suppliers_oil_packs_in_two_currencies_are_planned_in_one(policy, rate):
    # One supplier's pail in EUR and drum in USD: a plan bought in one currency, so the line's price
    # is a sum of prices in one currency (never EUR and USD added) and the workbook's subtotals add up.
    results = [assess_vessel(vessel("ALPHA"), 30, policy)]
    key = next(li.key for li in results[0].lines if li.kind == "oil")
    mixed = [Offer("Mixed", "M-20", 20.0, "20 L", 96.0, "EUR", 7), Offer("Mixed", "M-208", 208.0, "208 L", 700.0, "USD", 7)]
    order = consolidate(results, {}, {key: mixed}, eur_base(rate))
    (oil,) = order.oil
    line = next(li for li in order.lines if li.kind == "oil")
    bought = [p for p in oil.plan.packs if p.count]
    assert {p.offer.currency for p in bought} == {line.currency}
    assert line.line_total == pytest.approx(sum(p.count * p.offer.price for p in bought))
    assert oil.to_order_l <= oil.plan.supply
    eur_only = brute_force(oil.to_order_l, [(20.0, 96.0)])
    usd_only = brute_force(oil.to_order_l, [(208.0, 700.0)])
    if rate is None:  # the USD drum cannot be compared: the plan in the base currency, least price
        assert (line.currency, line.line_total) == ("EUR", pytest.approx(eur_only))
        assert order.missing_rates == ("USD",)
    else:  # both compared in EUR: the cheaper of the two plans
        assert line.line_total_base == pytest.approx(min(eur_only, usd_only * rate))


def test_oil_is_registered_by_its_fluid_and_its_order_line_says_what_it_covers(policy):
    # The generic part is the fluid (ISO 6743-4 family and ISO 3448 grade); what the order buys it
    # for, the storage tank charge (SOLAS II-1/29.12.3) and the top-up for the period, is the line's.
    from kit.engine.requirements import kept_parts

    result = assess_vessel(vessel("ALPHA"), 30, policy)
    roles = {li.role for li in result.lines if li.kind == "oil"}
    assert roles == {"storage", "top-up"}  # a steering unit that leaks: both
    (fluid,) = {li.designation.split(",")[0] for li in result.lines if li.kind == "oil"}
    assert {li.designation for li in kept_parts(result) if li.kind == "oil"} == {fluid}
    order = consolidate([result], {}, {}, Purchasing(TODAY))
    line = next(li for li in order.lines if li.kind == "oil")
    assert line.designation == f"{fluid}, storage tank charge and top-up for 30 days"
    result.units[0].lines[:] = [li for li in result.units[0].lines if li.role != "storage"]  # top-up only
    line = next(li for li in consolidate([result], {}, {}, Purchasing(TODAY)).lines if li.kind == "oil")
    assert line.designation == f"{fluid}, top-up for 30 days"


def test_a_late_drum_does_not_hide_the_same_suppliers_pails_that_arrive_in_time(policy):
    # Rule 3 over pack plans: Quick Pails' drum (30 days) would make its cheapest plan late, but its
    # pails alone (3 days) arrive in time and cost less than the other supplier's pails.
    results = [assess_vessel(vessel("ALPHA"), 30, policy)]
    key = next(li.key for li in results[0].lines if li.kind == "oil")
    offers = [Offer("Quick Pails", "Q-20", 20.0, "20 L", 96.0, "EUR", 3), Offer("Quick Pails", "Q-208", 208.0, "208 L", 800.0, "EUR", 30),
              Offer("Other", "O-20", 20.0, "20 L", 99.0, "EUR", 10)]
    due = TODAY + dt.timedelta(days=20)
    purchasing = Purchasing(TODAY, "EUR", handling_days=7, deliveries={"ALPHA": Delivery("ALPHA", "Rotterdam", due)})
    order = consolidate(results, {}, {key: offers}, purchasing)
    line = next(li for li in order.lines if li.kind == "oil")
    assert (line.supplier, line.late) == ("Quick Pails", False)
    assert {p.label for p in line.plan.packs if p.count} == {"20 L"}
    assert line.line_total == pytest.approx(brute_force(line.to_order, [(20.0, 96.0)]))
    assert line.order_by == due - dt.timedelta(days=3 + 7)
    # Without a delivery date the cheapest plan, drums and all.
    order = consolidate(results, {}, {key: offers}, Purchasing(TODAY, "EUR"))
    line = next(li for li in order.lines if li.kind == "oil")
    assert line.line_total == pytest.approx(brute_force(line.to_order, [(20.0, 96.0), (208.0, 800.0)]))
    # Nothing in time: the fastest plan, marked late.
    tight = Purchasing(TODAY, "EUR", handling_days=7, deliveries={"ALPHA": Delivery("ALPHA", "Rotterdam", TODAY + dt.timedelta(days=5))})
    line = next(li for li in consolidate(results, {}, {key: offers}, tight).lines if li.kind == "oil")
    assert (line.supplier, line.late, line.earliest_arrival) == ("Quick Pails", True, TODAY + dt.timedelta(days=3 + 7))
    # One supplier's plans are still its only offer.
    line = next(li for li in consolidate(results, {}, {key: offers[:2]}, purchasing).lines if li.kind == "oil")
    assert (line.supplier, line.reason, line.late) == ("Quick Pails", "only offer", False)
    assert {p.label for p in line.plan.packs if p.count} == {"20 L"}
