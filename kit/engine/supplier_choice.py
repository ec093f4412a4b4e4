# SPDX-License-Identifier: MIT
"""Which supplier an order line goes to, by when it must be ordered, and oil in the packs offered.

Pure: the offers, rates, preferences and deliveries come in as :mod:`kit.engine.purchasing` values.
The rules, in order (our own, written for a ship manager's purchasing office; README 'Supplier choice'):

1. **Money.** Offers are compared in the *comparison currency*: the office's base currency, else
   (none set) the currency most of the order's offers are in, ties alphabetical. An offer in another
   currency is converted at the rate in force (the latest set on or before today); with no rate it is
   never compared on price: it ranks after every priced offer that can be compared, and the order
   lists the missing rate. Offers without a price rank last. A line's cost is the packs it needs
   times the price per pack (for oil, the cheapest mix of the supplier's packs, rule 4); a line with
   nothing to order is ranked by price per unit of measure.
2. **Preference.** A supplier preferred for this part wins over price; then a supplier preferred for
   everything it offers (several: the rules below among them).
3. **Time.** An offer arrives in time when today + lead time + handling days <= the delivery date
   (with several vessels on a line, the earliest of their next deliveries). The cheapest offer that
   arrives in time is chosen; when none does, the fastest, and the line is marked late with its
   earliest arrival. Without a delivery date the cheapest is chosen. The line's order-by date is the
   delivery date less the lead time less the handling days. For oil, each lead time among a
   supplier's packs caps a plan of the packs that come that fast, and these plans are weighed as
   offers are (a slow drum does not make the same supplier's pails late).
4. **Oil packs.** Oil is planned once per fluid over the whole order in the chosen supplier's packs:
   the cheapest mix that is never short and overshoots by less than the supplier's smallest pack
   (:func:`cheapest_mix`); where no pack is offered, the policy's packages
   (:func:`kit.engine.oil.plan_packages`). A plan is bought in one currency: a supplier whose packs
   of one fluid are priced in two currencies offers two plans, compared as two offers are (so an
   unconvertible currency's packs never mix into a plan priced in another).
"""

from __future__ import annotations

import datetime as dt
import math
from collections import Counter
from dataclasses import dataclass
from typing import Iterable, Sequence

from kit.engine.purchasing import Delivery, Offer, Purchasing

EPS = 1e-9
MAX_SEARCH_STEPS = 200_000  # cheapest_mix's bound; real needs (hundreds of litres, 2-4 packs) take a few hundred


@dataclass(frozen=True)
class PackCount:
    """``count`` packs of ``content`` (in the part's unit of measure), from ``offer`` or, with no
    offer, one of the spares policy's packages."""

    label: str
    content: float
    count: int
    offer: Offer | None = None


@dataclass(frozen=True)
class PackPlan:
    """Packs covering ``need`` (in the part's unit of measure): never short."""

    need: float
    packs: tuple[PackCount, ...]

    @property
    def supply(self) -> float:
        return sum(p.content * p.count for p in self.packs)

    @property
    def packages(self) -> int:
        return sum(p.count for p in self.packs)

    @property
    def price(self) -> float | None:
        """The plan's price in its offers' currency; None when a pack bought has no price or no offer."""
        bought = [p for p in self.packs if p.count]
        if any(p.offer is None or p.offer.price is None for p in bought):
            return None
        return sum(p.count * p.offer.price for p in bought)

    @property
    def currency(self) -> str | None:
        found = [p.offer.currency for p in self.packs if p.offer is not None and p.offer.currency]
        return found[0] if found else None

    def describe(self) -> str:
        """"3 x 208 L + 8 x 20 L" (the packs bought; "none" when nothing is)."""
        return " + ".join(f"{p.count} x {p.label}" for p in self.packs if p.count) or "none"


