# SPDX-License-Identifier: MIT
"""Seal housings from the ISO series: piston and rod seals, wipers, guide rings.

All dimensions here are in mm (the unit the standards and every seal catalogue use).
For every housing, ``d < D``: a piston housing has D = bore and d = groove diameter;
a rod housing has d = rod and D = housing diameter.

References
----------
ISO 5597:2018, Hydraulic fluid power -- Cylinders -- Dimensions and tolerances of housings for
single-acting piston and rod seals in reciprocating applications.
ISO 6195:2013, Fluid power systems and components -- Cylinder-rod wiper-ring housings in
reciprocating applications -- Dimensions and tolerances.
ISO 10766:2015, Hydraulic fluid power -- Cylinders -- Housings for piston and rod guide rings of
rectangular section -- Dimensions and tolerances.
The band tables transcribed from these are marked ``from memory`` in ``kit/data``: check every
series housing against the maker's drawing before ordering.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from kit.errors import OutOfSeriesError
from kit.tables import load_table

STATED_ROLES = ("piston", "rod", "wiper", "guide", "stock")
LENGTHS = ("short", "medium", "long")

# Cut gap of a guide strip: room for thermal growth and swelling (common practice).
GUIDE_GAP_FRACTION = 0.01  # of the strip's mean circumference
GUIDE_GAP_MIN_MM = 1.5


@dataclass(frozen=True)
class Housing:
    """A seal housing: role, inner diameter d, outer diameter D, axial length L [mm]."""

    role: str
    d: float
    D: float
    L: float
    standard: str
    origin: str
    extra: dict[str, float] = field(default_factory=dict)
    side: str = ""  # for guide rings: "piston" or "rod"

    @property
    def radial_section(self) -> float:
        return (self.D - self.d) / 2.0


def _band(rows: tuple[dict[str, str], ...], nominal_mm: float, series: str) -> dict[str, str]:
    for row in rows:
        if float(row["nominal_over_mm"]) < nominal_mm <= float(row["nominal_to_mm"]):
            return row
    first, last = float(rows[0]["nominal_over_mm"]), float(rows[-1]["nominal_to_mm"])
    raise OutOfSeriesError(series, nominal_mm, last if nominal_mm > first else first)


def _seal_rows(role: str) -> tuple[dict[str, str], ...]:
    return tuple(r for r in load_table("iso5597_2018_housing_bands.csv") if r["role"] == role)


def rod_seal_housing(rod_mm: float, length: str = "medium") -> Housing:
    """Rod seal housing for a rod (or ram) of diameter ``rod_mm``: D = d + 2 S (ISO 5597).

    >>> h = rod_seal_housing(280)
    >>> (h.d, h.D, h.L)
    (280, 310.0, 25.0)
    """
    row = _band(_seal_rows("rod"), rod_mm, "ISO 5597 rod seal housings")
    s = float(row["radial_section_mm"])
    return Housing("rod", rod_mm, rod_mm + 2 * s, float(row[f"length_{length}_mm"]), "ISO 5597", "ISO 5597 series")


def piston_seal_housing(bore_mm: float, length: str = "medium") -> Housing:
    """Piston seal housing in a bore ``bore_mm``: groove diameter d = D - 2 S (ISO 5597)."""
    row = _band(_seal_rows("piston"), bore_mm, "ISO 5597 piston seal housings")
    s = float(row["radial_section_mm"])
    return Housing("piston", bore_mm - 2 * s, bore_mm, float(row[f"length_{length}_mm"]), "ISO 5597", "ISO 5597 series")


def wiper_housing(rod_mm: float) -> Housing:
    """Wiper-ring housing for a rod ``rod_mm`` (ISO 6195): D = d + 2 S_w."""
    row = _band(load_table("iso6195_2013_wiper_bands.csv"), rod_mm, "ISO 6195 wiper housings")
    s = float(row["radial_section_mm"])
    return Housing("wiper", rod_mm, rod_mm + 2 * s, float(row["length_mm"]), "ISO 6195", "ISO 6195 series")


def guide_cut_length(mean_diameter_mm: float) -> float:
    """Cut length of guide strip [mm]: pi x mean diameter less the gap.

    For a piston guide the mean diameter is D - t (bore less strip thickness), for a rod guide
    d + t. The gap is ``GUIDE_GAP_FRACTION`` of the circumference, at least ``GUIDE_GAP_MIN_MM``
    (common practice).
    """
    circumference = math.pi * mean_diameter_mm
    return circumference - max(GUIDE_GAP_MIN_MM, GUIDE_GAP_FRACTION * circumference)


def guide_housing(nominal_mm: float, side: str) -> Housing:
    """Guide ring housing (ISO 10766) on a ``side`` of "piston" (bore) or "rod".

    The strip thickness t sets the groove depth; the cut length is pi x (D - t) less the gap for
    a piston, pi x (d + t) less the gap for a rod.
    """
    row = _band(load_table("iso10766_2015_guide_bands.csv"), nominal_mm, "ISO 10766 guide ring housings")
    t, width = float(row["thickness_mm"]), float(row["width_mm"])
    if side == "piston":
        d, D, mean = nominal_mm - 2 * t, nominal_mm, nominal_mm - t
    else:
        d, D, mean = nominal_mm, nominal_mm + 2 * t, nominal_mm + t
    return Housing("guide", d, D, width, "ISO 10766", "ISO 10766 series",
                   {"t": t, "cut": round(guide_cut_length(mean), 1)}, side)
