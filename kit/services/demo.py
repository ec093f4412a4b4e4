# SPDX-License-Identifier: MIT
"""The demo: a throwaway fleet database built from ``demo_fleet/``, with invented stock and an
invented supplier catalogues (oil in several packs), then the fleet's bill of materials and one vessel's pre-voyage check.

Everything goes through the services a user's commands call (particulars, parts register,
catalogue CSV, each vessel's count sheet written, filled in and imported, the order, the check),
so the demo exercises the real paths: the documented order of a real fleet's set-up. The stock and the catalogue are invented here by a
fixed rule so the demo is the same every run: most parts fully on board, some short, filter
elements and oil below what a long voyage needs.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path

DEMO_SUPPLIER = "Northgate Marine Seals & Hydraulics (invented)"
DEMO_POLICY_FROM = dt.date(2026, 1, 1)  # invented: the demo company's policy in force from this day
CHECK_VESSEL = "CORVINA-BAY"


@dataclass(frozen=True)
class DemoOutput:
    folder: Path
    database: Path
    workbook: Path
    check_workbook: Path
    vessels: int
    order_lines: int
    short_lines: int


def demo_fleet_folder() -> Path:
    """``demo_fleet/`` beside the package (a source checkout, as the README installs it)."""
    return Path(__file__).resolve().parents[2] / "demo_fleet"


def _invented_count(lines, index_seed: int) -> dict[str, float]:
    """What the chief engineer counts, by part key; a part left out is not counted (none on board)."""
    counted = {}
    for i, line in enumerate(sorted({li.key: li for li in lines}.values(), key=lambda li: li.key)):
        need = sum(li.quantity for li in lines if li.key == line.key)
        if line.kind == "oil":
            counted[line.key] = round(need * 0.6)
        elif line.kind == "filter_element":
            counted[line.key] = max(0, int(need) - 2)
        elif (i + index_seed) % 5 != 0:
            counted[line.key] = need
    return counted


def _invented_hours(vessel) -> dict[tuple[str, str], float]:
    """Running hours since the last change read at each filter: half the change interval."""
    return {(u.id, f.position): round(f.change_interval / 3600 / 2) for u in vessel.units for f in u.filters}


# Oil packs of the invented suppliers: (pack, price per pack in EUR, lead time in days).
DEMO_OIL_PACKS = {DEMO_SUPPLIER: (("20 L", 96.0, 7), ("208 L", 905.0, 10), ("1000 L", 4150.0, 21)),
                  "Harbourline Fluid Power (invented)": (("20 L", 92.5, 14), ("208 L", 930.0, 14))}


def _invented_catalogue(lines, supplier: str = DEMO_SUPPLIER) -> list[dict]:
    """Seals, O-rings and filter elements in pieces (``pack_qty``) from the first supplier, and oil
    in several packs (``pack``) from both, each at its own prices and lead times."""
    rows = []
    oils = sorted({li.key for li in lines if li.kind == "oil"})
    prefix = "NMS" if supplier == DEMO_SUPPLIER else "HFP"
    for key in oils:
        for pack, price, lead in DEMO_OIL_PACKS[supplier]:
            rows.append({"supplier_ref": f"{prefix}-OIL-{len(rows) + 1:03d}", "part_key": key, "description": "hydraulic oil",
                         "pack": pack, "pack_qty": "", "price": price, "currency": "EUR", "lead_time_days": lead})
    if supplier != DEMO_SUPPLIER:
        return rows
    for n, line in enumerate(sorted({li.key: li for li in lines if li.kind not in ("oil", "spare")}.values(),
                                    key=lambda li: li.key), 1):
        size = max(line.dims.values()) if line.dims else 100.0
        pack = 2 if line.kind == "filter_element" else 1
        price = round(18 + 0.25 * size, 2) if line.kind != "filter_element" else 64.0
        rows.append({"supplier_ref": f"NMS-{n:05d}", "part_key": line.key, "description": line.designation,
                     "pack": "", "pack_qty": pack, "price": price, "currency": "EUR", "lead_time_days": 10 + (n % 4) * 7})
    return rows


def _write_csv(path: Path, rows: list[dict]) -> None:
    from kit.files.sheets import write_csv

    write_csv(path, list(rows[0]), [list(r.values()) for r in rows])


def fill_demo(engine, imports: Path, days: float = 90.0, fleet: Path | None = None) -> list:
    """Put the invented demo fleet into ``engine``'s database (built to the head revision here):
    particulars, the company's spares policy with ``days`` of cover, generic parts, the invented
    suppliers' catalogues and each vessel's invented stock count, the files written into the
    existing folder ``imports`` and read back as a user's would be. Return the vessels. Every
    step is the service a user's command calls."""
    from kit.engine.requirements import assess_vessel
    from kit.files.policy_file import load_policy
    from kit.files.stock_sheet import fill_count
    from kit.services.database import upgrade_database
    from kit.services.fleet import load_particulars, read_particulars, register_parts
    from kit.services.imports import import_catalogue, import_stock
    from kit.services.policies import set_policy
    from kit.services.templates import write_stock_template

    fleet = fleet or demo_fleet_folder()
    vessels = read_particulars(fleet)
    upgrade_database(engine)
    load_particulars(engine, fleet)
    # as `kit policy set --company ... --days`: the company's policy with its days of cover (kit's
    # default content), so `kit bom` and `kit check` on this database need no --days either
    for company in dict.fromkeys(v.company for v in vessels if v.company):
        set_policy(engine, name="demo fleet policy", cover_days=round(days), in_force_from=DEMO_POLICY_FROM,
                   company=company, note="invented, for the demo")
    policy = load_policy()
    results = {v.id: assess_vessel(v, days, policy) for v in vessels}  # what the invented files are made from
    all_lines = [li for r in results.values() for li in r.lines]
    register_parts(engine, days=days)  # as `kit parts register`: every part each vessel keeps
    for n, supplier in enumerate(DEMO_OIL_PACKS):
        catalogue_csv = imports / ("catalogue.csv" if n == 0 else f"catalogue-{n + 1}.csv")
        _write_csv(catalogue_csv, _invented_catalogue(all_lines, supplier))
        import_catalogue(engine, catalogue_csv, supplier)
    for i, v in enumerate(vessels):  # the chief engineer's count: template, count, import
        sheet = imports / f"count-{v.id.lower()}.xlsx"
        write_stock_template(engine, sheet, v.id, days)
        fill_count(sheet, _invented_count(results[v.id].lines, i), _invented_hours(v), "steering gear room",
                   dt.date(2026, 11, 15))
        import_stock(engine, sheet, None)
    return vessels


