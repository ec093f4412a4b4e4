# SPDX-License-Identifier: MIT
"""Dates as kit reads them: ISO 8601 calendar dates, YYYY-MM-DD, and nothing else.

Python 3.11's ``date.fromisoformat`` also takes the basic form (``20261205``) and week dates
(``2026-W49-1``), and ``strptime("%Y-%m-%d")`` takes ``2026-1-5``; none of them is the extended
calendar form the README promises (ISO 8601-1:2019, 5.2.2.1), so each is refused rather than read
as some day the user may not have meant.
"""

from __future__ import annotations

import datetime as dt
import re

CALENDAR_DATE = re.compile(r"[0-9]{4}-[0-9]{2}-[0-9]{2}")  # ASCII digits only
EXPECTED = "a date, YYYY-MM-DD (ISO 8601)"


def iso_date(text: str) -> dt.date | None:
    """``text`` as a date if it is an ISO 8601 calendar date YYYY-MM-DD of a real day, else None.

    >>> iso_date("2026-12-05"), iso_date("2026-1-5"), iso_date("20261205"), iso_date("2026-02-30")
    (datetime.date(2026, 12, 5), None, None, None)
    """
    text = text.strip()
    if CALENDAR_DATE.fullmatch(text) is None:
        return None
    try:
        return dt.date.fromisoformat(text)
    except ValueError:
        return None
