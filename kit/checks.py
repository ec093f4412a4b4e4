# SPDX-License-Identifier: MIT
"""Physics and rule checks that catch bad particulars before anything is ordered.

For a steering unit: torque at the relief setting at midships and at the maximum rudder angle,
the swing time from 35 deg one side to 30 deg the other with one pump and with all pumps against
the 28 s of SOLAS II-1/29.3.2 (judged on the case SOLAS II-1/29.6.1 sets, see ``kit.solas``),
ram or piston travel against the stroke, and for every unit the working pressure against the
ratings in the spares policy.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from kit import physics, solas
from kit.particulars import CylinderGeometry, RamGeometry, Unit, Vessel
from kit.spares import Policy


@dataclass
class UnitChecks:
    torque_midships: float | None = None  # N m
    torque_max_angle: float | None = None  # N m
    swing_time_one_pump: float | None = None  # s
    swing_time_all_pumps: float | None = None  # s
    swing_time_judged: float | None = None  # s
    judging_case: str | None = None
    pumps_judged: int | None = None
    swing_rule_met: bool | None = None
    travel: float | None = None  # m
    stroke: float | None = None  # m
    travel_ok: bool | None = None
    pressure_ok: bool = True
    warnings: list[str] = field(default_factory=list)


def check_unit(unit: Unit, vessel: Vessel, policy: Policy) -> UnitChecks:
    out = UnitChecks()
    for component, rating in policy.ratings.items():
        if rating > 0 and unit.working_pressure > rating:
            out.pressure_ok = False
            out.warnings.append(f"working pressure {unit.working_pressure / 1e5:g} bar exceeds the {component} rating "
                                f"{rating / 1e5:g} bar in the spares policy")
    if not unit.is_steering:
        return out
    act = physics.actuation(unit)
    theta_max = unit.max_rudder_angle
    out.torque_midships = act.torque(0.0, unit.working_pressure)
    out.torque_max_angle = act.torque(theta_max, unit.working_pressure)
    if theta_max < solas.HARD_OVER_RAD - 1e-9:
        out.warnings.append(f"maximum rudder angle {math.degrees(theta_max):g} deg is below the 35 deg of SOLAS II-1/29.3.2")
    volume = physics.swing_volume(act, solas.SWING_FROM_RAD, solas.SWING_TO_RAD)
    case = solas.judging_case(vessel.ship_type, unit.pumps, vessel.gross_tonnage)
    out.swing_time_one_pump = physics.swing_time(volume, unit.pump_flow)
    out.swing_time_all_pumps = physics.swing_time(volume, unit.pump_flow * unit.pumps)
    out.swing_time_judged = physics.swing_time(volume, unit.pump_flow * case.pumps_running)
    out.judging_case, out.pumps_judged = case.reason, case.pumps_running
    out.swing_rule_met = out.swing_time_judged <= solas.SWING_LIMIT_S
    out.warnings += case.warnings
    if not out.swing_rule_met:
        out.warnings.append(f"swing 35-30 deg takes {out.swing_time_judged:.1f} s with {case.pumps_running} pump(s), "
                            f"more than the 28 s of SOLAS II-1/29.3.2 ({case.reason})")
    g = unit.geometry
    if isinstance(g, RamGeometry):
        out.travel, out.stroke = physics.ram_travel(g.tiller_radius, theta_max), g.stroke
    elif isinstance(g, CylinderGeometry):
        out.travel, out.stroke = physics.cylinder_travel(g.tiller_radius, theta_max), g.stroke
    if out.travel is not None:
        out.travel_ok = out.travel <= out.stroke
        if not out.travel_ok:
            out.warnings.append(f"travel to {math.degrees(theta_max):g} deg each side is {out.travel * 1000:.0f} mm, "
                                f"more than the stroke {out.stroke * 1000:.0f} mm: check tiller radius, stroke and angle")
    return out
