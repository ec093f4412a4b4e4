# SPDX-License-Identifier: MIT
"""``kit parts``: the generic parts the fleet needs, in the fleet database."""

from __future__ import annotations

import click

from kit.safety import SAFETY
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
    from kit.commands.terminal import progress_bar
    from kit.services.fleet import register_parts

    done = register_parts(engine, vessel_ids, policy_file, progress_bar)
    click.echo(f"{done.parts} generic part(s) for {done.vessels} vessel(s) are in the database; "
               f"{done.entries_matched} catalogue entr{'y' if done.entries_matched == 1 else 'ies'} matched one of them only now")


@parts.command("list", epilog=SAFETY)
@click.option("--kind", help="Only parts of this kind (e.g. rod_seal).")
@db_option()
def list_(engine, kind: str | None) -> None:
    """List the generic parts: key, then designation.

    Example: kit parts list --kind o_ring
    """
    from kit.files.safe_text import visible
    from kit.services.fleet import list_parts

    for key, designation in list_parts(engine, kind):
        click.echo(f"{visible(key)}\t{visible(designation)}")
