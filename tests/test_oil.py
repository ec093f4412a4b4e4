# SPDX-License-Identifier: MIT
"""Oil: pipe volumes against the fluids library, system charge, packages, grades and conversions."""

from __future__ import annotations

import math

import pint
import pytest
from fluids.piping import nearest_pipe

from engine_helpers import ram_unit, unit
from kit.engine import display_units, oil, solas
from kit.engine.oil import Package, plan_packages
from kit.engine.oil_grades import ISO_3448_GRADES, density_kg_per_l, viscosity_limits
from kit.engine.particulars import Pipe

UREG = pint.UnitRegistry()  # an independent registry, to check kit's figures against
PAIL, DRUM, IBC = Package("pail", 0.020), Package("drum", 0.208), Package("IBC", 1.000)


@pytest.mark.parametrize("nps", [0.5, 1, 1.5, 2, 3, 4])
def test_pipe_volume_against_fluids(nps):
    # ASME B36.10M schedule 40 dimensions, as the fluids library tabulates them.
    _, di, do, t = nearest_pipe(NPS=nps, schedule="40")
    length = 12.5
    assert oil.pipe_volume(Pipe(do, t, length)) == pytest.approx(math.pi / 4 * di**2 * length, rel=1e-9)


def test_system_charge_stated_wins():
    u = unit(ram_unit(system_oil="500 L"))
    assert oil.system_charge(u) == (pytest.approx(0.500), "stated")


def test_system_charge_from_parts():
    u = unit(ram_unit(reservoir="300 L", pipe=[{"outside_diameter": "33.4 mm", "wall": "3.38 mm", "length": "24 m"}]))
    rams = math.pi / 4 * 0.280**2 * 0.900  # one ram pair holds A x stroke (kit.engine.physics.actuator_oil_volume)
    pipe = math.pi / 4 * (0.0334 - 2 * 0.00338) ** 2 * 24
    charge, basis = oil.system_charge(u)
    assert charge == pytest.approx(0.300 + rams + pipe, rel=1e-9)
    assert basis == "reservoir + actuators + pipes"
    assert oil.system_charge(unit(ram_unit()))[1] == "reservoir + actuators (no pipes given)"


def test_storage_tank_is_the_system_charge():
    # SOLAS II-1/29.12.3: one power actuating system including its reservoir.
    u = unit(ram_unit(system_oil="450 L"))
    assert solas.storage_tank_minimum(oil.system_charge(u)[0]) == pytest.approx(0.450)


def test_top_up():
    assert oil.top_up(0.5e-3 / 86400, 90) == pytest.approx(0.045, rel=1e-12)  # 0.5 L/day for 90 days
    assert oil.top_up(None, 90) == 0.0


def test_410_litres_is_two_drums():
    plan = plan_packages(0.410, [PAIL, DRUM])
    assert [(p.name, n) for p, n in plan.counts if n] == [("drum", 2)]
    assert plan.packages == 2
    assert plan.supply == pytest.approx(0.416)


@pytest.mark.parametrize("need", [0.001, 0.020, 0.021, 0.207, 0.208, 0.366, 0.990, 1.000, 1.318, 2.5])
def test_supply_covers_need_within_one_small_package(need):
    packages = [PAIL, DRUM, IBC]
    plan = plan_packages(need, packages)
    assert plan.supply >= need - 1e-12
    assert plan.supply - need < PAIL.volume
    # No plan with fewer packages meets the same rule: brute force over every small combination.
    fewest = min(
        a + b + c
        for a in range(int(need / 0.020) + 2) for b in range(int(need / 0.208) + 2) for c in range(int(need) + 2)
        if 0 <= 0.020 * a + 0.208 * b + 1.0 * c - need + 1e-12 < 0.020 - 1e-12
    )
    assert plan.packages == fewest


