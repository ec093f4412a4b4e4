# SPDX-License-Identifier: MIT
"""Who may do what, asked by every page before it calls a service (:mod:`kit.engine.access`).

With people (the office server) a page asks :func:`require` with its action and, for an action on
one vessel, the vessel; a person whose role may not is refused with 403 and nothing runs. With no
people (one person on one PC, let in by the start token) everything is allowed, as at the command
line. :func:`actor_of` names who asks, for the audit trail.
"""

from __future__ import annotations

from kit.engine.access import allowed, sees_every_vessel


class Forbidden(Exception):
    """A signed-in person asked for something their role may not do."""

    def __init__(self, text: str):
        super().__init__(text)
        self.text = text


def person_of(request):
    """The signed-in person (kit.store.people.Person), or None for the one user of this PC."""
    session = getattr(request.state, "session", None)
    return getattr(session, "person", None)


def keeps(person, vessel_id: str) -> bool:
    """Whether ``person`` keeps the vessel (ids compared in any letter case, as kit takes them)."""
    folded = vessel_id.casefold()
    return any(v.casefold() == folded for v in person.vessels)


def may(request, action: str, vessel_id: str | None = None) -> bool:
    person = person_of(request)
    if person is None:
        return True
    return allowed(person.role, action, None if vessel_id is None else keeps(person, vessel_id))


def require(request, action: str, vessel_id: str | None = None) -> None:
    """Refuse (:class:`Forbidden`) unless the person asking may take ``action`` (on ``vessel_id``)."""
    if not may(request, action, vessel_id):
        person = person_of(request)
        on = f" on {vessel_id}" if vessel_id is not None else ""
        raise Forbidden(f"{person.name} ({person.login}) is a {person.role.replace('_', ' ')} and may not {action}{on}.")


def vessels_seen(request) -> tuple[str, ...] | None:
    """The vessels the person asking may see: None for every vessel, else the ones they keep."""
    person = person_of(request)
    if person is None or sees_every_vessel(person.role):
        return None
    return person.vessels


def actor_of(request):
    """Who asks, for the audit trail: the person signed in, or this PC's user by the start token."""
    from kit.services.audit import Actor, command_line

    person = person_of(request)
    return Actor(person.login if person is not None else command_line().person, "web")