def build_demo(out: Path, days: float = 90.0, check_days: float = 120.0, fleet: Path | None = None) -> DemoOutput:
    """Build the demo in ``out`` and return where everything is. ``out`` must be new, empty, or a
    folder an earlier demo made (:func:`kit.files.output_targets.make_demo_folder`), which is replaced.
    Every step is the service a user's command calls (:func:`fill_demo`)."""
    from catalog_schema.engine import make_engine
    from kit.files.output_targets import check_demo_folder, make_demo_folder, record_demo_folder
    from kit.services.fleet import read_particulars
    from kit.services.orders import build_order, check_voyage
    from kit.files.check_workbook import write_check_workbook
    from kit.files.workbook import write_workbook

    check_demo_folder(out)  # before any work
    fleet = fleet or demo_fleet_folder()
    read_particulars(fleet)  # every file checked before the folder is made
    make_demo_folder(out)
    (out / "imports").mkdir()
    database = out / "fleet.sqlite"
    engine = make_engine(f"sqlite:///{database}")
    try:
        vessels = fill_demo(engine, out / "imports", days, fleet)
        order, _ = build_order(engine, (), days)
        ids = order.vessel_ids
        workbook = write_workbook(order, out / "fleet-bom.xlsx", days, f"whole fleet, {len(ids)} vessels")
        check = check_voyage(engine, CHECK_VESSEL if CHECK_VESSEL in ids else ids[0], check_days)
        check_workbook = write_check_workbook(check, out / f"{check.vessel.id.lower()}-voyage-check.xlsx")
    finally:
        engine.dispose()
        record_demo_folder(out)  # even after a failure: all it holds is kit's, as it was new or emptied
    return DemoOutput(out, database, workbook, check_workbook, len(vessels), len(order.lines), len(check.short.lines))
