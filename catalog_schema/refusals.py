# SPDX-License-Identifier: MIT
"""The database's own refusal of a row, traced back to the line of the file the row came from.

kit checks every row of an import before it writes anything, but the database has the last word:
a CHECK constraint, a unique key, an integer past the column's range (PostgreSQL's ``integer``
holds 32 bits), a NUL character in text on PostgreSQL. A bulk insert refused by the database
says only which constraint, not which of its thousands of rows.

On the normal path :func:`located` just runs the write: not one statement more. When the database
refuses it, :func:`located` raises :class:`~catalog_schema.engine.Unplaced`;
:func:`~catalog_schema.engine.write_transaction` rolls the transaction back and runs it once more
(:func:`replay_locating`), now with each located write inside a savepoint. The refused write is
then split in halves, each tried in a savepoint of its own (about 2 log2(n) statements, carrying
each row at most once), down to the first row refused, and :class:`RefusedRowError` names that
row's file and line and, where the refusal tells, the column. The replay is rolled back too:
nothing is written. (A savepoint on every import would cost SQLite a copy of each page the insert
reuses, in its statement journal.)
"""

from __future__ import annotations

import re
from contextvars import ContextVar
from typing import Callable, Mapping, Sequence

from sqlalchemy import CheckConstraint, Integer, Table, UniqueConstraint
from sqlalchemy.engine import Connection, Engine
from sqlalchemy.exc import DataError, IntegrityError

from catalog_schema.engine import Unplaced, shown, worth_retrying
from catalog_schema.errors import DatabaseError
from kit.errors import InputError

# What a database refusal of a row arrives as: constraint and value errors, and the sqlite3
# driver's own OverflowError for an integer past 64 bits.
REFUSALS = (IntegrityError, DataError, OverflowError)
# The largest magnitude an Integer column holds: PostgreSQL's int4, SQLite's 64-bit integer.
INTEGER_LIMIT = {"postgresql": 2**31 - 1, "sqlite": 2**63 - 1}
# SQLite names the failed constraint, or the table.column of a unique or NOT NULL key, in its message.
_SQLITE_NAMED = re.compile(r"^(?:CHECK|UNIQUE|NOT NULL) constraint failed: (.+)$")
SHOWN_CHARS = 60
# True while write_transaction runs a refused transaction again to find the row.
_locating: ContextVar[bool] = ContextVar("locating", default=False)


class RefusedRowError(InputError):
    """The database refused a row of an input file; ``source`` is the file and line."""


def located(conn: Connection, table: Table, columns: Sequence[str], rows: Sequence,
            write: Callable[[Connection, Sequence], object], where: Callable[[int], str],
            fields: Mapping[str, str] | None = None) -> None:
    """Run ``write(conn, rows)``; if the database refuses a row, :class:`RefusedRowError` (by way
    of :func:`replay_locating`, so call this inside :func:`~catalog_schema.engine.write_transaction`).

    ``rows`` are tuples of values in ``columns`` order, or dicts by column name; ``where(i)``
    names the file and line of ``rows[i]``; ``fields`` names a column the user knows by another
    name (``{"supplier_id": "--supplier"}``; others are "column NAME").
    """
    if not rows:
        return
    if not _locating.get():
        try:
            write(conn, rows)
        except REFUSALS as exc:
            if not _refusal(exc):
                raise
            raise Unplaced(_reason(exc)) from None
        return
    index, exc = _first_refused(conn, rows, write)
    if index is None:
        return
    values = rows[index] if isinstance(rows[index], Mapping) else dict(zip(columns, rows[index]))
    name = _column(conn, table, values, exc)
    field = "row" if name is None else (fields or {}).get(name, f"column {name}")
    got = _reason(exc) if name is None else f"{_shown(values[name])}, refused: {_reason(exc)}"
    raise RefusedRowError(where(index), field, "a value the database accepts", got=got) from None


