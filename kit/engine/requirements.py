# SPDX-License-Identifier: MIT
"""From a vessel and a period to what must be on board: one result per unit, and line items.

``assess_vessel`` runs every engine module over every unit (seal kit, checks, oil, filters,
spares policy) and returns plain dataclasses; ``LineItem`` designations are generic and
dimensional, so any seal supplier can quote them.
"""

from __future__ import annotations

import datetime as dt
import math
from collections import defaultdict
from dataclasses import dataclass, field, replace

from kit.engine import filters, oil, solas
from kit.engine.display_units import L_PER_M3 as M3_TO_L, PA_PER_BAR
from kit.engine.checks import CARRIER_PLACE, UnitChecks, check_unit
from kit.engine.oil import PackagePlan
from kit.engine.parts import PART_KINDS, LineItem, fmt_mm, part_key
from kit.engine.particulars import Fluid, Unit, Vessel
from kit.engine.seal_kit import SealKit, SealLine, build_seal_kit
from kit.engine.spares import Policy, PolicyItem

CARRIER_KINDS = ("carrier_seal_set", "carrier_bearing_parts")
SERIES_NOTE = "series housing: check against the maker's drawing before ordering"


@dataclass(frozen=True)
class FilterNeed:
    position: str
    elements_per_change: int
    changes: int
    spare_sets: int
    elements: int
    element_ref: str | None


@dataclass
class UnitResult:
    unit: Unit
    checks: UnitChecks
    kit: SealKit
    system_oil: float  # m^3
    system_oil_basis: str
    storage_tank_min: float | None  # m^3, steering units only
    top_up: float  # m^3 over the period
    filters: list[FilterNeed]
    lines: list[LineItem]
    warnings: list[str] = field(default_factory=list)
    charge: oil.Charge | None = None


@dataclass
class VesselResult:
    vessel: Vessel
    days: float
    policy: Policy
    units: list[UnitResult]
    oil_plans: dict[Fluid, PackagePlan]

    @property
    def lines(self) -> list[LineItem]:
        return [line for u in self.units for line in u.lines]


def litres_up(volume_m3: float) -> float:
    """Litres rounded up to 0.1 L: what is listed is never below the need, and reads cleanly."""
    return math.ceil(round(volume_m3 * M3_TO_L * 10, 6)) / 10


def _designation(kind: str, **values: object) -> str:
    text = PART_KINDS[kind][0]
    return text.format(**{k: fmt_mm(v) if isinstance(v, float) else v for k, v in values.items()})


def seal_line_item(unit: Unit, line: SealLine, quantity: int, basis: str) -> LineItem:
    """A seal of the kit as a requirement line."""
    note = SERIES_NOTE
    if line.role == "vane":
        dims = {"length": line.strip_length_mm, "h": line.strip_height_mm}
        return LineItem(unit.id, "vane_strip", line.role, _designation("vane_strip", **dims),
                        "vane geometry h + 2 (R - r)", quantity, "pcs", basis, part_key("vane_strip", dims, line.compound), dims,
                        line.compound, "unit particulars", "strip length from the vane geometry; confirm the profile with the maker", line.part)
    if line.oring is not None:
        fit = line.oring
        if fit.is_cord:
            dims = {"cs": fit.cross_section, "cut": fit.cord_cut_length}
            return LineItem(unit.id, "o_ring_cord", line.role, _designation("o_ring_cord", **dims),
                            "ISO 3601-1 cross-section, ISO 3601-2 gland", quantity, "pcs", basis, part_key("o_ring_cord", dims, line.compound),
                            dims, line.compound, "ISO 3601 series (past the largest ring: cord)", note, line.part)
        dims = {"id": fit.inside_diameter, "cs": fit.cross_section}
        return LineItem(unit.id, "o_ring", line.role, _designation("o_ring", **dims), "ISO 3601-1",
                        quantity, "pcs", basis, part_key("o_ring", dims, line.compound), dims, line.compound, "ISO 3601 series", note, line.part)
    h = line.housing
    kind = {"piston": "piston_seal", "rod": "rod_seal", "wiper": "wiper", "guide": "guide_ring", "stock": "stock_seal"}[line.role]
    dims = {"d": h.d, "D": h.D, "L": h.L, **h.extra}
    side = "bore" if h.side == "piston" else "rod"
    designation = _designation(kind, side=side, **dims)
    standard = h.standard if h.origin != "maker's drawing (stated in the particulars)" else "maker's drawing"
    return LineItem(unit.id, kind, line.role, designation, standard, quantity, "pcs", basis,
                    part_key(kind, dims, line.compound), dims, line.compound, h.origin,
                    note if "series" in h.origin else "dimensions from the maker's drawing", line.part)


def _sets(item: PolicyItem | None, kit: SealKit) -> int:
    if item is None:
        return 0
    return item.quantity * (kit.actuators if item.per == "actuator" else 1)


