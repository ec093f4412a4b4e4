# SPDX-License-Identifier: MIT
"""Output paths at their worst: the fleet database itself (by another name, a hard link, a
symbolic link, its -wal, -shm and -journal files), a FIFO, a device node, a socket, a folder, a
link to any of those, a read-only file; and ``kit demo --out`` pointed at a folder kit did not
make. Each is refused before any work with one line naming the path and the option, exit
status 2, and nothing is written: the FIFO stays a FIFO, the device stays a device.

Every FIFO, device node and socket is made inside the test's own temporary folder; the device
node has the numbers of /dev/null (1, 3), so even a write to it would go nowhere.
"""

from __future__ import annotations

import os
import socket
import sqlite3
import stat
from pathlib import Path

import pytest
from click.testing import CliRunner

import kit.files.atomic
from catalog_schema.engine import make_engine
from db_support import dump
from kit.files.atomic import replace_atomically
from kit.cli import main
from kit.errors import OutputError
from kit.files.output_targets import DEMO_MARKER, database_file, protecting

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"
CORVINA = DEMO / "corvina_bay.toml"
NOT_DB = "a file other than the fleet database and its -wal, -shm and -journal files"
NOT_SPECIAL = "a new file or a regular file"
WRITABLE = "a file kit may replace, with a write bit in its mode"
DEMO_OUT = f"a new folder, an empty one, or one kit demo made (with its {DEMO_MARKER} file)"
NULL_DEVICE = os.makedev(1, 3)  # the numbers of /dev/null (Linux devices.txt: char 1, minor 3)


def invoke(*args: str):
    return CliRunner().invoke(main, [str(a) for a in args])


@pytest.fixture
def fleet(tmp_path):
    """A SQLite fleet database holding Corvina Bay and its parts, in a folder of its own."""
    folder = tmp_path / "fleet"
    folder.mkdir()
    db = folder / "fleet.sqlite"
    for args in (["load", CORVINA], ["parts", "register"]):
        assert invoke(*args, "--db", db).exit_code == 0
    engine = make_engine(f"sqlite:///{db}")
    yield db, engine
    engine.dispose()


# command -> its arguments with the output path T (and the option a refusal names)
WRITERS = {
    "bom --out": (lambda db, t, ok: ["bom", "--out", t, "--db", db], "--out"),
    "bom --csv": (lambda db, t, ok: ["bom", "--out", ok, "--csv", t, "--db", db], "--csv"),
    "bom --json": (lambda db, t, ok: ["bom", "--out", ok, "--json", t, "--db", db], "--json"),
    "check --out": (lambda db, t, ok: ["check", "CORVINA-BAY", "--days", "30", "--out", t, "--db", db], "--out"),
    "template stock": (lambda db, t, ok: ["template", "stock", t, "--db", db], "OUT"),
    "template catalogue": (lambda db, t, ok: ["template", "catalogue", t], "OUT"),
    "template particulars": (lambda db, t, ok: ["template", "particulars", t, "--from", CORVINA], "OUT"),
}
WITH_DB = [w for w in WRITERS if "--db" in WRITERS[w][0]("D", "T", "O")]


def listing(folder: Path) -> list[str]:
    """The names in ``folder``, less SQLite's own -wal and -shm (they come and go with connections)."""
    return sorted(n for n in os.listdir(folder) if not n.startswith("fleet.sqlite-"))


def refused(fleet, args: list, folder: Path, line: str) -> None:
    """One line, exit 2, the database and ``folder``'s listing unchanged."""
    _, engine = fleet
    before, names = dump(engine), listing(folder)
    done = invoke(*args)
    assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {line}\n", "")
    assert dump(engine) == before
    assert listing(folder) == names


# --- the fleet database ---------------------------------------------------------------------


def database_names(db: Path) -> dict[str, tuple[Path, str]]:
    """Other paths to the database, made beside it: name -> (path, what the refusal calls it)."""
    hard, soft = db.parent / "order.xlsx", db.parent / "link.xlsx"
    os.link(db, hard)
    soft.symlink_to(db)
    return {
        "the file": (db, f"the fleet database {db}"),
        "a hard link": (hard, f"the fleet database {db}"),
        "a symbolic link": (soft, f"the fleet database {db}"),
        "its -shm by name": (Path(f"{db}-shm"), f"the -shm file of the fleet database {db}"),
        "its -journal by name": (Path(f"{db}-journal"), f"the -journal file of the fleet database {db}"),
        "a link's -wal": (db.parent / "link.xlsx-wal", f"the -wal file of a link to the fleet database {db}"),
    }


