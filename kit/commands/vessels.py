# SPDX-License-Identifier: MIT
"""``kit vessels``: the fleet at a glance."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option


@click.command(epilog=SAFETY)
@click.option("--json", "as_json", is_flag=True, help="Print the list as JSON instead of a table.")
@db_option()
def vessels(engine, as_json: bool) -> None:
    """List the vessels in the fleet database, sorted by id: id, name, ship type, gross tonnage,
    units, the date of the last stock count and the next delivery (port and date; blank when none
    is due). Vessel ids may be typed in any letter case in every command.

    Example: kit vessels --db office.sqlite
    """
    from kit.services.fleet import list_vessels

    found = list_vessels(engine)
    if as_json:
        import json

        from kit.files.safe_text import each_text, visible

        rows = [{"id": v.id, "name": v.name, "ship_type": v.ship_type, "gross_tonnage": v.gross_tonnage, "units": v.units,
                 "last_count": v.last_count.isoformat() if v.last_count else None,
                 "next_delivery": {"port": v.next_port, "due_on": v.next_due.isoformat()} if v.next_due else None}
                for v in found]
        click.echo(json.dumps(each_text(rows, visible), indent=2, ensure_ascii=False))
        return
    from rich.console import Console

    from kit.commands.terminal import vessels_table

    console = Console()
    if not found:
        console.print("no vessels in the fleet database (kit load adds them)")
        return
    console.print(vessels_table(found, console.width))
