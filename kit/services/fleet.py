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


def load_particulars(engine: Engine, path: str | Path, source: str | None = None, actor=None) -> list[str]:
    """Check every vessel of ``path`` (see :func:`read_particulars`), then save them all in one
    transaction; return their ids. Each vessel records the file it came from: ``path``, or
    ``source`` where a face read a copy (a page's upload, saved in a temporary folder, is recorded
    by the name it was uploaded under)."""
    from dataclasses import replace

    from catalog_schema.engine import write_transaction
    from kit.services.audit import audit
    from kit.store.fleet_store import save_vessels
    from kit.store.vessel_ids import known_vessel_ids

    vessels = read_particulars(path)
    if source is not None:
        vessels = [replace(v, source=source) for v in vessels]

    def work(conn):
        before = known_vessel_ids(conn, [v.id for v in vessels])
        saved = save_vessels(conn, vessels)
        for vid in saved:
            audit(conn, actor, "load particulars", vid, {"stored": vid in before},
                  {"stored": True, "file": source or Path(path).name, "units": len(next(v for v in vessels if v.id == vid).units)})
        return saved

    return write_transaction(engine, work)


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
                   progress: Progress = no_progress, days: float = 0.0, actor=None) -> PartsRegistered:
    """Work out the vessels (all, or ``vessel_ids``) over ``days`` and add the generic part of
    everything they keep in one transaction (:func:`kit.engine.requirements.kept_parts`: the
    oil of a unit that is only topped up too, whatever ``days``)."""
    from catalog_schema.engine import write_transaction
    from kit.engine.requirements import kept_parts
    from kit.store.parts_store import register_parts as add_parts
    from kit.services.orders import assess_all, read_fleet

    vessels, policies = read_fleet(engine, vessel_ids, policy_file)
    items = [line for r in assess_all(vessels, days, policies, progress) for line in kept_parts(r)]
    from kit.services.audit import audit

    def work(conn):
        added = add_parts(conn, items)
        audit(conn, actor, "register parts", ", ".join(v.id for v in vessels) if len(vessels) <= 5 else f"{len(vessels)} vessels",
              None, {"parts": added.parts, "entries matched": added.entries_matched})
        return added

    done = write_transaction(engine, work)
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

    from catalog_schema.engine import read_transaction
    from kit.store.fleet_overview import fleet_glance

    with read_transaction(engine) as conn:
        return fleet_glance(conn, today or dt.date.today())


@dataclass(frozen=True)
class VesselStatus:
    """One vessel of the fleet page: its glance row, its gear's rule verdicts and what is short on
    board for a voyage of its policy's days of cover."""

    glance: object  # kit.store.fleet_overview.VesselGlance
    rules_not_met: int  # SOLAS II-1/29 rules judged "not met" over its units
    rules_not_shown: int  # rules the particulars do not show either way
    warnings: int  # the engine's warnings over its units (bad or doubtful particulars)
    days: float | None  # the days of cover checked (None: no policy with days of cover in force)
    short_lines: int | None  # lines short on board for those days (None when days is None)


@dataclass(frozen=True)
class FleetPage:
    rows: list[VesselStatus]
    total: int  # vessels matching the search, over all pages
    page: int  # 1-based, within 1..pages
    pages: int
    search: str


def fleet_page(engine: Engine, search: str = "", page: int = 1, per_page: int = 25, today=None,
               only: tuple[str, ...] | None = None) -> FleetPage:
    """One page of the fleet, sorted by id, for vessels whose id, name or ship type contains
    ``search`` (any letter case), among ``only`` (ids as stored; None: every vessel). Only the
    page's vessels are read and worked out (glance, rules, stock against their policy's days of
    cover), so a thousand vessels cost what one page does; the reading takes no write lock
    (:func:`catalog_schema.engine.read_transaction`), so pages asked for at once are worked out
    side by side."""
    import datetime as dt

    from catalog_schema.engine import read_transaction
    from kit.engine.preflight import lines_short
    from kit.engine.requirements import assess_vessel
    from kit.store.fleet_overview import fleet_glance, vessel_labels
    from kit.store.policy_store import cover_days_in_force, policies_in_force
    from kit.store.fleet_store import read_vessels
    from kit.store.order_sources import stock_on_board

    today = today or dt.date.today()
    among = None if only is None else set(only)
    with read_transaction(engine) as conn:
        found = [v.id for v in _matching(vessel_labels(conn), search) if among is None or v.id in among]
        page, pages, ids = _one_page(found, page, per_page)
        shown = fleet_glance(conn, today, ids) if ids else []
        vessels = {v.id: v for v in read_vessels(conn, ids)} if ids else {}
        policies = policies_in_force(conn, ids, today) if ids else {}
        cover = cover_days_in_force(conn, ids, today) if ids else {}
        on_board = stock_on_board(conn, ids) if ids else {}
    rows = []
    for g in shown:
        r = assess_vessel(vessels[g.id], float(cover.get(g.id) or 0), policies[g.id], today)
        verdicts = [rule.verdict for u in r.units for rule in u.checks.rules]
        days = cover.get(g.id)
        rows.append(VesselStatus(g, verdicts.count("not met"), verdicts.count("not shown"),
                                 sum(len(u.warnings) + len(u.checks.warnings) for u in r.units),
                                 None if days is None else float(days), None if days is None else lines_short(r, on_board)))
    return FleetPage(rows, len(found), page, pages, search)


def _matching(glance: list, search: str) -> list:
    """The rows (vessels' glance or labels) whose id, name or ship type contains ``search`` (any letter case)."""
    needle = search.strip().casefold()
    return [g for g in glance if not needle or any(needle in (t or "").casefold() for t in (g.id, g.name, g.ship_type))]


def _one_page(rows: list, page: int, per_page: int) -> tuple[int, int, list]:
    """``page`` brought within 1..pages, the number of pages, and that page's rows."""
    pages = max(1, -(-len(rows) // per_page))
    page = min(max(1, page), pages)
    return page, pages, rows[(page - 1) * per_page: page * per_page]


@dataclass(frozen=True)
class VesselsFound:
    """One page of the vessels to choose from (the order page's list): glance rows only, no vessel
    worked out, and only that page's vessels glanced at."""

    rows: list  # kit.store.fleet_overview.VesselGlance
    total: int  # vessels matching the search, over all pages
    page: int
    pages: int
    search: str


def find_vessels(engine: Engine, search: str = "", page: int = 1, per_page: int = 25, today=None) -> VesselsFound:
    """One page of the vessels whose id, name or ship type contains ``search`` (any letter case), sorted by id."""
    import datetime as dt

    from catalog_schema.engine import read_transaction
    from kit.store.fleet_overview import fleet_glance, vessel_labels

    with read_transaction(engine) as conn:  # the labels to find and page; the glance of that page's vessels only
        found = [v.id for v in _matching(vessel_labels(conn), search)]
        page, pages, ids = _one_page(found, page, per_page)
        shown = fleet_glance(conn, today or dt.date.today(), ids) if ids else []
    return VesselsFound(shown, len(found), page, pages, search)
