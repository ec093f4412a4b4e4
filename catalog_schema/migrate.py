# SPDX-License-Identifier: MIT
"""Schema migrations (alembic), shipped inside the package in ``migrations/``.

A fresh database and one built at an older revision are both brought to :func:`head` by
:func:`upgrade`. Commands that read or write fleet data call :func:`require_current`: a fresh
database is built on first use; one at an older revision is refused with the command to run,
because upgrading a shared office database is a deliberate act. One at a revision this kit does
not know was built by a newer kit: it is refused, by :func:`upgrade` too, with a line saying so.

Several processes may meet a fresh database at once (a fleet's first morning). :func:`upgrade`
builds or upgrades the schema in one transaction holding the lock ``schema``
(:mod:`catalog_schema.locks`: an advisory lock on PostgreSQL, the write lock that ``BEGIN
IMMEDIATE`` takes on SQLite) and reads the revision again inside it, so one process builds the
schema and the others find it built.
"""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

from sqlalchemy import inspect, text
from sqlalchemy.engine import Connection, Engine
from sqlalchemy.exc import OperationalError

from catalog_schema.engine import connect_check, shown
from catalog_schema.errors import SchemaVersionError
from catalog_schema.locks import hold

MIGRATIONS = Path(__file__).parent / "migrations"

# The newest revision in migrations/, kept here so that an everyday command checks the schema with
# one query and without importing alembic; tests/test_db_schema.py checks it against alembic's head.
HEAD = "0010"
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


@lru_cache(maxsize=1)
def known() -> tuple[str, ...]:
    """Every revision in ``migrations/``, oldest first."""
    from alembic.script import ScriptDirectory

    return tuple(reversed([r.revision for r in ScriptDirectory.from_config(_config()).walk_revisions()]))


def revision_of(conn: Connection) -> str | None:
    """The revision of ``conn``'s database, or None for a database kit has never built."""
    if not inspect(conn).has_table(VERSION_TABLE):
        return None
    return conn.execute(text(f"SELECT version_num FROM {VERSION_TABLE}")).scalar()


def current(engine: Engine) -> str | None:
    """The database's revision, or None for a database kit has never built."""
    connect_check(engine)
    with engine.connect() as conn:
        return revision_of(conn)


def is_newer(found: str | None) -> bool:
    """True for a revision this kit does not know: a newer kit built the database."""
    return found is not None and found != HEAD and found not in known()


def _refuse_newer(engine: Engine, found: str | None) -> None:
    if is_newer(found):
        raise SchemaVersionError(shown(str(engine.url)), f"schema is at revision {found}, newer than this kit "
                                 f"(knows up to {HEAD})", "use a newer kit")


def upgrade(engine: Engine, revision: str = "head") -> tuple[str | None, str]:
    """Bring the database to ``revision``; return (revision before, revision after).

    One transaction, holding the lock ``schema`` from its first statement: the revision read
    inside it is the one left by whoever held the lock before, and alembic finds nothing to do
    when another process has just built the schema.
    """
    from alembic import command
    from alembic.util import CommandError

    if revision != "head" and revision not in known():
        raise SchemaVersionError(shown(str(engine.url)), f"--to {revision} is not a revision of this kit "
                                 f"(it knows {known()[0]} to {HEAD})", "give one of them or head")
    connect_check(engine)
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
                hold(conn, "schema")
                before = revision_of(conn)
                _refuse_newer(engine, before)
                cfg.attributes["connection"] = conn
                try:
                    command.upgrade(cfg, revision)
                except CommandError as exc:  # e.g. --to an older revision than the database's
                    raise SchemaVersionError(shown(str(engine.url)), str(exc).splitlines()[0],
                                             "kit db upgrade only goes forward") from None
                if sqlite and conn.exec_driver_sql("PRAGMA foreign_key_check").first() is not None:
                    raise RuntimeError("a migration left rows whose foreign keys point nowhere")
                after = revision_of(conn)
        finally:
            if sqlite:
                conn.connection.dbapi_connection.execute("PRAGMA foreign_keys=ON")
    return before, after


def require_current(engine: Engine) -> None:
    """Build a fresh database; refuse one at another revision with what to do."""
    try:
        found = current(engine)
    except OperationalError as exc:
        raise SchemaVersionError(shown(str(engine.url)), "cannot read its schema revision", str(exc.orig)) from None
    if found is None:
        found = upgrade(engine)[1]  # or finds it built by another process meanwhile
    if found == HEAD:
        return
    _refuse_newer(engine, found)
    raise SchemaVersionError(shown(str(engine.url)), f"schema is at revision {found}, this kit needs {HEAD}",
                             "run: kit db upgrade")
