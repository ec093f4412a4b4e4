# SPDX-License-Identifier: MIT
"""Who may ask the server, checked before any page runs.

One person on one PC (issue: the office server comes later): the server binds 127.0.0.1 and
prints a link with a random start token. Opening it sets a session cookie (HttpOnly,
SameSite=Strict) and sends the browser to the same address without the token, so the token
leaves the address bar and, with ``Referrer-Policy: no-referrer``, is never sent on. Then:

- a request without a valid session is refused (401) before any page runs;
- the Host header must name the server's own address (a page of another site that points its
  own host name at 127.0.0.1, "DNS rebinding", is refused with 400);
- every form carries the session's CSRF token and every POST is refused (403) without it;
- a request body larger than the upload limit is refused (413) as it arrives, before it is read
  whole;
- every response carries a Content-Security-Policy that allows no inline script and no other
  origin, and forbids framing.

With no people in the fleet database, sessions live in this process (:class:`Sessions`):
restarting the server ends them. Once people sign in (the office server), sessions are the
database's (:mod:`kit.services.people`), shared by every server in front of it.
"""

from __future__ import annotations

import hmac
import secrets
from dataclasses import dataclass
from urllib.parse import quote

from starlette.requests import Request

COOKIE = "kit_session"
CSRF_FIELD = "csrf"
TOKEN_PARAM = "token"
UPLOAD_LIMIT = 20 * 1024 * 1024  # bytes of one request body: a 100,000-row catalogue is about 8 MB as CSV
OPEN_PATHS = ("/static/",)  # the style sheet and icons: no data, so the refusal page is styled too
SIGN_IN = "/sign-in"  # with people: the one page open without a session

SECURITY_HEADERS = {
    "content-security-policy": ("default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data:; "
                                "form-action 'self'; frame-ancestors 'none'; base-uri 'none'; object-src 'none'"),
    "x-content-type-options": "nosniff",
    "x-frame-options": "DENY",
    "referrer-policy": "no-referrer",
    "cross-origin-opener-policy": "same-origin",
}


def same(a: str | None, b: str | None) -> bool:
    """Two secrets compared in constant time (no timing hint of how much of a guess was right)."""
    return a is not None and b is not None and hmac.compare_digest(a.encode(), b.encode())


@dataclass
class Session:
    csrf: str
    person: object = None  # kit.store.people.Person when people sign in; None: the one user of this PC


class Sessions:
    """The server's sessions by id (random, 256 bits), each with its own CSRF token."""

    def __init__(self) -> None:
        self._by_id: dict[str, Session] = {}

    def start(self) -> str:
        sid = secrets.token_urlsafe(32)
        self._by_id[sid] = Session(secrets.token_urlsafe(32))
        return sid

    def get(self, sid: str | None) -> Session | None:
        return self._by_id.get(sid) if sid else None


def allowed_hosts(host: str, port: int) -> frozenset[str]:
    """The Host header values the server answers: its own address and port, as a browser on this
    PC writes them."""
    names = {host, "localhost", "127.0.0.1"} if host in ("127.0.0.1", "localhost") else {host}
    return frozenset(f"{n}:{port}" for n in names) | (frozenset(names) if port == 80 else frozenset())