def _spare(unit: Unit, item: PolicyItem, what: str, quantity: int, extra: str) -> LineItem:
    text = f"{item.text}, {what}" if what else item.text
    return LineItem(unit.id, "spare", item.kind, text, "", quantity, "pcs", item.basis,
                    part_key("spare", {}, f"{item.kind}:{extra}"), part=item.text)


def name_plate(maker: str | None, model: str | None) -> str:
    """A maker and model as a supplier quotes by them ("Tarnwick Hydraulik TVB-16"); empty when neither is known."""
    return " ".join(x for x in (maker, model) if x)


def spare_lines(unit: Unit, policy: Policy, vessel_id: str) -> list[LineItem]:
    """The policy's non-seal items for ``unit``, each naming the makers and models the particulars give.

    A part only this unit has carries ``vessel_id`` and the unit in its key and its designation.
    A valve block's seal kit and relief cartridge whose block maker and model are both known are
    the same part on every vessel with that block (key by maker, model and, for the cartridge, its
    setting); a maker or model given joins the key of a coil, a hose or a pump shaft seal, so two
    makers' parts are never one line. A hose's key holds its working pressure, which its designation
    states: hoses of one bore at two pressures are two lines.
    """
    lines: list[LineItem] = []
    where = f"{unit.service} unit {unit.id}, vessel {vessel_id}"
    gear = name_plate(unit.maker, unit.model)
    block = name_plate(unit.valve_maker, unit.valve_model)
    block_known = bool(unit.valve_maker and unit.valve_model)
    bar = f"{unit.working_pressure / PA_PER_BAR:g} bar"
    for item in policy.items:
        if item.kind == "solenoid_coil":
            on = f", for valve block {block}" if block else ""
            for s in unit.solenoids:
                lines.append(_spare(unit, item, s.voltage + on, item.quantity, ":".join(filter(None, (s.voltage, block)))))
        elif item.kind == "valve_seal_kit" and unit.valve_blocks:
            if block_known:
                lines.append(_spare(unit, item, f"valve block {block}", item.quantity * unit.valve_blocks,
                                    f"{unit.valve_maker}:{unit.valve_model}"))
            else:
                what = ", ".join(filter(None, (f"valve block {block}" if block else "", where, f"gear {gear}" if gear else "")))
                lines.append(_spare(unit, item, what, item.quantity * unit.valve_blocks, f"{vessel_id}:{unit.id}"))
        elif item.kind == "relief_cartridge":
            if block_known:
                lines.append(_spare(unit, item, f"{bar}, valve block {block}", item.quantity,
                                    f"{unit.valve_maker}:{unit.valve_model}:{bar}"))
            else:
                what = ", ".join(filter(None, (bar, f"valve block {block}" if block else "", where, f"gear {gear}" if gear else "")))
                lines.append(_spare(unit, item, what, item.quantity, f"{vessel_id}:{unit.id}"))
        elif item.kind == "hose":
            for bore in sorted({h.bore for h in unit.hoses}):
                size = f"{fmt_mm(bore * 1000)}mm"
                text = f"bore {fmt_mm(bore * 1000)} mm, {bar} working" + (f", for gear {gear}" if gear else "")
                lines.append(_spare(unit, item, text, item.quantity, ":".join(filter(None, (size, bar, gear)))))
        elif item.kind == "pump_shaft_seal":
            if unit.pump_model:
                pump = name_plate(unit.pump_maker, unit.pump_model)
                lines.append(_spare(unit, item, pump, item.quantity, pump))
            else:
                maker = f", pump maker {unit.pump_maker}" if unit.pump_maker else ""
                model = f"pump of unit {unit.id} (model not stated){maker}"
                lines.append(_spare(unit, item, model, item.quantity, model))
        elif item.kind in CARRIER_KINDS and unit.is_steering:
            text = f"{CARRIER_PLACE[unit.rudder_carrier]} of {where}" + (f", gear {gear}" if gear else "")
            lines.append(_spare(unit, item, text, item.quantity, f"{vessel_id}:{unit.id}"))
    return lines


def charge_warning(c: oil.Charge, steering: bool) -> str:
    """A stated charge below the reservoir plus the oil in actuators and pipes, with both figures."""
    use = "the storage tank minimum (SOLAS II-1/29.12.3) and the charge use" if steering else "the charge uses"
    return (f"system_oil {c.stated * M3_TO_L:.1f} L is less than the reservoir plus the oil in the actuators and pipes, "
            f"{c.least * M3_TO_L:.1f} L: {use} {c.used * M3_TO_L:.1f} L")


def storage_rule(c: oil.Charge) -> solas.RuleResult:
    """SOLAS II-1/29.12.3: the storage tank recharges one power actuating system including its reservoir."""
    text = f"storage tank minimum {c.used * M3_TO_L:.1f} L ({c.basis})"
    if not c.stated_ok:
        return solas.RuleResult("SOLAS II-1/29.12.3", "not met",
                                f"stated system_oil {c.stated * M3_TO_L:.1f} L is below the reservoir plus actuators and pipes, "
                                f"{c.least * M3_TO_L:.1f} L; {text}")
    return solas.RuleResult("SOLAS II-1/29.12.3", "met", text)


