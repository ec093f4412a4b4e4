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


# Running hours since the last change known (issue 14). The formula: R = days x duty, I the maker's
# change interval, h the hours run; the first change when the element reaches its interval, at
# t1 = max(0, I - h), then every I: 0 when t1 > R, else 1 + floor((R - t1) / I) (common practice:
# change at the maker's interval). Each case worked by hand:
@pytest.mark.parametrize(("days", "duty", "interval_h", "run_h", "changes"), [
    (60, 24, 2000, 0, 0),        # R 1440 h; a new element reaches 2000 h after the voyage
    (60, 24, 2000, 700, 1),      # t1 = 1300 h <= 1440: 1 + floor(140 / 2000) = 1
    (60, 24, 2000, 560, 1),      # t1 = 1440 h, exactly at the end of the voyage: due within it
    (60, 24, 2000, 559, 0),      # t1 = 1441 h: after it
    (90, 24, 2000, 1900, 2),     # R 2160 h, t1 = 100 h: 1 + floor(2060 / 2000) = 2
    (60, 24, 2000, 2500, 1),     # overdue: changed at once, next at 2000 h: 1 + floor(1440 / 2000) = 1
    (90, 12, 500, 100, 2),       # R 1080 h, t1 = 400 h: 1 + floor(680 / 500) = 2
])
def test_changes_due_from_hours_run(days, duty, interval_h, run_h, changes):
    assert changes_due(days, duty, interval_h * H, run_h * H) == changes


def test_elements_from_hours_run():
    # 2 elements a change x (2 changes, as above + 1 spare set, common practice) = 6
    assert elements_needed(2, 90, 12, 500 * H, 1, 100 * H) == 6


def test_hours_run_brought_forward_to_the_start():
    import datetime as dt

    from kit.engine.filters import run_at_start

    read = dt.date(2026, 11, 1)
    # 1000 h read 10 days before the start, at 12 h a day: 1000 + 10 x 12 = 1120 h
    assert run_at_start(1000 * H, read, dt.date(2026, 11, 11), 12) == 1120 * H
    assert run_at_start(1000 * H, read, read, 12) == 1000 * H
    assert run_at_start(1000 * H, None, read, 12) == 1000 * H
    assert run_at_start(None, read, dt.date(2026, 11, 11), 12) is None


def test_hours_run_never_gives_more_changes_than_not_knowing_them():
    for run in range(0, 5000, 37):
        assert changes_due(90, 24, 2000 * H, run * H) <= changes_due(90, 24, 2000 * H) + 1
        assert changes_due(90, 24, 2000 * H, run * H) >= 1  # 2160 h is longer than one interval
