# SPDX-License-Identifier: MIT
"""Rudder force and torque by the classification-rule formula, to hold the gear's torque against.

All inputs and outputs in SI (m, m^2, m/s, N, N m) except inside the rule formula, which is
written for the speed in knots and gives newtons.

The formula (IACS UR S10 "Rudders, sole pieces and rudder horns", S10.2; the class societies'
rules carry the same):

    C_R = 132 K1 K2 K3 A V^2                  rudder force [N], A [m^2], V [kn]
    Q_R = C_R r,   r = c (alpha - k)          rudder torque [N m]

* K1 = (Lambda + 2) / 3, Lambda = b^2 / A_t the aspect ratio, not taken above 2; b the mean
  height of the rudder, A_t the rudder area plus any rudder horn area within b (kit takes A_t = A:
  the particulars have no rudder horn).
* K2 from the rudder profile, one figure ahead and one astern (``PROFILE_K2``).
* K3 = 0.8 for rudders outside the propeller jet, 1.15 behind a fixed propeller nozzle, 1.0
  otherwise (``POSITION_K3``).
* V = V0, the maximum ahead service speed at the summer load waterline; when V0 < 10 kn,
  V = (V0 + 20) / 3. Astern, V = the maximum astern speed, not below 0.5 V0.
* c = A / b the mean breadth; k = A_f / A, A_f the rudder area forward of the stock axis;
  alpha = 0.33 ahead and 0.66 astern (rudders not behind a fixed structure); ahead, r is not taken
  below 0.1 c.

Provenance of the coefficients: alpha (0.33 ahead, 0.66 astern) and r = c (alpha - k) confirmed
from a public copy of a class society's rules (Iranian Classification Society, Guidance for large
yachts, part 6, section 3, 301 "Rudder torque" and table 4.1.4); 132, K1, K2, K3, the speed floors
and the minimum lever 0.1 c are from memory of IACS UR S10.
"""

from __future__ import annotations

from dataclasses import dataclass

KNOT_M_S = 1852 / 3600  # 1 kn = 1 nautical mile (1852 m) an hour

RULE_CONSTANT = 132.0  # N / (m^2 kn^2), IACS UR S10.2.1 (from memory)
ASPECT_RATIO_CAP = 2.0  # Lambda not taken above 2 (from memory)
LOW_SPEED_KN = 10.0  # below it V = (V0 + 20) / 3 (from memory)
ASTERN_SPEED_FRACTION = 0.5  # astern speed not below 0.5 V0 (from memory)
ALPHA = {"ahead": 0.33, "astern": 0.66}  # confirmed: ICS guidance for large yachts, table 4.1.4
MIN_LEVER_AHEAD = 0.1  # r ahead not below 0.1 c (from memory)

# Rudder profile -> (K2 ahead, K2 astern), IACS UR S10 table 1 (from memory). A high-lift
# rudder astern is "to be specially considered"; 1.3 is the figure used when none is known.
PROFILE_K2: dict[str, tuple[float, float]] = {
    "naca": (1.10, 0.80),  # NACA-00 series and Goettingen profiles
    "flat_side": (1.10, 0.90),
    "mixed": (1.21, 0.90),  # e.g. HSVA profiles
    "hollow": (1.35, 0.90),
    "high_lift": (1.70, 1.30),
    "fish_tail": (1.40, 0.80),
    "single_plate": (1.00, 1.00),
}

# Rudder position -> K3, IACS UR S10.2.1 (from memory).
POSITION_K3: dict[str, float] = {
    "outside_jet": 0.8,  # outside the propeller jet
    "propeller_jet": 1.0,  # behind a propeller (in its jet)
    "behind_nozzle": 1.15,  # behind a fixed propeller nozzle
}


@dataclass(frozen=True)
class Rudder:
    """A rudder's particulars: area A, mean height b, area forward of the stock axis A_f,
    maximum ahead service speed V0 (and optionally the maximum astern speed), profile, position."""

    area: float  # m^2
    mean_height: float  # m
    area_forward: float  # m^2
    ahead_speed: float  # m/s
    profile: str
    position: str
    astern_speed: float | None = None  # m/s


@dataclass(frozen=True)
class RudderLoad:
    """Rudder force [N] and torque [N m] ahead and astern, with the speeds [kn] used."""

    force_ahead: float
    force_astern: float
    torque_ahead: float
    torque_astern: float
    speed_ahead_kn: float
    speed_astern_kn: float

    @property
    def torque(self) -> float:
        """The larger of the ahead and astern torques: what the gear must overcome."""
        return max(self.torque_ahead, self.torque_astern)


def design_speeds_kn(rudder: Rudder) -> tuple[float, float]:
    """(ahead, astern) speeds [kn] with the rule's floors: V = (V0 + 20) / 3 when V0 < 10 kn;
    astern the maximum astern speed, not below 0.5 V0 (module docstring)."""
    v0 = rudder.ahead_speed / KNOT_M_S
    ahead = (v0 + 20) / 3 if v0 < LOW_SPEED_KN else v0
    stated_astern = (rudder.astern_speed or 0.0) / KNOT_M_S
    return ahead, max(stated_astern, ASTERN_SPEED_FRACTION * v0)


def aspect_factor(rudder: Rudder) -> float:
    """K1 = (Lambda + 2) / 3, Lambda = b^2 / A not taken above 2."""
    aspect = min(rudder.mean_height**2 / rudder.area, ASPECT_RATIO_CAP)
    return (aspect + 2) / 3


def rudder_force(rudder: Rudder, speed_kn: float, k2: float) -> float:
    """C_R = 132 K1 K2 K3 A V^2 [N], V in knots."""
    return RULE_CONSTANT * aspect_factor(rudder) * k2 * POSITION_K3[rudder.position] * rudder.area * speed_kn**2


def lever(rudder: Rudder, course: str) -> float:
    """r = c (alpha - k) [m], c = A / b, k = A_f / A; ahead not below 0.1 c."""
    c = rudder.area / rudder.mean_height
    r = c * (ALPHA[course] - rudder.area_forward / rudder.area)
    return max(r, MIN_LEVER_AHEAD * c) if course == "ahead" else r


def rudder_load(rudder: Rudder) -> RudderLoad:
    """Force and torque of ``rudder`` ahead and astern by the rule formula (module docstring)."""
    v_ahead, v_astern = design_speeds_kn(rudder)
    k2_ahead, k2_astern = PROFILE_K2[rudder.profile]
    f_ahead = rudder_force(rudder, v_ahead, k2_ahead)
    f_astern = rudder_force(rudder, v_astern, k2_astern)
    return RudderLoad(f_ahead, f_astern, f_ahead * lever(rudder, "ahead"), f_astern * lever(rudder, "astern"),
                      v_ahead, v_astern)
