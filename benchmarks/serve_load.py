# SPDX-License-Identifier: MIT
"""``kit serve`` under load: the pages' response times beside the floor page's, under the same load.

    python -m benchmarks.serve_load [--vessels 1000] [--clients 10] [--seconds 30] [--runs 3]
                                    [--pg URL | --no-pg] [--out FILE.json]

The fleet of :mod:`benchmarks.fleet` (its stock counts and catalogue) is put into a database of
this step's own, as :func:`benchmarks.run.prepare` does for the other steps, with each company's
spares policy of 90 days of cover (so the fleet page works out every shown vessel's shortfall):
a SQLite file, and on PostgreSQL (``--pg``, default ``KIT_TEST_PG_URL``) a database named
:data:`PG_DB`, dropped at the end. Then ``kit serve --port 0`` is started as a process of its
own; its one printed line gives the port and start token. The load is a third process (so it
does not share the server's interpreter lock): it opens the start link once for the session
cookie, then ``--clients`` threads, each on one kept-alive connection to 127.0.0.1, ask for
pages one after another for ``--seconds``, each request's page drawn at random from
:data:`PAGES` (vessel ids drawn from the fleet). Every page, the floor among them, is so
measured under the same mixed load, at the same moments. A request's time is from sending it
to the last byte of the answer, measured by the client; anything but 200 is an error.

Reported per page and run: requests, errors, median and 95th percentile, and the ratio of the
page's 95th percentile to the floor's; over ``--runs`` runs the median run's ratio and the
spread. Targets (issue 15): the vessel page within 5 x the floor, the fleet page within 10 x,
no errors.
"""

from __future__ import annotations

import argparse
import json
import os
import re
import statistics
import subprocess
import sys
import tempfile
import time
from dataclasses import dataclass
from pathlib import Path

PG_DB = "kit_benchmark_serve"
POLICY_DAYS = 90


@dataclass(frozen=True)
class Page:
    name: str
    path: str  # ``{id}``: a vessel id, drawn for each request
    target: float | None  # p95(page) / p95(floor) at most (issue 15); None: reported only


# The pages measured, each drawn equally often; the floor is the trivial page every ratio is against.
FLOOR = Page("floor", "/alive", None)
PAGES = (
    FLOOR,
    Page("fleet", "/", 10.0),
    Page("fleet, page 7", "/?p=7", 10.0),
    Page("vessel", "/vessel/{id}", 5.0),
    Page("check", "/vessel/{id}/check", None),
)


# --- the load: a process of its own -------------------------------------------------------------


