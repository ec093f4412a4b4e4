# SPDX-License-Identifier: MIT
"""The few statements whose SQL differs between SQLite and PostgreSQL."""

from __future__ import annotations

import importlib
from typing import Sequence

from sqlalchemy import Table
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
