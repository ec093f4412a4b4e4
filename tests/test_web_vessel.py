# SPDX-License-Identifier: MIT
"""The vessel page and its pre-voyage check (kit/web/pages/vessel.py) over the demo fleet on both
engines: the figures are the services' (the same as kit calc and kit check show), the count typed
in place is checked as a count sheet's import and written all or nothing, and every refusal is one
sentence with the database left as it was."""

from __future__ import annotations

import datetime as dt
import html
import io
from html.parser import HTMLParser

import pytest

from tests.db_support import db_url, dump, engine  # noqa: F401
from tests.web_support import client, web  # noqa: F401

VESSEL = "CORVINA-BAY"


class _Cells(HTMLParser):
    """Every table row of a page as the text of its cells (th and td), inputs left out."""

    def __init__(self):
        super().__init__()
        self.rows, self.row, self.cell = [], None, None

    def handle_starttag(self, tag, attrs):
        if tag == "tr":
            self.row = []
        elif tag in ("td", "th") and self.row is not None:
            self.cell = []

    def handle_endtag(self, tag):
        if tag in ("td", "th") and self.cell is not None:
            self.row.append(" ".join("".join(self.cell).split()))
            self.cell = None
        elif tag == "tr" and self.row is not None:
            self.rows.append(self.row)
            self.row = None

    def handle_data(self, data):
        if self.cell is not None:
            self.cell.append(data)


def rows_of(text: str) -> list[list[str]]:
    parser = _Cells()
    parser.feed(text)
    return parser.rows


def count_form(web, vessel: str = VESSEL, counted: dict | None = None, hours: dict | None = None, **extra) -> dict:
    """The count form of the vessel page as a browser sends it: every row's part and location,
    ``counted`` by part key (others blank), ``hours`` by (unit, position)."""
    from kit.services.vessels import vessel_view

    view = vessel_view(web.engine, vessel)
    counted, hours = counted or {}, hours or {}
    form = {"csrf": web.csrf(f"/vessel/{vessel}"), "part": [], "location": [], "counted": [], "unit": [], "position": [],
            "hours": [], "counted_on": dt.date.today().isoformat(), "new_location": ""}
    for line in view.count.lines:
        form["part"].append(line.key)
        form["location"].append(line.location or "")
        form["counted"].append(str(counted.pop(line.key, "")))
    for f in view.count.filters:
        form["unit"].append(f.unit)
        form["position"].append(f.position)
        form["hours"].append(str(hours.get((f.unit, f.position), "")))
    form.update(extra)
    return form


# --- the vessel page -------------------------------------------------------------------------


def test_the_vessel_page_shows_the_services_figures_in_any_letter_case(web):
    from kit.engine.report_rows import gear_rows, oil_words, quantity
    from kit.services.vessels import vessel_view

    r = web.browser.get(f"/vessel/{VESSEL.lower()}")
    assert r.status_code == 200
    view = vessel_view(web.engine, VESSEL)
    page = rows_of(r.text)
    text = html.unescape(r.text)
    for u in view.report["units"]:
        for row in gear_rows(u):  # torque, swing times, rudder margin, oil: the values kit calc prints
            assert [row.check, row.value, row.against_with()] in page
        for rule in u["rules"]:
            assert [rule["clause"], rule["verdict"], rule["text"]] in page
        for seal in u["seals"]:
            assert any(cells[1] == seal["part"] and cells[5] == str(seal["qty"]) for cells in page if len(cells) == 8)
        for w in u["warnings"]:
            assert w in text
    for o in view.report["oil"]:
        assert oil_words(o) in text
    for line in view.count.lines:  # the stock on board, as the count sheet lists it
        on_board = quantity(line.on_board, line.uom) if line.on_board is not None else "none"
        assert any(cells[0] == line.designation and cells[4] == on_board for cells in page if len(cells) == 7)
    assert f"{view.short_lines} line(s) short" in text


def test_the_swing_time_is_judged_against_28_seconds(web):
    # SOLAS II-1/29.3.2: 35 deg on one side to 30 deg on the other within 28 s
    page = rows_of(web.browser.get(f"/vessel/{VESSEL}").text)
    judged = next(cells for cells in page if cells and cells[0] == "swing time judged")
    assert judged[2].startswith("28 s,") and judged[2].endswith((": met", ": NOT MET"))
    seconds = float(judged[1].removesuffix(" s"))
    assert judged[2].endswith(": met") == (seconds <= 28)


