# SPDX-License-Identifier: MIT
"""The order page: choose vessels and days, see the order as ``kit bom`` builds it (lines with
packs, supplier and why, prices, order-by dates, late lines, delivery; totals in the base currency
and per currency, and the same notes), and download the order workbook and the supplier enquiries.

The choice is a GET form, so an order can be bookmarked and reloaded. Vessels are chosen by
ticking them in a list that is searched and paged (a fleet of a thousand is never listed whole)
or by typing their ids; a vessel ticked on one page of the list stays chosen on the next, where
it is written into the ids field. Writing enquiries records them in the fleet database, so it
is a POST with the session's CSRF token, answered with the zip of the workbooks itself (nothing
is kept on the server for a later request).
"""

from __future__ import annotations

import contextlib
import datetime as dt
import io
import re
import shutil
import tempfile
import zipfile
from dataclasses import dataclass, replace
from pathlib import Path
from urllib.parse import urlencode

from fastapi import APIRouter, Depends, Query, Request
from fastapi.responses import Response

from kit.errors import ArgumentError, KitError, UnknownVesselError
from kit.web.access import actor_of, require
from kit.web.guard import checked_form
from kit.web.render import page

router = APIRouter()
PER_PAGE = 20  # vessels listed to tick at a time
SOURCE = "order page"  # how a refusal names where the value came from
PAPERS = (("a4", "A4"), ("letter", "US Letter"))
_TYPED = re.compile(r"[\s,;]+")  # between ids a person types (an id with a space or comma in it is ticked instead)
_CARRIED = re.compile(r"\n")  # between ids a page's hidden field carries (no stored text holds a control character)


@dataclass(frozen=True)
class Asked:
    """What the form asks for, as typed."""

    fleet: bool  # the whole fleet rather than the vessels chosen
    vessels: list[str]  # ids as typed, each once (any letter case)
    days: str  # blank: the days of cover of the policies in force
    hide: bool  # leave out lines with nothing to order
    sort: str

    def query(self, **more) -> str:
        """This choice as a query string (for links that keep it)."""
        pairs = [("scope", "fleet" if self.fleet else "chosen")] + [("vessel", v) for v in ([] if self.fleet else self.vessels)]
        pairs += [("days", self.days), ("sort", self.sort)] + ([("hide", "1")] if self.hide else [])
        return urlencode(pairs + [(k, v) for k, v in more.items() if v is not None])


def _ids(typed: str, ticked: list[str], between: re.Pattern = _TYPED) -> list[str]:
    """The vessel ids typed (separated by ``between``) and ticked, each once whatever its letter
    case, in the order given."""
    seen: dict[str, str] = {}
    for vessel_id in [*between.split(typed), *ticked]:
        vessel_id = vessel_id.strip()
        if vessel_id:
            seen.setdefault(vessel_id.casefold(), vessel_id)
    return list(seen.values())


def _period(engine, asked: Asked) -> tuple[list[str], float, str]:
    """The vessel ids asked for (none: the whole fleet), the days to cover and why those days; a
    refusal is a :class:`KitError` naming the page's field."""
    from kit.files.numbers import days_typed
    from kit.services.policies import days_of_cover

    vessel_ids = [] if asked.fleet else asked.vessels
    if not asked.fleet and not vessel_ids:
        raise ArgumentError(SOURCE, "vessels", "at least one vessel ticked or typed, or the whole fleet")
    if asked.days.strip():
        days = days_typed(asked.days, SOURCE)
        return vessel_ids, days, f"{days_text(days)} days, as asked"
    with _named_vessel():
        cover = days_of_cover(engine, vessel_ids)
    return vessel_ids, float(cover.days), cover.explained()


def days_text(days: float) -> str:
    """``days`` as a form field carries it: whole days without a decimal point, others exactly."""
    text = repr(float(days))
    return text.removesuffix(".0")


@contextlib.contextmanager
def _named_vessel():
    """An unknown vessel id refused as the page's field, not the command line's option."""
    try:
        yield
    except UnknownVesselError as exc:
        raise ArgumentError(SOURCE, "vessel", "the id of a vessel in the fleet database (the Fleet page lists them; "
                            "letter case does not matter)", got=repr(exc.vessel_id)) from None


def _order_of(engine, asked: Asked) -> dict:
    """The order asked for and what the page says about it."""
    from kit.engine.order_notes import WARNING, order_notes
    from kit.services.orders import build_order

    vessel_ids, days, why = _period(engine, asked)
    with _named_vessel():
        order, scope = build_order(engine, vessel_ids, days, to_order_only=asked.hide)
    lines = order.lines
    if asked.sort == "order_by":  # undated lines (no offer, or no delivery set) last
        lines = sorted(lines, key=lambda li: (li.order_by is None, li.order_by or dt.date.max, li.number))
    notes = order_notes(order)
    return {"order": order, "scope": scope, "days": days, "days_text": days_text(days), "days_why": why, "lines": lines,
            "notes": [n for n in notes if not n.startswith(WARNING)],
            "warnings": [n.removeprefix(WARNING) for n in notes if n.startswith(WARNING)],
            "totals": sorted(order.totals_by_currency().items()),
            "unconverted": sum(1 for li in order.lines if li.line_total is not None and li.line_total_base is None),
            "vessel_ids": order.vessel_ids}


