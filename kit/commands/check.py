# SPDX-License-Identifier: MIT
"""``kit check``: one vessel's on-board stock against what a voyage needs."""

from __future__ import annotations

import sys

import click

from kit.safety import SAFETY
from kit.commands.common import Days, db_option, default_days, paper_option


@click.command(epilog=SAFETY)
@click.argument("vessel_id")
@click.option("--days", type=Days(), help="Length of the voyage, in days; default the days of cover of the vessel's "
              "spares policy in force (kit policy set --days). Required with --policy: a policy file holds no days of cover.")
@click.option("--out", type=click.Path(), help="Also write the check as a workbook (.xlsx): shortfall, oil and filter elements covered.")
@click.option("--policy", "policy_file", type=click.Path(),
              help="Company spares policy (TOML); default the vessel's policy in force in the fleet database.")
@paper_option
@db_option()
def check(engine, vessel_id, days, out, policy_file, paper) -> None:
    """Check VESSEL_ID's on-board stock against what a voyage of --days needs: seals to the spares
    policy, oil for the storage tank and the top-up, filter elements for the changes due.

    The spares policy is --policy when given, else the vessel's policy in force today in the fleet
    database (its own, else its company's, else kit's default; see kit policy show).

    Prints the shortfall and says in words what is short; --out writes the check as a workbook
    that prints on one A4 page where it fits (the shortfall first, then the oil and filter
    elements it covered). Exit status: 0 nothing short, 1 something short, 2 bad input.

    Example: kit check CORVINA-BAY --days 120 --out corvina-shortfall.xlsx
    """
    from rich.console import Console

    from kit.commands.terminal import shortfall_table, shown
    from kit.engine.preflight import short_words
    from kit.files.output_targets import check_outputs
    from kit.services.orders import check_voyage

    check_outputs({"--out": out})
    days = default_days(engine, days, [vessel_id], policy_file=policy_file)
    check = check_voyage(engine, vessel_id, days, policy_file)
    vessel, short = check.vessel, check.short
    console = Console()
    if out:
        from kit.files.check_workbook import write_check_workbook

        write_check_workbook(check, out, paper=paper)
    words = short_words(short)
    if not words:
        console.print(f"{shown(vessel.name)} ({shown(vessel.id)}): everything a {days:g}-day voyage needs is on board;"
                      " nothing is short (exit status 0)")
    else:
        console.print(shortfall_table(check, console.width))
        console.print(f"{shown(vessel.name)} ({shown(vessel.id)}) is short for a {days:g}-day voyage: "
                      + shown("; ".join(words)) + ".")
    if out:
        console.print(f"wrote {shown(out)}")
    if words:
        console.print("Exit status 1 means something is short (0: nothing short; 2: bad input), for scripts.")
        sys.exit(1)