def replay_locating(engine: Engine, work: Callable[[Connection], object], refusal: Unplaced) -> None:
    """Run ``work`` again in a transaction that is rolled back, with :func:`located` finding the
    row the database refuses; raises :class:`RefusedRowError`, or, if the database accepts every
    row this time (another writer changed what it refused), a :class:`DatabaseError` with what
    it said the first time."""
    token = _locating.set(True)
    try:
        with engine.connect() as conn:
            transaction = conn.begin()
            try:
                work(conn)
            finally:
                transaction.rollback()
    finally:
        _locating.reset(token)
    raise DatabaseError(shown(str(engine.url)), "refused the change, nothing was written", str(refusal))


def _refusal(exc: Exception) -> bool:
    return not (isinstance(exc, (IntegrityError, DataError)) and worth_retrying(exc))


def _first_refused(conn: Connection, rows: Sequence, write) -> tuple[int | None, Exception | None]:
    """The index of the first row the database refuses, and its refusal (None, None if it takes
    them all); rows before it are written, inside the transaction the caller rolls back."""
    lo, hi = 0, len(rows)  # rows[:lo] are written; a refusal, if any, lies in rows[lo:hi]
    while hi - lo > 1:
        mid = (lo + hi) // 2
        try:
            with conn.begin_nested():
                write(conn, rows[lo:mid])
            lo = mid
        except REFUSALS as exc:
            if not _refusal(exc):
                raise
            hi = mid
    try:
        with conn.begin_nested():
            write(conn, rows[lo:hi])
    except REFUSALS as exc:
        if not _refusal(exc):
            raise
        return lo, exc
    return None, None


def _reason(exc: Exception) -> str:
    """The database's first line (PostgreSQL's DETAIL line, which repeats the row, is left out)."""
    orig = getattr(exc, "orig", None) or exc
    return (str(orig).strip().splitlines() or [type(orig).__name__])[0]


def _shown(value: object) -> str:
    text = repr(value)
    return text if len(text) <= SHOWN_CHARS else text[:SHOWN_CHARS] + "...'"


def _column(conn: Connection, table: Table, values: Mapping[str, object], exc: Exception) -> str | None:
    """The column the refusal is about: named by the constraint it broke, else the one value that
    the database cannot hold (a NUL in text, an integer past the column's range)."""
    for name in _constraint_columns(table, exc):
        if name in values:
            return name
    limit = INTEGER_LIMIT[conn.dialect.name]
    for name, value in values.items():
        if isinstance(value, str) and "\x00" in value and conn.dialect.name == "postgresql":
            return name
        column = table.c.get(name)
        if (column is not None and isinstance(column.type, Integer) and isinstance(value, int)
                and abs(value) > limit):
            return name
    return None


def _constraint_columns(table: Table, exc: Exception) -> list[str]:
    """The columns of the constraint the refusal names, the most telling first."""
    orig = getattr(exc, "orig", None)
    diag = getattr(orig, "diag", None)  # psycopg: the server's fields
    if diag is not None:
        if diag.column_name:
            return [diag.column_name]
        named = diag.constraint_name
    else:
        found = _SQLITE_NAMED.match(str(orig or ""))
        if not found:
            return []
        named = found.group(1)
        if "." in named:  # "catalogue_entries.supplier_id, catalogue_entries.supplier_ref"
            return [part.strip().split(".")[-1] for part in reversed(named.split(","))]
    for constraint in table.constraints:
        if constraint.name != named:
            continue
        if isinstance(constraint, UniqueConstraint):
            return [c.name for c in reversed(list(constraint.columns))]
        if isinstance(constraint, CheckConstraint):  # ck_<table>_<column>, else the columns it mentions
            own = named.removeprefix(f"ck_{table.name}_")
            said = re.findall(r"[a-z_]+", str(constraint.sqltext))
            return [own] + [c.name for c in table.columns if c.name in said]
    return []
