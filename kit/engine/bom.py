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

import math
from collections import defaultdict
from dataclasses import dataclass, field
from typing import Mapping

from kit.engine.display_units import L_PER_M3
from kit.engine.oil import Package, PackagePlan, plan_packages
from kit.engine.parts import LineItem
from kit.engine.requirements import VesselResult



@dataclass(frozen=True)
class CatalogueMatch:
    """A supplier's entry for a generic part. ``price`` is per pack of ``pack_quantity`` (in the part's uom)."""

    supplier: str
    part_number: str
    pack_quantity: float = 1.0
    price: float | None = None
    currency: str | None = None
    lead_time_days: int | None = None


@dataclass
class OrderLine:
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
    match: CatalogueMatch | None = None

    @property
    def to_order(self) -> float:
        return max(0.0, self.required - self.on_board)

    @property
    def pack_size(self) -> float:
        return self.match.pack_quantity if self.match else 1.0

    @property
    def packs(self) -> int:
        """Packs to order: to_order over the pack size, rounded up (whole pieces for a pack of 1)."""
        return math.ceil(round(self.to_order / self.pack_size, 9))

    @property
    def line_total(self) -> float | None:
        if self.match is None or self.match.price is None:
            return None
        return self.packs * self.match.price


@dataclass
class OilOrder:
    fluid_key: str
    designation: str
    required_l: float
    on_board_l: float
    plan: PackagePlan

    @property
    def to_order_l(self) -> float:
        return max(0.0, self.required_l - self.on_board_l)


@dataclass
class Order:
    results: list[VesselResult]
    lines: list[OrderLine]
    oil: list[OilOrder]
    packages: tuple[Package, ...]

    @property
    def vessel_ids(self) -> list[str]:
        return [r.vessel.id for r in self.results]

    def totals_by_currency(self) -> dict[str, float]:
        totals: dict[str, float] = defaultdict(float)
        for line in self.lines:
            if line.line_total is not None:
                totals[line.match.currency or ""] += line.line_total
        return dict(totals)


def _join(values: list[str]) -> str:
    return "; ".join(dict.fromkeys(v for v in values if v))


def consolidate(results: list[VesselResult], on_board: Mapping[tuple[str, str], float] | None = None,
                catalogue: Mapping[str, CatalogueMatch] | None = None) -> Order:
    """Consolidate the requirements of ``results`` into one order.

    ``on_board`` maps (vessel id, part key) to the quantity counted on board, in the part's uom;
    ``catalogue`` maps a part key to the supplier entry chosen for it.
    """
    on_board = on_board or {}
    catalogue = catalogue or {}
    grouped: dict[str, list[tuple[str, LineItem]]] = defaultdict(list)
    for r in results:
        for item in r.lines:
            grouped[item.key].append((r.vessel.id, item))
    lines: list[OrderLine] = []
    oil: list[OilOrder] = []
    packages = results[0].policy.packages if results else ()
    for key in sorted(grouped, key=lambda k: (_kind_order(grouped[k][0][1].kind), k)):
        items = grouped[key]
        first = items[0][1]
        split: dict[str, float] = defaultdict(float)
        for vessel_id, item in items:
            split[vessel_id] += item.quantity
        vessels = list(split)
        stock = sum(on_board.get((v, key), 0.0) for v in vessels)
        required = sum(split.values())
        if first.kind == "oil":
            oil.append(OilOrder(key, first.designation.split(",")[0], required, stock,
                                plan_packages(max(0.0, required - stock) / L_PER_M3, list(packages))))
        lines.append(OrderLine(0, key, first.kind, first.designation, first.standard, dict(first.dims), first.compound,
                               first.uom, _join([i.basis for _, i in items]), required, stock, dict(split),
                               catalogue.get(key)))
    for n, line in enumerate(lines, 1):
        line.number = n
    return Order(results, lines, oil, tuple(packages))


KIND_ORDER = ("piston_seal", "rod_seal", "stock_seal", "wiper", "guide_ring", "o_ring", "o_ring_cord", "vane_strip",
              "filter_element", "oil", "spare")


def _kind_order(kind: str) -> int:
    return KIND_ORDER.index(kind) if kind in KIND_ORDER else len(KIND_ORDER)
