# SPDX-License-Identifier: MIT
"""A second process for the concurrency tests: run one stock import many times.

Usage: python db_worker.py URL FILE VESSEL MODE TIMES START_AT
Waits until the clock reads START_AT (so two workers start together), then imports FILE for
VESSEL in MODE, TIMES times. Exits 0 when every import went in; a project error prints its
one line and exits 2.
"""

from __future__ import annotations

import sys
import time

from catalog_schema.engine import make_engine
from kit.errors import KitError
from kit.services.imports import import_stock


def main(url: str, file: str, vessel: str, mode: str, times: str, start_at: str) -> int:
    engine = make_engine(url)
    time.sleep(max(0.0, float(start_at) - time.time()))
    try:
        for _ in range(int(times)):
            import_stock(engine, file, vessel, mode)
    except KitError as exc:
        print(exc, file=sys.stderr)
        return 2
    finally:
        engine.dispose()
    return 0


if __name__ == "__main__":
    sys.exit(main(*sys.argv[1:]))