@pytest.mark.parametrize("writer", WITH_DB)
def test_the_fleet_database_is_never_an_output(fleet, writer):
    db, engine = fleet
    build, option = WRITERS[writer]
    content = db.read_bytes()
    for name, (target, what) in database_names(db).items():
        refused(fleet, build(db, target, db.parent / "ok.xlsx"), db.parent, f"{target}: {option}: expected {NOT_DB} (got {what})")
        assert db.read_bytes() == content, name


def test_the_write_ahead_log_in_use_is_never_an_output(fleet):
    """The -wal file exists while another connection holds changes in it (SQLite's WAL mode)."""
    db, engine = fleet
    other = sqlite3.connect(db)
    try:
        other.execute("PRAGMA wal_autocheckpoint=0")
        other.execute("CREATE TABLE scratch (x)")  # committed to the WAL, not yet to the database
        wal = Path(f"{db}-wal")
        log = wal.read_bytes()
        assert log  # the log is there and holds the change
        for writer in WITH_DB:
            build, option = WRITERS[writer]
            refused(fleet, build(db, wal, db.parent / "ok.xlsx"), db.parent,
                    f"{wal}: {option}: expected {NOT_DB} (got the -wal file of the fleet database {db})")
        assert wal.read_bytes() == log
    finally:
        other.close()


def test_a_postgresql_database_has_no_file_to_protect():
    assert database_file("postgresql+psycopg://kit@127.0.0.1:5432/fleet") is None
    assert database_file("sqlite:///:memory:") is None
    assert database_file("sqlite:////srv/kit/fleet.sqlite") == "/srv/kit/fleet.sqlite"


# --- things that are not regular files, and read-only files ----------------------------------


def special_paths(folder: Path) -> dict[str, tuple[Path, str, int]]:
    """name -> (path, what the refusal calls it, the stat file type it must keep)."""
    fifo, device, sock, sub = folder / "fifo.xlsx", folder / "device.xlsx", folder / "s.xlsx", folder / "sub.xlsx"
    os.mkfifo(fifo)
    os.mknod(device, 0o666 | stat.S_IFCHR, NULL_DEVICE)
    sub.mkdir()
    listener = socket.socket(socket.AF_UNIX)
    old = os.getcwd()
    os.chdir(folder)  # a socket's path is limited to about 100 bytes: bind it by its short name
    try:
        listener.bind(sock.name)
    finally:
        os.chdir(old)
    listener.close()
    found = {"a FIFO": (fifo, "a FIFO", stat.S_IFIFO), "a device": (device, "a character device", stat.S_IFCHR),
             "a socket": (sock, "a socket", stat.S_IFSOCK), "a folder": (sub, "a folder", stat.S_IFDIR)}
    for name, (path, what, kind) in list(found.items()):
        link = folder / f"link-to-{path.name}"
        link.symlink_to(path)
        found[f"a link to {name}"] = (link, f"a link to {what}", kind)
    return found


@pytest.mark.parametrize("writer", sorted(WRITERS))
def test_no_device_fifo_socket_or_folder_is_replaced(fleet, tmp_path, writer):
    db, _ = fleet
    folder = tmp_path / "targets"
    folder.mkdir()
    build, option = WRITERS[writer]
    for name, (path, what, kind) in special_paths(folder).items():
        refused(fleet, build(db, path, folder / "ok.xlsx"), folder, f"{path}: {option}: expected {NOT_SPECIAL} (got {what})")
        assert stat.S_IFMT(os.stat(path).st_mode) == kind, name
        if kind == stat.S_IFCHR:
            assert os.stat(path).st_rdev == NULL_DEVICE


@pytest.mark.parametrize("writer", sorted(WRITERS))
def test_a_read_only_file_is_not_replaced_even_by_root(fleet, tmp_path, writer):
    db, _ = fleet
    build, option = WRITERS[writer]
    kept = tmp_path / "kept.xlsx"
    kept.write_bytes(b"someone's approved order")
    kept.chmod(0o444)
    refused(fleet, build(db, kept, tmp_path / "ok.xlsx"), tmp_path,
            f"{kept}: {option}: expected {WRITABLE} (got a read-only file, mode 0444)")
    assert kept.read_bytes() == b"someone's approved order"
    link = tmp_path / "link.xlsx"
    link.symlink_to(kept)
    refused(fleet, build(db, link, tmp_path / "ok.xlsx"), tmp_path,
            f"{link}: {option}: expected {WRITABLE} (got a read-only file, mode 0444)")


