# SPDX-License-Identifier: MIT
"""Files kit writes appear whole or not at all: written to a temporary file beside the target,
then renamed into place (``os.replace`` is atomic on one file system)."""

from __future__ import annotations

import contextlib
import errno
import gc
import os
import sys
import tempfile
import uuid
from pathlib import Path
from typing import Callable, Iterator, Sequence

from kit.errors import OutputError
from kit.files.output_targets import refuse_bad_target


def replace_atomically(path: Path, write: Callable[[Path], object]) -> Path:
    """Call ``write(tmp)`` for a temporary file beside ``path``, then rename it to ``path``.

    On any failure the temporary file is removed and ``path`` is left as it was; an OSError
    (no room, no permission, read-only folder) becomes :class:`~kit.errors.OutputError`.
    ``path`` is refused (:func:`kit.files.output_targets.refuse_bad_target`: the fleet database, a
    device, FIFO, folder, a read-only file) before anything is written and again just before
    the rename, in case it became one meanwhile.
    Where the system offers it (Linux, ``O_TMPFILE``) the file being written has no name until it
    is complete, so even a process killed outright (SIGKILL, power loss) leaves no partial file.
    """
    refuse_bad_target(path)
    try:
        path.parent.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise OutputError(str(path), f"a writable folder ({exc.strerror})") from None
    try:
        _write_unnamed(path, write)
    except _NoUnnamedFiles:
        _write_named(path, write)
    return path


class _NoUnnamedFiles(Exception):
    """The file system cannot make a file without a name (no ``O_TMPFILE``)."""


def _write_unnamed(path: Path, write: Callable[[Path], object]) -> None:
    flag = getattr(os, "O_TMPFILE", 0)
    if not flag or not os.path.isdir("/proc/self/fd"):
        raise _NoUnnamedFiles
    try:
        fd = os.open(path.parent, flag | os.O_WRONLY, 0o644 & ~_umask())
    except OSError as exc:
        if exc.errno in (errno.EOPNOTSUPP, errno.EISDIR, errno.EINVAL, errno.ENOENT):
            raise _NoUnnamedFiles from None
        raise OutputError(str(path), f"a writable folder ({exc.strerror})") from None
    tmp: Path | None = None

    def finish() -> None:
        nonlocal tmp
        write(Path(f"/proc/self/fd/{fd}"))  # reopening the magic link writes the unnamed file
        os.fsync(fd)
        # The content is complete: give it a name beside the target, then move it into place.
        tmp = path.parent / f".{path.name}.{os.getpid()}.{uuid.uuid4().hex[:8]}.part"
        _link_following(f"/proc/self/fd/{fd}", tmp)
        refuse_bad_target(path)
        os.replace(tmp, path)
        tmp = None

    try:
        _refuse_quietly(path, finish, write)
    finally:
        os.close(fd)
        if tmp is not None and os.path.exists(tmp):
            os.unlink(tmp)


def _refuse_quietly(path: Path, step: Callable[[], object], write: Callable[[Path], object]) -> None:
    """Run ``step``; an OSError becomes one :class:`OutputError`, and nothing else is printed.

    A writer that failed half way (openpyxl's zip archive, its write-only sheet generators)
    is left holding a dead file; when it is collected it fails again and Python would print
    those second failures as "Exception ignored" tracebacks. They repeat the error reported
    here, so they are dropped while the failed writer is collected, and only then.
    """
    failure = None
    hook = sys.unraisablehook
    try:
        try:
            step()
        except OutputError:
            raise  # already one line, e.g. the target became a FIFO while the file was written
        except OSError as exc:
            failure = exc.strerror or str(exc)
            sys.unraisablehook = _drop
            _close_unsaved_sheets(write)
            gc.collect()  # the failed writer's leftovers, while they are still dropped
    finally:
        sys.unraisablehook = hook
    if failure is not None:
        raise OutputError(str(path), f"room and permission to write the file ({failure})")


def _close_unsaved_sheets(write: Callable[[Path], object]) -> None:
    """When ``write`` is an openpyxl workbook's ``save``, end the row streams of the write-only
    sheets it did not reach (``_rows``, openpyxl 3.1), which would fail again when collected."""
    for ws in getattr(getattr(write, "__self__", None), "worksheets", ()):
        rows = getattr(ws, "_rows", None)
        if rows is not None and hasattr(rows, "close"):
            try:
                rows.close()
            except (OSError, ValueError):
                pass  # the stream's file is already gone; the write was refused above


def _drop(_unraisable: object) -> None:
    """An unraisable-exception hook that prints nothing (see :func:`_refuse_quietly`)."""


def _link_following(source: str, target: Path) -> None:
    """``linkat(..., AT_SYMLINK_FOLLOW)``: name the file a /proc/self/fd link points at.

    ``os.link`` links the /proc symlink itself (which fails across file systems), so libc's
    linkat is called directly.
    """
    import ctypes

    at_fdcwd, at_symlink_follow = -100, 0x400
    libc = ctypes.CDLL(None, use_errno=True)
    if libc.linkat(at_fdcwd, os.fsencode(source), at_fdcwd, os.fsencode(str(target)), at_symlink_follow) != 0:
        code = ctypes.get_errno()
        raise OSError(code, os.strerror(code), str(target))


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _write_named(path: Path, write: Callable[[Path], object]) -> None:
    try:
        fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".part")
    except OSError as exc:
        raise OutputError(str(path), f"a writable folder ({exc.strerror})") from None
    os.close(fd)
    try:
        _refuse_quietly(path, lambda: (write(Path(tmp)), refuse_bad_target(path), os.replace(tmp, path)), write)
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)


@contextlib.contextmanager
def staged(writes: Sequence[tuple[Path, Callable[[Path], object]]]) -> Iterator[Callable[[], list[Path]]]:
    """Several files that appear all together or not at all.

    Each ``write(tmp)`` fills a temporary file beside its target (every target refused first as
    :func:`replace_atomically` refuses one); the block gets a ``publish`` function that renames them
    all into place, to call when everything else the files stand for is done (a database record,
    in the same transaction). If any write fails, or the block ends without publishing, every
    temporary file is removed and no target changes.
    """
    for path, _ in writes:
        refuse_bad_target(path)
    temps: list[tuple[Path, Path]] = []
    try:
        for path, write in writes:
            try:
                path.parent.mkdir(parents=True, exist_ok=True)
                fd, name = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".part")
            except OSError as exc:
                raise OutputError(str(path), f"a writable folder ({exc.strerror})") from None
            os.close(fd)
            temps.append((path, Path(name)))
            _refuse_quietly(path, lambda write=write, name=name: write(Path(name)), write)

        def publish() -> list[Path]:
            for path, _ in temps:
                refuse_bad_target(path)
            while temps:
                path, tmp = temps[0]
                try:
                    os.replace(tmp, path)
                except OSError as exc:
                    raise OutputError(str(path), f"room and permission to write the file ({exc.strerror})") from None
                temps.pop(0)
            return [path for path, _ in writes]

        yield publish
    finally:
        for _, tmp in temps:
            with contextlib.suppress(FileNotFoundError):
                os.unlink(tmp)
