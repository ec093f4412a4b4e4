# SPDX-License-Identifier: MIT
"""The bill of materials: requirements of one or more vessels, less what is on board, consolidated.

The same generic part (same key, see :mod:`kit.engine.parts`) across units and vessels is one order
line, with its split per vessel. Oil is summed per fluid over the whole order and only then
rounded to packages; filter elements and seals are rounded to the supplier's pack over the whole
order, not line by line.

Pure computation: the stock and the catalogue come in as plain mappings (the database layer reads
them), and the workbook writer turns the result into cells.
"""

from __future__ import annotations

import datetime as dt
import math
from collections import defaultdict
from dataclasses import dataclass, field, replace
from typing import Mapping, Sequence

from kit.engine.display_units import L_PER_M3
from kit.engine.oil import Package, plan_packages
from kit.engine.parts import LineItem
from kit.engine.purchasing import Delivery, Offer, Purchasing
from kit.engine.requirements import VesselResult
from kit.engine.series_of_hulls import HullSeries, find_series, per_hull, series_designation, shared_keys
from kit.engine.supplier_choice import Choice, PackCount, PackPlan, choose, comparison_currency, rate_of


@dataclass
class OrderLine:
    """One generic part over the order. ``choice`` is the supplier chosen (None: no offer);
    ``plan`` the packs bought for oil (the same :class:`~kit.engine.supplier_choice.PackPlan` as
    the fluid's :class:`OilOrder`), None for parts in pieces."""

    number: int
    key: str
    kind: str
    designation: str
    standard: str
    dims: dict[str, float]
    compound: str
    uom: str
    basis: str
    required: float
    on_board: float
    split: dict[str, float] = field(default_factory=dict)
    choice: Choice | None = None
    plan: PackPlan | None = None
    hulls: int | None = None  # the line's vessels are the hulls of one series, each needing per_hull
    per_hull: float | None = None  # (kit.engine.series_of_hulls.per_hull); None otherwise

    @property
    def to_order(self) -> float:
        return max(0.0, self.required - self.on_board)

    @property
    def offer(self) -> Offer | None:
        """The chosen offer of a part in pieces (None for oil, whose packs are in ``plan``)."""
        return self.choice.offers[0] if self.choice and self.plan is None else None

    @property
    def supplier(self) -> str | None:
        return self.choice.supplier if self.choice else None

    @property
    def pack_size(self) -> float:
        return self.offer.pack_content if self.offer else 1.0

    @property
    def pack_label(self) -> str:
        """The pack as the supplier wrote it, or the oil plan ("3 x 208 L + 8 x 20 L")."""
        if self.plan is not None:
            return self.plan.describe()
        return self.offer.pack_label if self.offer else f"1 {self.uom}"

    @property
    def packs(self) -> int:
        """Packs to order: the oil plan's, else to_order over the pack size, rounded up (whole pieces for a pack of 1)."""
        if self.plan is not None:
            return self.plan.packages
        return math.ceil(round(self.to_order / self.pack_size, 9))

    @property
    def price(self) -> float | None:
        """Price per pack (parts in pieces), in ``currency``."""
        return self.offer.price if self.offer else None

    @property
    def currency(self) -> str | None:
        if self.plan is not None:
            return self.plan.currency
        return self.offer.currency if self.offer else None

    @property
    def line_total(self) -> float | None:
        """Packs times price, in the supplier's ``currency``; None when unpriced."""
        if self.plan is not None:
            return self.plan.price if self.choice else None
        if self.offer is None or self.offer.price is None:
            return None
        return self.packs * self.offer.price

    @property
    def rate(self) -> float | None:
        """One unit of ``currency`` in the order's comparison currency (None: no rate in force)."""
        return self.choice.rate if self.choice else None

    @property
    def line_total_base(self) -> float | None:
        """``line_total`` in the order's comparison currency; None when unpriced or no rate is in force."""
        total = self.line_total
        return None if total is None or self.rate is None else total * self.rate

    @property
    def lead_time_days(self) -> int | None:
        return self.choice.lead_time_days if self.choice else None

    @property
    def order_by(self) -> dt.date | None:
        return self.choice.order_by if self.choice else None

    @property
    def late(self) -> bool:
        return bool(self.choice and self.choice.late)

    @property
    def earliest_arrival(self) -> dt.date | None:
        return self.choice.earliest_arrival if self.choice else None

    @property
    def delivery(self) -> Delivery | None:
        return self.choice.delivery if self.choice else None

    @property
    def reason(self) -> str:
        """Why the supplier was chosen ("" with no offer)."""
        return self.choice.reason if self.choice else ""


@dataclass
class OilOrder:
    fluid_key: str
    designation: str
    required_l: float
    on_board_l: float
    plan: PackPlan  # in litres; the same plan as the fluid's order line

    @property
    def to_order_l(self) -> float:
        return max(0.0, self.required_l - self.on_board_l)


@dataclass
class Order:
    """The consolidated order. ``currency`` is the comparison currency (the base currency, else the
    offers' most common, see :mod:`kit.engine.supplier_choice`); ``missing_rates`` the currencies of
    offers that could not be compared for want of a rate into it."""

    results: list[VesselResult]
    lines: list[OrderLine]
    oil: list[OilOrder]
    packages: tuple[Package, ...]
    purchasing: Purchasing | None = None
    currency: str | None = None
    missing_rates: tuple[str, ...] = ()
    series: tuple[HullSeries, ...] = ()  # sister ships built alike (kit.engine.series_of_hulls)

    @property
    def vessel_ids(self) -> list[str]:
        return [r.vessel.id for r in self.results]

    @property
    def base_currency(self) -> str | None:
        return self.purchasing.base_currency if self.purchasing else None

    def totals_by_currency(self) -> dict[str, float]:
        totals: dict[str, float] = defaultdict(float)
        for line in self.lines:
            if line.line_total is not None:
                totals[line.currency or ""] += line.line_total
        return dict(totals)

    def total_in_currency(self) -> float:
        """Sum of the lines' totals in the comparison currency (lines unpriced or without a rate left out)."""
        return sum(line.line_total_base for line in self.lines if line.line_total_base is not None)

    def late_lines(self) -> list[OrderLine]:
        return [line for line in self.lines if line.late]


