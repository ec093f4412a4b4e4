# SPDX-License-Identifier: MIT
"""SOLAS II-1/29: the figures, the judging case of 29.6.1, and the checks built on them."""

from __future__ import annotations

import math

import pytest

from engine_helpers import ram_unit, vane_unit, vessel
from kit.engine import physics, solas
from kit.engine.checks import check_unit
from kit.files.policy_file import load_policy

POLICY = load_policy()


def test_figures_of_regulation_29():
    # SOLAS II-1/29.3.2: 35 deg one side to 30 deg the other in not more than 28 s.
    assert solas.SWING_LIMIT_S == 28.0
    assert solas.SWING_FROM_RAD == pytest.approx(math.radians(35))
    assert solas.SWING_TO_RAD == pytest.approx(math.radians(30))
    assert solas.HARD_OVER_RAD == pytest.approx(math.radians(35))
    # SOLAS II-1/29.16.1: tankers, chemical tankers, gas carriers of 10,000 GT; every ship of 70,000 GT.
    assert solas.TANKER_TWO_UNITS_GT == 10_000
    assert solas.ANY_SHIP_TWO_UNITS_GT == 70_000
    # SOLAS II-1/29.3.3 and 29.4.3: power operation for stocks over 120 mm (main), 230 mm (auxiliary).
    assert (solas.MAIN_POWER_STOCK_M, solas.AUXILIARY_POWER_STOCK_M) == (0.120, 0.230)
    # SOLAS II-1/29.2.2: design pressure at least 1.25 x the maximum working pressure.
    assert solas.DESIGN_PRESSURE_FACTOR == 1.25


def test_passenger_ship_judged_with_one_unit_out():
    # SOLAS II-1/29.6.1.1: passenger ship meets 29.3.2 with any one power unit out of operation.
    case = solas.judging_case("passenger", 2, 24600)
    assert case.pumps_running == 1
    assert "29.6.1.1" in case.reason and case.warnings == ()
    assert solas.judging_case("passenger", 3, 24600).pumps_running == 2


@pytest.mark.parametrize("ship_type", ["cargo", "tanker"])
def test_cargo_ship_judged_with_all_units(ship_type):
    # SOLAS II-1/29.6.1.2: cargo ship meets 29.3.2 with all power units operating.
    case = solas.judging_case(ship_type, 2, 30000)
    assert case.pumps_running == 2
    assert case.reason == "cargo ship, all power units operating (SOLAS II-1/29.6.1.2)"


def test_storage_tank_is_one_system_charge():
    # SOLAS II-1/29.12.3: recharge at least one power actuating system including the reservoir.
    assert solas.storage_tank_minimum(0.450) == 0.450


def test_checks_judge_passenger_ship_on_one_pump():
    v = vessel(vane_unit(pumps=2), ship_type="passenger", gross_tonnage=24600)
    c = check_unit(v.units[0], v, POLICY)
    assert c.pumps_judged == 1
    assert c.swing_time_judged == pytest.approx(c.swing_time_one_pump, rel=1e-12)
    # By hand: swept volume (35 + 30 deg) x vanes h (R^2 - r^2) / 2 over one pump's 240 L/min.
    volume = math.radians(65) * 2 * 0.450 * (0.450**2 - 0.250**2) / 2
    assert c.swing_time_one_pump == pytest.approx(volume / (0.240 / 60), rel=1e-9)


def test_checks_judge_cargo_ship_on_all_pumps():
    v = vessel(ram_unit(pumps=2), ship_type="cargo")
    c = check_unit(v.units[0], v, POLICY)
    assert c.pumps_judged == 2
    assert c.swing_time_judged == pytest.approx(c.swing_time_all_pumps, rel=1e-12)


def test_slow_gear_fails_29_3_2_with_a_warning():
    v = vessel(ram_unit(pumps=2, pump_flow="10 L/min"))
    c = check_unit(v.units[0], v, POLICY)
    assert c.swing_time_judged > 28 and c.swing_rule_met is False
    assert rule(c, "29.3.2").verdict == "not met"
    assert any(w.startswith("SOLAS II-1/29.3.2 not met: 35 deg each side reachable; 35-30 deg in") for w in c.warnings)


