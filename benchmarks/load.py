# SPDX-License-Identifier: MIT
"""The load against ``kit serve`` shared by steps 7 and 8 (:mod:`benchmarks.serve_load`,
:mod:`benchmarks.office_load`): starting and stopping a server, the client threads (in a process
of their own, so they do not share a server's or the benchmark's interpreter lock) and the
figures of a run.

Each client is one thread on one kept-alive connection to 127.0.0.1 with one session cookie,
asking for pages back to back for the run's seconds (at most one request in flight per client:
the load is bounded by the number of clients), each request's page drawn at random from the
client's own pages and each vessel id from the client's own ids. A request's time runs from
sending it to the last byte of the answer, as the client sees it; any status but the page's
expected one is an error. Times are kept per page and per server.
"""

from __future__ import annotations

import json
import os
import re
import statistics
import subprocess
import sys
import time
from dataclasses import dataclass
from pathlib import Path


@dataclass(frozen=True)
class Page:
    name: str
    path: str  # ``{id}``: a vessel id, drawn for each request
    target: float | None  # p95(page) / p95(floor) at most; None: reported only
    expect: int = 200  # the status a correct answer has


FLOOR = Page("floor", "/alive", None)  # the trivial page every ratio is against


def client(port: int, cookie: str, pages: tuple[Page, ...], ids: list[str], server: str = "",
           ids_of: dict[str, list[str]] | None = None) -> dict:
    """One client thread's order, as the load process takes it (JSON): its vessel ids, or for a
    page named in ``ids_of`` that page's own."""
    return {"port": port, "cookie": cookie, "server": server, "ids": ids, "ids_of": ids_of or {},
            "pages": [[p.name, p.path, p.expect] for p in pages]}


# --- the load: a process of its own -------------------------------------------------------------


