# SPDX-License-Identifier: MIT
"""Fleet-scale benchmark: kit's commands as whole processes, each beside a baseline measured in
the same run, reported as ratios (medians of ``--runs`` runs; shared machines are noisy).

    python -m benchmarks.run [--vessels 1000] [--small 100] [--runs 3] [--pg URL] [--out FILE.json]

Steps (targets from issue 6):

1. ``kit --help`` and ``kit bom --help`` against ``python -c "import click"`` (<= 2.5);
2. ``kit load FOLDER`` of N vessels into SQLite against parsing the same TOML with tomllib (<= 4);
3. ``kit catalogue import`` of the 100,000-row catalogue (CSV, xlsx) against the csv module or
   openpyxl read-only with sqlite3 executemany in one transaction (<= 2; xlsx <= 0.3, issue 13); and, with no target,
   its floor: kit's checked rows inserted into kit's own table by sqlite3 alone (what the
   table's keys and indexes cost, whatever program writes the rows); then the CSV import
   against that floor, by turns (<= 2, issue 13);
4. ``kit bom`` of the whole fleet against writing the same cells with openpyxl write-only
   (<= 1.5, peak memory <= 300 MB);
5. ``kit bom`` at ``--small`` vessels against N vessels (time grows at most 11x for 10x);
6. the load, the imports and the BOM against PostgreSQL (``--pg``, default ``KIT_TEST_PG_URL``),
   beside SQLite. The benchmark makes a database of its own there and drops it at the end.
7. ``kit serve``'s pages under ``--serve-clients`` clients for ``--serve-seconds``, each page's
   95th percentile response time against the floor page's under the same load (vessel page
   <= 5, fleet page <= 10, no errors; issue 15), on both databases (:mod:`benchmarks.serve_load`).
8. the office server (issue 16; PostgreSQL only, skipped without ``--pg``): ``--office-sessions``
   people signed in to two ``kit serve`` processes on one database for ``--office-seconds``, each
   page's median and 95th percentile per server beside the floor page's (:mod:`benchmarks.office_load`).

Each kit run takes turns with a run of its baseline, so a figure and its baseline meet the same
state of the machine. The databases are prepared (untimed) with kit itself: ``kit db upgrade``,
``kit load``, ``kit parts register``, the catalogue and every vessel's stock, then settled as a
running server keeps them (:func:`settle`). Every timed command is started by ``launch.py``,
which reports its wall time and peak resident memory. Results go to ``--out`` (JSON) and a table
on stdout.
"""

from __future__ import annotations

import argparse
import json
import os
import platform
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from dataclasses import dataclass, field
from pathlib import Path

from benchmarks.fleet import generate

PY = sys.executable
KIT = [PY, "-m", "kit"]
BASE = [PY, "-m", "benchmarks.baselines"]
ROOT = Path(__file__).resolve().parent.parent
PG_DB = f"kit_benchmark_{os.getpid()}"  # its own per run: two runs at once never drop each other's


@dataclass
class Timing:
    seconds: list[float] = field(default_factory=list)
    peak_mb: list[float] = field(default_factory=list)

    @property
    def median(self) -> float:
        return statistics.median(self.seconds)

    @property
    def peak(self) -> float:
        return max(self.peak_mb)


LAUNCH = Path(__file__).with_name("launch.py")


def run_once(cmd: list[str], cwd: Path) -> tuple[float, float]:
    """Wall time (s) and peak RSS (MB) of ``cmd`` as one child process; fails loudly."""
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    done = subprocess.run([PY, str(LAUNCH), *cmd], cwd=cwd, env=env, capture_output=True, text=True, check=True)
    found = json.loads(done.stdout)
    if found["returncode"] != 0:
        raise SystemExit(f"benchmark step failed ({found['returncode']}): {' '.join(cmd)}\n{found['stderr']}")
    return found["seconds"], found["peak_mb"]


def measure(cmd: list[str], cwd: Path, runs: int, before=None) -> Timing:
    t = Timing()
    for _ in range(runs):
        if before:
            before()
        s, mb = run_once(cmd, cwd)
        t.seconds.append(s)
        t.peak_mb.append(mb)
    return t