def assess_unit(unit: Unit, vessel: Vessel, days: float, policy: Policy, start: dt.date | None = None) -> UnitResult:
    checks = check_unit(unit, vessel, policy)
    kit = build_seal_kit(unit, policy.housing_length)
    seal_item = policy.item("seal_set")
    sets = _sets(seal_item, kit)
    lines = [seal_line_item(unit, s, s.qty_per_actuator * sets, seal_item.basis) for s in kit.lines] if sets else []

    figures = oil.charge(unit)
    charge, charge_basis = figures.used, figures.basis
    storage = solas.storage_tank_minimum(charge) if unit.is_steering else None
    charge_warnings = [] if figures.stated_ok else [charge_warning(figures, unit.is_steering)]
    if unit.is_steering:
        checks.rules.append(storage_rule(figures))
    leak = oil.top_up(unit.oil_leakage, days)
    fluid = str(unit.fluid)
    storage_item = policy.item("storage_oil")
    if storage is not None and storage_item:
        lines.append(LineItem(unit.id, "oil", "storage", _designation("oil", fluid=fluid) + ", storage tank charge",
                              "ISO 6743-4, ISO 3448", litres_up(storage), "L", storage_item.basis,
                              part_key("oil", {}, fluid), compound="", origin=charge_basis))
    if leak > 0:
        lines.append(LineItem(unit.id, "oil", "top-up", _designation("oil", fluid=fluid) + f", top-up for {days:g} days",
                              "ISO 6743-4, ISO 3448", litres_up(leak), "L", "leakage rate x period",
                              part_key("oil", {}, fluid)))

    needs = []
    for f in unit.filters:
        run = filters.run_at_start(f.run_since_change, f.run_read_on, start, f.duty_hours_per_day)
        changes = filters.changes_due(days, f.duty_hours_per_day, f.change_interval, run)
        total = filters.elements_needed(f.elements, days, f.duty_hours_per_day, f.change_interval, policy.spare_filter_sets, run)
        needs.append(FilterNeed(f.position, f.elements, changes, policy.spare_filter_sets, total, f.element_ref))
        # An element by its reference is one part wherever it is fitted; without one, it is this unit's.
        ref = f", element {f.element_ref}" if f.element_ref else f", {unit.service} unit {unit.id}, vessel {vessel.id}"
        lines.append(LineItem(unit.id, "filter_element", f.position, _designation("filter_element", position=f.position, ref=ref),
                              "", total, "pcs", f"{changes} change(s) due + {policy.spare_filter_sets} spare set(s)",
                              part_key("filter_element", {}, f.element_ref or f"{vessel.id}:{unit.id}:{f.position}"), part=f"{f.position} filter"))
    lines += spare_lines(unit, policy, vessel.id)
    warnings = list(dict.fromkeys(kit.warnings + checks.warnings + charge_warnings))
    return UnitResult(unit, checks, kit, charge, charge_basis, storage, leak, needs, lines, warnings, figures)


def oil_plans(units: list[UnitResult], policy: Policy) -> dict[Fluid, PackagePlan]:
    """Oil per fluid over all ``units``, rounded up once to the policy's packages."""
    need: dict[Fluid, float] = defaultdict(float)
    for u in units:
        need[u.unit.fluid] += (u.storage_tank_min or 0.0) + u.top_up
    return {f: oil.plan_packages(v, list(policy.packages)) for f, v in need.items()}


def assess_vessel(vessel: Vessel, days: float, policy: Policy, start: dt.date | None = None) -> VesselResult:
    """Everything kit works out for ``vessel`` over ``days`` from ``start`` (the day filter
    running hours are brought forward to; None: taken as read) under ``policy``."""
    if days < 0:
        raise ValueError("days must not be negative")
    units = [assess_unit(u, vessel, days, policy, start) for u in vessel.units]
    return VesselResult(vessel, days, policy, units, oil_plans(units, policy))


def kept_parts(result: VesselResult) -> list[LineItem]:
    """The line items of every part the vessel keeps, for registering them: the result's lines,
    and the oil of each unit whose fluid has no line (a unit only topped up, worked out over a
    period without leakage), so a count of that oil has a part to go to. An oil part is its fluid
    alone ("hydraulic oil HM 46"): what it is bought for (storage tank charge, top-up for a period)
    belongs to an order's line, not to the part."""
    lines = []
    for u in result.units:
        fluid = _designation("oil", fluid=str(u.unit.fluid))
        lines += [replace(li, designation=fluid) if li.kind == "oil" else li for li in u.lines]
    keys = {li.key for li in lines}
    for u in result.units:
        fluid = str(u.unit.fluid)
        key = part_key("oil", {}, fluid)
        if key not in keys:
            keys.add(key)
            lines.append(LineItem(u.unit.id, "oil", "kept", _designation("oil", fluid=fluid), "ISO 6743-4, ISO 3448",
                                  0.0, "L", "oil the unit keeps", key))
    return lines
