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
The band tables transcribed from these are marked ``from memory`` in ``kit/data`` except where a
row names the public source it was confirmed from: check every series housing against the maker's
drawing before ordering.

Scope. Each table records the sizes its standard covers (``kit.engine.standard_tables.SCOPES``). A size past that
scope but inside the table is sized by the series' proportions and labelled as kit's extrapolation
(``Housing.past_scope`` says which scope it is past), never as the ISO size.

Wiper housing type. ISO 6195:2013 has five housing types: A (undercut or separate cover,
elastomeric wiper), B (open, press-fit wiper with a rigid case), C (undercut, the preferred housing
for double-lip wipers without a rigid case), D (undercut, elastomer-energised plastic-faced
wipers) and E (undercut or cover, the preferred housing for single-lip wipers). kit sizes type C:
on a steering ram a double lip both keeps salt and dirt out and holds back the oil film past the
rod seal, and an elastomeric wiper in an undercut is changed without pressing out a metal case.

Oscillating service. ISO 5597 is for reciprocating seals. The stock and hub seals of a rotary vane
actuator oscillate; kit sizes their housings by the ISO 5597 rod proportions and labels them as
kit's sizing for oscillating service, not as ISO 5597 housings.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from kit.errors import OutOfSeriesError
from kit.engine.standard_tables import SCOPES, load_table

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
    past_scope: str = ""  # the standard's scope this size lies past ("" within it)

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
    return tuple(r for r in load_table(ISO_5597) if r["role"] == role)


ISO_5597 = "iso5597_2018_housing_bands.csv"
ISO_6195 = "iso6195_2013_wiper_bands.csv"
ISO_10766 = "iso10766_2015_guide_bands.csv"


def _labels(table: str, side: str, nominal_mm: float, standard: str) -> tuple[str, str, str]:
    """(standard, origin, past_scope) for a series size: the standard's own label within its scope,
    kit's extrapolation past it."""
    scope = SCOPES[table]
    if scope.covers(side, nominal_mm):
        return standard, f"{standard} series", ""
    return (f"kit extrapolation of {standard}", f"kit's extrapolation of the {standard} series past its scope",
            scope.text(side))


def rod_seal_housing(rod_mm: float, length: str = "medium") -> Housing:
    """Rod seal housing for a rod (or ram) of diameter ``rod_mm``: D = d + 2 S (ISO 5597).

    >>> h = rod_seal_housing(280)
    >>> (h.d, h.D, h.L)
    (280, 310.0, 25.0)
    """
    row = _band(_seal_rows("rod"), rod_mm, "ISO 5597 rod seal housings")
    s = float(row["radial_section_mm"])
    standard, origin, past = _labels(ISO_5597, "rod", rod_mm, "ISO 5597")
    return Housing("rod", rod_mm, rod_mm + 2 * s, float(row[f"length_{length}_mm"]), standard, origin, past_scope=past)


def oscillating_seal_housing(d_mm: float, length: str = "medium") -> Housing:
    """Housing of a rotary vane stock or hub seal (oscillating service) on a diameter ``d_mm``:
    sized by the ISO 5597 rod proportions, labelled as kit's sizing (module docstring)."""
    rod = rod_seal_housing(d_mm, length)
    extrapolated = " past its scope" if rod.past_scope else ""
    return Housing("stock", rod.d, rod.D, rod.L, "kit sizing for oscillating service (ISO 5597 rod proportions)",
                   f"kit's sizing by the ISO 5597 rod series{extrapolated} for an oscillating seal "
                   "(ISO 5597 is for reciprocating seals)", past_scope=rod.past_scope)


def piston_seal_housing(bore_mm: float, length: str = "medium") -> Housing:
    """Piston seal housing in a bore ``bore_mm``: groove diameter d = D - 2 S (ISO 5597)."""
    row = _band(_seal_rows("piston"), bore_mm, "ISO 5597 piston seal housings")
    s = float(row["radial_section_mm"])
    standard, origin, past = _labels(ISO_5597, "piston", bore_mm, "ISO 5597")
    return Housing("piston", bore_mm - 2 * s, bore_mm, float(row[f"length_{length}_mm"]), standard, origin, past_scope=past)


def wiper_housing(rod_mm: float) -> Housing:
    """Wiper-ring housing for a rod ``rod_mm`` (ISO 6195, housing type C): D = d + 2 S_w."""
    row = _band(load_table(ISO_6195), rod_mm, "ISO 6195 wiper housings")
    s = float(row["radial_section_mm"])
    standard, origin, past = _labels(ISO_6195, "rod", rod_mm, f"ISO 6195 type {row['housing_type']}")
    return Housing("wiper", rod_mm, rod_mm + 2 * s, float(row["length_mm"]), standard, origin, past_scope=past)


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
    row = _band(load_table(ISO_10766), nominal_mm, "ISO 10766 guide ring housings")
    t, width = float(row["thickness_mm"]), float(row["width_mm"])
    if side == "piston":
        d, D, mean = nominal_mm - 2 * t, nominal_mm, nominal_mm - t
    else:
        d, D, mean = nominal_mm, nominal_mm + 2 * t, nominal_mm + t
    standard, origin, past = _labels(ISO_10766, side, nominal_mm, "ISO 10766")
    return Housing("guide", d, D, width, standard, origin, {"t": t, "cut": round(guide_cut_length(mean), 1)}, side, past)
