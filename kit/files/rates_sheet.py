# SPDX-License-Identifier: MIT
"""A small CSV of exchange rates read and checked, every cell (kit fetches no rate itself).

One row per rate, into the base currency set with ``kit purchasing set``:

============  ====================================================================================
``currency``  an ISO 4217 alphabetic code (:mod:`kit.files.currencies`), not the base currency
``rate``      units of the base currency one unit of ``currency`` is worth: a plain decimal above
              0, at most :data:`MAX_RATE`, in the file's decimal mark (:mod:`kit.files.numbers`)
``set_on``    the day the rate was set, YYYY-MM-DD (:mod:`kit.files.dates`), not after today
``source``    where it came from (a bank's reference rate, an invoice): text without control
              characters (:mod:`kit.files.safe_text`)
============  ====================================================================================

The same currency twice on one day is refused. The file is refused whole at its first bad cell,
naming file, line and column, so an import is all or nothing.
"""

from __future__ import annotations

import datetime as dt
import math
from pathlib import Path

from kit.engine.purchasing import Rate
from kit.errors import InputError
from kit.files.currencies import currency_code
from kit.files.dates import EXPECTED as DATE_EXPECTED, iso_date
from kit.files.numbers import decimal_mark, number
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Table, read_table

SHEET = "rates"
COLUMNS = ("currency", "rate", "set_on", "source")
# Units of the base currency per unit of another: far above any real pair (a strong currency
# against one of small units is some 10**5), far inside a double.
MAX_RATE = 1e9
RATE_EXPECTED = (f"units of the base currency one unit of the currency is worth, a number above 0 and at most "
                 f"{MAX_RATE:,.0f}")
MAX_SOURCE_CHARS = 200


def checked_rate(value: float) -> bool:
    """Whether ``value`` is a rate kit stores: above 0 and at most :data:`MAX_RATE`."""
    return 0 < value <= MAX_RATE


def rate_date_expected(today: dt.date) -> str:
    return f"the day the rate was set, not after today ({today.isoformat()}): kit records rates, it forecasts none"


def _set_on(table: Table, row: Row, today: dt.date) -> dt.date:
    value = row.values.get("set_on")
    day = iso_date(value) if isinstance(value, str) else None
    if day is None:
        raise table.error(row, "set_on", DATE_EXPECTED, value if value is not None else "an empty cell")
    if day > today:
        raise table.error(row, "set_on", rate_date_expected(today), day.isoformat())
    return day


def _source(table: Table, row: Row) -> str:
    value = row.values.get("source")
    if value is None:
        raise table.error(row, "source", "where the rate came from, e.g. bank reference rate", "an empty cell")
    if CONTROL.search(value):
        raise table.error(row, "source", NO_CONTROL, value)
    if len(value) > MAX_SOURCE_CHARS:
        raise table.error(row, "source", f"at most {MAX_SOURCE_CHARS} characters", value[:40] + "...")
    return value


def read_rates(path: str | Path, base: str, decimal: str | None = None, today: dt.date | None = None) -> list[Rate]:
    """The rates of the CSV file ``path`` into ``base``, every cell checked (:class:`InputError` at
    the first bad one). ``decimal`` is the decimal mark ("point", "comma"; None: by the separator)."""
    source = str(path)
    if Path(path).suffix.lower() != ".csv":
        raise InputError(source, "file", "a .csv file of exchange rates", got=repr(Path(path).suffix or "no suffix"))
    day = today or dt.date.today()
    table = read_table(path, SHEET, known=COLUMNS, required=COLUMNS)
    mark = decimal_mark(table, decimal)
    seen: dict[tuple[str, dt.date], int] = {}
    out = []
    for row in table.rows:
        currency = currency_code(table, row, row.values.get("currency"))
        if currency == base:
            raise table.error(row, "currency", f"a currency other than the base currency {base} (its rate is 1)", currency)
        rate = number(table, row, "rate", mark, minimum=None, maximum=math.inf)  # plain and finite; bounds below
        if rate is None or not checked_rate(rate):
            raise table.error(row, "rate", RATE_EXPECTED, "an empty cell" if rate is None else row.values["rate"])
        set_on = _set_on(table, row, day)
        if (currency, set_on) in seen:
            raise table.error(row, "currency", f"each currency once per day (already on {table.where(seen[currency, set_on])})",
                              currency)
        seen[currency, set_on] = row.line
        out.append(Rate(currency, base, rate, set_on, _source(table, row)))
    if not out:
        raise InputError(source, "rows", "at least one rate below the header row", got="none")
    return out
