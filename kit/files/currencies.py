# SPDX-License-Identifier: MIT
"""Currency codes: the ISO 4217 alphabetic codes, from a table that names its source.

``kit/data/iso4217_2015_currency_codes.csv`` holds every code of the ISO 4217 list as Debian's
iso-codes project carries it (``iso_4217.json``, as shipped in pycountry 26.2.16), checked
against its recorded checksum (:mod:`kit.engine.standard_tables`). It is read on the first catalogue row, never
when kit starts. Codes that name no money a supplier can invoice in are refused too: ``XTS``
(reserved for testing) and ``XXX`` (no currency involved), both so defined by ISO 4217 itself.
"""

from __future__ import annotations

from functools import cache
from typing import Any

from kit.errors import InputError
from kit.files.sheets import Row, Table
from kit.engine.standard_tables import load_table

TABLE = "iso4217_2015_currency_codes.csv"
NOT_MONEY = {"XTS": "a code reserved for testing", "XXX": "the code for no currency"}
EXPECTED = "an ISO 4217 currency code such as EUR, USD, NOK or JPY"


@cache
def codes() -> frozenset[str]:
    """Every alphabetic code in the table, less :data:`NOT_MONEY`."""
    return frozenset(row["code"] for row in load_table(TABLE)) - NOT_MONEY.keys()


def currency_code(table: Table, row: Row, value: Any) -> str:
    """``value`` (a cell) as an ISO 4217 code in capitals, or refused naming the cell."""
    code = value.upper() if isinstance(value, str) else None
    if code not in codes():
        raise table.error(row, "currency", EXPECTED + (f", not {NOT_MONEY[code]}" if code in NOT_MONEY else ""), value)
    return code


def iso_currency(value: str, *, source: str, field: str, error: type[InputError] = InputError) -> str:
    """``value`` (given outside a sheet, e.g. on the command line) as an ISO 4217 code in capitals,
    or ``error`` naming ``source`` and ``field``."""
    code = value.strip().upper()
    if code not in codes():
        raise error(source, field, EXPECTED + (f", not {NOT_MONEY[code]}" if code in NOT_MONEY else ""), got=repr(value))
    return code
