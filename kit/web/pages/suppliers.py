# SPDX-License-Identifier: MIT
"""The suppliers page: every supplier with its catalogue entries, currencies and preference; a
catalogue (.xlsx or .csv) or a filled-in enquiry reply (.xlsx) uploaded and read by the same
services as ``kit catalogue import`` and ``kit enquiry read``, with the rows that matched no
generic part listed; an empty catalogue template to download."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

from fastapi import APIRouter, Depends, Query, Request

from kit.web.access import actor_of, require
from kit.web.guard import checked_form
from kit.web.notices import notice_of, redirect_with
from kit.web.render import page
from kit.web.upload_forms import choice_field, one_upload, reading, text_field
from kit.web.uploads import as_uploaded, safe_name

router = APIRouter()
CATALOGUE_SUFFIXES = (".xlsx", ".csv")  # kit.files.catalogue_sheet reads these
REPLY_SUFFIXES = (".xlsx",)  # kit.files.enquiry_reply reads a workbook only
# the form's choice -> the decimal mark the import takes (kit catalogue import --decimal-mark)
DECIMAL_MARKS = {"": None, "point": "point", "comma": "comma"}
SHOW_UNMATCHED = 20  # rows listed on the page, as kit catalogue import lists them; the rest counted


@dataclass(frozen=True)
class Imported:
    """What an import reported, as the page shows it (kept for the redirect, so bounded: never
    the service's report of a 100,000-row file whole)."""

    kind: str  # "catalogue" or "reply"
    filename: str  # as uploaded
    supplier: str
    rows: int  # catalogue rows read (a reply: lines quoted)
    matched: int  # of them, matched to a generic part
    unmatched_total: int
    unmatched: list[tuple[str, str, str]]  # the first SHOW_UNMATCHED (where, supplier_ref, part key), of the file as uploaded
    enquiry_id: str | None = None  # a reply: the enquiry it answers
    skipped: tuple[str, ...] = ()  # a reply: its line references not quoted (the first of them, if many)
    skipped_total: int = 0


def _unmatched(upload, path, report) -> list[tuple[str, str, str]]:
    return [(as_uploaded(where, path, upload.filename), ref, key) for where, ref, key in report.unmatched[:SHOW_UNMATCHED]]


@router.get("/suppliers")
def suppliers(request: Request, done: str | None = Query(None, max_length=64)):
    from kit.services.purchasing import list_suppliers

    require(request, "view suppliers")
    return page("suppliers.html", request, title="Suppliers", suppliers=list_suppliers(request.app.state.engine),
                done=notice_of(request, done), show_unmatched=SHOW_UNMATCHED)


@router.post("/suppliers/catalogue")
def import_catalogue(request: Request, form=Depends(checked_form)):
    """As ``kit catalogue import FILE --supplier NAME [--decimal-mark ...]``."""
    from kit.services.imports import import_catalogue as imported

    require(request, "import catalogue")
    supplier = text_field(form, "supplier", "supplier name")
    decimal = choice_field(form, "decimal", "decimal mark", DECIMAL_MARKS)
    upload = one_upload(form, "catalogue", "catalogue file", CATALOGUE_SUFFIXES)
    with reading(upload, request.app.state.upload_limit) as path:
        report = imported(request.app.state.engine, path, supplier, decimal, actor=actor_of(request))
        done = Imported("catalogue", safe_name(upload.filename), report.supplier, report.rows, report.matched,
                        len(report.unmatched), _unmatched(upload, path, report))
    return redirect_with(request, "/suppliers", done)


@router.post("/suppliers/reply")
def read_reply(request: Request, form=Depends(checked_form)):
    """As ``kit enquiry read REPLY``."""
    from kit.services.enquiries import read_enquiry_reply

    require(request, "read reply")
    upload = one_upload(form, "reply", "enquiry reply", REPLY_SUFFIXES)
    with reading(upload, request.app.state.upload_limit) as path:
        report = read_enquiry_reply(request.app.state.engine, path, actor=actor_of(request))
        done = Imported("reply", safe_name(upload.filename), report.supplier, report.quoted, report.quoted - len(report.unmatched),
                        len(report.unmatched), _unmatched(upload, path, report), report.enquiry_id, tuple(report.skipped),
                        len(report.skipped))
    return redirect_with(request, "/suppliers", done)


@router.get("/suppliers/catalogue-template.{suffix}")
def catalogue_template(request: Request, suffix: Literal["xlsx", "csv"], paper: Literal["a4", "letter"] = "a4"):
    """As ``kit template catalogue catalogue-template.xlsx``."""
    require(request, "view suppliers")
    from kit.services.templates import write_catalogue_template
    from kit.web.sent_files import sent_file

    return sent_file(lambda path: write_catalogue_template(path, paper), f"catalogue-template.{suffix}")
