# SPDX-License-Identifier: MIT
"""Input files at their worst: a FIFO that no one writes to, a device node, a folder, a link to
any of those, where kit expects a particulars, policy, stock or catalogue file; files past
their size limits; TOML nested deep enough to exhaust the parser's stack or its time; ``.TOML``
in capitals; and one vessel id in two files of one load. Each is refused at once with one line
naming the file, exit status 2, nothing written; the FIFO and the device are left as they were.

FIFOs and device nodes are made in the test's own temporary folder; the device node has the
numbers of /dev/null (1, 3). While kit runs on a FIFO a watcher stands by to release it, so a
kit that waited on the FIFO would fail the test instead of hanging it.
"""

from __future__ import annotations

import contextlib
import os
import re
import stat
import threading
import tomllib
from pathlib import Path
from typing import Iterator

import pytest
from click.testing import CliRunner

from catalog_schema.engine import make_engine
from db_support import TOML_CYLINDER, dump
from kit.cli import main
from kit.errors import InputError
from kit.files.input_files import MAX_CSV_BYTES, MAX_TOML_BYTES, MAX_XLSX_BYTES, Kind, open_text
from kit.files.policy_file import policy_from_text
from kit.files.toml_text import MAX_DEPTH, nesting_depth

NULL_DEVICE = os.makedev(1, 3)  # the numbers of /dev/null (Linux devices.txt: char 1, minor 3)
DEEP = f"TOML nested at most {MAX_DEPTH} deep (arrays, inline tables, dotted keys)"


def invoke(*args):
    return CliRunner().invoke(main, [str(a) for a in args])


@pytest.fixture
def fleet(tmp_path):
    """A SQLite fleet database holding TEST-ONE and its parts."""
    db = tmp_path / "fleet.sqlite"
    good = tmp_path / "good.toml"
    good.write_text(TOML_CYLINDER)
    for args in (["load", good], ["parts", "register"]):
        assert invoke(*args, "--db", db).exit_code == 0
    engine = make_engine(f"sqlite:///{db}")
    yield db, engine, good
    engine.dispose()


# reader -> its arguments with the input path P (G: a good particulars file, D: the database)
READERS = {
    "load .toml": lambda p, g, d: ["load", p, "--db", d],
    "load .xlsx": lambda p, g, d: ["load", p, "--db", d],
    "calc": lambda p, g, d: ["calc", p],
    "calc --policy": lambda p, g, d: ["calc", g, "--policy", p],
    "bom --particulars": lambda p, g, d: ["bom", "--particulars", p, "--out", Path(d).parent / "bom.xlsx", "--db", d],
    "bom --policy": lambda p, g, d: ["bom", "--policy", p, "--out", Path(d).parent / "bom.xlsx", "--db", d],
    "policy set --file": lambda p, g, d: ["policy", "set", "--company", "Brackwater Test Shipping", "--name", "x",
                                          "--days", "90", "--from", "2025-01-01", "--file", p, "--db", d],
    "template --from": lambda p, g, d: ["template", "particulars", Path(d).parent / "t.xlsx", "--from", p],
    "stock import .csv": lambda p, g, d: ["stock", "import", p, "--vessel", "TEST-ONE", "--db", d],
    "stock import .xlsx": lambda p, g, d: ["stock", "import", p, "--vessel", "TEST-ONE", "--db", d],
    "catalogue import .csv": lambda p, g, d: ["catalogue", "import", p, "--supplier", "Acme", "--db", d],
    "catalogue import .xlsx": lambda p, g, d: ["catalogue", "import", p, "--supplier", "Acme", "--db", d],
}


def suffix(reader: str) -> str:
    return ".xlsx" if reader.endswith(".xlsx") else ".csv" if reader.endswith(".csv") else ".toml"


def unchanged(fleet, folder: Path):
    """A context of sorts: the database and the folder's names before, to compare after."""
    _, engine, _ = fleet
    return dump(engine), sorted(n for n in os.listdir(folder) if not n.startswith("fleet.sqlite-"))


@contextlib.contextmanager
def watched(fifo: Path, seconds: float = 10.0) -> Iterator[list[bool]]:
    """Run a block while a watcher, after ``seconds``, opens ``fifo`` for writing and closes it at
    once: a reader kit left waiting on it then reads an empty file, and the test fails instead of
    hanging. The list it yields holds True once the watcher had to do that."""
    stop, released = threading.Event(), [False]

    def release() -> None:
        if stop.wait(seconds):
            return
        while not stop.is_set():
            try:
                fd = os.open(fifo, os.O_WRONLY | os.O_NONBLOCK)  # ENXIO while no reader waits
            except OSError:
                stop.wait(0.05)
                continue
            os.close(fd)
            released[0] = True

    watcher = threading.Thread(target=release, daemon=True)
    watcher.start()
    try:
        yield released
    finally:
        stop.set()
        watcher.join()


