# SPDX-License-Identifier: MIT
"""One side of the register-versus-import race (tests/test_db_races.py).

Usage: python race_worker.py ROLE URL WORKDIR ROUNDS

``import``: round r imports WORKDIR/cat-r.csv for supplier ``race-r``. Its transaction reads the
generic parts' ids, writes WORKDIR/read-r, and then waits (at most HOLD_S) for WORKDIR/registered-r
before it goes on to insert and commit: the delay that opens the window, added here in test code.
``register``: round r waits for WORKDIR/read-r (at most WAIT_S, else it fails), registers the parts of round r
(the keys the catalogue names) and writes WORKDIR/registered-r.

A project error prints its one line on stderr and exits 2.
"""

from __future__ import annotations

import sys
import time
from pathlib import Path

import kit.store.catalogue_import
import kit.services.imports
from catalog_schema.engine import make_engine, write_transaction
from kit.errors import KitError
from kit.engine.parts import LineItem
from kit.store.parts_store import register_parts

HOLD_S = 0.3
WAIT_S = 60.0
ROWS = 2000


def key(r: int, i: int) -> str:
    return f"spare:race-{r}-{i}"


def _wait_for(path: Path, seconds: float) -> bool:
    deadline = time.monotonic() + seconds
    while not path.exists() and time.monotonic() < deadline:
        time.sleep(0.005)
    return path.exists()


def importer(engine, work: Path, rounds: int) -> None:
    real = kit.store.catalogue_import.part_ids
    state = {}

    def part_ids_then_wait(conn):
        found = real(conn)
        (work / f"read-{state['r']}").write_text("read")
        _wait_for(work / f"registered-{state['r']}", HOLD_S)
        return found

    kit.store.catalogue_import.part_ids = part_ids_then_wait
    for r in range(rounds):
        state["r"] = r
        kit.services.imports.import_catalogue(engine, work / f"cat-{r}.csv", f"race-{r}")


def registrar(engine, work: Path, rounds: int) -> None:
    for r in range(rounds):
        if not _wait_for(work / f"read-{r}", WAIT_S):
            raise SystemExit(f"round {r}: the import never read the part ids")
        items = [LineItem("SG1", "spare", "", key(r, i), "", 1, "pcs", "test", key(r, i)) for i in range(ROWS)]
        write_transaction(engine, lambda conn: register_parts(conn, items))  # noqa: B023 (run at once)
        (work / f"registered-{r}").write_text("registered")


ROLES = {"import": importer, "register": registrar}


def main(role: str, url: str, work: str, rounds: str) -> int:
    engine = make_engine(url)
    try:
        ROLES[role](engine, Path(work), int(rounds))
    except KitError as exc:
        print(exc, file=sys.stderr)
        return 2
    finally:
        engine.dispose()
    return 0


if __name__ == "__main__":
    sys.exit(main(*sys.argv[1:]))
