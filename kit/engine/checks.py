# SPDX-License-Identifier: MIT
"""Physics and rule checks that catch bad particulars before anything is ordered.

For a steering unit: torque at the relief setting at midships and at the maximum rudder angle,
the swing time from 35 deg one side to 30 deg the other with one pump and with all pumps against
the 28 s of SOLAS II-1/29.3.2 (judged on the case SOLAS II-1/29.6.1 sets, see ``kit.engine.solas``),
the angle the stroke lets the rudder reach, the pump flow each pump needs for 28 s in that
case, the reduced mode after a single failure, one verdict per rule of regulation 29
(``kit.engine.solas.judge``), ram or piston travel against the stroke, the gear's torque at 35 deg
against the rudder's torque by the classification-rule formula (``kit.engine.rudder``) when the rudder
is given, the rudder carrier's inspection, and for every unit the working pressure against the
ratings in the spares policy.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

from kit.engine import physics, rudder, solas
from kit.engine.particulars import CylinderGeometry, RamGeometry, Unit, Vessel, VaneGeometry
from kit.engine.spares import Policy

TORQUE_BASIS = {
    RamGeometry: "Rapson slide, T = k p A R / cos^2(theta)",
    VaneGeometry: "rotary vane, T = p vanes h (R^2 - r^2) / 2",
}
TRUNNION_EXACT = "trunnion cylinders, exact geometry by virtual work (trunnion_distance)"
TRUNNION_APPROXIMATE = "trunnion cylinders, long-cylinder approximation T = n p (A_b + A_a) R cos(theta)"
APPROXIMATION_WARNING = ("trunnion cylinders: torque, swing oil and piston travel by the long-cylinder approximation "
                         "(cylinder axis kept in its midships direction), which overstates the torque at 35 deg by a few "
                         "per cent in one direction of motion; state trunnion_distance for the exact geometry")
CARRIER_PLACE = {"separate": "separate rudder carrier bearing", "in_actuator": "rudder carrier in the actuator housing",
                 None: "rudder carrier (in the actuator housing or separate: not stated)"}
CARRIER_INSPECTION = "wear-down measured at each dry-docking and recorded against the maker's limit (common practice)"
# Room a rotary vane gear keeps past 2 x its maximum angle, for the rudder stops and vanes of real
# width when vane_angle is not given (common practice, from memory): less than this is warned.
VANE_MARGIN_RAD = math.radians(10)


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
    torque_basis: str | None = None
    swing_oil: float | None = None  # m^3, 35 deg one side to 30 deg the other
    rudder_load: rudder.RudderLoad | None = None
    gear_torque_35: float | None = None  # N m, least of both directions at the maximum working pressure
    gear_torque_pressure: float | None = None  # Pa
    rudder_margin: float | None = None  # gear torque / rudder torque - 1
    inspections: list[str] = field(default_factory=list)
    warnings: list[str] = field(default_factory=list)
    reachable_angle: float | None = None  # rad, the most each side that stops and stroke allow
    pump_flow_needed: float | None = None  # m^3/s each pump, for 28 s in the judged case
    reduced: solas.ReducedMode | None = None
    rules: list[solas.RuleResult] = field(default_factory=list)
    auxiliary_gear_required: bool | None = None


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
    g = unit.geometry
    theta_max = unit.max_rudder_angle
    out.torque_midships = act.torque(0.0, unit.working_pressure)
    out.torque_max_angle = physics.least_torque(act, theta_max, unit.working_pressure)
    out.torque_basis = TORQUE_BASIS.get(type(g))
    if isinstance(g, CylinderGeometry):
        out.torque_basis = TRUNNION_EXACT if g.trunnion_distance is not None else TRUNNION_APPROXIMATE
        if g.trunnion_distance is None:
            out.warnings.append(APPROXIMATION_WARNING)
    if theta_max < solas.HARD_OVER_RAD - 1e-9:
        out.warnings.append(f"maximum rudder angle {math.degrees(theta_max):g} deg is below the 35 deg of SOLAS II-1/29.3.2")
    if isinstance(unit.geometry, VaneGeometry):
        margin = physics.vane_free_swing(unit.geometry) - 2 * theta_max
        if margin < VANE_MARGIN_RAD:
            out.warnings.append(f"the vane chambers swing at most {math.degrees(margin + 2 * theta_max):.1f} deg, within "
                                f"{math.degrees(VANE_MARGIN_RAD):g} deg of 2 x the maximum rudder angle: check the vane angles "
                                "and the rudder stops with the maker")
    volume = physics.swing_volume(act, solas.SWING_FROM_RAD, solas.SWING_TO_RAD)
    out.swing_oil = volume
    case = solas.judging_case(vessel.ship_type, unit.pumps, vessel.gross_tonnage)
    out.swing_time_one_pump = physics.swing_time(volume, unit.pump_flow)
    out.swing_time_all_pumps = physics.swing_time(volume, unit.pump_flow * unit.pumps)
    out.swing_time_judged = physics.swing_time(volume, unit.pump_flow * case.pumps_running)
    out.judging_case, out.pumps_judged = case.reason, case.pumps_running
    out.pump_flow_needed = volume / solas.SWING_LIMIT_S / case.pumps_running
    travel_at = None
    if isinstance(g, RamGeometry):
        travel_at = lambda th: physics.ram_travel(g.tiller_radius, th)  # noqa: E731
    elif isinstance(g, CylinderGeometry):
        if g.trunnion_distance is not None:
            travel_at = lambda th: physics.trunnion_travel(g, th)  # noqa: E731
        else:
            travel_at = lambda th: physics.cylinder_travel(g.tiller_radius, th)  # noqa: E731
    if travel_at is not None:
        out.travel, out.stroke = travel_at(theta_max), g.stroke
    out.reachable_angle = theta_max if travel_at is None else physics.reachable_angle(travel_at, g.stroke, theta_max)
    out.swing_rule_met = out.reachable_angle >= solas.HARD_OVER_RAD - 1e-9 and out.swing_time_judged <= solas.SWING_LIMIT_S
    out.reduced = reduced_mode(unit) if unit.isolation_valves else None
    verdicts = solas.judge(solas.GearFigures(
        vessel.ship_type, vessel.gross_tonnage, unit.pumps, out.reachable_angle, out.swing_time_all_pumps,
        out.swing_time_judged, unit.isolation_valves, unit.working_pressure, unit.stock_diameter,
        unit.max_working_pressure, unit.design_pressure, out.reduced))
    out.rules, out.auxiliary_gear_required = list(verdicts.rules), verdicts.auxiliary_gear_required
    out.warnings += verdicts.warnings
    if out.travel is not None:
        out.travel_ok = out.travel <= out.stroke
        if not out.travel_ok:
            out.warnings.append(f"travel to {math.degrees(theta_max):g} deg each side is {out.travel * 1000:.0f} mm, "
                                f"more than the stroke {out.stroke * 1000:.0f} mm: check tiller radius, stroke and angle")
    _check_rudder(unit, act, out)
    out.inspections.append(f"{CARRIER_PLACE[unit.rudder_carrier]}: {CARRIER_INSPECTION}")
    return out


def gear_pressure(unit: Unit) -> float:
    """The pressure [Pa] the gear's torque is held against the rudder at: the maximum working pressure
    where the particulars give one, else the relief setting (``working_pressure``)."""
    return unit.max_working_pressure or unit.working_pressure


def _check_rudder(unit: Unit, act: physics.Actuation, out: UnitChecks) -> None:
    """The gear's least torque at 35 deg against the rudder torque by the rule formula (``kit.engine.rudder``)."""
    if unit.rudder is None:
        return
    load = rudder.rudder_load(unit.rudder)
    pressure = gear_pressure(unit)
    out.rudder_load, out.gear_torque_pressure = load, pressure
    out.gear_torque_35 = physics.least_torque(act, solas.HARD_OVER_RAD, pressure)
    out.rudder_margin = out.gear_torque_35 / load.torque - 1
    if out.rudder_margin < 0:
        course = "ahead" if load.torque_ahead >= load.torque_astern else "astern"
        out.warnings.append(f"the gear is short: {out.gear_torque_35 / 1e3:,.1f} kNm at 35 deg and {pressure / 1e5:g} bar "
                            f"against a rudder torque of {load.torque / 1e3:,.1f} kNm {course} by the classification-rule "
                            f"formula ({-100 * out.rudder_margin:.1f} % short); check the rudder particulars and the gear with "
                            "the maker and the class society")


