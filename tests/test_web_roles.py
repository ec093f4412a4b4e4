# SPDX-License-Identifier: MIT
"""The authorisation matrix of the office server: every role x every page and form, on SQLite and
PostgreSQL. Each request carries a valid session, a valid check token and a valid body, so only the
role decides. Allowed: the page's own success status. Refused: 403 with one sentence, and the
database as it was, audit trail included.

The expected outcome is written out here from the roles as issue 16 describes them, not asked of
kit.engine.access (a table compared with itself could not fail):

- someone who administers: people, spares policies, particulars; reads the office's pages and the
  audit trail (who did what is the administrator's to oversee);
- someone who buys: catalogues, enquiry replies, orders and enquiries; reads the office's pages;
- someone who keeps a vessel: stock counts (and filter hours) of the vessels assigned to them and
  their pre-voyage check; reads those vessels only, not the office's ordering and supplier pages;
- someone who only reads: every page, no change.

Least privilege: no role takes another's changes (an administrator does not count a ship's stock).
One office database per engine is shared by the module: refusals compare it before and after
their own request, and the few allowed changes touch nothing another case needs.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

import pytest

from kit.services.people import add_person
from tests.db_support import ENGINES, TOML_CYLINDER, dump, fresh_url
from tests.upload_support import refusal_of
from tests.web_support import CSRF_IN_FORM, PORT, TOKEN
from tests.test_web_people import PASSWORD, sign_in

OWN, OTHER = "CORVINA-BAY", "TIDEWHISTLE"  # demo vessels: the keeper keeps the first only
SEALS = "Northgate Marine Seals & Hydraulics (invented)"  # the demo's first supplier (kit.services.demo)
LOGINS = {"administrator": "ada", "buyer": "marta", "vessel_keeper": "ingrid", "reader": "rolf"}
AUDIT = {"audit_events"}
XLSX = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"

# --- what each role may do, from the issue's descriptions -----------------------------------------

OFFICE_READERS = {"administrator", "buyer", "reader"}


def reads_fleet(role: str, vessel: str | None) -> bool:
    """The fleet list (each sees the vessels they may), and any vessel's pages to all but a
    keeper, who reads only the vessels they keep."""
    return role != "vessel_keeper" or vessel in (None, OWN)


def reads_office(role: str, vessel: str | None) -> bool:
    return role in OFFICE_READERS


def counts(role: str, vessel: str | None) -> bool:
    return role == "vessel_keeper" and vessel == OWN


def buys(role: str, vessel: str | None) -> bool:
    return role == "buyer"


def administers(role: str, vessel: str | None) -> bool:
    return role == "administrator"


# --- the routes ----------------------------------------------------------------------------------


@dataclass(frozen=True)
class Case:
    name: str
    method: str
    path: str
    may: object  # (role, vessel) -> bool
    vessel: str | None = None
    ok: int = 200  # the success status
    kind: str = "text/html"  # the success response's content type
    body: str | None = None  # which valid body a POST sends

    def __str__(self) -> str:
        return self.name


ORDER = f"vessel={OWN}&vessel=SALTMERE-CREST&days=120"
CASES = [
    Case("fleet", "GET", "/", reads_fleet),
    *(c for v in (OWN, OTHER) for c in (
        Case(f"vessel page {v}", "GET", f"/vessel/{v}", reads_fleet, v),
        Case(f"check {v}", "GET", f"/vessel/{v}/check", reads_fleet, v),
        Case(f"count sheet {v}", "GET", f"/vessel/{v}/count-sheet.xlsx", reads_fleet, v, kind=XLSX),
        Case(f"check workbook {v}", "GET", f"/vessel/{v}/check.xlsx", reads_fleet, v, kind=XLSX),
        Case(f"count {v}", "POST", f"/vessel/{v}/count", counts, v, ok=303, body="count"))),
    Case("order page", "GET", "/order", reads_office),
    Case("order shown", "GET", f"/order?go=1&{ORDER}", reads_office),
    Case("order workbook", "GET", f"/order/workbook?{ORDER}", reads_office, kind=XLSX),
    Case("write enquiries", "POST", "/order/enquiries", buys, ok=200, kind="application/zip", body="enquiries"),
    Case("suppliers page", "GET", "/suppliers", reads_office),
    Case("catalogue template xlsx", "GET", "/suppliers/catalogue-template.xlsx", reads_office, kind=XLSX),
    Case("catalogue template csv", "GET", "/suppliers/catalogue-template.csv", reads_office, kind="text/csv"),
    Case("import catalogue", "POST", "/suppliers/catalogue", buys, ok=303, body="catalogue"),
    Case("read reply", "POST", "/suppliers/reply", buys, ok=303, body="reply"),
    Case("particulars page", "GET", "/particulars", reads_office),
    Case("particulars template", "GET", "/particulars/template.xlsx", reads_office, kind=XLSX),
    Case("load particulars", "POST", "/particulars", administers, ok=303, body="particulars"),
    Case("audit trail", "GET", "/audit", administers),
]


@dataclass
class Office:
    app: object
    engine: object
    browsers: dict  # role -> a signed-in TestClient
    imports: Path  # the demo's catalogue file
    reply: Path  # a filled enquiry reply to the demo's first supplier


@pytest.fixture(scope="module", params=ENGINES)
def office(request, tmp_path_factory):
    """The demo fleet with one person of each role signed in, one database per engine."""
    from catalog_schema.engine import make_engine
    from catalog_schema.migrate import upgrade
    from kit.services.demo import fill_demo
    from kit.services.enquiries import write_enquiries
    from kit.web.app import create_app
    from test_enquiry import _fill

    folder = tmp_path_factory.mktemp(f"office-{request.param}")
    with fresh_url(request.param, folder) as url:
        engine = make_engine(url)
        upgrade(engine)
        fill_demo(engine, folder)
        for role, login in LOGINS.items():
            add_person(engine, login, login.title(), role, PASSWORD, [OWN] if role == "vessel_keeper" else [])
        written = write_enquiries(engine, [], 90, folder / "enquiries")
        enquiry = next(Path(p) for e, p in written.written if e.supplier == SEALS)
        reply = _fill(enquiry, folder / "reply.xlsx", {0: ("NMS-ROLE-1", 9.5, "EUR", "4 pcs", 21, "next week")})
        app = create_app(engine, token=TOKEN, port=PORT)
        browsers = {role: sign_in(app, login)[0] for role, login in LOGINS.items()}
        yield Office(app, engine, browsers, folder, reply)
        engine.dispose()


def csrf_of(browser) -> str:
    """The session's check token, as the fleet page's sign-out form carries it (every role sees it)."""
    return CSRF_IN_FORM.search(browser.get("/").text).group(1)


def count_body(office, vessel: str) -> dict:
    """A valid count of ``vessel``: its first part counted as 1, today."""
    from kit.services.vessels import vessel_view

    view = vessel_view(office.engine, vessel).count
    return {"data": {"part": [li.key for li in view.lines], "location": [li.location or "" for li in view.lines],
                     "counted": ["1"] + [""] * (len(view.lines) - 1), "unit": [f.unit for f in view.filters],
                     "position": [f.position for f in view.filters], "hours": [""] * len(view.filters),
                     "counted_on": dt.date.today().isoformat(), "new_location": ""}}


def body_of(office, case: Case) -> dict:
    if case.body == "count":
        return count_body(office, case.vessel)
    if case.body == "enquiries":
        return {"data": {"scope": "chosen", "ids": f"{OWN}\nSALTMERE-CREST", "days": "120", "reply_by": "", "paper": "a4"}}
    if case.body == "catalogue":
        path = office.imports / "catalogue.csv"
        return {"data": {"supplier": SEALS}, "files": {"catalogue": (path.name, path.read_bytes())}}
    if case.body == "reply":
        return {"data": {}, "files": {"reply": (office.reply.name, office.reply.read_bytes())}}
    return {"data": {"register": "yes"}, "files": {"particulars": ("test_one.toml", TOML_CYLINDER.encode())}}


def ask(office, role: str, case: Case):
    browser = office.browsers[role]
    if case.method == "GET":
        return browser.get(case.path)
    sent = body_of(office, case)
    return browser.post(case.path, data={"csrf": csrf_of(browser), **sent["data"]}, files=sent.get("files"))


@pytest.mark.parametrize("case", CASES, ids=str)
@pytest.mark.parametrize("role", list(LOGINS))
def test_each_role_may_do_what_the_issue_gives_it_and_nothing_else(office, role, case):
    before, trail = dump(office.engine), dump(office.engine, AUDIT)
    r = ask(office, role, case)
    if case.may(role, case.vessel):
        assert r.status_code == case.ok, (r.status_code, r.text[:400])
        if case.ok == 200:
            assert r.headers["content-type"].startswith(case.kind)
        if case.method == "POST":  # a change, traced to the person who made it
            added = set(dump(office.engine, AUDIT)["audit_events"]) - set(trail["audit_events"])
            assert added and all(LOGINS[role] in row for row in added), added
    else:
        assert r.status_code == 403, (r.status_code, r.text[:400])
        said = refusal_of(r)
        assert said.endswith(".") and said.count(". ") == 0 and f"({LOGINS[role]})" in said and "may not" in said, said
        assert dump(office.engine) == before
        assert dump(office.engine, AUDIT) == trail


def test_the_matrix_covers_every_route_the_pages_declare():
    """Every route of the pages is in the matrix (a new page cannot go untested by roles)."""
    import importlib

    from kit.web.app import PAGES

    declared = {(m, r.path) for name in PAGES for r in importlib.import_module(f"kit.web.pages.{name}").router.routes
                for m in r.methods}
    tested = {(c.method, c.path.split("?")[0].replace(OWN, "{vessel_id}").replace(OTHER, "{vessel_id}")) for c in CASES}
    tested |= {("GET", "/suppliers/catalogue-template.{suffix}")}
    open_to_all = {("GET", "/sign-in"), ("POST", "/sign-in"), ("POST", "/sign-out")}
    assert ("POST", "/vessel/{vessel_id}/count") in declared
    assert declared - tested - open_to_all == set()
