# SPDX-License-Identifier: MIT
"""One vessel as a face shows it whole (the vessel page): its particulars worked out, its stock on
board and what a voyage needs; the pre-voyage check for a number of days; and a count typed in
place recorded as a count sheet's import would record it.

Every figure comes from the same services and engine functions as the command line's (``kit
calc``'s :class:`kit.engine.requirements.VesselResult`, ``kit check``'s
:func:`kit.services.orders.check_voyage`, ``kit template stock --vessel``'s
:func:`kit.services.templates.count_sheet`), so a page and a terminal never disagree.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from typing import Any, Sequence

from sqlalchemy.engine import Engine


@dataclass(frozen=True)
class VesselView:
    """What the vessel page shows of one vessel."""

    vessel: Any  # the kit.engine.particulars.Vessel, as stored
    report: dict  # the result as kit calc --json gives it (kit.engine.report.vessel_json), control characters made visible
    days: float  # the period worked out: the days of cover of the policy in force, else 0 (as kit calc's default)
    cover_days: int | None  # the days of cover of the policy in force (None: it states none)
    count: Any  # its kit.files.stock_sheet.CountSheet (stock on board per part and location, filter hours), or None
    count_refused: str | None  # why there is no count sheet (a part it keeps is not registered), else None
    short_lines: int | None  # lines short for a voyage of ``cover_days`` (None without days of cover)


def vessel_view(engine: Engine, vessel_id: str, today: dt.date | None = None) -> VesselView:
    """``vessel_id`` (any letter case) worked out over the days of cover of its spares policy in
    force (0 days when the policy states none), with its count sheet for those days and the number
    of lines short for them. :class:`kit.errors.UnknownVesselError` for an id the database lacks."""
    from catalog_schema.engine import read_transaction
    from kit.engine.preflight import lines_short
    from kit.engine.report import vessel_json
    from kit.engine.requirements import assess_vessel
    from kit.errors import InputError
    from kit.files.safe_text import each_text, visible
    from kit.services.orders import read_fleet
    from kit.services.templates import count_sheet_of
    from kit.store.order_sources import stock_on_board
    from kit.store.policy_store import cover_days_in_force

    today = today or dt.date.today()
    (vessel,), policies = read_fleet(engine, [vessel_id], None)
    count, refused = None, None
    # one read without the write lock: the vessel worked out once for the page, its count sheet
    # and its lines short (offers choose who sells a line, never whether it is short)
    with read_transaction(engine) as conn:
        cover = cover_days_in_force(conn, [vessel.id], today).get(vessel.id)
        days = float(cover or 0)
        result = assess_vessel(vessel, days, policies[vessel.id], today)
        try:
            count = count_sheet_of(conn, result, today)
        except InputError as exc:  # a part it keeps is not registered yet: the rest of the page still shows
            refused = str(exc)
        on_board = stock_on_board(conn, [vessel.id])
    short = None if cover is None else lines_short(result, on_board)
    return VesselView(vessel, each_text(vessel_json(result), visible), days, cover, count, refused, short)


def voyage_check(engine: Engine, vessel_id: str, days: float | None = None):
    """``kit check``'s pre-voyage check (:func:`kit.services.orders.check_voyage`) of ``vessel_id``
    for ``days``, by default the days of cover of its spares policy in force (as ``kit check``
    defaults, :func:`kit.services.policies.days_of_cover`)."""
    from kit.services.orders import check_voyage
    from kit.services.policies import days_of_cover

    if days is None:
        days = days_of_cover(engine, [vessel_id]).days
    return check_voyage(engine, vessel_id, float(days))


def record_counts(engine: Engine, vessel_id: str, counts: Sequence[tuple[str, str | None, Any]],
                  counted_on: Any = None, location: str | None = None,
                  hours: Sequence[tuple[str, str, Any]] = (), actor=None):
    """Record a count of ``vessel_id``'s stock typed in place: ``counts`` (part key, location or
    None, what was counted; blank: not counted), counted on ``counted_on`` (blank: today), parts
    with no location at ``location``; and ``hours`` (unit, position, running hours since the
    filter change). The same checks as a count sheet's import (:func:`kit.files.stock_sheet.read_count_entries`)
    and the same writer (:func:`kit.store.stock_import.write_stock`): plain non-negative finite
    numbers within bounds, known parts and filter positions, a date not after today; all or
    nothing. Returns a :class:`kit.store.stock_import.StockReport`."""
    from catalog_schema.engine import write_transaction
    from kit.files.stock_sheet import read_count_entries
    from kit.store.stock_import import write_stock
    from kit.store.vessel_ids import resolve_vessel_id

    from kit.services.audit import audit, stock_snapshot

    def work(conn):
        vessel = resolve_vessel_id(conn, vessel_id)
        stock = read_count_entries(f"count of {vessel}", counts, counted_on, location, hours)
        before = stock_snapshot(conn, vessel)
        report = write_stock(conn, stock, vessel)
        if report.rows or report.filter_hours:
            audit(conn, actor, "stock count", vessel, before, stock_snapshot(conn, vessel) | {"filter hours recorded": report.filter_hours})
        return report

    return write_transaction(engine, work)