def test_rudder_angle_below_35_deg_warns():
    v = vessel(ram_unit(max_rudder_angle="30 deg"))
    c = check_unit(v.units[0], v, POLICY)
    assert "maximum rudder angle 30 deg is below the 35 deg of SOLAS II-1/29.3.2" in c.warnings


def test_travel_beyond_stroke_warns():
    # 2 x 600 mm x tan 35 deg = 840 mm of travel on a 800 mm stroke.
    v = vessel(ram_unit(stroke="800 mm"))
    c = check_unit(v.units[0], v, POLICY)
    assert c.travel == pytest.approx(physics.ram_travel(0.6, math.radians(35)))
    assert c.travel_ok is False
    assert any("is 840 mm, more than the stroke 800 mm" in w for w in c.warnings)


def test_pressure_above_a_rating_warns():
    # Default policy rates hoses at 250 bar (common practice).
    v = vessel(ram_unit(working_pressure="300 bar"))
    c = check_unit(v.units[0], v, POLICY)
    assert c.pressure_ok is False
    assert "working pressure 300 bar exceeds the hose rating 250 bar in the spares policy" in c.warnings


# --- verdicts, each worked by hand from the clause ------------------------------------------

RAM_SWEPT = math.pi / 4 * 0.280**2 * 0.600 * (math.tan(math.radians(35)) + math.tan(math.radians(30)))  # k A R (tan 35 + tan 30), k = 1


def rule(c, clause: str):
    return next(r for r in c.rules if r.clause.startswith("SOLAS II-1/" + clause) and (clause.endswith("mode") or "mode" not in r.clause))


def judged(ship_type: str, pumps: int, flow_l_min: float, gt: float = 8000, **over):
    v = vessel(ram_unit(pumps=pumps, pump_flow=f"{flow_l_min} L/min", **over), ship_type=ship_type, gross_tonnage=gt)
    return check_unit(v.units[0], v, POLICY)


# (ship type, pumps, flow each) -> pumps judged (29.6.1), 29.3.2 with all, the 29.6.1 case clause and
# verdict, auxiliary steering gear required. 60 L/min: 47.2 s on one pump, 23.6 s on two, 15.7 s on three.
VERDICT_CASES = [
    ("cargo", 1, 60, 1, "not met", "29.6.1.2", "not applicable", True),        # 29.6.1 needs two units
    ("cargo", 1, 120, 1, "met", "29.6.1.2", "not applicable", True),
    ("cargo", 2, 60, 2, "met", "29.6.1.2", "met", False),                     # 29.6.1.2: all units
    ("cargo", 3, 60, 3, "met", "29.6.1.2", "met", False),
    ("passenger", 1, 120, 1, "met", "29.6.1.1", "not applicable", True),
    ("passenger", 2, 60, 1, "met", "29.6.1.1", "not met", True),               # met with all, not with one out
    ("passenger", 2, 120, 1, "met", "29.6.1.1", "met", False),
    ("passenger", 3, 60, 2, "met", "29.6.1.1", "met", False),                  # 29.6.1.1: any one out
]


@pytest.mark.parametrize(("ship_type", "pumps", "flow", "running", "main", "clause", "case", "auxiliary"), VERDICT_CASES)
def test_verdicts_for_passenger_and_cargo_ships(ship_type, pumps, flow, running, main, clause, case, auxiliary):
    c = judged(ship_type, pumps, flow, isolation_valves=True)
    q = flow / 60000  # m^3/s
    # SOLAS II-1/29.3.2 on the main gear with all its units: 35-30 deg in 28 s.
    assert c.swing_time_all_pumps == pytest.approx(RAM_SWEPT / (q * pumps), rel=1e-9)
    assert rule(c, "29.3.2").verdict == main
    # SOLAS II-1/29.6.1.1 / .2: the case that spares the auxiliary steering gear.
    assert c.pumps_judged == running
    assert c.swing_time_judged == pytest.approx(RAM_SWEPT / (q * running), rel=1e-9)
    assert rule(c, clause).verdict == case
    assert c.swing_rule_met is (RAM_SWEPT / (q * running) <= 28)
    assert c.auxiliary_gear_required is auxiliary
    # Pump flow each for 28 s in the judged case: V / 28 s / pumps judged.
    assert c.pump_flow_needed == pytest.approx(RAM_SWEPT / 28 / running, rel=1e-9)
    aux = [w for w in c.warnings if w.startswith("an auxiliary steering gear is required (SOLAS II-1/29.4)")]
    assert len(aux) == (1 if auxiliary else 0)


