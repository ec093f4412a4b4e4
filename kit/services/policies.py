# SPDX-License-Identifier: MIT
"""The spares policy in force per company or vessel: set one, show the one in force."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from sqlalchemy.engine import Engine


def set_policy(engine: Engine, *, name: str, cover_days: int, in_force_from: dt.date, company: str | None = None,
               vessel: str | None = None, note: str | None = None, policy_file: str | None = None) -> None:
    """Record a policy for one company or one vessel from ``in_force_from``; with ``policy_file``
    its content is stored too, checked first (see :func:`kit.store.policy_store.set_policy`)."""
    from catalog_schema.engine import write_transaction
    from kit.store.policy_store import set_policy as record
    from kit.engine.spares import read_policy_text

    content = read_policy_text(policy_file) if policy_file else None
    write_transaction(engine, lambda conn: record(conn, name=name, cover_days=cover_days, in_force_from=in_force_from,
                                                  company=company, vessel=vessel, note=note,
                                                  content=content, content_source=str(policy_file)))


@dataclass(frozen=True)
class PolicyShown:
    vessel: str
    on: dt.date
    record: object  # the kit.store.policy_store.PolicyInForce, or None: no policy in force, so kit's default
    rules: object  # the kit.engine.spares.Policy it says, checked


def show_policy(engine: Engine, vessel: str, on: dt.date | None = None) -> PolicyShown:
    """The spares policy in force for ``vessel`` on ``on`` (default today): its own, else its
    company's, else kit's default."""
    from kit.store.policy_store import policy_in_force
    from kit.engine.spares import load_policy

    day = on or dt.date.today()
    with engine.connect() as conn:
        found = policy_in_force(conn, vessel, day)
    return PolicyShown(vessel, day, found, load_policy() if found is None else found.policy())
