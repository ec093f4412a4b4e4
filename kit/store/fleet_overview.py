# SPDX-License-Identifier: MIT
"""The fleet at a glance: one row per vessel with its units, last stock count and next delivery.

One statement for the whole fleet (grouped sub-queries joined to the vessels), never one per
vessel, so a thousand vessels cost what ten do.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass

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


def fleet_glance(conn: Connection, today: dt.date) -> list[VesselGlance]:
    """Every vessel, sorted by id, with its units, last count and next delivery due on or after ``today``."""
    units = select(UNITS.c.vessel_id, func.count().label("units")).group_by(UNITS.c.vessel_id).subquery()
    counted = (select(STOCK.c.vessel_id, func.max(STOCK.c.counted_on).label("last_count"))
               .group_by(STOCK.c.vessel_id).subquery())
    next_due = (select(DELIVERIES.c.vessel_id, func.min(DELIVERIES.c.due_on).label("due_on"))
                .where(DELIVERIES.c.due_on >= today).group_by(DELIVERIES.c.vessel_id).subquery())
    # (vessel_id, due_on) is unique in deliveries, so the join finds the one delivery of that day
    query = (select(VESSELS.c.id, VESSELS.c.name, VESSELS.c.ship_type, VESSELS.c.gross_tonnage, units.c.units,
                    counted.c.last_count, DELIVERIES.c.port, next_due.c.due_on)
             .outerjoin(units, units.c.vessel_id == VESSELS.c.id)
             .outerjoin(counted, counted.c.vessel_id == VESSELS.c.id)
             .outerjoin(next_due, next_due.c.vessel_id == VESSELS.c.id)
             .outerjoin(DELIVERIES, and_(DELIVERIES.c.vessel_id == next_due.c.vessel_id, DELIVERIES.c.due_on == next_due.c.due_on))
)
    found = [VesselGlance(r.id, r.name, r.ship_type, r.gross_tonnage, r.units or 0, r.last_count, r.port, r.due_on)
             for r in conn.execute(query)]
    return sorted(found, key=lambda v: v.id)  # by code point on every engine (a PostgreSQL collation may skip hyphens)