@pytest.mark.parametrize("reader", sorted(READERS))
@pytest.mark.parametrize("linked", [False, True], ids=["fifo", "link to a fifo"])
def test_a_fifo_is_refused_not_waited_on(fleet, tmp_path, reader, linked):
    db, engine, good = fleet
    fifo = tmp_path / f"pipe{suffix(reader)}"
    os.mkfifo(fifo)
    path = fifo
    if linked:
        path = tmp_path / f"link{suffix(reader)}"
        path.symlink_to(fifo)
    before = unchanged(fleet, tmp_path)
    with watched(fifo) as released:
        done = invoke(*READERS[reader](path, good, db))
    assert not released[0], "kit waited on the FIFO"
    got = "a link to a FIFO" if linked else "a FIFO"
    assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {path}: file: expected a regular file (got {got})\n", "")
    assert unchanged(fleet, tmp_path) == before
    assert stat.S_ISFIFO(os.stat(fifo).st_mode)


@pytest.mark.parametrize("reader", sorted(READERS))
def test_a_device_or_folder_is_refused_unread(fleet, tmp_path, reader):
    db, engine, good = fleet
    device, folder = tmp_path / f"device{suffix(reader)}", tmp_path / f"folder{suffix(reader)}"
    os.mknod(device, 0o666 | stat.S_IFCHR, NULL_DEVICE)
    folder.mkdir()
    (folder / "a.toml").write_text(TOML_CYLINDER)  # a folder is a fine input for load and bom only
    link = tmp_path / f"link{suffix(reader)}"
    link.symlink_to(device)
    cases = [(device, "a character device"), (link, "a link to a character device")]
    if reader not in ("load .toml", "load .xlsx", "bom --particulars"):
        cases.append((folder, "a folder"))
    for path, got in cases:
        before = unchanged(fleet, tmp_path)
        done = invoke(*READERS[reader](path, good, db))
        assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {path}: file: expected a regular file (got {got})\n", "")
        assert unchanged(fleet, tmp_path) == before
    assert stat.S_ISCHR(os.stat(device).st_mode) and os.stat(device).st_rdev == NULL_DEVICE


def test_a_fifo_in_a_folder_of_particulars_is_refused(fleet, tmp_path):
    db, engine, _ = fleet
    folder = tmp_path / "fleet"
    folder.mkdir()
    (folder / "a.toml").write_text(TOML_CYLINDER)
    os.mkfifo(folder / "b.toml")
    before = dump(engine)
    for args in (["load", folder, "--db", db], ["bom", "--particulars", folder, "--out", tmp_path / "b.xlsx", "--db", db]):
        with watched(folder / "b.toml") as released:
            done = invoke(*args)
        assert not released[0], "kit waited on the FIFO"
        assert (done.exit_code, done.stderr) == (2, f"kit: error: {folder / 'b.toml'}: file: expected a regular file (got a FIFO)\n")
    assert dump(engine) == before
    assert not (tmp_path / "b.xlsx").exists()


# --- sizes ----------------------------------------------------------------------------------


@pytest.mark.parametrize(("reader", "limit"), [
    ("load .toml", MAX_TOML_BYTES), ("calc --policy", MAX_TOML_BYTES), ("policy set --file", MAX_TOML_BYTES),
    ("stock import .csv", MAX_CSV_BYTES), ("catalogue import .xlsx", MAX_XLSX_BYTES),
])
def test_a_file_past_its_size_limit_is_refused_unread(fleet, tmp_path, reader, limit):
    db, engine, good = fleet
    path = tmp_path / f"big{suffix(reader)}"
    with path.open("wb") as fh:
        fh.truncate(limit + 1)  # a sparse file: the size is there, no disk is used
    before = unchanged(fleet, tmp_path)
    done = invoke(*READERS[reader](path, good, db))
    assert (done.exit_code, done.stderr) == (
        2, f"kit: error: {path}: file: expected a file of at most {limit >> 20} MiB (got {(limit + 1) / 2**20:.1f} MiB)\n")
    assert unchanged(fleet, tmp_path) == before


def test_the_limits_are_the_documented_ones():
    # SECURITY.md and the README state these figures
    assert (MAX_TOML_BYTES, MAX_CSV_BYTES, MAX_XLSX_BYTES, MAX_DEPTH) == (4 << 20, 128 << 20, 128 << 20, 32)
    docs = (Path(__file__).resolve().parents[1] / "SECURITY.md").read_text()
    for figure in ("4 MiB", "128 MiB", "32 deep"):
        assert figure in docs


def test_a_file_that_grows_past_its_limit_while_read_is_refused(tmp_path):
    """The reader counts what it reads, not what stat said when the file was opened."""
    path = tmp_path / "stock.csv"
    path.write_text("part_key,quantity\n")  # 18 bytes
    with pytest.raises(InputError, match=rf"^{path}: file: expected a file of at most 10 bytes \(got 18 bytes\)$"):
        open_text(path, Kind("a CSV file", 10))
    with open_text(path, Kind("a CSV file", 20)) as fh:
        with path.open("a") as writer:
            writer.write("another line\n")  # another program appends while kit reads
        with pytest.raises(InputError, match=rf"^{path}: file: expected a file of at most 20 bytes \(got more\)$"):
            fh.read()