def measure_pair(kit_cmd: list[str], base_cmd: list[str], cwd: Path, runs: int, before_kit=None,
                 before_base=None) -> tuple[Timing, Timing]:
    """kit and its baseline run by turns, so both meet the same state of a shared, noisy machine."""
    kit_t, base_t = Timing(), Timing()
    for _ in range(runs):
        for cmd, t, before in ((kit_cmd, kit_t, before_kit), (base_cmd, base_t, before_base)):
            if before:
                before()
            s, mb = run_once(cmd, cwd)
            t.seconds.append(s)
            t.peak_mb.append(mb)
    return kit_t, base_t


def kit(*args: str, cwd: Path) -> None:
    run_once([*KIT, *args], cwd)


# --- databases --------------------------------------------------------------------------------


def pg_url(base: str, name: str = PG_DB) -> str:
    from sqlalchemy.engine import make_url

    return make_url(base).set(database=name).render_as_string(hide_password=False)


def pg_recreate(base: str, name: str = PG_DB) -> None:
    from sqlalchemy import create_engine, text

    engine = create_engine(base, isolation_level="AUTOCOMMIT")
    with engine.connect() as conn:
        conn.execute(text(f"DROP DATABASE IF EXISTS {name} WITH (FORCE)"))
        conn.execute(text(f"CREATE DATABASE {name}"))
    engine.dispose()


def pg_drop(base: str, name: str = PG_DB) -> None:
    from sqlalchemy import create_engine, text

    engine = create_engine(base, isolation_level="AUTOCOMMIT")
    with engine.connect() as conn:
        conn.execute(text(f"DROP DATABASE IF EXISTS {name} WITH (FORCE)"))
    engine.dispose()


def import_all_stock(db: str, stock: Path) -> None:
    """Every vessel's stock count, in this process (one command per vessel would take minutes)."""
    from catalog_schema.engine import make_engine, resolve_url
    from kit.services.imports import import_stock

    engine = make_engine(resolve_url(db))
    try:
        for path in sorted(stock.glob("*.csv")):
            import_stock(engine, path, path.stem, "count")
    finally:
        engine.dispose()


def clear_supplier(db: str, supplier: str) -> None:
    """Drop a supplier's entries, so every timed import starts from the same database."""
    from sqlalchemy import delete, select

    from catalog_schema.engine import make_engine, resolve_url
    from catalog_schema.core_tables import CATALOGUE_ENTRIES as entries
    from catalog_schema.core_tables import SUPPLIERS as suppliers

    engine = make_engine(resolve_url(db))
    with engine.begin() as conn:
        ids = select(suppliers.c.id).where(suppliers.c.name == supplier).scalar_subquery()
        conn.execute(delete(entries).where(entries.c.supplier_id == ids))
    engine.dispose()


def settle(db: str) -> None:
    """Leave the database as a running office server keeps it, so a timed step does not pay for the
    untimed set-up before it: SQLite's write-ahead log checkpointed into the file; on PostgreSQL
    the dead rows of deleted catalogue entries vacuumed and the statistics gathered (what
    autovacuum does, and it is off on some servers), then a checkpoint."""
    import sqlite3

    from sqlalchemy import create_engine, text
    from sqlalchemy.engine import make_url

    from catalog_schema.engine import resolve_url

    url = make_url(resolve_url(db))
    if url.get_backend_name() == "sqlite":
        with sqlite3.connect(url.database) as conn:
            conn.execute("PRAGMA wal_checkpoint(TRUNCATE)")
        return
    engine = create_engine(url, isolation_level="AUTOCOMMIT")
    with engine.connect() as conn:
        conn.execute(text("VACUUM ANALYZE"))
        conn.execute(text("CHECKPOINT"))
    engine.dispose()


def prepare(db: str, fleet: dict[str, Path], cwd: Path) -> None:
    """A fleet database as an office would have it: fleet, parts, a catalogue, stock."""
    kit("db", "upgrade", "--db", db, cwd=cwd)
    kit("load", str(fleet["particulars"]), "--db", db, cwd=cwd)
    kit("parts", "register", "--db", db, cwd=cwd)
    kit("catalogue", "import", str(fleet["catalogue_csv"]), "--supplier", "Synthetic Seals GmbH", "--db", db, cwd=cwd)
    import_all_stock(db, fleet["stock"])
    settle(db)


