# SPDX-License-Identifier: MIT
"""Cylinder bores and rod diameters against the ISO 3320 series.

A size on the series is reported with its series (preferred or second choice); a size off the
series is still sized downstream, with a warning naming the nearest series sizes either side.

References
----------
ISO 3320:2013, Fluid power systems and components -- Cylinder bores and piston rod diameters and
area ratios -- Metric series. Table values here are from memory (see the data file).
"""

from __future__ import annotations

import bisect
import math
from dataclasses import dataclass

from kit.engine.standard_tables import load_table

TOLERANCE_MM = 0.01


def _series(kind: str) -> dict[float, str]:
    return {float(r["diameter_mm"]): r["series"] for r in load_table("iso3320_2013_bores_rods.csv") if r["kind"] == kind}


BORES_MM: dict[float, str] = _series("bore")
RODS_MM: dict[float, str] = _series("rod")


@dataclass(frozen=True)
class SeriesCheck:
    kind: str
    diameter_mm: float
    series: str | None  # "preferred", "second" or None when off the series
    below_mm: float | None
    above_mm: float | None

    @property
    def on_series(self) -> bool:
        return self.series is not None

    def warning(self) -> str | None:
        """The off-series warning, or None when the size is on the series."""
        if self.on_series:
            return None
        near = " and ".join(f"{x:g} mm" for x in (self.below_mm, self.above_mm) if x is not None)
        return (f"{self.kind} {self.diameter_mm:g} mm is not in the ISO 3320 series; nearest series sizes {near}; "
                "housings sized for the actual diameter")


def check(kind: str, diameter_m: float) -> SeriesCheck:
    """Check a ``kind`` ("bore" or "rod") diameter [m] against ISO 3320."""
    table = BORES_MM if kind == "bore" else RODS_MM
    d_mm = diameter_m * 1000.0
    sizes = sorted(table)
    for size in sizes:
        if abs(size - d_mm) <= TOLERANCE_MM:
            return SeriesCheck(kind, size, table[size], size, size)
    i = bisect.bisect_left(sizes, d_mm)
    below = sizes[i - 1] if i > 0 else None
    above = sizes[i] if i < len(sizes) else None
    return SeriesCheck(kind, round(d_mm, 3), None, below, above)


def area_ratio(bore_m: float, rod_m: float) -> float:
    """Area ratio phi = A_bore / (A_bore - A_rod) = D^2 / (D^2 - d^2), as ISO 3320 clause 6 defines it.

    >>> round(area_ratio(0.1, 0.07), 2)
    1.96
    """
    if rod_m >= bore_m:
        raise ValueError("rod must be smaller than bore")
    return bore_m**2 / (bore_m**2 - rod_m**2)


def circle_area(d_m: float) -> float:
    """Area of a circle of diameter ``d_m`` [m^2]."""
    return math.pi * d_m * d_m / 4.0