def test_a_link_to_nothing_is_refused(fleet, tmp_path):
    db, _ = fleet
    link = tmp_path / "order.xlsx"
    link.symlink_to(tmp_path / "nowhere")
    refused(fleet, ["bom", "--out", link, "--db", db], tmp_path, f"{link}: --out: expected {NOT_SPECIAL} (got a link to nothing)")
    assert link.is_symlink() and not (tmp_path / "nowhere").exists()


def test_refused_before_any_work(fleet, tmp_path, monkeypatch):
    """A bad --csv is found before the order is built: nothing is computed, --out is not written."""
    db, _ = fleet

    def no_work(*args, **kwargs):
        raise AssertionError("the order was built before the outputs were checked")

    monkeypatch.setattr("kit.services.orders.build_order", no_work)
    fifo = tmp_path / "order.csv"
    os.mkfifo(fifo)
    refused(fleet, ["bom", "--out", tmp_path / "order.xlsx", "--csv", fifo, "--db", db], tmp_path,
            f"{fifo}: --csv: expected {NOT_SPECIAL} (got a FIFO)")


@pytest.mark.parametrize("given, option, first", [
    (lambda t: ["--out", t / "order.xlsx", "--csv", t / "order.xlsx"], "--csv", "--out"),
    (lambda t: ["--out", t / "order.xlsx", "--json", t / "sub" / ".." / "order.xlsx"], "--json", "--out"),
    (lambda t: ["--out", t / "order.xlsx", "--csv", t / "lines.csv", "--json", t / "lines.csv"], "--json", "--csv"),
])
def test_two_outputs_of_one_command_are_two_files(fleet, tmp_path, given, option, first):
    """--out and --csv naming one file: before, the CSV silently replaced the workbook (exit 0)."""
    db, _ = fleet
    (tmp_path / "sub").mkdir()
    args = given(tmp_path)
    target = args[args.index(option) + 1]
    old = tmp_path / "order.xlsx"
    old.write_bytes(b"last week's order")
    refused(fleet, ["bom", *args, "--db", db], tmp_path,
            f"{target}: {option}: expected a file other than {first}'s (got the file {first} writes)")
    assert old.read_bytes() == b"last week's order"


def test_a_writable_file_is_still_replaced(fleet, tmp_path):
    db, _ = fleet
    old = tmp_path / "order.xlsx"
    old.write_bytes(b"last week's order")
    done = invoke("bom", "--out", old, "--db", db)
    assert done.exit_code == 0, done.output
    assert old.read_bytes()[:2] == b"PK"  # a workbook (a zip archive) now


# --- the race: the target changes while the file is being written ---------------------------


@pytest.fixture(params=["unnamed", "named"])
def temporary_files(request, monkeypatch):
    """Both ways kit.files.atomic writes: an O_TMPFILE file, and a named temporary file."""
    if request.param == "named":
        monkeypatch.delattr(kit.files.atomic.os, "O_TMPFILE", raising=False)
    return request.param


def test_a_fifo_made_while_writing_is_not_replaced(tmp_path, temporary_files):
    target = tmp_path / "order.csv"

    def write(tmp: Path) -> None:
        tmp.write_text("a,b\n")
        os.mkfifo(target)  # another process puts a FIFO where the output goes

    with pytest.raises(OutputError, match=rf"^{target}: output: expected {NOT_SPECIAL} \(got a FIFO\)$"):
        replace_atomically(target, write)
    assert stat.S_ISFIFO(os.stat(target).st_mode)
    assert os.listdir(tmp_path) == ["order.csv"]  # no temporary file left behind


def test_a_link_to_the_database_made_while_writing_is_not_replaced(tmp_path, temporary_files):
    db = tmp_path / "fleet.sqlite"
    db.write_bytes(b"SQLite format 3\0")
    target = tmp_path / "order.csv"

    def write(tmp: Path) -> None:
        tmp.write_text("a,b\n")
        os.link(db, target)

    with protecting(f"sqlite:///{db}"):
        with pytest.raises(OutputError, match=rf"^{target}: output: expected {NOT_DB} \(got the fleet database {db}\)$"):
            replace_atomically(target, write)
    assert db.read_bytes() == target.read_bytes() == b"SQLite format 3\0"
    assert sorted(os.listdir(tmp_path)) == ["fleet.sqlite", "order.csv"]


# --- kit demo --out ------------------------------------------------------------------------


def demo(out) -> object:
    return invoke("demo", "--out", out, "--days", "30", "--check-days", "30")


def test_the_demo_folder_is_named_neutrally_by_the_library(tmp_path):
    """The library calls it the demo folder; ``kit demo`` (below) names its --out there."""
    from kit.files.output_targets import check_demo_folder

    (tmp_path / "notes.txt").write_text("the chief's notes")
    with pytest.raises(OutputError) as refused:
        check_demo_folder(tmp_path)
    assert str(refused.value) == (f"{tmp_path}: demo folder: expected {DEMO_OUT} (got a folder kit demo did not make, "
                                  "holding 1 entry (e.g. 'notes.txt'))")


