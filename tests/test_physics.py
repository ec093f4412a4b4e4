# SPDX-License-Identifier: MIT
"""Torque, swept oil and swing time, each worked by hand here from the formula's source."""

from __future__ import annotations

import math

import pytest

from engine_helpers import cylinder_unit, ram_unit, unit, vane_unit, vessel
from kit.engine import physics
from kit.engine.checks import check_unit
from kit.engine.particulars import CylinderGeometry, RamGeometry, VaneGeometry
from kit.files.policy_file import load_policy

P = 160e5  # 160 bar
RAM = RamGeometry(ram_diameter=0.280, stroke=0.900, tiller_radius=0.600)
VANE = VaneGeometry(vanes=2, vane_height=0.450, housing_bore=0.900, hub_diameter=0.500, stock_diameter=0.380)
CYL = CylinderGeometry(bore=0.200, rod=0.140, stroke=0.450, tiller_radius=0.280)
ANGLES = [math.radians(a) for a in (0, 5, 10, 20, 30, 35, 45)]


@pytest.mark.parametrize("count", [2, 4])
def test_rapson_slide_torque_by_hand(count):
    # Rapson slide: T = k p A R / cos^2(theta), k = count / 2 (Taylor, Introduction to Marine
    # Engineering, ch. 12, from memory).
    act = physics.ram_actuation(RAM, count)
    a = math.pi / 4 * 0.280**2
    for th in ANGLES:
        assert act.torque(th, P) == pytest.approx((count / 2) * P * a * 0.600 / math.cos(th) ** 2, rel=1e-12)


def test_ram_torque_grows_as_one_over_cos_squared():
    # Rapson slide 1/cos^2 law (Taylor, ch. 12, from memory).
    act = physics.ram_actuation(RAM, 2)
    t0 = act.torque(0.0, P)
    for th in ANGLES:
        assert act.torque(th, P) / t0 == pytest.approx(1 / math.cos(th) ** 2, rel=1e-12)
    assert act.torque(math.radians(35), P) / t0 == pytest.approx(1.490, abs=0.001)  # 1/cos^2 35 deg


def test_rotary_vane_torque_by_hand_and_constant():
    # Rotary vane: T = p x vanes x h x (R^2 - r^2) / 2 (energy balance over one chamber).
    act = physics.vane_actuation(VANE)
    expected = P * 2 * 0.450 * (0.450**2 - 0.250**2) / 2
    for th in ANGLES:
        assert act.torque(th, P) == pytest.approx(expected, rel=1e-12)


def test_trunnion_cylinder_torque_by_hand():
    # Trunnion pair, one pushing on the bore and one pulling on the annulus: T = n p (A_b + A_a) R cos(theta).
    act = physics.cylinder_actuation(CYL, 2)
    a_b = math.pi / 4 * 0.200**2
    a_a = a_b - math.pi / 4 * 0.140**2
    for th in ANGLES:
        assert act.torque(th, P) == pytest.approx(P * (a_b + a_a) * 0.280 * math.cos(th), rel=1e-12)


@pytest.mark.parametrize("act", [physics.ram_actuation(RAM, 2), physics.vane_actuation(VANE), physics.cylinder_actuation(CYL, 2)],
                         ids=["ram", "vane", "cylinder"])
def test_torque_is_pressure_times_dv_dtheta(act):
    # Energy balance of a lossless actuator: T = p dV/dtheta, by central differences of V.
    h = 1e-6
    for th in ANGLES[1:]:
        dv = (act.volume(th + h) - act.volume(th - h)) / (2 * h)
        assert act.torque(th, P) == pytest.approx(P * dv, rel=1e-6)


def test_swing_volume_is_both_sides():
    act = physics.ram_actuation(RAM, 2)
    a35, a30 = math.radians(35), math.radians(30)
    k_a_r = 1 * math.pi / 4 * 0.280**2 * 0.600
    assert physics.swing_volume(act, a35, a30) == pytest.approx(k_a_r * (math.tan(a35) + math.tan(a30)), rel=1e-12)


def test_swing_time_is_volume_over_flow():
    assert physics.swing_time(0.040, 0.002) == pytest.approx(20.0, rel=1e-12)


def test_two_pumps_halve_the_swing_time():
    v = vessel(ram_unit(pumps=2))
    c = check_unit(v.units[0], v, load_policy())
    assert c.swing_time_all_pumps == pytest.approx(c.swing_time_one_pump / 2, rel=1e-12)


