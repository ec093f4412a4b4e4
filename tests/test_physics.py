# SPDX-License-Identifier: MIT
"""Torque, swept oil and swing time, each worked by hand here from the formula's source."""

from __future__ import annotations

import math

import pytest

from engine_helpers import cylinder_unit, ram_unit, unit, vane_unit, vessel
from kit import physics
from kit.checks import check_unit
from kit.particulars import CylinderGeometry, RamGeometry, VaneGeometry
from kit.spares import load_policy

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
    assert physics.actuator_oil_volume(ram) == pytest.approx(2 * math.pi / 4 * 0.280**2 * 0.900, rel=1e-12)
    cyl = unit(cylinder_unit())
    a_b = math.pi / 4 * 0.200**2
    assert physics.actuator_oil_volume(cyl) == pytest.approx(2 * (2 * a_b - math.pi / 4 * 0.140**2) * 0.450, rel=1e-12)
    vane = unit(vane_unit())
    assert physics.actuator_oil_volume(vane) == pytest.approx(math.pi * (0.450**2 - 0.250**2) * 0.450, rel=1e-12)
    assert physics.actuation(vane).torque(0.3, P) == pytest.approx(physics.vane_actuation(VANE).torque(0, P), rel=1e-12)
