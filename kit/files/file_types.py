# SPDX-License-Identifier: MIT
"""What kind of thing a path names, in words, for the one-line refusals of
:mod:`kit.files.input_files` and :mod:`kit.files.output_targets`."""

from __future__ import annotations

import os
import stat

# stat's file-type test -> the words a refusal uses
KINDS = (
    (stat.S_ISDIR, "a folder"),
    (stat.S_ISFIFO, "a FIFO"),
    (stat.S_ISCHR, "a character device"),
    (stat.S_ISBLK, "a block device"),
    (stat.S_ISSOCK, "a socket"),
)


def kind_of(mode: int) -> str:
    """``"a regular file"``, ``"a folder"``, ``"a FIFO"``, ... for a stat mode."""
    for test, words in KINDS:
        if test(mode):
            return words
    return "a regular file" if stat.S_ISREG(mode) else "a special file"


def described(path: str | os.PathLike, st: os.stat_result) -> str:
    """:func:`kind_of` of ``st`` (the followed ``path``), as "a link to ..." when ``path`` is a link."""
    return f"a link to {kind_of(st.st_mode)}" if os.path.islink(path) else kind_of(st.st_mode)
