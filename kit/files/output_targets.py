# SPDX-License-Identifier: MIT
"""Which paths kit may write to, and the folder ``kit demo`` may replace.

kit replaces an output file by renaming a finished temporary file onto its name
(:mod:`kit.files.atomic`). That rename would put a workbook where the fleet database was, replace a
device node or FIFO with a regular file, or replace a file someone made read-only on purpose,
root or not. :func:`refuse_bad_target` refuses those; commands call :func:`check_outputs` before
any work, and :func:`kit.files.atomic.replace_atomically` calls it again just before the rename.

The fleet database to protect is set for the length of a command by :func:`protecting`
(the ``--db`` option does it): the SQLite file and its ``-wal``, ``-shm`` and ``-journal``
companions, compared by device and inode (a hard link or a symbolic link to them is the same
file) and by name (a companion that does not exist yet). A PostgreSQL database has no file.
"""

from __future__ import annotations

import contextlib
import contextvars
import os
import shutil
import stat
from dataclasses import dataclass, field
from pathlib import Path
from typing import TYPE_CHECKING, Iterator, Mapping

from kit.errors import OutputError
from kit.files.file_types import described

if TYPE_CHECKING:
    from sqlalchemy.engine import URL

COMPANIONS = ("", "-wal", "-shm", "-journal")  # SQLite's own files beside the database
DEMO_MARKER = ".made-by-kit-demo"  # left in a folder kit demo made, so it may replace it


@dataclass
class Guard:
    """What the running command protects: the database file (or None) and each output's option."""

    database: str | None = None
    options: dict[str, str] = field(default_factory=dict)  # resolved output path -> its option, e.g. --out


_GUARD: contextvars.ContextVar[Guard | None] = contextvars.ContextVar("kit_output_guard", default=None)


def _guard() -> Guard:
    """The running command's guard; outside :func:`protecting`, a fresh one that protects nothing."""
    return _GUARD.get() or Guard()


def database_file(url: str | URL) -> str | None:
    """The SQLite file an SQLAlchemy URL names; None for PostgreSQL or an in-memory database."""
    from sqlalchemy.engine import make_url

    parsed = make_url(url)
    if parsed.get_backend_name() != "sqlite" or not parsed.database or parsed.database == ":memory:":
        return None
    return parsed.database


@contextlib.contextmanager
def protecting(database_url: str | URL | None) -> Iterator[None]:
    """Refuse, while the block runs, every output that is the database ``database_url`` names."""
    token = _GUARD.set(Guard(database_file(database_url) if database_url else None))
    try:
        yield
    finally:
        _GUARD.reset(token)


def _identity(path: str) -> tuple[int, int] | None:
    try:
        st = os.stat(path)
    except OSError:
        return None
    return st.st_dev, st.st_ino


def _database_part(target: Path, database: str) -> str | None:
    """Which of the database's files ``target`` is ("the fleet database", "the -wal file of ..."),
    or None."""
    name, same = os.path.realpath(target), _identity(str(target))
    for suffix in COMPANIONS:
        part = database + suffix
        if name == os.path.realpath(part) or (same is not None and same == _identity(part)):
            return "the fleet database" if not suffix else f"the {suffix} file of the fleet database"
        # beside a link to the database, SQLite would take this name for the link's companion
        if suffix and target.name.endswith(suffix):
            base = _identity(str(target)[: -len(suffix)])
            if base is not None and base == _identity(database):
                return f"the {suffix} file of a link to the fleet database"
    return None


def refuse_bad_target(path: str | os.PathLike, option: str | None = None) -> None:
    """Raise :class:`OutputError` unless kit may write ``path``: not the fleet database or its
    companions, and when it exists a regular file (links followed) with a write bit in its mode."""
    target = Path(path)
    guard = _guard()
    option = option or guard.options.get(os.path.realpath(target), "output")
    if guard.database:
        part = _database_part(target, guard.database)
        if part:
            raise OutputError(str(target), "a file other than the fleet database and its -wal, -shm and -journal files",
                              option, got=f"{part} {guard.database}")
    try:
        os.lstat(target)
    except FileNotFoundError:
        return  # a new file
    except OSError as exc:
        raise OutputError(str(target), "a path kit can look at", option, got=exc.strerror) from None
    try:
        st = os.stat(target)
    except OSError:
        raise OutputError(str(target), "a new file or a regular file", option, got="a link to nothing") from None
    if not stat.S_ISREG(st.st_mode):
        raise OutputError(str(target), "a new file or a regular file", option, got=described(target, st))
    if not st.st_mode & 0o222:
        raise OutputError(str(target), "a file kit may replace, with a write bit in its mode", option,
                          got=f"a read-only file, mode {stat.S_IMODE(st.st_mode):04o}")


