# SPDX-License-Identifier: MIT
"""Text from users and suppliers must never become a formula, nor carry a control character.

A spreadsheet program treats a cell or CSV field that starts with ``=``, ``+``, ``-``, ``@``, a tab
or a carriage return as a formula (OWASP, "CSV Injection"). In an xlsx kit writes such text as a
string cell, which no program evaluates; in a CSV it is prefixed with a single quote.

Control characters (C0 including NUL, DEL and C1) are refused in every text kit stores
(:func:`checked_text`, kept in :mod:`kit.engine.text_checks` so the engine's checks share it):
PostgreSQL cannot store a NUL, openpyxl refuses most C0 characters in a cell, and an escape
sequence on a terminal can rewrite what the user sees. Text already stored (written by another
program) has each of them replaced by U+FFFD by every writer (:func:`visible`), so it can never
crash a command or reach a file or terminal raw.
"""

from __future__ import annotations

from typing import Any, Callable

from kit.engine.text_checks import CONTROL, NO_CONTROL, checked_text

__all__ = ["CONTROL", "NO_CONTROL", "REPLACEMENT", "TRIGGERS", "checked_text", "csv_field", "each_text", "from_csv_field",
           "is_risky", "visible"]

TRIGGERS = ("=", "+", "-", "@", "\t", "\r")
REPLACEMENT = "\ufffd"


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
