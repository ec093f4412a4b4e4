# SPDX-License-Identifier: MIT
"""The particulars page: vessels added or updated from an uploaded particulars file (TOML) or
particulars workbook (.xlsx), read and saved by the same service as ``kit load``; the empty
particulars workbook to download."""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Literal

from fastapi import APIRouter, Depends, Query, Request

from kit.web.access import actor_of, require
from kit.web.guard import checked_form
from kit.web.notices import notice_of, redirect_with
from kit.web.render import page
from kit.web.upload_forms import choice_field, one_upload, reading
from kit.web.uploads import safe_name

router = APIRouter()
SUFFIXES = (".toml", ".xlsx")  # kit.files.particulars_file reads these (a folder only from the command line)


@dataclass(frozen=True)
class Loaded:
    filename: str  # as uploaded
    ids: list[str]  # the vessels added or updated (the first of them, if many)
    vessels: int  # how many
    registered: object = None  # kit.services.fleet.PartsRegistered, when the parts were registered too
    not_registered: str | None = None  # why registering the parts was refused (the vessels stay loaded)


@router.get("/particulars")
def particulars(request: Request, done: str | None = Query(None, max_length=64)):
    require(request, "view particulars")
    return page("particulars.html", request, title="Particulars", done=notice_of(request, done))


@router.post("/particulars")
def load(request: Request, form=Depends(checked_form)):
    """As ``kit load FILE``, then (box ticked) ``kit parts register --vessel ID ...`` for its vessels."""
    from kit.errors import KitError
    from kit.services.fleet import load_particulars, register_parts

    require(request, "load particulars")
    register = choice_field(form, "register", "register the parts", {"": False, "yes": True})
    upload = one_upload(form, "particulars", "particulars file", SUFFIXES)
    engine = request.app.state.engine
    with reading(upload, request.app.state.upload_limit) as path:
        ids = load_particulars(engine, path, source=safe_name(upload.filename), actor=actor_of(request))
    loaded = Loaded(safe_name(upload.filename), ids, len(ids))
    if register:  # as `kit parts register --vessel ID ...` run next: its own transaction
        try:
            loaded = replace(loaded, registered=register_parts(engine, ids, actor=actor_of(request)))
        except KitError as exc:
            loaded = replace(loaded, not_registered=str(exc))
    return redirect_with(request, "/particulars", loaded)


@router.get("/particulars/template.xlsx")
def template(request: Request, paper: Literal["a4", "letter"] = "a4"):
    """As ``kit template particulars particulars.xlsx``."""
    require(request, "view particulars")
    from kit.services.templates import write_particulars_template
    from kit.web.sent_files import sent_file

    return sent_file(lambda path: write_particulars_template(path, None, paper), "particulars.xlsx")