def test_the_particulars_are_shown_in_the_units_of_the_file(web):
    """The page's working pressure, pump flow and reservoir, converted from SI for display, equal
    the particulars file's own figures read by pint apart from kit."""
    import tomllib

    import pint

    from kit.services.demo import demo_fleet_folder

    ureg = pint.UnitRegistry()
    unit = tomllib.loads((demo_fleet_folder() / "corvina_bay.toml").read_text())["unit"][0]
    page = {cells[0]: cells[1] for cells in rows_of(web.browser.get(f"/vessel/{VESSEL}").text) if len(cells) == 2}
    assert float(page["working pressure"].removesuffix(" bar")) == pytest.approx(ureg(unit["working_pressure"]).to("bar").magnitude)
    pumps, flow = page["pumps"].split(" x ")
    assert float(flow.removesuffix(" L/min")) == pytest.approx(ureg(unit["pump_flow"]).to("L/min").magnitude)
    assert float(page["reservoir"].removesuffix(" L")) == pytest.approx(ureg(unit["reservoir"]).to("L").magnitude)


def test_oil_in_us_gallons_is_the_litres_over_the_nist_factor(web):
    import re

    text = html.unescape(web.browser.get(f"/vessel/{VESSEL}").text)
    found = re.search(r"need ([\d,.]+) L = [\d,.]+ kg = ([\d,.]+) US gal", text)
    litres, gallons = (float(x.replace(",", "")) for x in found.groups())
    assert gallons == pytest.approx(litres / 3.785411784, abs=0.06)  # NIST SP 811: 1 US gal = 3.785411784 L


def test_an_unknown_vessel_is_404_with_one_sentence(web):
    for path in ("/vessel/NO-SUCH-SHIP", "/vessel/NO-SUCH-SHIP/check", "/vessel/NO-SUCH-SHIP/check.xlsx",
                 "/vessel/NO-SUCH-SHIP/count-sheet.xlsx"):
        r = web.browser.get(path)
        assert r.status_code == 404, path
        assert "There is no vessel &#39;NO-SUCH-SHIP&#39; in the fleet database" in r.text


def test_no_session_no_vessel(web):
    for path in (f"/vessel/{VESSEL}", f"/vessel/{VESSEL}/check", f"/vessel/{VESSEL}/check.xlsx",
                 f"/vessel/{VESSEL}/count-sheet.xlsx"):
        r = client(web.app).get(path)
        assert r.status_code == 401 and VESSEL not in r.text, path


# --- the pre-voyage check ---------------------------------------------------------------------


def check_rows(web, days=None) -> list[list[str]]:
    from kit.engine.preflight import shortfall_rows
    from kit.engine.report_rows import quantity
    from kit.services.vessels import voyage_check

    found = voyage_check(web.engine, VESSEL, days)
    return [[str(n), row.part, row.uom, quantity(row.needed, row.uom), quantity(row.on_board, row.uom),
             quantity(row.short, row.uom), row.basis] for n, row in enumerate(shortfall_rows(found.short), 1)]


def test_the_check_defaults_to_the_policys_days_of_cover_and_lists_the_services_shortfall(web):
    from kit.services.policies import days_of_cover

    r = web.browser.get(f"/vessel/{VESSEL.lower()}/check")
    assert r.status_code == 200
    days = days_of_cover(web.engine, [VESSEL]).days
    expected = check_rows(web, days)
    assert expected, "the demo's vessel is short of something"
    page = [cells for cells in rows_of(r.text) if len(cells) == 7 and cells[0].isdigit()]
    assert page == expected
    assert f"{len(expected)} lines short for a {days:g}-day voyage" in r.text
    assert f'name="days" value="{days:g}"' in r.text


def test_the_check_for_other_days_is_the_services(web):
    for days in ("0", "7", "365.5"):
        r = web.browser.get(f"/vessel/{VESSEL}/check?days={days}")
        assert r.status_code == 200
        assert [cells for cells in rows_of(r.text) if len(cells) == 7 and cells[0].isdigit()] == check_rows(web, float(days))


def test_bad_days_are_one_sentence(web):
    for days in ("-1", "nan", "inf", "1e3", "3651", "ninety", "9" * 50):
        for path in ("check", "check.xlsx", "count-sheet.xlsx"):
            r = web.browser.get(f"/vessel/{VESSEL}/{path}", params={"days": days})
            assert r.status_code == 400, (days, path)
            assert "days: expected a plain number of days from 0 to 3650" in r.text and "Traceback" not in r.text


# --- downloads --------------------------------------------------------------------------------


