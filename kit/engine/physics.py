# SPDX-License-Identifier: MIT
"""Steering gear physics: torque at the relief setting, oil swept, swing time, ram travel.

All inputs and outputs in SI (Pa, m, m^2, m^3, m^3/s, rad, N m, s).

Torque is the work the oil does per radian of rudder movement, T = p dV/dtheta, so each
actuator's torque and the oil its pressurised chambers take come from one displacement
function x(theta):

* Ram gear with a Rapson slide: the ram moves x = R tan(theta) (R the tiller radius at
  midships), k = count / 2 rams are pressurised at once, so V(theta) = k A R tan(theta) and
  T(theta) = k p A R / cos^2(theta).
* Rotary vane: each of the ``vanes`` pressurised chambers sweeps h (R^2 - r^2) / 2 per radian
  (R = housing bore / 2, r = hub / 2), so T = p vanes h (R^2 - r^2) / 2 at every angle.
* Trunnion cylinders: each cylinder is pinned to the tiller at radius R and swings on its
  trunnion; of every pair one cylinder pushes on its full bore and the other pulls on its
  annulus. With the trunnion position known (``trunnion_distance`` a, see below) kit uses the
  exact geometry. Without it kit takes the cylinder long against the tiller (its axis keeps its
  midships direction): the piston moves x = R sin(theta), so
  V(theta) = (count / 2) (A_bore + A_annulus) R sin(theta) and
  T(theta) = (count / 2) p (A_bore + A_annulus) R cos(theta), and says so in a warning.

Exact trunnion geometry (virtual work)
--------------------------------------
Put the stock axis at the origin and the tiller along x at midships, the tiller pin at
P(theta) = R (cos theta, sin theta). The cylinder axis is square to the tiller at midships, so
the trunnion of the cylinder that extends for positive theta sits at Q = (R, -a), a the distance
from trunnion axis to tiller pin at midships. The pin-to-trunnion length is

    L(theta)^2 = (R cos theta - R)^2 + (R sin theta + a)^2
               = a^2 + 2 R^2 (1 - cos theta) + 2 a R sin theta,
    dL/dtheta  = R (R sin theta + a cos theta) / L(theta).

The pair's other cylinder is the mirror image (on the opposite tiller arm, or on the same arm
from the other side): its length is L(-theta), and it shortens as theta grows. Moving in the
direction of positive theta, the first cylinder pushes with p on A_bore over dL(theta) and the
second pulls with p on A_annulus over -d[L(-theta)] = L'(-theta) dtheta. Virtual work,
T dtheta = p dV, gives per pair

    T+(theta) = p [A_bore L'(theta) + A_annulus L'(-theta)],

and the oil the pressurised chambers take from theta1 to theta2 is
V(theta2) - V(theta1) with V(theta) = A_bore (L(theta) - a) - A_annulus (L(-theta) - a).
Moving the other way the roles swap: T-(theta) = T+(-theta). At the hard-over angle the gear
holds the rudder with the smaller of the two, so ``torque_knm.max_angle`` is the least of
T+(theta_max) and T+(-theta_max). Each cylinder travels L(theta_max) - L(-theta_max) between
hard-over angles. As a grows, L -> a + R sin theta and both results tend to the long-cylinder
approximation above.

Swing time from angle a one side to angle b the other side is the oil taken,
V(b) - V(-a), over the delivered flow; every V here is measured from midships.

References
----------
Rapson slide torque and the 1/cos^2 law: any marine engineering text on steering gear, e.g.
D. A. Taylor, Introduction to Marine Engineering, 2nd ed., ch. 12 (from memory).
T = p dV/dtheta: conservation of energy for an ideal (lossless) actuator.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Callable

from kit.engine.particulars import CylinderGeometry, RamGeometry, Unit, VaneGeometry
from kit.engine.series import circle_area


@dataclass(frozen=True)
class Actuation:
    """How an actuator turns the rudder: displaced volume V(theta) and torque T(theta, p)."""

    volume: Callable[[float], float]
    torque: Callable[[float, float], float]


def ram_actuation(g: RamGeometry, count: int) -> Actuation:
    """Rapson slide: V = k A R tan(theta), T = k p A R / cos^2(theta), k = count / 2."""
    k = count / 2
    a = circle_area(g.ram_diameter)
    r = g.tiller_radius
    return Actuation(lambda th: k * a * r * math.tan(th), lambda th, p: k * p * a * r / math.cos(th) ** 2)


def vane_swept_per_radian(g: VaneGeometry) -> float:
    """Volume the pressurised chambers take per radian: vanes h (R^2 - r^2) / 2 [m^3/rad]."""
    big_r, small_r = g.housing_bore / 2, g.hub_diameter / 2
    return g.vanes * g.vane_height * (big_r**2 - small_r**2) / 2


def vane_actuation(g: VaneGeometry) -> Actuation:
    """Rotary vane: V = vanes h (R^2 - r^2) / 2 x theta, T = p vanes h (R^2 - r^2) / 2."""
    q = vane_swept_per_radian(g)
    return Actuation(lambda th: q * th, lambda th, p: p * q)


def cylinder_actuation(g: CylinderGeometry, count: int) -> Actuation:
    """Trunnion cylinders in pairs: the exact geometry when the trunnion position is given, else the
    long-cylinder approximation V = n (A_b + A_a) R sin(theta), T = n p (A_b + A_a) R cos(theta)."""
    if g.trunnion_distance is not None:
        return trunnion_actuation(g, count)
    n = count / 2
    area = circle_area(g.bore) + (circle_area(g.bore) - circle_area(g.rod))
    r = g.tiller_radius
    return Actuation(lambda th: n * area * r * math.sin(th), lambda th, p: n * p * area * r * math.cos(th))


def trunnion_length(g: CylinderGeometry, theta: float) -> float:
    """Pin-to-trunnion length L(theta) = sqrt(a^2 + 2 R^2 (1 - cos theta) + 2 a R sin theta) [m]
    (module docstring: exact trunnion geometry)."""
    a, r = g.trunnion_distance, g.tiller_radius
    return math.sqrt(a * a + 2 * r * r * (1 - math.cos(theta)) + 2 * a * r * math.sin(theta))


def trunnion_rate(g: CylinderGeometry, theta: float) -> float:
    """dL/dtheta = R (R sin theta + a cos theta) / L(theta) [m/rad]."""
    a, r = g.trunnion_distance, g.tiller_radius
    return r * (r * math.sin(theta) + a * math.cos(theta)) / trunnion_length(g, theta)


def trunnion_actuation(g: CylinderGeometry, count: int) -> Actuation:
    """Exact trunnion pairs by virtual work: T+ = n p [A_b L'(theta) + A_a L'(-theta)],
    V = n [A_b (L(theta) - a) - A_a (L(-theta) - a)], n = count / 2 (module docstring)."""
    n = count / 2
    a_b = circle_area(g.bore)
    a_a = a_b - circle_area(g.rod)
    a = g.trunnion_distance

    def volume(th: float) -> float:
        return n * (a_b * (trunnion_length(g, th) - a) - a_a * (trunnion_length(g, -th) - a))

    def torque(th: float, p: float) -> float:
        return n * p * (a_b * trunnion_rate(g, th) + a_a * trunnion_rate(g, -th))

    return Actuation(volume, torque)


def actuation(unit: Unit) -> Actuation:
    g = unit.geometry
    if isinstance(g, RamGeometry):
        return ram_actuation(g, unit.count)
    if isinstance(g, VaneGeometry):
        return vane_actuation(g)
    return cylinder_actuation(g, unit.count)


def swing_volume(act: Actuation, from_angle: float, to_angle: float) -> float:
    """Oil [m^3] the pressurised chambers take to swing from ``from_angle`` one side to ``to_angle`` the other:
    V(to) - V(-from), V measured from midships (for the symmetric actuators V(to) + V(from))."""
    return act.volume(to_angle) - act.volume(-from_angle)


def least_torque(act: Actuation, angle: float, pressure: float) -> float:
    """The smaller torque [N m] at ``angle`` of the two directions of motion: T+(angle) and
    T-(angle) = T+(-angle) (equal for the symmetric actuators; not for exact trunnion pairs)."""
    return min(act.torque(angle, pressure), act.torque(-angle, pressure))


def swing_time(volume: float, flow: float) -> float:
    """Time [s] to deliver ``volume`` [m^3] at ``flow`` [m^3/s]."""
    return volume / flow


def ram_travel(tiller_radius: float, max_angle: float) -> float:
    """Total ram travel 2 R tan(theta_max) of a Rapson slide between hard-over angles [m]."""
    return 2 * tiller_radius * math.tan(max_angle)


def cylinder_travel(tiller_radius: float, max_angle: float) -> float:
    """Total piston travel 2 R sin(theta_max) of a trunnion cylinder between hard-over angles [m]
    (long-cylinder approximation)."""
    return 2 * tiller_radius * math.sin(max_angle)


def trunnion_travel(g: CylinderGeometry, max_angle: float) -> float:
    """Total piston travel L(theta_max) - L(-theta_max) of a trunnion cylinder between hard-over
    angles [m], exact geometry (module docstring)."""
    return trunnion_length(g, max_angle) - trunnion_length(g, -max_angle)


def reachable_angle(travel: Callable[[float], float], stroke: float, max_angle: float) -> float:
    """The largest rudder angle [rad], up to ``max_angle``, whose travel between that angle each side
    fits the stroke: ``travel(theta)`` is the total travel from theta one side to theta the other
    (rising with theta), found by bisection so that any travel law will do.

    >>> round(math.degrees(reachable_angle(lambda th: ram_travel(0.5, th), 0.6, math.radians(35))), 2)
    30.96
    """
    if travel(max_angle) <= stroke:
        return max_angle
    low, high = 0.0, max_angle
    for _ in range(60):
        mid = (low + high) / 2
        low, high = (mid, high) if travel(mid) <= stroke else (low, mid)
    return low


def vane_free_swing(g: VaneGeometry) -> float:
    """The most a moving vane can swing [rad] between its two fixed vanes: 2 pi / n - 2 beta.

    n moving vanes and as many fixed vanes share the annulus: between two fixed vanes there is
    2 pi / n of it; the fixed vane takes up beta of that and the moving vane in the chamber another
    beta (``vane_angle``, each vane's angle around the stock axis), so the moving vane swings at
    most 2 pi / n - 2 beta. Without ``vane_angle``, beta = 0 and the figure is an upper bound.

    >>> round(math.degrees(vane_free_swing(VaneGeometry(3, 0.3, 1.0, 0.6, 0.4, math.radians(20)))), 6)
    80.0
    """
    return 2 * math.pi / g.vanes - 2 * (g.vane_angle or 0.0)


def actuator_oil_volume(unit: Unit) -> float:
    """Oil [m^3] the actuators hold, by their real geometry (clearance volumes, which the
    particulars do not give, left out).

    * Steering rams work in pairs on one crosshead or Rapson slide: as one ram comes out of its
      cylinder by x the other goes in by x, so the pair holds c + A (s/2 + x) + c + A (s/2 - x)
      = A s + 2c at every position. A 4-ram gear is two pairs: (count / 2) A s in all.
    * Steering cylinders in pairs, one pushing while the other pulls: a cylinder holds
      A_b x + A_a (s - x) at extension x, and over the pair x_1 + x_2 = s (to first order in the
      angle: one extends as the other retracts), so a pair holds (A_b + A_a) s. The second-order
      rest, A_rod times the change in x_1 + x_2, goes to and from the reservoir.
    * Rams and cylinders of other services may all move out together: the most they hold is
      count A s (rams) or count A_b s (cylinders fully out, annulus empty).
    * Rotary vane: the annulus pi (R^2 - r^2) h less the 2n vanes, each taking
      beta (R^2 - r^2) h / 2 (``vane_angle`` beta): (2 pi - 2 n beta) (R^2 - r^2) h / 2; full at
      every rudder angle. Without ``vane_angle``, the whole annulus (an upper estimate).
    """
    g = unit.geometry
    sets = unit.count / 2 if unit.is_steering else unit.count
    if isinstance(g, RamGeometry):
        return sets * circle_area(g.ram_diameter) * g.stroke
    if isinstance(g, CylinderGeometry):
        full, annulus = circle_area(g.bore), circle_area(g.bore) - circle_area(g.rod)
        return sets * ((full + annulus) if unit.is_steering else full) * g.stroke
    ring = (g.housing_bore / 2) ** 2 - (g.hub_diameter / 2) ** 2
    return (2 * math.pi - 2 * g.vanes * (g.vane_angle or 0.0)) * ring * g.vane_height / 2
