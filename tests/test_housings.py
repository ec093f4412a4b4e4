# SPDX-License-Identifier: MIT
"""Series seal housings: D = d + 2 S from the band tables, guide cut lengths, out-of-series errors."""

from __future__ import annotations

import math

import pytest

from kit.engine import housings
from kit.errors import OutOfSeriesError


def test_rod_housing_for_280_mm():
    # ISO 5597:2018 rod housings (from memory): over 220 up to 360 mm, S = 15 mm, medium L = 25 mm.
    h = housings.rod_seal_housing(280)
    assert (h.d, h.D, h.L) == (280, 310, 25)
    assert h.radial_section == 15
    assert h.standard == "ISO 5597"


def test_piston_housing_groove_is_bore_less_two_sections():
    # ISO 5597:2018 piston housings (from memory): over 160 up to 250 mm, S = 12.5 mm.
    h = housings.piston_seal_housing(200)
    assert (h.d, h.D) == (175, 200)
    assert h.d == h.D - 2 * h.radial_section


@pytest.mark.parametrize(("length", "expected"), [("short", 16), ("medium", 20), ("long", 32)])
def test_housing_length_choice(length, expected):
    # ISO 5597:2018 (from memory): rod over 140 up to 220 mm, L short/medium/long 16/20/32 mm.
    assert housings.rod_seal_housing(200, length).L == expected


def test_band_edges_belong_to_the_lower_band():
    # A nominal of exactly 220 mm is "over 140 up to 220": the upper limit is inclusive.
    assert housings.rod_seal_housing(220).radial_section == 12.5
    assert housings.rod_seal_housing(220.001).radial_section == 15


def test_wiper_housing():
    # ISO 6195:2013 (from memory): rod over 250 up to 360 mm, S = 12.5 mm, L = 16 mm; housing type C
    # (ISO 6195:2013 abstract: type C is the preferred housing for double-lip wipers).
    h = housings.wiper_housing(280)
    assert (h.d, h.D, h.L, h.standard) == (280, 305, 16, "ISO 6195 type C")


def test_guide_ring_cut_length_by_hand():
    # ISO 10766 (t 4 mm in a 25 mm groove: Trelleborg Orkot Slydring catalogue 2011, table XLII;
    # band over 250 up to 500 mm from memory).
    h = housings.guide_housing(290, "rod")
    t = 4.0
    assert (h.d, h.D, h.L, h.side) == (290, 290 + 2 * t, 25, "rod")
    circumference = math.pi * (290 + t)
    gap = max(1.5, 0.01 * circumference)  # cut gap: 1 % of the circumference, at least 1.5 mm (common practice)
    assert h.extra["t"] == t
    assert h.extra["cut"] == pytest.approx(circumference - gap, abs=0.05)


def test_piston_guide_sits_in_the_bore():
    h = housings.guide_housing(200, "piston")
    t = h.extra["t"]
    assert (h.d, h.D) == (200 - 2 * t, 200)
    assert h.extra["cut"] == pytest.approx(math.pi * (200 - t) * 0.99, abs=0.05)


def test_small_guide_gap_is_at_least_the_minimum():
    # 1 % of pi x 20 mm is 0.63 mm, under the 1.5 mm minimum (common practice).
    assert housings.guide_cut_length(20) == pytest.approx(math.pi * 20 - 1.5, rel=1e-12)


@pytest.mark.parametrize(
    ("build", "nominal", "message"),
    [
        (housings.rod_seal_housing, 900, "900 mm lies outside ISO 5597 rod seal housings (limit 800 mm)"),
        (housings.piston_seal_housing, 560, "560 mm lies outside ISO 5597 piston seal housings (limit 500 mm)"),
        (housings.wiper_housing, 810, "810 mm lies outside ISO 6195 wiper housings (limit 800 mm)"),
        (housings.rod_seal_housing, 0, "0 mm lies outside ISO 5597 rod seal housings (limit 0 mm)"),
    ],
)
def test_out_of_series(build, nominal, message):
    with pytest.raises(OutOfSeriesError) as info:
        build(nominal)
    assert str(info.value) == message


def test_out_of_series_guide():
    with pytest.raises(OutOfSeriesError, match=r"^1200 mm lies outside ISO 10766 guide ring housings \(limit 1000 mm\)$"):
        housings.guide_housing(1200, "rod")
