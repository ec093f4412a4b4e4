# SPDX-License-Identifier: MIT
"""The project's own errors.

Every error kit raises on bad input derives from :class:`KitError`, and also from the built-in
type it resembles, so callers can catch either. Each carries structured fields and builds its
one-line message in ``__str__``; the CLI prints that line and exits with status 2.
"""

from __future__ import annotations

from dataclasses import dataclass


class KitError(Exception):
    """Base class of every error kit raises on purpose."""


@dataclass
class InputError(KitError, ValueError):
    """A value in an input file is missing or not what was expected.

    ``source`` is the file (and sheet or line where there is one), ``field`` the dotted path of the
    field, ``expected`` says what would have been accepted, ``got`` what was found (optional).
    """

    source: str
    field: str
    expected: str
    got: str | None = None

    def __str__(self) -> str:
        found = f" (got {self.got})" if self.got is not None else ""
        where = f"{self.source}: " if self.source else ""
        return f"{where}{self.field}: expected {self.expected}{found}"


class ArgumentError(InputError):
    """A value handed to a library call (not read from a file) is not what was expected.

    ``field`` names the value neutrally ("days of cover", "supplier name"); ``source`` is the file
    it was given for, or empty. A face says how the user gave it: the command line puts its
    option in ``field`` and its command in an empty ``source`` (``kit/commands/common.py``).
    """


@dataclass
class OutOfSeriesError(KitError, ValueError):
    """A size lies past the largest (or below the smallest) entry of a standard series."""

    series: str
    value_mm: float
    limit_mm: float

    def __str__(self) -> str:
        return (
            f"{self.value_mm:g} mm lies outside {self.series} "
            f"(limit {self.limit_mm:g} mm)"
        )


@dataclass
class IncompatibleFluidError(KitError, ValueError):
    """No seal compound in the table is compatible with the fluid."""

    fluid: str
    function: str

    def __str__(self) -> str:
        return f"no seal compound in the table is compatible with {self.fluid} for {self.function}"


@dataclass
class TableChecksumError(KitError, RuntimeError):
    """A transcribed standard table no longer matches its recorded checksum."""

    table: str
    expected: str
    actual: str

    def __str__(self) -> str:
        return f"data table {self.table} changed: sha256 {self.actual}, recorded {self.expected}"


@dataclass
class OutputError(KitError, OSError):
    """An output file could not be written; nothing was left half-written."""

    target: str
    expected: str
    field: str = "output"  # the option that named it, e.g. --out
    got: str | None = None

    def __str__(self) -> str:
        found = f" (got {self.got})" if self.got is not None else ""
        return f"{self.target}: {self.field}: expected {self.expected}{found}"


@dataclass
class UnknownVesselError(KitError, LookupError):
    """No vessel with this id in the fleet database. The library names only the id; a face adds
    how the id was given (the command line names its option, see ``kit/commands/common.py``)."""

    vessel_id: str

    def __str__(self) -> str:
        return f"no vessel {self.vessel_id!r} in the fleet database (kit load adds vessels)"
