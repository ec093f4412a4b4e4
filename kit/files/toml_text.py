# SPDX-License-Identifier: MIT
"""TOML text to a dict, with its nesting bounded before the parser sees it.

``tomllib`` parses arrays and inline tables by recursion, so ``a = [[[[...`` a few hundred
deep exhausts the interpreter's stack; and it builds a dotted key (``a.b.c...``) in time that
grows with the square of its parts (16,000 parts: 12 s). :func:`nesting_depth` counts both
with a small scanner that skips strings and comments, and :func:`parse_toml` refuses past
:data:`MAX_DEPTH` before parsing.
"""

from __future__ import annotations

import re
import tomllib
from typing import Any

from kit.errors import InputError

# Arrays, inline tables, table headers and the dots of a dotted key, counted together.
# kit's own files nest at most 3 deep ([[unit.filter]]).
MAX_DEPTH = 32

_TOKEN = re.compile(
    r'"""(?:[^"\\]|\\[\s\S]|"(?!""))*"""(?:""?)?'  # multi-line basic string (up to two quotes
    r"|'''[\s\S]*?'''(?:''?)?"                       # may close it), multi-line literal string
    r'|"(?:[^"\\\n]|\\.)*"'                          # basic string
    r"|'[^'\n]*'"                                    # literal string
    r"|#[^\n]*"                                      # comment
    r"|[\[\]{}.\n,=]"                                # what the count looks at
)
_OPENING, _CLOSING, _ENDS_KEY = "[{", "]}", "\n,="


def nesting_depth(text: str, limit: int = MAX_DEPTH) -> tuple[int, int]:
    """The deepest nesting in ``text`` (brackets and braces open, plus the dots of the dotted key
    being read) and the line where it is first reached; the scan stops past ``limit``.

    A dot counts as a key part until ``=``, a comma, a newline or a bracket ends the key; a float
    value's one dot may add one to the count (a bound, never less than the truth).
    """
    depth = dots = deepest = 0
    line = where = 1
    for match in _TOKEN.finditer(text):
        token = match.group()
        char = token[0]
        if char in "\"'#":
            line += token.count("\n")
            continue
        if char == ".":
            dots += 1
        elif char in _OPENING:
            depth, dots = depth + 1, 0
        elif char in _CLOSING:
            depth, dots = max(0, depth - 1), 0
        else:  # newline, comma, equals sign: a key ends here
            dots = 0
            line += char == "\n"
        if depth + dots > deepest:
            deepest, where = depth + dots, line
            if deepest > limit:
                break
    return deepest, where


def parse_toml(text: str, source: str) -> dict[str, Any]:
    """Parse ``text`` (from ``source``) once its nesting is known to be at most :data:`MAX_DEPTH`."""
    deepest, line = nesting_depth(text)
    if deepest > MAX_DEPTH:
        raise InputError(source, "file", f"TOML nested at most {MAX_DEPTH} deep (arrays, inline tables, dotted keys)",
                         got=f"deeper at line {line}")
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(source, "file", "valid TOML", got=str(exc)) from None
