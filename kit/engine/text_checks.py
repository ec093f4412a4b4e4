# SPDX-License-Identifier: MIT
"""The one check every text kit stores passes: no control character.

Control characters (C0 including NUL, DEL and C1) are refused in every text kit stores
(:func:`checked_text`): PostgreSQL cannot store a NUL, openpyxl refuses most C0 characters in a
cell, and an escape sequence on a terminal can rewrite what the user sees. The engine checks the
particulars and the spares policy with it; :mod:`kit.files.safe_text` uses the same pattern for
what is read from sheets and written to files.
"""

from __future__ import annotations

import re

from kit.errors import InputError

# C0 (NUL to US), DEL and C1 (Unicode 15.0, 23.1); and the lone surrogates Python makes of bytes
# that are not UTF-8 (in a command-line argument), which no database or file can encode.
CONTROL = re.compile(r"[\x00-\x1f\x7f-\x9f\ud800-\udfff]")
NO_CONTROL = "text without control characters (tab, newline, NUL, escape and the like) or bytes that are not UTF-8"


def checked_text(value: str, *, source: str, field: str, error: type[InputError] = InputError) -> str:
    """``value`` unchanged, or ``error`` (an :class:`InputError`) naming ``source`` and ``field`` if
    it holds a control character (the one check every stored text passes)."""
    found = CONTROL.search(value)
    if found is not None:
        shown = value if len(value) <= 40 else value[:40] + "..."
        raise error(source, field, NO_CONTROL, got=f"{shown!r}, U+{ord(found.group()):04X} at character {found.start() + 1}")
    return value