def _join(values: list[str]) -> str:
    return "; ".join(dict.fromkeys(v for v in values if v))


def policy_plan(need_l: float, packages: Sequence[Package]) -> PackPlan:
    """Oil no supplier offers, in the spares policy's packages (:func:`kit.engine.oil.plan_packages`), in litres."""
    plan = plan_packages(need_l / L_PER_M3, list(packages))
    packs = [PackCount(f"{p.name} {p.volume * L_PER_M3:g} L", p.volume * L_PER_M3, n) for p, n in plan.counts]
    return PackPlan(need_l, tuple(sorted(packs, key=lambda p: -p.content)))


def consolidate(results: list[VesselResult], on_board: Mapping[tuple[str, str], float] | None = None,
                offers: Mapping[str, Sequence[Offer]] | None = None, purchasing: Purchasing | None = None) -> Order:
    """Consolidate the requirements of ``results`` into one order.

    ``on_board`` maps (vessel id, part key) to the quantity counted on board, in the part's uom;
    ``offers`` maps a part key to every supplier offer for it; ``purchasing`` holds today, rates,
    preferences and deliveries (none: today, nothing set). The supplier of each line is chosen by
    :func:`kit.engine.supplier_choice.choose`; oil is planned once per fluid in the chosen
    supplier's packs (the policy's packages where nothing is offered), and that one plan is the
    line's and the fluid's. Sister ships built alike are a series (:mod:`kit.engine.series_of_hulls`):
    each hull's own parts are one line with the first hull's, and a line the hulls of one series
    need alike gives ``hulls`` and ``per_hull``.
    """
    on_board = on_board or {}
    offers = offers or {}
    purchasing = purchasing or Purchasing(dt.date.today())
    series = find_series(results)
    as_lead = shared_keys(results, series)
    grouped: dict[str, list[tuple[str, LineItem]]] = defaultdict(list)
    for r in results:
        for item in r.lines:
            grouped[as_lead.get((r.vessel.id, item.key), item.key)].append((r.vessel.id, item))
    leads = {s.lead: s for s in series}
    currency = comparison_currency(purchasing, (o for k in grouped for o in offers.get(k, ())))
    lines: list[OrderLine] = []
    oil: list[OilOrder] = []
    packages = results[0].policy.packages if results else ()
    missing: set[str] = set()
    for key in sorted(grouped, key=lambda k: (_kind_order(grouped[k][0][1].kind), k)):
        items = grouped[key]
        first = items[0][1]
        split: dict[str, float] = defaultdict(float)
        for vessel_id, item in items:
            split[vessel_id] += item.quantity
        vessels = list(split)
        # each hull's stock under its own part key (a hull's own part joined to the first hull's line)
        stock = sum(on_board.get(pair, 0.0) for pair in dict.fromkeys((v, i.key) for v, i in items))
        required = sum(split.values())
        to_order = max(0.0, required - stock)
        is_oil = first.kind == "oil"
        line_offers = list(offers.get(key, ()))
        choice = choose(key, to_order, line_offers, purchasing, currency, vessels, oil=is_oil)
        missing |= {o.currency for o in line_offers if o.price is not None and rate_of(o.currency, currency, purchasing) is None}
        plan = None
        if is_oil:
            plan = choice.plan if choice else policy_plan(to_order, packages)
            oil.append(OilOrder(key, first.designation.split(",")[0], required, stock, plan))
        designation = first.designation
        if is_oil:  # the fluid, then what it is bought for: the storage tank charge and/or the top-up
            what = [i.designation.split(", ", 1)[1] for _, i in items if ", " in i.designation]
            designation = ", ".join([first.designation.split(", ", 1)[0]] + ([" and ".join(dict.fromkeys(what))] if what else []))
        if any(v != vessels[0] for v, i in items if i.key != key) and vessels[0] in leads:
            designation = series_designation(designation, vessels[0])
        hulls, each = per_hull(split, series) or (None, None)
        lines.append(OrderLine(0, key, first.kind, designation, first.standard, dict(first.dims), first.compound,
                               first.uom, _join([i.basis for _, i in items]), required, stock, dict(split),
                               choice, plan, hulls, each))
    for n, line in enumerate(lines, 1):
        line.number = n
    return Order(results, lines, oil, tuple(packages), purchasing, currency, tuple(sorted(missing)), tuple(series))


def only_to_order(order: Order) -> Order:
    """``order`` without the lines that have nothing to order (lines renumbered, oil likewise)."""
    short = [replace(line) for line in order.lines if line.to_order > EPS]
    for n, line in enumerate(short, 1):
        line.number = n
    oil = [o for o in order.oil if o.to_order_l > EPS]
    return replace(order, lines=short, oil=oil)


EPS = 1e-9
KIND_ORDER = ("piston_seal", "rod_seal", "stock_seal", "wiper", "guide_ring", "o_ring", "o_ring_cord", "vane_strip",
              "filter_element", "oil", "spare")


def _kind_order(kind: str) -> int:
    return KIND_ORDER.index(kind) if kind in KIND_ORDER else len(KIND_ORDER)