def test_ram_travel():
    # Rapson slide: the ram moves R tan(theta) each side of midships.
    assert physics.ram_travel(0.600, math.radians(35)) == pytest.approx(2 * 0.600 * math.tan(math.radians(35)), rel=1e-12)
    assert physics.ram_travel(0.600, math.radians(35)) == pytest.approx(0.840, abs=0.001)


def test_cylinder_travel():
    assert physics.cylinder_travel(0.280, math.radians(35)) == pytest.approx(2 * 0.280 * math.sin(math.radians(35)), rel=1e-12)


def test_actuator_dispatch_and_oil():
    ram = unit(ram_unit())
    assert physics.actuation(ram).torque(0, P) == pytest.approx(physics.ram_actuation(RAM, 2).torque(0, P), rel=1e-12)
    # A ram pair holds A x stroke: as one ram comes out by x the other goes in by x.
    assert physics.actuator_oil_volume(ram) == pytest.approx(math.pi / 4 * 0.280**2 * 0.900, rel=1e-12)
    cyl = unit(cylinder_unit())
    a_b = math.pi / 4 * 0.200**2
    # A cylinder pair holds (A_bore + A_annulus) x stroke: x_1 + x_2 = stroke.
    assert physics.actuator_oil_volume(cyl) == pytest.approx((2 * a_b - math.pi / 4 * 0.140**2) * 0.450, rel=1e-12)
    vane = unit(vane_unit())
    assert physics.actuator_oil_volume(vane) == pytest.approx(math.pi * (0.450**2 - 0.250**2) * 0.450, rel=1e-12)
    assert physics.actuation(vane).torque(0.3, P) == pytest.approx(physics.vane_actuation(VANE).torque(0, P), rel=1e-12)


def _pair_oil_by_positions(area: float, stroke: float, xs) -> list[float]:
    """Oil in a ram pair, ram 1 out by x from mid-stroke and ram 2 in by x, at each x (clearances nil)."""
    return [area * (stroke / 2 + x) + area * (stroke / 2 - x) for x in xs]


@pytest.mark.parametrize("count", [2, 4])
def test_ram_pairs_hold_area_times_stroke_each(count):
    # Rapson slide pairs: two plungers on one crosshead. Summed over positions by hand, each pair
    # holds A x stroke at every position, so a 4-ram gear (two pairs) holds 2 A s, not 4 A s.
    area = math.pi / 4 * 0.280**2
    by_positions = _pair_oil_by_positions(area, 0.900, [-0.4, -0.1, 0.0, 0.25, 0.45])
    assert max(by_positions) == pytest.approx(min(by_positions)) == pytest.approx(area * 0.900)
    u = unit(ram_unit(count=count))
    assert physics.actuator_oil_volume(u) == pytest.approx(count / 2 * by_positions[0], rel=1e-12)


def test_non_steering_cylinders_hold_at_most_the_full_bore():
    # Hatch cylinders all run out together: fully out, each holds A_bore x stroke, annulus empty.
    hatch = unit(cylinder_unit(service="hatch_cover", count=8, tiller_radius=None, max_rudder_angle=None))
    assert physics.actuator_oil_volume(hatch) == pytest.approx(8 * math.pi / 4 * 0.200**2 * 0.450, rel=1e-12)


def test_rotary_vane_oil_less_the_vanes():
    # Annulus pi (R^2 - r^2) h less 2n vanes of 30 deg each: (360 - 4 x 30)/360 of the annulus.
    v = unit(vane_unit(vane_angle="30 deg"))
    annulus = math.pi * (0.450**2 - 0.250**2) * 0.450
    assert physics.actuator_oil_volume(v) == pytest.approx(annulus * 240 / 360, rel=1e-12)


def test_reachable_angle_of_a_short_stroke():
    # Rapson slide: x = R tan(theta) each side, so a stroke s reaches atan(s / 2R).
    reach = physics.reachable_angle(lambda th: physics.ram_travel(0.600, th), 0.800, math.radians(35))
    assert reach == pytest.approx(math.atan(0.800 / 1.200), abs=1e-9)
    assert physics.reachable_angle(lambda th: physics.ram_travel(0.600, th), 0.900, math.radians(35)) == math.radians(35)


@pytest.mark.parametrize(("vanes", "vane_angle", "free"), [(2, 0, 180), (3, 20, 80), (5, 0, 72), (6, 0, 60)])
def test_vane_free_swing(vanes, vane_angle, free):
    # Between two fixed vanes 360/n deg; less the fixed and the moving vane's own angles.
    g = VaneGeometry(vanes, 0.4, 1.0, 0.6, 0.4, math.radians(vane_angle))
    assert math.degrees(physics.vane_free_swing(g)) == pytest.approx(free)