def drive(port: int, token: str, ids: list[str], clients: int, seconds: float, seed: int = 1) -> dict:
    """``clients`` threads asking for random pages of :data:`PAGES` for ``seconds``: per page the
    request times (s) and the statuses other than 200."""
    import http.client
    import random
    import threading
    from urllib.parse import quote

    cookie = login(port, token)
    for page in PAGES:  # once each, untimed: the server's first request of a page imports its modules
        _get(http.client.HTTPConnection("127.0.0.1", port, timeout=120), _path(page, ids[0]), cookie)
    times: dict[str, list[float]] = {p.name: [] for p in PAGES}
    errors: dict[str, dict[str, int]] = {p.name: {} for p in PAGES}
    lock = threading.Lock()
    start = threading.Barrier(clients)

    def client(n: int) -> None:
        rnd = random.Random(seed * 1000 + n)
        conn = http.client.HTTPConnection("127.0.0.1", port, timeout=120)
        mine: list[tuple[str, float, str | None]] = []
        start.wait()
        deadline = time.perf_counter() + seconds
        while time.perf_counter() < deadline:
            page = rnd.choice(PAGES)
            path = _path(page, quote(rnd.choice(ids), safe=""))
            t0 = time.perf_counter()
            try:
                status = _get(conn, path, cookie)
                error = None if status == 200 else str(status)
            except (OSError, http.client.HTTPException) as exc:
                error = type(exc).__name__
                conn.close()
                conn = http.client.HTTPConnection("127.0.0.1", port, timeout=120)
            mine.append((page.name, time.perf_counter() - t0, error))
        conn.close()
        with lock:
            for name, took, error in mine:
                times[name].append(took)
                if error:
                    errors[name][error] = errors[name].get(error, 0) + 1

    threads = [threading.Thread(target=client, args=(n,)) for n in range(clients)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    return {"times": times, "errors": errors}


def _path(page: Page, vessel_id: str) -> str:
    return page.path.format(id=vessel_id)


def _get(conn, path: str, cookie: str) -> int:
    conn.request("GET", path, headers={"Cookie": cookie})
    response = conn.getresponse()
    response.read()
    return response.status


def login(port: int, token: str) -> str:
    """The session cookie (``name=value``) the start link sets."""
    import http.client

    conn = http.client.HTTPConnection("127.0.0.1", port, timeout=30)
    conn.request("GET", f"/?token={token}")
    response = conn.getresponse()
    response.read()
    conn.close()
    cookie = response.getheader("set-cookie")
    if response.status != 303 or not cookie:
        raise SystemExit(f"serve_load: the start link gave {response.status} and no session cookie")
    return cookie.split(";", 1)[0]


# --- the server and the runs ----------------------------------------------------------------------

SERVING = re.compile(r"kit: serving http://127\.0\.0\.1:(\d+)/\?token=(\S+)")


def start_server(db: str, cwd: Path, log: Path) -> tuple[subprocess.Popen, int, str]:
    """``kit serve --db DB --port 0`` as a process of its own; its port and start token."""
    from benchmarks.run import KIT, ROOT

    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    with log.open("wb") as err:
        proc = subprocess.Popen([*KIT, "serve", "--db", db, "--port", "0"], cwd=cwd, env=env, stdout=subprocess.PIPE,
                                stderr=err, text=True)
    line = proc.stdout.readline()
    found = SERVING.search(line)
    if not found:
        proc.kill()
        proc.wait()
        raise SystemExit(f"serve_load: kit serve did not print its address: {line!r}\n{log.read_text()[-2000:]}")
    return proc, int(found.group(1)), found.group(2)


def stop_server(proc: subprocess.Popen) -> None:
    proc.terminate()
    try:
        proc.wait(timeout=20)
    except subprocess.TimeoutExpired:
        proc.kill()
        proc.wait()


def load_once(port: int, token: str, ids: list[str], clients: int, seconds: float, seed: int) -> dict:
    """One run of :func:`drive` in a Python process of its own."""
    from benchmarks.run import PY, ROOT

    order = json.dumps({"port": port, "token": token, "ids": ids, "clients": clients, "seconds": seconds, "seed": seed})
    done = subprocess.run([PY, "-m", "benchmarks.serve_load", "drive"], input=order, capture_output=True, text=True,
                          cwd=ROOT, env={**os.environ, "PYTHONPATH": str(ROOT)}, check=False)
    if done.returncode != 0:
        raise SystemExit(f"serve_load: the load process failed ({done.returncode}):\n{done.stderr[-4000:]}")
    return json.loads(done.stdout)


def p95(times: list[float]) -> float:
    """The 95th percentile (the 19th of 20-quantiles, exclusive method)."""
    return statistics.quantiles(times, n=20)[18] if len(times) > 1 else times[0]


def summary(load: dict) -> dict[str, dict]:
    """Per page: requests, errors, median and p95 (ms) and p95's ratio to the floor's."""
    floor = p95(load["times"][FLOOR.name])
    out = {}
    for page in PAGES:
        times = load["times"][page.name]
        errors = sum(load["errors"][page.name].values())
        high = p95(times) if times else None
        out[page.name] = {"path": page.path, "requests": len(times), "errors": errors,
                          "error_statuses": load["errors"][page.name],
                          "median_ms": round(statistics.median(times) * 1000, 2) if times else None,
                          "p95_ms": None if high is None else round(high * 1000, 2),
                          "ratio": None if high is None else round(high / floor, 2)}
    return out


def prepare_serving(db: str, fleet: dict[str, Path], cwd: Path) -> list[str]:
    """The fleet database as :func:`benchmarks.run.prepare` makes it, and each company's spares
    policy with days of cover; the fleet's vessel ids."""
    import tomllib

    from benchmarks.run import kit, prepare

    prepare(db, fleet, cwd)
    companies, ids = set(), []
    for path in sorted(fleet["particulars"].glob("*.toml")):
        doc = tomllib.loads(path.read_text(encoding="utf-8"))
        companies.add(doc["company"]["name"])
        ids.append(doc["vessel"]["id"])
    for company in sorted(companies):
        kit("policy", "set", "--company", company, "--name", "benchmark policy", "--days", str(POLICY_DAYS),
            "--from", "2024-01-01", "--db", db, cwd=cwd)
    return ids


def serve_step(engine: str, db: str, fleet: dict[str, Path], work: Path, *, clients: int, seconds: float,
               runs: int) -> list[dict]:
    """The serve step on one database: per page, one result entry with every run's figures."""
    ids = prepare_serving(db, fleet, work)
    proc, port, token = start_server(db, work, work / f"serve-{engine}.log")
    try:
        per_run = [summary(load_once(port, token, ids, clients, seconds, seed=n + 1)) for n in range(runs)]
    finally:
        stop_server(proc)
    entries = []
    for page in PAGES:
        runs_of = [r[page.name] for r in per_run]
        ratios = [r["ratio"] for r in runs_of if r["ratio"] is not None]
        errors = sum(r["errors"] for r in runs_of)
        middle = sorted(runs_of, key=lambda r: (r["ratio"] is None, r["ratio"] or 0))[(len(runs_of) - 1) // 2]
        floor = per_run[runs_of.index(middle)][FLOOR.name]
        ratio = None if page is FLOOR else middle["ratio"]
        entries.append({
            "step": "7", "what": f"kit serve {page.path} ({page.name}), {clients} clients [{engine}]",
            "kit_s": None if middle["p95_ms"] is None else round(middle["p95_ms"] / 1000, 5),
            "kit_median_s": None if middle["median_ms"] is None else round(middle["median_ms"] / 1000, 5),
            "baseline": "p95 of /alive (floor), same load",
            "baseline_s": round(floor["p95_ms"] / 1000, 5), "ratio": ratio,
            "ratio_spread": [min(ratios), max(ratios)] if ratios and page is not FLOOR else None,
            "target": page.target, "requests": sum(r["requests"] for r in runs_of), "errors": errors,
            "met": False if errors else None if page.target is None else ratio is not None and ratio <= page.target,
            "runs": runs_of, "clients": clients, "seconds": seconds,
        })
    return entries


def print_entries(entries: list[dict]) -> None:
    for e in entries:
        run_p95 = ", ".join(f"{r['p95_ms']}" for r in e["runs"])
        print(f"  7    {e['what']:<58} {e['requests']:6d} req {e['errors']:5d} err  median "
              f"{e['kit_median_s'] * 1000:7.1f} ms  p95 {e['kit_s'] * 1000:7.1f} ms (runs: {run_p95})  "
              f"ratio {e['ratio']} {'' if not e['ratio_spread'] else e['ratio_spread']}", flush=True)


def bench_serve(work: Path, fleet: dict[str, Path], pg: str | None, *, clients: int, seconds: float, runs: int) -> list[dict]:
    """The serve step on SQLite and, with ``pg``, on PostgreSQL (a database of its own, dropped after)."""
    from benchmarks.run import pg_drop, pg_recreate, pg_url

    entries = []
    dbs = {"sqlite": str(work / "serve.sqlite")}
    if pg:
        dbs["postgresql"] = pg_url(pg, PG_DB)
    try:
        for engine, db in dbs.items():
            print(f"{engine}: kit serve under {clients} clients, {runs} x {seconds:g} s", flush=True)
            if engine == "postgresql":
                pg_recreate(pg, PG_DB)
            found = serve_step(engine, db, fleet, work, clients=clients, seconds=seconds, runs=runs)
            print_entries(found)
            entries += found
    finally:
        if pg:
            pg_drop(pg, PG_DB)
    return entries


def main() -> None:
    if sys.argv[1:] == ["drive"]:  # the load process (see load_once)
        order = json.loads(sys.stdin.read())
        print(json.dumps(drive(**order)))
        return
    from benchmarks.fleet import generate
    from benchmarks.run import ROOT, fleet_options, table

    parser = argparse.ArgumentParser(description="kit serve under load: each page beside the floor page (not a test).")
    fleet_options(parser)
    parser.add_argument("--clients", type=int, default=10)
    parser.add_argument("--seconds", type=float, default=30.0, help="seconds of each run of the load")
    parser.add_argument("--runs", type=int, default=3, help="runs of the load on each database")
    parser.add_argument("--out", default=str(ROOT / "benchmarks" / "serve-results.json"))
    args = parser.parse_args()
    work = Path(args.work or tempfile.mkdtemp(prefix="kit-serve-bench-"))
    work.mkdir(parents=True, exist_ok=True)
    print(f"generating {args.vessels} vessels in {work}", flush=True)
    fleet = generate(work / "fleet", args.vessels, args.catalogue_rows)
    entries = bench_serve(work, fleet, args.pg, clients=args.clients, seconds=args.seconds, runs=args.runs)
    import platform

    results = {"vessels": args.vessels, "catalogue_rows": args.catalogue_rows, "runs": args.runs,
               "python": platform.python_version(), "machine": f"{platform.machine()}, {os.cpu_count()} cores",
               "load_average": os.getloadavg(), "date": time.strftime("%Y-%m-%d"), "steps": entries}
    Path(args.out).write_text(json.dumps(results, indent=2) + "\n", encoding="utf-8")
    print()
    print(table(results))
    print(f"\nwrote {args.out}")
    if not args.work:
        import shutil

        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
