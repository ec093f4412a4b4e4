# SPDX-License-Identifier: MIT
"""What a successful POST did, kept for the page the browser is sent to next.

After a form is sent the browser is redirected (303) to a GET page (post/redirect/get, so a reload
sends nothing twice). What the action reported, such as an import's unmatched rows, is kept here
under a random key that the redirect carries (``?done=KEY``); only the session that made it can
read it back, and only the last :data:`KEPT` results are kept, in this process.
"""

from __future__ import annotations

import secrets
import threading
from collections import OrderedDict

KEPT = 256  # results kept for all sessions together; the oldest goes first


class Notices:
    def __init__(self, kept: int = KEPT):
        self._kept = kept
        self._by_key: OrderedDict[str, tuple[object, object]] = OrderedDict()
        self._lock = threading.Lock()  # sync pages run in a thread pool

    def put(self, session, value) -> str:
        key = secrets.token_urlsafe(16)
        with self._lock:
            self._by_key[key] = (session, value)
            while len(self._by_key) > self._kept:
                self._by_key.popitem(last=False)
        return key

    def get(self, session, key: str | None):
        """The value kept under ``key`` for ``session``, or None (unknown, expired or another's)."""
        with self._lock:
            found = self._by_key.get(key) if key else None
        # a session's CSRF token is its own secret: the same session asks, whether its object is
        # this process's (start token) or made afresh for each request from the database (people)
        return found[1] if found is not None and session is not None and found[0].csrf == session.csrf else None


def notices(request) -> Notices:
    """The application's notices (made on first use)."""
    state = request.app.state
    with _MAKING:
        if getattr(state, "notices", None) is None:
            state.notices = Notices()
    return state.notices


_MAKING = threading.Lock()


def redirect_with(request, path: str, value):
    """A 303 to ``path`` carrying the key of ``value``, kept for this request's session."""
    from fastapi.responses import RedirectResponse

    key = notices(request).put(request.state.session, value)
    return RedirectResponse(f"{path}?done={key}", status_code=303)


def notice_of(request, key: str | None):
    """What the action whose key the address carries reported, or None."""
    return notices(request).get(getattr(request.state, "session", None), key)
