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

from alembic import command
from alembic.config import Config
from alembic.runtime.migration import MigrationContext
from alembic.script import ScriptDirectory
from sqlalchemy.engine import Engine
from sqlalchemy.exc import OperationalError

from catalog_schema.engine import connect_check, shown
from catalog_schema.errors import SchemaVersionError

MIGRATIONS = Path(__file__).parent / "migrations"


def _config() -> Config:
    cfg = Config()
    cfg.set_main_option("script_location", str(MIGRATIONS))
    return cfg


@lru_cache(maxsize=1)
def head() -> str:
    """The newest revision this kit knows."""
    return ScriptDirectory.from_config(_config()).get_current_head()


def current(engine: Engine) -> str | None:
    """The database's revision, or None for a database kit has never built."""
    connect_check(engine)
    with engine.connect() as conn:
        return MigrationContext.configure(conn).get_current_revision()


def upgrade(engine: Engine, revision: str = "head") -> tuple[str | None, str]:
    """Bring the database to ``revision``; return (revision before, revision after)."""
    before = current(engine)
    cfg = _config()
    with engine.begin() as conn:
        cfg.attributes["connection"] = conn
        command.upgrade(cfg, revision)
    return before, current(engine)


def require_current(engine: Engine) -> None:
    """Build a fresh database; refuse one at another revision with the command to run."""
    try:
        found = current(engine)
    except OperationalError as exc:
        raise SchemaVersionError(shown(str(engine.url)), "cannot read its schema revision", str(exc.orig)) from None
    if found is None:
        upgrade(engine)
    elif found != head():
        raise SchemaVersionError(shown(str(engine.url)), f"schema is at revision {found}, this kit needs {head()}",
                                 "run: kit db upgrade")