def drive(clients: list[dict], seconds: float, seed: int = 1) -> dict:
    """The clients' threads asking for their pages for ``seconds``: per page and server the request
    times (s) and the unexpected statuses (or exceptions) with their counts."""
    import http.client
    import random
    import threading
    from urllib.parse import quote

    def connect(port: int):
        return http.client.HTTPConnection("127.0.0.1", port, timeout=120)

    warmed = set()
    for c in clients:  # each page once per server, untimed: a server's first request of a page imports its modules
        for name, path, _ in c["pages"]:
            if (c["server"], name) not in warmed:
                warmed.add((c["server"], name))
                get(connect(c["port"]), path.format(id=quote(c["ids"][0], safe="")), c["cookie"])
    times: dict[str, dict[str, list[float]]] = {}
    errors: dict[str, dict[str, dict[str, int]]] = {}
    lock = threading.Lock()
    start = threading.Barrier(len(clients))

    def run(n: int, c: dict) -> None:
        rnd = random.Random(seed * 1000 + n)
        conn = connect(c["port"])
        mine: list[tuple[str, float, str | None]] = []
        start.wait()
        deadline = time.perf_counter() + seconds
        while time.perf_counter() < deadline:
            name, path, expect = rnd.choice(c["pages"])
            path = path.format(id=quote(rnd.choice(c["ids_of"].get(name, c["ids"])), safe=""))
            t0 = time.perf_counter()
            try:
                status = get(conn, path, c["cookie"])
                error = None if status == expect else str(status)
            except (OSError, http.client.HTTPException) as exc:
                error = type(exc).__name__
                conn.close()
                conn = connect(c["port"])
            mine.append((name, time.perf_counter() - t0, error))
        conn.close()
        with lock:
            for name, took, error in mine:
                times.setdefault(name, {}).setdefault(c["server"], []).append(took)
                if error:
                    seen = errors.setdefault(name, {}).setdefault(c["server"], {})
                    seen[error] = seen.get(error, 0) + 1

    threads = [threading.Thread(target=run, args=(n, c)) for n, c in enumerate(clients)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    return {"times": times, "errors": errors}


def get(conn, path: str, cookie: str) -> int:
    conn.request("GET", path, headers={"Cookie": cookie})
    response = conn.getresponse()
    response.read()
    return response.status


def load_once(clients: list[dict], seconds: float, seed: int) -> dict:
    """One run of :func:`drive` in a Python process of its own."""
    from benchmarks.run import PY, ROOT

    order = json.dumps({"clients": clients, "seconds": seconds, "seed": seed})
    before = os.getloadavg()
    done = subprocess.run([PY, "-m", "benchmarks.load"], input=order, capture_output=True, text=True,
                          cwd=ROOT, env={**os.environ, "PYTHONPATH": str(ROOT)}, check=False)
    if done.returncode != 0:
        raise SystemExit(f"benchmark load: the load process failed ({done.returncode}):\n{done.stderr[-4000:]}")
    # the machine's 1-minute load average as the run began and ended: how busy it was besides
    return {**json.loads(done.stdout), "load_average": [round(before[0], 2), round(os.getloadavg()[0], 2)]}


# --- the server -----------------------------------------------------------------------------------

SERVING = re.compile(r"kit: serving http://127\.0\.0\.1:(\d+)/(?:\?token=(\S+)| \(people sign in\))")


def start_server(db: str, cwd: Path, log: Path) -> tuple[subprocess.Popen, int, str | None]:
    """``kit serve --db DB --port 0`` as a process of its own on 127.0.0.1; its port and start
    token (None once people sign in)."""
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
        raise SystemExit(f"benchmark: kit serve did not print its address: {line!r}\n{log.read_text()[-2000:]}")
    return proc, int(found.group(1)), found.group(2)


def stop_server(proc: subprocess.Popen) -> None:
    proc.terminate()
    try:
        proc.wait(timeout=20)
    except subprocess.TimeoutExpired:
        proc.kill()
        proc.wait()


# --- the figures ----------------------------------------------------------------------------------


def p95(times: list[float]) -> float:
    """The 95th percentile (the 19th of 20-quantiles, exclusive method)."""
    return statistics.quantiles(times, n=20)[18] if len(times) > 1 else times[0]


def figures(load: dict, pages: tuple[Page, ...], server: str | None = None) -> dict[str, dict]:
    """Per page, on one server (``server``) or all of them (None): requests, errors, median and p95
    (ms) and p95's ratio to the floor's on the same server(s) under the same load."""

    def pooled(of: dict) -> list:
        return [x for s, xs in of.items() if server is None or s == server for x in xs]

    def error_counts(name: str) -> dict[str, int]:
        out: dict[str, int] = {}
        for s, seen in load["errors"].get(name, {}).items():
            if server is None or s == server:
                for what, n in seen.items():
                    out[what] = out.get(what, 0) + n
        return out

    floor = p95(pooled(load["times"][FLOOR.name]))
    out = {}
    for page in pages:
        times = pooled(load["times"].get(page.name, {}))
        statuses = error_counts(page.name)
        high = p95(times) if times else None
        out[page.name] = {"path": page.path, "requests": len(times), "errors": sum(statuses.values()),
                          "error_statuses": statuses,
                          "median_ms": round(statistics.median(times) * 1000, 2) if times else None,
                          "p95_ms": None if high is None else round(high * 1000, 2),
                          "ratio": None if high is None else round(high / floor, 2),
                          "load_average": load.get("load_average")}
    return out


def entries_of(step: str, what: str, pages: tuple[Page, ...], per_run: list[dict[str, dict]], **extra) -> list[dict]:
    """One result entry per page from its figures in each run (:func:`figures`): the median run's
    p95 and ratio (by the ratio), their spread over the runs, the run's floor beside it."""
    entries = []
    for page in pages:
        runs_of = [r[page.name] for r in per_run]
        ratios = [r["ratio"] for r in runs_of if r["ratio"] is not None]
        errors = sum(r["errors"] for r in runs_of)
        middle = sorted(runs_of, key=lambda r: (r["ratio"] is None, r["ratio"] or 0))[(len(runs_of) - 1) // 2]
        floor = per_run[runs_of.index(middle)][FLOOR.name]
        ratio = None if page is FLOOR else middle["ratio"]
        entries.append({
            "step": step, "what": what.format(page=page),
            "kit_s": None if middle["p95_ms"] is None else round(middle["p95_ms"] / 1000, 5),
            "kit_median_s": None if middle["median_ms"] is None else round(middle["median_ms"] / 1000, 5),
            "baseline": "p95 of /alive (floor), same load",
            "baseline_s": round(floor["p95_ms"] / 1000, 5), "ratio": ratio,
            "ratio_spread": [min(ratios), max(ratios)] if ratios and page is not FLOOR else None,
            "target": page.target, "requests": sum(r["requests"] for r in runs_of), "errors": errors,
            "met": False if errors else None if page.target is None else ratio is not None and ratio <= page.target,
            "runs": runs_of, **extra,
        })
    return entries


def print_entries(entries: list[dict]) -> None:
    for e in entries:
        run_p95 = ", ".join(f"{r['p95_ms']}" for r in e["runs"])
        median = "" if e["kit_median_s"] is None else f"{e['kit_median_s'] * 1000:7.1f}"
        high = "" if e["kit_s"] is None else f"{e['kit_s'] * 1000:7.1f}"
        print(f"  {e['step']:<4} {e['what']:<62} {e['requests']:6d} req {e['errors']:5d} err  median "
              f"{median} ms  p95 {high} ms (runs: {run_p95})  "
              f"ratio {e['ratio']} {'' if not e['ratio_spread'] else e['ratio_spread']}", flush=True)


def write_results(args, entries: list[dict], work: Path, **extra) -> None:
    """A step run alone: its results to ``args.out`` (JSON) and the table on stdout, as run.py does."""
    import platform
    import shutil

    from benchmarks.run import table

    results = {"vessels": args.vessels, "catalogue_rows": args.catalogue_rows, "runs": args.runs,
               "python": platform.python_version(), "machine": f"{platform.machine()}, {os.cpu_count()} cores",
               "load_average": os.getloadavg(), "date": time.strftime("%Y-%m-%d"), **extra, "steps": entries}
    Path(args.out).write_text(json.dumps(results, indent=2) + "\n", encoding="utf-8")
    print()
    print(table(results))
    print(f"\nwrote {args.out}")
    if not args.work:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":  # the load process (see load_once)
    print(json.dumps(drive(**json.loads(sys.stdin.read()))))
