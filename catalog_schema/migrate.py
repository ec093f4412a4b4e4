# SPDX-License-Identifier: MIT
"""Schema migrations (alembic), shipped inside the package in ``migrations/``.

A fresh database and one built at an older revision are both brought to :func:`head` by
:func:`upgrade`. Commands that read or write fleet data call :func:`require_current`: a fresh
database is built on first use; one at an older revision is refused with the command to run,
because upgrading a shared office database is a deliberate act.
"""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

from sqlalchemy import inspect, text
from sqlalchemy.engine import Engine
from sqlalchemy.exc import OperationalError

from catalog_schema.engine import connect_check, shown
from catalog_schema.errors import SchemaVersionError

MIGRATIONS = Path(__file__).parent / "migrations"

# The newest revision in migrations/, kept here so that an everyday command checks the schema with
# one query and without importing alembic; tests/test_db_schema.py checks it against alembic's head.
HEAD = "0005"
VERSION_TABLE = "alembic_version"


def _config():
    from alembic.config import Config

    cfg = Config()
    cfg.set_main_option("script_location", str(MIGRATIONS))
    return cfg


@lru_cache(maxsize=1)
def head() -> str:
    """The newest revision this kit knows, as alembic reads it from ``migrations/``."""
    from alembic.script import ScriptDirectory

    return ScriptDirectory.from_config(_config()).get_current_head()


def current(engine: Engine) -> str | None:
    """The database's revision, or None for a database kit has never built."""
    connect_check(engine)
    with engine.connect() as conn:
        if not inspect(conn).has_table(VERSION_TABLE):
            return None
        return conn.execute(text(f"SELECT version_num FROM {VERSION_TABLE}")).scalar()


def upgrade(engine: Engine, revision: str = "head") -> tuple[str | None, str]:
    """Bring the database to ``revision``; return (revision before, revision after)."""
    from alembic import command

    before = current(engine)
    cfg = _config()
    with engine.connect() as conn:
        # SQLite changes a constraint by rebuilding the table (alembic's batch mode), and dropping
        # the old table would cascade its deletes to the child tables: foreign keys are switched
        # off around the migration, outside its transaction as SQLite requires, and checked after.
        sqlite = conn.dialect.name == "sqlite"
        if sqlite:
            conn.connection.dbapi_connection.execute("PRAGMA foreign_keys=OFF")
        try:
            with conn.begin():
                cfg.attributes["connection"] = conn
                command.upgrade(cfg, revision)
                if sqlite and conn.exec_driver_sql("PRAGMA foreign_key_check").first() is not None:
                    raise RuntimeError("a migration left rows whose foreign keys point nowhere")
        finally:
            if sqlite:
                conn.connection.dbapi_connection.execute("PRAGMA foreign_keys=ON")
    return before, current(engine)


def require_current(engine: Engine) -> None:
    """Build a fresh database; refuse one at another revision with the command to run."""
    try:
        found = current(engine)
    except OperationalError as exc:
        raise SchemaVersionError(shown(str(engine.url)), "cannot read its schema revision", str(exc.orig)) from None
    if found is None:
        upgrade(engine)
    elif found != HEAD:
        raise SchemaVersionError(shown(str(engine.url)), f"schema is at revision {found}, this kit needs {HEAD}",
                                 "run: kit db upgrade")
