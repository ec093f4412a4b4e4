# SPDX-License-Identifier: MIT
"""SOLAS II-1 regulation 29 (steering gear): the figures, the case each rule is judged on, and
one verdict per rule.

References
----------
SOLAS 1974 as amended, chapter II-1, regulation 29. The wording of 29.2.2, 29.2.3, 29.3.2 and
29.3.3 was read from a public reproduction of the consolidated text (SOLAS 74/78, chapter II-1,
part C); 29.4.2, 29.4.3, 29.6.1 and 29.16 were checked against a public paraphrase, with their
clause numbers from memory.

* 29.2.2: the design pressure is at least 1.25 times the maximum working pressure expected in
  the conditions of 29.3.2.
* 29.2.3: relief valves; their setting shall not exceed the design pressure.
* 29.3.2: the main steering gear puts the rudder over from 35 deg on one side to 35 deg on the
  other, and from 35 deg on either side to 30 deg on the other in not more than 28 s, at the
  deepest seagoing draught and maximum ahead service speed.
* 29.3.3: the main steering gear is power operated where 29.3.2 needs it and in any case when the
  rudder stock is over 120 mm in diameter in way of the tiller (ice strengthening excluded).
* 29.4: the auxiliary steering gear; 29.4.2: 15 deg to 15 deg in not more than 60 s at half the
  maximum ahead service speed or 7 knots, whichever is greater; 29.4.3: power operated where 29.4.2
  needs it and in any case when the rudder stock is over 230 mm in way of the tiller.
* 29.6.1: where the main steering gear comprises two or more identical power units, an auxiliary
  steering gear need not be fitted, provided that (.1) in a passenger ship the main steering gear
  meets 29.3.2 while any one of the power units is out of operation; (.2) in a cargo ship it meets
  29.3.2 while operating with all power units; (.3) after a single failure in its piping system or
  in one of the power units the defect can be isolated so that steering capability can be
  maintained or speedily regained.
* 29.12.3: a fixed storage tank able to recharge at least one power actuating system including
  the reservoir (see ``kit.engine.oil.charge``).
* 29.16.1: tankers, chemical tankers and gas carriers of 10,000 GT and upwards, and every other
  ship of 70,000 GT and upwards: two or more identical power units complying with paragraph 6.
  29.16.2 (the same tankers): after a single failure of one power actuating system, steering
  regained within 45 s (from memory).

Our reading, stated so it can be checked:

* The power units of one unit in the particulars are identical (one ``pump_flow`` and one
  ``pump_model`` for all).
* 29.3.2 is judged on the case 29.6.1 sets: a passenger ship with one power unit fewer than it has,
  a cargo ship (tankers, chemical tankers and gas carriers included) with all; a single power unit
  on that unit. The 29.3.2 result itself is the main gear with all its power units; where that is
  met but the 29.6.1 case is not, what fails is the dispensation of 29.6.1, and an auxiliary
  steering gear (29.4) is then required.
* 29.6.1.3 is shown by ``isolation_valves = true``; without it the particulars do not show it.
* The reduced mode after a single failure, for gears with isolation valves, is one power actuating
  system lost: one power unit fewer (while two or more remain) and, for a gear of four or more rams
  or cylinders, half of them isolated. A single power unit driving fewer than four rams or cylinders
  has no reduced mode: the failure leaves nothing to steer with. SOLAS sets no figure for it; kit reports its torque and
  swing time.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from kit.engine.display_units import PA_PER_BAR

SWING_FROM_RAD = math.radians(35.0)  # SOLAS II-1/29.3.2
SWING_TO_RAD = math.radians(30.0)  # SOLAS II-1/29.3.2
SWING_LIMIT_S = 28.0  # SOLAS II-1/29.3.2
HARD_OVER_RAD = math.radians(35.0)  # SOLAS II-1/29.3.2
TANKER_TWO_UNITS_GT = 10_000  # SOLAS II-1/29.16.1
ANY_SHIP_TWO_UNITS_GT = 70_000  # SOLAS II-1/29.16.1
TANKER_TYPES = ("tanker", "chemical_tanker", "gas_carrier")  # SOLAS II-1/29.16.1
MAIN_POWER_STOCK_M = 0.120  # SOLAS II-1/29.3.3
AUXILIARY_POWER_STOCK_M = 0.230  # SOLAS II-1/29.4.3
DESIGN_PRESSURE_FACTOR = 1.25  # SOLAS II-1/29.2.2

SHIP_WORDS = {"cargo": "cargo ship", "passenger": "passenger ship", "tanker": "tanker",
              "chemical_tanker": "chemical tanker", "gas_carrier": "gas carrier"}
VERDICTS = ("met", "not met", "not shown", "not applicable", "info")


@dataclass(frozen=True)
class JudgingCase:
    """The number of power units the 28 s rule is judged with, and why."""

    pumps_running: int
    reason: str
    warnings: tuple[str, ...] = ()


@dataclass(frozen=True)
class RuleResult:
    """One rule's verdict (one of ``VERDICTS``) with its clause and what it was judged on."""

    clause: str
    verdict: str
    text: str


