# SPDX-License-Identifier: MIT
"""What the bill of materials reads from the fleet database: on-board stock and catalogue offers.

Stock is summed over a vessel's locations. Of the catalogue entries matched to a generic part,
the one with the lowest price per piece (price / pack quantity) is taken, then the shorter lead
time; entries without a price come after every priced one.
"""

from __future__ import annotations

from typing import Iterable

from sqlalchemy import func, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, PARTS, STOCK, SUPPLIERS
from catalog_schema.sql import in_batches
from kit.engine.bom import CatalogueMatch

ENTRIES = CATALOGUE_ENTRIES


def stock_on_board(conn: Connection, vessel_ids: Iterable[str]) -> dict[tuple[str, str], float]:
    """(vessel id, part key) -> quantity on board, over all locations."""
    ids = list(vessel_ids)
    if not ids:
        return {}
    query = (select(STOCK.c.vessel_id, PARTS.c.key, func.sum(STOCK.c.quantity))
             .join(PARTS, PARTS.c.id == STOCK.c.part_id)
             .where(STOCK.c.vessel_id.in_(ids))
             .group_by(STOCK.c.vessel_id, PARTS.c.key))
    return {(v, k): float(q) for v, k, q in conn.execute(query)}


def _rank(entry: CatalogueMatch) -> tuple:
    per_piece = entry.price / entry.pack_quantity if entry.price is not None else float("inf")
    lead = entry.lead_time_days if entry.lead_time_days is not None else 10**6
    return (per_piece, lead, entry.supplier, entry.part_number)


def catalogue_offers(conn: Connection, keys: Iterable[str] | None = None) -> dict[str, CatalogueMatch]:
    """Part key -> the best matched catalogue entry (see module docstring)."""
    # An entry's part_key is its part's key once part_id is set (matched at import or when the part
    # is registered), so the entries are found through the part_key index, not by scanning for part_id.
    query = (select(ENTRIES.c.part_key, SUPPLIERS.c.name, ENTRIES.c.supplier_ref, ENTRIES.c.pack_qty, ENTRIES.c.price,
                    ENTRIES.c.currency, ENTRIES.c.lead_time_days)
             .join(SUPPLIERS, SUPPLIERS.c.id == ENTRIES.c.supplier_id)
             .where(ENTRIES.c.part_id.is_not(None)))
    if keys is None:
        batches = [query]
    else:  # only the parts asked for, a bounded number of keys a statement
        batches = [query.where(ENTRIES.c.part_key.in_(batch)) for batch in in_batches(conn, sorted(set(keys)))]
    best: dict[str, CatalogueMatch] = {}
    for batch in batches:
        for key, supplier, ref, pack, price, currency, lead in conn.execute(batch).all():
            entry = CatalogueMatch(supplier, ref, float(pack), None if price is None else float(price), currency, lead)
            if key not in best or _rank(entry) < _rank(best[key]):
                best[key] = entry
    return best
