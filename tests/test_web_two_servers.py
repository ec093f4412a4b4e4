# SPDX-License-Identifier: MIT
"""Two real ``kit serve`` processes in front of one PostgreSQL schema, as an office that outgrew
one server runs them (issue 16): a session begun on one is good on the other and ended on both by
one sign-out; a change through one is seen through the other at once; and ten vessel keepers
counting their own vessels at once through both, while a buyer imports a catalogue, lose and
double nothing: every count is in the database with exactly one audit row.

PostgreSQL only (SQLite is one file for one server); with KIT_TEST_PG_URL set and the server
unreachable the tests fail, as tests/db_support.py says. Traffic goes to 127.0.0.1 only, and only
the processes these tests start are stopped, by their own handles.
"""

from __future__ import annotations

import datetime as dt
import json
import re
import subprocess
import threading
from pathlib import Path

import httpx
import pytest
from sqlalchemy import select

from kit.services.people import add_person
from tests.db_support import TOML_CYLINDER, fresh_url
from tests.test_web_serve import kit, serving_line, stop  # noqa: F401  (fixture)
from tests.web_support import CSRF_IN_FORM

PASSWORD = "bollard pull 4400 kN"
SERVING = re.compile(r"^kit: serving http://127\.0\.0\.1:(\d+)/ \(people sign in\)$")
CHECK = re.compile(r'name="check" value="([^"]+)"')
DEMO = Path(__file__).resolve().parents[1] / "demo_fleet" / "corvina_bay.toml"
KEEPERS = 10
NEW_PLACE = "Store A"
SEALS = "Northgate Marine Seals & Hydraulics (invented)"  # the demo's first supplier (kit.services.demo)


@pytest.fixture
def office(tmp_path):
    """The demo fleet in a PostgreSQL schema of its own, with ten more vessels (copies of a demo
    vessel under new ids), a keeper for each, a buyer, an administrator and a reader."""
    from catalog_schema.engine import make_engine
    from catalog_schema.migrate import upgrade
    from kit.services.demo import fill_demo
    from kit.services.fleet import load_particulars, register_parts

    with fresh_url("postgresql", tmp_path) as url:
        engine = make_engine(url)
        upgrade(engine)
        fill_demo(engine, tmp_path)
        ids = [f"KEEP-{n:02d}" for n in range(1, KEEPERS + 1)]
        for vessel_id in ids:
            copy = tmp_path / f"{vessel_id}.toml"
            copy.write_text(DEMO.read_text(encoding="utf-8").replace('id = "CORVINA-BAY"', f'id = "{vessel_id}"', 1),
                            encoding="utf-8")
            load_particulars(engine, copy)
        register_parts(engine, ids)
        for n, vessel_id in enumerate(ids, 1):
            add_person(engine, f"keeper{n}", f"Keeper {n}", "vessel_keeper", PASSWORD, [vessel_id])
        add_person(engine, "marta", "Marta Koivu", "buyer", PASSWORD)
        add_person(engine, "ada", "Ada Lind", "administrator", PASSWORD)
        add_person(engine, "rolf", "Rolf Haug", "reader", PASSWORD)
        yield url, engine, ids, tmp_path
        engine.dispose()


def serve(url: str, folder: Path, name: str, stop) -> str:  # noqa: F811
    """Start ``kit serve`` on the database; its base address once it prints that people sign in."""
    log = (folder / f"{name}.log").open("w")
    proc = subprocess.Popen(kit("serve", "--db", url, "--port", "0", "--host", "127.0.0.1"),
                            stdout=subprocess.PIPE, stderr=log, text=True)
    stop(proc)
    found, _ = serving_line(proc, SERVING)
    return f"http://127.0.0.1:{found.group(1)}"


def browser(base: str) -> httpx.Client:
    return httpx.Client(base_url=base, follow_redirects=False, timeout=60)


def signed_in(base: str, login: str) -> httpx.Client:
    b = browser(base)
    check = CHECK.search(b.get("/sign-in").text).group(1)
    r = b.post("/sign-in", data={"login": login, "password": PASSWORD, "check": check, "next": "/"})
    assert r.status_code == 303, r.text[:300]
    return b


def on(base: str, session: httpx.Client) -> httpx.Client:
    """A browser on another server carrying ``session``'s cookie (as a load balancer would send it)."""
    b = browser(base)
    b.cookies.set("kit_session", session.cookies.get("kit_session"))
    return b


def csrf_of(b: httpx.Client) -> str:
    return CSRF_IN_FORM.search(b.get("/").text).group(1)


