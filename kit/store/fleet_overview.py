# SPDX-License-Identifier: MIT
"""The fleet at a glance: one row per vessel with its units, last stock count and next delivery.

One statement for the whole fleet or the vessels asked for (grouped sub-queries joined to the
vessels), never one per vessel, so a thousand vessels cost what ten do. A page of the fleet
finds its vessels by :func:`vessel_labels` (ids, names and ship types only) and asks the glance
of those alone, so it does not group the whole fleet's stock and deliveries.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

from typing import Sequence

from sqlalchemy import and_, func, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import DELIVERIES, STOCK, UNITS, VESSELS


@dataclass(frozen=True)
class VesselGlance:
    id: str
    name: str
    ship_type: str
    gross_tonnage: float
    units: int
    last_count: dt.date | None  # the latest counted_on of the vessel's stock rows
    next_port: str | None  # the first delivery due on or after the day asked about
    next_due: dt.date | None


@dataclass(frozen=True)
class VesselLabel:
    id: str
    name: str
    ship_type: str


def vessel_labels(conn: Connection) -> list[VesselLabel]:
    """Every vessel's id, name and ship type, sorted by id (code point), for finding a page of them."""
    rows = conn.execute(select(VESSELS.c.id, VESSELS.c.name, VESSELS.c.ship_type))
    return sorted((VesselLabel(*r) for r in rows), key=lambda v: v.id)


def fleet_glance(conn: Connection, today: dt.date, ids: Sequence[str] | None = None) -> list[VesselGlance]:
    """Every vessel (or those of ``ids``), sorted by id, with its units, last count and next
    delivery due on or after ``today``."""
    def only(column, query):
        return query if ids is None else query.where(column.in_(list(ids)))

    units = only(UNITS.c.vessel_id, select(UNITS.c.vessel_id, func.count().label("units"))).group_by(UNITS.c.vessel_id).subquery()
    counted = (only(STOCK.c.vessel_id, select(STOCK.c.vessel_id, func.max(STOCK.c.counted_on).label("last_count")))
               .group_by(STOCK.c.vessel_id).subquery())
    next_due = (only(DELIVERIES.c.vessel_id, select(DELIVERIES.c.vessel_id, func.min(DELIVERIES.c.due_on).label("due_on")))
                .where(DELIVERIES.c.due_on >= today).group_by(DELIVERIES.c.vessel_id).subquery())
    # (vessel_id, due_on) is unique in deliveries, so the join finds the one delivery of that day
    query = (select(VESSELS.c.id, VESSELS.c.name, VESSELS.c.ship_type, VESSELS.c.gross_tonnage, units.c.units,
                    counted.c.last_count, DELIVERIES.c.port, next_due.c.due_on)
             .outerjoin(units, units.c.vessel_id == VESSELS.c.id)
             .outerjoin(counted, counted.c.vessel_id == VESSELS.c.id)
             .outerjoin(next_due, next_due.c.vessel_id == VESSELS.c.id)
             .outerjoin(DELIVERIES, and_(DELIVERIES.c.vessel_id == next_due.c.vessel_id, DELIVERIES.c.due_on == next_due.c.due_on))
)
    query = only(VESSELS.c.id, query)
    found = [VesselGlance(r.id, r.name, r.ship_type, r.gross_tonnage, r.units or 0, r.last_count, r.port, r.due_on)
             for r in conn.execute(query)]
    return sorted(found, key=lambda v: v.id)  # by code point on every engine (a PostgreSQL collation may skip hyphens)
