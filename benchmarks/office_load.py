# SPDX-License-Identifier: MIT
"""The office server under load: people signed in to two ``kit serve`` processes on one PostgreSQL.

    python -m benchmarks.office_load [--vessels 1000] [--sessions 50] [--seconds 60] [--runs 1]
                                     [--keeps 20] [--pg URL] [--out FILE.json]

Issue 16's load check. The fleet of :mod:`benchmarks.fleet` goes into a PostgreSQL database of
this step's own (:data:`PG_DB`, made from ``--pg``, default ``KIT_TEST_PG_URL``, and dropped at
the end), prepared as step 7 prepares its database. Then ``--sessions`` people are added (a
fifth buyers, a fifth readers, the rest vessel keepers, each keeping ``--keeps`` vessels of
their own), each with a random password that is kept only in this process, and two ``kit serve
--port 0`` processes are started on 127.0.0.1 in front of that one database. Each person signs
in once through the sign-in form (``GET /sign-in`` for the form's check value and its cookie,
then ``POST /sign-in``: a 303 with the session cookie), alternately on server A and server B.

The load is a process of its own (:mod:`benchmarks.load`): one thread per session, on one
kept-alive connection to its server, asking for the pages its role may see back to back for
``--seconds``: the floor ``/alive``, the fleet (a keeper's fleet is the vessels they keep; a
buyer or reader also asks for the fleet's page 7), the vessel page and its pre-voyage check
(ids drawn from the whole fleet for a buyer or reader, from the vessels kept for a keeper), and,
for a keeper, another keeper's vessel, which must be refused (403). Any other status is an
error. Reported per page, on each server and on both: requests, errors, median, 95th
percentile and its ratio to the floor's on the same server(s) under the same load. No targets
(issue 16 asks for the figures); step 7's targets are for one user.
"""

from __future__ import annotations

import argparse
import os
import secrets
import tempfile
from pathlib import Path

from benchmarks.load import FLOOR, Page, client, entries_of, figures, load_once, print_entries, start_server, stop_server

# this run's own: two runs on one PostgreSQL server (two helpers' benchmarks) must not drop each other's
PG_DB = f"kit_benchmark_office_{os.getpid()}"
SERVERS = ("A", "B")

FLEET, FLEET_7 = Page("fleet", "/", None), Page("fleet, page 7", "/?p=7", None)
VESSEL, CHECK = Page("vessel", "/vessel/{id}", None), Page("check", "/vessel/{id}/check", None)
REFUSED = Page("another's vessel (403)", "/vessel/{id}", None, expect=403)  # a keeper's ids: other keepers' vessels
OFFICE_PAGES = (FLOOR, FLEET, FLEET_7, VESSEL, CHECK)
KEEPER_PAGES = (FLOOR, FLEET, VESSEL, CHECK, REFUSED)
PAGES = (FLOOR, FLEET, FLEET_7, VESSEL, CHECK, REFUSED)  # the order of the report


