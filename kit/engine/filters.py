# SPDX-License-Identifier: MIT
"""Filter elements to carry for a voyage or a period.

Per filter position, elements = elements_per_change x (changes + spare_sets), with
changes = ceil(days x duty / change_interval): every change falling due within the period, plus
the spare sets the policy keeps (default 1, common practice: one set on board beyond the
planned changes, for a blocked element). A period of 0 days still gives the spare sets.
"""

from __future__ import annotations

import math

SECONDS_PER_HOUR = 3600.0


def changes_due(days: float, duty_hours_per_day: float, change_interval_s: float) -> int:
    """Element changes falling due in ``days`` at ``duty_hours_per_day`` running hours."""
    if days < 0:
        raise ValueError("days must not be negative")
    running_s = days * duty_hours_per_day * SECONDS_PER_HOUR
    # round() first so that 2000 h exactly does not become 2 changes by floating-point noise
    return math.ceil(round(running_s / change_interval_s, 9))


def elements_needed(elements: int, days: float, duty_hours_per_day: float, change_interval_s: float, spare_sets: int = 1) -> int:
    """Elements for one filter position: elements x (ceil(days x duty / interval) + spare_sets).

    >>> elements_needed(2, 90, 24, 2000 * 3600)  # 2160 h: 2 changes + 1 spare set
    6
    """
    return elements * (changes_due(days, duty_hours_per_day, change_interval_s) + spare_sets)
