# SPDX-License-Identifier: MIT
"""Trunnion cylinders, exact geometry: against a numerical derivative of the pin-to-trunnion
length taken from coordinates here (not the code's closed form), and a hand-worked example."""

from __future__ import annotations

import math

import pytest

from engine_helpers import cylinder_unit, vessel
from kit.engine import physics
from kit.engine.checks import APPROXIMATION_WARNING, check_unit
from kit.errors import InputError
from kit.engine.particulars import CylinderGeometry
from kit.files.policy_file import load_policy

R, A = 0.280, 1.000  # tiller radius, trunnion axis to tiller pin at midships [m]
GEOM = CylinderGeometry(bore=0.200, rod=0.140, stroke=0.450, tiller_radius=R, trunnion_distance=A)
A_BORE = math.pi / 4 * 0.200**2
A_ANNULUS = A_BORE - math.pi / 4 * 0.140**2
P = 125e5


def pin_to_trunnion(theta: float) -> tuple[float, float]:
    """Lengths of the pair's two cylinders from coordinates: stock axis at the origin, tiller along
    x at midships, each cylinder square to the tiller at midships. Cylinder 1 on the arm at +R with
    its trunnion at (R, -a); cylinder 2 on the opposite arm at -R with its trunnion at (-R, -a)."""
    pin1 = (R * math.cos(theta), R * math.sin(theta))
    pin2 = (-R * math.cos(theta), -R * math.sin(theta))
    return math.hypot(pin1[0] - R, pin1[1] + A), math.hypot(pin2[0] + R, pin2[1] + A)


def virtual_work_torques(theta: float, h: float = 1e-6) -> tuple[float, float]:
    """(T+, T-) per pair by virtual work with central differences of the lengths: moving +theta,
    cylinder 1 extends on the full bore and cylinder 2 retracts on the annulus; moving -theta, the
    other way round."""
    up, down = pin_to_trunnion(theta + h), pin_to_trunnion(theta - h)
    d1, d2 = (up[0] - down[0]) / (2 * h), (up[1] - down[1]) / (2 * h)
    return P * (A_BORE * d1 - A_ANNULUS * d2), P * (-A_BORE * d2 + A_ANNULUS * d1)


@pytest.mark.parametrize("degrees", [-35, -20, -5, 0, 5, 20, 30, 35])
def test_torque_against_numerical_derivative_of_pin_to_trunnion_length(degrees):
    # Virtual work: T dtheta = p dV for a lossless actuator.
    th = math.radians(degrees)
    act = physics.trunnion_actuation(GEOM, 2)
    plus, minus = virtual_work_torques(th)
    assert act.torque(th, P) == pytest.approx(plus, rel=1e-7)
    assert act.torque(-th, P) == pytest.approx(minus, rel=1e-7)  # T-(theta) = T+(-theta) by mirror symmetry


def test_lengths_and_travel_against_coordinates():
    for degrees in (-35, 0, 17, 35):
        th = math.radians(degrees)
        l1, l2 = pin_to_trunnion(th)
        assert physics.trunnion_length(GEOM, th) == pytest.approx(l1, rel=1e-12)
        assert physics.trunnion_length(GEOM, -th) == pytest.approx(l2, rel=1e-12)
    th = math.radians(35)
    assert physics.trunnion_travel(GEOM, th) == pytest.approx(pin_to_trunnion(th)[0] - pin_to_trunnion(-th)[0], rel=1e-12)


def test_swing_oil_against_coordinates():
    # Oil for 35 deg one side to 30 deg the other: bore side of cylinder 1 from -35 to +30 deg,
    # annulus side of cylinder 2 over the same swing.
    a, b = math.radians(35), math.radians(30)
    l1a, l2a = pin_to_trunnion(-a)
    l1b, l2b = pin_to_trunnion(b)
    expected = A_BORE * (l1b - l1a) + A_ANNULUS * (l2a - l2b)
    assert physics.swing_volume(physics.trunnion_actuation(GEOM, 2), a, b) == pytest.approx(expected, rel=1e-12)