def cheapest_mix(need: float, packs: Sequence[tuple[float, float]]) -> tuple[int, ...]:
    """Counts of ``packs`` (content, cost each) covering ``need`` at the least cost with
    need <= supply < need + the smallest content.

    An exact branch-and-bound search: counts of the larger packs are tried from the most that can
    be of use down to none, a branch is cut when its cost plus what is still needed at the lowest
    cost per unit cannot beat the best mix found, and the smallest pack then rounds the rest up
    (more of it could only cost more). Using the smallest pack alone is always a valid mix, so
    it is the first bound to beat; past ``MAX_SEARCH_STEPS`` the best found so far is kept (never
    short either).

    >>> cheapest_mix(410, [(208, 900.0), (20, 95.0)])  # 2 drums (1800) beat 1 drum + 11 pails (1945)
    (2, 0)
    """
    if need < 0 or not packs or any(c <= 0 or cost < 0 for c, cost in packs):
        raise ValueError("need must be >= 0 and packs given with positive content and cost >= 0")
    order = sorted(range(len(packs)), key=lambda i: -packs[i][0])
    sizes = [packs[i][0] for i in order]
    costs = [packs[i][1] for i in order]
    smallest = sizes[-1]
    tol = EPS * max(1.0, need)
    # lowest cost per unit among packs i.. (the bound on what is still needed)
    floor = [min(costs[j] / sizes[j] for j in range(i, len(sizes))) for i in range(len(sizes))]
    # the smallest pack alone is always a valid mix: the first bound to beat
    alone = max(0, math.ceil(round(need / smallest, 9)))
    best_cost, best = alone * costs[-1], [0] * (len(sizes) - 1) + [alone]
    steps = 0

    def search(i: int, supplied: float, cost: float, counts: list[int]) -> None:
        nonlocal best_cost, best, steps
        steps += 1
        remaining = need - supplied
        if i == len(sizes) - 1:
            n = max(0, math.ceil(round(remaining / sizes[i], 9)))
            total = cost + n * costs[i]
            if supplied + n * sizes[i] - need < smallest - tol and total < best_cost - 1e-9 * max(1.0, best_cost):
                best_cost, best = total, counts + [n]
            return
        most = max(0, math.ceil(round(remaining / sizes[i], 9)))
        for k in range(most, -1, -1):
            if steps > MAX_SEARCH_STEPS:
                return
            s = supplied + k * sizes[i]
            if s - need >= smallest - tol:
                continue
            c = cost + k * costs[i]
            if c + max(0.0, need - s) * floor[i + 1] >= best_cost - 1e-9 * max(1.0, best_cost):
                continue
            search(i + 1, s, c, counts + [k])

    search(0, 0.0, 0.0, [])
    out = [0] * len(packs)
    for pos, i in enumerate(order):
        out[i] = best[pos]
    return tuple(out)


@dataclass(frozen=True)
class Candidate:
    """One way to fill a line: a supplier's offer (pieces) or its packs planned (oil)."""

    supplier: str
    offers: tuple[Offer, ...]
    cost: float | None  # in ``currency``, for the line's quantity (or per unit when nothing is to order)
    currency: str | None
    lead_time_days: int | None
    plan: PackPlan | None = None
    rate: float | None = None  # one unit of ``currency`` in the comparison currency; None: cannot compare

    @property
    def value(self) -> float | None:
        """Cost in the comparison currency."""
        return None if self.cost is None or self.rate is None else self.cost * self.rate


@dataclass(frozen=True)
class Choice:
    """The supplier chosen for a line and why; dates when a delivery is set.

    ``offers`` are the chosen supplier's offers (one for parts in pieces; its packs for oil);
    ``rate`` converts the offer's currency into the order's comparison currency (1.0 when the
    same; None when no rate is in force); ``order_by`` is the delivery date less lead time less
    handling days; ``late`` marks a line that cannot arrive in time if ordered today, and
    ``earliest_arrival`` is today + lead time + handling days.
    """

    supplier: str
    offers: tuple[Offer, ...]
    reason: str
    rate: float | None
    lead_time_days: int | None
    delivery: Delivery | None = None
    order_by: dt.date | None = None
    earliest_arrival: dt.date | None = None
    late: bool = False
    plan: PackPlan | None = None


def comparison_currency(purchasing: Purchasing, offers: Iterable[Offer]) -> str | None:
    """The base currency, else the currency most offers are in (ties alphabetical), else None."""
    if purchasing.base_currency:
        return purchasing.base_currency
    counts = Counter(o.currency for o in offers if o.currency)
    return min(counts, key=lambda c: (-counts[c], c)) if counts else None


def rate_of(currency: str | None, comparing: str | None, purchasing: Purchasing) -> float | None:
    """One unit of ``currency`` in ``comparing``: 1.0 when the same, the rate in force when the
    base currency is set and a rate is, else None (never compared silently)."""
    if currency is None or comparing is None:
        return None
    if currency == comparing:
        return 1.0
    if purchasing.base_currency == comparing and currency in purchasing.rates:
        return purchasing.rates[currency].rate
    return None


