# SPDX-License-Identifier: MIT
"""Who may do what on the office server: the roles and the actions each may take.

Pure: the faces ask :func:`allowed` before they call a service, with the person's role and, for
an action on one vessel, whether that person keeps the vessel. The roles (names of our own):

``administrator``  people, spares policies, particulars; reads everything, reads the audit trail
``buyer``          catalogues, replies, exchange rates, preferred suppliers, deliveries, orders and
                   enquiries; reads everything
``vessel_keeper``  stock counts and filter hours of the vessels assigned to them, and their
                   pre-voyage check; reads those vessels only
``reader``         reads everything, changes nothing

Least privilege: no role holds another's changes (an administrator does not count a ship's
stock, a buyer does not change particulars), so each change in the audit trail was made by the
role responsible for it. A single person on one PC with the start token (no people in the
database) is outside this table: that is the command line's trust, on a page.
"""

from __future__ import annotations

ROLES = ("administrator", "buyer", "vessel_keeper", "reader")

# action -> roles that may take it. Actions on one vessel ("vessel" in VESSEL_ACTIONS) also need a
# vessel keeper to keep that vessel; the other roles take them on any vessel.
ACTIONS: dict[str, frozenset[str]] = {
    "view fleet": frozenset(ROLES),
    "view vessel": frozenset(ROLES),
    "view check": frozenset(ROLES),
    "download count sheet": frozenset(ROLES),
    "download check": frozenset(ROLES),
    "count stock": frozenset({"vessel_keeper"}),
    "record filter hours": frozenset({"vessel_keeper"}),
    "view order": frozenset({"administrator", "buyer", "reader"}),
    "download order": frozenset({"administrator", "buyer", "reader"}),
    "write enquiries": frozenset({"buyer"}),
    "view suppliers": frozenset({"administrator", "buyer", "reader"}),
    "import catalogue": frozenset({"buyer"}),
    "read reply": frozenset({"buyer"}),
    "set rates": frozenset({"buyer"}),
    "prefer supplier": frozenset({"buyer"}),
    "set delivery": frozenset({"buyer"}),
    "view particulars": frozenset({"administrator", "buyer", "reader"}),
    "load particulars": frozenset({"administrator"}),
    "set policy": frozenset({"administrator"}),
    "manage people": frozenset({"administrator"}),
    "view audit": frozenset({"administrator"}),
}
VESSEL_ACTIONS = frozenset({"view vessel", "view check", "download count sheet", "download check",
                            "count stock", "record filter hours"})


def allowed(role: str, action: str, keeps_vessel: bool | None = None) -> bool:
    """Whether a person of ``role`` may take ``action``; for an action on one vessel, a vessel
    keeper only on a vessel they keep (``keeps_vessel``). An unknown action is refused, never
    allowed by default."""
    if action not in ACTIONS:
        raise KeyError(f"unknown action {action!r}")
    if role not in ACTIONS[action]:
        return False
    if role == "vessel_keeper" and action in VESSEL_ACTIONS:
        return bool(keeps_vessel)
    return True


def sees_every_vessel(role: str) -> bool:
    """Whether the fleet a person sees is the whole fleet (else only the vessels they keep)."""
    return role != "vessel_keeper"
