# SPDX-License-Identifier: MIT
"""Vessel ids as a user types them: matched to the stored id whatever the letter case.

Every service that takes a vessel id from a user (``kit check ID``, ``--vessel``, a stock count,
``kit policy``) resolves it here first, so ``corvina-bay`` finds ``CORVINA-BAY`` everywhere alike.
Two stored ids that differ only in letter case would make that ambiguous, so loading the second
is refused (:func:`refuse_case_twins`). Letter case is compared by Python's ``str.casefold`` on the
ids read back, not by SQL ``lower()``, which SQLite applies to ASCII letters only.
"""

from __future__ import annotations

from typing import Container, Iterable

from sqlalchemy import select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import VESSELS
from catalog_schema.sql import in_batches
from kit.errors import InputError, UnknownVesselError


def by_fold(ids: Iterable[str]) -> dict[str, list[str]]:
    """``ids`` by their case-folded form."""
    found: dict[str, list[str]] = {}
    for vessel_id in ids:
        found.setdefault(vessel_id.casefold(), []).append(vessel_id)
    return found


def matched_id(typed: str, exact: Container[str], folded: dict[str, list[str]]) -> str | None:
    """The id ``typed`` names: itself when it is among ``exact``, else the one id of ``folded``
    (:func:`by_fold`) equal to it but for letter case; None when none is, or more than one."""
    if typed in exact:
        return typed
    matches = folded.get(typed.casefold(), [])
    return matches[0] if len(matches) == 1 else None


def _stored_by_fold(conn: Connection) -> dict[str, list[str]]:
    """Every stored id by its case-folded form (one query; a fleet's ids are a few thousand at most)."""
    return by_fold(conn.execute(select(VESSELS.c.id).order_by(VESSELS.c.id)).scalars())


def resolve_vessel_ids(conn: Connection, typed: Iterable[str]) -> list[str]:
    """The stored id of each id in ``typed``, in order: the id itself when stored as typed, else the
    one stored id equal to it but for letter case. :class:`UnknownVesselError` names the first id
    as typed that matches none (or, in a database written before the refusal of case twins, more
    than one)."""
    wanted = list(typed)
    exact: set[str] = set()
    for chunk in in_batches(conn, sorted(set(wanted))):
        exact.update(conn.execute(select(VESSELS.c.id).where(VESSELS.c.id.in_(chunk))).scalars())
    if all(v in exact for v in wanted):
        return wanted
    folded = _stored_by_fold(conn)
    out = []
    for vessel_id in wanted:
        found = matched_id(vessel_id, exact, folded)
        if found is None:
            raise UnknownVesselError(vessel_id)
        out.append(found)
    return out


def resolve_vessel_id(conn: Connection, typed: str) -> str:
    """The stored id of ``typed`` (see :func:`resolve_vessel_ids`)."""
    return resolve_vessel_ids(conn, [typed])[0]


def refuse_case_twins(conn: Connection, vessels: Iterable) -> None:
    """Refuse vessels (``id`` and ``source`` attributes) whose id differs only in letter case from
    a stored vessel's or another's of the same load, naming both ids, before anything is written."""
    stored = {fold: ids[0] for fold, ids in _stored_by_fold(conn).items()}
    for v in vessels:
        other = stored.setdefault(v.id.casefold(), v.id)
        if other != v.id:
            raise InputError(v.source or f"vessel {v.id}", "vessel.id",
                             f"an id that differs from vessel {other!r} by more than letter case "
                             "(kit matches vessel ids whatever the case)", got=repr(v.id))


def known_vessel_ids(conn: Connection, ids: Iterable[str]) -> set[str]:
    """Those of ``ids`` (exactly as stored) the database holds."""
    from sqlalchemy import select

    from catalog_schema.core_tables import VESSELS

    wanted = list(dict.fromkeys(ids))
    return set(conn.execute(select(VESSELS.c.id).where(VESSELS.c.id.in_(wanted))).scalars()) if wanted else set()