@dataclass(frozen=True)
class ReducedMode:
    """The gear after a single failure, one power actuating system lost."""

    actuators: int
    actuators_fitted: int
    parts: str  # what works on, e.g. "2 of 4 rams"
    pumps: int
    torque_max_angle: float  # N m at the relief setting
    swing_time: float  # s, 35 deg to 30 deg


@dataclass(frozen=True)
class GearFigures:
    """What the rules of regulation 29 are judged on, in SI (rad, s, m, Pa)."""

    ship_type: str
    gross_tonnage: float
    pumps: int
    reachable_angle: float
    swing_time_all: float
    swing_time_judged: float
    isolation_valves: bool
    relief_setting: float
    stock_diameter: float | None = None
    max_working_pressure: float | None = None
    design_pressure: float | None = None
    reduced: ReducedMode | None = None


@dataclass(frozen=True)
class Verdicts:
    rules: tuple[RuleResult, ...]
    auxiliary_gear_required: bool | None  # None: only if 29.6.1.3 cannot be shown
    warnings: tuple[str, ...]

    def rule(self, clause: str) -> RuleResult:
        return next(r for r in self.rules if r.clause == clause)


def is_passenger(ship_type: str) -> bool:
    return ship_type == "passenger"


def judging_case(ship_type: str, pumps: int, gross_tonnage: float) -> JudgingCase:
    """Which case SOLAS II-1/29.3.2 is judged on, read from 29.6.1 (see module docstring)."""
    if pumps < 2:
        return JudgingCase(1, "single power unit (SOLAS II-1/29.3.2)")
    if is_passenger(ship_type):
        return JudgingCase(pumps - 1, "passenger ship, one power unit out of operation (SOLAS II-1/29.6.1.1)")
    return JudgingCase(pumps, "cargo ship, all power units operating (SOLAS II-1/29.6.1.2)")


def two_units_required(ship_type: str, gross_tonnage: float) -> bool:
    """SOLAS II-1/29.16.1: tankers, chemical tankers, gas carriers >= 10,000 GT; any ship >= 70,000 GT."""
    return (ship_type in TANKER_TYPES and gross_tonnage >= TANKER_TWO_UNITS_GT) or gross_tonnage >= ANY_SHIP_TWO_UNITS_GT


def storage_tank_minimum(system_charge_m3: float) -> float:
    """Fixed storage tank minimum [m^3]: enough to recharge one power actuating system including
    its reservoir (SOLAS II-1/29.12.3)."""
    return system_charge_m3


def _deg(rad: float) -> str:
    return f"{math.degrees(rad):.1f}".removesuffix(".0")


def _bar(pa: float) -> str:
    return f"{pa / PA_PER_BAR:g} bar"


def _mm(m: float) -> str:
    return f"{m * 1000:g} mm"


def reaches_hard_over(f: GearFigures) -> bool:
    return f.reachable_angle >= HARD_OVER_RAD - 1e-9


def rule_29_3_2(f: GearFigures) -> RuleResult:
    """29.3.2 for the main gear with all its power units: 35 deg each side reachable, 35-30 in 28 s."""
    units = f"all {f.pumps} power units" if f.pumps > 1 else "its one power unit"
    swing = f"35-30 deg in {f.swing_time_all:.1f} s with {units}, limit 28 s"
    if not reaches_hard_over(f):
        return RuleResult("SOLAS II-1/29.3.2", "not met",
                          f"the rudder reaches only {_deg(f.reachable_angle)} deg each side, short of 35 deg to 35 deg; {swing}")
    met = f.swing_time_all <= SWING_LIMIT_S
    return RuleResult("SOLAS II-1/29.3.2", "met" if met else "not met", f"35 deg each side reachable; {swing}")


