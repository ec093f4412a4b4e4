# SPDX-License-Identifier: MIT
"""Where the fleet database is, and how to open it and write to it.

The database is named by ``--db`` on the command line, else by the ``KIT_DB`` environment
variable, else it is the SQLite file :func:`default_path` (``$XDG_DATA_HOME/kit/fleet.sqlite``,
``~/.local/share/kit/fleet.sqlite`` when XDG_DATA_HOME is unset). A value with ``://`` is an
SQLAlchemy URL (``sqlite:///...`` or ``postgresql+psycopg://user@host:5432/db``); anything else
is a path to a SQLite file.

SQLite is opened in WAL mode with a busy timeout, foreign keys on, and every transaction begun
with ``BEGIN IMMEDIATE``, so two processes sharing one file queue for the write lock instead of
failing half way. On both engines :func:`write_transaction` retries a transaction that lost a
lock or serialisation race, and says so in one line when it keeps losing. A transaction that
only reads may be opened by :func:`read_transaction` instead: on SQLite it takes no write lock
(one snapshot of the write-ahead log, so readers neither queue behind each other nor hold up a
writer) and the connection refuses any write while it lasts.
"""

from __future__ import annotations

import os
import time
from contextlib import contextmanager
from pathlib import Path
from typing import Callable, Iterator, TypeVar

from sqlalchemy import create_engine, event
from sqlalchemy.engine import Connection, Engine, make_url
from sqlalchemy.exc import ArgumentError, DBAPIError, OperationalError

from catalog_schema.errors import BusyError, DatabaseError

ENV_VAR = "KIT_DB"
BUSY_TIMEOUT_MS = 30_000
SQLITE_CACHE_KIB = 64 * 1024
WRITE_ATTEMPTS = 6
READ_ONLY = "kit_read_only"  # a Connection's execution option: its transactions only read (see read_transaction)

# PostgreSQL SQLSTATEs worth one more try: serialization_failure, deadlock_detected.
_PG_RETRY_STATES = {"40001", "40P01"}

T = TypeVar("T")


def default_path() -> Path:
    """The SQLite file used when neither ``--db`` nor ``KIT_DB`` names a database."""
    base = os.environ.get("XDG_DATA_HOME") or str(Path.home() / ".local" / "share")
    return Path(base) / "kit" / "fleet.sqlite"


def resolve_url(db: str | None) -> str:
    """Turn a ``--db`` value (URL or SQLite path; None for the default) into an SQLAlchemy URL."""
    value = (db or os.environ.get(ENV_VAR) or "").strip()
    if "://" in value:
        return value
    path = Path(value).expanduser() if value else default_path()
    return f"sqlite:///{path.resolve()}"


def shown(url: str) -> str:
    """The URL as it may be printed: the password hidden."""
    try:
        return make_url(url).render_as_string(hide_password=True)
    except ArgumentError:
        return url


def parse_url(url: str):
    """``url`` parsed (an SQLAlchemy URL), refused as no database URL or path when it is none."""
    try:
        return make_url(url)
    except ArgumentError:
        raise DatabaseError(url, "not a database URL or path", "give a file path or e.g. postgresql+psycopg://user@host/db") from None


def make_engine(url: str, busy_timeout_ms: int = BUSY_TIMEOUT_MS) -> Engine:
    """Open an engine on ``url`` with the settings two processes need to share it.

    ``busy_timeout_ms`` is how long a SQLite writer waits for another's lock before giving up.
    """
    parsed = parse_url(url)
    backend = parsed.get_backend_name()
    if backend == "sqlite":
        return _sqlite_engine(url, parsed.database, busy_timeout_ms)
    if backend == "postgresql":
        if parsed.get_driver_name() != "psycopg":
            raise DatabaseError(shown(url), "PostgreSQL is reached through psycopg 3", "write the URL as postgresql+psycopg://...")
        try:
            return create_engine(url, pool_pre_ping=True)
        except ImportError:
            raise DatabaseError(shown(url), "psycopg is not installed", "pip install 'kit[postgres]'") from None
    raise DatabaseError(shown(url), f"unsupported database {backend!r}", "use a SQLite file or postgresql+psycopg://")


