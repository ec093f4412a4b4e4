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

from kit.errors import InputError

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
    "area": ("[length] ** 2", "m**2"),
    "speed": ("[length] / [time]", "m/s"),
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
    "area": '"12.5 m^2"',
    "speed": '"15 kn"',
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


# Factors to SI of the unit words particulars, policies and sheets use most, as pint computes
# them (tests/test_units.py checks every one against pint). With them a file in these units is
# read without importing pint at all; any other unit goes to pint, once per unit word.
COMMON_FACTORS: dict[str, dict[str, float]] = {
    "length": {"mm": 0.001, "m": 1.0, "cm": 0.01, "in": 0.0254, "inch": 0.0254, "ft": 0.30479999999999996},
    "pressure": {"bar": 100000.0, "Pa": 1.0, "kPa": 1000.0, "MPa": 1000000.0, "psi": 6894.7572931683635},
    "flow": {"L/min": 1.666666666666667e-05, "l/min": 1.666666666666667e-05, "L/h": 2.7777777777777787e-07,
             "L/day": 1.1574074074074076e-08, "l/day": 1.1574074074074076e-08, "gal/min": 6.309019639999999e-05,
             "gal/day": 4.381263638888888e-08, "m**3/h": 0.0002777777777777778, "m^3/h": 0.0002777777777777778},
    "volume": {"L": 0.0010000000000000002, "l": 0.0010000000000000002, "litre": 0.0010000000000000002,
               "liter": 0.0010000000000000002, "gal": 0.0037854117839999993, "m**3": 1.0, "m^3": 1.0},
    "time": {"s": 1.0, "min": 60.0, "h": 3600.0, "hour": 3600.0, "hours": 3600.0, "d": 86400.0, "day": 86400.0,
             "days": 86400.0, "week": 604800.0, "weeks": 604800.0, "month": 2629800.0, "months": 2629800.0,
             "year": 31557600.0, "years": 31557600.0},
    "angle": {"deg": 0.017453292519943295, "degree": 0.017453292519943295, "degrees": 0.017453292519943295, "rad": 1.0},
    "mass": {"kg": 1.0, "t": 1000.0},
    "voltage": {"V": 1.0},
    "area": {"m^2": 1.0, "m**2": 1.0},
    "speed": {"kn": 1852 / 3600, "knot": 1852 / 3600, "knots": 1852 / 3600, "m/s": 1.0},  # 1 kn = 1852 m/h
}

# "<number> <unit words>": the number, then the unit as written.
_NUMBER_UNIT = re.compile(r"([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?)\s*(\S.*?)")


@lru_cache(maxsize=1)
def registry():
    """The package's one pint registry, made on first use (pint is slow to import and to set up)."""
    import pint

    return pint.UnitRegistry()


@lru_cache(maxsize=512)
def _factor(unit: str, kind: str) -> float | None:
    """SI value of one ``unit`` of ``kind``, or None when ``unit`` is not of that kind."""
    common = COMMON_FACTORS[kind].get(unit)
    if common is not None:
        return common
    try:
        return _pint_si(f"1 {unit}", kind)
    except _NotOfKind:
        return None


class _NotOfKind(Exception):
    pass


def _pint_si(text: str, kind: str) -> float:
    """``text`` parsed by pint and converted to the SI unit of ``kind``; _NotOfKind if it is not one."""
    import pint

    ureg = registry()
    try:
        q = ureg.Quantity(text)
        if not isinstance(q, pint.Quantity):
            raise _NotOfKind
        _, si = KINDS[kind]
        if kind == "angle":
            if q.dimensionless and str(q.units) not in ("degree", "radian", "arcminute"):
                raise _NotOfKind
        elif q.unitless or q.dimensionality != ureg.Quantity(1, si).dimensionality:
            raise _NotOfKind
        return float(q.to(si).magnitude)
    except (pint.errors.PintError, ValueError, TypeError, AttributeError, SyntaxError, KeyError, OverflowError):
        raise _NotOfKind from None


def a_kind(kind: str) -> str:
    """``kind`` with its article, for messages: "a length", "an area"."""
    return f"{'an' if kind[0] in 'aeiou' else 'a'} {kind}"


def to_si(value: object, kind: str, *, source: str, field: str) -> float:
    """Parse ``value`` (a string with a unit) as a quantity of ``kind`` and return it in SI.

    The number times the unit's factor (asked of pint once per unit word, or taken from
    :data:`COMMON_FACTORS`): pint converts a plain quantity by that same multiplication.
    Raises :class:`~kit.errors.InputError` naming ``source`` and ``field`` when the value is not a
    string, carries no unit, has a unit of another kind, or is not a finite number.
    """
    want = f"{a_kind(kind)} with a unit, e.g. {EXAMPLES[kind]}"
    if isinstance(value, bool) or not isinstance(value, str) or not looks_like_quantity(value.strip()):
        raise InputError(source, field, want, got=repr(value if len(str(value)) <= MAX_TEXT else str(value)[:MAX_TEXT] + "..."))
    text = value.strip()
    plain = _NUMBER_UNIT.fullmatch(text)
    factor = _factor(plain[2], kind) if plain else None
    if factor is None:
        raise InputError(source, field, want, got=repr(value))
    try:
        magnitude = float(plain[1]) * factor
    except OverflowError:
        raise InputError(source, field, want, got=repr(value)) from None
    if not math.isfinite(magnitude):
        raise InputError(source, field, "a finite " + want.removeprefix("a "), got=repr(value))
    return magnitude


def convert(value: float, from_unit: str, to_unit: str) -> float:
    """Convert a float between two units (used at the output edge)."""
    return float(registry().Quantity(value, from_unit).to(to_unit).magnitude)