def test_passenger_ship_met_with_all_units_says_the_auxiliary_gear_is_needed():
    # 29.3.2 is met with both units (23.6 s); with one out (47.2 s) the 29.6.1.1 dispensation fails.
    c = judged("passenger", 2, 60, isolation_valves=True)
    assert rule(c, "29.3.2").verdict == "met"
    assert not any(w.startswith("SOLAS II-1/29.3.2 not met") for w in c.warnings)
    assert ("an auxiliary steering gear is required (SOLAS II-1/29.4): SOLAS II-1/29.6.1.1 not met, 29.3.2 is not met "
            f"with 1 of 2 power units (one out of operation): 35-30 deg in {RAM_SWEPT / 0.001:.1f} s, limit 28 s") in c.warnings


def test_single_failure_isolable_only_with_isolation_valves():
    # SOLAS II-1/29.6.1.3: without isolation valves the particulars do not show it.
    shown = judged("cargo", 2, 120, isolation_valves=True)
    unshown = judged("cargo", 2, 120)
    assert (rule(shown, "29.6.1.3").verdict, shown.auxiliary_gear_required) == ("met", False)
    assert (rule(unshown, "29.6.1.3").verdict, unshown.auxiliary_gear_required) == ("not shown", None)
    assert any(w.startswith("an auxiliary steering gear is required (SOLAS II-1/29.4) unless a single failure can be isolated")
               for w in unshown.warnings)


@pytest.mark.parametrize(("ship_type", "gt", "pumps", "valves", "verdict"), [
    ("cargo", 70_000, 1, True, "not met"),          # 29.16.1: every ship of 70,000 GT and upwards
    ("cargo", 69_999, 1, True, "not applicable"),
    ("passenger", 80_000, 2, True, "met"),
    ("cargo", 80_000, 2, False, "not shown"),       # paragraph 6 (29.6.1.3) not shown
    ("tanker", 10_000, 1, True, "not met"),
    ("chemical_tanker", 10_000, 2, True, "met"),
    ("gas_carrier", 9_999, 1, True, "not applicable"),
    ("tanker", 9_999, 1, True, "not applicable"),
])
def test_two_identical_power_units_clause(ship_type, gt, pumps, valves, verdict):
    c = judged(ship_type, pumps, 120, gt=gt, isolation_valves=valves)
    assert rule(c, "29.16.1").verdict == verdict
    assert ("SOLAS II-1/29.16.1 not met:" in " ".join(c.warnings)) is (verdict == "not met")


def test_unreachable_35_deg_fails_29_3_2_however_fast():
    # Rapson slide: a 800 mm stroke at R = 600 mm reaches atan(0.8 / 1.2) = 33.7 deg each side.
    c = judged("cargo", 2, 240, stroke="800 mm", isolation_valves=True)
    assert c.reachable_angle == pytest.approx(math.atan(0.800 / 1.200), abs=1e-9)
    assert c.swing_time_judged < 28
    assert c.swing_rule_met is False
    assert rule(c, "29.3.2").verdict == "not met"
    assert rule(c, "29.3.2").text.startswith("the rudder reaches only 33.7 deg each side")
    assert c.auxiliary_gear_required is True


def test_reduced_mode_of_a_four_ram_gear_is_half_the_torque():
    # A 4-ram gear with isolation valves loses one power actuating system: 2 rams on 1 pump.
    # Rapson slide T = k p A R / cos^2(theta), k = rams / 2: k = 2 fitted, k = 1 in the reduced mode.
    c = judged("tanker", 2, 120, gt=42_300, count=4, isolation_valves=True)
    a, p, th = math.pi / 4 * 0.280**2, 160e5, math.radians(35)
    assert c.torque_max_angle == pytest.approx(2 * p * a * 0.600 / math.cos(th) ** 2, rel=1e-9)
    assert c.reduced.torque_max_angle == pytest.approx(1 * p * a * 0.600 / math.cos(th) ** 2, rel=1e-9)
    assert (c.reduced.actuators, c.reduced.pumps) == (2, 1)
    # Half the rams sweep half the oil, on one pump of 2 L/s: k = 1 x A R (tan 35 + tan 30) / 0.002.
    assert c.reduced.swing_time == pytest.approx(RAM_SWEPT / 0.002, rel=1e-9)
    assert rule(c, "29.6.1.3 reduced mode").verdict == "info"
    assert "2 of 4 rams on 1 power unit(s)" in rule(c, "29.6.1.3 reduced mode").text
    assert judged("tanker", 2, 120, gt=42_300, count=4).reduced is None


