# SPDX-License-Identifier: MIT
"""What differs between SQLite and PostgreSQL in the statements kit sends: upserts, how many
values one statement may carry, and how a bulk insert hands its rows to the driver."""

from __future__ import annotations

import importlib
from operator import itemgetter
from typing import Iterator, Sequence

from sqlalchemy import Table, insert
from sqlalchemy.engine import Connection

# Values per IN (...) list or statement: SQLite may be built with a limit of 999 bound
# parameters; PostgreSQL takes 65,535, and fewer statements save it a round trip and a plan each.
VALUES_PER_STATEMENT = {"sqlite": 500, "postgresql": 10_000}


def in_batches(conn: Connection, values: Sequence) -> Iterator[Sequence]:
    """``values`` in slices small enough for one statement on the connection's engine."""
    step = VALUES_PER_STATEMENT[conn.dialect.name]
    for i in range(0, len(values), step):
        yield values[i:i + step]


def _insert(dialect: str):
    """The dialect's own ``insert`` (with ``on_conflict_*``), imported only for the engine in use."""
    return importlib.import_module(f"sqlalchemy.dialects.{dialect}").insert


def upsert(conn: Connection, table: Table, keys: Sequence[str], update: Sequence[str] = (), add: Sequence[str] = ()):
    """``INSERT ... ON CONFLICT (keys) DO UPDATE``: ``update`` columns take the new value, ``add``
    columns add the new value to the stored one (atomic in the database, so no update is lost).
    With neither, the conflict does nothing. Run it with a list of rows for an executemany."""
    stmt = _insert(conn.dialect.name)(table)
    sets = {c: stmt.excluded[c] for c in update}
    sets.update({c: table.c[c] + stmt.excluded[c] for c in add})
    if not sets:
        return stmt.on_conflict_do_nothing(index_elements=list(keys))
    return stmt.on_conflict_do_update(index_elements=list(keys), set_=sets)


def insert_rows(conn: Connection, table: Table, columns: Sequence[str], rows: Sequence[tuple]) -> None:
    """Insert ``rows`` (tuples of values in ``columns`` order) with one executemany.

    The statement is Core's ``insert(table)`` compiled for the connection's dialect; the rows go
    to the driver as they are, without SQLAlchemy's per-row parameter processing (half the time
    of a 100,000-row import on SQLite). So the values must be the driver's own: str, int, float
    or None; dates and booleans go through ``conn.execute(insert(table), dicts)`` instead.
    """
    if rows:
        conn.exec_driver_sql(*insert_statement(conn.dialect, table, columns, rows))


def insert_statement(dialect, table: Table, columns: Sequence[str], rows: Sequence[tuple]) -> tuple[str, list]:
    """Core's INSERT for ``columns`` compiled for ``dialect``, and ``rows`` as its driver takes
    them: tuples in the statement's order (SQLite) or dicts by name (psycopg)."""
    compiled = insert(table).compile(dialect=dialect, column_keys=list(columns))
    if not compiled.positional:
        return str(compiled), [dict(zip(columns, r)) for r in rows]
    order = [columns.index(name) for name in compiled.positiontup]
    if order == list(range(len(columns))):
        return str(compiled), list(rows)
    return str(compiled), list(map(itemgetter(*order), rows)) if len(order) > 1 else [(r[order[0]],) for r in rows]
