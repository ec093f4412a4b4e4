# SPDX-License-Identifier: MIT
"""Generic parts and requirement line items: the contract between the engine and its readers.

A *generic part* is named by what any supplier can quote from: a kind and its dimensions
(for example a rod seal housing d 280 x D 300 x L 25 to ISO 5597). Its *key* is a normalised
string, so the same part from two units, two vessels or two suppliers' catalogues is one part.

A *line item* is one requirement: a generic part, how many, in what unit of measure, and the
basis for keeping it (a rule, common practice or company policy).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache

# kind -> (designation template, dimension names in order). Dimensions are in mm.
PART_KINDS: dict[str, tuple[str, tuple[str, ...]]] = {
    "piston_seal": ("piston seal housing D {D} x d {d} x L {L}", ("D", "d", "L")),
    "rod_seal": ("rod seal housing d {d} x D {D} x L {L}", ("d", "D", "L")),
    "stock_seal": ("rotary stock seal housing d {d} x D {D} x L {L}", ("d", "D", "L")),
    "wiper": ("wiper housing d {d} x D {D} x L {L}", ("d", "D", "L")),
    "guide_ring": ("guide ring housing {side} {d} x {D} x L {L}, strip t {t}, cut length {cut}", ("d", "D", "L", "t", "cut")),
    "o_ring": ("O-ring ID {id} x CS {cs}", ("id", "cs")),
    "o_ring_cord": ("O-ring cord CS {cs}, cut length {cut}, vulcanised to a ring", ("cs", "cut")),
    "vane_strip": ("vane seal strip length {length}, for vane height {h}", ("length", "h")),
    "filter_element": ("filter element, {position} filter{ref}", ()),
    "oil": ("hydraulic oil {fluid}", ()),
    "spare": ("{text}", ()),
}


@lru_cache(maxsize=8192)  # a fleet repeats its sizes: tens of thousands of calls, a few thousand values
def fmt_mm(value: float) -> str:
    """A dimension in mm as printed in designations and keys: at most two decimals, no trailing zeros."""
    text = f"{value:.2f}".rstrip("0").rstrip(".")
    return "0" if text == "-0" else text


def part_key(kind: str, dims: dict[str, float], extra: str = "") -> str:
    """Normalised key of a generic part: ``kind:name=value:...`` with dimensions in mm.

    >>> part_key("rod_seal", {"d": 280.0, "D": 300.0, "L": 25.0})
    'rod_seal:d=280:D=300:L=25'
    """
    names = PART_KINDS[kind][1]
    body = ":".join(f"{n}={fmt_mm(dims[n])}" for n in names if n in dims)
    parts = [kind] + ([body] if body else []) + ([extra.strip().lower()] if extra else [])
    return ":".join(parts)


@dataclass(frozen=True)
class LineItem:
    """One requirement: a generic part, a quantity and the reason to keep it.

    ``dims`` are in mm (or empty); ``quantity`` is in ``uom`` (``pcs``, ``L``, ``m``, ``set``).
    ``origin`` says where the dimensions came from (``ISO 5597 series``, ``maker's drawing``, ...).
    """

    unit_id: str
    kind: str
    role: str
    designation: str
    standard: str
    quantity: float
    uom: str
    basis: str
    key: str
    dims: dict[str, float] = field(default_factory=dict)
    compound: str = ""
    origin: str = ""
    note: str = ""
    part: str = ""  # what the part is on the unit, e.g. "ram gland rod seal"
