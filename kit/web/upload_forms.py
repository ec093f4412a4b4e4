# SPDX-License-Identifier: MIT
"""A form's upload field, checked before any reader sees it, and its refusals said as the command
line says them.

A page that takes a file asks :func:`one_upload` for it: exactly one file per field, under a name
ending in a suffix the service's reader takes, then :func:`reading` saves it (the size bounded by
the upload limit; see :mod:`kit.web.uploads`), refuses an empty one, and hands the path to the
service. A refusal of the service (a :class:`kit.errors.KitError`) comes back naming the file as
the user uploaded it, never the temporary folder, and the services write in one transaction, so a
refused file leaves nothing behind.
"""

from __future__ import annotations

import contextlib
from pathlib import Path
from typing import Iterator, Sequence


from kit.errors import ArgumentError, InputError, KitError
from kit.web.uploads import as_uploaded, safe_name, saved


class UploadRefused(KitError, ValueError):
    """A service's refusal of an uploaded file, already said of the file by its uploaded name."""

    def __init__(self, message: str):
        super().__init__(message)
        self.message = message

    def __str__(self) -> str:
        return self.message


def one_upload(form, field: str, what: str, suffixes: Sequence[str]):
    """The one file (a Starlette ``UploadFile``) of ``form``'s ``field``, ``what`` in words ("the
    catalogue"), whose name ends in one of ``suffixes`` (".xlsx", any letter case)."""
    given = form.getlist(field)
    files = [f for f in given if not isinstance(f, str)]
    kinds = " or ".join(suffixes)
    if len(given) > 1:
        raise ArgumentError("", what, f"one {kinds} file", got=f"{len(given)} files")
    if not files or not files[0].filename:
        raise ArgumentError("", what, f"a {kinds} file", got="no file")
    upload = files[0]
    name = safe_name(upload.filename)
    suffix = Path(name).suffix.lower()
    if suffix not in suffixes:
        raise InputError(name, "file", f"a file ending in {kinds}", got=repr(suffix) if suffix else "no suffix")
    return upload


def text_field(form, field: str, what: str, *, required: bool = True, max_length: int = 200) -> str:
    """A form's text ``field`` (never a file put in its place), at most ``max_length`` characters."""
    value = form.get(field)
    if value is None and not required:
        return ""
    if not isinstance(value, str):
        raise ArgumentError("", what, "text", got="a file" if value is not None else "nothing")
    if len(value) > max_length:
        raise ArgumentError("", what, f"at most {max_length} characters", got=f"{len(value):,}")
    return value


def choice_field(form, field: str, what: str, choices: dict[str, str | None]) -> str | None:
    """The value ``choices`` maps the form's ``field`` to (a missing field counts as "")."""
    value = form.get(field) or ""
    if not isinstance(value, str) or value not in choices:
        raise ArgumentError("", what, "one of " + ", ".join(repr(c) for c in choices), got=repr(value) if isinstance(value, str) else "a file")
    return choices[value]


@contextlib.contextmanager
def reading(upload, limit: int) -> Iterator[Path]:
    """The uploaded file saved where a service can read it by path; an empty file is refused, and a
    service's refusal of it is said of the file by its uploaded name (:class:`UploadRefused`)."""
    with saved(upload, limit) as path:
        if path.stat().st_size == 0:
            raise InputError(safe_name(upload.filename), "file", "a file with something in it", got="an empty file")
        try:
            yield path
        except KitError as exc:
            raise UploadRefused(as_uploaded(str(exc), path, upload.filename)) from None