def _sqlite_engine(url: str, database: str | None, busy_timeout_ms: int) -> Engine:
    if database and database != ":memory:":
        try:
            Path(database).parent.mkdir(parents=True, exist_ok=True)
        except OSError as exc:
            raise DatabaseError(shown(url), f"its folder cannot be made ({exc.strerror})", "give a writable path") from None
    engine = create_engine(url, connect_args={"timeout": busy_timeout_ms / 1000})

    @event.listens_for(engine, "connect")
    def _on_connect(dbapi_connection, _record) -> None:  # type: ignore[no-untyped-def]
        dbapi_connection.isolation_level = None  # SQLAlchemy's "begin" event issues BEGIN itself
        cursor = dbapi_connection.cursor()
        cursor.execute("PRAGMA journal_mode=WAL")
        cursor.execute(f"PRAGMA busy_timeout={int(busy_timeout_ms)}")
        cursor.execute("PRAGMA foreign_keys=ON")
        # A page cache of up to 64 MiB (default 2 MiB), taken only as pages are read: a 100,000-row
        # catalogue import otherwise spills its index pages and reads them back (a quarter of its insert).
        cursor.execute(f"PRAGMA cache_size=-{SQLITE_CACHE_KIB}")
        cursor.close()

    @event.listens_for(engine, "begin")
    def _on_begin(conn: Connection) -> None:
        # A reader's deferred BEGIN takes its snapshot at the first SELECT and no write lock; SQLite
        # would take the lock at a first write, and fail rather than wait if another writer had
        # committed since the snapshot, so query_only refuses any write in it outright. The pragma
        # stays with the pooled DB-API connection: it is switched only when the kind changes.
        read_only = bool(conn.get_execution_options().get(READ_ONLY))
        info = conn.connection.info
        if info.get(READ_ONLY, False) != read_only:
            conn.exec_driver_sql(f"PRAGMA query_only={int(read_only)}")
            info[READ_ONLY] = read_only
        conn.exec_driver_sql("BEGIN" if read_only else "BEGIN IMMEDIATE")

    return engine


@contextmanager
def read_transaction(engine: Engine) -> Iterator[Connection]:
    """A connection in one transaction that only reads.

    On SQLite it takes no write lock, so concurrent readers (the pages of ``kit serve``) run side
    by side and beside a writer, each on one consistent snapshot; a write in it is refused
    (``attempt to write a readonly database``). On PostgreSQL it is an ordinary transaction.
    """
    with engine.connect() as conn:
        conn.execution_options(**{READ_ONLY: True})
        with conn.begin():
            yield conn


def worth_retrying(exc: DBAPIError) -> bool:
    """True for a lost lock or serialisation race, which another try may win."""
    state = getattr(exc.orig, "sqlstate", None)
    if state in _PG_RETRY_STATES:
        return True
    text = str(exc.orig).lower()
    return isinstance(exc, OperationalError) and ("database is locked" in text or "database is busy" in text)


class Unplaced(Exception):
    """The database refused rows of a write, not yet traced to one (see :mod:`catalog_schema.refusals`)."""


def write_transaction(engine: Engine, work: Callable[[Connection], T], attempts: int = WRITE_ATTEMPTS) -> T:
    """Run ``work(conn)`` in one transaction: all of it is committed, or none of it.

    A transaction that lost a lock or serialisation race is rolled back and run again, up to
    ``attempts`` times; then :class:`BusyError`. One whose rows the database refused is rolled
    back and run once more to find the row (:func:`catalog_schema.refusals.replay_locating`),
    which raises the error naming it. Any other error rolls back and propagates.
    """
    for attempt in range(1, attempts + 1):
        try:
            with engine.begin() as conn:
                return work(conn)
        except Unplaced as refusal:
            from catalog_schema.refusals import replay_locating

            replay_locating(engine, work, refusal)
        except DBAPIError as exc:
            if not worth_retrying(exc):
                raise
            if attempt == attempts:
                raise BusyError(shown(str(engine.url)), f"another writer held it through {attempts} attempts",
                                "try again when the other import has finished") from None
            time.sleep(0.05 * attempt)
    raise AssertionError("unreachable")


def connect_check(engine: Engine) -> None:
    """Open and close one connection, turning 'cannot reach' into a one-line error."""
    try:
        with engine.connect():
            pass
    except OperationalError as exc:
        first = str(exc.orig).strip().splitlines()[0] if exc.orig else str(exc)
        raise DatabaseError(shown(str(engine.url)), _why_not_opened(engine), first) from None


def _why_not_opened(engine: Engine) -> str:
    """'cannot be opened', and why when it is a SQLite file kit may not write (WAL needs to)."""
    database = engine.url.database if engine.url.get_backend_name() == "sqlite" else None
    if database and database != ":memory:":
        path = Path(database)
        if (path.exists() and not os.access(path, os.W_OK)) or not os.access(path.parent, os.W_OK):
            return "cannot be opened: the file or its folder is read-only (kit writes to it, even to read)"
    return "cannot be opened"
