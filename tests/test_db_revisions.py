# SPDX-License-Identifier: MIT
"""The database's schema revision, on SQLite and PostgreSQL: a database built by a newer kit is
refused with a line that says so, and the first use of a fresh database by several processes at
once builds it once, for all of them."""

from __future__ import annotations

import subprocess
import sys
import time

import pytest
from click.testing import CliRunner
from sqlalchemy import inspect, text

from catalog_schema.engine import make_engine
from catalog_schema.errors import SchemaVersionError
from catalog_schema.migrate import HEAD, current, require_current
from db_support import db_url, dump, engine  # noqa: F401  (fixtures)
from kit.cli import main

FUTURE = "9999_future"


@pytest.fixture
def future(engine):
    """A database at head, then stamped with a revision no kit of this version has."""
    with engine.begin() as conn:
        conn.execute(text("UPDATE alembic_version SET version_num = :v"), {"v": FUTURE})
    return engine


def _newer(engine) -> str:
    return (f"database {engine.url.render_as_string(hide_password=True)}: schema is at revision {FUTURE}, "
            f"newer than this kit (knows up to {HEAD}); use a newer kit")


def test_a_newer_database_is_refused_as_newer(future):
    with pytest.raises(SchemaVersionError) as err:
        require_current(future)
    assert str(err.value) == _newer(future)


@pytest.mark.parametrize("args", [["parts", "list"], ["db", "upgrade"], ["db", "upgrade", "--to", "0002"]],
                         ids=["everyday-command", "upgrade", "upgrade-to"])
def test_commands_refuse_a_newer_database_in_one_line(future, args):
    url = future.url.render_as_string(hide_password=False)
    before = dump(future)
    result = CliRunner().invoke(main, [*args, "--db", url])
    assert (result.exit_code, result.output) == (2, f"kit: error: {_newer(future)}\n")
    assert dump(future) == before and current(future) == FUTURE


def test_status_says_the_database_is_newer(future):
    url = future.url.render_as_string(hide_password=False)
    result = CliRunner().invoke(main, ["db", "status", "--db", url])
    assert result.exit_code == 0
    assert f"revision: {FUTURE} (newer than this kit); this kit's newest: {HEAD}" in result.output.splitlines()


def test_upgrade_to_a_revision_this_kit_does_not_have_is_one_line(db_url):
    result = CliRunner().invoke(main, ["db", "upgrade", "--to", "0042", "--db", db_url])
    shown = make_engine(db_url).url.render_as_string(hide_password=True)
    assert (result.exit_code, result.output) == (
        2, f"kit: error: database {shown}: --to 0042 is not a revision of this kit (it knows 0001 to {HEAD}); "
           f"give one of them or head\n")
    assert current(make_engine(db_url)) is None


FIRST_USE = """
import sys, time
from kit.cli import main
import catalog_schema.migrate, kit.commands.db, kit.commands.parts, alembic.command, sqlalchemy
time.sleep(max(0.0, float(sys.argv[1]) - time.time()))
main(sys.argv[2:], prog_name="kit")
"""
PROCESSES = (["parts", "list"], ["db", "upgrade"], ["parts", "list"], ["db", "upgrade"], ["parts", "list"])


def test_first_use_by_several_processes_at_once_builds_the_schema_once(db_url):
    start_at = f"{time.time() + 3.0:.3f}"  # past every process's start-up, so they open the database together
    procs = [subprocess.Popen([sys.executable, "-c", FIRST_USE, start_at, *args, "--db", db_url],
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True) for args in PROCESSES]
    results = [(args, *p.communicate(timeout=120), p.returncode) for args, p in zip(PROCESSES, procs)]
    for args, _out, err, code in results:
        assert (code, err) == (0, ""), f"kit {' '.join(args)}: {err}"
    upgrades = sorted(out for args, out, _, _ in results if args[1] == "upgrade")
    # one of them may have built it, or a "parts list" before them: each says where it is
    assert all(line in (f"schema at revision {HEAD}\n", f"schema at revision {HEAD} (was empty)\n") for line in upgrades)
    eng = make_engine(db_url)
    assert current(eng) == HEAD
    with eng.connect() as conn:
        assert conn.execute(text("SELECT count(*) FROM alembic_version")).scalar() == 1
        assert "catalogue_entries" in inspect(conn).get_table_names()
    eng.dispose()
