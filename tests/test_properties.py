# SPDX-License-Identifier: MIT
"""Properties over the whole input range (hypothesis): housings, O-rings, filters and oil."""

from __future__ import annotations

import math

from hypothesis import given, settings
from hypothesis import strategies as st

from kit.engine import housings, orings
from kit.engine.filters import elements_needed
from kit.engine.oil import Package, plan_packages
from kit.engine.standard_tables import load_table

SETTINGS = settings(max_examples=150, deadline=None)


def band_values(name: str, column: str, role: str | None = None) -> set[float]:
    return {float(r[column]) for r in load_table(name) if role is None or r["role"] == role}


SEAL = "iso5597_2018_housing_bands.csv"
WIPER = "iso6195_2013_wiper_bands.csv"
GUIDE = "iso10766_2015_guide_bands.csv"
LENGTH_COLUMNS = ("length_short_mm", "length_medium_mm", "length_long_mm")


def seal_lengths(role: str) -> set[float]:
    return set().union(*(band_values(SEAL, c, role) for c in LENGTH_COLUMNS))


sizes = st.tuples(st.floats(20, 500), st.floats(0.3, 0.8)).map(lambda bf: (round(bf[0], 2), round(bf[0] * bf[1], 2)))


@SETTINGS
@given(sizes, st.sampled_from(housings.LENGTHS))
def test_every_housing_has_d_below_D_and_band_values(size, length):
    bore, rod = size
    cases = [
        (housings.piston_seal_housing(bore, length), band_values(SEAL, "radial_section_mm", "piston"), seal_lengths("piston")),
        (housings.rod_seal_housing(rod, length), band_values(SEAL, "radial_section_mm", "rod"), seal_lengths("rod")),
        (housings.wiper_housing(rod), band_values(WIPER, "radial_section_mm"), band_values(WIPER, "length_mm")),
        (housings.guide_housing(bore, "piston"), band_values(GUIDE, "thickness_mm"), band_values(GUIDE, "width_mm")),
        (housings.guide_housing(rod, "rod"), band_values(GUIDE, "thickness_mm"), band_values(GUIDE, "width_mm")),
    ]
    for h, sections, lengths in cases:
        assert h.d < h.D
        assert any(math.isclose(h.radial_section, s, abs_tol=1e-9) for s in sections), h
        assert h.L in lengths, h
    assert cases[0][0].D == bore and cases[1][0].d == rod


@SETTINGS
@given(st.floats(20, 500))
def test_static_oring_within_iso_3601_2(bore):
    fit = orings.static_oring(bore)
    assert 0.0 <= fit.stretch <= 0.05  # ISO 3601-2:2016 static radial (from memory)
    assert orings.SQUEEZE_RANGE[0] <= fit.squeeze <= orings.SQUEEZE_RANGE[1]
    assert fit.fill <= 0.85  # ISO 3601-2:2016 (from memory)
    assert fit.groove_diameter < fit.bore
    assert fit.cross_section in orings.CROSS_SECTIONS_MM


@SETTINGS
@given(st.integers(1, 6), st.floats(0, 730), st.floats(0, 24), st.floats(100, 10_000), st.integers(0, 3))
def test_filter_elements_never_short(elements, days, duty, interval_h, spare_sets):
    n = elements_needed(elements, days, duty, interval_h * 3600, spare_sets)
    assert n % elements == 0
    assert n >= elements * (days * duty / interval_h + spare_sets) - 1e-6
    assert n < elements * (days * duty / interval_h + spare_sets + 1) + 1e-6


@SETTINGS
@given(st.floats(0, 5), st.lists(st.sampled_from([0.005, 0.020, 0.060, 0.208, 1.0]), min_size=1, max_size=3, unique=True))
def test_package_supply_never_short(need, volumes):
    plan = plan_packages(need, [Package(f"p{v}", v) for v in volumes])
    assert plan.supply >= need - 1e-9
    assert plan.supply - need < min(volumes) + 1e-9