def test_zero_need_buys_nothing():
    plan = plan_packages(0.0, [PAIL, DRUM])
    assert plan.packages == 0 and plan.supply == 0


def test_negative_need_is_refused():
    with pytest.raises(ValueError, match="need must be >= 0 and at least one package given"):
        plan_packages(-0.1, [PAIL])
    with pytest.raises(ValueError, match="need must be >= 0 and at least one package given"):
        plan_packages(0.1, [])


def test_us_gallon_is_nist():
    # NIST SP 811, appendix B: 1 US gallon = 3.785411784 L, checked with pint.
    assert UREG.Quantity(1, "gallon").to("liter").magnitude == pytest.approx(3.785411784, rel=1e-12)
    assert display_units.US_GAL_PER_M3 == pytest.approx(UREG.Quantity(1, "m**3").to("gallon").magnitude, rel=1e-12)


def test_kilograms_via_density():
    # Mineral hydraulic oil about 0.87 kg/L at 15 degC (common practice).
    assert density_kg_per_l("HM") == 0.87
    assert 410 * density_kg_per_l("HM") == pytest.approx(356.7)
    assert density_kg_per_l("HFDR") > 1.0  # phosphate esters are heavier than water (common practice)


@pytest.mark.parametrize(("grade", "low", "high"), [(32, 28.8, 35.2), (46, 41.4, 50.6), (68, 61.2, 74.8)])
def test_iso_3448_published_limits(grade, low, high):
    # ISO 3448:1992, table 1 (from memory): VG 32 28.8-35.2, VG 46 41.4-50.6, VG 68 61.2-74.8 mm^2/s.
    assert viscosity_limits(grade) == pytest.approx((low, high))


@pytest.mark.parametrize("grade", sorted(ISO_3448_GRADES))
def test_iso_3448_limits_are_midpoint_plus_minus_ten_percent(grade):
    # ISO 3448:1992: limits are +-10 % of the midpoint, and the midpoint of VG n is n (from memory;
    # VG 2, 3, 5 and 7 have midpoints 2.2, 3.2, 4.6 and 6.8).
    mid, low, high = ISO_3448_GRADES[grade]
    assert low == pytest.approx(0.9 * mid, rel=1e-9)
    assert high == pytest.approx(1.1 * mid, rel=1e-9)
    if grade >= 10:
        assert mid == grade


def test_stated_charge_below_the_reservoir_is_a_failed_check():
    # SOLAS II-1/29.12.3: the storage tank recharges one power actuating system including its
    # reservoir. By hand: 300 L reservoir + one ram pair pi/4 x 0.280^2 x 0.900 = 55.42 L.
    from kit.engine.requirements import assess_unit
    from kit.files.policy_file import load_policy
    from engine_helpers import vessel

    least = 0.300 + math.pi / 4 * 0.280**2 * 0.900
    c = oil.charge(unit(ram_unit(system_oil="5 L")))
    assert (c.stated, c.least, c.used, c.stated_ok) == (pytest.approx(0.005), pytest.approx(least), pytest.approx(least), False)
    v = vessel(ram_unit(system_oil="5 L"))
    r = assess_unit(v.units[0], v, 90, load_policy())
    assert r.storage_tank_min == pytest.approx(least)
    assert (f"system_oil 5.0 L is less than the reservoir plus the oil in the actuators and pipes, {least * 1000:.1f} L: "
            f"the storage tank minimum (SOLAS II-1/29.12.3) and the charge use {least * 1000:.1f} L") in r.warnings
    rule = next(x for x in r.checks.rules if x.clause == "SOLAS II-1/29.12.3")
    assert rule.verdict == "not met" and "5.0 L" in rule.text and f"{least * 1000:.1f} L" in rule.text


def test_stated_charge_above_the_least_is_used():
    c = oil.charge(unit(ram_unit(system_oil="500 L")))
    assert (c.used, c.basis, c.stated_ok) == (pytest.approx(0.500), "stated", True)
