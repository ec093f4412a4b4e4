# SPDX-License-Identifier: MIT
"""``kit check``: one vessel's on-board stock against what a voyage needs."""

from __future__ import annotations

import sys

import click

from kit.cli import SAFETY
from kit.commands.common import Days, db_option


@click.command(epilog=SAFETY)
@click.argument("vessel_id")
@click.option("--days", type=Days(), required=True, help="Length of the voyage, in days.")
@click.option("--out", type=click.Path(), help="Also write the shortfall as a workbook (.xlsx).")
@click.option("--policy", "policy_file", type=click.Path(),
              help="Company spares policy (TOML); default the vessel's policy in force in the fleet database.")
@db_option()
def check(engine, vessel_id, days, out, policy_file) -> None:
    """Check VESSEL_ID's on-board stock against what a voyage of --days needs: seals to the spares
    policy, oil for the storage tank and the top-up, filter elements for the changes due.

    The spares policy is --policy when given, else the vessel's policy in force today in the fleet
    database (its own, else its company's, else kit's default; see kit policy show).

    Prints the shortfall. Exit status: 0 nothing short, 1 something short, 2 bad input.

    Example: kit check CORVINA-BAY --days 120 --out corvina-shortfall.xlsx
    """
    from rich.console import Console
    from rich.table import Table

    from kit.fleet_orders import load_fleet, vessel_policies
    from kit.order_sources import catalogue_offers, stock_on_board
    from kit.output_targets import check_outputs
    from kit.preflight import preflight_order
    from kit.requirements import assess_vessel
    from kit.safe_text import shown_on_terminal as shown

    check_outputs({"--out": out})
    (vessel,) = load_fleet(engine, [vessel_id])
    result = assess_vessel(vessel, days, vessel_policies(engine, [vessel.id], policy_file)[vessel.id])
    with engine.connect() as conn:
        on_board = stock_on_board(conn, [vessel.id])
        offers = catalogue_offers(conn, {li.key for li in result.lines})
    short = preflight_order(result, on_board, offers)
    console = Console()
    if out:
        from kit.workbook import write_workbook

        write_workbook(short, out, days, f"pre-voyage check of {vessel.name}: shortfall for {days:g} days")
    if not short.lines:
        console.print(f"{shown(vessel.name)} ({shown(vessel.id)}): everything a {days:g}-day voyage needs is on board")
        if out:
            console.print(f"wrote {shown(out)}")
        return
    table = Table(title=f"{shown(vessel.name)} ({shown(vessel.id)}): short for a {days:g}-day voyage", title_justify="left")
    for col in ("no", "designation", "required", "on board", "short", "uom", "basis"):
        table.add_column(col, justify="right" if col in ("no", "required", "on board", "short") else "left")
    for line in short.lines:
        nd = 1 if line.uom == "L" else 0
        table.add_row(str(line.number), shown(line.designation), f"{line.required:.{nd}f}", f"{line.on_board:.{nd}f}",
                      f"{line.to_order:.{nd}f}", shown(line.uom), shown(line.basis))
    console.print(table)
    if out:
        console.print(f"wrote {shown(out)}")
    sys.exit(1)
