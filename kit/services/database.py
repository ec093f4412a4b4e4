# SPDX-License-Identifier: MIT
"""The fleet database itself: bring its schema up to date, say what it holds."""

from __future__ import annotations

from dataclasses import dataclass

from sqlalchemy.engine import Engine


def upgrade_database(engine: Engine, revision: str = "head") -> tuple[str | None, str]:
    """Bring the schema to ``revision`` (a fresh database is built): (revision before, after)."""
    from catalog_schema.migrate import upgrade

    return upgrade(engine, revision)


@dataclass(frozen=True)
class DatabaseStatus:
    revision: str | None  # None: an empty database
    newer: bool  # a revision newer than this kit's
    head: str
    tables: list[tuple[str, int]]  # (table, rows) of each table present


def database_status(engine: Engine) -> DatabaseStatus:
    """The database's schema revision and the rows of each table."""
    from catalog_schema.migrate import current, head, is_newer
    from kit.store.database_status import table_rows

    found = current(engine)
    with engine.connect() as conn:
        tables = table_rows(conn)
    return DatabaseStatus(found, is_newer(found), head(), tables)
