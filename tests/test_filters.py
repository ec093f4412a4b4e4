# SPDX-License-Identifier: MIT
"""Filter elements: elements x (ceil(days x duty / interval) + spare sets)."""

from __future__ import annotations

import math

import pytest

from kit.engine.filters import changes_due, elements_needed

H = 3600.0


@pytest.mark.parametrize(
    ("elements", "days", "duty", "interval_h", "spare_sets"),
    [(1, 90, 24, 2000, 1), (2, 90, 24, 2000, 1), (1, 180, 20, 4000, 2), (3, 365, 24, 1000, 0), (1, 30, 8, 500, 1)],
)
def test_formula_by_hand(elements, days, duty, interval_h, spare_sets):
    expected = elements * (math.ceil(days * duty / interval_h) + spare_sets)
    assert elements_needed(elements, days, duty, interval_h * H, spare_sets) == expected


def test_ninety_days_round_the_clock_on_2000_h():
    # 2160 running hours on 2000 h elements: 2 changes fall due, plus 1 spare set (common practice).
    assert changes_due(90, 24, 2000 * H) == 2
    assert elements_needed(2, 90, 24, 2000 * H) == 6


def test_zero_days_still_gives_the_spare_sets():
    assert changes_due(0, 24, 2000 * H) == 0
    assert elements_needed(2, 0, 24, 2000 * H, spare_sets=1) == 2
    assert elements_needed(2, 0, 24, 2000 * H, spare_sets=3) == 6


def test_exactly_one_interval_is_one_change():
    # 2000/24 days at 24 h a day is 2000 h exactly: one change, not two.
    assert changes_due(2000 / 24, 24, 2000 * H) == 1
    assert changes_due(2 * 2000 / 24, 24, 2000 * H) == 2


def test_just_past_one_interval_is_two_changes():
    assert changes_due(2000 / 24 + 1 / 24, 24, 2000 * H) == 2  # one hour past 2000 h


def test_filter_not_running_needs_only_spares():
    assert elements_needed(1, 90, 0, 2000 * H) == 1


def test_negative_days_are_refused():
    with pytest.raises(ValueError, match="days must not be negative"):
        changes_due(-1, 24, 2000 * H)