def check_outputs(targets: Mapping[str, str | os.PathLike | None]) -> None:
    """Refuse the outputs a command was given (option -> path; None when not given) before any
    work, and remember each option so a refusal at the rename names it too."""
    guard = _guard()
    given: dict[str, str] = {}  # resolved path -> the option that named it first
    for option, path in targets.items():
        if path is None:
            continue
        refuse_bad_target(path, option)
        name = os.path.realpath(path)
        if name in given:  # the later write would replace the earlier one
            raise OutputError(str(path), f"a file other than {given[name]}'s", option, got=f"the file {given[name]} writes")
        given[name] = guard.options[name] = option


def check_folder(folder: str | os.PathLike, option: str = "output") -> None:
    """Refuse ``folder`` as the place for a command's files unless it is new or a folder (links followed)."""
    try:
        st = os.stat(folder)
    except FileNotFoundError:
        return
    except OSError as exc:
        raise OutputError(str(folder), "a folder kit can write files into", option, got=exc.strerror) from None
    if not stat.S_ISDIR(st.st_mode):
        raise OutputError(str(folder), "a new folder or an existing one", option, got=described(Path(folder), st))


# --- the demo folder ------------------------------------------------------------------------


def check_demo_folder(folder: Path, option: str = "demo folder") -> None:
    """Refuse ``folder`` unless it is new, empty, or a folder kit demo made (it holds the marker)."""
    expected = "a new folder, an empty one, or one kit demo made (with its " + DEMO_MARKER + " file)"
    try:
        st = os.lstat(folder)
    except FileNotFoundError:
        return
    except OSError as exc:
        raise OutputError(str(folder), expected, option, got=exc.strerror) from None
    if stat.S_ISLNK(st.st_mode):
        raise OutputError(str(folder), expected, option, got="a link")
    if not stat.S_ISDIR(st.st_mode):
        raise OutputError(str(folder), expected, option, got=described(folder, st))
    entries = os.listdir(folder)
    if entries and not _marked(folder):
        raise OutputError(str(folder), expected, option, got=f"a folder kit demo did not make, holding {len(entries)} "
                          f"{'entry' if len(entries) == 1 else 'entries'} (e.g. {sorted(entries)[0]!r})")
    # a marker alone is not enough: a marker left in a home folder, or a file the user saved into
    # the demo folder afterwards, must not be deleted with it
    foreign = sorted(set(entries) - _made_names(folder)) if entries else []
    if foreign:
        raise OutputError(str(folder), expected, option, got=f"a folder kit demo made that now also holds "
                          f"{len(foreign)} {'entry' if len(foreign) == 1 else 'entries'} it did not make "
                          f"(e.g. {foreign[0]!r})")


def _marked(folder: Path) -> bool:
    """The folder holds kit demo's marker, a regular file (not a link to one)."""
    try:
        return stat.S_ISREG(os.lstat(folder / DEMO_MARKER).st_mode)
    except OSError:
        return False


def _made_names(folder: Path) -> set[str]:
    """The names the marker lists (what kit demo wrote, one a line after the first), the marker and
    the database's companions."""
    try:
        listed = (folder / DEMO_MARKER).read_text(encoding="utf-8").splitlines()[1:]
    except (OSError, UnicodeDecodeError):
        listed = []
    return {DEMO_MARKER, *listed, *(f"fleet.sqlite{suffix}" for suffix in COMPANIONS)}


def record_demo_folder(folder: Path) -> None:
    """List in the marker what kit demo wrote in ``folder``, so only that is replaced next time."""
    names = sorted(set(os.listdir(folder)) - {DEMO_MARKER})
    with open(folder / DEMO_MARKER, "a", encoding="utf-8") as marker:
        marker.writelines(f"{name}\n" for name in names)


def make_demo_folder(folder: Path, option: str = "demo folder") -> None:
    """Empty ``folder`` (when :func:`check_demo_folder` allows it) and mark it as kit's."""
    check_demo_folder(folder, option)
    try:
        if _marked(folder):
            shutil.rmtree(folder)
        folder.mkdir(parents=True, exist_ok=True)
        (folder / DEMO_MARKER).write_text("kit demo made this folder; the next kit demo --out here replaces it.\n",
                                          encoding="utf-8")
    except OSError as exc:
        raise OutputError(str(folder), "a folder kit can make and write", option, got=exc.strerror) from None