# --- TOML nesting ---------------------------------------------------------------------------


def nested(depth: int, kind: str) -> str:
    """A ``key = ...`` line nested ``depth`` deep by arrays, inline tables or a dotted key."""
    return {
        "arrays": "deep = " + "[" * depth + "1" + "]" * depth,
        "inline tables": "deep = " + "{ a = " * depth + "1" + " }" * depth,
        "dotted key": "deep" + ".a" * depth + " = 1",
    }[kind]


@pytest.mark.parametrize("kind", ["arrays", "inline tables", "dotted key"])
def test_nesting_is_bounded_before_parsing(fleet, tmp_path, kind):
    db, engine, good = fleet
    for depth in (MAX_DEPTH + 1, 5000):  # 5000 arrays exhaust tomllib's recursion; 5000 dots take it seconds
        path = tmp_path / "deep.toml"
        path.write_text(TOML_CYLINDER.replace("[vessel]", nested(depth, kind) + "\n\n[vessel]"))
        for reader in ("load .toml", "calc", "bom --particulars", "template --from"):
            before = unchanged(fleet, tmp_path)
            done = invoke(*READERS[reader](path, good, db))
            line = TOML_CYLINDER[:TOML_CYLINDER.index("[vessel]")].count("\n") + 1
            assert (done.exit_code, done.stderr) == (2, f"kit: error: {path}: file: expected {DEEP} (got deeper at line {line})\n")
            assert unchanged(fleet, tmp_path) == before
    policy = tmp_path / "policy.toml"
    policy.write_text(nested(500, kind) + "\n")
    for reader in ("calc --policy", "policy set --file"):
        done = invoke(*READERS[reader](policy, good, db))
        assert (done.exit_code, done.stderr) == (2, f"kit: error: {policy}: file: expected {DEEP} (got deeper at line 1)\n")
    with pytest.raises(InputError, match="^fleet database: x: file: expected " + re.escape(DEEP)):
        policy_from_text(nested(500, kind), "fleet database: x")  # a stored policy written by another program


def test_the_depth_limit_itself_is_accepted():
    for kind in ("arrays", "inline tables"):
        assert nesting_depth(nested(MAX_DEPTH, kind)) == (MAX_DEPTH, 1)
    assert nesting_depth(nested(MAX_DEPTH, "dotted key")) == (MAX_DEPTH, 1)


def test_brackets_and_dots_in_strings_and_comments_do_not_count():
    text = ('title = "[[[[{{{{ a.b.c.d"  # [[[[ {{{{ a.b.c\n'
            "path = 'C:\\[x].[y].[z]'\n"
            'notes = """\n[[[[ "quoted" ""\n]]"""\n'
            "raw = '''[[[[\n''''\n"
            "[[unit.filter]]\n"
            'element = "x.y.z"\n'
            "pressure = 1.5\n")
    assert tomllib.loads(text)["raw"] == "[[[[\n'"  # the strings end where tomllib ends them
    # deepest: [[unit.filter]], two brackets and one dot, at line 8
    assert nesting_depth(text) == (3, 8)


# --- .TOML in capitals, and one vessel in two files -----------------------------------------


def test_toml_in_any_case_is_toml(fleet, tmp_path):
    db, engine, _ = fleet
    folder = tmp_path / "newbuild"
    folder.mkdir()
    (folder / "A.TOML").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-A"))
    (folder / "b.Toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-B"))
    (folder / "readme.txt").write_text("not particulars")
    done = invoke("load", folder, "--db", db)
    assert (done.exit_code, done.stdout) == (0, "loaded 2 vessel(s): TEST-A, TEST-B\n")
    done = invoke("bom", "--particulars", folder, "--out", tmp_path / "b.xlsx", "--db", db)
    assert done.exit_code == 0 and "for 2 vessel(s)" in done.stdout


def test_one_vessel_in_two_files_of_a_load_is_refused(fleet, tmp_path):
    db, engine, _ = fleet
    folder = tmp_path / "fleet"
    folder.mkdir()
    (folder / "a.toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-TWIN"))
    (folder / "b.toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-TWIN").replace('name = "Test One"', 'name = "Other"'))
    line = (f"kit: error: {folder / 'b.toml'}: vessel.id: expected a vessel id no other file of this load has "
            f"(also in {folder / 'a.toml'}) (got 'TEST-TWIN')\n")
    before = unchanged(fleet, tmp_path)
    for args in (["load", folder, "--db", db], ["bom", "--particulars", folder, "--out", tmp_path / "b.xlsx", "--db", db]):
        done = invoke(*args)
        assert (done.exit_code, done.stderr, done.stdout) == (2, line, "")
        assert unchanged(fleet, tmp_path) == before