def test_the_option_is_named_when_kit_runs_as_a_module(tmp_path):
    """``python -m kit`` has a program name of three words; the command is still found, so the
    message names --out as ``kit demo`` does (before, the library's neutral word showed)."""
    import subprocess
    import sys

    (tmp_path / "notes.txt").write_text("the chief's notes")
    done = subprocess.run([sys.executable, "-m", "kit", "demo", "--out", str(tmp_path)], capture_output=True, text=True)
    assert (done.returncode, done.stderr) == (2, f"kit: error: {tmp_path}: --out: expected {DEMO_OUT} (got a folder kit demo "
                                                 "did not make, holding 1 entry (e.g. 'notes.txt'))\n")


def test_demo_refuses_a_folder_it_did_not_make(tmp_path, monkeypatch):
    work = tmp_path / "work"
    work.mkdir()
    (work / "notes.txt").write_text("the chief's notes")
    monkeypatch.chdir(work)
    done = demo(".")
    assert (done.exit_code, done.stderr) == (
        2, f"kit: error: .: --out: expected {DEMO_OUT} (got a folder kit demo did not make, holding 1 entry (e.g. 'notes.txt'))\n")
    assert os.listdir(work) == ["notes.txt"]
    home = tmp_path / "home"
    home.mkdir()
    (home / ".profile").write_text("# mine\n")
    (home / "fleet").mkdir()
    monkeypatch.setenv("HOME", str(home))
    done = demo(os.path.expanduser("~"))
    assert (done.exit_code, done.stderr) == (
        2, f"kit: error: {home}: --out: expected {DEMO_OUT} (got a folder kit demo did not make, holding 2 entries (e.g. '.profile'))\n")
    assert sorted(os.listdir(home)) == [".profile", "fleet"]


def test_demo_refuses_what_is_not_a_folder(tmp_path):
    file, fifo, link = tmp_path / "report.pdf", tmp_path / "pipe", tmp_path / "link"
    file.write_bytes(b"%PDF")
    os.mkfifo(fifo)
    (tmp_path / "made").mkdir()
    (tmp_path / "made" / DEMO_MARKER).write_text("")
    link.symlink_to(tmp_path / "made")
    for path, got in ((file, "a regular file"), (fifo, "a FIFO"), (link, "a link")):
        done = demo(path)
        assert (done.exit_code, done.stderr) == (2, f"kit: error: {path}: --out: expected {DEMO_OUT} (got {got})\n")
    assert file.read_bytes() == b"%PDF" and stat.S_ISFIFO(os.stat(fifo).st_mode)
    assert os.listdir(tmp_path / "made") == [DEMO_MARKER]


def test_demo_uses_an_empty_folder_and_replaces_only_its_own(tmp_path):
    out = tmp_path / "empty"
    out.mkdir()
    assert demo(out).exit_code == 0
    assert {DEMO_MARKER, "fleet.sqlite", "fleet-bom.xlsx", "imports"} <= set(os.listdir(out))
    (out / "fleet-bom.xlsx").write_bytes(b"edited")
    done = demo(out)  # kit made it and holds only what kit wrote: replaced whole
    assert done.exit_code == 0, done.output
    assert (out / "fleet-bom.xlsx").read_bytes()[:2] == b"PK" and (out / DEMO_MARKER).is_file()


def test_demo_keeps_what_it_did_not_make_in_a_marked_folder(tmp_path, monkeypatch):
    """Before, a marker was enough: a home folder holding one, or a demo folder the user had saved
    notes into, was deleted whole (exit 0)."""
    made = tmp_path / "kit-demo"
    assert demo(made).exit_code == 0
    (made / "notes.txt").write_text("the chief's notes")
    home = tmp_path / "home"
    home.mkdir()
    (home / "thesis.txt").write_text("mine")
    (home / DEMO_MARKER).write_text("")
    monkeypatch.setenv("HOME", str(home))
    for folder, name in ((made, "notes.txt"), (Path(os.path.expanduser("~")), "thesis.txt")):
        before = sorted(os.listdir(folder))
        done = demo(folder)
        assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {folder}: --out: expected {DEMO_OUT} "
                                                              f"(got a folder kit demo made that now also holds 1 entry "
                                                              f"it did not make (e.g. {name!r}))\n", "")
        assert sorted(os.listdir(folder)) == before and (folder / name).read_text() in ("the chief's notes", "mine")