def test_hand_worked_example_at_35_degrees():
    # Worked by hand (sin 35 = 0.573576, cos 35 = 0.819152), R = 0.28 m, a = 1.0 m:
    # L(+35)^2 = 1 + 2 (0.0784)(0.180848) + 2 (0.28)(0.573576) = 1.349560 -> L = 1.161705 m
    # L(-35)^2 = 1 + 0.028357 - 0.321203 = 0.707154           -> L = 0.840925 m
    # travel = 1.161705 - 0.840925 = 0.320780 m (long-cylinder: 2 R sin 35 = 0.321203 m)
    # L'(+35) = 0.28 (0.28 x 0.573576 + 0.819152) / 1.161705 = 0.236144
    # L'(-35) = 0.28 (-0.160601 + 0.819152) / 0.840925 = 0.219275
    # A_b = 0.0314159 m^2, A_a = 0.0160221 m^2, p = 125 bar:
    # T+ = 125e5 (0.0314159 x 0.236144 + 0.0160221 x 0.219275) = 136.65 kNm
    # T- = 125e5 (0.0314159 x 0.219275 + 0.0160221 x 0.236144) = 133.40 kNm
    th = math.radians(35)
    act = physics.trunnion_actuation(GEOM, 2)
    assert physics.trunnion_length(GEOM, th) == pytest.approx(1.161705, abs=2e-6)
    assert physics.trunnion_length(GEOM, -th) == pytest.approx(0.840925, abs=2e-6)
    assert physics.trunnion_travel(GEOM, th) == pytest.approx(0.320780, abs=3e-6)
    assert act.torque(th, P) / 1e3 == pytest.approx(136.65, abs=0.01)
    assert act.torque(-th, P) / 1e3 == pytest.approx(133.40, abs=0.01)


def test_check_reports_least_torque_exact_travel_and_basis():
    v = vessel(cylinder_unit(trunnion_distance="1000 mm"))
    c = check_unit(v.units[0], v, load_policy())
    th = math.radians(35)
    assert c.torque_max_angle == pytest.approx(min(virtual_work_torques(th)), rel=1e-7)
    assert c.travel == pytest.approx(pin_to_trunnion(th)[0] - pin_to_trunnion(-th)[0], rel=1e-12)
    assert "exact geometry" in c.torque_basis
    assert APPROXIMATION_WARNING not in c.warnings


def test_without_trunnion_distance_the_approximation_is_kept_and_warned():
    v = vessel(cylinder_unit())
    c = check_unit(v.units[0], v, load_policy())
    th = math.radians(35)
    assert c.torque_max_angle == pytest.approx(P * (A_BORE + A_ANNULUS) * R * math.cos(th), rel=1e-12)
    assert APPROXIMATION_WARNING in c.warnings
    assert "long-cylinder approximation" in c.torque_basis


def test_long_cylinders_tend_to_the_approximation():
    # As a grows, L -> a + R sin(theta): both directions tend to n p (A_b + A_a) R cos(theta).
    far = CylinderGeometry(0.200, 0.140, 0.450, R, 1000.0)
    act = physics.trunnion_actuation(far, 2)
    th = math.radians(35)
    assert act.torque(th, P) == pytest.approx(P * (A_BORE + A_ANNULUS) * R * math.cos(th), rel=1e-3)
    assert act.torque(-th, P) == pytest.approx(P * (A_BORE + A_ANNULUS) * R * math.cos(th), rel=1e-3)


def test_trunnion_distance_shorter_than_half_the_stroke_is_refused():
    with pytest.raises(InputError, match=r"unit\[0\]\.trunnion_distance: expected a trunnion distance longer than half the stroke"):
        vessel(cylinder_unit(trunnion_distance="200 mm"))
