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
@click.option("--serve", is_flag=True, help="Then serve the demo fleet as pages in a browser on this PC (as kit serve does).")
@click.option("--port", type=click.IntRange(0, 65535), default=8750, show_default=True,
              help="With --serve: the port on 127.0.0.1 (0: any free port).")
@reports_errors
def demo(out, days, check_days, serve, port) -> None:
    """Build a throwaway SQLite fleet database from demo_fleet/ (an invented company and fleet),
    load invented stock and an invented supplier catalogue, and write the fleet's bill of
    materials workbook and one vessel's pre-voyage check into a folder. With --serve, then serve
    that database as pages in a browser on this PC, as kit serve does, until Ctrl+C.

    Example: kit demo --out kit-demo --serve
    """
    from pathlib import Path

    from kit.services.demo import build_demo

    result = build_demo(Path(out), days, check_days)
    click.echo(f"demo fleet: {result.vessels} vessels, {result.order_lines} order lines")
    click.echo(f"database:            {result.database}")
    click.echo(f"fleet order ({days:g} d): {result.workbook}")
    click.echo(f"pre-voyage check:    {result.check_workbook} ({result.short_lines} line(s) short for {check_days:g} days)")
    if serve:
        from catalog_schema.engine import make_engine
        from kit.commands.serve import serve_engine

        engine = make_engine(f"sqlite:///{result.database}")
        try:
            serve_engine(engine, port)
        finally:
            engine.dispose()
