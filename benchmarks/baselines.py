# SPDX-License-Identifier: MIT
"""The baselines the benchmark measures kit against, each run as a process of its own.

``python -m benchmarks.baselines toml FOLDER``            parse every particulars file with tomllib alone
``python -m benchmarks.baselines csv FILE DB``             csv module + sqlite3 executemany, one transaction
``python -m benchmarks.baselines xlsx FILE DB``            openpyxl read-only + sqlite3 executemany
``python -m benchmarks.baselines rows ROWS.pickle DB``     checked catalogue rows into kit's table, sqlite3 alone
``python -m benchmarks.baselines cells CELLS.pickle OUT``  write the same cells with openpyxl write-only

None of them imports kit: each is the least a program doing that step has to do.
"""

from __future__ import annotations

import sys


def toml(folder: str) -> None:
    import tomllib
    from pathlib import Path

    for path in sorted(Path(folder).glob("*.toml")):
        tomllib.loads(path.read_bytes().decode("utf-8"))


def _insert(db: str, header: list, rows) -> None:
    import sqlite3

    conn = sqlite3.connect(db, isolation_level=None)
    cols = ", ".join(f"c{i}" for i in range(len(header)))  # SQLite names are case-blind: d and D clash
    conn.execute(f"CREATE TABLE IF NOT EXISTS catalogue ({cols})")
    conn.execute("BEGIN")
    conn.executemany(f"INSERT INTO catalogue VALUES ({', '.join('?' * len(header))})", rows)
    conn.execute("COMMIT")
    conn.close()


def csv_file(path: str, db: str) -> None:
    import csv

    with open(path, newline="", encoding="utf-8") as f:
        reader = csv.reader(f)
        header = next(reader)
        _insert(db, header, reader)


def xlsx_file(path: str, db: str) -> None:
    import openpyxl

    wb = openpyxl.load_workbook(path, read_only=True, data_only=True)
    rows = wb["catalogue"].iter_rows(values_only=True)
    header = list(next(rows))
    _insert(db, header, rows)
    wb.close()


def rows(source: str, db: str) -> None:
    """The floor of a catalogue import: rows already checked, inserted into the fleet database's
    own catalogue table (its keys, indexes and constraints) by sqlite3 executemany, one transaction."""
    import pickle
    import sqlite3

    with open(source, "rb") as f:
        sql, values = pickle.load(f)
    conn = sqlite3.connect(db, isolation_level=None)
    conn.execute("PRAGMA foreign_keys=ON")
    conn.execute("BEGIN")
    conn.executemany(sql, values)
    conn.execute("COMMIT")
    conn.close()


def cells(source: str, out: str) -> None:
    import pickle

    from openpyxl import Workbook

    with open(source, "rb") as f:
        sheets = pickle.load(f)
    wb = Workbook(write_only=True)
    for title, rows in sheets:
        ws = wb.create_sheet(title)
        for row in rows:
            ws.append(row)
    wb.save(out)


STEPS = {"toml": toml, "csv": csv_file, "xlsx": xlsx_file, "rows": rows, "cells": cells}

if __name__ == "__main__":
    STEPS[sys.argv[1]](*sys.argv[2:])
