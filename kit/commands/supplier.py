# SPDX-License-Identifier: MIT
"""``kit supplier``: suppliers preferred over price, for everything they offer or for one part."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option


@click.group(epilog=SAFETY)
def supplier() -> None:
    """The suppliers whose catalogues are imported: list them, and prefer one over price for
    everything it offers or for one generic part (a part's preferred supplier wins over a
    supplier preferred for everything).

    Example: kit supplier list
    """


@supplier.command(epilog=SAFETY)
@click.argument("name")
@click.option("--part", "part_key", metavar="PART_KEY", help="Only for this generic part (kit parts list shows the keys); "
              "one supplier per part, so this replaces another.")
@click.option("--note", help="Why, for this part (e.g. maker's approval); only with --part.")
@db_option()
def prefer(engine, name, part_key, note) -> None:
    """Prefer the supplier NAME (as imported with kit catalogue import) over price: for everything
    it offers, or with --part for one generic part.

    Example: kit supplier prefer "Skerrow Seal Supply" --part "o_ring:id=100.00mm:cs=3.55mm:spec=NBR" --note "maker-approved"
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import prefer_supplier

    done = prefer_supplier(engine, name, part_key, note)
    if done.part_key is None:
        click.echo(visible(f"{done.supplier}: preferred for everything it offers" + ("" if done.done else " (already)")))
    else:
        click.echo(visible(f"{done.supplier}: preferred for {done.part_key}"
                           + (f" (instead of {done.replaced})" if done.replaced else "")))
        if not done.offered:
            click.echo(visible(f"  note: {done.supplier} offers nothing for this part (no catalogue entry or quoted "
                               "reply matches it): the order chooses among the other offers until it does"))


@supplier.command(epilog=SAFETY)
@click.argument("name")
@click.option("--part", "part_key", metavar="PART_KEY", help="Only the preference for this generic part.")
@db_option()
def unprefer(engine, name, part_key) -> None:
    """Undo kit supplier prefer: NAME is no longer preferred for everything it offers, or with
    --part for that part (its other preferences stay).

    Example: kit supplier unprefer "Skerrow Seal Supply"
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import unprefer_supplier

    done = unprefer_supplier(engine, name, part_key)
    what = "everything it offers" if done.part_key is None else done.part_key
    click.echo(visible(f"{done.supplier}: no longer preferred for {what}" if done.done
                       else f"{done.supplier}: was not preferred for {what}; nothing changed"))


@supplier.command("list", epilog=SAFETY)
@db_option()
def list_(engine) -> None:
    """List the suppliers: catalogue entries (and how many matched a generic part), whether
    preferred for everything, and the parts each is preferred for.

    Example: kit supplier list
    """
    from kit.files.safe_text import visible
    from kit.services.purchasing import list_suppliers

    listed = list_suppliers(engine)
    if not listed:
        click.echo("no suppliers yet (kit catalogue import adds them)")
    for s in listed:
        flag = "preferred" if s.preferred else "-"
        click.echo(f"{visible(s.name)}\t{s.entries} entries, {s.matched} matched\t{flag}")
        for key, note in s.parts:
            click.echo(visible(f"  preferred for {key}" + (f": {note}" if note else "")))
