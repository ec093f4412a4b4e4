# SPDX-License-Identifier: MIT
"""Files kit writes appear whole or not at all: written to a temporary name beside the target,
then renamed into place (``os.replace`` is atomic on one file system)."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path
from typing import Callable

from kit.errors import OutputError


def replace_atomically(path: Path, write: Callable[[Path], object]) -> Path:
    """Call ``write(tmp)`` for a temporary file beside ``path``, then rename it to ``path``.

    On any failure the temporary file is removed and ``path`` is left as it was; an OSError
    (no room, no permission, read-only folder) becomes :class:`~kit.errors.OutputError`.
    """
    try:
        path.parent.mkdir(parents=True, exist_ok=True)
        fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".part")
    except OSError as exc:
        raise OutputError(str(path), f"a writable folder ({exc.strerror})") from None
    os.close(fd)
    try:
        write(Path(tmp))
        os.replace(tmp, path)
    except OSError as exc:
        raise OutputError(str(path), f"room and permission to write the file ({exc.strerror})") from None
    finally:
        if os.path.exists(tmp):
            os.unlink(tmp)
    return path
