# SPDX-License-Identifier: MIT
"""Seal compounds compatible with the hydraulic fluid.

The table (``kit/data/seal_compound_compatibility.csv``) rates each compound against each
ISO 6743-4 fluid category as ``ok``, ``limited`` (usable with care: temperature, water content)
or ``no``. It is common practice from seal makers' published compatibility charts, not a
standard: the seal maker's confirmation for the actual fluid comes first. The rows for the high
water content fluids HFAE, HFAS and HFB are from memory of such charts (polyurethane hydrolyses
in water, EPDM swells in mineral oil) and say so in their ``provenance``.

Compounds: AU (polyester urethane), NBR (nitrile), HNBR (hydrogenated nitrile), FKM
(fluoroelastomer), EPDM (ethylene propylene diene).
"""

from __future__ import annotations

from dataclasses import dataclass

from kit.errors import IncompatibleFluidError
from kit.engine.standard_tables import load_table

# Preference by seal function: the first compound rated ok is chosen.
PREFERENCE: dict[str, tuple[str, ...]] = {
    "dynamic": ("AU", "NBR", "HNBR", "FKM", "EPDM"),
    "static": ("NBR", "FKM", "HNBR", "EPDM"),
}


@dataclass(frozen=True)
class CompoundChoice:
    compound: str
    rating: str  # "ok" or "limited"
    warning: str | None


def rating(category: str, compound: str) -> str:
    for row in load_table("seal_compound_compatibility.csv"):
        if row["fluid_category"] == category and row["compound"] == compound:
            return row["rating"]
    return "no"


def choose(category: str, function: str, stated: str | None = None) -> CompoundChoice:
    """Pick a compound for seals of ``function`` ("dynamic" or "static") in fluid ``category``.

    A compound ``stated`` in the particulars is kept when it is rated ok, kept with a warning
    when limited, and refused (:class:`~kit.errors.IncompatibleFluidError`) when rated no.
    """
    if stated:
        r = rating(category, stated)
        if r == "no":
            raise IncompatibleFluidError(category, f"{function} seals in {stated}")
        warn = None if r == "ok" else f"{stated} is of limited compatibility with {category}; confirm with the seal maker"
        return CompoundChoice(stated, r, warn)
    limited = None
    for compound in PREFERENCE[function]:
        r = rating(category, compound)
        if r == "ok":
            return CompoundChoice(compound, r, None)
        if r == "limited" and limited is None:
            limited = compound
    if limited:
        return CompoundChoice(limited, "limited",
                              f"no compound fully compatible with {category} for {function} seals; {limited} chosen, confirm with the seal maker")
    raise IncompatibleFluidError(category, f"{function} seals")
