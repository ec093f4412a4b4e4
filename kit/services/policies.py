# SPDX-License-Identifier: MIT
"""The spares policy in force per company or vessel: set one, show the one in force."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

from sqlalchemy.engine import Engine

from kit.errors import ArgumentError


def check_policy_values(*, name: str, cover_days: int, company: str | None, vessel: str | None,
                        note: str | None) -> None:
    """Refuse values a policy cannot be set from, by neutral names (:class:`ArgumentError`; the
    command line names its options for them)."""
    from kit.files.numbers import MAX_DAYS
    from kit.files.safe_text import checked_text

    if (company is None) == (vessel is None):
        raise ArgumentError("", "company or vessel", "exactly one of the two", got="both" if company else "neither")
    if not 0 <= cover_days <= MAX_DAYS:
        raise ArgumentError("", "days of cover", f"a whole number of days from 0 to {MAX_DAYS}", got=repr(cover_days))
    for field, text in (("policy name", name), ("company", company), ("vessel", vessel), ("note", note)):
        if text is not None:
            checked_text(text, source="", field=field, error=ArgumentError)


def set_policy(engine: Engine, *, name: str, cover_days: int, in_force_from: dt.date, company: str | None = None,
               vessel: str | None = None, note: str | None = None, policy_file: str | None = None,
               actor=None) -> None:
    """Record a policy for one company or one vessel from ``in_force_from``; with ``policy_file``
    its content is stored too, checked first (see :func:`kit.store.policy_store.set_policy`)."""
    from catalog_schema.engine import write_transaction
    from kit.store.policy_store import set_policy as record
    from kit.files.policy_file import read_policy_text

    content = read_policy_text(policy_file) if policy_file else None
    check_policy_values(name=name, cover_days=cover_days, company=company, vessel=vessel, note=note)
    from kit.store.vessel_ids import resolve_vessel_id

    from kit.services.audit import audit

    def work(conn):
        stored_vessel = vessel and resolve_vessel_id(conn, vessel)
        record(conn, name=name, cover_days=cover_days, in_force_from=in_force_from, company=company,
               vessel=stored_vessel, note=note, content=content, content_source=str(policy_file))
        audit(conn, actor, "set policy", stored_vessel or company, None,
              {"name": name, "days of cover": cover_days, "in force from": in_force_from.isoformat(), "note": note,
               "content": "kit's default" if content is None else f"from {Path(str(policy_file)).name}"})

    write_transaction(engine, work)


@dataclass(frozen=True)
class PolicyShown:
    vessel: str
    on: dt.date
    record: object  # the kit.store.policy_store.PolicyInForce, or None: no policy in force, so kit's default
    rules: object  # the kit.engine.spares.Policy it says, checked


def show_policy(engine: Engine, vessel: str, on: dt.date | None = None) -> PolicyShown:
    """The spares policy in force for ``vessel`` (any letter case) on ``on`` (default today): its own,
    else its company's, else kit's default."""
    from kit.store.policy_store import policy_in_force
    from kit.files.policy_file import load_policy

    day = on or dt.date.today()
    from kit.store.vessel_ids import resolve_vessel_id

    with engine.connect() as conn:
        vessel = resolve_vessel_id(conn, vessel)
        found = policy_in_force(conn, vessel, day)
    return PolicyShown(vessel, day, found, load_policy() if found is None else found.policy())


@dataclass(frozen=True)
class CoverDays:
    """The days an order or check covers when none are given: the largest days of cover of the
    vessels' policies in force, and each vessel's (so a face can say when they differ)."""

    days: int
    by_vessel: dict[str, int]

    @property
    def differ(self) -> bool:
        return len(set(self.by_vessel.values())) > 1

    def explained(self) -> str:
        """The days taken, and why: "120 days, the largest days of cover of the spares policies in
        force (120 for A; 90 for B, C, D and 2 more)" where the vessels' policies differ, else
        "90 days, the days of cover of the spares policy in force"."""
        if not self.differ:
            return f"{self.days} days, the days of cover of the spares policy in force"
        groups: dict[int, list[str]] = {}
        for vessel, d in sorted(self.by_vessel.items()):
            groups.setdefault(d, []).append(vessel)
        each = "; ".join(f"{d} for {', '.join(ids[:3])}" + (f" and {len(ids) - 3} more" if len(ids) > 3 else "")
                         for d, ids in sorted(groups.items(), reverse=True))
        return f"{self.days} days, the largest days of cover of the spares policies in force ({each})"


NO_COVER_IN_FILES = ("a number of days (a spares policy file holds no days of cover; kit policy set "
                     "records them in the fleet database)")


def days_of_cover(engine: Engine, vessel_ids=(), *, particulars: str | None = None,
                  policy_file: str | None = None) -> CoverDays:
    """The days of cover of the spares policies in force today for ``vessel_ids`` (all vessels
    when none), the largest where they differ. A policy file (``policy_file``, or kit's default
    with ``particulars``) states no days of cover, nor does kit's default policy, so those, and a
    vessel with no policy in force, are refused by the neutral name "days" (:class:`ArgumentError`)."""
    from kit.errors import InputError
    from kit.store.policy_store import cover_days_in_force
    from kit.store.vessel_ids import resolve_vessel_ids

    if particulars or policy_file:
        raise ArgumentError("", "days", NO_COVER_IN_FILES)
    from catalog_schema.engine import read_transaction

    with read_transaction(engine) as conn:
        ids = list(dict.fromkeys(resolve_vessel_ids(conn, vessel_ids))) if vessel_ids else None
        found = cover_days_in_force(conn, ids, dt.date.today())
    if not found:
        raise InputError(str(engine.url.database or engine.url), "vessels",
                         "at least one vessel (load some with kit load PATH)", got="none")
    without = [v for v, days in found.items() if days is None]
    if without:
        raise ArgumentError("", "days", f"a number of days (no spares policy with days of cover is in force for "
                            f"{without[0]}" + (f" and {len(without) - 1} other vessel(s)" if len(without) > 1 else "")
                            + "; kit policy set records one)")
    days = {v: d for v, d in found.items() if d is not None}
    return CoverDays(max(days.values()), days)
