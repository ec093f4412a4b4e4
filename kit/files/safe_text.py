# SPDX-License-Identifier: MIT
"""Text from users and suppliers must never become a formula, nor carry a control character.

A spreadsheet program treats a cell or CSV field that starts with ``=``, ``+``, ``-``, ``@``, a tab
or a carriage return as a formula (OWASP, "CSV Injection"). In an xlsx kit writes such text as a
string cell, which no program evaluates; in a CSV it is prefixed with a single quote.

Control characters (C0 including NUL, DEL and C1) are refused in every text kit stores
(:func:`checked_text`): PostgreSQL cannot store a NUL, openpyxl refuses most C0 characters in a
cell, and an escape sequence on a terminal can rewrite what the user sees. Text already stored
(written by another program) has each of them replaced by U+FFFD by every writer
(:func:`visible`), so it can never crash a command or reach a file or terminal raw.
"""

from __future__ import annotations

import re
from typing import Any, Callable

from kit.errors import InputError

TRIGGERS = ("=", "+", "-", "@", "\t", "\r")
# C0 (NUL to US), DEL and C1 (Unicode 15.0, 23.1); and the lone surrogates Python makes of bytes
# that are not UTF-8 (in a command-line argument), which no database or file can encode.
CONTROL = re.compile(r"[\x00-\x1f\x7f-\x9f\ud800-\udfff]")
REPLACEMENT = "\ufffd"
NO_CONTROL = "text without control characters (tab, newline, NUL, escape and the like) or bytes that are not UTF-8"


def checked_text(value: str, *, source: str, field: str, error: type[InputError] = InputError) -> str:
    """``value`` unchanged, or ``error`` (an :class:`InputError`) naming ``source`` and ``field`` if
    it holds a control character (the one check every stored text passes)."""
    found = CONTROL.search(value)
    if found is not None:
        shown = value if len(value) <= 40 else value[:40] + "..."
        raise error(source, field, NO_CONTROL, got=f"{shown!r}, U+{ord(found.group()):04X} at character {found.start() + 1}")
    return value


def visible(value: Any) -> Any:
    r"""``value`` with every control character replaced by U+FFFD (other values as they are).

    >>> visible("seal\x00kit\x1b[2J") == "seal\ufffdkit\ufffd[2J", visible(12.5)
    (True, 12.5)
    """
    if isinstance(value, str) and CONTROL.search(value) is not None:
        return CONTROL.sub(REPLACEMENT, value)
    return value


def each_text(value: Any, change: Callable[[str], Any]) -> Any:
    """``value`` (dicts and lists of any depth, as for JSON) with ``change`` applied to every text
    in it, keys included."""
    if isinstance(value, dict):
        return {change(k) if isinstance(k, str) else k: each_text(v, change) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [each_text(v, change) for v in value]
    return change(value) if isinstance(value, str) else value


def is_risky(value: object) -> bool:
    return isinstance(value, str) and value.startswith(TRIGGERS)


def csv_field(value: object) -> object:
    """A value safe to put in a CSV field: control characters replaced, risky text gets a leading
    single quote."""
    value = visible(value)
    return "'" + value if is_risky(value) else value


def from_csv_field(value: str) -> str:
    """The text :func:`csv_field` was given: a leading quote before a formula character dropped."""
    return value[1:] if value.startswith("'") and is_risky(value[1:]) else value
