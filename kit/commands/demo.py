# SPDX-License-Identifier: MIT
"""``kit demo``: the whole job on the invented demo fleet, in a throwaway folder."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, reports_errors


@click.command(epilog=SAFETY)
@click.option("--out", type=click.Path(), default="kit-demo", show_default=True,
              help="Folder to build the demo in: a new or empty folder, or one an earlier kit demo made "
                   "(only that is replaced); any other folder or file is refused.")
@click.option("--days", type=Days(), default=90, show_default=True, help="Period of the fleet order.")
@click.option("--check-days", type=Days(), default=120, show_default=True,
              help="Length of the voyage for the pre-voyage check.")
@reports_errors
def demo(out, days, check_days) -> None:
    """Build a throwaway SQLite fleet database from demo_fleet/ (an invented company and fleet),
    load invented stock and an invented supplier catalogue, and write the fleet's bill of
    materials workbook and one vessel's pre-voyage check into a folder.

    Example: kit demo --out kit-demo
    """
    from pathlib import Path

    from kit.services.demo import build_demo

    result = build_demo(Path(out), days, check_days)
    click.echo(f"demo fleet: {result.vessels} vessels, {result.order_lines} order lines")
    click.echo(f"database:            {result.database}")
    click.echo(f"fleet order ({days:g} d): {result.workbook}")
    click.echo(f"pre-voyage check:    {result.check_workbook} ({result.short_lines} line(s) short for {check_days:g} days)")