def rule_29_6_1_case(f: GearFigures) -> RuleResult:
    """29.6.1.1 (passenger) or .2 (cargo): 29.3.2 in the case that spares the auxiliary steering gear."""
    clause = "SOLAS II-1/29.6.1.1" if is_passenger(f.ship_type) else "SOLAS II-1/29.6.1.2"
    if f.pumps < 2:
        return RuleResult(clause, "not applicable", "a single power unit: 29.6.1 needs two or more identical power units")
    case = judging_case(f.ship_type, f.pumps, f.gross_tonnage)
    running = f"{case.pumps_running} of {f.pumps} power units (one out of operation)" if is_passenger(f.ship_type) \
        else f"all {f.pumps} power units"
    if not reaches_hard_over(f):
        return RuleResult(clause, "not met", f"29.3.2 is not met with {running}: 35 deg is not reachable")
    met = f.swing_time_judged <= SWING_LIMIT_S
    return RuleResult(clause, "met" if met else "not met",
                      f"29.3.2 {'is' if met else 'is not'} met with {running}: 35-30 deg in {f.swing_time_judged:.1f} s, limit 28 s")


def rule_29_6_1_3(f: GearFigures) -> RuleResult:
    if f.pumps < 2:
        return RuleResult("SOLAS II-1/29.6.1.3", "not applicable", "a single power unit: no dispensation under 29.6.1")
    if f.isolation_valves:
        return RuleResult("SOLAS II-1/29.6.1.3", "met",
                          "isolation valves: a single failure in the piping or in one power unit can be isolated")
    return RuleResult("SOLAS II-1/29.6.1.3", "not shown",
                      "no isolation valves stated: the particulars do not show that a single failure in the piping or "
                      "in one power unit can be isolated (isolation_valves = true where the gear has them)")


def auxiliary_gear_required(case: RuleResult, isolable: RuleResult) -> bool | None:
    """True when 29.6.1 cannot spare the auxiliary steering gear, None when only 29.6.1.3 is unshown."""
    if case.verdict in ("not applicable", "not met") or isolable.verdict == "not met":
        return True
    return None if isolable.verdict == "not shown" else False


def rule_29_3_3(f: GearFigures) -> RuleResult:
    if f.stock_diameter is None:
        return RuleResult("SOLAS II-1/29.3.3", "not shown", "stock_diameter not given")
    if f.stock_diameter > MAIN_POWER_STOCK_M:
        return RuleResult("SOLAS II-1/29.3.3", "met",
                          f"power operated, as a rudder stock of {_mm(f.stock_diameter)} (over 120 mm) requires")
    return RuleResult("SOLAS II-1/29.3.3", "met",
                      f"power operated; a rudder stock of {_mm(f.stock_diameter)} (120 mm or less) needs power only where 29.3.2 does")


def rule_29_4_3(f: GearFigures, auxiliary: bool | None) -> RuleResult:
    if auxiliary is False:
        return RuleResult("SOLAS II-1/29.4.3", "not applicable", "no auxiliary steering gear needed (SOLAS II-1/29.6.1)")
    if f.stock_diameter is None:
        return RuleResult("SOLAS II-1/29.4.3", "not shown",
                          "stock_diameter not given: whether an auxiliary steering gear must be power operated is not known")
    if f.stock_diameter > AUXILIARY_POWER_STOCK_M:
        return RuleResult("SOLAS II-1/29.4.3", "info",
                          f"an auxiliary steering gear must be power operated: rudder stock {_mm(f.stock_diameter)} is over 230 mm")
    return RuleResult("SOLAS II-1/29.4.3", "info",
                      f"an auxiliary steering gear may be hand operated where it meets 29.4.2 (15-15 deg in 60 s): "
                      f"rudder stock {_mm(f.stock_diameter)} is 230 mm or less")


def rule_29_16_1(f: GearFigures, case: RuleResult, isolable: RuleResult) -> RuleResult:
    if not two_units_required(f.ship_type, f.gross_tonnage):
        return RuleResult("SOLAS II-1/29.16.1", "not applicable",
                          f"a {SHIP_WORDS.get(f.ship_type, f.ship_type)} of {f.gross_tonnage:,.0f} GT (applies to tankers, chemical tankers "
                          "and gas carriers of 10,000 GT and upwards and every other ship of 70,000 GT and upwards)")
    who = "a tanker, chemical tanker or gas carrier of 10,000 GT or more" if f.ship_type in TANKER_TYPES \
        and f.gross_tonnage >= TANKER_TWO_UNITS_GT else "a ship of 70,000 GT or more"
    if f.pumps < 2:
        return RuleResult("SOLAS II-1/29.16.1", "not met", f"{who} needs two or more identical power units; it has one")
    if case.verdict == "not met" or isolable.verdict == "not met":
        return RuleResult("SOLAS II-1/29.16.1", "not met",
                          f"{f.pumps} identical power units, but not complying with paragraph 6 ({case.clause}: {case.verdict})")
    if isolable.verdict == "not shown":
        return RuleResult("SOLAS II-1/29.16.1", "not shown", f"{f.pumps} identical power units; paragraph 6 not shown (29.6.1.3)")
    return RuleResult("SOLAS II-1/29.16.1", "met", f"{f.pumps} identical power units complying with paragraph 6 ({who})")


