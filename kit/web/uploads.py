# SPDX-License-Identifier: MIT
"""Uploaded files, handed to the same readers as the command line's.

The services read files by path, as the command line gives them. An upload is written to a new
private temporary folder under its own base name (so the readers' checks of the file's kind by
its suffix and their messages naming the file hold), read there, and the folder removed whatever
happens. A refusal names the file as the user uploaded it, not the temporary folder.
"""

from __future__ import annotations

import contextlib
import re
import shutil
import tempfile
from pathlib import Path
from typing import Iterator

# A base name the readers accept: letters, digits, dot, dash, underscore, space; the rest becomes "_".
_UNSAFE = re.compile(r"[^\w.\- ]", re.UNICODE)


def safe_name(filename: str | None, default: str = "upload") -> str:
    """The upload's base name without any folder, control character or leading dot."""
    base = (filename or "").replace("\\", "/").rsplit("/", 1)[-1]
    base = _UNSAFE.sub("_", base).strip(" .")[:120]
    return base or default


@contextlib.contextmanager
def saved(upload, limit: int) -> Iterator[Path]:
    """The uploaded file (a Starlette ``UploadFile``) saved under its base name in a private
    temporary folder; the folder is removed afterwards. More than ``limit`` bytes is refused with
    :class:`kit.web.guard.BodyTooLarge` before it is all written."""
    from kit.web.guard import BodyTooLarge

    folder = Path(tempfile.mkdtemp(prefix="kit-upload-"))
    try:
        path = folder / safe_name(upload.filename)
        written = 0
        with open(path, "wb") as out:
            while chunk := upload.file.read(1 << 20):
                written += len(chunk)
                if written > limit:
                    raise BodyTooLarge(limit)
                out.write(chunk)
        yield path
    finally:
        shutil.rmtree(folder, ignore_errors=True)


def as_uploaded(message: str, path: Path, filename: str | None) -> str:
    """A reader's message about ``path`` said of the file as the user named it."""
    return message.replace(str(path), safe_name(filename)).replace(str(path.parent) + "/", "")
