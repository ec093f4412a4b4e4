# SPDX-License-Identifier: MIT
"""Gathering an order: vessels from the database (or particulars files), the engine over each,
then stock and catalogue offers, consolidated. The glue between the commands and the engine.

Each vessel is worked out under its own spares policy: a ``--policy`` file for all of them when
one is given, else the policy in force today in the fleet database (the vessel's own, else its
company's, else kit's default). Consolidation then takes the oil packages from the first vessel's
policy (see :func:`kit.bom.consolidate`).
"""

from __future__ import annotations

import sys
from typing import Iterable, Mapping

from sqlalchemy.engine import Engine

from kit.bom import Order, consolidate
from kit.errors import InputError
from kit.requirements import VesselResult, assess_vessel
from kit.spares import Policy, load_policy


def _progress(items: list, label: str) -> Iterable:
    """Yield ``items``, with a progress bar on stderr when it is a terminal and the work is long."""
    if len(items) < 5 or not sys.stderr.isatty():
        yield from items
        return
    from rich.progress import track

    from rich.console import Console

    yield from track(items, description=label, console=Console(stderr=True), transient=True)


def assess_all(vessels: list, days: float, policies: Mapping[str, Policy]) -> list[VesselResult]:
    """Each vessel over ``days`` under its policy in ``policies`` (by vessel id)."""
    return [assess_vessel(v, days, policies[v.id]) for v in _progress(vessels, "working out requirements")]


def vessel_policies(engine: Engine, vessel_ids: Iterable[str], policy_file: str | None) -> dict[str, Policy]:
    """The spares policy per vessel: ``policy_file`` for all when given, else each vessel's policy
    in force today in the fleet database (its own, else its company's, else kit's default)."""
    ids = list(vessel_ids)
    if policy_file is not None:
        policy = load_policy(policy_file)
        return {v: policy for v in ids}
    import datetime as dt

    from kit.policy_store import policies_in_force

    with engine.connect() as conn:
        return policies_in_force(conn, ids, dt.date.today())


def load_fleet(engine: Engine, vessel_ids: Iterable[str]) -> list:
    from kit.fleet_store import read_vessels

    ids = list(vessel_ids)
    with engine.connect() as conn:
        vessels = read_vessels(conn, ids or None)
    missing = sorted(set(ids) - {v.id for v in vessels})
    if missing:
        raise InputError("--vessel", "vessel", "the id of a vessel in the fleet database (kit load adds them)", got=repr(missing[0]))
    if not vessels:
        raise InputError(str(engine.url.database or engine.url), "vessels", "at least one vessel (load some with kit load PATH)", got="none")
    return vessels


def build_order(engine: Engine, vessel_ids: Iterable[str], days: float, particulars: str | None,
                policy_file: str | None) -> tuple[Order, str]:
    """The consolidated order and a line saying what it covers."""
    if particulars:
        from pathlib import Path

        from kit.particulars import load_folder, load_vessel

        path = Path(particulars)
        vessels = load_folder(path) if path.is_dir() else [load_vessel(path)]
        if vessel_ids:
            vessels = [v for v in vessels if v.id in set(vessel_ids)]
        policy = load_policy(policy_file)
        return consolidate(assess_all(vessels, days, {v.id: policy for v in vessels})), f"{len(vessels)} vessel(s) from {particulars}, no stock counted"
    from kit.order_sources import catalogue_offers, stock_on_board

    vessels = load_fleet(engine, vessel_ids)
    results = assess_all(vessels, days, vessel_policies(engine, [v.id for v in vessels], policy_file))
    with engine.connect() as conn:
        on_board = stock_on_board(conn, [v.id for v in vessels])
        offers = catalogue_offers(conn, {li.key for r in results for li in r.lines})
    scope = "whole fleet" if not vessel_ids else "selected vessels"
    return consolidate(results, on_board, offers), f"{scope}, {len(vessels)} vessel(s), stock from the fleet database"
