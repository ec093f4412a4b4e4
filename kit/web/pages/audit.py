# SPDX-License-Identifier: MIT
"""The audit trail page: who changed what and when, with the before and after (administrators)."""

from __future__ import annotations

from fastapi import APIRouter, Query, Request

from kit.web.access import require
from kit.web.render import page

router = APIRouter()


@router.get("/audit")
def audit_trail(request: Request, person: str = Query("", max_length=200), subject: str = Query("", max_length=200),
                limit: int = Query(200, ge=1, le=5000)):
    import json

    from kit.services.audit import read_audit

    require(request, "view audit")
    events = read_audit(request.app.state.engine, person=person or None, subject=subject or None, limit=limit)
    shown = [(e, "" if e.before is None else json.dumps(e.before, sort_keys=True, ensure_ascii=False, indent=1),
              "" if e.after is None else json.dumps(e.after, sort_keys=True, ensure_ascii=False, indent=1)) for e in events]
    return page("audit.html", request, title="Audit trail", events=shown, who=person, subject=subject, limit=limit)
