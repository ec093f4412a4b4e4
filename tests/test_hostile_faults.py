# SPDX-License-Identifier: MIT
"""Faults: a process killed while it writes a workbook or in the middle of an import, a full
disk, a read-only database, a PostgreSQL connection dropped mid-import. The old file stays whole,
the database stays as it was, and the user gets one clear line.

The full disk and the read-only file system are real: a tiny tmpfs mounted for the test (kit's
CI runs as root). Where mounting is not permitted those tests skip, and the full disk is still
covered by ``test_no_room_simulated``, which makes ``os.replace`` fail with ENOSPC.
"""

from __future__ import annotations

import errno
import os
import signal
import subprocess
import sys
import time
from contextlib import contextmanager
from pathlib import Path

import pytest
from click.testing import CliRunner
from sqlalchemy import create_engine, select, text

from catalog_schema.engine import make_engine
from db_support import PG_ENV, db_url, dump  # noqa: F401  (fixtures)
from kit.cli import main
from kit.store.parts_store import PARTS

TESTS = Path(__file__).resolve().parent
WORKER = TESTS / "hostile_worker.py"
DEMO = TESTS.parent / "demo_fleet"
CORVINA = DEMO / "corvina_bay.toml"
NO_ROOM = "room and permission to write the file (No space left on device)"


def kit(*args: str) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, "-m", "kit", *args], capture_output=True, text=True, timeout=120)


def invoke(*args: str):
    return CliRunner().invoke(main, list(args))


def one_line(stderr: str) -> str:
    assert stderr.count("\n") == 1 and stderr.endswith("\n"), stderr
    assert "Traceback" not in stderr
    return stderr.strip()


@contextmanager
def tmpfs(where: Path, options: str):
    where.mkdir()
    done = subprocess.run(["mount", "-t", "tmpfs", "-o", options, "tmpfs", str(where)], capture_output=True, text=True)
    if done.returncode:
        pytest.skip(f"cannot mount a tmpfs here ({done.stderr.strip()}); test_no_room_simulated covers a full disk")
    try:
        yield where
    finally:
        subprocess.run(["umount", "-l", str(where)], check=True)


def fill(folder: Path) -> None:
    """Take every byte left on the file system of ``folder``."""
    try:
        with open(folder / "ballast", "wb") as fh:
            while True:
                fh.write(b"\0" * 1024)
                fh.flush()
    except OSError as exc:
        assert exc.errno == errno.ENOSPC


class Paused:
    """A kit process stopped by hostile_worker.py at a chosen point."""

    def __init__(self, tmp_path: Path, mode: str, *args: str):
        self.marker, self.go = tmp_path / "marker", tmp_path / "go"
        self.proc = subprocess.Popen([sys.executable, str(WORKER), mode, str(self.marker), str(self.go), "--", *args],
                                     stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)

    def wait_for_pause(self) -> str:
        deadline = time.monotonic() + 60
        while not self.marker.exists():
            assert self.proc.poll() is None, self.proc.communicate()
            assert time.monotonic() < deadline, "the worker never reached its pause"
            time.sleep(0.02)
        time.sleep(0.05)  # the marker is written; let the write finish
        return self.marker.read_text()

    def kill(self) -> None:
        self.proc.send_signal(signal.SIGKILL)
        self.proc.communicate(timeout=30)
        assert self.proc.returncode == -signal.SIGKILL

    def resume(self) -> tuple[int, str]:
        self.go.write_text("go")
        _, err = self.proc.communicate(timeout=60)
        return self.proc.returncode, err


# --- a workbook write killed -------------------------------------------------------------


def test_killed_while_writing_a_workbook(tmp_path):
    out = tmp_path / "out"
    target = out / "bom.xlsx"
    db = str(tmp_path / "fleet.sqlite")
    assert invoke("bom", "--particulars", str(CORVINA), "--days", "90", "--out", str(target), "--db", db).exit_code == 0
    before = target.read_bytes()
    worker = Paused(tmp_path, "pause-save", "bom", "--particulars", str(CORVINA), "--days", "180", "--out", str(target), "--db", db)
    worker.wait_for_pause()
    assert sorted(os.listdir(out)) == ["bom.xlsx"]  # the half-written workbook has no name at all
    worker.kill()
    assert target.read_bytes() == before
    assert sorted(os.listdir(out)) == ["bom.xlsx"]


# --- an import killed, or its connection dropped ------------------------------------------


@pytest.fixture
def fleet(db_url, tmp_path):
    """The demo vessel Corvina Bay and its generic parts, and a stock count for three of them."""
    for args in (["load", str(CORVINA)], ["parts", "register"]):
        done = invoke(*args, "--db", db_url)
        assert done.exit_code == 0, done.output
    engine = make_engine(db_url)
    with engine.connect() as conn:
        keys = conn.execute(select(PARTS.c.key).order_by(PARTS.c.key).limit(3)).scalars().all()
    count = tmp_path / "count.csv"
    count.write_text("part_key,location,quantity\n" + "".join(f"{k},engine room,7\n" for k in keys))
    yield db_url, engine, count
    engine.dispose()


IMPORTS = {
    "stock": lambda count: ["stock", "import", str(count), "--vessel", "CORVINA-BAY"],
    "catalogue": lambda count: ["catalogue", "import", str(write_catalogue(count)), "--supplier", "Northgate Seals"],
    "load": lambda count: ["load", str(DEMO)],
}


