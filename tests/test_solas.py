# SPDX-License-Identifier: MIT
"""SOLAS II-1/29: the figures, the judging case of 29.6.1, and the checks built on them."""

from __future__ import annotations

import math

import pytest

from engine_helpers import ram_unit, vane_unit, vessel
from kit import physics, solas
from kit.checks import check_unit
from kit.spares import load_policy

POLICY = load_policy()


def test_figures_of_regulation_29():
    # SOLAS II-1/29.3.2: 35 deg one side to 30 deg the other in not more than 28 s.
    assert solas.SWING_LIMIT_S == 28.0
    assert solas.SWING_FROM_RAD == pytest.approx(math.radians(35))
    assert solas.SWING_TO_RAD == pytest.approx(math.radians(30))
    assert solas.HARD_OVER_RAD == pytest.approx(math.radians(35))
    # SOLAS II-1/29.16: tankers of 10,000 GT and upwards.
    assert solas.TANKER_TWO_UNITS_GT == 10_000


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


def test_single_pump_warns():
    # SOLAS II-1/29.4: with one power unit an auxiliary steering gear is required.
    case = solas.judging_case("cargo", 1, 5000)
    assert case.pumps_running == 1
    assert case.warnings == ("single power unit: an auxiliary steering gear is required (SOLAS II-1/29.4)",)


def test_large_tanker_with_one_pump_warns_twice():
    case = solas.judging_case("tanker", 1, 10_000)
    assert case.warnings[0] == "a tanker of 10,000 GT or more needs two or more identical power units (SOLAS II-1/29.16)"
    assert len(case.warnings) == 2
    assert len(solas.judging_case("tanker", 1, 9_999).warnings) == 1


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


def test_slow_gear_fails_the_28_s_rule_with_a_warning():
    v = vessel(ram_unit(pumps=2, pump_flow="10 L/min"))
    c = check_unit(v.units[0], v, POLICY)
    assert c.swing_time_judged > 28 and c.swing_rule_met is False
    assert any(w.startswith("swing 35-30 deg takes") and "more than the 28 s of SOLAS II-1/29.3.2" in w for w in c.warnings)


def test_single_pump_unit_checks_carry_the_warning():
    v = vessel(ram_unit(pumps=1))
    c = check_unit(v.units[0], v, POLICY)
    assert "single power unit: an auxiliary steering gear is required (SOLAS II-1/29.4)" in c.warnings


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
