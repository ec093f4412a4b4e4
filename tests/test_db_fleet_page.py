# SPDX-License-Identifier: MIT
"""The fleet page's service (``kit serve``'s first page) over the invented demo fleet, on SQLite
and PostgreSQL: a page reads only its own vessels yet says what the whole-fleet glance and the
pre-voyage check say of them; and the read transaction it uses, which on SQLite takes no write
lock and refuses writes."""

from __future__ import annotations

import sqlite3

import pytest
from sqlalchemy import text
from sqlalchemy.exc import OperationalError

from catalog_schema.engine import make_engine, read_transaction, write_transaction
from db_support import db_url, engine  # noqa: F401  (fixtures)
from kit.services.demo import fill_demo
from kit.services.fleet import fleet_page, list_vessels
from kit.services.orders import check_voyage

DEMO_DAYS = 90.0  # the demo company's policy: 90 days of cover (kit/services/demo.py)


@pytest.fixture
def demo(engine, tmp_path):  # noqa: F811
    fill_demo(engine, tmp_path, days=DEMO_DAYS)
    return engine


def test_a_page_agrees_with_the_glance_and_the_pre_voyage_check(demo):
    glance = list_vessels(demo)
    shown = [row for p in (1, 2, 3) for row in fleet_page(demo, "", p, per_page=2).rows]
    # the same vessels in the same order as the whole fleet's glance (kit vessels), page by page
    assert [r.glance for r in shown] == glance
    for row in shown:
        assert row.days == DEMO_DAYS
        # as many lines short as `kit check VESSEL --days 90` lists (the command's own service)
        assert row.short_lines == len(check_voyage(demo, row.glance.id, DEMO_DAYS).short.lines), row.glance.id
    assert any(row.short_lines for row in shown)  # the demo's counts leave something short somewhere


def test_pages_and_search(demo):
    glance = list_vessels(demo)
    last = fleet_page(demo, "", 99, per_page=4)  # past the end: the last page
    assert (last.page, last.pages, last.total) == (2, 2, len(glance))
    assert [r.glance.id for r in last.rows] == [g.id for g in glance[4:]]
    needle = glance[0].name.split()[-1].upper()  # part of a name, in another letter case
    found = fleet_page(demo, needle, 1)
    assert glance[0].id in [r.glance.id for r in found.rows]
    assert all(needle.casefold() in " ".join((r.glance.id, r.glance.name, r.glance.ship_type)).casefold() for r in found.rows)
    assert fleet_page(demo, "no vessel is called this", 1).rows == []


def test_a_reader_does_not_wait_for_a_writer_on_sqlite(tmp_path):
    # In WAL mode a reader reads the last committed snapshot while a writer holds the write lock
    # (sqlite.org/wal.html, "Concurrency"); BEGIN IMMEDIATE would wait for that lock.
    url = f"sqlite:///{tmp_path / 'f.sqlite'}"
    writer, reader = make_engine(url), make_engine(url, busy_timeout_ms=50)
    write_transaction(writer, lambda c: c.execute(text("CREATE TABLE t (x INTEGER)")))
    write_transaction(writer, lambda c: c.execute(text("INSERT INTO t VALUES (1)")))
    with writer.begin() as held:  # BEGIN IMMEDIATE: holds the write lock until the block ends
        held.execute(text("INSERT INTO t VALUES (2)"))
        with read_transaction(reader) as conn:
            assert conn.execute(text("SELECT x FROM t")).scalars().all() == [1]  # the committed row only
        with pytest.raises(OperationalError, match="database is locked"), reader.connect() as conn:
            conn.execute(text("SELECT x FROM t"))  # an ordinary transaction queues for the lock
    writer.dispose()
    reader.dispose()


def test_a_read_transaction_keeps_one_snapshot_on_sqlite(tmp_path):
    # a WAL reader sees the database as of its first read until it ends (sqlite.org/isolation.html)
    url = f"sqlite:///{tmp_path / 'f.sqlite'}"
    writer, reader = make_engine(url), make_engine(url)
    write_transaction(writer, lambda c: c.execute(text("CREATE TABLE t (x INTEGER)")))
    with read_transaction(reader) as conn:
        assert conn.execute(text("SELECT count(*) FROM t")).scalar() == 0
        write_transaction(writer, lambda c: c.execute(text("INSERT INTO t VALUES (1)")))
        assert conn.execute(text("SELECT count(*) FROM t")).scalar() == 0
    with read_transaction(reader) as conn:
        assert conn.execute(text("SELECT count(*) FROM t")).scalar() == 1
    writer.dispose()
    reader.dispose()


def test_a_read_transaction_refuses_writes_and_leaves_the_connection_writable(tmp_path):
    url = f"sqlite:///{tmp_path / 'f.sqlite'}"
    engine = make_engine(url)
    write_transaction(engine, lambda c: c.execute(text("CREATE TABLE t (x INTEGER)")))
    with pytest.raises(OperationalError) as err, read_transaction(engine) as conn:
        conn.execute(text("INSERT INTO t VALUES (1)"))
    assert isinstance(err.value.orig, sqlite3.OperationalError)
    assert "readonly database" in str(err.value.orig)
    # the one pooled connection the reader had goes to the next writer, which may write again
    write_transaction(engine, lambda c: c.execute(text("INSERT INTO t VALUES (2)")))
    with read_transaction(engine) as conn:
        assert conn.execute(text("SELECT x FROM t")).scalars().all() == [2]
    engine.dispose()