def write_catalogue(count: Path) -> Path:
    path = count.with_name("catalogue.csv")
    keys = [line.split(",")[0] for line in count.read_text().splitlines()[1:]]
    path.write_text("supplier_ref,part_key,currency\n" + "".join(f"NG-{i},{k},EUR\n" for i, k in enumerate(keys)))
    return path


@pytest.mark.parametrize("what", sorted(IMPORTS))
def test_killed_in_the_middle_of_an_import(fleet, tmp_path, what):
    url, engine, count = fleet
    before = dump(engine)
    worker = Paused(tmp_path, "pause-import", *IMPORTS[what](count), "--db", url)
    worker.wait_for_pause()
    worker.kill()
    assert dump(engine) == before
    again = invoke(*IMPORTS[what](count), "--db", url)  # the database is not left locked or broken
    assert again.exit_code == 0, again.output
    assert dump(engine) != before


def test_postgresql_connection_dropped_mid_import(fleet, tmp_path):
    url, engine, count = fleet
    if engine.dialect.name != "postgresql":
        pytest.skip("pg_terminate_backend is PostgreSQL's")
    before = dump(engine)
    worker = Paused(tmp_path, "pause-import", *IMPORTS["stock"](count), "--db", url)
    pid = int(worker.wait_for_pause())
    admin = create_engine(os.environ[PG_ENV], isolation_level="AUTOCOMMIT")
    with admin.connect() as conn:
        assert conn.execute(text("SELECT pg_terminate_backend(:pid)"), {"pid": pid}).scalar() is True
    admin.dispose()
    status, err = worker.resume()
    line = one_line(err)
    assert status == 2
    assert line.startswith("kit: error: database postgresql+psycopg://") and "nothing was written" in line, line
    assert dump(engine) == before


# --- no room, no permission ----------------------------------------------------------------


def test_disk_full(tmp_path):
    with tmpfs(tmp_path / "full", "size=64k") as full:
        old = full / "bom.xlsx"
        old.write_bytes(b"the old workbook")
        fill(full)
        listing = sorted(os.listdir(full))
        db = str(tmp_path / "fleet.sqlite")
        cases = [
            (["bom", "--days", "90", "--particulars", str(CORVINA), "--out", str(old), "--db", db], old),
            (["template", "particulars", str(full / "t.xlsx"), "--from", str(CORVINA)], full / "t.xlsx"),
            (["template", "catalogue", str(full / "c.csv")], full / "c.csv"),
        ]
        for args, target in cases:
            done = kit(*args)
            assert (done.returncode, one_line(done.stderr)) == (2, f"kit: error: {target}: output: expected {NO_ROOM}")
            assert sorted(os.listdir(full)) == listing
        assert old.read_bytes() == b"the old workbook"
        done = kit("load", str(CORVINA), "--db", str(full / "fleet.sqlite"))
        assert done.returncode == 2
        assert "database or disk is full" in one_line(done.stderr)


def test_no_room_simulated(tmp_path, monkeypatch):
    """ENOSPC at the rename, for every kind of file kit writes (monkeypatched, runs anywhere)."""
    def no_room(src, dst):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr("kit.files.atomic.os.replace", no_room)
    out = tmp_path / "out"
    out.mkdir()
    db = str(tmp_path / "fleet.sqlite")
    cases = [
        ["bom", "--days", "90", "--particulars", str(CORVINA), "--out", str(out / "b.xlsx"), "--db", db],
        ["template", "particulars", str(out / "t.xlsx"), "--from", str(CORVINA)],
        ["template", "catalogue", str(out / "c.csv")],
        ["template", "stock", str(out / "s.xlsx"), "--db", db],
    ]
    for args in cases:
        done = invoke(*args)
        assert done.exit_code == 2, done.output
        assert done.stderr == f"kit: error: {args[args.index('--out') + 1] if '--out' in args else args[2]}: output: expected {NO_ROOM}\n"
    assert os.listdir(out) == []


def test_read_only_database(tmp_path):
    db = tmp_path / "ro" / "fleet.sqlite"
    with tmpfs(tmp_path / "ro", "size=4m") as ro:
        assert kit("load", str(CORVINA), "--db", str(db)).returncode == 0
        subprocess.run(["mount", "-o", "remount,ro", str(ro)], check=True)
        before = db.read_bytes()
        for args in (["load", str(DEMO)], ["bom", "--days", "90", "--out", str(tmp_path / "b.xlsx")], ["db", "status"]):
            done = kit(*args, "--db", str(db))
            assert done.returncode == 2
            assert one_line(done.stderr) == (f"kit: error: database sqlite:///{db}: cannot be opened: the file or its folder "
                                             "is read-only (kit writes to it, even to read); unable to open database file")
        assert db.read_bytes() == before
        assert not (tmp_path / "b.xlsx").exists()
        done = kit("load", str(CORVINA), "--db", str(ro / "new" / "fleet.sqlite"))
        assert one_line(done.stderr) == (f"kit: error: database sqlite:///{ro / 'new' / 'fleet.sqlite'}: its folder cannot "
                                         "be made (Read-only file system); give a writable path")