def test_the_count_sheet_download_is_the_workbook_kit_template_stock_writes(web, tmp_path):
    from openpyxl import load_workbook

    from kit.services.policies import days_of_cover
    from kit.services.templates import write_stock_template

    r = web.browser.get(f"/vessel/{VESSEL.lower()}/count-sheet.xlsx")
    assert r.status_code == 200 and "attachment" in r.headers["content-disposition"]
    assert r.headers["content-type"].startswith("application/vnd.openxmlformats")
    ours = tmp_path / "cli.xlsx"
    write_stock_template(web.engine, ours, VESSEL, days_of_cover(web.engine, [VESSEL]).days)
    got, want = load_workbook(io.BytesIO(r.content)), load_workbook(ours)
    assert got.sheetnames == want.sheetnames
    for name in want.sheetnames:
        assert [list(row) for row in got[name].iter_rows(values_only=True)] == [list(row) for row in want[name].iter_rows(values_only=True)]


def test_the_check_workbook_download_is_the_workbook_kit_check_writes(web, tmp_path):
    from openpyxl import load_workbook

    from kit.files.check_workbook import write_check_workbook
    from kit.services.vessels import voyage_check

    r = web.browser.get(f"/vessel/{VESSEL}/check.xlsx?days=30")
    assert r.status_code == 200 and f'filename="{VESSEL}-check.xlsx"' in r.headers["content-disposition"]
    ours = write_check_workbook(voyage_check(web.engine, VESSEL, 30.0), tmp_path / "cli.xlsx")
    got, want = load_workbook(io.BytesIO(r.content)), load_workbook(ours)
    assert [[list(row) for row in ws.iter_rows(values_only=True)] for ws in got] == \
           [[list(row) for row in ws.iter_rows(values_only=True)] for ws in want]


# --- counting in place ------------------------------------------------------------------------


def test_counting_what_is_short_leaves_nothing_short(web):
    from kit.engine.preflight import shortfall_rows
    from kit.services.vessels import voyage_check

    short = shortfall_rows(voyage_check(web.engine, VESSEL).short)
    r = web.browser.post(f"/vessel/{VESSEL.lower()}/count", data=count_form(web, counted={row.key: row.needed for row in short}))
    assert r.status_code == 303, r.text
    assert r.headers["location"] == f"/vessel/{VESSEL}?recorded={len(short)}&hours=0#stock"
    page = web.browser.get(r.headers["location"])
    assert f"Recorded {len(short)} count(s)" in page.text
    check = web.browser.get(f"/vessel/{VESSEL}/check")
    assert "Nothing short" in check.text and not shortfall_rows(voyage_check(web.engine, VESSEL).short)


def test_a_count_sets_the_quantity_date_and_filter_hours(web):
    from kit.services.vessels import vessel_view

    before = vessel_view(web.engine, VESSEL).count
    line = next(li for li in before.lines if li.location is not None)
    f = before.filters[0]
    day = dt.date.today() - dt.timedelta(days=3)
    form = count_form(web, counted={line.key: "7.5"}, hours={(f.unit, f.position): "1234"}, counted_on=day.isoformat())
    r = web.browser.post(f"/vessel/{VESSEL}/count", data=form)
    assert r.status_code == 303 and "recorded=1&hours=1" in r.headers["location"]
    after = vessel_view(web.engine, VESSEL).count
    changed = next(li for li in after.lines if li.key == line.key and li.location == line.location)
    assert (changed.on_board, changed.as_of) == (7.5, day)
    moved = next(x for x in after.filters if (x.unit, x.position) == (f.unit, f.position))
    assert (moved.hours, moved.recorded_on) == (1234.0, day)
    untouched = [li for li in after.lines if li.key != line.key]
    assert untouched == [li for li in before.lines if li.key != line.key]


def test_a_blank_form_changes_nothing(web):
    before = dump(web.engine)
    r = web.browser.post(f"/vessel/{VESSEL}/count", data=count_form(web))
    assert r.status_code == 303 and "recorded=0&hours=0" in r.headers["location"]
    assert "Nothing was entered" in web.browser.get(r.headers["location"]).text
    assert dump(web.engine) == before


def _first_key(web) -> str:
    from kit.services.vessels import vessel_view

    return vessel_view(web.engine, VESSEL).count.lines[0].key


