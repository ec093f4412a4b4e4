# SPDX-License-Identifier: MIT
"""A company spares policy (TOML) read from a file, or from its text as stored in the fleet database.

The text is read through :mod:`kit.files.input_files` (a regular file, bounded in size), parsed by
:func:`kit.files.toml_text.parse_toml`, and merged over kit's default policy and checked by the
engine (:func:`kit.engine.spares.policy_from_data`).
"""

from __future__ import annotations

from pathlib import Path

from kit.engine.spares import DEFAULT_SOURCE, Policy, policy_from_data
from kit.files.input_files import TOML_POLICY, read_text
from kit.files.toml_text import parse_toml


def read_policy_text(path: str | Path) -> str:
    """The text of a company policy file (a regular file, see :mod:`kit.files.input_files`)."""
    return read_text(path, TOML_POLICY)


def policy_from_text(text: str | None, source: str = DEFAULT_SOURCE) -> Policy:
    """The default policy with ``text`` (a company policy file's TOML, e.g. as stored in the fleet
    database) merged over it; ``None`` is the default policy itself. Errors name ``source``."""
    return policy_from_data(None if text is None else parse_toml(text, source), source)


def load_policy(override: str | Path | None = None) -> Policy:
    """The default policy, with ``override`` (a company policy file) merged over it."""
    if override is None:
        return policy_from_text(None)
    return policy_from_text(read_policy_text(override), str(override))
