# SPDX-License-Identifier: MIT
"""The few statements whose SQL differs between SQLite and PostgreSQL."""

from __future__ import annotations

import importlib
from typing import Sequence

from sqlalchemy import Table, insert
from sqlalchemy.engine import Connection


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
    if not rows:
        return
    compiled = insert(table).compile(dialect=conn.dialect, column_keys=list(columns))
    if compiled.positional:
        order = [columns.index(name) for name in compiled.positiontup]
        params = rows if order == list(range(len(columns))) else [tuple(r[i] for i in order) for r in rows]
    else:
        params = [dict(zip(columns, r)) for r in rows]
    conn.exec_driver_sql(str(compiled), params)
