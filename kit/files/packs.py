# SPDX-License-Identifier: MIT
"""A supplier's pack, as a catalogue or reply writes it ("20 L", "208 L", "5 US_gal", "10 pcs"),
read into the part's unit of measure.

Oil is counted in litres (``L``): its pack is a volume with a unit, parsed by the project's pint
registry (:mod:`kit.engine.units`). Parts counted in pieces (``pcs``, ``set``) take a whole number
of pieces with a count word (``10 pcs``, ``1 set``). A cord counted in metres (``m``) takes a length.
A pack in any other unit than the part's is refused with one line; so is a gallon, quart, pint or
barrel that does not say whether it is US or imperial (``US_gal``, ``imp_gal``).
"""

from __future__ import annotations

import math
import re

from kit.errors import InputError
from kit.engine.units import MAX_TEXT, to_si
from kit.files.numbers import MAX_PACK_QTY

# Count words of a pack of pieces (our own short list; a set is one piece of a kit counted in sets).
COUNT_WORDS = {"pcs": 1, "pc": 1, "piece": 1, "pieces": 1, "ea": 1, "each": 1, "set": 1, "sets": 1}
# Gallon spellings of the trade that pint's registry lacks, as pint's own names.
ALIASES = {"US_gal": "US_liquid_gallon", "USgal": "US_liquid_gallon", "imp_gal": "imperial_gallon",
           "UK_gal": "imperial_gallon"}
# Units whose size differs between US customary and imperial measure (a US gallon is 3.785 L, an
# imperial one 4.546 L: NIST Handbook 44, Appendix C), or that pint reads as a US liquid barrel
# where the oil trade's barrel is 42 US gallons: refused unless named as US or imperial.
AMBIGUOUS = {"gal", "gallon", "gallons", "qt", "quart", "quarts", "pt", "pint", "pints", "fluid_ounce", "fluid_ounces",
             "floz", "cup", "cups", "barrel", "barrels", "bbl"}
AMBIGUOUS_HINT = "a gallon, quart, pint or barrel named as US or imperial (5 US_gal, 5 imp_gal)"
_COUNT = re.compile(r"([0-9]{1,7})\s*([A-Za-z]+)")
_WORD = re.compile(r"[A-Za-z_]+")
# The unit of measure of each part kind as kit's requirements count it (kit.engine.requirements).
VOLUME_UOMS = {"L": 1.0}  # litres per uom
LENGTH_UOMS = {"m": 1.0}
COUNT_UOMS = ("pcs", "set")


def uom_of_kind(kind: str) -> str:
    """The unit of measure kit counts a part kind in: litres for oil, pieces for everything else."""
    return "L" if kind == "oil" else "pcs"


def _want(uom: str) -> str:
    if uom in VOLUME_UOMS:
        return 'a volume with a unit, e.g. "20 L", "208 L" or "5 US_gal" (the part is counted in litres)'
    if uom in LENGTH_UOMS:
        return 'a length with a unit, e.g. "10 m" (the part is counted in metres)'
    return 'a whole number of pieces, e.g. "10 pcs" or "1 set" (the part is counted in pieces)'


def read_pack(text: object, uom: str, source: str, field: str) -> tuple[float, str]:
    """One pack's content in ``uom`` and its label as written (spaces tidied).

    Refused (one-line :class:`~kit.errors.InputError` naming ``source`` and ``field``) unless the
    pack is a positive quantity of the part's kind, at most 1,000,000 of ``uom``.

    >>> read_pack("208 L", "L", "cat.csv, line 2", "column pack")
    (208.0, '208 L')
    >>> round(read_pack("5 US_gal", "L", "cat.csv, line 3", "column pack")[0], 4)
    18.9271
    """
    want = _want(uom)
    if isinstance(text, bool) or not isinstance(text, str):
        raise InputError(source, field, want, got="an empty cell" if text is None else repr(text))
    label = " ".join(text.split())
    if not label or len(label) > MAX_TEXT:
        raise InputError(source, field, want, got=repr(label[:MAX_TEXT] + ("..." if len(label) > MAX_TEXT else "")))
    if uom in COUNT_UOMS:
        found = _COUNT.fullmatch(label)
        if found is None or found[2].lower() not in COUNT_WORDS:
            raise InputError(source, field, want, got=repr(label))
        content = float(int(found[1]))
    else:
        kind = "volume" if uom in VOLUME_UOMS else "length" if uom in LENGTH_UOMS else None
        if kind is None:
            raise ValueError(f"no pack reading for unit of measure {uom!r}")
        if any(w.lower() in AMBIGUOUS for w in _WORD.findall(label)):
            raise InputError(source, field, f"{want}, {AMBIGUOUS_HINT}", got=repr(label))
        spelled = _WORD.sub(lambda w: ALIASES.get(w[0], w[0]), label)
        try:
            si = to_si(spelled, kind, source=source, field=field)
        except InputError:
            raise InputError(source, field, want, got=repr(label)) from None
        content = si * 1000.0 / VOLUME_UOMS[uom] if kind == "volume" else si / LENGTH_UOMS[uom]
        content = round(content, 6)  # 5 US_gal = 18.927059 L: a millilitre's accuracy is plenty
    if not (math.isfinite(content) and 0 < content <= MAX_PACK_QTY):
        raise InputError(source, field, f"{want}, more than 0 and at most {MAX_PACK_QTY:,} {uom}", got=repr(label))
    return content, label
