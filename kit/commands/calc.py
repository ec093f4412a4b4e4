# SPDX-License-Identifier: MIT
"""``kit calc``: one vessel's particulars to seals, oil, filters, spares and checks."""

from __future__ import annotations

import json

import click

from kit.safety import SAFETY
from kit.commands.common import Days, reports_errors


@click.command(epilog=SAFETY)
@click.argument("particulars", type=click.Path())
@click.option("--days", type=Days(), default=0, show_default=True,
              help="Length of the voyage or period, in days.")
@click.option("--policy", "policy_file", type=click.Path(), default=None,
              help="Company spares policy (TOML) merged over kit's default policy.")
@click.option("--json", "as_json", is_flag=True, help="Print JSON (the scripting format in the README).")
@reports_errors
def calc(particulars: str, days: float, policy_file: str | None, as_json: bool) -> None:
    """Work out seal housings and sizes, oil quantities, filter elements, recommended spares and
    physics checks (torque, SOLAS 28 s swing time, stroke) for the vessel in PARTICULARS: a .toml
    file or a particulars workbook (.xlsx, see `kit template particulars`). No database is opened.

    Exits with status 2 and one line naming the file and field when the particulars are wrong.

    Example: kit calc demo_fleet/corvina_bay.toml --days 90 --json
    """
    from kit.services.fleet import work_out

    result = work_out(particulars, days, policy_file)
    if as_json:
        from kit.engine.report import vessel_json

        click.echo(json.dumps(vessel_json(result), indent=2))
        return
    from rich.console import Console

    from kit.commands.terminal import render

    render(result, Console())
