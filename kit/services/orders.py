# SPDX-License-Identifier: MIT
"""Orders: the bill of materials over vessels, and one vessel's pre-voyage check.

Each vessel is worked out under its own spares policy: a policy file for all of them when one is
given, else the policy in force today in the fleet database (the vessel's own, else its
company's, else kit's default). Consolidation then takes the oil packages from the first vessel's
policy (see :func:`kit.engine.bom.consolidate`).
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from typing import Iterable, Mapping

from sqlalchemy.engine import Connection, Engine

from kit.errors import ArgumentError
from kit.services import Progress, no_progress


def assess_all(vessels: list, days: float, policies: Mapping, progress: Progress = no_progress) -> list:
    """Each vessel over ``days`` from today under its policy in ``policies`` (by vessel id)."""
    from kit.engine.requirements import assess_vessel

    today = dt.date.today()
    return [assess_vessel(v, days, policies[v.id], today) for v in progress(vessels, "working out requirements")]


def _vessels(conn: Connection, vessel_ids: list[str], database: str) -> list:
    """The vessels asked for (all when none are; ids in any letter case), each known, at least one."""
    from kit.errors import InputError
    from kit.store.fleet_store import read_vessels
    from kit.store.vessel_ids import resolve_vessel_ids

    vessels = read_vessels(conn, list(dict.fromkeys(resolve_vessel_ids(conn, vessel_ids))) if vessel_ids else None)
    if not vessels:
        raise InputError(database, "vessels", "at least one vessel (load some with kit load PATH)", got="none")
    return vessels


def read_fleet(engine: Engine, vessel_ids: Iterable[str], policy_file: str | None) -> tuple[list, dict]:
    """The vessels (all, or ``vessel_ids``) and the spares policy of each by id: ``policy_file``
    for all when given, else each vessel's policy in force today in the fleet database."""
    from kit.store.policy_store import policies_in_force
    from kit.files.policy_file import load_policy

    from catalog_schema.engine import read_transaction

    ids = list(vessel_ids)
    with read_transaction(engine) as conn:
        vessels = _vessels(conn, ids, str(engine.url.database or engine.url))
        if policy_file is None:
            return vessels, policies_in_force(conn, [v.id for v in vessels], dt.date.today())
    policy = load_policy(policy_file)
    return vessels, {v.id: policy for v in vessels}


def build_order(engine: Engine | None, vessel_ids: Iterable[str], days: float, particulars: str | None = None,
                policy_file: str | None = None, progress: Progress = no_progress, to_order_only: bool = False) -> tuple:
    """The consolidated order (:class:`kit.engine.bom.Order`) and a line saying what it covers: the
    vessels of the fleet database (all, or ``vessel_ids``) less their stock on board, with the
    catalogue's offers, rates, preferred suppliers and deliveries; or, with ``particulars`` (a .toml
    file, a particulars workbook or a folder of both), those vessels alone (``engine`` unused, may be None), under ``policy_file`` (or kit's default), no stock counted
    and no database. ``to_order_only`` leaves out the lines with nothing to order."""
    from kit.services.bulk_work import without_cycle_collection

    with without_cycle_collection():  # every vessel's parts and lines, no cycles (see kit.services.bulk_work)
        order, scope = _build_order(engine, vessel_ids, days, particulars, policy_file, progress)
    if to_order_only:
        from kit.engine.bom import only_to_order

        return only_to_order(order), scope + ", only lines with something to order"
    return order, scope


def _build_order(engine, vessel_ids, days, particulars, policy_file, progress) -> tuple:
    from kit.engine.bom import consolidate

    if particulars:
        from kit.files.particulars_file import read_particulars
        from kit.files.policy_file import load_policy

        vessels = read_particulars(particulars)
        if vessel_ids:
            vessels = _chosen(vessels, vessel_ids, particulars)
        policy = load_policy(policy_file)
        results = assess_all(vessels, days, {v.id: policy for v in vessels}, progress)
        return consolidate(results), f"{len(vessels)} vessel(s) from {particulars}, no stock counted"
    vessels, policies = read_fleet(engine, vessel_ids, policy_file)
    results = assess_all(vessels, days, policies, progress)
    on_board, offers, purchasing = _order_sources(engine, [v.id for v in vessels], {li.key for r in results for li in r.lines})
    scope = "whole fleet" if not vessel_ids else "selected vessels"
    return (consolidate(results, on_board, offers, purchasing),
            f"{scope}, {len(vessels)} vessel(s), stock from the fleet database")


def _chosen(vessels: list, typed: Iterable[str], particulars: str) -> list:
    """The vessels of ``typed`` among those read from ``particulars``, in the file's order: an id
    matches in any letter case, as the fleet database matches it (:mod:`kit.store.vessel_ids`).
    :class:`ArgumentError` ("vessel id") for an id that matches none, or more than one."""
    from kit.store.vessel_ids import by_fold, matched_id

    stored = [vessel.id for vessel in vessels]
    exact, folded = set(stored), by_fold(stored)
    wanted = set()
    for vessel_id in typed:
        found = matched_id(vessel_id, exact, folded)
        if found is None:
            shown = sorted(exact)
            raise ArgumentError(str(particulars), "vessel id", "the id of a vessel in these particulars (letter case does not "
                                "matter): " + ", ".join(shown[:8]) + (f" and {len(shown) - 8} more" if len(shown) > 8 else ""),
                                got=repr(vessel_id))
        wanted.add(found)
    return [vessel for vessel in vessels if vessel.id in wanted]


def _order_sources(engine: Engine, vessel_ids: list[str], keys: set[str]) -> tuple:
    """Stock on board, every offer for ``keys`` and the purchasing records as of today, read in one
    transaction so they agree with each other."""
    from kit.store.order_sources import catalogue_offers, stock_on_board
    from catalog_schema.engine import read_transaction
    from kit.store.purchasing_store import purchasing_context

    with read_transaction(engine) as conn:
        return (stock_on_board(conn, vessel_ids), catalogue_offers(conn, keys),
                purchasing_context(conn, vessel_ids, dt.date.today()))


@dataclass(frozen=True)
class VoyageCheck:
    vessel: object  # the kit.engine.particulars.Vessel checked
    days: float
    short: object  # a kit.engine.bom.Order of the lines short (empty: everything is on board)
    full: object = None  # the vessel's whole kit.engine.bom.Order less its stock, every line short or not


def check_voyage(engine: Engine, vessel_id: str, days: float, policy_file: str | None = None) -> VoyageCheck:
    """``vessel_id``'s (any letter case) on-board stock against what a voyage of ``days`` needs."""
    from kit.engine.preflight import shortfall_of, vessel_order
    from kit.engine.requirements import assess_vessel

    (vessel,), policies = read_fleet(engine, [vessel_id], policy_file)
    result = assess_vessel(vessel, days, policies[vessel.id], dt.date.today())
    on_board, offers, purchasing = _order_sources(engine, [vessel.id], {li.key for li in result.lines})
    full = vessel_order(result, on_board, offers, purchasing)
    return VoyageCheck(vessel, days, shortfall_of(full), full)
