# SPDX-License-Identifier: MIT
"""Imports into the fleet database: a supplier's catalogue, a vessel's stock. Each file is read
and checked whole before the transaction opens, then written all or nothing."""

from __future__ import annotations

from pathlib import Path

from sqlalchemy.engine import Engine

from kit.errors import ArgumentError
from kit.services.audit import Actor, audit, stock_snapshot
from kit.services.bulk_work import without_cycle_collection


def supplier_name(supplier: str, path: str | Path) -> str:
    """The supplier's name as stored (trimmed), or :class:`ArgumentError` ("supplier name")."""
    from kit.files.safe_text import checked_text

    name = checked_text(supplier, source=str(path), field="supplier name", error=ArgumentError).strip()
    if not name:
        raise ArgumentError(str(path), "supplier name", "a supplier name", got="an empty name")
    return name


def import_catalogue(engine: Engine, path: str | Path, supplier: str, decimal: str | None = None, actor: Actor | None = None):
    """Replace ``supplier``'s catalogue by the rows of ``path``: a
    :class:`kit.store.catalogue_import.CatalogueReport` listing what matched no generic part.
    ``decimal`` is the decimal mark of the file's numbers ("point", "comma"; None: by the file's kind)."""
    from catalog_schema.engine import write_transaction
    from kit.files.catalogue_sheet import read_catalogue
    from kit.store.catalogue_import import write_catalogue

    from kit.store.catalogue_import import supplier_entry_count

    def work(conn):
        before = supplier_entry_count(conn, catalogue.supplier)
        report = write_catalogue(conn, catalogue)
        audit(conn, actor, "import catalogue", report.supplier, {"entries": before},
              {"entries": report.rows, "matched": report.matched, "file": Path(path).name})
        return report

    with without_cycle_collection():  # 100,000 rows, no cycles (see kit.services.bulk_work)
        catalogue = read_catalogue(path, supplier_name(supplier, path), decimal)
        return write_transaction(engine, work)


def import_stock(engine: Engine, path: str | Path, vessel_id: str | None, mode: str = "count", decimal: str | None = None,
                 actor: Actor | None = None):
    """Write the stock rows of ``path`` for ``vessel_id`` (``mode`` "count" or "adjust"): a
    :class:`kit.store.stock_import.StockReport`. The vessel id in any letter case. A file made for one vessel (its column
    ``vessel``) is refused for another; ``vessel_id`` None takes the file's, and a file that
    names none then is refused. Rows left blank are not counted and are reported."""
    from catalog_schema.engine import write_transaction
    from kit.files.stock_sheet import MODES, read_stock
    from kit.store.stock_import import write_stock

    if mode not in MODES:
        raise ArgumentError(str(path), "counting mode", "one of " + ", ".join(MODES), got=repr(mode))
    from kit.store.vessel_ids import resolve_vessel_id

    stock = read_stock(path, mode, decimal)
    if vessel_id is None:
        if stock.vessel is None:
            raise ArgumentError(str(path), "vessel id", "the vessel's id: the file names none (a vessel's own "
                                "count sheet does), so give it", got="none")
        vessel_id = stock.vessel
    stock.refuse_other_vessel(vessel_id)  # before the database is opened
    chosen = vessel_id

    def work(conn):
        vessel = resolve_vessel_id(conn, chosen)
        before = stock_snapshot(conn, vessel)
        report = write_stock(conn, stock, vessel)
        audit(conn, actor, "stock " + mode, vessel, before, stock_snapshot(conn, vessel) | {"file": Path(path).name})
        return report

    return write_transaction(engine, work)