BAD_COUNTS = [
    ("-1", "column counted: expected a number from 0 to 1,000,000,000 (got -1.0)"),
    ("nan", "column counted: expected a plain number of at least 0 with a decimal point"),
    ("inf", "column counted: expected a plain number of at least 0 with a decimal point"),
    ("1e400", "column counted: expected a plain number of at least 0 with a decimal point"),
    ("1000000001", "column counted: expected a number from 0 to 1,000,000,000"),
    ("9" * 400, "column counted: expected a plain number of at least 0 with a decimal point"),
    ("12,5", "column counted: expected a plain number of at least 0 with a decimal point"),
    ("twelve", "column counted: expected a plain number of at least 0 with a decimal point"),
]


def test_a_bad_count_is_refused_whole_naming_the_part(web):
    from kit.services.vessels import vessel_view

    key = _first_key(web)
    before = dump(web.engine)
    for value, expected in BAD_COUNTS:
        good = {li.key: "1" for li in vessel_view(web.engine, VESSEL).count.lines}  # all or nothing: the rest are good
        good[key] = value
        r = web.browser.post(f"/vessel/{VESSEL}/count", data=count_form(web, counted=good))
        assert r.status_code == 400, value
        line = html.unescape(r.text.split('role="alert">')[1].split("</p>")[0])
        assert line.startswith(f"count of {VESSEL}, part_key {key!r} at ") and expected in line, line
        assert "\n" not in line
        assert dump(web.engine) == before


BAD_ENTRIES = [
    ("part", "no_such:part", "column part_key: expected the key of a generic part in the database"),
    ("counted_on", (dt.date.today() + dt.timedelta(days=1)).isoformat(), "column counted_on: expected the date of a count already made"),
    ("counted_on", "31/12/2025", "column counted_on: expected a date, YYYY-MM-DD"),
    ("position", "no such filter", "column position: expected a filter position of unit"),
    ("hours", "-5", "column hours_since_change: expected a number from 0 to 100,000"),
    ("hours", "nan", "column hours_since_change: expected a plain number"),
]


def test_other_bad_entries_are_refused_whole(web):
    from kit.services.vessels import vessel_view

    view = vessel_view(web.engine, VESSEL)
    before = dump(web.engine)
    for field, value, expected in BAD_ENTRIES:
        form = count_form(web, counted={li.key: "2" for li in view.count.lines},
                          hours={(f.unit, f.position): "10" for f in view.count.filters})
        if isinstance(form[field], list):
            form[field][0] = value
        else:
            form[field] = value
        r = web.browser.post(f"/vessel/{VESSEL}/count", data=form)
        assert r.status_code == 400, (field, value)
        assert expected in html.unescape(r.text), (field, value)
        assert dump(web.engine) == before


def test_a_form_whose_rows_do_not_line_up_is_refused(web):
    form = count_form(web)
    form["counted"] = form["counted"][:-1]
    before = dump(web.engine)
    r = web.browser.post(f"/vessel/{VESSEL}/count", data=form)
    assert r.status_code == 400 and "count form: expected a part, location and count on every row" in r.text
    long = count_form(web)  # a long stock list passes the form's field bound and is checked row by row
    long.update(part=[f"no-such-{n}" for n in range(600)], location=[""] * 600, counted=["1"] * 600)
    r = web.browser.post(f"/vessel/{VESSEL}/count", data=long)
    assert r.status_code == 400 and "part_key &#39;no-such-0&#39;" in r.text and "generic part in the database" in r.text
    assert dump(web.engine) == before


def test_a_count_without_session_or_csrf_is_refused(web):
    form = count_form(web, counted={_first_key(web): "3"})
    before = dump(web.engine)
    assert client(web.app).post(f"/vessel/{VESSEL}/count", data=form).status_code == 401
    for token in (None, "", "x" * 43, form["csrf"][:-1]):
        sent = {k: v for k, v in form.items() if k != "csrf"}
        if token is not None:
            sent["csrf"] = token
        r = web.browser.post(f"/vessel/{VESSEL}/count", data=sent)
        assert r.status_code == 403 and "check token" in r.text
    assert dump(web.engine) == before


def test_a_count_for_an_unknown_vessel_is_404_and_writes_nothing(web):
    form = count_form(web, counted={_first_key(web): "3"})
    before = dump(web.engine)
    r = web.browser.post("/vessel/NO-SUCH-SHIP/count", data=form)
    assert r.status_code == 404 and "There is no vessel" in r.text
    assert dump(web.engine) == before