def _packs_for(quantity: float, content: float) -> int:
    return max(0, math.ceil(round(quantity / content, 9)))


def _piece_candidates(to_order: float, offers: Sequence[Offer], comparing, purchasing) -> list[Candidate]:
    out = []
    for o in offers:
        if o.price is None:
            cost = None
        elif to_order > EPS:
            cost = _packs_for(to_order, o.pack_content) * o.price
        else:
            cost = o.price / o.pack_content
        out.append(Candidate(o.supplier, (o,), cost, o.currency, o.lead_time_days,
                             rate=rate_of(o.currency, comparing, purchasing)))
    return out


def plan_in_offers(need: float, offers: Sequence[Offer], comparing: str | None, purchasing: Purchasing) -> PackPlan:
    """The cheapest mix of one supplier's ``offers`` (packs) covering ``need`` (:func:`cheapest_mix`).

    Each pack costs its price in the comparison currency when every pack can be converted, else its
    own price when all are priced in one currency; otherwise (prices missing or not comparable) its
    content, so the least supply is bought.
    """
    rates = [rate_of(o.currency, comparing, purchasing) for o in offers]
    if all(o.price is not None for o in offers) and all(r is not None for r in rates):
        costs = [o.price * r for o, r in zip(offers, rates)]
    elif all(o.price is not None for o in offers) and len({o.currency for o in offers}) == 1:
        costs = [o.price for o in offers]
    else:
        costs = [o.pack_content for o in offers]
    counts = cheapest_mix(need, [(o.pack_content, c) for o, c in zip(offers, costs)])
    packs = sorted((PackCount(o.pack_label, o.pack_content, n, o) for o, n in zip(offers, counts)),
                   key=lambda p: (-p.content, p.label))
    return PackPlan(need, tuple(packs))


def _oil_candidates(to_order: float, offers: Sequence[Offer], comparing, purchasing) -> list[Candidate]:
    """One candidate per supplier and currency: a plan is bought in one currency, so its price is a
    sum in that currency (a supplier's packs in two currencies are two plans, compared as any two)."""
    by_supplier: dict[tuple[str, str | None], list[Offer]] = {}
    for o in offers:
        by_supplier.setdefault((o.supplier, o.currency), []).append(o)
    out = []
    for (supplier, _), offered in by_supplier.items():
        # Each lead time of the supplier's packs caps a plan of the packs that come that fast, so a
        # slow drum does not make its pails late (rule 3 picks among the plans as among suppliers).
        caps = sorted({o.lead_time_days for o in offered if o.lead_time_days is not None}) if to_order > EPS else []
        subsets = [[o for o in offered if o.lead_time_days is not None and o.lead_time_days <= cap] for cap in caps]
        seen: set[tuple] = set()
        for own in [*subsets, offered]:
            plan = plan_in_offers(to_order, own, comparing, purchasing)
            bought = [p.offer for p in plan.packs if p.count] or own
            mix = tuple(sorted((p.offer.part_number, p.count) for p in plan.packs if p.count))
            if mix in seen:
                continue
            seen.add(mix)
            leads = [o.lead_time_days for o in bought]
            lead = None if any(x is None for x in leads) else max(leads)
            currency = plan.currency
            cost = plan.price
            if to_order <= EPS:  # nothing to order: ranked by price per litre of the cheapest pack
                priced = [o.price / o.pack_content for o in own if o.price is not None and o.currency == currency]
                cost = min(priced) if priced else None
            out.append(Candidate(supplier, tuple(own), cost, currency, lead, plan, rate_of(currency, comparing, purchasing)))
    return out


def _money(currency: str | None, amount: float) -> str:
    return f"{currency or ''} {amount:,.2f}".strip()


def _arrival(c: Candidate, purchasing: Purchasing) -> dt.date | None:
    if c.lead_time_days is None:
        return None
    return purchasing.today + dt.timedelta(days=c.lead_time_days + purchasing.handling_days)


def _cheapest(pool: list[Candidate]) -> list[Candidate]:
    """``pool`` ordered: comparable prices first (cheapest first), then prices with no rate,
    then no price; within each, the shorter lead time, then the supplier's name."""
    def key(c: Candidate):
        tier = 0 if c.value is not None else 1 if c.cost is not None else 2
        lead = c.lead_time_days if c.lead_time_days is not None else math.inf
        return (tier, c.value if tier == 0 else 0.0, lead, c.supplier, tuple(o.part_number for o in c.offers))
    return sorted(pool, key=key)


