# SPDX-License-Identifier: MIT
"""Two processes importing stock at once, on SQLite and PostgreSQL: for different vessels and
for the same vessel. Nothing is lost, nothing crashes; a collision is retried or refused in one
clear line."""

from __future__ import annotations

import subprocess
import sys
import time
from pathlib import Path

import pytest
from sqlalchemy import text

from catalog_schema.engine import make_engine, write_transaction
from catalog_schema.errors import BusyError
from db_support import TOML_CYLINDER, db_url, engine  # noqa: F401  (fixtures)
from kit.store.fleet_store import save_vessels
from kit.engine.parts import LineItem
from kit.store.parts_store import register_parts
from kit.files.particulars_file import load_vessel
from test_db_imports import STOCK_HEADER, stock_rows, write_csv

WORKER = Path(__file__).with_name("db_worker.py")
TIMES = 12
KEYS = ["spare:test-a", "spare:test-b", "spare:test-c"]


@pytest.fixture
def two_vessels(engine, tmp_path):
    def setup(conn):
        for vid in ("TEST-ONE", "TEST-TWO"):
            path = tmp_path / f"{vid}.toml"
            path.write_text(TOML_CYLINDER.replace("TEST-ONE", vid))
            save_vessels(conn, [load_vessel(path)])
        register_parts(conn, [LineItem("SG1", "spare", "", k, "", 1, "pcs", "test", k) for k in KEYS])

    write_transaction(engine, setup)
    return engine


def run_together(url: str, jobs: list[tuple[Path, str, str]]) -> None:
    """Start one worker per job at the same moment; every one must finish cleanly."""
    start_at = f"{time.time() + 2.0:.3f}"  # past every worker's start-up, so their loops overlap
    procs = [subprocess.Popen([sys.executable, str(WORKER), url, str(f), vessel, mode, str(TIMES), start_at],
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True) for f, vessel, mode in jobs]
    for p in procs:
        out, err = p.communicate(timeout=120)
        assert (p.returncode, err) == (0, ""), f"worker failed: {err}"


def test_adjustments_to_the_same_vessel_are_not_lost(two_vessels, tmp_path):
    url = two_vessels.url.render_as_string(hide_password=False)
    plus = write_csv(tmp_path / "plus.csv", STOCK_HEADER, [[k, "", "", 1, ""] for k in KEYS])
    run_together(url, [(plus, "TEST-ONE", "adjust"), (plus, "TEST-ONE", "adjust")])
    assert stock_rows(two_vessels, "TEST-ONE") == {(k, "unassigned"): 2.0 * TIMES for k in KEYS}


def test_adjustments_to_different_vessels_at_once(two_vessels, tmp_path):
    url = two_vessels.url.render_as_string(hide_password=False)
    plus = write_csv(tmp_path / "plus.csv", STOCK_HEADER, [[k, "", "", 1, ""] for k in KEYS])
    run_together(url, [(plus, "TEST-ONE", "adjust"), (plus, "TEST-TWO", "adjust")])
    for vessel in ("TEST-ONE", "TEST-TWO"):
        assert stock_rows(two_vessels, vessel) == {(k, "unassigned"): float(TIMES) for k in KEYS}


def test_two_counts_of_the_same_vessel_leave_one_whole_count(two_vessels, tmp_path):
    url = two_vessels.url.render_as_string(hide_password=False)
    ones = write_csv(tmp_path / "ones.csv", STOCK_HEADER, [[k, "", "", 1, ""] for k in KEYS])
    # The second file lists the parts in the other order, so a row-by-row writer could deadlock.
    twos = write_csv(tmp_path / "twos.csv", STOCK_HEADER, [[k, "", "", 2, ""] for k in reversed(KEYS)])
    run_together(url, [(ones, "TEST-ONE", "count"), (twos, "TEST-ONE", "count")])
    found = set(stock_rows(two_vessels, "TEST-ONE").values())
    assert found in ({1.0}, {2.0})  # one file's count, never a mixture


def test_a_writer_held_out_too_long_gets_one_clear_line(tmp_path):
    url = f"sqlite:///{tmp_path / 'f.sqlite'}"
    holder = make_engine(url)
    waiter = make_engine(url, busy_timeout_ms=50)
    with holder.begin() as conn:  # BEGIN IMMEDIATE: holds the write lock until the block ends
        conn.execute(text("CREATE TABLE t (x INTEGER)"))
        with pytest.raises(BusyError) as err:
            write_transaction(waiter, lambda c: c.execute(text("INSERT INTO t VALUES (1)")), attempts=2)
    assert str(err.value) == (f"database {url}: another writer held it through 2 attempts; "
                              f"try again when the other import has finished")
    holder.dispose()
    waiter.dispose()
