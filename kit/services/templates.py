# SPDX-License-Identifier: MIT
"""The sheets kit reads, written for a person to fill in: particulars, stock, catalogue."""

from __future__ import annotations

from pathlib import Path

from sqlalchemy.engine import Engine


def write_particulars_template(out: str | Path, from_toml: str | Path | None = None, paper: str = "a4") -> None:
    """The particulars workbook ``out`` (.xlsx), filled from a .toml particulars file when given,
    to print on ``paper`` ("a4" or "letter")."""
    from kit.files.particulars_sheet import write_particulars_template as write

    write(out, from_toml, paper)


def write_stock_template(engine: Engine, out: str | Path, vessel: str | None = None, days: float | None = None,
                         paper: str = "a4") -> int:
    """The stock sheet ``out`` (.xlsx or .csv); return how many part rows it has.

    With ``vessel``: its count sheet (:func:`count_sheet`, ``days`` the voyage). Without: one row
    per generic part in the database, for an import that names the vessel."""
    if vessel is not None:
        from kit.files.stock_sheet import write_count_sheet
        from kit.safety import SAFETY

        count = count_sheet(engine, vessel, 0.0 if days is None else days)
        write_count_sheet(out, count, SAFETY, paper)
        return len(count.lines)
    from kit.files.sheets import write_sheet
    from kit.files.stock_sheet import stock_sheet
    from kit.store.stock_import import stock_rows

    from kit.store.vessel_ids import resolve_vessel_id

    with engine.connect() as conn:
        sheet = stock_sheet(stock_rows(conn, vessel and resolve_vessel_id(conn, vessel)))
    write_sheet(out, sheet, "Stock sheet (template)", paper)
    return len(sheet.rows)


def count_sheet(engine: Engine, vessel_id: str, days: float):
    """What a count on board of ``vessel_id`` lists (:class:`kit.files.stock_sheet.CountSheet`):
    every part the vessel keeps under its policy in force (:func:`kit.engine.requirements.kept_parts`,
    each registered) with what a voyage of ``days`` needs, and every part it has in stock, at each
    location; and its filter positions with the running hours last recorded."""
    import datetime as dt

    from catalog_schema.engine import read_transaction
    from kit.engine.requirements import assess_vessel
    from kit.services.orders import read_fleet

    today = dt.date.today()
    (vessel,), policies = read_fleet(engine, [vessel_id], None)
    result = assess_vessel(vessel, days, policies[vessel.id], today)
    with read_transaction(engine) as conn:
        return count_sheet_of(conn, result, today)


def count_sheet_of(conn, result, today):
    """:func:`count_sheet` of a vessel already worked out (``result``, a
    :class:`kit.engine.requirements.VesselResult` over the sheet's days), read in the caller's
    transaction ``conn``: the vessel page shows it beside the rest of the vessel from one read."""
    from kit.engine.requirements import kept_parts
    from kit.errors import InputError
    from kit.files.stock_sheet import CountLine, CountSheet, FilterLine
    from kit.store.stock_import import registered_parts, vessel_stock

    vessel, days = result.vessel, result.days
    lines = kept_parts(result)
    needed: dict[str, float] = {}
    uom: dict[str, str] = {}
    for li in lines:
        needed[li.key] = needed.get(li.key, 0.0) + li.quantity
        uom.setdefault(li.key, li.uom)
    known = registered_parts(conn, list(needed))
    held = vessel_stock(conn, vessel.id)
    missing = sorted(set(needed) - set(known))
    if missing:
        raise InputError(f"vessel {vessel.id}", "parts", "every part the vessel keeps registered (kit parts register)",
                         got=f"{len(missing)} not registered, e.g. {missing[0]!r}")
    parts = dict(known)
    parts.update({r.key: (r.kind, r.designation) for r in held})
    at: dict[str, list] = {}
    for r in held:
        at.setdefault(r.key, []).append(r)
    rows = []
    for key in sorted(parts, key=lambda k: (parts[k][0], parts[k][1], k)):
        kind, designation = parts[key]
        unit = uom.get(key, "L" if kind == "oil" else "pcs")
        need = needed.get(key)
        for n, r in enumerate(at.get(key, [None])):
            rows.append(CountLine(key, designation, unit, None if r is None else r.location, need if n == 0 else None,
                                  None if r is None else r.quantity, None if r is None else r.counted_on))
    filters = [FilterLine(u.id, f.position, f.element_ref or "", f.change_interval / 3600,
                          None if f.run_since_change is None else f.run_since_change / 3600, f.run_read_on)
               for u in vessel.units for f in u.filters]
    return CountSheet(vessel.id, vessel.name, days, today, rows, filters)


def write_catalogue_template(out: str | Path, paper: str = "a4") -> None:
    """An empty catalogue sheet ``out`` (.xlsx or .csv) with kit's column names and notes, to print on ``paper``."""
    from kit.files.catalogue_sheet import COLUMNS, NOTES, SHEET
    from kit.files.sheets import Sheet, write_sheet

    write_sheet(out, Sheet(SHEET, COLUMNS, (), NOTES), "Catalogue (template)", paper)
