# SPDX-License-Identifier: MIT
"""Cylinder bores and rods against ISO 3320, checked against the ISO 3 R10 preferred numbers."""

from __future__ import annotations

import math

import pytest

from kit.engine import series

# ISO 3:1973 R10 series, the rounded values the standard publishes for one decade.
R10_ROUNDED = (1.00, 1.25, 1.60, 2.00, 2.50, 3.15, 4.00, 5.00, 6.30, 8.00)

# ISO 3320:2013, table 1 (from memory): the preferred bores between 25 and 500 mm.
PREFERRED_25_TO_500 = (25, 32, 40, 50, 63, 80, 100, 125, 160, 200, 250, 320, 400, 500)


def test_r10_rounded_values_are_the_theoretical_series():
    # ISO 3:1973 R10 series: the rounded values lie within 1.3 % of 10**(i/10).
    for i, value in enumerate(R10_ROUNDED):
        theoretical = 10 ** (i / 10)
        assert abs(value - theoretical) / theoretical < 0.013


def test_preferred_bores_are_the_r10_series():
    # ISO 3:1973 R10 series, decades 10..100 and 100..1000: 25 mm is R10 step 14, 500 mm step 27.
    expected = []
    for i in range(14, 28):
        value = R10_ROUNDED[i % 10] * 10 ** (i // 10)
        # ISO 3320 writes R10's 3.15 step as 32 and 320 (ISO 3320:2013, table 1, from memory).
        if i % 10 == 5:
            value = 3.2 * 10 ** (i // 10)
        expected.append(round(value, 6))
    assert tuple(expected) == PREFERRED_25_TO_500
    table = tuple(b for b, s in sorted(series.BORES_MM.items()) if s == "preferred" and 25 <= b <= 500)
    assert table == PREFERRED_25_TO_500


@pytest.mark.parametrize("bore_mm", PREFERRED_25_TO_500)
def test_preferred_bore_is_on_series(bore_mm):
    c = series.check("bore", bore_mm / 1000)
    assert c.on_series
    assert c.series == "preferred"
    assert c.warning() is None


def test_second_choice_bore():
    # ISO 3320:2013, table 1 (from memory): 90 mm is a second-choice bore.
    assert series.check("bore", 0.090).series == "second"


def test_size_within_tolerance_counts_as_on_series():
    c = series.check("bore", 0.100004)  # 100.004 mm: 4 micrometres off
    assert c.on_series and c.diameter_mm == 100.0


@pytest.mark.parametrize(
    ("kind", "d_mm", "below", "above"),
    [("bore", 95, 90, 100), ("bore", 330, 320, 360), ("rod", 330.2, 320, 360), ("rod", 57, 56, 63)],
)
def test_off_series_warning_names_both_neighbours(kind, d_mm, below, above):
    c = series.check(kind, d_mm / 1000)
    assert not c.on_series
    assert (c.below_mm, c.above_mm) == (below, above)
    assert c.warning() == (f"{kind} {d_mm:g} mm is not in the ISO 3320 series; nearest series sizes "
                           f"{below} mm and {above} mm; housings sized for the actual diameter")


def test_past_the_largest_bore_names_one_neighbour():
    c = series.check("bore", 0.600)
    assert (c.below_mm, c.above_mm) == (500, None)
    assert "nearest series sizes 500 mm;" in c.warning()


def test_area_ratio_by_hand():
    # ISO 3320:2013, clause 6 (from memory): phi = A_piston / A_annulus.
    bore, rod = 0.100, 0.070
    a_piston = math.pi / 4 * bore**2
    a_annulus = a_piston - math.pi / 4 * rod**2
    assert series.area_ratio(bore, rod) == pytest.approx(a_piston / a_annulus, rel=1e-12)
    assert series.area_ratio(bore, rod) == pytest.approx(1.96, abs=0.005)  # 1/(1 - 0.49)


def test_area_ratio_refuses_rod_not_smaller_than_bore():
    with pytest.raises(ValueError, match="rod must be smaller than bore"):
        series.area_ratio(0.1, 0.1)


def test_circle_area():
    assert series.circle_area(0.2) == pytest.approx(math.pi * 0.01, rel=1e-12)
