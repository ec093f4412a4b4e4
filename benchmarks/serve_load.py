# SPDX-License-Identifier: MIT
"""``kit serve`` under load: the pages' response times beside the floor page's, under the same load.

    python -m benchmarks.serve_load [--vessels 1000] [--clients 10] [--seconds 30] [--runs 3]
                                    [--pg URL | --no-pg] [--out FILE.json]

The fleet of :mod:`benchmarks.fleet` (its stock counts and catalogue) is put into a database of
this step's own, as :func:`benchmarks.run.prepare` does for the other steps, with each company's
spares policy of 90 days of cover (so the fleet page works out every shown vessel's shortfall):
a SQLite file, and on PostgreSQL (``--pg``, default ``KIT_TEST_PG_URL``) a database named
:data:`PG_DB`, dropped at the end. Then ``kit serve --port 0`` is started as a process of its
own; its one printed line gives the port and start token, and the start link opened once gives
the session cookie. The load is a third process (:mod:`benchmarks.load`, so it does not share
the server's interpreter lock): ``--clients`` threads, each on one kept-alive connection to 127.0.0.1, ask for
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
import os
import tempfile
from pathlib import Path

from benchmarks.load import FLOOR, Page, client, entries_of, figures, load_once, print_entries, start_server, stop_server

PG_DB = f"kit_benchmark_serve_{os.getpid()}"  # its own per run: two runs at once never drop each other's
POLICY_DAYS = 90

# The pages measured, each drawn equally often; the floor is the trivial page every ratio is against.
PAGES = (
    FLOOR,
    Page("fleet", "/", 10.0),
    Page("fleet, page 7", "/?p=7", 10.0),
    Page("vessel", "/vessel/{id}", 5.0),
    Page("check", "/vessel/{id}/check", None),
)


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
        cookie = login(port, token)
        orders = [client(port, cookie, PAGES, ids)] * clients
        per_run = [figures(load_once(orders, seconds, seed=n + 1), PAGES) for n in range(runs)]
    finally:
        stop_server(proc)
    return entries_of("7", f"kit serve {{page.path}} ({{page.name}}), {clients} clients [{engine}]", PAGES, per_run,
                      clients=clients, seconds=seconds)


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
    from benchmarks.fleet import generate
    from benchmarks.load import write_results
    from benchmarks.run import ROOT, fleet_options

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
    write_results(args, entries, work)


if __name__ == "__main__":
    main()
