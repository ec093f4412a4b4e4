# SPDX-License-Identifier: MIT
"""A pack as a supplier writes it ("20 L", "208 L", "5 US_gal", "10 pcs"), read against the part's
unit of measure: :func:`read_pack` gives its content in that unit and the label as written.

A part counted in pieces (or sets) takes a whole number of pieces, with or without "pcs"; a part
measured in litres or metres takes a volume or a length with a unit, which pint converts.
"""

from __future__ import annotations

import re

from kit.errors import InputError
from kit.engine.units import to_si

_PIECES = re.compile(r"(\d{1,7})\s*(pcs|pc|pieces|piece|sets|set)?", re.IGNORECASE)
# The US liquid gallon under the name catalogues use; pint's "gal" is the US liquid gallon, 231 in^3
# (NIST Handbook 44, appendix C).
_ALIASES = {"us_gal": "gal", "usgal": "gal"}
_MEASURED = {"L": ("volume", 1000.0, '"20 L", "208 L" or "5 US_gal"'), "m": ("length", 1.0, '"50 m"')}
MAX_PACK = 1_000_000  # pieces, litres or metres in one pack


def read_pack(text: object, uom: str, source: str, field: str) -> tuple[float, str]:
    """``text`` as (one pack's content in ``uom``, the label as written), or :class:`InputError`
    naming ``source`` and ``field``."""
    label = " ".join(str(text).split()) if text is not None else ""
    if uom in _MEASURED:
        kind, per_si, example = _MEASURED[uom]
        number, _, unit = label.partition(" ")
        shown = f"{number} {_ALIASES.get(unit.lower(), unit)}" if unit else label
        try:
            content = round(to_si(shown, kind, source=source, field=field) * per_si, 6)
        except InputError:
            raise InputError(source, field, f"the pack's content with its unit, e.g. {example}", got=repr(text)) from None
        if not 0 < content <= MAX_PACK:
            raise InputError(source, field, f"a pack of more than 0 and at most {MAX_PACK:,} {uom}", got=repr(text))
        return content, label
    found = _PIECES.fullmatch(label)
    if found is None or not 1 <= int(found.group(1)) <= MAX_PACK:
        raise InputError(source, field, f'whole pieces in one pack, 1 to {MAX_PACK:,}, e.g. "10 pcs"', got=repr(text))
    return float(found.group(1)), label