def test_no_reduced_mode_with_one_power_unit_and_one_ram_pair():
    # SOLAS II-1/29.6.1.3 isolates a failure so that steering capability is kept; with one power
    # unit driving one ram pair the one power actuating system is the whole gear, and losing it
    # leaves none (before, kit showed the intact gear as the reduced mode: 2 of 2 rams on 1 unit).
    c = judged("cargo", 1, 120, isolation_valves=True)
    assert c.reduced is None
    assert (rule(c, "29.6.1.3 reduced mode").verdict, rule(c, "29.6.1.3 reduced mode").text) == (
        "not applicable", "a single power unit driving all the actuators: a single failure leaves no power actuating "
        "system to steer with")
    # Four rams on one power unit: a piping failure isolates one pair and the other works on: k = 1.
    four = judged("cargo", 1, 120, count=4, isolation_valves=True)
    assert (four.reduced.actuators, four.reduced.pumps) == (2, 1)
    a, th = math.pi / 4 * 0.280**2, math.radians(35)
    assert four.reduced.torque_max_angle == pytest.approx(160e5 * a * 0.600 / math.cos(th) ** 2, rel=1e-9)


@pytest.mark.parametrize(("stock", "main", "auxiliary"), [
    ("100 mm", "120 mm or less", "may be hand operated"),
    ("200 mm", "over 120 mm", "may be hand operated"),
    ("250 mm", "over 120 mm", "must be power operated"),
])
def test_power_operation_by_stock_diameter(stock, main, auxiliary):
    # SOLAS II-1/29.3.3 (over 120 mm: main gear power operated), 29.4.3 (over 230 mm: auxiliary too).
    c = judged("cargo", 1, 120, stock_diameter=stock)
    assert rule(c, "29.3.3").verdict == "met" and main in rule(c, "29.3.3").text
    assert rule(c, "29.4.3").verdict == "info" and auxiliary in rule(c, "29.4.3").text
    assert rule(judged("cargo", 1, 120), "29.3.3").verdict == "not shown"


@pytest.mark.parametrize(("design", "mwp", "v222", "v223"), [
    ("200 bar", "150 bar", "met", "met"),        # 1.25 x 150 = 187.5 <= 200; relief 160 <= 200
    ("180 bar", "150 bar", "not met", "met"),    # 187.5 > 180
    ("150 bar", "110 bar", "met", "not met"),    # 137.5 <= 150; relief 160 > 150
    ("200 bar", None, "met", "met"),             # 1.25 x relief 160 = 200 bounds it
    ("190 bar", None, "not shown", "met"),
    (None, None, "not shown", "not shown"),
])
def test_design_pressure_and_relief_setting(design, mwp, v222, v223):
    # SOLAS II-1/29.2.2: design >= 1.25 x maximum working pressure; 29.2.3: relief setting <= design.
    over = {k: v for k, v in (("design_pressure", design), ("max_working_pressure", mwp)) if v}
    c = judged("cargo", 2, 120, **over)
    assert (rule(c, "29.2.2").verdict, rule(c, "29.2.3").verdict) == (v222, v223)


def test_rotary_vane_near_its_chamber_limit_warns():
    # 5 moving vanes leave each chamber at most 360 / 5 = 72 deg: 2 deg past 2 x 35 deg.
    v = vessel(vane_unit(vanes=5))
    c = check_unit(v.units[0], v, POLICY)
    assert any(w.startswith("the vane chambers swing at most 72.0 deg") for w in c.warnings)
    ok = vessel(vane_unit(vanes=3))
    assert not any("vane chambers" in w for w in check_unit(ok.units[0], ok, POLICY).warnings)
