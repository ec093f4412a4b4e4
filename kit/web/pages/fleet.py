# SPDX-License-Identifier: MIT
"""The fleet page: every vessel with its gear's rule verdicts, last stock count, next delivery and
how many lines are short for a voyage of its policy's days of cover; paged and searchable."""

from __future__ import annotations

from fastapi import APIRouter, Query, Request

from kit.web.access import require, vessels_seen
from kit.web.render import page

router = APIRouter()
PER_PAGE = 25


@router.get("/")
def fleet(request: Request, q: str = Query("", max_length=100), p: int = Query(1, ge=1, le=100_000)):
    from kit.services.fleet import fleet_page

    require(request, "view fleet")
    found = fleet_page(request.app.state.engine, q, p, PER_PAGE, only=vessels_seen(request))
    return page("fleet.html", request, fleet=found, title="Fleet")
