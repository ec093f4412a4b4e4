# SPDX-License-Identifier: MIT
"""The pages' templates and what every page shows.

Jinja2 with autoescaping on for every template: a vessel name, supplier name or remark stored
with ``<script>`` in it is shown as text, never run. Every page gets the navigation, the safety
caution (:data:`kit.safety.SAFETY`) and its session's CSRF token for its forms.
"""

from __future__ import annotations

from functools import lru_cache
from pathlib import Path

from kit.safety import SAFETY

HERE = Path(__file__).resolve().parent
# (path, label, the action that shows it) of the pages named in the navigation bar, in the order a user meets them
NAVIGATION = (("/", "Fleet", "view fleet"), ("/order", "Order", "view order"), ("/suppliers", "Suppliers", "view suppliers"),
              ("/particulars", "Particulars", "view particulars"), ("/audit", "Audit trail", "view audit"))


@lru_cache(maxsize=1)
def environment():
    from jinja2 import Environment, FileSystemLoader, StrictUndefined, select_autoescape

    env = Environment(loader=FileSystemLoader(HERE / "templates"), autoescape=select_autoescape(default=True),
                      undefined=StrictUndefined, trim_blocks=True, lstrip_blocks=True)
    env.filters["number"] = number
    env.filters["date"] = lambda d: "" if d is None else d.isoformat()
    return env


def number(value, places: int = 1) -> str:
    """A figure as a reader wants it on a page: thousands separated, ``places`` decimals, and an
    en dash where there is none."""
    if value is None:
        return "\u2013"
    if isinstance(value, int):
        return f"{value:,}"
    return f"{value:,.{places}f}"


def render(template: str, request=None, **values) -> str:
    """``template`` filled with ``values`` and what every page shows."""
    from kit.engine.access import allowed

    session = getattr(getattr(request, "state", None), "session", None) if request is not None else None
    path = request.url.path if request is not None else ""
    person = getattr(session, "person", None)
    navigation = [] if session is None else [(p, label) for p, label, action in NAVIGATION
                                             if person is None or allowed(person.role, action)]
    return environment().get_template(template).render(
        safety=SAFETY, navigation=navigation, here=path, csrf=session.csrf if session else "", person=person, **values)


def page(template: str, request, status: int = 200, **values):
    """A whole page as a response."""
    from fastapi.responses import HTMLResponse

    return HTMLResponse(render(template, request, **values), status_code=status)


def refusal_page(status: int, text: str, request=None) -> str:
    """The page for a refused request: its status and the one sentence that says why."""
    return render("refused.html", request, status=status, text=text)
