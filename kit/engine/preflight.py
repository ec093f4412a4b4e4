# SPDX-License-Identifier: MIT
"""The pre-voyage check: one vessel's on-board stock against what the voyage needs.

The shortfall is the vessel's own bill of materials with only the lines where the stock falls
short; the command exits with status 1 when it is not empty, so scripts can act on it. The check
also shows what it covered: the oil of each unit (charge, storage tank, top-up) and every oil and
filter element line, short or not.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Mapping, Sequence

from kit.engine.bom import EPS, KIND_ORDER, Order, OrderLine, consolidate, only_to_order
from kit.engine.display_units import L_PER_M3
from kit.engine.purchasing import Offer, Purchasing
from kit.engine.requirements import VesselResult


def preflight_order(result: VesselResult, on_board: Mapping[tuple[str, str], float],
                    offers: Mapping[str, Sequence[Offer]] | None = None, purchasing: Purchasing | None = None) -> Order:
    """The shortfall of ``result`` against ``on_board`` as an order (lines renumbered)."""
    return shortfall_of(vessel_order(result, on_board, offers, purchasing))


def vessel_order(result: VesselResult, on_board: Mapping[tuple[str, str], float],
                 offers: Mapping[str, Sequence[Offer]] | None = None, purchasing: Purchasing | None = None) -> Order:
    """One vessel's whole order less its stock: every line, short or not."""
    return consolidate([result], on_board, offers, purchasing)


def shortfall_of(full: Order) -> Order:
    """The lines of ``full`` (one vessel's order less its stock) with something short, renumbered
    (copies: ``full`` keeps its numbers)."""
    return only_to_order(full)


def lines_short(result: VesselResult, on_board: Mapping[tuple[str, str], float]) -> int:
    """How many lines of the vessel's shortfall (:func:`preflight_order`) there are. A line is short
    when what the voyage needs exceeds what is on board; the suppliers' offers choose who sells
    it and in what packs, never whether it is short, so none are needed to count the lines."""
    return sum(1 for line in vessel_order(result, on_board).lines if line.to_order > EPS)


@dataclass(frozen=True)
class CheckRow:
    """One line of the check as a reader sees it: the part, its unit of measure, what the voyage
    needs, what is on board and what is short (never below 0), and the basis of the need."""

    part: str
    uom: str
    needed: float
    on_board: float
    short: float
    basis: str
    kind: str
    key: str


def check_row(line: OrderLine) -> CheckRow:
    """``line`` as a check row; an oil line is named by its fluid (it sums the storage tank and the top-up)."""
    part = line.designation.split(",")[0] if line.kind == "oil" else line.designation
    return CheckRow(part, line.uom, line.required, line.on_board, line.to_order, line.basis, line.kind, line.key)


def shortfall_rows(order: Order) -> list[CheckRow]:
    """The lines of ``order`` with something short, in the order's sequence."""
    return [check_row(line) for line in order.lines if line.to_order > EPS]


def covered_rows(order: Order, kind: str) -> list[CheckRow]:
    """Every line of ``order`` of ``kind`` ("oil", "filter_element"), short or not."""
    return [check_row(line) for line in order.lines if line.kind == kind]


@dataclass(frozen=True)
class UnitOil:
    """The oil figures of one unit (litres): its charge, the storage tank minimum (steering units,
    SOLAS II-1/29.12.3) and the top-up over the voyage (leakage rate x period)."""

    unit: str
    fluid: str
    charge_l: float
    storage_tank_l: float | None
    top_up_l: float
    charge_basis: str


def unit_oil(result: VesselResult) -> list[UnitOil]:
    """The oil figures of each unit of ``result``, in the order of its particulars."""
    litres = lambda m3: m3 * L_PER_M3  # noqa: E731
    return [UnitOil(u.unit.id, str(u.unit.fluid), litres(u.system_oil),
                    None if u.storage_tank_min is None else litres(u.storage_tank_min), litres(u.top_up), u.system_oil_basis)
            for u in result.units]


SEAL_KINDS = frozenset(KIND_ORDER[:KIND_ORDER.index("filter_element")])


def short_words(order: Order) -> list[str]:
    """What ``order`` (a shortfall) is short of, in plain words: seals and spares counted in pieces,
    filter elements too, oil in litres per fluid. Empty when nothing is short."""
    rows = shortfall_rows(order)
    words = []
    for label, kinds in (("seal", SEAL_KINDS), ("filter element", {"filter_element"}), ("spare part", {"spare"})):
        pieces = sum(r.short for r in rows if r.kind in kinds)
        if pieces > EPS:
            lines = sum(1 for r in rows if r.kind in kinds)
            words.append(f"{pieces:g} {label}{'' if pieces == 1 else 's'} ({lines} line{'' if lines == 1 else 's'})")
    words += [f"{r.short:,.1f} L of {r.part}" for r in rows if r.kind == "oil"]
    return words
