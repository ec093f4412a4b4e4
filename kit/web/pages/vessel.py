# SPDX-License-Identifier: MIT
"""The vessel page: one vessel's particulars, gear checks (torque, swing times, SOLAS II-1/29
verdicts, rudder margin), seal kits, oil and filters, and its stock on board, counted in place;
its pre-voyage check for N days; and downloads of its count sheet and check workbook.

Every figure is a service's (:mod:`kit.services.vessels`, as ``kit calc`` and ``kit check`` show
them); counts typed here are checked and written as a count sheet's import is.
"""

from __future__ import annotations

from fastapi import APIRouter, Depends, Query, Request
from fastapi.responses import RedirectResponse

from kit.errors import ArgumentError, UnknownVesselError
from kit.web.access import actor_of, require
from kit.web.guard import checked_form
from kit.web.render import page, refusal_page
from kit.web.sent_files import sent_file

router = APIRouter()
# Fields of one count form: a part, its location and its count a row, three a filter position; the
# guard's own bound (400) would stop a vessel of more than about 130 rows. The body stays bounded
# by the upload limit.
COUNT_FORM_FIELDS = 6000


def _unknown(request: Request, exc: UnknownVesselError):
    from fastapi.responses import HTMLResponse

    text = f"There is no vessel {exc.vessel_id!r} in the fleet database; the Particulars page adds vessels."
    return HTMLResponse(refusal_page(404, text, request), status_code=404)


def _days(text: str | None) -> float | None:
    """The ``days`` of an address as ``kit check --days`` takes them: a plain number from 0 to
    :data:`kit.files.numbers.MAX_DAYS`; None when not given."""
    from kit.files.numbers import MAX_DAYS, parse_decimal

    if text is None or not text.strip():
        return None
    value = parse_decimal(text.strip(), "point")
    if value is None or not 0 <= value <= MAX_DAYS:
        raise ArgumentError("", "days", f"a plain number of days from 0 to {MAX_DAYS}, e.g. 90",
                            got=repr(text if len(text) <= 40 else text[:40] + "..."))
    return value


@router.get("/vessel/{vessel_id}")
def vessel(request: Request, vessel_id: str, recorded: int | None = Query(None, ge=0, le=100_000),
           hours: int = Query(0, ge=0, le=100_000)):
    import datetime as dt

    from kit.engine.report_rows import fmt, gear_rows, oil_words, quantity, seal_cells, unit_particulars
    from kit.services.vessels import vessel_view

    require(request, "view vessel", vessel_id)
    try:
        view = vessel_view(request.app.state.engine, vessel_id)
    except UnknownVesselError as exc:
        return _unknown(request, exc)
    units = [(u, gear_rows(u), [seal_cells(s) for s in u["seals"]]) for u in view.report["units"]]
    oil = [(o, oil_words(o)) for o in view.report["oil"]]
    fields = [dict(unit_particulars(u)) for u in view.vessel.units]
    labels = list(dict.fromkeys(label for f in fields for label in f))
    particulars = [(label, [f.get(label, "\u2013") for f in fields]) for label in labels]
    return page("vessel.html", request, view=view, v=view.vessel, units=units, oil=oil, today=dt.date.today(),
                particulars=particulars, fmt=fmt, qty=quantity,
                recorded=recorded, hours=hours, title=f"{view.vessel.name} ({view.vessel.id})")


async def checked_count_form(request: Request):
    """The count form, read with room for a long stock list, then checked as every form is
    (:func:`kit.web.guard.checked_form` takes the form already read)."""
    await request.form(max_files=0, max_fields=COUNT_FORM_FIELDS)
    return await checked_form(request)


