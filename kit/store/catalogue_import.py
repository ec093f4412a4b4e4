# SPDX-License-Identifier: MIT
"""A supplier's catalogue, read and checked by :mod:`kit.files.catalogue_sheet`, written into the
fleet database all or nothing.

An import replaces that supplier's whole catalogue in one transaction. Rows are matched to the
generic parts already in the database by their normalised key; rows that match nothing are kept
(so a part registered later finds them) and listed in the report.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Callable

from sqlalchemy import delete, select
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, SUPPLIERS
from catalog_schema.locks import hold
from catalog_schema.refusals import located
from catalog_schema.sql import in_batches, insert_rows, upsert
from kit.files.catalogue_sheet import ENTRY_COLUMNS, CatalogueFile
from kit.store.parts_store import part_ids
from kit.store.purchasing_records import supplier_named

ENTRIES = CATALOGUE_ENTRIES
# A checked entry's values after its line (ENTRY_COLUMNS from supplier_ref on), with the supplier and
# part ids, in the table's own column order, which the compiled INSERT keeps: the driver takes the
# rows as they are (catalog_schema.sql.insert_statement), with no reordering of 100,000 tuples.
ROW_COLUMNS = ("supplier_id", "supplier_ref", "part_key", "part_id", *ENTRY_COLUMNS[4:])


class Unmatched(Sequence):
    """The rows that matched no generic part, each as (where, supplier_ref, part key), the place
    worded only when the row is read: an import may leave most of 100,000 rows unmatched, and the
    report prints a few of them."""

    def __init__(self, where: Callable[[int], str], rows: list[tuple[int, str, str]]):
        self._where, self._rows = where, rows  # rows as (line, supplier_ref, part key)

    def _worded(self, row: tuple[int, str, str]) -> tuple[str, str, str]:
        return self._where(row[0]), row[1], row[2]

    def __len__(self) -> int:
        return len(self._rows)

    def __getitem__(self, index):
        if isinstance(index, slice):
            return [self._worded(r) for r in self._rows[index]]
        return self._worded(self._rows[index])

    def __eq__(self, other: object) -> bool:
        return list(self) == list(other) if isinstance(other, Sequence) else NotImplemented

    def __repr__(self) -> str:
        return f"Unmatched({len(self)} rows)"


@dataclass
class CatalogueReport:
    supplier: str
    rows: int
    matched: int
    unmatched: Sequence[tuple[str, str, str]] = field(default_factory=list)  # (where, supplier_ref, part key)


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
    part_id = part_ids(conn).get
    # each entry unpacked by name into its row (a comprehension: 100,000 rows, no per-row list)
    rows = [(sid, ref, key, part_id(key), description, pack_qty, price, currency, lead, content, label)
            for _, ref, key, description, pack_qty, price, currency, lead, content, label in entries]
    unmatched = [entry[:3] for entry, row in zip(entries, rows) if row[3] is None]  # (line, supplier_ref, part key)
    report = CatalogueReport(supplier, len(entries), len(rows) - len(unmatched), Unmatched(table.where, unmatched))
    if whole:
        conn.execute(delete(ENTRIES).where(ENTRIES.c.supplier_id == sid))
    else:
        for column, index in ((ENTRIES.c.part_key, 2), (ENTRIES.c.supplier_ref, 1)):
            for chunk in in_batches(conn, sorted({e[index] for e in entries})):
                conn.execute(delete(ENTRIES).where(ENTRIES.c.supplier_id == sid, column.in_(chunk)))
    located(conn, ENTRIES, ROW_COLUMNS, rows, lambda c, some: insert_rows(c, ENTRIES, ROW_COLUMNS, some),
            lambda i: table.where(entries[i][0]), {"supplier_id": "supplier name", "part_id": "part_key"})
    return report


def supplier_entry_count(conn: Connection, supplier: str) -> int:
    """How many catalogue entries ``supplier`` (any letter case) has; 0 for a supplier not yet stored."""
    from sqlalchemy import func

    name = supplier_named(conn, supplier)
    if name is None:
        return 0
    return conn.execute(select(func.count()).select_from(ENTRIES).join(SUPPLIERS, SUPPLIERS.c.id == ENTRIES.c.supplier_id)
                        .where(SUPPLIERS.c.name == name)).scalar_one()
