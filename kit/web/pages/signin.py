# SPDX-License-Identifier: MIT
"""Signing in and out, when people are kept in the fleet database (the office server).

The sign-in form is the one page open without a session. It carries a check value that must
match a cookie set with the form (double submit), so another site cannot sign a browser in as
someone else. A successful sign-in always starts a new session (a new cookie: no fixation); a
refusal says only "wrong login or password", or, once too many have failed, until when sign-in
is locked (HTTP 429).
"""

from __future__ import annotations

import secrets

from fastapi import APIRouter, Depends, Request
from fastapi.responses import RedirectResponse

from kit.web.guard import COOKIE, checked_form, local_path, same
from kit.web.render import page

router = APIRouter()
FORM_COOKIE = "kit_sign_in"


def _form(request: Request, status: int = 200, refusal: str | None = None, next_path: str = "/"):
    check = secrets.token_urlsafe(32)
    response = page("signin.html", request, status=status, title="Sign in", refusal=refusal, check=check,
                    next_path=local_path(next_path))
    response.set_cookie(FORM_COOKIE, check, httponly=True, samesite="strict", secure=request.app.state.secure_cookies,
                        path="/sign-in")
    return response


@router.get("/sign-in")
def sign_in_form(request: Request, next: str = "/"):
    return _form(request, next_path=next)


@router.post("/sign-in")
async def sign_in(request: Request):
    from starlette.concurrency import run_in_threadpool

    from kit.services.people import SignInRefused, sign_in as start

    form = await request.form(max_files=0, max_fields=10)
    login, password = str(form.get("login", ""))[:200], str(form.get("password", ""))[:1024]
    next_path = local_path(str(form.get("next", "/")))
    if not same(str(form.get("check", "")), request.cookies.get(FORM_COOKIE)):
        return _form(request, 403, "The sign-in form had expired or came from elsewhere; sign in again.", next_path)
    address = request.client.host if request.client else "unknown"
    try:
        signed = await run_in_threadpool(start, request.app.state.engine, login, password, address)
    except SignInRefused as refused:
        return _form(request, 429 if refused.locked else 401, str(refused), next_path)
    response = RedirectResponse(next_path, status_code=303)
    response.set_cookie(COOKIE, signed.cookie, httponly=True, samesite="strict", secure=request.app.state.secure_cookies, path="/")
    response.delete_cookie(FORM_COOKIE, path="/sign-in")
    return response


@router.post("/sign-out")
def sign_out(request: Request, form=Depends(checked_form)):
    from kit.services.people import sign_out as end

    end(request.app.state.engine, request.cookies.get(COOKIE))
    response = RedirectResponse("/sign-in", status_code=303)
    response.delete_cookie(COOKIE, path="/")
    return response
