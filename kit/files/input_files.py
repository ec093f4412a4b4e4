# SPDX-License-Identifier: MIT
"""Opening the files kit reads: only regular files, of bounded size, never waited on.

Every reader (particulars and policy TOML, the particulars, stock and catalogue workbooks and
CSV files) opens its file here. The path is looked at first (``stat``, following links) and
anything but a regular file is refused without being opened: a FIFO would make ``open`` wait
for a writer for ever, and a device such as ``/dev/zero`` would be read without end. The file is
then opened with ``O_NONBLOCK`` and ``fstat`` is asked again about what was opened, so a path
swapped for a FIFO or device in between is caught, not read. Sizes are bounded per kind
(:data:`MAX_TOML_BYTES`, :data:`MAX_CSV_BYTES`, :data:`MAX_XLSX_BYTES`); reading stops at the
limit even when the file grows or its size is not told by ``stat``.
"""

from __future__ import annotations

import io
import os
import stat
from dataclasses import dataclass
from pathlib import Path
from typing import TextIO

from kit.errors import InputError
from kit.files.file_types import described, kind_of

# A particulars file of a large vessel is a few kilobytes; a policy file less.
MAX_TOML_BYTES = 4 * 1024 * 1024
# A catalogue of 100,000 rows (the row limit, kit.files.sheets.MAX_ROWS) is 10 to 20 MB as CSV.
MAX_CSV_BYTES = 128 * 1024 * 1024
# The same catalogue as a workbook is a few MB; what it unpacks to is bounded in kit.files.sheets.
MAX_XLSX_BYTES = 128 * 1024 * 1024

_OPEN_FLAGS = os.O_RDONLY | os.O_NONBLOCK | getattr(os, "O_NOCTTY", 0) | getattr(os, "O_CLOEXEC", 0)


@dataclass(frozen=True)
class Kind:
    """A kind of input file: what a refusal says was expected of it, and its size limit."""

    expected: str  # e.g. "a readable particulars file"
    max_bytes: int


TOML_PARTICULARS = Kind("a readable particulars file", MAX_TOML_BYTES)
TOML_POLICY = Kind("a readable spares policy file", MAX_TOML_BYTES)
SHEET_CSV = Kind("an existing .xlsx or .csv file", MAX_CSV_BYTES)
SHEET_XLSX = Kind("an existing .xlsx or .csv file", MAX_XLSX_BYTES)
PARTICULARS_XLSX = Kind("an existing .xlsx file", MAX_XLSX_BYTES)
TLS_FILE = Kind("a readable PEM file", 1024 * 1024)
PASSWORD_FILE = Kind("a readable file holding a password on its first line", 4096)


def _size(size: int) -> str:
    """A size as a refusal shows it: MiB, or bytes below one MiB."""
    if size < 1 << 20:
        return f"{size:,} bytes"
    return f"{size >> 20} MiB" if size % (1 << 20) == 0 else f"{size / 2**20:.1f} MiB"


def _too_big(source: str, kind: Kind, got: str) -> InputError:
    return InputError(source, "file", f"a file of at most {_size(kind.max_bytes)}", got=got)


def _open(path: Path, kind: Kind) -> int:
    """Open ``path`` for reading, as a descriptor, when it is a regular file within the limit."""
    source = str(path)
    try:
        before = os.stat(path)
    except OSError as exc:
        raise InputError(source, "file", kind.expected, got=exc.strerror or str(exc)) from None
    if not stat.S_ISREG(before.st_mode):
        raise InputError(source, "file", "a regular file", got=described(path, before))  # never opened
    if before.st_size > kind.max_bytes:
        raise _too_big(source, kind, _size(before.st_size))
    try:
        fd = os.open(path, _OPEN_FLAGS)  # O_NONBLOCK: a FIFO swapped in cannot make this wait
    except OSError as exc:
        raise InputError(source, "file", kind.expected, got=exc.strerror or str(exc)) from None
    opened = os.fstat(fd)
    if not stat.S_ISREG(opened.st_mode) or (opened.st_dev, opened.st_ino) != (before.st_dev, before.st_ino):
        os.close(fd)
        raise InputError(source, "file", "a regular file that stays in place while kit opens it",
                         got=f"{kind_of(opened.st_mode)} in its place")
    if opened.st_size > kind.max_bytes:
        os.close(fd)
        raise _too_big(source, kind, _size(opened.st_size))
    return fd


def check_input(path: str | Path, kind: Kind) -> None:
    """Refuse ``path`` unless it is a regular file within ``kind``'s size limit (for readers that
    open the file by name themselves, such as openpyxl)."""
    os.close(_open(Path(path), kind))


def read_bytes(path: str | Path, kind: Kind) -> bytes:
    """The whole content of a regular file of at most ``kind.max_bytes``."""
    path = Path(path)
    fd = _open(path, kind)
    with os.fdopen(fd, "rb", buffering=0) as raw:
        data = raw.read(kind.max_bytes + 1)
    if len(data) > kind.max_bytes:
        raise _too_big(str(path), kind, "more")
    return data


def read_text(path: str | Path, kind: Kind) -> str:
    """:func:`read_bytes` decoded as UTF-8."""
    try:
        return read_bytes(path, kind).decode("utf-8")
    except UnicodeDecodeError:
        raise InputError(str(path), "file", "UTF-8 text", got="undecodable bytes") from None


class _Bounded(io.RawIOBase):
    """A file read through, refused once more than ``kind.max_bytes`` have come out of it."""

    def __init__(self, fd: int, source: str, kind: Kind):
        self._file = io.FileIO(fd, "rb")
        self._source, self._kind, self._total = source, kind, 0

    def readable(self) -> bool:
        return True

    def readinto(self, buffer) -> int:  # type: ignore[no-untyped-def]
        n = self._file.readinto(buffer) or 0
        self._total += n
        if self._total > self._kind.max_bytes:
            raise _too_big(self._source, self._kind, "more")
        return n

    def close(self) -> None:
        self._file.close()
        super().close()


def open_text(path: str | Path, kind: Kind, encoding: str = "utf-8", newline: str | None = None) -> TextIO:
    """A text stream over a regular file, refused part way if it passes ``kind.max_bytes``."""
    path = Path(path)
    raw = _Bounded(_open(path, kind), str(path), kind)
    return io.TextIOWrapper(io.BufferedReader(raw, 1 << 16), encoding=encoding, newline=newline)
