# SPDX-License-Identifier: MIT
"""What a successful POST did, carried to the page the browser is sent to next.

After a form is sent the browser is redirected (303) to a GET page (post/redirect/get, so a reload
sends nothing twice). What the action reported, such as an import's unmatched rows, travels with
the browser, not in the server's memory, so that any of several servers in front of one database
may answer the GET: a short-lived cookie (HttpOnly, SameSite=Strict, Secure over TLS, a minute)
holds the report as JSON of plain values under a random key that the redirect's address carries
(``?done=KEY``); the page shows it only when the two keys match. The cookie is bounded (its
longest lists are cut, their totals stay counted) and what it holds is shown escaped like any text,
so a browser that alters it changes only what that browser is shown.
"""

from __future__ import annotations

import base64
import binascii
import dataclasses
import json
import secrets
from types import SimpleNamespace

COOKIE = "kit_notice"
LIFETIME = 60  # seconds: long enough for the redirect, short enough not to linger
BOUND = 3000  # characters of the cookie's value (browsers keep at least 4096 bytes a cookie)


def _plain(value):
    return dataclasses.asdict(value) if dataclasses.is_dataclass(value) else value


def _cut(value) -> bool:
    """Halve the longest list in ``value`` (dicts and lists of plain values); whether one was cut."""
    lists = []

    def walk(v):
        if isinstance(v, dict):
            for item in v.values():
                walk(item)
        elif isinstance(v, list):
            lists.append(v)
            for item in v:
                walk(item)

    walk(value)
    longest = max(lists, key=len, default=[])
    if not longest:
        return False
    del longest[len(longest) // 2:]
    return True


def encoded(key: str, value) -> str:
    """``value`` (a dataclass or plain values) under ``key`` as the cookie carries it, within :data:`BOUND`."""
    plain = json.loads(json.dumps(_plain(value)))  # tuples as lists, so they can be cut
    while True:
        text = base64.urlsafe_b64encode(json.dumps({"key": key, "value": plain}, separators=(",", ":")).encode()).decode()
        if len(text) <= BOUND or not _cut(plain):
            return text


def decoded(text: str | None, key: str | None):
    """The value carried under ``key``, as attributes (a template reads ``done.supplier``); None when
    absent, for another key, or not what kit wrote."""
    from kit.web.guard import same

    if not text or not key or len(text) > BOUND:
        return None
    try:
        carried = json.loads(base64.urlsafe_b64decode(text.encode()))
        if not isinstance(carried, dict) or not same(str(carried.get("key")), key):
            return None
        return json.loads(json.dumps(carried["value"]), object_hook=lambda d: SimpleNamespace(**d))
    except (ValueError, TypeError, KeyError, binascii.Error):
        return None


def redirect_with(request, path: str, value):
    """A 303 to ``path`` whose browser carries ``value`` for the page it shows next."""
    from fastapi.responses import RedirectResponse

    key = secrets.token_urlsafe(16)
    response = RedirectResponse(f"{path}?done={key}", status_code=303)
    response.set_cookie(COOKIE, encoded(key, value), max_age=LIFETIME, path=path, httponly=True, samesite="strict",
                        secure=request.app.state.secure_cookies)
    return response


def notice_of(request, key: str | None):
    """What the action whose key the address carries reported, or None."""
    return decoded(request.cookies.get(COOKIE), key)
