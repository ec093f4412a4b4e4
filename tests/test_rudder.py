# SPDX-License-Identifier: MIT
"""Rudder force and torque by the classification-rule formula, worked by hand.

C_R = 132 K1 K2 K3 A V^2 [N], Q_R = C_R c (alpha - k): IACS UR S10.2 (from memory for 132, K1, K2,
K3, the speed floors and the 0.1 c minimum lever); alpha 0.33 ahead and 0.66 astern confirmed from
the Iranian Classification Society's guidance for large yachts, part 6, section 3, table 4.1.4.
"""

from __future__ import annotations

import math

import pytest

from engine_helpers import ram_unit, vessel
from kit.engine import rudder
from kit.engine.checks import check_unit
from kit.errors import InputError
from kit.files.policy_file import load_policy

KN = 1852 / 3600
RUDDER = {"area": "20 m^2", "mean_height": "6 m", "area_forward": "4 m^2", "ahead_speed": "15 kn",
          "profile": "naca", "position": "propeller_jet"}


def test_rudder_torque_ahead_and_astern_by_hand():
    # Lambda = 6^2 / 20 = 1.8, K1 = (1.8 + 2) / 3 = 1.266667; NACA K2 = 1.1 ahead, 0.8 astern; K3 = 1.0.
    # Ahead, 15 kn: C_R = 132 x 1.266667 x 1.1 x 1.0 x 20 x 225 = 827,640 N;
    #   c = 20 / 6 = 3.3333 m, k = 4 / 20 = 0.2, r = 3.3333 (0.33 - 0.2) = 0.43333 m -> Q = 358.64 kNm.
    # Astern, 0.5 x 15 = 7.5 kn: C_R = 132 x 1.266667 x 0.8 x 20 x 56.25 = 150,480 N;
    #   r = 3.3333 (0.66 - 0.2) = 1.53333 m -> Q = 230.74 kNm.
    load = rudder.rudder_load(rudder.Rudder(20.0, 6.0, 4.0, 15 * KN, "naca", "propeller_jet"))
    assert load.force_ahead == pytest.approx(827_640, rel=1e-5)
    assert load.force_astern == pytest.approx(150_480, rel=1e-5)
    assert load.torque_ahead / 1e3 == pytest.approx(358.64, abs=0.01)
    assert load.torque_astern / 1e3 == pytest.approx(230.74, abs=0.01)
    assert (load.speed_ahead_kn, load.speed_astern_kn) == pytest.approx((15.0, 7.5), rel=1e-12)


def test_low_speed_floor_aspect_cap_and_minimum_lever_by_hand():
    # V0 = 8 kn < 10 kn: V = (8 + 20) / 3 = 9.3333 kn; astern 0.5 x 8 = 4 kn.
    # b = 8 m, A = 20 m^2: Lambda = 3.2, capped at 2 -> K1 = 4/3. Outside the jet K3 = 0.8; single plate K2 = 1.0.
    # k = 6 / 20 = 0.3: c (0.33 - 0.3) = 0.075 m is below 0.1 c = 0.25 m, so r ahead = 0.25 m.
    # C_R ahead = 132 x 4/3 x 1.0 x 0.8 x 20 x 87.111 = 245,333 N -> Q = 61.33 kNm.
    r = rudder.Rudder(20.0, 8.0, 6.0, 8 * KN, "single_plate", "outside_jet")
    load = rudder.rudder_load(r)
    assert load.speed_ahead_kn == pytest.approx(28 / 3, rel=1e-12)
    assert load.speed_astern_kn == pytest.approx(4.0, rel=1e-12)
    assert rudder.aspect_factor(r) == pytest.approx(4 / 3, rel=1e-12)
    assert rudder.lever(r, "ahead") == pytest.approx(0.25, rel=1e-12)
    assert load.torque_ahead / 1e3 == pytest.approx(61.33, abs=0.01)


def test_gear_against_the_rudder_margin_and_shortfall():
    # Gear: 2 rams of 280 mm on R 0.6 m at 160 bar, 35 deg: T = 1 x 160e5 x 0.061575 x 0.6 / cos^2 35 = 880.9 kNm.
    t35 = 160e5 * math.pi / 4 * 0.280**2 * 0.600 / math.cos(math.radians(35)) ** 2
    assert t35 / 1e3 == pytest.approx(880.9, abs=0.1)
    v = vessel(ram_unit(rudder=RUDDER))
    c = check_unit(v.units[0], v, load_policy())
    assert c.gear_torque_35 == pytest.approx(t35, rel=1e-12)
    assert c.rudder_margin == pytest.approx(t35 / c.rudder_load.torque_ahead - 1, rel=1e-12)
    assert not any("the gear is short" in w for w in c.warnings)
    # At 25 kn ahead the rudder torque is 358.64 x (25/15)^2 = 996.2 kNm: the gear is short.
    fast = vessel(ram_unit(rudder={**RUDDER, "ahead_speed": "25 kn"}))
    c = check_unit(fast.units[0], fast, load_policy())
    assert c.rudder_load.torque_ahead / 1e3 == pytest.approx(358.64 * (25 / 15) ** 2, abs=0.05)
    assert c.rudder_margin < 0
    assert any(w.startswith("the gear is short: 880.9 kNm at 35 deg and 160 bar") for w in c.warnings)


def test_carrier_inspection_line():
    v = vessel(ram_unit())
    c = check_unit(v.units[0], v, load_policy())
    assert c.inspections == ["separate rudder carrier bearing: wear-down measured at each dry-docking and recorded "
                             "against the maker's limit (common practice)"]


def test_unknown_profile_is_refused():
    with pytest.raises(InputError, match=r"unit\[0\]\.rudder\.profile: expected one of naca, flat_side"):
        vessel(ram_unit(rudder={**RUDDER, "profile": "banana"}))


def test_rudder_carrier_in_actuator_refused_for_a_ram():
    with pytest.raises(InputError, match=r"unit\[0\]\.rudder_carrier: expected one of separate \(got 'in_actuator'\)"):
        vessel(ram_unit(rudder_carrier="in_actuator"))
