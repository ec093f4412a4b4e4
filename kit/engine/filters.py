# SPDX-License-Identifier: MIT
"""Filter elements to carry for a voyage or a period.

Per filter position, elements = elements_per_change x (changes + spare_sets), with
changes the changes falling due within the period, plus the spare sets the policy keeps (default
1, common practice: one set on board beyond the planned changes, for a blocked element). A period
of 0 days still gives the spare sets.

Changes due over a period of running time R = days x duty, at the maker's change interval I
(the element is changed when it has run its interval: common practice, following the maker's
interval):

- running hours since the last change not known: ceil(R / I), as if the element in place were
  due now (each element serves I, so that many are used over R; the cautious figure);
- running hours h since the last change known: the first change falls due when the element
  reaches its interval, at t1 = max(0, I - h) into the period (at once when it is overdue), then
  every I: changes = 0 when t1 > R, else 1 + floor((R - t1) / I).

Hours read on an earlier date are brought forward to the start of the period at the filter's duty
(:func:`run_at_start`), so an old reading never makes the element look newer than it is.
"""

from __future__ import annotations

import datetime as dt
import math

SECONDS_PER_HOUR = 3600.0


def changes_due(days: float, duty_hours_per_day: float, change_interval_s: float, run_s: float | None = None) -> int:
    """Element changes falling due in ``days`` at ``duty_hours_per_day`` running hours, the
    element in place having run ``run_s`` seconds since its last change (None: not known). The
    formula is the module's: ceil(R / I) unknown, else 0 when I - h > R, else 1 + floor((R - max(0, I - h)) / I).

    >>> changes_due(60, 24, 2000 * 3600, 700 * 3600)  # R 1440 h, first change at 1300 h: 1
    1
    """
    if days < 0:
        raise ValueError("days must not be negative")
    running_s = days * duty_hours_per_day * SECONDS_PER_HOUR
    if run_s is None:
        # round() first so that 2000 h exactly does not become 2 changes by floating-point noise
        return math.ceil(round(running_s / change_interval_s, 9))
    if run_s < 0:
        raise ValueError("running time since the last change must not be negative")
    first = max(0.0, change_interval_s - run_s)
    if round(first - running_s, 6) > 0:
        return 0
    return 1 + math.floor(round((running_s - first) / change_interval_s, 9))


def run_at_start(run_s: float | None, read_on: dt.date | None, start: dt.date | None, duty_hours_per_day: float) -> float | None:
    """Running time since the last change at ``start``, from ``run_s`` read on ``read_on``: the
    days between at the filter's duty are added (none when either date is unknown or the reading
    is not older)."""
    if run_s is None or read_on is None or start is None or read_on >= start:
        return run_s
    return run_s + (start - read_on).days * duty_hours_per_day * SECONDS_PER_HOUR


def elements_needed(elements: int, days: float, duty_hours_per_day: float, change_interval_s: float, spare_sets: int = 1,
                    run_s: float | None = None) -> int:
    """Elements for one filter position: elements x (changes due + spare_sets), changes as
    :func:`changes_due`.

    >>> elements_needed(2, 90, 24, 2000 * 3600)  # 2160 h, hours not known: 2 changes + 1 spare set
    6
    >>> elements_needed(2, 90, 24, 2000 * 3600, run_s=0.0)  # a new element: 1 change at 2000 h + 1 spare set
    4
    """
    return elements * (changes_due(days, duty_hours_per_day, change_interval_s, run_s) + spare_sets)
