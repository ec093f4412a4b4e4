# SPDX-License-Identifier: MIT
"""The spares policy in force per company or per vessel, kept in the fleet database.

A policy row names the policy (e.g. a company policy file), the days of cover it asks for, and
the date it is in force from. For a vessel on a date, its own latest policy in force wins;
without one, its company's.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from sqlalchemy import select
from sqlalchemy.engine import Connection

from catalog_schema.sql import upsert
from catalog_schema.tables import SparesPolicyRow
from kit.errors import InputError
from kit.fleet_store import COMPANIES, VESSELS, company_id

POLICIES = SparesPolicyRow.__table__


@dataclass(frozen=True)
class PolicyInForce:
    scope: str  # "vessel" or "company"
    name: str
    cover_days: int
    in_force_from: dt.date
    note: str | None


def set_policy(conn: Connection, *, name: str, cover_days: int, in_force_from: dt.date,
               company: str | None = None, vessel: str | None = None, note: str | None = None) -> None:
    """Record a policy for exactly one company or one vessel (replacing one of the same date)."""
    if (company is None) == (vessel is None):
        raise InputError("kit policy set", "--company/--vessel", "exactly one of the two", got="both" if company else "neither")
    if cover_days < 0:
        raise InputError("kit policy set", "--days", "a whole number of days >= 0", got=repr(cover_days))
    if vessel is not None and conn.execute(select(VESSELS.c.id).where(VESSELS.c.id == vessel)).first() is None:
        raise InputError("kit policy set", "--vessel", "the id of a vessel in the database (kit load adds them)", got=repr(vessel))
    row = {"company_id": company_id(conn, company), "vessel_id": vessel, "name": name, "cover_days": cover_days,
           "in_force_from": in_force_from, "note": note}
    scope = ["vessel_id" if vessel is not None else "company_id", "in_force_from"]
    conn.execute(upsert(conn, POLICIES, scope, update=["name", "cover_days", "note"]), [row])


def policy_in_force(conn: Connection, vessel_id: str, on: dt.date) -> PolicyInForce | None:
    """The vessel's policy on date ``on``, else its company's, else None."""
    vessel = conn.execute(select(VESSELS.c.company_id).where(VESSELS.c.id == vessel_id)).first()
    if vessel is None:
        raise InputError("kit policy show", "--vessel", "the id of a vessel in the database", got=repr(vessel_id))
    for scope, column, value in (("vessel", POLICIES.c.vessel_id, vessel_id), ("company", POLICIES.c.company_id, vessel.company_id)):
        if value is None:
            continue
        row = conn.execute(select(POLICIES).where(column == value, POLICIES.c.in_force_from <= on)
                           .order_by(POLICIES.c.in_force_from.desc()).limit(1)).first()
        if row is not None:
            return PolicyInForce(scope, row.name, row.cover_days, row.in_force_from, row.note)
    return None
