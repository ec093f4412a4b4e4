# SPDX-License-Identifier: MIT
"""Vessels and generic parts: load particulars, register parts, list parts, list the vessels, work out a vessel."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from sqlalchemy.engine import Engine

from kit.services import Progress, no_progress


def read_particulars(path: str | Path) -> list:
    """The vessels of ``path``: a .toml file, a particulars workbook (.xlsx) or a folder of both
    (:func:`kit.files.particulars_file.read_particulars`)."""
    from kit.files.particulars_file import read_particulars as read

    return read(path)


def load_particulars(engine: Engine, path: str | Path) -> list[str]:
    """Check every vessel of ``path`` (see :func:`read_particulars`), then save them all in one
    transaction; return their ids."""
    from catalog_schema.engine import write_transaction
    from kit.store.fleet_store import save_vessels

    vessels = read_particulars(path)
    return write_transaction(engine, lambda conn: save_vessels(conn, vessels))


def work_out(path: str | Path, days: float, policy_file: str | None = None):
    """One vessel's particulars file (.toml or a particulars workbook, see
    :func:`kit.files.particulars_file.read_file`) worked out over ``days`` under ``policy_file``
    (or kit's default policy): a :class:`kit.engine.requirements.VesselResult`. No database."""
    import datetime as dt

    from kit.engine.requirements import assess_vessel
    from kit.files.particulars_file import read_file
    from kit.files.policy_file import load_policy

    return assess_vessel(read_file(path), days, load_policy(policy_file), dt.date.today())


@dataclass(frozen=True)
class PartsRegistered:
    vessels: int
    parts: int  # distinct generic parts of those vessels (new or already there)
    entries_matched: int  # catalogue entries that matched one of them only now


def register_parts(engine: Engine, vessel_ids=(), policy_file: str | None = None,
                   progress: Progress = no_progress, days: float = 0.0) -> PartsRegistered:
    """Work out the vessels (all, or ``vessel_ids``) over ``days`` and add the generic part of
    everything they keep in one transaction (:func:`kit.engine.requirements.kept_parts`: the
    oil of a unit that is only topped up too, whatever ``days``)."""
    from catalog_schema.engine import write_transaction
    from kit.engine.requirements import kept_parts
    from kit.store.parts_store import register_parts as add_parts
    from kit.services.orders import assess_all, read_fleet

    vessels, policies = read_fleet(engine, vessel_ids, policy_file)
    items = [line for r in assess_all(vessels, days, policies, progress) for line in kept_parts(r)]
    done = write_transaction(engine, lambda conn: add_parts(conn, items))
    return PartsRegistered(len(vessels), done.parts, done.entries_matched)


def list_parts(engine: Engine, kind: str | None = None) -> list[tuple[str, str]]:
    """The generic parts (or those of ``kind``) as (key, designation)."""
    from kit.store.parts_store import list_parts as listed

    with engine.connect() as conn:
        return listed(conn, kind)


def list_vessels(engine: Engine, today=None) -> list:
    """The fleet at a glance, sorted by id: :class:`kit.store.fleet_overview.VesselGlance` rows with
    the units, last stock count and next delivery due on or after ``today`` (default today)."""
    import datetime as dt

    from kit.store.fleet_overview import fleet_glance

    with engine.connect() as conn:
        return fleet_glance(conn, today or dt.date.today())
