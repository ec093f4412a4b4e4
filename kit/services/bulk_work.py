# SPDX-License-Identifier: MIT
"""Work on many small objects at once (a 100,000-row catalogue, a 1,000-vessel order) with
Python's cycle collector paused.

The collector runs after every few hundred new container objects and now and then walks every
object still alive. A catalogue import or a fleet order builds hundreds of thousands of rows,
parts and lines that hold no reference cycles and live to the end of the work, so those walks
find nothing and, as the live objects grow, take a large share of the time: about half of
building the benchmark's 1,000-vessel order (measured in one process, the collector on and off).
Reference counting still frees everything that is dropped; cycles made meanwhile are collected
once the collector runs again.
"""

from __future__ import annotations

import gc
from collections.abc import Iterator
from contextlib import contextmanager


@contextmanager
def without_cycle_collection() -> Iterator[None]:
    """The cycle collector paused for the ``with`` block and restored as it was, errors or not."""
    was = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was:
            gc.enable()
