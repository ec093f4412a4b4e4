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

FIELDS = ("number", "designation", "standard", "compound", "required", "per_hull", "hulls", "on_board", "to_order", "uom", "pack_size",
          "pack", "packs", "supplier", "supplier_part_number", "price_per_pack", "currency", "line_total", "rate_to_base",
          "line_total_base", "base_currency", "order_by", "late", "earliest_arrival", "delivery_port", "delivery_on",
          "lead_time_days", "why_chosen", "basis", "vessels", "part_key")


def _day(value) -> str | None:
    return value.isoformat() if value else None


def pack_records(plan) -> list[dict[str, Any]]:
    """The packs of an oil plan, as bought (count 0 included: the supplier's other packs)."""
    return [{"pack": p.label, "content": round(p.content, 6), "count": p.count,
             "supplier_part_number": p.offer.part_number if p.offer else None,
             "price_per_pack": p.offer.price if p.offer else None} for p in plan.packs]


def order_records(order: Order) -> list[dict[str, Any]]:
    out = []
    for line in order.lines:
        offer, delivery = line.offer, line.delivery
        rec = {
            "number": line.number, "designation": line.designation, "standard": line.standard, "compound": line.compound,
            "required": round(line.required, 3),
            "per_hull": None if line.per_hull is None else round(line.per_hull, 3), "hulls": line.hulls, "on_board": round(line.on_board, 3), "to_order": round(line.to_order, 3),
            "uom": line.uom, "pack_size": None if line.plan is not None else line.pack_size, "pack": line.pack_label,
            "packs": line.packs, "supplier": line.supplier, "supplier_part_number": offer.part_number if offer else None,
            "price_per_pack": line.price, "currency": line.currency, "line_total": line.line_total,
            "rate_to_base": line.rate, "line_total_base": line.line_total_base, "base_currency": order.currency,
            "order_by": _day(line.order_by), "late": line.late, "earliest_arrival": _day(line.earliest_arrival),
            "delivery_port": delivery.port if delivery else None, "delivery_on": _day(delivery.due_on if delivery else None),
            "lead_time_days": line.lead_time_days, "why_chosen": line.reason or None,
            "basis": line.basis, "vessels": {v: round(q, 3) for v, q in line.split.items()}, "part_key": line.key,
        }
        if line.plan is not None:
            rec["packs_planned"] = pack_records(line.plan)
        out.append(rec)
    return out


def write_order_csv(order: Order, path: str | Path) -> Path:
    """The order's lines as CSV, one row per line, the vessels' split in one cell."""
    rows = []
    for rec in order_records(order):
        rec["vessels"] = "; ".join(f"{v}: {q:g}" for v, q in rec["vessels"].items())
        rec["late"] = "late" if rec["late"] else None
        rows.append([rec[f] for f in FIELDS])
    return write_csv(path, FIELDS, rows)


def write_json(order: Order, path: str | Path, days: float) -> Path:
    doc = {
        "vessels": order.vessel_ids, "days": days,
        "series": [{"series": s.lead, "hulls": list(s.hulls)} for s in order.series],
        "lines": order_records(order),
        "oil": [{"fluid": o.designation, "required_l": round(o.required_l, 1), "on_board_l": round(o.on_board_l, 1),
                 "to_order_l": round(o.to_order_l, 1), "supply_l": round(o.plan.supply, 3),
                 "plan": o.plan.describe(), "packs": pack_records(o.plan)}
                for o in order.oil],
        "totals": order.totals_by_currency(),
        "base_currency": order.base_currency, "comparison_currency": order.currency,
        "total_in_base": round(order.total_in_currency(), 2) if order.currency else None,
        "missing_rates": list(order.missing_rates),
        "late_lines": [line.number for line in order.late_lines()],
    }
    # Control characters replaced: JSON would carry them as escapes, decoded raw by whoever reads it.
    text = json.dumps(each_text(doc, visible), indent=2)
    return replace_atomically(Path(path), lambda tmp: tmp.write_text(text, encoding="utf-8"))
