# SPDX-License-Identifier: MIT
"""Particulars files (TOML) read from disk: one file, or every ``*.toml`` file of a folder.

The text is read through :mod:`kit.files.input_files` (regular files only, bounded in size),
parsed by :func:`kit.files.toml_text.parse_toml` and checked into a vessel by the engine
(:func:`kit.engine.particulars.vessel_from_dict`).
"""

from __future__ import annotations

from pathlib import Path

from kit.engine.particulars import Vessel, vessel_from_dict
from kit.errors import InputError
from kit.files.input_files import TOML_PARTICULARS, read_text
from kit.files.toml_text import parse_toml


def load_vessel(path: str | Path) -> Vessel:
    """Read and check one particulars file (a regular file, see :mod:`kit.files.input_files`)."""
    source = str(path)
    return vessel_from_dict(parse_toml(read_text(path, TOML_PARTICULARS), source), source)


def is_toml(path: Path) -> bool:
    """A ``.toml`` file name, in any case (``.TOML`` too)."""
    return path.suffix.lower() == ".toml"


def load_folder(folder: str | Path) -> list[Vessel]:
    """Read every ``*.toml`` particulars file in ``folder`` (sorted by name; any case of the
    suffix). A vessel id in two files is refused, naming both."""
    folder = Path(folder)
    files = sorted(p for p in folder.iterdir() if is_toml(p))
    if not files:
        raise InputError(str(folder), "folder", "at least one *.toml particulars file", got="none")
    vessels: list[Vessel] = []
    first: dict[str, str] = {}
    for f in files:
        vessel = load_vessel(f)
        if vessel.id in first:
            raise InputError(str(f), "vessel.id", f"a vessel id no other file of this load has (also in {first[vessel.id]})",
                             got=repr(vessel.id))
        first[vessel.id] = str(f)
        vessels.append(vessel)
    return vessels
