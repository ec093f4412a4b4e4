# SPDX-License-Identifier: MIT
"""``kit db``: build or upgrade the fleet database and say what is in it."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option


@click.group(epilog=SAFETY)
def db() -> None:
    """Build, upgrade and inspect the fleet database.

    The database is a SQLite file (default ~/.local/share/kit/fleet.sqlite) or a PostgreSQL
    URL, named by --db or the KIT_DB environment variable.

    Example: kit db upgrade --db office.sqlite
    """


@db.command(epilog=SAFETY)
@click.option("--to", "revision", default="head", show_default=True, help="Revision to reach.")
@db_option(migrate=False)
def upgrade(engine, revision: str) -> None:
    """Bring the database's schema to the newest revision (or --to REV); a fresh one is built.

    Example: kit db upgrade --db postgresql+psycopg://kit@db.office/fleet
    """
    from kit.services.database import upgrade_database

    before, after = upgrade_database(engine, revision)
    click.echo(f"schema at revision {after}" + ("" if before == after else f" (was {before or 'empty'})"))


@db.command(epilog=SAFETY)
@db_option(migrate=False)
def status(engine) -> None:
    """Show the database, its schema revision and how many rows each table holds.

    Example: kit db status
    """
    from catalog_schema.engine import shown
    from kit.services.database import database_status

    found = database_status(engine)
    click.echo(f"database: {shown(str(engine.url))}")
    newer = " (newer than this kit)" if found.newer else ""
    click.echo(f"revision: {found.revision or 'none (empty database)'}{newer}; this kit's newest: {found.head}")
    for name, rows in found.tables:
        click.echo(f"  {name:<18} {rows:>8}")
