# SPDX-License-Identifier: MIT
"""What the bill of materials reads from the fleet database: on-board stock and catalogue offers.

Stock is summed over a vessel's locations. Every catalogue entry matched to a generic part is an
offer for it (the engine chooses among them, :mod:`kit.engine.supplier_choice`); an entry's pack
is its ``pack_content`` in the part's unit, or, for entries imported before packs had a unit,
its ``pack_qty``.
"""

from __future__ import annotations

from typing import Iterable

from sqlalchemy import func, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, PARTS, STOCK, SUPPLIERS
from catalog_schema.sql import in_batches
from kit.engine.purchasing import Offer

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


def catalogue_offers(conn: Connection, keys: Iterable[str] | None = None) -> dict[str, list[Offer]]:
    """Part key -> every matched catalogue entry for it, as offers (see module docstring)."""
    # An entry's part_key is its part's key once part_id is set (matched at import or when the part
    # is registered), so the entries are found through the part_key index, not by scanning for part_id.
    query = (select(ENTRIES.c.part_key, SUPPLIERS.c.name, ENTRIES.c.supplier_ref, ENTRIES.c.pack_qty, ENTRIES.c.price,
                    ENTRIES.c.currency, ENTRIES.c.lead_time_days, ENTRIES.c.pack_content, ENTRIES.c.pack_label)
             .join(SUPPLIERS, SUPPLIERS.c.id == ENTRIES.c.supplier_id)
             .where(ENTRIES.c.part_id.is_not(None)))
    if keys is None:
        batches = [query]
    else:  # only the parts asked for, a bounded number of keys a statement
        batches = [query.where(ENTRIES.c.part_key.in_(batch)) for batch in in_batches(conn, sorted(set(keys)))]
    found: dict[str, list[Offer]] = {}
    for batch in batches:
        for key, supplier, ref, pack_qty, price, currency, lead, content, label in conn.execute(batch).all():
            if content is None:  # imported before packs had a unit: pack_qty in the part's unit
                content, label = float(pack_qty), f"{pack_qty:g}"
            found.setdefault(key, []).append(Offer(supplier, ref, float(content), label or f"{content:g}",
                                                   None if price is None else float(price), currency, lead))
    for offers in found.values():
        offers.sort(key=lambda o: (o.supplier, o.part_number))
    return found