def reduced_mode(unit: Unit) -> solas.ReducedMode | None:
    """The gear with one power actuating system lost (see ``kit.engine.solas``): one power unit fewer while
    two or more are fitted, and half the rams or cylinders of a gear of four or more. The torque
    and the oil swept scale with the rams or cylinders working (``kit.engine.physics``); a 4-ram gear on
    2 rams gives half the torque and, on half the flow, the same swing time.
    """
    split = unit.actuator in ("ram", "cylinder") and unit.count >= 4
    if unit.pumps < 2 and not split:
        return None  # its one power actuating system lost, nothing is left to steer with
    actuators = unit.count // 2 if split else unit.count
    pumps = unit.pumps - 1 if unit.pumps >= 2 else 1
    act = physics.actuation(replace(unit, count=actuators))
    volume = physics.swing_volume(act, solas.SWING_FROM_RAD, solas.SWING_TO_RAD)
    parts = f"{actuators} of {unit.count} {unit.actuator}s" if unit.count > 1 else f"the {unit.actuator.replace('_', ' ')} actuator"
    return solas.ReducedMode(actuators, unit.count, parts, pumps, physics.least_torque(act, unit.max_rudder_angle, unit.working_pressure),
                             physics.swing_time(volume, unit.pump_flow * pumps))
