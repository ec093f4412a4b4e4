# SPDX-License-Identifier: MIT
"""Particulars read from disk: a TOML file, a particulars workbook (.xlsx), or a folder of both.

:func:`read_particulars` is the one reader of ``kit calc``, ``kit bom --particulars`` and
``kit load``. TOML text is read through :mod:`kit.files.input_files` (regular files only, bounded
in size) and parsed by :func:`kit.files.toml_text.parse_toml`; a workbook is read by
:func:`kit.files.particulars_sheet.load_particulars_sheet`; either is checked into a vessel by the
engine (:func:`kit.engine.particulars.vessel_from_dict`), so both obey one set of rules.
"""

from __future__ import annotations

from pathlib import Path

from kit.engine.particulars import Vessel, vessel_from_dict
from kit.errors import InputError
from kit.files.input_files import TOML_PARTICULARS, read_text
from kit.files.toml_text import parse_toml

FOLDER_EXPECTED = "at least one *.toml or *.xlsx particulars file"


def load_vessel(path: str | Path) -> Vessel:
    """Read and check one particulars file (a regular file, see :mod:`kit.files.input_files`)."""
    source = str(path)
    return vessel_from_dict(parse_toml(read_text(path, TOML_PARTICULARS), source), source)


def is_toml(path: Path) -> bool:
    """A ``.toml`` file name, in any case (``.TOML`` too)."""
    return path.suffix.lower() == ".toml"


def is_workbook(path: Path) -> bool:
    """A ``.xlsx`` file name in any case, not a spreadsheet program's lock file (``~$name.xlsx``)."""
    return path.suffix.lower() == ".xlsx" and not path.name.startswith("~$")


def read_file(path: str | Path) -> Vessel:
    """One vessel: a particulars workbook when the name ends in ``.xlsx`` (any case), else TOML."""
    if is_workbook(Path(path)):
        from kit.files.particulars_sheet import load_particulars_sheet

        return load_particulars_sheet(path)
    return load_vessel(path)


def load_folder(folder: str | Path) -> list[Vessel]:
    """Read every ``*.toml`` and ``*.xlsx`` particulars file in ``folder`` (sorted by name; any
    case of the suffix; other files left alone). A vessel id in two files is refused, naming both."""
    folder = Path(folder)
    files = sorted(p for p in folder.iterdir() if is_toml(p) or is_workbook(p))
    if not files:
        raise InputError(str(folder), "folder", FOLDER_EXPECTED, got="none")
    vessels: list[Vessel] = []
    first: dict[str, str] = {}
    for f in files:
        vessel = read_file(f)
        if vessel.id in first:
            raise InputError(str(f), "vessel.id", f"a vessel id no other file of this load has (also in {first[vessel.id]})",
                             got=repr(vessel.id))
        first[vessel.id] = str(f)
        vessels.append(vessel)
    return vessels


def read_particulars(path: str | Path) -> list[Vessel]:
    """The vessels of ``path``: a folder (:func:`load_folder`), else one file (:func:`read_file`)."""
    target = Path(path)
    return load_folder(target) if target.is_dir() else [read_file(target)]
