# SPDX-License-Identifier: MIT
"""Oil quantities: system charge, storage-tank minimum, voyage top-up, and packages to buy.

Volumes in m^3 inside; the report shows litres, kilograms and US gallons.

* System charge: the reservoir plus the oil in the actuators plus the pipes, pi/4 d_i^2 L each,
  or the charge stated in the particulars (``system_oil``) where that is larger; a stated charge
  below it is flagged (``Charge.stated_ok``).
* Storage tank minimum: one power actuating system including its reservoir (SOLAS II-1/29.12.3).
* Voyage top-up: the leakage rate times the period.
* Packages: the smallest number of packages whose volume covers the need and overshoots it by
  less than the smallest package, so supply is never short and never wasteful by a whole package.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from kit.engine.display_units import L_PER_M3
from kit.engine.particulars import Pipe, Unit
from kit.engine.physics import actuator_oil_volume



@dataclass(frozen=True)
class Package:
    name: str
    volume: float  # m^3


def pipe_volume(pipe: Pipe) -> float:
    """Oil in a pipe: pi/4 d_i^2 L [m^3], d_i = outside diameter - 2 wall."""
    return math.pi / 4 * pipe.inside_diameter**2 * pipe.length


@dataclass(frozen=True)
class Charge:
    """The charge of one power actuating system: what the particulars state, the least it can be
    (reservoir + actuators + pipes) and the figure used, the larger of the two."""

    used: float  # m^3
    basis: str
    least: float  # m^3, reservoir + actuators + pipes
    stated: float | None = None  # m^3

    @property
    def stated_ok(self) -> bool:
        """False when a stated charge is below the reservoir plus the oil in actuators and pipes."""
        return self.stated is None or self.stated >= self.least * (1 - 1e-9)


def charge(unit: Unit) -> Charge:
    """The charge [m^3] of one power actuating system including its reservoir (SOLAS II-1/29.12.3).

    It can never be less than the reservoir plus the oil the actuators and pipes hold
    (``kit.engine.physics.actuator_oil_volume``, pi/4 d_i^2 L a pipe); a stated ``system_oil`` below that
    is a typing error or a figure without the reservoir, and the larger figure is used.
    """
    least = unit.reservoir + actuator_oil_volume(unit) + sum(pipe_volume(p) for p in unit.pipes)
    how = "reservoir + actuators + pipes" if unit.pipes else "reservoir + actuators (no pipes given)"
    if unit.system_oil is None:
        return Charge(least, how, least)
    if unit.system_oil >= least * (1 - 1e-9):
        return Charge(unit.system_oil, "stated", least, unit.system_oil)
    return Charge(least, f"{how}, more than the stated {unit.system_oil * L_PER_M3:.1f} L", least, unit.system_oil)


def system_charge(unit: Unit) -> tuple[float, str]:
    """System charge [m^3] of one power actuating system and where the figure came from."""
    c = charge(unit)
    return c.used, c.basis


def top_up(leakage_m3_per_s: float | None, days: float) -> float:
    """Oil lost to leakage over ``days`` [m^3]."""
    return (leakage_m3_per_s or 0.0) * days * 86400.0


@dataclass(frozen=True)
class PackagePlan:
    need: float
    counts: tuple[tuple[Package, int], ...]

    @property
    def supply(self) -> float:
        return sum(p.volume * n for p, n in self.counts)

    @property
    def packages(self) -> int:
        return sum(n for _, n in self.counts)


def plan_packages(need: float, packages: list[Package]) -> PackagePlan:
    """Packages covering ``need`` with need <= supply < need + smallest package.

    Largest package first: as many whole packages as fit in what is still needed, or one more
    when that one more would overshoot by less than the smallest package (then the need is met);
    the smallest package rounds the rest up. The same rule is a spreadsheet formula per package
    (see ``kit.files.workbook``), so the workbook recomputes the plan when an on-board count changes.

    >>> pails, drums = Package("pail", 0.020), Package("drum", 0.208)
    >>> plan = plan_packages(0.410, [pails, drums])
    >>> [(p.name, n) for p, n in plan.counts]
    [('drum', 2), ('pail', 0)]
    """
    if need < 0 or not packages:
        raise ValueError("need must be >= 0 and at least one package given")
    ordered = sorted(packages, key=lambda p: -p.volume)
    smallest = ordered[-1].volume
    remaining = need
    counts = []
    for p in ordered[:-1]:
        up = math.ceil(round(remaining / p.volume, 9))
        n = up if up * p.volume - remaining < smallest else math.floor(round(remaining / p.volume, 9))
        n = max(n, 0)
        counts.append((p, n))
        remaining -= n * p.volume
    counts.append((ordered[-1], max(0, math.ceil(round(remaining / smallest, 9)))))
    return PackagePlan(need, tuple(counts))
