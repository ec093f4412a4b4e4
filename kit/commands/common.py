# SPDX-License-Identifier: MIT
"""Pieces that many commands share: error handling and shared options."""

from __future__ import annotations

import contextlib
import functools
import gc
import sys
from typing import Any, Callable, Iterator

import click


@contextlib.contextmanager
def without_cycle_collector() -> Iterator[None]:
    """Run a command with Python's cyclic garbage collector paused, then restart it.

    A command builds many small objects (a fleet's particulars, line items, rows, cells) that
    hold no reference cycles: reference counting frees them, and the collector only walks them
    again and again. Measured: 0.14 s of a 1,000-vessel BOM and 0.23 s of a 100,000-row
    catalogue import, with the same peak memory with the collector paused (96 MB, 264 MB).
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


def reports_errors(func: Callable[..., Any]) -> Callable[..., Any]:
    """Turn the project's own errors into one line on stderr and exit status 2 (and run the
    command with :func:`without_cycle_collector`, and with outputs of its own checked, see
    :mod:`kit.output_targets`)."""

    @functools.wraps(func)
    def wrapper(*args: Any, **kwargs: Any) -> Any:
        from kit.errors import KitError
        from kit.output_targets import protecting

        try:
            with without_cycle_collector(), protecting(None):
                return func(*args, **kwargs)
        except KitError as exc:
            click.echo(f"kit: error: {exc}", err=True)
            sys.exit(2)

    return wrapper


def db_option(migrate: bool = True) -> Callable[[Callable[..., Any]], Callable[..., Any]]:
    """Add ``--db`` (or env var ``KIT_DB``) and hand the command an open ``engine``.

    The value is a SQLite file path or a database URL; without one, kit's default SQLite file.
    With ``migrate`` a fresh database is built first and one at an old schema is refused.
    Errors, including the database's own, become one line and exit status 2. No file the
    command writes may be the database (:func:`kit.output_targets.protecting`).
    """

    def decorate(func: Callable[..., Any]) -> Callable[..., Any]:
        @functools.wraps(func)
        def wrapper(*args: Any, db: str | None, **kwargs: Any) -> Any:
            from sqlalchemy.exc import DBAPIError

            from catalog_schema.engine import make_engine, resolve_url, shown
            from catalog_schema.errors import DatabaseError
            from catalog_schema.migrate import require_current

            from kit.output_targets import protecting

            engine = make_engine(resolve_url(db))
            try:
                if migrate:
                    require_current(engine)
                with protecting(engine.url):
                    return func(*args, engine=engine, **kwargs)
            except DBAPIError as exc:
                first = str(exc.orig).strip().splitlines()[0] if exc.orig else type(exc).__name__
                raise DatabaseError(shown(str(engine.url)), "refused the change, nothing was written", first) from None
            finally:
                engine.dispose()

        option = click.option("--db", envvar="KIT_DB", metavar="PATH|URL", default=None,
                              help="Fleet database: a SQLite file or a postgresql+psycopg:// URL "
                                   "[env var KIT_DB; default ~/.local/share/kit/fleet.sqlite].")
        return option(reports_errors(wrapper))

    return decorate
