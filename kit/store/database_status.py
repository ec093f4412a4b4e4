# SPDX-License-Identifier: MIT
"""How many rows each of the fleet database's tables holds (for ``kit db status``)."""

from __future__ import annotations

from sqlalchemy import func, inspect, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import metadata


def table_rows(conn: Connection) -> list[tuple[str, int]]:
    """(table name, rows) for each of kit's tables present, in dependency order."""
    present = set(inspect(conn).get_table_names())
    return [(table.name, conn.execute(select(func.count()).select_from(table)).scalar_one())
            for table in metadata.sorted_tables if table.name in present]
