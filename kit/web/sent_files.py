# SPDX-License-Identifier: MIT
"""A file a page sends for download: written by the same kit.files writer as the command line's
into a private temporary folder, sent as an attachment, and the folder removed once it is sent."""

from __future__ import annotations

import shutil
import tempfile
from pathlib import Path
from typing import Callable

MEDIA_TYPES = {
    ".xlsx": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
    ".csv": "text/csv; charset=utf-8",
}


def sent_file(write: Callable[[Path], object], filename: str):
    """``write(path)`` into a new temporary folder, then the file as a download named ``filename``."""
    from fastapi.responses import FileResponse
    from starlette.background import BackgroundTask

    folder = Path(tempfile.mkdtemp(prefix="kit-download-"))
    try:
        path = folder / filename
        write(path)
    except BaseException:
        shutil.rmtree(folder, ignore_errors=True)
        raise
    return FileResponse(path, media_type=MEDIA_TYPES[path.suffix.lower()], filename=filename,
                        background=BackgroundTask(shutil.rmtree, folder, ignore_errors=True))