def checked_catalogue(db: str, path: Path, supplier: str, out: Path) -> None:
    """kit's checked rows of the catalogue at ``path`` as kit inserts them for ``supplier`` (added
    here), with kit's INSERT statement, pickled for the floor step's plain sqlite3 insert."""
    import pickle
    import sqlite3

    from sqlalchemy.dialects import sqlite

    from catalog_schema.core_tables import CATALOGUE_ENTRIES
    from catalog_schema.sql import insert_statement
    from kit.files.catalogue_sheet import COLUMNS, ENTRY_COLUMNS, SHEET, check_rows
    from kit.files.sheets import read_table

    table = read_table(path, SHEET, known=COLUMNS, required=("supplier_ref", "currency"))
    with sqlite3.connect(db) as conn:
        conn.execute("INSERT OR IGNORE INTO suppliers (name) VALUES (?)", (supplier,))
        sid = conn.execute("SELECT id FROM suppliers WHERE name = ?", (supplier,)).fetchone()[0]
        known = dict(conn.execute("SELECT key, id FROM parts"))
    rows = [(sid, known.get(key), ref, key, *rest) for _, ref, key, *rest in check_rows(table)]
    out.write_bytes(pickle.dumps(insert_statement(sqlite.dialect(), CATALOGUE_ENTRIES, ENTRY_COLUMNS, rows)))


# --- the steps --------------------------------------------------------------------------------


def workbook_cells(path: Path, out: Path) -> None:
    """Every sheet's cell values of kit's workbook, for the write-only baseline to write again."""
    import pickle

    import openpyxl

    wb = openpyxl.load_workbook(path, read_only=True)
    sheets = [(ws.title, [list(r) for r in ws.iter_rows(values_only=True)]) for ws in wb.worksheets]
    wb.close()
    out.write_bytes(pickle.dumps(sheets))


