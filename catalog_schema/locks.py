# SPDX-License-Identifier: MIT
"""Named locks that serialise two kinds of transaction which must never interleave.

On PostgreSQL each name is a transaction-level advisory lock (``pg_advisory_xact_lock``): taken
by a statement inside the transaction and released by its commit or rollback, so a process
killed while holding it frees it. Under READ COMMITTED every statement after the lock sees what
the previous holder committed. On SQLite every write transaction begins with ``BEGIN
IMMEDIATE`` (see :mod:`catalog_schema.engine`), which already holds the file's one write lock
from the first statement to the commit, so the lock is that and nothing more is sent.

The keys are fixed numbers, the same in every kit process on the database; they are per
database, so two schemas of one PostgreSQL database share them (which only serialises more).
"""

from __future__ import annotations

from sqlalchemy import text
from sqlalchemy.engine import Connection

# Arbitrary 64-bit keys, "kit" in ASCII and a serial: no other program on an office database is
# expected to use advisory locks with these numbers.
KEYS = {
    "schema": 0x6B69_7400_0000_0001,  # building or upgrading the schema
    "part matching": 0x6B69_7400_0000_0002,  # matching catalogue entries to generic parts
}


def hold(conn: Connection, name: str) -> None:
    """Take the lock ``name`` for the rest of ``conn``'s transaction (waiting for its holder)."""
    if conn.dialect.name == "postgresql":
        conn.execute(text("SELECT pg_advisory_xact_lock(:key)"), {"key": KEYS[name]})
