# SPDX-License-Identifier: MIT
"""Hydraulic fluids: ISO 3448 viscosity grades, ISO 6743-4 categories and densities.

References
----------
ISO 3448:1992, Industrial liquid lubricants -- ISO viscosity classification, table 1: each grade
VG n is the kinematic viscosity midpoint at 40 degC in mm^2/s, with limits of +-10 %.
ISO 6743-4:2015, Lubricants -- Classification -- Part 4: Family H (hydraulic systems).
"""

from __future__ import annotations

from kit.engine.standard_tables import load_table


def _grades() -> dict[int, tuple[float, float, float]]:
    return {int(r["grade"]): (float(r["midpoint_mm2_s"]), float(r["min_mm2_s"]), float(r["max_mm2_s"]))
            for r in load_table("iso3448_1992_viscosity_grades.csv")}


ISO_3448_GRADES: dict[int, tuple[float, float, float]] = _grades()

# ISO 6743-4 category -> broad family, used to pick seal compounds and densities.
FAMILY: dict[str, str] = {
    "HL": "mineral", "HM": "mineral", "HV": "mineral", "HG": "mineral", "HH": "mineral", "HR": "mineral",
    "HETG": "vegetable", "HEES": "synthetic ester", "HEPG": "polyglycol", "HEPR": "polyalphaolefin",
    "HFAE": "oil-in-water emulsion", "HFAS": "aqueous solution", "HFB": "water-in-oil emulsion",
    "HFC": "water glycol", "HFDR": "phosphate ester", "HFDU": "other synthetic",
}

# Density at 15 degC in kg/L, typical of the family (common practice; the oil's data sheet wins).
DENSITY_KG_PER_L: dict[str, float] = {
    "mineral": 0.87, "vegetable": 0.92, "synthetic ester": 0.92, "polyglycol": 1.00,
    "polyalphaolefin": 0.84, "water glycol": 1.07, "phosphate ester": 1.13, "other synthetic": 0.95,
    # HFA fluids are some 95 % water; HFB about 40 % water in oil (from memory).
    "oil-in-water emulsion": 1.00, "aqueous solution": 1.00, "water-in-oil emulsion": 0.93,
}


def viscosity_limits(grade: int) -> tuple[float, float]:
    """Kinematic viscosity limits at 40 degC [mm^2/s] of ISO 3448 grade ``grade``.

    >>> viscosity_limits(46)
    (41.4, 50.6)
    """
    _, low, high = ISO_3448_GRADES[grade]
    return low, high


def density_kg_per_l(category: str) -> float:
    """Typical density [kg/L] of a fluid of ISO 6743-4 ``category`` (common practice)."""
    return DENSITY_KG_PER_L[FAMILY[category]]