def bench(args: argparse.Namespace) -> dict:
    work = Path(args.work or tempfile.mkdtemp(prefix="kit-bench-"))
    work.mkdir(parents=True, exist_ok=True)
    runs = args.runs
    results: dict = {"vessels": args.vessels, "small": args.small, "runs": runs, "catalogue_rows": args.catalogue_rows,
                     "python": platform.python_version(), "machine": f"{platform.machine()}, {os.cpu_count()} cores",
                     "date": time.strftime("%Y-%m-%d"), "steps": []}

    def record(step: str, what: str, kit_t: Timing, base_t: Timing | None, target: float | None, base_name: str,
               **extra) -> None:
        ratio = kit_t.median / base_t.median if base_t else None
        entry = {"step": step, "what": what, "kit_s": round(kit_t.median, 3), "kit_peak_mb": round(kit_t.peak, 1),
                 "baseline": base_name, "baseline_s": round(base_t.median, 3) if base_t else None,
                 "ratio": None if ratio is None else round(ratio, 2), "target": target,
                 "met": None if ratio is None or target is None else ratio <= target, "kit_runs_s": [round(s, 3) for s in kit_t.seconds],
                 **extra}
        results["steps"].append(entry)
        print(f"  {step:<4} {what:<44} kit {kit_t.median:7.3f} s  {base_name:<26} "
              f"{'' if base_t is None else f'{base_t.median:7.3f} s'}  ratio {entry['ratio']}", flush=True)

    # Byte-compile kit as an installed package is: an editable install compiles on first import,
    # unless (as on some CI machines) PYTHONDONTWRITEBYTECODE is set, and then every timed run
    # would compile kit's sources again while the baselines' libraries are compiled.
    subprocess.run([PY, "-m", "compileall", "-q", str(ROOT / "kit"), str(ROOT / "catalog_schema")], check=True)
    print(f"generating {args.vessels} and {args.small} vessels in {work}", flush=True)
    big = generate(work / "fleet", args.vessels, args.catalogue_rows)
    small = generate(work / "fleet-small", args.small, 0)
    small["catalogue_csv"] = big["catalogue_csv"]

    # 1. start-up
    click_cmd = [PY, "-c", "import click"]
    for label, cmd in (("kit --help", ["--help"]), ("kit bom --help", ["bom", "--help"])):
        record("1", label, *measure_pair([*KIT, *cmd], click_cmd, work, runs * 3), 2.5, "import click")

    dbs = {"sqlite": lambda name: str(work / f"{name}.sqlite")}
    if args.pg:
        dbs["postgresql"] = lambda name: pg_url(args.pg)

    def fresh(engine: str, name: str):
        def make() -> None:
            if engine == "sqlite":
                for suffix in ("", "-wal", "-shm"):
                    Path(dbs["sqlite"](name) + suffix).unlink(missing_ok=True)
            else:
                pg_recreate(args.pg)
            kit("db", "upgrade", "--db", dbs[engine](name), cwd=work)
        return make

    base_db = work / "baseline.sqlite"

    def fresh_baseline() -> None:
        base_db.unlink(missing_ok=True)

    cells = work / "bom-cells.pickle"
    for engine, db_of in dbs.items():
        print(f"{engine}:", flush=True)
        # 2. loading the particulars into a freshly built database
        db = db_of("load")
        record("2", f"kit load {args.vessels} vessels [{engine}]",
               *measure_pair([*KIT, "load", str(big["particulars"]), "--db", db], [*BASE, "toml", str(big["particulars"])],
                             work, runs, fresh(engine, "load")),
               4.0, "tomllib alone")

        # 3. the catalogue into a database holding the fleet and its parts
        db = db_of("fleet")
        if engine == "postgresql":
            pg_recreate(args.pg)
        prepare(db, big, work)
        supplier = "Synthetic Bench Supplier"

        def clear() -> None:
            clear_supplier(db, supplier)  # noqa: B023 (called within this iteration)
            settle(db)  # noqa: B023

        for label, path, kind, base_name in (("CSV", big["catalogue_csv"], "csv", "csv + sqlite3"),
                                             ("xlsx", big["catalogue_xlsx"], "xlsx", "openpyxl r/o + sqlite3")):
            kit_cmd = [*KIT, "catalogue", "import", str(path), "--supplier", supplier, "--db", db]
            record("3", f"kit catalogue import {args.catalogue_rows:,} rows {label} [{engine}]",
                   *measure_pair(kit_cmd, [*BASE, kind, str(path), str(base_db)], work, runs, clear, fresh_baseline),
                   2.0 if kind == "csv" else 0.3, base_name)  # xlsx: issue 13's target
            if engine == "sqlite" and kind == "csv":  # what the database's keys cost, without kit
                rows = work / "catalogue-rows.pickle"
                clear()
                checked_catalogue(db, path, supplier, rows)
                floor_cmd = [*BASE, "rows", str(rows), db]
                record("3", "floor: kit's checked rows into kit's table, sqlite3 alone [sqlite]",
                       *measure_pair(floor_cmd, [*BASE, kind, str(path), str(base_db)], work, runs, clear, fresh_baseline),
                       None, base_name)
                # issue 13's measure: the import against the floor, by turns (the rows above meet
                # the machine at different moments, so their quotient is noisier)
                record("3", f"kit catalogue import {args.catalogue_rows:,} rows CSV, against its floor [sqlite]",
                       *measure_pair(kit_cmd, floor_cmd, work, runs, clear, clear), 2.0, "the floor row's command")
        clear()

        # 4. the fleet's bill of materials, against writing the same cells
        out = work / f"bom-{engine}.xlsx"
        if not cells.exists():
            kit("bom", "--db", db, "--days", "90", "--out", str(out), cwd=work)
            workbook_cells(out, cells)
        bom_t, cells_t = measure_pair([*KIT, "bom", "--db", db, "--days", "90", "--out", str(out)],
                                      [*BASE, "cells", str(cells), str(work / "baseline-bom.xlsx")], work, runs)
        record("4", f"kit bom {args.vessels} vessels [{engine}]", bom_t, cells_t, 1.5, "openpyxl write-only",
               peak_target_mb=300, peak_met=bom_t.peak <= 300)

        # 5. scaling: the same at the small fleet (same catalogue)
        db_small = db_of("small") if engine == "sqlite" else db
        if engine == "postgresql":
            pg_recreate(args.pg)
        prepare(db_small, small, work)
        small_t = measure([*KIT, "bom", "--db", db_small, "--days", "90", "--out", str(work / "bom-small.xlsx")], work, runs)
        growth = bom_t.median / small_t.median
        results["steps"].append({"step": "5", "what": f"kit bom {args.small} -> {args.vessels} vessels [{engine}]",
                                 "kit_s": round(bom_t.median, 3), "baseline": f"kit bom {args.small} vessels",
                                 "baseline_s": round(small_t.median, 3), "ratio": round(growth, 2),
                                 "target": 11.0, "met": growth <= 11.0})
        print(f"  5    kit bom {args.small} -> {args.vessels} vessels: {small_t.median:.3f} s -> {bom_t.median:.3f} s, "
              f"x{growth:.2f}", flush=True)
    if args.pg:
        pg_drop(args.pg)

    # 7. kit serve's pages under load, each beside the floor page under the same load (issue 15)
    if args.serve_seconds > 0:
        from benchmarks.serve_load import bench_serve

        results["steps"] += bench_serve(work, big, args.pg, clients=args.serve_clients, seconds=args.serve_seconds,
                                        runs=args.serve_runs)
    # 8. the office server: people signed in to two servers on one PostgreSQL (issue 16)
    if args.pg and args.office_seconds > 0:
        from benchmarks.office_load import bench_office

        results["steps"] += bench_office(work, big, args.pg, sessions=args.office_sessions, seconds=args.office_seconds,
                                         runs=args.office_runs, keeps=args.office_keeps)
    if not args.keep and not args.work:
        shutil.rmtree(work, ignore_errors=True)
    return results


