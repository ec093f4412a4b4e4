# SPDX-License-Identifier: MIT
"""``kit delivery``: where and when an order must be on board each vessel."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import IsoDate, db_option


@click.group(epilog=SAFETY)
def delivery() -> None:
    """Where (port) and when (date) an order must be on board a vessel; an order's lines are due
    for ordering that date less the lead time and the handling margin (kit purchasing show).

    Example: kit delivery list
    """


@delivery.command("set", epilog=SAFETY)
@click.argument("vessel_id", metavar="VESSEL")
@click.option("--port", required=True, help="The port the order is delivered in.")
@click.option("--on", "due_on", type=IsoDate(), required=True, help="The day it must be on board, YYYY-MM-DD, today or later.")
@click.option("--note", help="Free text, e.g. the agent.")
@db_option()
def set_(engine, vessel_id, port, due_on, note) -> None:
    """Record that an order must be on board VESSEL in a port on a day. The same vessel and day
    again replaces the port.

    Example: kit delivery set CORVINA-BAY --port Rotterdam --on 2026-12-14 --note "agent: Kessel Shipping"
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import set_delivery

    done = set_delivery(engine, vessel_id, port, due_on, note)
    click.echo(visible(f"{done.vessel_id}: on board at {done.port} by {done.due_on.isoformat()}"
                       + (f" (instead of {done.replaced})" if done.replaced and done.replaced != done.port else "")))


@delivery.command("list", epilog=SAFETY)
@click.option("--vessel", "vessel_id", help="Only this vessel's.")
@click.option("--all", "include_past", is_flag=True, help="Past deliveries too.")
@db_option()
def list_(engine, vessel_id, include_past) -> None:
    """List the deliveries by date: upcoming ones (today or later), or with --all past ones too.

    Example: kit delivery list --vessel CORVINA-BAY
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import list_deliveries

    listed = list_deliveries(engine, vessel_id, include_past)
    if not listed:
        click.echo("no deliveries" + ("" if include_past else " from today on") + " (kit delivery set adds one)")
    for item in listed:
        d = item.delivery
        click.echo("\t".join(visible(x) for x in (d.due_on.isoformat(), d.vessel_id, d.port, item.note or "")).rstrip("\t"))


@delivery.command(epilog=SAFETY)
@click.argument("vessel_id", metavar="VESSEL")
@click.option("--on", "due_on", type=IsoDate(), required=True, help="The day of the delivery to remove, YYYY-MM-DD.")
@db_option()
def remove(engine, vessel_id, due_on) -> None:
    """Remove VESSEL's delivery on a day.

    Example: kit delivery remove CORVINA-BAY --on 2026-12-14
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import remove_delivery

    port = remove_delivery(engine, vessel_id, due_on)
    click.echo(visible(f"{vessel_id}: delivery at {port} on {due_on.isoformat()} removed"))
