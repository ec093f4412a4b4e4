# SPDX-License-Identifier: MIT
"""SOLAS II-1 regulation 29 (steering gear): the figures and which case each rule is judged on.

References
----------
SOLAS 1974 as amended, chapter II-1, regulation 29:
* 29.3.2: the main steering gear shall be capable of putting the rudder over from 35 deg on one
  side to 35 deg on the other, and from 35 deg on either side to 30 deg on the other side in not
  more than 28 s, at the deepest seagoing draught and maximum ahead service speed.
* 29.6.1: where the main steering gear comprises two or more identical power units, an auxiliary
  steering gear need not be fitted, provided that (.1) in a passenger ship the main steering gear
  can meet 29.3.2 while any one of the power units is out of operation; (.2) in a cargo ship the
  main steering gear can meet 29.3.2 while operating with all power units.
* 29.12.3: where the main steering gear is required to be power operated, a fixed storage tank
  with sufficient capacity to recharge at least one power actuating system including the
  reservoir.
* 29.16: tankers, chemical tankers and gas carriers of 10,000 gross tonnage and upwards: the main
  steering gear comprises two or more identical power units (with the single-failure provisions of
  29.16 and 29.17).
Our reading of 29.6 for the judging case: a passenger ship is judged with one power unit fewer
than it has (any one out of operation), a cargo ship (tankers included) with all power units.
With a single power unit the ship needs an auxiliary steering gear (29.4) and the main gear is
judged on that one unit.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

SWING_FROM_RAD = math.radians(35.0)  # SOLAS II-1/29.3.2
SWING_TO_RAD = math.radians(30.0)  # SOLAS II-1/29.3.2
SWING_LIMIT_S = 28.0  # SOLAS II-1/29.3.2
HARD_OVER_RAD = math.radians(35.0)  # SOLAS II-1/29.3.2
TANKER_TWO_UNITS_GT = 10_000  # SOLAS II-1/29.16


@dataclass(frozen=True)
class JudgingCase:
    """The number of power units the 28 s rule is judged with, and why."""

    pumps_running: int
    reason: str
    warnings: tuple[str, ...] = ()


def judging_case(ship_type: str, pumps: int, gross_tonnage: float) -> JudgingCase:
    """Which case SOLAS II-1/29.3.2 is judged on, read from 29.6.1 (see module docstring)."""
    warnings: list[str] = []
    if ship_type == "tanker" and gross_tonnage >= TANKER_TWO_UNITS_GT and pumps < 2:
        warnings.append("a tanker of 10,000 GT or more needs two or more identical power units (SOLAS II-1/29.16)")
    if pumps < 2:
        warnings.append("single power unit: an auxiliary steering gear is required (SOLAS II-1/29.4)")
        return JudgingCase(1, "single power unit (SOLAS II-1/29.3.2)", tuple(warnings))
    if ship_type == "passenger":
        return JudgingCase(pumps - 1, "passenger ship, one power unit out of operation (SOLAS II-1/29.6.1.1)", tuple(warnings))
    return JudgingCase(pumps, "cargo ship, all power units operating (SOLAS II-1/29.6.1.2)", tuple(warnings))


def storage_tank_minimum(system_charge_m3: float) -> float:
    """Fixed storage tank minimum [m^3]: enough to recharge one power actuating system including
    its reservoir (SOLAS II-1/29.12.3)."""
    return system_charge_m3
