# SPDX-License-Identifier: MIT
"""Static O-rings for glands and end covers: ISO 3601-1 sizes in ISO 3601-2 housings.

The O-ring sits in a groove on the inner part (a cover spigot or gland) and seals against a
bore of diameter ``bore``: a static radial gland of the piston type. The cross-section CS comes
from the bore; the groove root diameter is d3 = bore - 2 t, t the gland depth for that CS. The
ring is the largest series inside diameter not above d3, so it is stretched onto the groove by

    stretch = (d3 - ID) / ID

and, stretched, its cross-section thins (volume kept constant)

    CS' = CS * sqrt((ID + CS) / (d3 + CS))

so that the squeeze is (CS' - t) / CS' and the gland fill is (pi/4 CS'^2) / (t b), b the groove
width. Past the largest series ring for the chosen cross-section the seal becomes a length of
vulcanised O-ring cord cut to pi (d3 / (1 + s_cord) + CS), s_cord the fitted stretch.

References
----------
ISO 3601-1:2012, Fluid power systems -- O-rings -- Part 1: Inside diameters, cross-sections,
tolerances and designation codes (cross-sections 1.80, 2.65, 3.55, 5.30, 7.00 mm).
ISO 3601-2:2016, Part 2: Housing dimensions for general applications (static radial glands:
gland depths, groove widths, squeeze, stretch and fill limits; values here from memory).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache

from kit.errors import OutOfSeriesError
from kit.engine.standard_tables import load_table

CROSS_SECTIONS_MM = (1.80, 2.65, 3.55, 5.30, 7.00)  # ISO 3601-1:2012, clause 4

# ISO 3601-2 static radial limits (from memory).
SQUEEZE_RANGE = (0.12, 0.30)
STRETCH_MAX = 0.05
FILL_MAX = 0.85
CORD_STRETCH = 0.01  # a cord ring is cut 1 % short so it grips its groove (common practice)

# Cross-section for a sealing bore up to this diameter [mm] (common practice).
CS_BY_BORE = ((30.0, 1.80), (80.0, 2.65), (150.0, 3.55), (400.0, 5.30), (math.inf, 7.00))


@dataclass(frozen=True)
class ORingFit:
    """A static O-ring chosen for a bore: the ring, its groove and the checks that it passed."""

    bore: float
    inside_diameter: float
    cross_section: float
    groove_diameter: float
    gland_depth: float
    groove_width: float
    stretch: float
    squeeze: float
    fill: float
    cord_cut_length: float | None = None  # set when the ring is vulcanised cord

    @property
    def is_cord(self) -> bool:
        return self.cord_cut_length is not None


def _glands() -> dict[float, tuple[float, float]]:
    return {float(r["cross_section_mm"]): (float(r["gland_depth_mm"]), float(r["groove_width_mm"]))
            for r in load_table("iso3601_2_2016_static_radial_glands.csv")}


def series_sizes(cross_section: float) -> list[float]:
    """ISO 3601-1 inside diameters made in ``cross_section`` [mm], ascending."""
    return list(_series_sizes(cross_section))


@lru_cache(maxsize=64)
def _series_sizes(cross_section: float) -> tuple[float, ...]:
    # Once per cross-section, not once per unit: a fleet asks for the same few sections.
    return tuple(sorted(float(r["inside_diameter_mm"]) for r in load_table("iso3601_1_2012_o_ring_sizes.csv")
                        if abs(float(r["cross_section_mm"]) - cross_section) < 1e-9))


def _fit(bore: float, cs: float, inside: float, depth: float, width: float, cord: float | None = None) -> ORingFit:
    d3 = bore - 2 * depth
    stretch = (d3 - inside) / inside
    cs_eff = cs * math.sqrt((inside + cs) / (d3 + cs))
    squeeze = (cs_eff - depth) / cs_eff
    fill = (math.pi / 4 * cs_eff**2) / (depth * width)
    return ORingFit(bore, inside, cs, d3, depth, width, stretch, squeeze, fill, cord)


def within_limits(fit: ORingFit) -> bool:
    """True when stretch, squeeze and fill lie in the ISO 3601-2 static ranges used here."""
    return (0.0 <= fit.stretch <= STRETCH_MAX and SQUEEZE_RANGE[0] <= fit.squeeze <= SQUEEZE_RANGE[1]
            and fit.fill <= FILL_MAX)


def cross_section_for(bore: float) -> float:
    return next(cs for limit, cs in CS_BY_BORE if bore <= limit)


def static_oring(bore: float) -> ORingFit:
    """Choose a static radial O-ring sealing against ``bore`` [mm].

    Tries the cross-section the bore calls for, then the others nearest to it, and returns the
    first series ring whose stretch, squeeze and fill stay in range. Where the bore is past the
    series for its cross-section, returns vulcanised cord. Raises
    :class:`~kit.errors.OutOfSeriesError` for a bore below the smallest gland.

    >>> fit = static_oring(200.0)
    >>> (fit.inside_diameter, fit.cross_section)
    (190.0, 5.3)
    """
    glands = _glands()
    wanted = cross_section_for(bore)
    order = sorted(CROSS_SECTIONS_MM, key=lambda cs: (abs(CROSS_SECTIONS_MM.index(cs) - CROSS_SECTIONS_MM.index(wanted)), -cs))
    for cs in order:
        depth, width = glands[cs]
        d3 = bore - 2 * depth
        sizes = [s for s in series_sizes(cs) if s <= d3]
        if not sizes:
            continue
        if d3 > max(series_sizes(cs)) * (1 + STRETCH_MAX):
            if cs == wanted:
                break  # past the series for this cross-section: cord, not a thinner ring
            continue
        fit = _fit(bore, cs, sizes[-1], depth, width)
        if within_limits(fit):
            return fit
    depth, width = glands[wanted]
    d3 = bore - 2 * depth
    if d3 <= 0 or wanted != CROSS_SECTIONS_MM[-1] and d3 < min(series_sizes(wanted)):
        raise OutOfSeriesError("ISO 3601-1 O-rings", bore, min(series_sizes(CROSS_SECTIONS_MM[0])) + 2 * glands[1.80][0])
    inside = round(d3 / (1 + CORD_STRETCH), 1)
    cut = math.pi * (inside + wanted)
    return _fit(bore, wanted, inside, depth, width, cord=round(cut, 1))
