# SPDX-License-Identifier: MIT
"""A result as a JSON-ready dict: the scripting contract documented in the README.

The command line's tables for people are drawn from the same dict (``kit/commands/terminal.py``).
"""

from __future__ import annotations

import math
from typing import Any

from kit.engine.display_units import KN_PER_N as KNM, L_PER_M3, PA_PER_BAR, US_GAL_PER_M3
from kit.engine.oil_grades import density_kg_per_l
from kit.engine.requirements import UnitResult, VesselResult
from kit.engine.seal_kit import SealLine, SealKit, mm



def _r(x: float | None, nd: int = 1) -> float | None:
    return None if x is None else round(x, nd)


def seal_json(line: SealLine, kit: SealKit, vane_geometry: tuple[float, float] | None) -> dict[str, Any]:
    """One seal as JSON. d_mm < D_mm always; for an O-ring they are the groove root and the bore."""
    out: dict[str, Any] = {"role": line.role, "part": line.part, "qty_per_actuator": line.qty_per_actuator,
                           "qty": line.qty_per_actuator * kit.actuators, "compound": line.compound}
    if line.housing is not None:
        h = line.housing
        out.update(d_mm=h.d, D_mm=h.D, L_mm=h.L, standard=h.standard, origin=h.origin)
        if "t" in h.extra:
            out.update(strip_thickness_mm=h.extra["t"], cut_length_mm=h.extra["cut"])
    elif line.oring is not None:
        f = line.oring
        out.update(d_mm=round(f.groove_diameter, 2), D_mm=f.bore, L_mm=f.groove_width, id_mm=f.inside_diameter,
                   cs_mm=f.cross_section, standard="ISO 3601-1, ISO 3601-2",
                   origin="ISO 3601 series" if not f.is_cord else "O-ring cord (past the ISO 3601-1 series)",
                   stretch_pct=round(100 * f.stretch, 2), squeeze_pct=round(100 * f.squeeze, 1), fill_pct=round(100 * f.fill, 1))
        if f.is_cord:
            out["cut_length_mm"] = f.cord_cut_length
    else:
        hub, bore = vane_geometry
        out.update(d_mm=hub, D_mm=bore, L_mm=line.strip_length_mm, standard="vane geometry h + 2 (R - r)",
                   origin="unit particulars")
    return out


def unit_json(u: UnitResult) -> dict[str, Any]:
    c = u.checks
    g = u.unit.geometry
    vane = (mm(g.hub_diameter), mm(g.housing_bore)) if u.unit.actuator == "rotary_vane" else None
    return {
        "id": u.unit.id,
        "service": u.unit.service,
        "actuator": u.unit.actuator,
        "count": u.unit.count,
        "fluid": str(u.unit.fluid),
        "torque_knm": {"midships": _r(c.torque_midships and c.torque_midships * KNM),
                       "max_angle": _r(c.torque_max_angle and c.torque_max_angle * KNM)},
        "swing_time_s": {"one_pump": _r(c.swing_time_one_pump), "all_pumps": _r(c.swing_time_all_pumps),
                         "judged": _r(c.swing_time_judged)},
        "swing_rule_met": c.swing_rule_met,
        "swing_rule_case": c.judging_case,
        "travel_mm": _r(c.travel and c.travel * 1000), "stroke_mm": _r(c.stroke and c.stroke * 1000),
        "torque_basis": c.torque_basis,
        "swing_oil_l": _r(c.swing_oil and c.swing_oil * L_PER_M3),
        **rudder_json(c),
        "inspections": c.inspections,
        "system_oil_l": _r(u.system_oil * L_PER_M3), "system_oil_basis": u.system_oil_basis,
        "storage_tank_min_l": _r(u.storage_tank_min and u.storage_tank_min * L_PER_M3),
        "top_up_l": _r(u.top_up * L_PER_M3, 2),
        "seals": [seal_json(s, u.kit, vane) for s in u.kit.lines],
        "filters": [{"position": f.position, "elements": f.elements, "elements_per_change": f.elements_per_change,
                     "changes_due": f.changes, "spare_sets": f.spare_sets} for f in u.filters],
        "warnings": u.warnings,
        "rules": [{"clause": r.clause, "verdict": r.verdict, "text": r.text} for r in c.rules],
        "auxiliary_steering_gear_required": c.auxiliary_gear_required,
        "reachable_angle_deg": _r(c.reachable_angle and math.degrees(c.reachable_angle)),
        "pump_flow_needed_l_min": _r(c.pump_flow_needed and c.pump_flow_needed * L_PER_M3 * 60),
        "reduced_mode": None if c.reduced is None else {
            "actuators": c.reduced.actuators, "pumps": c.reduced.pumps,
            "torque_knm_max_angle": _r(c.reduced.torque_max_angle * KNM), "swing_time_s": _r(c.reduced.swing_time)},
        "system_oil_least_l": _r(u.charge and u.charge.least * L_PER_M3),
        "system_oil_stated_l": _r(u.unit.system_oil and u.unit.system_oil * L_PER_M3),
    }


def rudder_json(c) -> dict[str, Any]:
    """The gear against the rudder: rule torques ahead and astern, the gear's least torque at 35 deg
    at its maximum working pressure, and the margin (null without a [unit.rudder] table)."""
    load = c.rudder_load
    return {
        "rudder_torque_knm": None if load is None else {"ahead": _r(load.torque_ahead * KNM), "astern": _r(load.torque_astern * KNM)},
        "rudder_force_kn": None if load is None else {"ahead": _r(load.force_ahead * KNM), "astern": _r(load.force_astern * KNM)},
        "gear_torque_35_knm": _r(c.gear_torque_35 and c.gear_torque_35 * KNM),
        "gear_torque_pressure_bar": _r(c.gear_torque_pressure and c.gear_torque_pressure / PA_PER_BAR),
        "rudder_torque_margin_pct": None if c.rudder_margin is None else round(100 * c.rudder_margin, 1),
    }


def vessel_json(r: VesselResult) -> dict[str, Any]:
    v = r.vessel
    units = [unit_json(u) for u in r.units]
    oil = []
    for fluid, plan in r.oil_plans.items():
        need_l = plan.need * L_PER_M3
        oil.append({"fluid": str(fluid), "need_l": round(need_l, 1),
                    "need_kg": round(need_l * density_kg_per_l(fluid.category), 1),
                    "need_us_gal": round(plan.need * US_GAL_PER_M3, 1),
                    "supply_l": round(plan.supply * L_PER_M3, 1),
                    "packages": [{"name": p.name, "volume_l": round(p.volume * L_PER_M3, 1), "count": n}
                                 for p, n in plan.counts if n]})
    return {
        "vessel": {"id": v.id, "name": v.name, "ship_type": v.ship_type, "gross_tonnage": v.gross_tonnage,
                   "company": v.company},
        "days": r.days,
        "policy": r.policy.name,
        "units": units,
        "oil": oil,
        "lines": [{"unit": li.unit_id, "designation": li.designation, "part": li.part, "standard": li.standard,
                   "compound": li.compound, "quantity": round(li.quantity, 2) if isinstance(li.quantity, float) else li.quantity,
                   "uom": li.uom, "basis": li.basis, "key": li.key, "origin": li.origin, "note": li.note}
                  for li in r.lines],
    }
