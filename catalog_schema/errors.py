# SPDX-License-Identifier: MIT
"""Database errors, as project errors: the CLI prints one line and exits with status 2."""

from __future__ import annotations

from dataclasses import dataclass

from kit.errors import KitError


@dataclass
class DatabaseError(KitError, RuntimeError):
    """The database cannot be opened or used as asked. ``where`` is the URL, password hidden."""

    where: str
    problem: str
    hint: str = ""

    def __str__(self) -> str:
        hint = f"; {self.hint}" if self.hint else ""
        return f"database {self.where}: {self.problem}{hint}"


@dataclass
class SchemaVersionError(DatabaseError):
    """The database's schema is not the one this kit expects."""


@dataclass
class BusyError(DatabaseError):
    """Another writer kept the database busy through every retry."""
