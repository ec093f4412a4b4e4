# SPDX-License-Identifier: MIT
"""The application ``kit serve`` runs: the pages, the refusals, the guard in front.

:func:`create_app` takes the fleet database's engine, as every service does, and the start token;
it opens nothing itself. Refusals are pages with one sentence, as the command line prints one
line: a library error (:class:`kit.errors.KitError`) is shown as the command line would say it
(file, line, column, expected) with status 400, and nothing is half-written because the services
write in one transaction.
"""

from __future__ import annotations

from kit.web.guard import UPLOAD_LIMIT

PAGES = ("fleet", "vessel", "order", "suppliers", "particulars", "signin", "audit")  # modules of kit.web.pages, each with a ``router``


def create_app(engine, *, token: str, host: str = "127.0.0.1", port: int = 8750, upload_limit: int = UPLOAD_LIMIT,
               people: bool | None = None, secure_cookies: bool = False, names: tuple[str, ...] = ()):
    """The web application over ``engine`` (the fleet database), answering at ``host``:``port``
    (and at the host ``names`` given) to a browser that opened the link with ``token``; or, with
    ``people`` (default: whether the database holds any), to people who sign in. ``secure_cookies``
    when the browser reaches it over TLS (directly or through a proxy)."""
    import importlib

    from fastapi import FastAPI, Request
    from fastapi.exceptions import RequestValidationError
    from fastapi.responses import HTMLResponse, PlainTextResponse
    from fastapi.staticfiles import StaticFiles

    from kit.errors import KitError
    from kit.services.people import anyone_signs_in
    from kit.web.access import Forbidden
    from kit.web.guard import BodyTooLarge, CsrfRefused, Guard, Sessions, allowed_hosts
    from kit.web.render import HERE, refusal_page

    app = FastAPI(docs_url=None, redoc_url=None, openapi_url=None, title="kit")
    app.state.engine = engine
    app.state.upload_limit = upload_limit
    app.state.sessions = Sessions()
    app.state.people = anyone_signs_in(engine) if people is None else people
    app.state.secure_cookies = secure_cookies

    def refused(request: Request, status: int, text: str) -> HTMLResponse:
        return HTMLResponse(refusal_page(status, text, request), status_code=status)

    @app.exception_handler(KitError)
    async def kit_error(request: Request, exc: KitError):
        return refused(request, 400, str(exc))

    @app.exception_handler(BodyTooLarge)
    async def too_large(request: Request, exc: BodyTooLarge):
        return refused(request, 413, str(exc))

    @app.exception_handler(Forbidden)
    async def forbidden(request: Request, exc: Forbidden):
        return refused(request, 403, exc.text)

    @app.exception_handler(CsrfRefused)
    async def no_csrf(request: Request, exc: CsrfRefused):
        return refused(request, 403, "The form did not carry this session's check token; reload the page and send it again.")

    @app.exception_handler(RequestValidationError)
    async def bad_field(request: Request, exc: RequestValidationError):
        first = exc.errors()[0]
        field = ".".join(str(x) for x in first.get("loc", ())[1:]) or "request"
        return refused(request, 422, f"{request.url.path}: {field}: expected {first.get('msg', 'a valid value').lower()}")

    @app.exception_handler(404)
    async def not_found(request: Request, exc):
        return refused(request, 404, "There is no such page here.")

    @app.get("/alive", response_class=PlainTextResponse)
    def alive() -> str:
        """The lightest page, behind the same guard: the benchmark's floor."""
        return "kit: serving\n"

    app.mount("/static", StaticFiles(directory=HERE / "static"), name="static")
    for name in PAGES:
        app.include_router(importlib.import_module(f"kit.web.pages.{name}").router)
    hosts = allowed_hosts(host, port) | frozenset(n for name in names for n in (name, f"{name}:{port}"))
    app.add_middleware(Guard, token=token, hosts=hosts, sessions=app.state.sessions, limit=upload_limit,
                       engine=engine, people=app.state.people)
    return app