def test_stored_script_is_shown_as_text(web):
    """A location typed with markup, then shown on the page: escaped, never run."""
    from kit.services.vessels import vessel_view

    script = "<script>alert('kit')</script>"
    new = next(li for li in vessel_view(web.engine, VESSEL).count.lines if li.location is None)
    r = web.browser.post(f"/vessel/{VESSEL}/count", data=count_form(web, counted={new.key: "1"}, new_location=script))
    assert r.status_code == 303
    page = web.browser.get(f"/vessel/{VESSEL}").text
    assert script not in page
    assert "&lt;script&gt;alert(&#39;kit&#39;)&lt;/script&gt;" in page


def test_a_vessel_named_with_markup_is_shown_as_text(web, tmp_path):
    from kit.services.demo import demo_fleet_folder
    from kit.services.fleet import load_particulars

    text = (demo_fleet_folder() / "corvina_bay.toml").read_text()
    hostile = tmp_path / "hostile.toml"
    hostile.write_text(text.replace('id = "CORVINA-BAY"', 'id = "SCRIPT-BAY"')
                       .replace('name = "Corvina Bay"', 'name = "<script>alert(1)</script> Bay"'))
    load_particulars(web.engine, hostile)
    for path in ("/vessel/script-bay", "/vessel/SCRIPT-BAY/check?days=10"):
        r = web.browser.get(path)
        assert r.status_code == 200 and "<script>alert(1)</script>" not in r.text
        assert "&lt;script&gt;alert(1)&lt;/script&gt; Bay" in r.text


def test_a_vessel_without_days_of_cover_is_asked_for_days(web, tmp_path):
    """A vessel of a company with no spares policy recorded: the page works it out over 0 days
    (kit calc's default) and the check asks for the days, as kit check does without --days."""
    from kit.services.demo import demo_fleet_folder
    from kit.services.fleet import load_particulars, register_parts

    text = (demo_fleet_folder() / "corvina_bay.toml").read_text()
    other = tmp_path / "other.toml"
    other.write_text(text.replace('id = "CORVINA-BAY"', 'id = "LONE-GULL"')
                     .replace('name = "Marrowgate Ship Management Ltd"', 'name = "Unlisted Owners (invented)"'))
    load_particulars(web.engine, other)
    register_parts(web.engine, ["LONE-GULL"])
    r = web.browser.get("/vessel/lone-gull")
    assert r.status_code == 200 and "no days of cover stated" in r.text and "Figures for a period of 0 days" in r.text
    r = web.browser.get("/vessel/lone-gull/check")
    assert r.status_code == 400
    assert "no spares policy with days of cover is in force for LONE-GULL" in r.text and '<label for="days">' in r.text
    r = web.browser.get("/vessel/lone-gull/check?days=30")
    assert r.status_code == 200 and "30-day voyage" in r.text


# --- the service under the form: the count sheet's checks and writer ------------------------


def test_a_count_in_place_writes_what_the_count_sheets_import_writes(web, tmp_path):
    """The same count, typed in place or imported from the vessel's count sheet, leaves the same
    rows; and the same bad count is refused by both with the same column and expectation."""
    from kit.errors import InputError
    from kit.files.stock_sheet import fill_count
    from kit.services.imports import import_stock
    from kit.services.templates import write_stock_template
    from kit.services.vessels import record_counts, vessel_view

    lines = [li for li in vessel_view(web.engine, VESSEL).count.lines if li.location is not None][:3]
    day = dt.date.today() - dt.timedelta(days=1)
    sheet = tmp_path / "count.xlsx"
    write_stock_template(web.engine, sheet, VESSEL, 90)
    fill_count(sheet, {li.key: 4.0 + n for n, li in enumerate(lines)}, on=day)
    import_stock(web.engine, sheet, VESSEL)
    imported = dump(web.engine, audit=False)
    trail = dump(web.engine, {"audit_events"})["audit_events"]
    report = record_counts(web.engine, VESSEL.lower(), [(li.key, li.location, str(4 + n)) for n, li in enumerate(lines)], day)
    assert len(dump(web.engine, {"audit_events"})["audit_events"]) == len(trail) + 1  # each change leaves its own audit row
    assert report.rows == len(lines) and dump(web.engine, audit=False) == imported
    for bad in (-1.0, 2e9):
        write_stock_template(web.engine, sheet, VESSEL, 90)
        fill_count(sheet, {lines[0].key: bad}, on=day)
        with pytest.raises(InputError) as from_sheet:
            import_stock(web.engine, sheet, VESSEL)
        with pytest.raises(InputError) as typed:
            record_counts(web.engine, VESSEL, [(lines[0].key, lines[0].location, str(bad))], day)
        assert (typed.value.field, typed.value.expected) == (from_sheet.value.field, from_sheet.value.expected)
    assert dump(web.engine, audit=False) == imported