@router.get("/order")
def order_page(request: Request,
               go: str | None = Query(None, max_length=10),
               scope: str = Query("chosen", pattern="^(chosen|fleet)$"),
               ids: str = Query("", max_length=40_000),
               vessel: list[str] = Query([]),
               days: str = Query("", max_length=40),
               hide: bool = Query(False),
               sort: str = Query("line", pattern="^(line|order_by)$"),  # line number, or order-by date
               q: str = Query("", max_length=100),
               p: int = Query(1, ge=1, le=100_000)):
    from kit.services.fleet import find_vessels

    require(request, "view order")
    engine = request.app.state.engine
    asked = Asked(scope == "fleet", _ids(ids, vessel), days, hide, sort)
    found = find_vessels(engine, q, p, PER_PAGE)
    listed = {g.id.casefold() for g in found.rows}
    chosen = {v.casefold() for v in asked.vessels}
    values = {"asked": asked, "found": found, "listing": [(g, g.id.casefold() in chosen) for g in found.rows],
              "by_date": replace(asked, sort="order_by").query(go="1"), "by_line": replace(asked, sort="line").query(go="1"),
              "also": [v for v in asked.vessels if v.casefold() not in listed],
              "shown": None, "refusal": None, "hint": None, "papers": PAPERS}
    status = 200
    if go and not (asked.fleet or asked.vessels):  # Enter in the search field, nothing chosen yet: a search
        values["hint"] = "Tick the vessels to order for, type their ids, or choose the whole fleet; then show the order."
    elif go:
        try:
            values["shown"] = _order_of(engine, asked)
        except KitError as exc:
            values["refusal"], status = str(exc), 400
    return page("order.html", request, status=status, title="Order", **values)


def _asked_in(form) -> Asked:
    """The choice a download or enquiry form carries (the vessels and days the page showed; the
    vessels in one field, so a thousand of them stay within the form's bound on fields)."""
    scope = form.get("scope", "chosen")
    return Asked(scope == "fleet", _ids(str(form.get("ids", "")), [str(v) for v in form.getlist("vessel")], _CARRIED),
                 str(form.get("days", "")), form.get("hide") == "1", "line")


def _paper(value) -> str:
    if value not in dict(PAPERS):
        raise ArgumentError(SOURCE, "paper", "one of " + ", ".join(dict(PAPERS)), got=repr(value))
    return value


@router.get("/order/workbook")
def order_workbook(request: Request,
                   scope: str = Query("chosen", pattern="^(chosen|fleet)$"),
                   ids: str = Query("", max_length=40_000),
                   vessel: list[str] = Query([]),
                   days: str = Query("", max_length=40),
                   hide: bool = Query(False),
                   paper: str = Query("a4", max_length=10)):
    """The order workbook, written by the same writer and with the same arguments as ``kit bom --out``."""
    from kit.files.workbook import write_workbook

    from kit.web.sent_files import sent_file

    require(request, "download order")
    shown = _order_of(request.app.state.engine, Asked(scope == "fleet", _ids(ids, vessel, _CARRIED), days, hide, "line"))
    size = _paper(paper)
    return sent_file(lambda path: write_workbook(shown["order"], path, shown["days"], shown["scope"], size),
                     f"kit-order-{dt.date.today().isoformat()}.xlsx")


@router.post("/order/enquiries")
def order_enquiries(request: Request, form=Depends(checked_form)):
    """Write the order as supplier enquiries (recorded in the fleet database, as ``kit enquiry
    write`` does) and answer with the zip of their workbooks, one per supplier and the open enquiry."""
    from kit.files.dates import EXPECTED, iso_date
    from kit.services.enquiries import write_enquiries

    require(request, "write enquiries")
    asked = _asked_in(form)
    reply_text = str(form.get("reply_by", "")).strip()
    reply_by = iso_date(reply_text) if reply_text else None
    if reply_text and reply_by is None:
        raise ArgumentError(SOURCE, "replies by", EXPECTED, got=repr(reply_text[:40]))
    paper = _paper(form.get("paper", "a4"))
    engine = request.app.state.engine
    vessel_ids, days, _ = _period(engine, asked)
    folder = Path(tempfile.mkdtemp(prefix="kit-enquiries-"))
    try:
        with _named_vessel():
            result = write_enquiries(engine, vessel_ids, days, folder / "enquiries", reply_by, paper=paper, actor=actor_of(request))
        packed = io.BytesIO()
        with zipfile.ZipFile(packed, "w", zipfile.ZIP_DEFLATED) as z:
            for _, path in result.written:
                z.write(path, path.name)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return Response(packed.getvalue(), media_type="application/zip", headers={
        "content-disposition": f'attachment; filename="kit-enquiries-{dt.date.today().isoformat()}.zip"'})