@router.post("/vessel/{vessel_id}/count")
def record_count(request: Request, vessel_id: str, form=Depends(checked_count_form)):
    """The count typed in the stock table: each row's part, location and count (blank: not counted),
    the filters' running hours, the date counted and where parts with no location go."""
    from urllib.parse import quote

    from kit.services.vessels import record_counts

    require(request, "count stock", vessel_id)

    def texts(name: str) -> list[str]:
        return [v if isinstance(v, str) else "" for v in form.getlist(name)]

    parts, places, counted = texts("part"), texts("location"), texts("counted")
    units, positions, run = texts("unit"), texts("position"), texts("hours")
    if not len(parts) == len(places) == len(counted) or not len(units) == len(positions) == len(run):
        raise ArgumentError("", "count form", "a part, location and count on every row (reload the page)",
                            got=f"{len(parts)} part(s), {len(places)} location(s), {len(counted)} count(s)")
    on = form.get("counted_on")
    where = form.get("new_location")
    try:
        report = record_counts(request.app.state.engine, vessel_id, list(zip(parts, places, counted)),
                               on if isinstance(on, str) else None, where if isinstance(where, str) else None,
                               list(zip(units, positions, run)), actor=actor_of(request))
    except UnknownVesselError as exc:
        return _unknown(request, exc)
    return RedirectResponse(f"/vessel/{quote(report.vessel, safe='')}?recorded={report.rows}&hours={report.filter_hours}#stock",
                            status_code=303)


@router.get("/vessel/{vessel_id}/check")
def check(request: Request, vessel_id: str, days: str | None = Query(None, max_length=100)):
    from kit.engine.preflight import covered_rows, short_words, shortfall_rows, unit_oil
    from kit.engine.report_rows import fmt, quantity
    from kit.services.vessels import voyage_check

    require(request, "view check", vessel_id)
    chosen = _days(days)
    try:
        found = voyage_check(request.app.state.engine, vessel_id, chosen)
    except UnknownVesselError as exc:
        return _unknown(request, exc)
    except ArgumentError as exc:  # no days given and none of cover in force: ask for them
        if chosen is not None:
            raise
        return page("vessel_days.html", request, status=400, vessel_id=vessel_id, text=str(exc),
                    title="Pre-voyage check: how many days?")
    result = found.full.results[0] if found.full is not None and found.full.results else None
    return page("vessel_check.html", request, check=found, v=found.vessel, rows=shortfall_rows(found.short),
                words=short_words(found.short), oil=unit_oil(result) if result is not None else [],
                covered=[*covered_rows(found.full, "oil"), *covered_rows(found.full, "filter_element")],
                days_text=f"{found.days:g}", fmt=fmt, qty=quantity,
                title=f"Pre-voyage check, {found.vessel.name} ({found.vessel.id})")


def _file_name(vessel_id: str, what: str) -> str:
    from kit.web.uploads import safe_name

    return safe_name(f"{vessel_id}-{what}.xlsx", f"vessel-{what}.xlsx")


@router.get("/vessel/{vessel_id}/count-sheet.xlsx")
def count_sheet(request: Request, vessel_id: str, days: str | None = Query(None, max_length=100)):
    """The workbook ``kit template stock OUT --vessel ID`` writes, for a voyage of ``days`` (default
    the days of cover of the vessel's policy in force, as there)."""
    from kit.services.policies import days_of_cover
    from kit.services.templates import write_stock_template

    require(request, "download count sheet", vessel_id)
    engine = request.app.state.engine
    try:
        chosen = _days(days)
        if chosen is None:
            chosen = days_of_cover(engine, [vessel_id]).days
        return sent_file(lambda path: write_stock_template(engine, path, vessel_id, chosen), _file_name(vessel_id, "count-sheet"))
    except UnknownVesselError as exc:
        return _unknown(request, exc)


@router.get("/vessel/{vessel_id}/check.xlsx")
def check_workbook(request: Request, vessel_id: str, days: str | None = Query(None, max_length=100)):
    """The workbook ``kit check ID --out FILE`` writes."""
    from kit.files.check_workbook import write_check_workbook
    from kit.services.vessels import voyage_check

    require(request, "download check", vessel_id)
    try:
        found = voyage_check(request.app.state.engine, vessel_id, _days(days))
    except UnknownVesselError as exc:
        return _unknown(request, exc)
    return sent_file(lambda path: write_check_workbook(found, path), _file_name(found.vessel.id, "check"))
