# SPDX-License-Identifier: MIT
"""``kit load``: vessel particulars into the fleet database."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option


@click.command(epilog=SAFETY)
@click.argument("path", type=click.Path(path_type=str))
@db_option()
def load(engine, path: str) -> None:
    """Load vessel particulars from PATH: a .toml file, a particulars workbook (.xlsx, see
    `kit template particulars`) or a folder of .toml files.

    All files are checked before anything is written, and all are written in one transaction.
    A vessel already in the database is updated by its id, a unit by its id on the vessel;
    loading the same file twice changes nothing. On-board stock is left alone.

    Example: kit load demo_fleet/
    """
    from kit.services.fleet import load_particulars

    ids = load_particulars(engine, path)
    click.echo(f"loaded {len(ids)} vessel(s): {', '.join(ids)}")
