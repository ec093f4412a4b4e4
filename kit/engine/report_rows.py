# SPDX-License-Identifier: MIT
"""The readable report's rows, for every face alike: ``kit calc``'s tables on a terminal and the
vessel page in a browser show the same figures, in the same display units, with the same words.

The rows are drawn from the JSON-ready dict of :mod:`kit.engine.report` (already in display units:
kN m, s, bar, L, mm, deg), so a face only styles them: the terminal colours a verdict, the page
marks it with a class.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

SWING_LIMIT_S = 28  # SOLAS II-1/29.3.2: 35 deg one side to 30 deg the other within 28 s


def fmt(x: float | None, unit: str = "", nd: int = 1) -> str:
    """A figure with thousands separated and ``nd`` decimals, then ``unit``; "-" where there is none."""
    if x is None or (isinstance(x, float) and math.isnan(x)):
        return "-"
    return f"{x:,.{nd}f}{unit}"


def quantity(x: float, uom: str) -> str:
    """A quantity of a part in its unit of measure: litres to 0.1 L, pieces and metres whole."""
    return f"{x:,.{1 if uom == 'L' else 0}f}"


@dataclass(frozen=True)
class GearRow:
    """One line of a unit's checks: what is checked, its value, what it is judged against, and
    the verdict where there is one (``ok`` True for "met"/"enough", False for "NOT MET"/"SHORT")."""

    check: str
    value: str
    against: str = ""
    verdict: str | None = None
    ok: bool | None = None

    def against_with(self, styled: str | None = None) -> str:
        """``against`` and the verdict (``styled``, as a face marks it up, default as it is)."""
        if self.verdict is None:
            return self.against
        return f"{self.against}: {styled if styled is not None else self.verdict}"


def gear_rows(u: dict[str, Any]) -> list[GearRow]:
    """The checks of one unit (a dict of :func:`kit.engine.report.unit_json`) in the order the
    report shows them: torque, swing times judged against SOLAS II-1/29.3.2, the rudder's rule
    torque against the gear's, travel, and the oil (charge, SOLAS II-1/29.12.3 storage tank, top-up)."""
    rows: list[GearRow] = []
    add = rows.append
    if u["torque_knm"]["midships"] is not None:
        add(GearRow("torque at relief setting, midships", fmt(u["torque_knm"]["midships"], " kNm")))
        add(GearRow("torque at relief setting, max angle (least of both directions)", fmt(u["torque_knm"]["max_angle"], " kNm")))
        s = u["swing_time_s"]
        add(GearRow("swing 35 deg to 30 deg, one pump", fmt(s["one_pump"], " s")))
        add(GearRow("swing 35 deg to 30 deg, all pumps", fmt(s["all_pumps"], " s")))
        met = bool(u["swing_rule_met"])
        add(GearRow("swing time judged", fmt(s["judged"], " s"), f"{SWING_LIMIT_S} s, {u['swing_rule_case']}",
                    "met" if met else "NOT MET", met))
        add(GearRow("torque basis", "", u["torque_basis"] or ""))
    if u["rudder_torque_knm"] is not None:
        q = u["rudder_torque_knm"]
        add(GearRow("rudder torque ahead / astern", f"{fmt(q['ahead'])} / {fmt(q['astern'])} kNm", "classification-rule formula"))
        enough = u["rudder_torque_margin_pct"] >= 0
        add(GearRow(f"gear torque at 35 deg, {u['gear_torque_pressure_bar']:g} bar", fmt(u["gear_torque_35_knm"], " kNm"),
                    f"margin {u['rudder_torque_margin_pct']:+.1f} %", "enough" if enough else "SHORT", enough))
        add(GearRow("rudder angle reachable each side", fmt(u["reachable_angle_deg"], " deg"), "35 deg (SOLAS II-1/29.3.2)"))
        add(GearRow("pump flow needed each, judged case", fmt(u["pump_flow_needed_l_min"], " L/min"), f"for {SWING_LIMIT_S} s"))
    if u["travel_mm"] is not None:
        add(GearRow("travel between hard-over angles", fmt(u["travel_mm"], " mm", 0), f"stroke {fmt(u['stroke_mm'], ' mm', 0)}"))
    add(GearRow("system charge", fmt(u["system_oil_l"], " L"), u["system_oil_basis"]))
    if u["storage_tank_min_l"] is not None:
        add(GearRow("storage tank minimum", fmt(u["storage_tank_min_l"], " L"), "SOLAS II-1/29.12.3"))
    add(GearRow("top-up for the period", fmt(u["top_up_l"], " L", 2), "leakage rate x period"))
    return rows


def seal_cells(s: dict[str, Any]) -> list[str]:
    """One seal of a unit's kit (a dict of :func:`kit.engine.report.seal_json`) as the report's
    cells: role, part, d, D and L in mm, quantity per unit, compound, where the size comes from."""
    return [s["role"], s["part"], fmt(s["d_mm"], "", 2), fmt(s["D_mm"], "", 2), fmt(s["L_mm"], "", 1),
            str(s["qty"]), s["compound"], s["origin"]]


def oil_words(o: dict[str, Any]) -> str:
    """One fluid's oil plan (an entry of :func:`kit.engine.report.vessel_json`'s ``oil``) in words:
    the need in litres, kilograms and US gallons, and the packages to buy."""
    packs = ", ".join(f"{p['count']} x {p['name']} ({p['volume_l']:g} L)" for p in o["packages"]) or "none"
    return (f"need {o['need_l']:,.1f} L = {o['need_kg']:,.1f} kg = {o['need_us_gal']:,.1f} US gal;"
            f" buy {packs} = {o['supply_l']:,.1f} L")


def unit_particulars(unit: Any) -> list[tuple[str, str]]:
    """A unit's main particulars (a :class:`kit.engine.particulars.Unit`, SI) as (what, value) in
    the units people read: bar, L/min, L, mm, deg."""
    from kit.engine.display_units import L_MIN_PER_M3_S, L_PER_M3, MM_PER_M, bar

    g = unit.geometry
    made = " ".join(x for x in (unit.maker, unit.model) if x)
    out = [("service", unit.service), ("actuator", f"{unit.actuator.replace('_', ' ')} x {unit.count}"),
           ("fluid", str(unit.fluid)), ("working pressure", fmt(bar(unit.working_pressure), " bar", 0)),
           ("pumps", f"{unit.pumps} x {fmt(unit.pump_flow * L_MIN_PER_M3_S, ' L/min')}"),
           ("reservoir", fmt(unit.reservoir * L_PER_M3, " L"))]
    if unit.max_rudder_angle is not None:
        out.append(("max rudder angle", fmt(math.degrees(unit.max_rudder_angle), " deg")))
    sizes = [(name, getattr(g, attr)) for name, attr in (("ram diameter", "ram_diameter"), ("bore", "bore"), ("rod", "rod"),
             ("stroke", "stroke"), ("tiller radius", "tiller_radius"), ("vanes", "vanes"), ("housing bore", "housing_bore"),
             ("hub diameter", "hub_diameter")) if getattr(g, attr, None) is not None]
    out += [(name, str(value) if isinstance(value, int) else fmt(value * MM_PER_M, " mm", 0)) for name, value in sizes]
    if unit.stock_diameter is not None:
        out.append(("rudder stock diameter", fmt(unit.stock_diameter * MM_PER_M, " mm", 0)))
    if made:
        out.append(("maker and model", made))
    return out
