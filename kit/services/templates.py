# SPDX-License-Identifier: MIT
"""The sheets kit reads, written for a person to fill in: particulars, stock, catalogue."""

from __future__ import annotations

from pathlib import Path

from sqlalchemy.engine import Engine


def write_particulars_template(out: str | Path, from_toml: str | Path | None = None) -> None:
    """The particulars workbook ``out`` (.xlsx), filled from a .toml particulars file when given."""
    from kit.files.particulars_sheet import write_particulars_template as write

    write(out, from_toml)


def write_stock_template(engine: Engine, out: str | Path, vessel: str | None = None) -> int:
    """The stock sheet ``out`` (.xlsx or .csv): one row per generic part, with ``vessel``'s stock
    filled in; return how many part rows it has."""
    from kit.files.sheets import write_sheet
    from kit.files.stock_sheet import stock_sheet
    from kit.store.stock_import import stock_rows

    from kit.store.vessel_ids import resolve_vessel_id

    with engine.connect() as conn:
        sheet = stock_sheet(stock_rows(conn, vessel and resolve_vessel_id(conn, vessel)))
    write_sheet(out, sheet)
    return len(sheet.rows)


def write_catalogue_template(out: str | Path) -> None:
    """An empty catalogue sheet ``out`` (.xlsx or .csv) with kit's column names and notes."""
    from kit.files.catalogue_sheet import COLUMNS, NOTES, SHEET
    from kit.files.sheets import Sheet, write_sheet

    write_sheet(out, Sheet(SHEET, COLUMNS, (), NOTES))
