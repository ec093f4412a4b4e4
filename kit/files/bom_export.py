# SPDX-License-Identifier: MIT
"""The order as CSV or JSON, for scripts and for systems that take neither formulas nor styles.

Values, not formulas; user and supplier text is made formula-safe (:mod:`kit.files.safe_text`); each
file is written to a temporary name and renamed into place.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

from kit.files.atomic import replace_atomically
from kit.engine.bom import Order
from kit.files.safe_text import each_text, visible
from kit.files.sheets import write_csv

FIELDS = ("number", "designation", "standard", "compound", "required", "on_board", "to_order", "uom", "pack_size",
          "packs", "supplier", "supplier_part_number", "price_per_pack", "currency", "line_total", "lead_time_days",
          "basis", "vessels", "part_key")


def order_records(order: Order) -> list[dict[str, Any]]:
    out = []
    for line in order.lines:
        m = line.match
        out.append({
            "number": line.number, "designation": line.designation, "standard": line.standard, "compound": line.compound,
            "required": round(line.required, 3), "on_board": round(line.on_board, 3), "to_order": round(line.to_order, 3),
            "uom": line.uom, "pack_size": line.pack_size, "packs": line.packs,
            "supplier": m.supplier if m else None, "supplier_part_number": m.part_number if m else None,
            "price_per_pack": m.price if m else None, "currency": m.currency if m else None,
            "line_total": line.line_total, "lead_time_days": m.lead_time_days if m else None,
            "basis": line.basis, "vessels": {v: round(q, 3) for v, q in line.split.items()}, "part_key": line.key,
        })
    return out


def write_order_csv(order: Order, path: str | Path) -> Path:
    """The order's lines as CSV, one row per line, the vessels' split in one cell."""
    rows = []
    for rec in order_records(order):
        rec["vessels"] = "; ".join(f"{v}: {q:g}" for v, q in rec["vessels"].items())
        rows.append([rec[f] for f in FIELDS])
    return write_csv(path, FIELDS, rows)


def write_json(order: Order, path: str | Path, days: float) -> Path:
    doc = {
        "vessels": order.vessel_ids, "days": days,
        "lines": order_records(order),
        "oil": [{"fluid": o.designation, "required_l": round(o.required_l, 1), "on_board_l": round(o.on_board_l, 1),
                 "to_order_l": round(o.to_order_l, 1), "supply_l": round(o.plan.supply * 1000, 1),
                 "packages": [{"name": p.name, "volume_l": round(p.volume * 1000, 1), "count": n} for p, n in o.plan.counts if n]}
                for o in order.oil],
        "totals": order.totals_by_currency(),
    }
    # Control characters replaced: JSON would carry them as escapes, decoded raw by whoever reads it.
    text = json.dumps(each_text(doc, visible), indent=2)
    return replace_atomically(Path(path), lambda tmp: tmp.write_text(text, encoding="utf-8"))