def people_of(sessions: int, ids: list[str], keeps: int) -> list[dict]:
    """``sessions`` people: a fifth buyers, a fifth readers (at least one each), the rest vessel
    keepers, each keeping ``keeps`` vessels no other keeper keeps (fewer if the fleet is too small)."""
    office = max(1, sessions // 5)
    roles = ["buyer"] * office + ["reader"] * office
    roles += ["vessel_keeper"] * max(0, sessions - len(roles))
    keepers = roles[:sessions].count("vessel_keeper")
    if keepers > len(ids):
        raise SystemExit(f"office_load: {len(ids)} vessels are too few for {keepers} vessel keepers")
    keeps = max(1, min(keeps, len(ids) // max(1, keepers)))  # a small fleet: fewer each, none shared
    out, kept = [], 0
    for n, role in enumerate(roles[:sessions]):
        vessels = []
        if role == "vessel_keeper":
            vessels = ids[kept:kept + keeps]
            kept += len(vessels)
        out.append({"login": f"bench.{role.replace('_', '')}{n:03d}", "name": f"Benchmark person {n}", "role": role,
                    "vessels": vessels, "password": secrets.token_urlsafe(18)})
    return out


def add_people(db: str, people: list[dict]) -> None:
    """The people, in this process (a ``kit people add`` process each would mostly start Python)."""
    from catalog_schema.engine import make_engine, resolve_url
    from kit.services.people import add_person

    engine = make_engine(resolve_url(db))
    try:
        for p in people:
            add_person(engine, p["login"], p["name"], p["role"], p["password"], p["vessels"])
    finally:
        engine.dispose()


def sign_in(port: int, login: str, password: str) -> str:
    """The session cookie (``name=value``) of one sign-in through the form, as a browser does it."""
    import http.client
    import re
    from urllib.parse import urlencode

    conn = http.client.HTTPConnection("127.0.0.1", port, timeout=60)
    conn.request("GET", "/sign-in")
    form = conn.getresponse()
    body = form.read().decode("utf-8")
    check = re.search(r'name="check" value="([^"]+)"', body)
    form_cookie = (form.getheader("set-cookie") or "").split(";", 1)[0]
    if form.status != 200 or not check or not form_cookie:
        raise SystemExit(f"office_load: the sign-in form gave {form.status} without its check value and cookie")
    fields = urlencode({"login": login, "password": password, "check": check.group(1), "next": "/"})
    conn.request("POST", "/sign-in", body=fields, headers={"Cookie": form_cookie,
                                                            "Content-Type": "application/x-www-form-urlencoded"})
    done = conn.getresponse()
    done.read()
    conn.close()
    cookie = next((c.split(";", 1)[0] for c in done.headers.get_all("set-cookie") or []
                   if c.startswith("kit_session=")), None)
    if done.status != 303 or not cookie:
        raise SystemExit(f"office_load: signing in {login} gave {done.status} and no session cookie")
    return cookie


def orders(people: list[dict], ports: dict[str, int], ids: list[str]) -> list[dict]:
    """Each person signed in on a server by turns: one client order each (:func:`benchmarks.load.client`)."""
    kept = {v for p in people for v in p["vessels"]}
    out = []
    for n, p in enumerate(people):
        server = SERVERS[n % len(SERVERS)]
        cookie = sign_in(ports[server], p["login"], p["password"])
        if p["role"] == "vessel_keeper":
            others = sorted(kept - set(p["vessels"])) or [v for v in ids if v not in p["vessels"]]
            out.append(client(ports[server], cookie, KEEPER_PAGES, p["vessels"], server,
                              ids_of={REFUSED.name: others}))
        else:
            out.append(client(ports[server], cookie, OFFICE_PAGES, ids, server))
    return out


def bench_office(work: Path, fleet: dict[str, Path], pg: str, *, sessions: int, seconds: float, runs: int,
                 keeps: int) -> list[dict]:
    """Step 8 on a PostgreSQL database of its own, dropped after: per page on each server and on
    both, one result entry with every run's figures."""
    from benchmarks.run import pg_drop, pg_recreate, pg_url
    from benchmarks.serve_load import prepare_serving

    db = pg_url(pg, PG_DB)
    print(f"postgresql: {sessions} people signed in to {len(SERVERS)} kit serve processes, {runs} x {seconds:g} s",
          flush=True)
    procs = []
    try:
        pg_recreate(pg, PG_DB)
        ids = prepare_serving(db, fleet, work)
        people = people_of(sessions, ids, keeps)
        add_people(db, people)
        ports = {}
        for server in SERVERS:
            proc, ports[server], token = start_server(db, work, work / f"office-{server}.log")
            procs.append(proc)
            if token is not None:
                raise SystemExit("office_load: kit serve printed a start token although people sign in")
        clients = orders(people, ports, ids)
        loads = [load_once(clients, seconds, seed=n + 1) for n in range(runs)]
    finally:
        for proc in procs:
            stop_server(proc)
        pg_drop(pg, PG_DB)
    entries = []
    for server in (*SERVERS, None):
        on = f"server {server}" if server else "both servers"
        per_run = [figures(load, PAGES, server) for load in loads]
        entries += entries_of("8", f"office {{page.path}} ({{page.name}}), {on}, {sessions} sessions [postgresql]",
                              PAGES, per_run, sessions=sessions, servers=len(SERVERS), seconds=seconds,
                              server=server or "both")
    print_entries(entries)
    return entries


def office_options(parser: argparse.ArgumentParser, prefix: str = "") -> None:
    """The step's options, alone or (``prefix`` "office-") among run.py's."""
    step = "step 8: " if prefix else ""
    parser.add_argument(f"--{prefix}sessions", type=int, default=50, help=f"{step}people signed in at once, one client each")
    parser.add_argument(f"--{prefix}keeps", type=int, default=20, help=f"{step}vessels each vessel keeper keeps")
    skip = " (0: skip)" if prefix else ""
    parser.add_argument(f"--{prefix}seconds", type=float, default=60.0, help=f"{step}seconds of each run of the load{skip}")
    parser.add_argument(f"--{prefix}runs", type=int, default=1, help=f"{step}runs of the load")


def main() -> None:
    from benchmarks.fleet import generate
    from benchmarks.load import write_results
    from benchmarks.run import ROOT, fleet_options

    parser = argparse.ArgumentParser(description="kit serve for an office: people signed in to two servers on one "
                                     "PostgreSQL, each page beside the floor page (not a test).")
    fleet_options(parser)
    office_options(parser)
    parser.add_argument("--out", default=str(ROOT / "benchmarks" / "office-results.json"))
    args = parser.parse_args()
    if not args.pg:
        parser.error("the office step needs PostgreSQL: --pg URL or KIT_TEST_PG_URL")
    work = Path(args.work or tempfile.mkdtemp(prefix="kit-office-bench-"))
    work.mkdir(parents=True, exist_ok=True)
    print(f"generating {args.vessels} vessels in {work}", flush=True)
    fleet = generate(work / "fleet", args.vessels, args.catalogue_rows)
    entries = bench_office(work, fleet, args.pg, sessions=args.sessions, seconds=args.seconds, runs=args.runs,
                           keeps=args.keeps)
    write_results(args, entries, work, sessions=args.sessions, keeps=args.keeps)


if __name__ == "__main__":
    main()
