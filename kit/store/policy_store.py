# SPDX-License-Identifier: MIT
"""The spares policy in force per company or per vessel, kept in the fleet database.

A policy row names the policy (e.g. a company policy file), the days of cover it asks for, the
date it is in force from and its content: the company policy file's TOML text, validated by
:mod:`kit.engine.spares` before it is stored (null: kit's default policy). For a vessel on a date, its
own latest policy in force wins; without one, its company's; without either, kit's default.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from sqlalchemy import select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import SPARES_POLICIES
from catalog_schema.sql import upsert
from kit.store.fleet_store import VESSELS, company_id, vessel_company
from kit.engine.spares import Policy
from kit.files.policy_file import policy_from_text

POLICIES = SPARES_POLICIES


@dataclass(frozen=True)
class PolicyInForce:
    scope: str  # "vessel" or "company"
    name: str
    cover_days: int
    in_force_from: dt.date
    note: str | None
    content: str | None = None  # the company policy file's TOML; None = kit's default

    def policy(self) -> Policy:
        """The policy this row says, as kit works with it (a row stored by another program is
        validated here again, and refused with the row named)."""
        source = f"fleet database: {self.name}, {self.scope} policy from {self.in_force_from.isoformat()}"
        return policy_from_text(self.content, source if self.content is not None else source + "; no content stored, so kit's default")


def set_policy(conn: Connection, *, name: str, cover_days: int, in_force_from: dt.date,
               company: str | None = None, vessel: str | None = None, note: str | None = None,
               content: str | None = None, content_source: str = "kit policy set") -> None:
    """Record a policy for exactly one company or one vessel (replacing one of the same date).

    ``content`` (a company policy file's TOML text) is validated first; a policy that does not
    parse or validate is refused with ``content_source`` (the file) named. The other values are
    checked by the caller (:func:`kit.services.policies.set_policy`).
    """
    if content is not None:
        policy_from_text(content, content_source)
    if vessel is not None:
        vessel_company(conn, vessel)  # the vessel must exist
    row = {"company_id": company_id(conn, company), "vessel_id": vessel, "name": name, "cover_days": cover_days,
           "in_force_from": in_force_from, "note": note, "content": content}
    scope = ["vessel_id" if vessel is not None else "company_id", "in_force_from"]
    conn.execute(upsert(conn, POLICIES, scope, update=["name", "cover_days", "note", "content"]), [row])


def policy_in_force(conn: Connection, vessel_id: str, on: dt.date) -> PolicyInForce | None:
    """The vessel's policy on date ``on``, else its company's, else None (:class:`kit.errors.UnknownVesselError`
    for a vessel not in the database)."""
    company = vessel_company(conn, vessel_id)
    for scope, column, value in (("vessel", POLICIES.c.vessel_id, vessel_id), ("company", POLICIES.c.company_id, company)):
        if value is None:
            continue
        row = conn.execute(select(POLICIES).where(column == value, POLICIES.c.in_force_from <= on)
                           .order_by(POLICIES.c.in_force_from.desc()).limit(1)).first()
        if row is not None:
            return PolicyInForce(scope, row.name, row.cover_days, row.in_force_from, row.note, row.content)
    return None


def policies_in_force(conn: Connection, vessel_ids: list[str], on: dt.date) -> dict[str, Policy]:
    """Each vessel's spares policy on date ``on``: its own, else its company's, else kit's default.

    Two queries for any number of vessels (the vessels' companies, and every policy in force by
    ``on``), the same choice as :func:`policy_in_force` makes one vessel at a time. Vessels under
    the same stored policy share one :class:`Policy` object.
    """
    ids = list(vessel_ids)
    company_of = dict(conn.execute(select(VESSELS.c.id, VESSELS.c.company_id).where(VESSELS.c.id.in_(ids))).all()) if ids else {}
    latest: dict[tuple[str, object], PolicyInForce] = {}
    rows = conn.execute(select(POLICIES).where(POLICIES.c.in_force_from <= on).order_by(POLICIES.c.in_force_from))
    for row in rows:  # ascending, so the last one seen per scope is the one in force
        scope = ("vessel", row.vessel_id) if row.vessel_id is not None else ("company", row.company_id)
        latest[scope] = PolicyInForce(scope[0], row.name, row.cover_days, row.in_force_from, row.note, row.content)
    built: dict[tuple, Policy] = {}
    out = {}
    for vessel_id in ids:
        found = latest.get(("vessel", vessel_id)) or latest.get(("company", company_of.get(vessel_id)))
        key = None if found is None else (found.scope, found.name, found.in_force_from, found.content)
        if key not in built:
            built[key] = policy_from_text(None) if found is None else found.policy()
        out[vessel_id] = built[key]
    return out
