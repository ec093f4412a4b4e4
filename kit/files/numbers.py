# SPDX-License-Identifier: MIT
"""Numbers in imported sheets: plain decimals in an explicit style, finite and bounded.

A number in a sheet is a plain decimal: an optional sign, digits and at most one decimal mark.
Which mark is the decimal one is never guessed from the value: a semicolon-separated CSV is
read with a decimal comma (the usual export of spreadsheet programs where the comma is the
decimal mark), a comma- or tab-separated CSV and the text cells of a workbook with a decimal
point, and the caller states it for a file (the command line's ``--decimal-mark point|comma``). A value with a grouping
separator (``1,250.00``, ``1.250,00``, ``1 250``, ``1'250``), the other decimal mark, an exponent,
infinity or NaN is refused, naming the style in force and how to change it: the setting by its
neutral name, :data:`SETTING`, which the command line replaces with its option
(``OPTIONS`` in kit/commands/common.py).

Every number also has bounds, so nothing overflows a database column or a sum: the whole
numbers (pack sizes, lead times, days) stay far inside a 32-bit signed integer, which is
PostgreSQL's ``integer`` (SQLite's is 64-bit), and the decimals far inside a double.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

from kit.errors import ArgumentError, InputError

if TYPE_CHECKING:  # only for annotations: the CLI's option types import this module at start-up
    from kit.files.sheets import Row, Table

# Decimal mark -> what it looks like, and the pattern of a plain decimal written with it.
MARKS = {"point": ".", "comma": ","}
_PLAIN = {name: re.compile(rf"[+-]?(?:[0-9]+(?:{re.escape(mark)}[0-9]*)?|{re.escape(mark)}[0-9]+)") for name, mark in MARKS.items()}
# A CSV's separator -> the decimal mark its numbers are read with (unless the caller states one).
SEPARATOR_MARK = {";": "comma", ",": "point", "\t": "point"}
SEPARATOR_NAMES = {";": "semicolon", ",": "comma", "\t": "tab"}
EXAMPLES = {"point": "12.50", "comma": "12,50"}
SETTING = "decimal mark"  # the setting's neutral name in messages; a face names it its own way
# Longer text is no plain number a person typed (and Python's int() refuses past 4,300 digits).
MAX_CHARS = 40

# Bounds of the whole numbers kit stores (each far inside 2**31 - 1 = 2,147,483,647).
MAX_PACK_QTY = 1_000_000  # pieces, litres or metres in one pack
MAX_DAYS = 3650  # ten years: lead times, days of cover, periods and voyages
# Bounds of the decimals kit stores.
MAX_PRICE = 1e12  # per pack, in any currency (a large pack in a currency of small units)
MAX_QUANTITY = 1e9  # on-board stock of one part at one place, pcs, L or m


@dataclass(frozen=True)
class DecimalMark:
    """The decimal mark in force for one file, and why (for the refusal message)."""

    name: str  # "point" or "comma"
    why: str  # the default's reason; empty when the caller stated the mark

    def expected(self, setting: str = SETTING) -> str:
        """What a number must look like, naming ``setting`` (how the mark is stated) as the way to change it."""
        other = "comma" if self.name == "point" else "point"
        why = self.why or f"{setting} {self.name}"
        return (f"a plain number with a decimal {self.name}, e.g. {EXAMPLES[self.name]}, and no grouping separators "
                f"(decimal {self.name}: {why}; {setting} {other} reads {EXAMPLES[other]})")


@dataclass
class NotPlainNumberError(InputError):
    """A number that is not plain under the decimal mark in force. The message names the setting
    that states the mark by ``setting`` (:data:`SETTING`; the command line puts its option there)."""

    mark: DecimalMark | None = None
    setting: str = SETTING

    def __str__(self) -> str:
        if self.mark is None:
            return super().__str__()
        return str(InputError(self.source, self.field, self.mark.expected(self.setting), self.got))


def decimal_mark(table: Table, given: str | None) -> DecimalMark:
    """The decimal mark for ``table``: ``given`` (the option), else the CSV separator's, else point."""
    if given is not None:
        if given not in MARKS:
            raise ArgumentError(table.path, SETTING, "one of " + ", ".join(MARKS), got=repr(given))
        return DecimalMark(given, "")
    separator = table.separator
    if separator is None:
        return DecimalMark("point", "the default for text in a workbook's cells")
    return DecimalMark(SEPARATOR_MARK[separator], f"the default for a {SEPARATOR_NAMES[separator]}-separated CSV")


def plain_decimal(mark: str) -> re.Pattern:
    """The pattern a plain decimal with ``mark`` ("point" or "comma") fully matches (see :func:`parse_decimal`)."""
    return _PLAIN[mark]


def parse_decimal(text: str, mark: str) -> float | None:
    """``text`` as a float if it is a plain decimal with ``mark`` ("point" or "comma"), else None.

    >>> parse_decimal("12,50", "comma"), parse_decimal("1.250,00", "comma"), parse_decimal("12,50", "point")
    (12.5, None, None)
    """
    if len(text) > MAX_CHARS or _PLAIN[mark].fullmatch(text) is None:
        return None
    return float(text.replace(",", ".") if mark == "comma" else text)


def days_typed(text: str, source: str = "") -> float:
    """A period typed into a form, in days: a plain decimal with a point, more than 0 and at most
    :data:`MAX_DAYS`; anything else (text, a sign, NaN, an exponent, zero) is refused by
    :class:`ArgumentError` ("days").

    >>> days_typed(" 90 "), days_typed("0.5")
    (90.0, 0.5)
    """
    number = parse_decimal(text.strip(), "point")
    if number is None or not 0 < number <= MAX_DAYS:
        raise ArgumentError(source, "days", f"a plain number of days more than 0 and at most {MAX_DAYS}, e.g. 90",
                            got=repr(text[:MAX_CHARS]))
    return number


def number(table: Table, row: Row, column: str, mark: DecimalMark, *, minimum: float | None = 0.0,
           maximum: float) -> float | None:
    """The decimal in ``column`` of ``row`` (None when empty), refused unless plain, finite and in bounds."""
    value = row.values.get(column)
    if value is None:
        return None
    if isinstance(value, str):
        parsed = parse_decimal(value, mark.name)
        if parsed is None:
            refused = table.error(row, column, mark.expected(), value if len(value) <= MAX_CHARS else value[:MAX_CHARS] + "...")
            raise NotPlainNumberError(refused.source, refused.field, refused.expected, refused.got, mark)
        value = parsed
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise table.error(row, column, "a finite number", value)
    low = -maximum if minimum is None else minimum
    if not low <= value <= maximum:
        raise table.error(row, column, f"a number from {low:,.0f} to {maximum:,.0f}", value)
    return float(value)


def whole_number(table: Table, row: Row, column: str, minimum: int, maximum: int,
                 default: int | None = None) -> int | None:
    """The whole number in ``column`` of ``row`` (``default`` when empty), from ``minimum`` to ``maximum``."""
    raw: Any = row.values.get(column)
    if raw is None:
        return default
    value = raw
    if isinstance(raw, str) and len(raw) <= MAX_CHARS and raw.isascii() and raw.isdigit():  # "²" isdigit too
        value = int(raw)
    elif isinstance(raw, float) and math.isfinite(raw) and raw.is_integer():
        value = int(raw)
    if isinstance(value, bool) or not isinstance(value, int) or not minimum <= value <= maximum:
        shown = raw[:MAX_CHARS] + "..." if isinstance(raw, str) and len(raw) > MAX_CHARS else raw
        raise table.error(row, column, f"a whole number from {minimum:,} to {maximum:,}", shown)
    return value