def rule_reduced_mode(f: GearFigures) -> RuleResult:
    clause = "SOLAS II-1/29.6.1.3 reduced mode"
    r = f.reduced
    if r is None and f.isolation_valves:
        return RuleResult(clause, "not applicable", "a single power unit driving all the actuators: a single failure "
                          "leaves no power actuating system to steer with")
    if r is None:
        return RuleResult(clause, "not applicable", "no isolation valves stated")
    return RuleResult(clause, "info",
                      f"one power actuating system lost: {r.parts} on {r.pumps} power unit(s) give "
                      f"{r.torque_max_angle / 1000:.1f} kNm at the maximum angle and swing 35-30 deg in {r.swing_time:.1f} s "
                      "(SOLAS sets no figure; the class rules and the maker's reduced-speed limits apply)")


def rule_29_2_2(f: GearFigures) -> RuleResult:
    clause = "SOLAS II-1/29.2.2"
    if f.design_pressure is None:
        return RuleResult(clause, "not shown", "design_pressure not given")
    if f.max_working_pressure is not None:
        need = DESIGN_PRESSURE_FACTOR * f.max_working_pressure
        met = f.design_pressure >= need * (1 - 1e-9)
        return RuleResult(clause, "met" if met else "not met",
                          f"design pressure {_bar(f.design_pressure)} against 1.25 x the maximum working pressure "
                          f"{_bar(f.max_working_pressure)} = {_bar(need)}")
    need = DESIGN_PRESSURE_FACTOR * f.relief_setting
    if f.design_pressure >= need * (1 - 1e-9):
        return RuleResult(clause, "met", f"design pressure {_bar(f.design_pressure)} is at least 1.25 x the relief setting "
                                         f"{_bar(f.relief_setting)}, which bounds the maximum working pressure")
    return RuleResult(clause, "not shown", f"max_working_pressure not given; design pressure {_bar(f.design_pressure)} is "
                                           f"below 1.25 x the relief setting ({_bar(need)})")


def rule_29_2_3(f: GearFigures) -> RuleResult:
    if f.design_pressure is None:
        return RuleResult("SOLAS II-1/29.2.3", "not shown", "design_pressure not given")
    met = f.relief_setting <= f.design_pressure * (1 + 1e-9)
    return RuleResult("SOLAS II-1/29.2.3", "met" if met else "not met",
                      f"relief setting {_bar(f.relief_setting)} {'within' if met else 'above'} the design pressure {_bar(f.design_pressure)}")


def judge(f: GearFigures) -> Verdicts:
    """Every rule of regulation 29 kit can judge from the particulars, each with its clause."""
    main = rule_29_3_2(f)
    case = rule_29_6_1_case(f)
    isolable = rule_29_6_1_3(f)
    auxiliary = auxiliary_gear_required(case, isolable)
    rules = (main, case, isolable, rule_29_16_1(f, case, isolable), rule_reduced_mode(f), rule_29_3_3(f),
             rule_29_4_3(f, auxiliary), rule_29_2_2(f), rule_29_2_3(f))
    warnings = [f"{r.clause} not met: {r.text}" for r in rules if r.verdict == "not met" and r is not case]
    if auxiliary:
        why = case.text if case.verdict == "not applicable" else f"{case.clause} {case.verdict}, {case.text}"
        warnings.append(f"an auxiliary steering gear is required (SOLAS II-1/29.4): {why}")
    elif auxiliary is None:
        warnings.append("an auxiliary steering gear is required (SOLAS II-1/29.4) unless a single failure can be isolated "
                        "(SOLAS II-1/29.6.1.3), which the particulars do not show: isolation_valves not stated")
    if f.max_working_pressure is not None and f.max_working_pressure > f.relief_setting:
        warnings.append(f"max_working_pressure {_bar(f.max_working_pressure)} is above the relief setting "
                        f"{_bar(f.relief_setting)}: the relief valve would lift in service")
    return Verdicts(rules, auxiliary, tuple(warnings))