def test_two_servers_share_sessions_and_changes(office, stop):  # noqa: F811
    url, engine, _, folder = office
    a, b = serve(url, folder, "a", stop), serve(url, folder, "b", stop)
    ada_a = signed_in(a, "ada")
    ada_b = on(b, ada_a)
    assert ada_b.get("/").status_code == 200  # the session begun on A is good on B
    assert "TEST-ONE" not in ada_b.get("/?q=test-one").text
    r = ada_a.post("/particulars", data={"csrf": csrf_of(ada_b)},  # B's form, A's server: one session
                   files={"particulars": ("test_one.toml", TOML_CYLINDER.encode())})
    assert r.status_code == 303, r.text[:300]
    assert "TEST-ONE" in ada_b.get("/?q=test-one").text  # seen through B at once
    # the notice of what A did travels with the browser: B shows it on the page A redirected to
    ada_b.cookies.set("kit_notice", r.cookies.get("kit_notice"))
    shown = ada_b.get(r.headers["location"])
    assert shown.status_code == 200 and "Particulars loaded: test_one.toml" in shown.text and "TEST-ONE" in shown.text
    rolf_a = signed_in(a, "rolf")
    rolf_b = on(b, rolf_a)
    assert rolf_b.get("/").status_code == 200
    assert rolf_a.post("/sign-out", data={"csrf": csrf_of(rolf_a)}).status_code == 303
    r = rolf_b.get("/")
    assert r.status_code == 303 and r.headers["location"].startswith("/sign-in")  # ended on B too
    assert ada_b.get("/").status_code == 200  # another person's session goes on


def count_form(engine, vessel_id: str, csrf: str, round_: int) -> tuple[dict, dict]:
    """A count of every line of ``vessel_id`` with quantities of its own for this round; and the
    quantities it leaves by (part key, location)."""
    from kit.services.vessels import vessel_view

    view = vessel_view(engine, vessel_id).count
    assert view.lines, f"{vessel_id} has no stock lines to count"
    n = int(vessel_id.rsplit("-", 1)[1])
    counted = {(li.key, li.location or ""): float(100 * round_ + n + i) for i, li in enumerate(view.lines)}
    # lines with no location yet are put in the new location the form names
    placed = {(key, loc or NEW_PLACE): q for (key, loc), q in counted.items()}
    return {"csrf": csrf, "part": [k for k, _ in counted], "location": [loc for _, loc in counted],
            "counted": [repr(q) for q in counted.values()], "unit": [f.unit for f in view.filters],
            "position": [f.position for f in view.filters], "hours": [""] * len(view.filters),
            "counted_on": dt.date.today().isoformat(), "new_location": NEW_PLACE}, placed


def test_ten_keepers_and_a_buyer_at_once_through_two_servers_lose_and_double_nothing(office, stop):  # noqa: F811
    from kit.services.vessels import vessel_view
    from kit.store.audit import AUDIT_EVENTS

    url, engine, ids, folder = office
    servers = serve(url, folder, "a", stop), serve(url, folder, "b", stop)
    keepers = [signed_in(servers[n % 2], f"keeper{n + 1}") for n in range(KEEPERS)]
    buyer = signed_in(servers[1], "marta")
    forms = [[count_form(engine, ids[n], csrf_of(k), round_) for round_ in (1, 2)] for n, k in enumerate(keepers)]
    catalogue = (folder / "catalogue.csv").read_bytes()
    start = threading.Barrier(KEEPERS + 1)
    answers: dict = {}

    def keep(n: int) -> None:
        start.wait()
        for round_, (form, _) in enumerate(forms[n], 1):  # the second round through the other server
            b = keepers[n] if round_ == 1 else on(servers[(n + 1) % 2], keepers[n])
            answers[(n, round_)] = b.post(f"/vessel/{ids[n]}/count", data=form).status_code

    def buy() -> None:
        start.wait()
        answers["buyer"] = buyer.post("/suppliers/catalogue", data={"csrf": csrf_of(buyer), "supplier": SEALS},
                                      files={"catalogue": ("catalogue.csv", catalogue)}).status_code

    threads = [threading.Thread(target=keep, args=(n,)) for n in range(KEEPERS)] + [threading.Thread(target=buy)]
    for t in threads:
        t.start()
    for t in threads:
        t.join(timeout=300)
    assert answers == {**{(n, r): 303 for n in range(KEEPERS) for r in (1, 2)}, "buyer": 303}
    with engine.connect() as conn:
        trail = conn.execute(select(AUDIT_EVENTS).where(AUDIT_EVENTS.c.via == "web")).mappings().all()
    for n, vessel_id in enumerate(ids):
        _, last = forms[n][1]
        stock = {(li.key, li.location or ""): li.on_board for li in vessel_view(engine, vessel_id).count.lines}
        assert {k: stock.get(k) for k in last} == last  # the last round's count, every line of it
        rows = [e for e in trail if e["subject"] == vessel_id]
        assert [(e["person"], e["action"]) for e in rows] == [(f"keeper{n + 1}", "stock count")] * 2  # one row per count
        after = json.loads(max(rows, key=lambda e: e["id"])["after"])
        assert {k: v[0] for k, v in after.items() if " @ " in k} == {f"{key} @ {loc}": q for (key, loc), q in last.items()}
    imports = [e for e in trail if e["action"] == "import catalogue"]
    assert [(e["person"], e["subject"]) for e in imports] == [("marta", SEALS)]
