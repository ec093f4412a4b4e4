# SPDX-License-Identifier: MIT
"""From an order to enquiries (requests for quotation): one per supplier the order buys from, and
one open enquiry, for any supplier, for the lines no catalogue offers.

Pure shaping: the order (:class:`kit.engine.bom.Order`), the deliveries on board and the dates
come in; plain :class:`Enquiry` values go out for the workbook writer
(:mod:`kit.files.enquiry_workbook`) and the record that lets a reply be matched
(:mod:`kit.store.enquiries`). What an enquiry line says is only what a supplier needs to quote:
the generic designation with every dimension, the standard, the compound, the service conditions
of the units it is for, the quantity, the vessels and units, the delivery port and date. Part keys
stay in the record (never in the line a supplier sees), and so do our stock and other suppliers'
prices. A line with nothing to order is left out.
"""

from __future__ import annotations

import datetime as dt
from collections import defaultdict
from dataclasses import dataclass
from typing import Callable, Mapping

from kit.engine.bom import Order, OrderLine
from kit.engine.display_units import PA_PER_BAR
from kit.engine.purchasing import Delivery

# Days a supplier is given to reply to an enquiry when none is stated (common practice).
REPLY_DAYS = 7


@dataclass(frozen=True)
class Supply:
    """What the order chose for a line: the supplier, the packs to order and one pack's content in
    the part's unit of measure with its label ("10 pcs", "208 L"); all None where nothing is offered."""

    supplier: str | None
    packs: int | None = None
    pack_content: float | None = None
    pack_label: str | None = None


def supply_of(line: OrderLine) -> Supply:
    """The supplier, packs and pack the order chose for ``line``.

    The one place that reads the order's choice of supplier: where the order's choice changes
    shape, only this function changes.
    """
    if line.supplier is None:  # no offer (oil planned in the policy's packages has no supplier either)
        return Supply(None)
    if line.plan is not None:  # oil: the plan in the chosen supplier's packs ("1 x 208 L + 2 x 20 L")
        return Supply(line.supplier, line.packs, None, line.pack_label)
    return Supply(line.supplier, line.packs, line.pack_size, line.pack_label)


@dataclass(frozen=True)
class EnquiryLine:
    """One line of an enquiry. ``key`` is recorded, never written to the supplier's workbook."""

    number: int
    ref: str
    key: str
    designation: str
    standard: str
    compound: str
    service: str  # working pressure and fluid of the units the part is for
    quantity: float  # to order, in ``uom``
    uom: str
    packs: int | None  # in the supplier's packs (None in an open enquiry)
    pack_label: str | None
    vessels: str  # vessels and units it is for
    port: str  # delivery port(s), blank when none is set
    due_on: dt.date | None  # the earliest delivery date of its vessels, None when none is set


@dataclass(frozen=True)
class Enquiry:
    """One workbook: to ``supplier`` (None: open, for any supplier) from ``company``."""

    id: str
    supplier: str | None
    company: str
    written_on: dt.date
    reply_by: dt.date
    lines: tuple[EnquiryLine, ...]
    deliveries: tuple[Delivery, ...] = ()  # the next delivery of each vessel on its lines that has one


def line_ref(enquiry_id: str, number: int) -> str:
    """Our reference of line ``number`` of an enquiry, as the supplier quotes it back.

    >>> line_ref("E250612-3FA9C1", 7)
    'E250612-3FA9C1-007'
    """
    return f"{enquiry_id}-{number:03d}"


def _uses(order: Order) -> dict[str, list[tuple[str, str, str]]]:
    """Part key -> (vessel id, unit id, service conditions) of each unit that needs it, in order."""
    found: dict[str, list[tuple[str, str, str]]] = defaultdict(list)
    for result in order.results:
        for u in result.units:
            conditions = f"{u.unit.working_pressure / PA_PER_BAR:.4g} bar, {u.unit.fluid}"
            for item in u.lines:
                use = (result.vessel.id, u.unit.id, conditions)
                if use not in found[item.key]:
                    found[item.key].append(use)
    return found


def _join(values) -> str:
    return "; ".join(dict.fromkeys(v for v in values if v))


def _vessels_and_units(uses: list[tuple[str, str, str]]) -> str:
    units: dict[str, list[str]] = defaultdict(list)
    for vessel, unit, _ in uses:
        units[vessel].append(unit)
    return "; ".join(f"{vessel} ({', '.join(ids)})" for vessel, ids in units.items())


def _delivery(vessels: list[str], deliveries: Mapping[str, Delivery]) -> tuple[str, dt.date | None]:
    """The port(s) and the earliest date a line must be on board its vessels; each vessel named
    beside its port when the vessels go to more than one."""
    known = [deliveries[v] for v in vessels if v in deliveries]
    if not known:
        return "", None
    ports = list(dict.fromkeys(d.port for d in known))
    port = ports[0] if len(ports) == 1 else "; ".join(f"{d.vessel_id}: {d.port} by {d.due_on.isoformat()}" for d in known)
    return port, min(d.due_on for d in known)


def company_of(order: Order) -> str:
    """The company the vessels belong to (each named once), or a note that none is stated."""
    return _join(r.vessel.company for r in order.results) or "(company not stated in the particulars)"


def enquiries(order: Order, deliveries: Mapping[str, Delivery], written_on: dt.date, reply_by: dt.date | None,
              new_id: Callable[[], str]) -> list[Enquiry]:
    """The enquiries for ``order``: one per supplier chosen (by name), then the open one, each
    holding only the lines with something to order. ``new_id`` gives each enquiry its reference."""
    uses = _uses(order)
    by_supplier: dict[str | None, list[tuple[OrderLine, Supply]]] = defaultdict(list)
    for line in order.lines:
        if line.to_order <= 0:
            continue
        supply = supply_of(line)
        by_supplier[supply.supplier].append((line, supply))
    company = company_of(order)
    reply = reply_by or written_on + dt.timedelta(days=REPLY_DAYS)
    out = []
    for supplier in sorted((s for s in by_supplier if s is not None), key=str.casefold) + ([None] if None in by_supplier else []):
        eid = new_id()
        lines = []
        for n, (line, supply) in enumerate(by_supplier[supplier], 1):
            used = uses.get(line.key, [])
            port, due = _delivery(list(line.split), deliveries)
            lines.append(EnquiryLine(
                n, line_ref(eid, n), line.key, line.designation, line.standard, line.compound,
                _join(c for _, _, c in used), round(line.to_order, 3), line.uom, supply.packs, supply.pack_label,
                _vessels_and_units(used) or ", ".join(line.split), port, due))
        vessels = dict.fromkeys(v for line, _ in by_supplier[supplier] for v in line.split)
        out.append(Enquiry(eid, supplier, company, written_on, reply, tuple(lines),
                           tuple(deliveries[v] for v in vessels if v in deliveries)))
    return out



@dataclass(frozen=True)
class AskedLine:
    """A line as it was written and recorded: what a reply must hand back unchanged, and its part."""

    ref: str
    part_key: str
    designation: str
    quantity: float
    uom: str
    # the other locked cells as written; None where the enquiry was recorded without them (before revision 0010)
    standard: str | None = None
    compound: str | None = None
    service: str | None = None


@dataclass(frozen=True)
class Asked:
    """A recorded enquiry: the supplier asked (None: an open enquiry) and its lines by reference."""

    id: str
    supplier: str | None
    lines: Mapping[str, AskedLine]
