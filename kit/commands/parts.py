# SPDX-License-Identifier: MIT
"""``kit parts``: the generic parts the fleet needs, in the fleet database."""

from __future__ import annotations

import click

from kit.cli import SAFETY
from kit.commands.common import db_option


@click.group(epilog=SAFETY)
def parts() -> None:
    """Generic parts: register those the fleet's units need, and list them.

    Example: kit parts register
    """


@parts.command(epilog=SAFETY)
@click.option("--vessel", "vessel_ids", multiple=True, help="Only this vessel (repeatable); default all.")
@click.option("--policy", "policy_file", type=click.Path(path_type=str), help="Company spares policy file (TOML).")
@db_option()
def register(engine, vessel_ids: tuple[str, ...], policy_file: str | None) -> None:
    """Work out every unit's seal kit, oil, filter elements and spares, and add their generic
    parts to the database, one row per part key, so catalogues and stock can refer to them.

    Example: kit parts register --vessel CORVINA-BAY
    """
    from catalog_schema.engine import write_transaction
    from kit.fleet_orders import assess_all, load_fleet, vessel_policies
    from kit.parts_store import register_parts

    vessels = load_fleet(engine, vessel_ids)
    policies = vessel_policies(engine, [v.id for v in vessels], policy_file)
    items = [line for r in assess_all(vessels, 0.0, policies) for line in r.lines]
    done = write_transaction(engine, lambda conn: register_parts(conn, items))
    click.echo(f"{done.parts} generic part(s) for {len(vessels)} vessel(s) are in the database; "
               f"{done.entries_matched} catalogue entr{'y' if done.entries_matched == 1 else 'ies'} matched one of them only now")


@parts.command("list", epilog=SAFETY)
@click.option("--kind", help="Only parts of this kind (e.g. rod_seal).")
@db_option()
def list_(engine, kind: str | None) -> None:
    """List the generic parts: key, then designation.

    Example: kit parts list --kind o_ring
    """
    from sqlalchemy import select

    from kit.parts_store import PARTS
    from kit.safe_text import visible

    query = select(PARTS.c.key, PARTS.c.designation).order_by(PARTS.c.kind, PARTS.c.key)
    if kind:
        query = query.where(PARTS.c.kind == kind)
    with engine.connect() as conn:
        for key, designation in conn.execute(query):
            click.echo(f"{visible(key)}\t{visible(designation)}")
