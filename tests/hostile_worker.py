# SPDX-License-Identifier: MIT
"""A kit process for the fault tests, stopped at a chosen point so the test can kill it there.

Usage: python hostile_worker.py MODE MARKER GO -- KIT ARGS...

``pause-save``: the workbook being saved gets half its bytes, then MARKER is written and the
process waits (the test kills it with SIGKILL). ``pause-import``: the import's transaction has
done all its writes but not committed; MARKER gets the database connection's server process id
(PostgreSQL) or 0, and the process waits until the file GO exists (at most 60 s), then commits.
Then the command runs as ``kit`` would run it.
"""

from __future__ import annotations

import io
import os
import sys
import time
from pathlib import Path

WAIT_S = 60


def _wait_for(go: Path) -> None:
    deadline = time.monotonic() + WAIT_S
    while not go.exists() and time.monotonic() < deadline:
        time.sleep(0.02)


def pause_save(marker: Path, go: Path) -> None:
    import openpyxl

    real = openpyxl.Workbook.save

    def half_then_wait(self, filename):
        buf = io.BytesIO()
        real(self, buf)
        data = buf.getvalue()
        with open(filename, "wb") as fh:
            fh.write(data[: len(data) // 2])
            fh.flush()
            os.fsync(fh.fileno())
        marker.write_text("saving")
        _wait_for(go)

    openpyxl.Workbook.save = half_then_wait


def pause_import(marker: Path, go: Path) -> None:
    import catalog_schema.engine as engine_module
    import kit.store.catalogue_import
    import kit.store.stock_import

    real = engine_module.write_transaction

    def paused(engine, work, attempts=engine_module.WRITE_ATTEMPTS):
        def work_then_wait(conn):
            result = work(conn)
            pid = conn.exec_driver_sql("SELECT pg_backend_pid()").scalar() if conn.dialect.name == "postgresql" else 0
            marker.write_text(str(pid))
            _wait_for(go)
            return result

        return real(engine, work_then_wait, attempts)

    for module in (engine_module, kit.store.stock_import, kit.store.catalogue_import):
        module.write_transaction = paused


MODES = {"pause-save": pause_save, "pause-import": pause_import}

if __name__ == "__main__":
    mode, marker, go, dashes, *args = sys.argv[1:]
    assert dashes == "--", "usage: hostile_worker.py MODE MARKER GO -- KIT ARGS..."
    MODES[mode](Path(marker), Path(go))
    from kit.cli import main

    main(args, prog_name="kit")
