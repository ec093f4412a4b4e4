# SPDX-License-Identifier: MIT
"""A supplier's catalogue, read and checked by :mod:`kit.files.catalogue_sheet`, written into the
fleet database all or nothing.

An import replaces that supplier's whole catalogue in one transaction. Rows are matched to the
generic parts already in the database by their normalised key; rows that match nothing are kept
(so a part registered later finds them) and listed in the report.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from sqlalchemy import delete, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, SUPPLIERS
from catalog_schema.locks import hold
from catalog_schema.refusals import located
from catalog_schema.sql import in_batches, insert_rows, upsert
from kit.files.catalogue_sheet import CatalogueFile
from kit.store.parts_store import part_ids
from kit.store.purchasing_records import supplier_named

ENTRIES = CATALOGUE_ENTRIES


@dataclass
class CatalogueReport:
    supplier: str
    rows: int
    matched: int
    unmatched: list[tuple[str, str, str]] = field(default_factory=list)  # (where, supplier_ref, part key)


def write_catalogue(conn: Connection, catalogue: CatalogueFile, whole: bool = True) -> CatalogueReport:
    """Replace the supplier's catalogue by the checked rows, in the caller's transaction; report
    what matched no generic part. With ``whole`` False (an enquiry reply) only the supplier's
    entries for the parts and part numbers the rows name are replaced; the rest of its catalogue stays."""
    path, supplier, table, entries = catalogue.path, catalogue.supplier, catalogue.table, catalogue.entries
    hold(conn, "part matching")  # so a register running at once cannot miss these rows (see register_parts)
    supplier = supplier_named(conn, supplier) or supplier  # the supplier stored, in any letter case
    located(conn, SUPPLIERS, ["name"], [{"name": supplier}], lambda c, one: c.execute(upsert(c, SUPPLIERS, ["name"]), one),
            lambda _: path, {"name": "supplier name"})
    sid = conn.execute(select(SUPPLIERS.c.id).where(SUPPLIERS.c.name == supplier)).scalar_one()
    known = part_ids(conn)
    report = CatalogueReport(supplier, len(entries), 0)
    rows = []
    for line, ref, key, *rest in entries:
        pid = known.get(key)
        if pid is None:
            report.unmatched.append((table.where(line), ref, key))
        rows.append((sid, pid, ref, key, *rest))
    report.matched = len(rows) - len(report.unmatched)
    if whole:
        conn.execute(delete(ENTRIES).where(ENTRIES.c.supplier_id == sid))
    else:
        for column, index in ((ENTRIES.c.part_key, 2), (ENTRIES.c.supplier_ref, 1)):
            for chunk in in_batches(conn, sorted({e[index] for e in entries})):
                conn.execute(delete(ENTRIES).where(ENTRIES.c.supplier_id == sid, column.in_(chunk)))
    columns = catalogue.columns
    located(conn, ENTRIES, columns, rows, lambda c, some: insert_rows(c, ENTRIES, columns, some),
            lambda i: table.where(entries[i][0]), {"supplier_id": "supplier name", "part_id": "part_key"})
    return report