class Guard:
    """ASGI middleware in front of every page: Host header, body size, session, security headers.

    CSRF is checked where a form is read (:func:`kit.web.render.form_of`), since only the page
    knows its form; this middleware makes sure a POST never reaches a page without a session.
    """

    def __init__(self, app, *, token: str, hosts: frozenset[str], sessions: Sessions, limit: int = UPLOAD_LIMIT,
                 engine=None, people: bool = False):
        self.app, self.token, self.hosts, self.sessions, self.limit = app, token, hosts, sessions, limit
        self.engine, self.people = engine, people

    async def __call__(self, scope, receive, send):
        if scope["type"] != "http":
            return await self.app(scope, receive, send)
        headers = {k.decode("latin-1").lower(): v.decode("latin-1") for k, v in scope["headers"]}

        async def send_secured(message):
            if message["type"] == "http.response.start":
                have = {k.lower() for k, _ in message.get("headers", [])}
                extra = [(k.encode(), v.encode()) for k, v in SECURITY_HEADERS.items() if k.encode() not in have]
                if b"cache-control" not in have:
                    extra.append((b"cache-control", b"no-store"))
                message = {**message, "headers": list(message.get("headers", [])) + extra}
            await send(message)

        if headers.get("host") not in self.hosts:
            return await _refuse(send_secured, 400, "This server answers only for its own address "
                                 f"({', '.join(sorted(self.hosts))}); the Host header named another.")
        length = headers.get("content-length")
        if length is not None and (not length.isdigit() or int(length) > self.limit):
            return await _refuse(send_secured, 413, f"The upload is larger than the limit of {self.limit // (1024 * 1024)} MB.")
        path = scope["path"]
        if path.startswith(OPEN_PATHS):
            return await self.app(scope, _bounded(receive, self.limit), send_secured)
        sid = _cookie(headers.get("cookie", ""), COOKIE)
        if self.people:
            return await self._with_person(scope, receive, send_secured, sid, path)
        session = self.sessions.get(sid)
        if session is None:
            given = _query_param(scope.get("query_string", b"").decode("latin-1"), TOKEN_PARAM)
            if scope["method"] == "GET" and same(given, self.token):
                return await _start_session(send_secured, self.sessions.start(), path)
            return await _refuse(send_secured, 401, "Open the address kit printed when the server started "
                                 "(kit: serving http://127.0.0.1:N/?token=...); this browser has no session.")
        scope = {**scope, "state": {**scope.get("state", {}), "session": session}}
        return await self.app(scope, _bounded(receive, self.limit), send_secured)


    async def _with_person(self, scope, receive, send, cookie: str | None, path: str):
        """People sign in: the session is the database's (shared by every server), found by the
        cookie's digest; without one, a page asks to sign in."""
        from starlette.concurrency import run_in_threadpool

        from kit.services.people import session_of

        found = await run_in_threadpool(session_of, self.engine, cookie) if cookie else None
        if found is None:
            if path == SIGN_IN:
                return await self.app(scope, _bounded(receive, self.limit), send)
            if scope["method"] == "GET":
                return await _redirect(send, f"{SIGN_IN}?next={quote(path, safe='/')}")
            return await _refuse(send, 401, "Sign in first: this browser has no session (or it has ended).")
        scope = {**scope, "state": {**scope.get("state", {}), "session": Session(found.csrf, person=found.person)}}
        return await self.app(scope, _bounded(receive, self.limit), send)


async def _redirect(send, location: str) -> None:
    await send({"type": "http.response.start", "status": 303,
                "headers": [(b"location", location.encode()), (b"content-length", b"0")]})
    await send({"type": "http.response.body", "body": b""})


def local_path(path: str | None) -> str:
    """``path`` if it is a path on this server, else "/" (a sign-in never sends the browser elsewhere)."""
    return path if path and path.startswith("/") and not path.startswith("//") and "\\" not in path else "/"


def _bounded(receive, limit: int):
    """``receive`` that stops a body (chunked, or longer than it said) once it passes ``limit``."""
    seen = 0

    async def bounded():
        nonlocal seen
        message = await receive()
        if message["type"] == "http.request":
            seen += len(message.get("body", b""))
            if seen > limit:
                raise BodyTooLarge(limit)
        return message

    return bounded


class BodyTooLarge(Exception):
    def __init__(self, limit: int):
        super().__init__(f"The upload is larger than the limit of {limit // (1024 * 1024)} MB.")


def _cookie(header: str, name: str) -> str | None:
    for part in header.split(";"):
        key, _, value = part.strip().partition("=")
        if key == name:
            return value
    return None


def _query_param(query: str, name: str) -> str | None:
    from urllib.parse import parse_qs

    values = parse_qs(query).get(name)
    return values[0] if values else None


async def _start_session(send, sid: str, path: str) -> None:
    path = local_path(path)  # never to another site
    cookie = f"{COOKIE}={sid}; Path=/; HttpOnly; SameSite=Strict"
    await send({"type": "http.response.start", "status": 303,
                "headers": [(b"location", (path or "/").encode()), (b"set-cookie", cookie.encode()),
                            (b"content-length", b"0")]})
    await send({"type": "http.response.body", "body": b""})


async def _refuse(send, status: int, text: str) -> None:
    from kit.web.render import refusal_page

    body = refusal_page(status, text).encode()
    await send({"type": "http.response.start", "status": status,
                "headers": [(b"content-type", b"text/html; charset=utf-8"), (b"content-length", str(len(body)).encode())]})
    await send({"type": "http.response.body", "body": body})


class CsrfRefused(Exception):
    """A POST without its session's CSRF token (a page of another site posting into this one)."""


async def checked_form(request: Request):
    """The request's form, once its CSRF field has been checked against the session's token (a
    FastAPI dependency for every page that takes a POST). Field and file counts are bounded.
    ``request`` is annotated so FastAPI hands over the request rather than reading a query
    parameter of that name (which refused every POST with 422)."""
    form = await request.form(max_files=4, max_fields=400)
    session = getattr(request.state, "session", None)
    if session is None or not same(form.get(CSRF_FIELD) if isinstance(form.get(CSRF_FIELD), str) else None, session.csrf):
        raise CsrfRefused()
    return form
