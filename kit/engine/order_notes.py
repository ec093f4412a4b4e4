# SPDX-License-Identifier: MIT
"""What an order comes to, in words: the lines ``kit bom`` ends with and the order page shows.

Plain text built from a :class:`kit.engine.bom.Order` alone; a face makes stored text safe for
where it shows it (the command line replaces control characters, a page escapes its HTML).
"""

from __future__ import annotations

RULES_LISTED = 10  # rule checks not met listed one a line; past this, a count
WARNING = "warning: "  # the start of each note that needs the purchaser's attention


def order_notes(order) -> list[str]:
    """The order's lines and those with something to order, the series of sister ships, the total
    of the priced lines per currency (as the workbook's cover sums them) and in the base currency,
    then the warnings that matter (each starting with :data:`WARNING`): lines to order with no
    catalogue price, late lines, missing exchange rates and each rule check of the gear not met."""
    to_order = [line for line in order.lines if line.to_order > 0]
    out = [f"{len(order.lines)} order line(s) for {len(order.results)} vessel(s), {len(to_order)} with something to order"]
    for s in order.series[:RULES_LISTED]:
        alike = sum(1 for line in order.lines if line.hulls == len(s.hulls) and s.lead in line.split)
        out.append(f"series {s.lead}: {len(s.hulls)} hulls built alike ({', '.join(s.hulls)}); "
                   f"{alike} line(s) give the quantity per hull")
    totals = order.totals_by_currency()
    if totals:
        out.append("total of priced lines: " + "; ".join(f"{totals[c]:,.2f} {c or '(no currency)'}" for c in sorted(totals)))
    if order.base_currency:
        out.append(f"total in the base currency: {order.total_in_currency():,.2f} {order.base_currency}")
    unpriced = [line for line in to_order if line.line_total is None]
    if unpriced:
        kinds = ", ".join(dict.fromkeys(line.kind.replace("_", " ") for line in unpriced))
        out.append(f"{WARNING}{len(unpriced)} of the {len(to_order)} line(s) to order have no catalogue price ({kinds})")
    late = order.late_lines()
    if late:
        out.append(f"{WARNING}{len(late)} line(s) late: no offer arrives by the delivery date (see the Late column)")
    if order.missing_rates:
        out.append(f"{WARNING}no exchange rate into {order.currency} for {', '.join(order.missing_rates)}: "
                   "those offers were not compared on price (kit rates set)")
    failed = [(r.vessel.id, u.unit.id, rule.clause) for r in order.results for u in r.units
              for rule in u.checks.rules if rule.verdict == "not met"]
    for vessel_id, unit_id, clause in failed[:RULES_LISTED]:
        out.append(f"{WARNING}{vessel_id} unit {unit_id}: {clause} not met (see the Gear checks sheet)")
    if len(failed) > RULES_LISTED:
        out.append(f"{WARNING}{len(failed) - RULES_LISTED} more rule check(s) not met (see the Gear checks sheet)")
    return out