def _versus(chosen: Candidate, others: list[Candidate], comparing: str | None) -> str:
    rivals = [c for c in others if c is not chosen and c.value is not None and c.supplier != chosen.supplier]
    if chosen.value is None or not rivals:
        return ""
    nxt = rivals[0]
    return f", {_money(comparing, chosen.value)} vs {_money(comparing, nxt.value)} ({nxt.supplier})"


def _pick(pool: list[Candidate], due: dt.date | None, purchasing: Purchasing, comparing) -> tuple[Candidate, str, bool]:
    """The candidate of ``pool`` by money and time (rules 1 and 3), the reason and whether it is late."""
    ranked = _cheapest(pool)
    top_tier = [c for c in ranked if (c.value is not None) == (ranked[0].value is not None)
                and (c.cost is not None) == (ranked[0].cost is not None)]
    if due is None:
        chosen = top_tier[0]
        return chosen, _why_cheapest(chosen, ranked, comparing, "cheapest (no delivery date set)"), False
    in_time = [c for c in top_tier if (a := _arrival(c, purchasing)) is not None and a <= due]
    if in_time:
        chosen = in_time[0]
        reason = _why_cheapest(chosen, in_time, comparing, "cheapest in time")
        cheaper = [c for c in top_tier if c.value is not None and chosen.value is not None and c.value < chosen.value
                   and c not in in_time]
        if cheaper:
            reason += f"; {_money(comparing, cheaper[0].value)} ({cheaper[0].supplier}) arrives too late"
        return chosen, reason, False
    fastest = min(top_tier, key=lambda c: (c.lead_time_days if c.lead_time_days is not None else math.inf,
                                           c.value if c.value is not None else 0.0, c.supplier))
    if fastest.lead_time_days is None:
        return fastest, "lead time unknown: arrival cannot be judged", False
    return fastest, "fastest; none arrives in time", True


def _why_cheapest(chosen: Candidate, ranked: list[Candidate], comparing, words: str) -> str:
    if chosen.cost is None:
        return "no price offered"
    if chosen.value is None:
        return f"no {chosen.currency} rate into {comparing}: not compared on price"
    return words + _versus(chosen, ranked, comparing)


def choose(key: str, to_order: float, offers: Sequence[Offer], purchasing: Purchasing, comparing: str | None,
           vessel_ids: Iterable[str], oil: bool = False) -> Choice | None:
    """The supplier for the line ``key`` (rules 1 to 3 of the module), or None with no offer.

    ``to_order`` is in the part's unit of measure; ``vessel_ids`` are the line's vessels, whose
    earliest next delivery sets the date.
    """
    if not offers:
        return None
    candidates = (_oil_candidates if oil else _piece_candidates)(to_order, offers, comparing, purchasing)
    deliveries = [purchasing.deliveries[v] for v in vessel_ids if v in purchasing.deliveries]
    delivery = min(deliveries, key=lambda d: (d.due_on, d.vessel_id)) if deliveries else None
    due = delivery.due_on if delivery else None
    part_pick = purchasing.part_suppliers.get(key)
    preferred = [c for c in candidates if c.supplier == part_pick]
    label = "preferred for this part"
    if not preferred:
        preferred = [c for c in candidates if c.supplier in purchasing.preferred_suppliers]
        label = "preferred supplier"
    if preferred:
        chosen, _, late = _pick(preferred, due, purchasing, comparing)
        reason = label
    elif len({c.supplier for c in candidates}) == 1:  # one supplier (its plans in time, rule 3)
        chosen, _, late = _pick(candidates, due, purchasing, comparing)
        reason = "only offer"
    else:
        chosen, reason, late = _pick(candidates, due, purchasing, comparing)
    unrated = sorted({c.currency for c in candidates if c.cost is not None and c.rate is None and c is not chosen})
    if unrated and reason not in ("only offer",):
        reason += f"; offers in {', '.join(unrated)} not compared (no rate into {comparing})"
    arrival = _arrival(chosen, purchasing)
    something = to_order > EPS
    order_by = None
    if due is not None and chosen.lead_time_days is not None and something:
        order_by = due - dt.timedelta(days=chosen.lead_time_days + purchasing.handling_days)
    return Choice(chosen.supplier, chosen.offers, reason, chosen.rate, chosen.lead_time_days, delivery, order_by,
                  arrival if something else None, late and something, chosen.plan)
