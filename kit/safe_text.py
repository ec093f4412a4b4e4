# SPDX-License-Identifier: MIT
"""Text from users and suppliers must never become a formula in a spreadsheet kit writes.

A spreadsheet program treats a cell or CSV field that starts with ``=``, ``+``, ``-``, ``@``, a tab
or a carriage return as a formula (OWASP, "CSV Injection"). In an xlsx kit writes such text as a
string cell, which no program evaluates; in a CSV it is prefixed with a single quote.
"""

from __future__ import annotations

TRIGGERS = ("=", "+", "-", "@", "\t", "\r")


def is_risky(value: object) -> bool:
    return isinstance(value, str) and value.startswith(TRIGGERS)


def csv_field(value: object) -> object:
    """A value safe to put in a CSV field: risky text gets a leading single quote."""
    return "'" + value if is_risky(value) else value


def from_csv_field(value: str) -> str:
    """The text :func:`csv_field` was given: a leading quote before a formula character dropped."""
    return value[1:] if value.startswith("'") and is_risky(value[1:]) else value
