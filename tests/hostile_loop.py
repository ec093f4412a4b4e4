# SPDX-License-Identifier: MIT
"""One process of the concurrency test: a bounded loop of kit commands on a shared database.

Usage: python hostile_loop.py URL WORKDIR NAME TIMES START_AT
Each round adds one of every part at location NAME (stock import --mode adjust), replaces
supplier NAME's catalogue, and exports the bill of materials. Prints the number of adjustments
that went in; any failure prints its one line on stderr and the process exits 2.
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

from click.testing import CliRunner

from kit.cli import main

DEADLINE_S = 60


def run(url: str, work: str, name: str, times: str, start_at: str) -> int:
    work_dir = Path(work)
    time.sleep(max(0.0, float(start_at) - time.time()))
    runner, done, stop = CliRunner(), 0, time.monotonic() + DEADLINE_S
    for i in range(int(times)):
        if time.monotonic() > stop:
            break
        for args in (["stock", "import", str(work_dir / f"{name}.csv"), "--vessel", "CORVINA-BAY", "--mode", "adjust"],
                     ["catalogue", "import", str(work_dir / f"{name}-cat.csv"), "--supplier", name],
                     ["bom", "--days", "90", "--out", str(work_dir / f"{name}-{i % 2}.xlsx")]):
            result = runner.invoke(main, [*args, "--db", url])
            if result.exit_code != 0:
                sys.stderr.write(result.stderr or repr(result.exception) + "\n")
                print(done)
                return 2
            done += args[0] == "stock"
    print(done)
    return 0


if __name__ == "__main__":
    sys.exit(run(*sys.argv[1:]))
