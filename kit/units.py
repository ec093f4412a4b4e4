# SPDX-License-Identifier: MIT
"""Quantities at the edges: one pint registry for the whole package.

Inputs are strings such as ``"280 mm"``, ``"2400 psi"`` or ``"50 gal/min"``. They are parsed
here, checked for the right dimension, and handed to the engine as SI floats (m, Pa, m^3/s,
m^3, s). Nothing inside the engine sees pint.
"""

from __future__ import annotations

import math
import re
from functools import lru_cache

import pint

from kit.errors import InputError

ureg = pint.UnitRegistry()

# What each kind of field is measured in, as a pint dimensionality and its SI unit.
KINDS: dict[str, tuple[str, str]] = {
    "length": ("[length]", "m"),
    "pressure": ("[mass] / [length] / [time] ** 2", "Pa"),
    "flow": ("[length] ** 3 / [time]", "m**3/s"),
    "volume": ("[length] ** 3", "m**3"),
    "time": ("[time]", "s"),
    "angle": ("", "rad"),
    "mass": ("[mass]", "kg"),
    "voltage": ("[mass] * [length] ** 2 / [current] / [time] ** 3", "V"),
}

EXAMPLES = {
    "length": '"280 mm" or "11 in"',
    "pressure": '"160 bar" or "2400 psi"',
    "flow": '"120 L/min" or "50 gal/min"',
    "volume": '"400 L" or "100 gal"',
    "time": '"2000 h" or "6 months"',
    "angle": '"35 deg"',
    "mass": '"25 kg"',
    "voltage": '"24 V"',
}


# What a quantity may look like before pint sees it: a plain number, then unit words joined by
# spaces, ``/``, ``*`` or ``.``, with one-digit powers (``m**3``, ``m^3``). pint evaluates the
# text as arithmetic, so "9**9**9 mm" would tie up the process and "1 mm * 10**400" would
# overflow; neither is a measurement, and neither reaches pint.
MAX_TEXT = 60
_QUANTITY = re.compile(
    r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?\s*"
    r"(?:[^\W\d]|[°µ])(?:[^\W\d]|[°µ\s/*.]|(?:\*\*|\^)-?\d(?!\s*(?:\*\*|\^)))*"
)


def looks_like_quantity(text: str) -> bool:
    """True if ``text`` is a plain number followed by a unit, short enough to parse safely."""
    return len(text) <= MAX_TEXT and _QUANTITY.fullmatch(text) is not None


@lru_cache(maxsize=4096)
def _parse(text: str) -> pint.Quantity:
    return ureg.Quantity(text)


def to_si(value: object, kind: str, *, source: str, field: str) -> float:
    """Parse ``value`` (a string with a unit) as a quantity of ``kind`` and return it in SI.

    Raises :class:`~kit.errors.InputError` naming ``source`` and ``field`` when the value is not a
    string, carries no unit, has a unit of another kind, or is not a finite number.
    """
    want = f"a {kind} with a unit, e.g. {EXAMPLES[kind]}"
    if isinstance(value, bool) or not isinstance(value, str) or not looks_like_quantity(value.strip()):
        raise InputError(source, field, want, got=repr(value if len(str(value)) <= MAX_TEXT else str(value)[:MAX_TEXT] + "..."))
    try:
        q = _parse(value.strip())
    except (pint.errors.PintError, ValueError, TypeError, AttributeError, SyntaxError, KeyError, OverflowError):
        raise InputError(source, field, want, got=repr(value)) from None
    if not isinstance(q, pint.Quantity):
        raise InputError(source, field, want, got=repr(value))
    dim, si = KINDS[kind]
    if kind == "angle":
        if q.dimensionless and str(q.units) not in ("degree", "radian", "arcminute"):
            raise InputError(source, field, want, got=repr(value))
    elif q.unitless or q.dimensionality != ureg.Quantity(1, si).dimensionality:
        raise InputError(source, field, want, got=repr(value))
    try:
        magnitude = float(q.to(si).magnitude)
    except (pint.errors.PintError, TypeError, ValueError, OverflowError):
        raise InputError(source, field, want, got=repr(value)) from None
    if not math.isfinite(magnitude):
        raise InputError(source, field, "a finite " + want.removeprefix("a "), got=repr(value))
    return magnitude


def convert(value: float, from_unit: str, to_unit: str) -> float:
    """Convert a float between two units (used at the output edge)."""
    return float(ureg.Quantity(value, from_unit).to(to_unit).magnitude)