def table(results: dict) -> str:
    """The results as a Markdown table (the README's Performance section)."""
    lines = ["| step | what | kit [s] | baseline | baseline [s] | ratio | target | met |",
             "| --- | --- | ---: | --- | ---: | ---: | ---: | --- |"]
    for s in results["steps"]:
        met = {True: "yes", False: "**no**", None: ""}[s["met"]]
        if "peak_met" in s:
            met += f"; peak {s['kit_peak_mb']:.0f} MB {'yes' if s['peak_met'] else '**no**'}"
        if "errors" in s:  # steps 7 and 8: a page's requests and errors, its ratio's spread over the runs
            notes = [met] if met else []
            notes.append(f"{s['requests']} requests, {s['errors']} {'**errors**' if s['errors'] else 'errors'}")
            if s.get("ratio_spread"):
                notes.append(f"runs {s['ratio_spread'][0]} to {s['ratio_spread'][1]}")
            met = "; ".join(notes)
        target = "" if s["target"] is None else f"<= {s['target']:g}"
        lines.append(f"| {s['step']} | {s['what']} | {_seconds(s['kit_s'])} | {s['baseline']} | "
                     f"{_seconds(s['baseline_s'])} | {'' if s['ratio'] is None else s['ratio']} | {target} | {met} |")
    return "\n".join(lines)


def _seconds(value: float | None) -> str:
    """Seconds to two places, or three significant digits below 0.1 s (a page's response time)."""
    if value is None:
        return ""
    return f"{value:.2f}" if value >= 0.1 else f"{value:.3g}"


def fleet_options(parser: argparse.ArgumentParser) -> None:
    """The options of the fleet and the databases, shared with ``python -m benchmarks.serve_load``."""
    parser.add_argument("--vessels", type=int, default=1000)
    parser.add_argument("--catalogue-rows", type=int, default=100_000)
    parser.add_argument("--pg", default=os.environ.get("KIT_TEST_PG_URL"),
                        help="PostgreSQL URL of a server to use (a database of the benchmark's own is made there)")
    parser.add_argument("--no-pg", dest="pg", action="store_const", const=None)
    parser.add_argument("--work", help="folder for the generated fleet and databases (default a temporary one)")


def main() -> None:
    from benchmarks.office_load import office_options

    parser = argparse.ArgumentParser(description="kit's fleet-scale benchmark (not a test; not run in CI).")
    fleet_options(parser)
    parser.add_argument("--small", type=int, default=100)
    parser.add_argument("--runs", type=int, default=3, help="runs per figure; the median is reported")
    parser.add_argument("--keep", action="store_true", help="keep the temporary folder")
    parser.add_argument("--serve-clients", type=int, default=10, help="step 7: clients at once")
    parser.add_argument("--serve-seconds", type=float, default=30.0, help="step 7: seconds of each load run (0: skip)")
    parser.add_argument("--serve-runs", type=int, default=3, help="step 7: load runs on each database")
    office_options(parser, "office-")  # step 8, on PostgreSQL only
    parser.add_argument("--out", default=str(ROOT / "benchmarks" / "results.json"))
    args = parser.parse_args()
    results = bench(args)
    Path(args.out).write_text(json.dumps(results, indent=2) + "\n", encoding="utf-8")
    print()
    print(table(results))
    print(f"\nwrote {args.out}")


if __name__ == "__main__":
    main()
