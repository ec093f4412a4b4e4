# SPDX-License-Identifier: MIT
"""Static O-rings: ISO 3601-1 cross-sections, stretch, squeeze and fill worked by hand."""

from __future__ import annotations

import math

import pytest

from kit.engine import orings
from kit.errors import OutOfSeriesError
from kit.engine.standard_tables import load_table

# ISO 3601-1:2012, clause 4 (published): the five cross-sections of the series.
ISO_3601_1_CROSS_SECTIONS = (1.80, 2.65, 3.55, 5.30, 7.00)


def test_cross_sections_are_the_published_ones():
    assert orings.CROSS_SECTIONS_MM == ISO_3601_1_CROSS_SECTIONS
    in_table = {float(r["cross_section_mm"]) for r in load_table("iso3601_1_2012_o_ring_sizes.csv")}
    assert in_table == set(ISO_3601_1_CROSS_SECTIONS)
    glands = {float(r["cross_section_mm"]) for r in load_table("iso3601_2_2016_static_radial_glands.csv")}
    assert glands == set(ISO_3601_1_CROSS_SECTIONS)


def test_gland_depth_less_than_cross_section():
    for row in load_table("iso3601_2_2016_static_radial_glands.csv"):
        assert float(row["gland_depth_mm"]) < float(row["cross_section_mm"]) < float(row["groove_width_mm"])


def test_200_mm_bore_by_hand():
    # Gland for CS 5.30 (ISO 3601-2:2016, from memory): depth t = 4.19 mm, width b = 7.1 mm.
    fit = orings.static_oring(200.0)
    cs, t, b = 5.30, 4.19, 7.1
    d3 = 200.0 - 2 * t
    inside = 190.0  # largest CS 5.30 ring of ISO 3601-1 not above d3 = 191.62 (from memory)
    stretch = (d3 - inside) / inside
    cs_stretched = cs * math.sqrt((inside + cs) / (d3 + cs))  # volume kept constant
    assert (fit.inside_diameter, fit.cross_section) == (inside, cs)
    assert fit.groove_diameter == pytest.approx(d3, abs=1e-12)
    assert fit.stretch == pytest.approx(stretch, rel=1e-12)
    assert fit.squeeze == pytest.approx((cs_stretched - t) / cs_stretched, rel=1e-12)
    assert fit.fill == pytest.approx(math.pi / 4 * cs_stretched**2 / (t * b), rel=1e-12)
    assert not fit.is_cord
    assert orings.within_limits(fit)


def test_cord_past_the_series():
    # 800 mm: past the largest CS 7.00 ring (670 mm, from memory) stretched 5 %: vulcanised cord.
    fit = orings.static_oring(800.0)
    d3 = 800.0 - 2 * 5.67
    inside = round(d3 / 1.01, 1)  # cut 1 % short (common practice)
    assert fit.is_cord
    assert fit.cross_section == 7.00
    assert fit.inside_diameter == inside
    assert fit.cord_cut_length == pytest.approx(math.pi * (inside + 7.00), abs=0.05)
    assert fit.stretch == pytest.approx(0.01, abs=0.001)


@pytest.mark.parametrize(("bore", "cs"), [(25, 1.80), (30, 1.80), (50, 2.65), (120, 3.55), (300, 5.30), (450, 7.00)])
def test_cross_section_for_bore(bore, cs):
    # Cross-section by bore (common practice).
    assert orings.cross_section_for(bore) == cs


def test_too_small_a_bore():
    with pytest.raises(OutOfSeriesError) as info:
        orings.static_oring(3.0)
    # Smallest ring 1.8 mm ID on CS 1.80 plus two gland depths of 1.38 mm.
    assert str(info.value) == "3 mm lies outside ISO 3601-1 O-rings (limit 4.56 mm)"


def test_within_limits_rejects_each_limit():
    good = orings.static_oring(200.0)
    fields = dict(vars(good))
    for change in ({"stretch": -0.001}, {"stretch": 0.051}, {"squeeze": 0.11}, {"squeeze": 0.31}, {"fill": 0.86}):
        assert not orings.within_limits(orings.ORingFit(**{**fields, **change}))


def test_limits_are_iso_3601_2_static():
    # ISO 3601-2:2016 static radial glands (from memory): stretch up to 5 %, fill up to 85 %.
    assert orings.STRETCH_MAX == 0.05
    assert orings.FILL_MAX == 0.85
    assert orings.SQUEEZE_RANGE[0] < orings.SQUEEZE_RANGE[1] <= 0.30
