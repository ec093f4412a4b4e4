# SPDX-License-Identifier: MIT
"""``kit stock``: a vessel's on-board stock in the fleet database."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option, decimal_mark_option


@click.group(epilog=SAFETY)
def stock() -> None:
    """On-board stock per vessel: import a count or receipts and issues.

    Example: kit stock import corvina_stock.xlsx --vessel CORVINA-BAY
    """


@stock.command("import", epilog=SAFETY)
@click.argument("file", type=click.Path(path_type=str))
@click.option("--vessel", help="The vessel's id, as in its particulars; needed when the file names none.")
@click.option("--mode", type=click.Choice(["count", "adjust"]), default="count", show_default=True,
              help="count: quantities are what is on board; adjust: + received, - used.")
@decimal_mark_option
@db_option()
def import_(engine, file: str, vessel: str | None, mode: str, decimal: str | None) -> None:
    """Write FILE's stock rows (.xlsx sheet "stock", or .csv; see `kit template stock`) for VESSEL.

    Columns: part_key, designation (not read), location, quantity (or counted, in a count
    sheet), counted_on (YYYY-MM-DD, not after today), vessel. A blank quantity or counted cell
    means not counted: the row is listed and left as it was. A count sheet made for one vessel
    (`kit template stock --vessel`) names it, and is refused for another; a file that names
    none needs --vessel. A count sheet's filter_hours sheet records running hours since the
    last filter change. Quantities are plain decimals: a semicolon-separated CSV has a decimal
    comma, a comma- or tab-separated one a decimal point (see --decimal-mark). The whole file
    is refused if one row is bad; stock never goes below zero.

    Example: kit stock import receipts.csv --vessel CORVINA-BAY --mode adjust
    """
    from kit.files.safe_text import visible
    from kit.services.imports import import_stock

    report = import_stock(engine, file, vessel, mode, decimal)
    hours = f"; running hours of {report.filter_hours} filter position(s)" if report.filter_hours else ""
    click.echo(f"{report.vessel}: {report.rows} stock row(s) written ({report.mode}){hours}")
    if report.not_counted:
        click.echo(f"{len(report.not_counted)} row(s) not counted (left as they were):")
        for line in report.not_counted:
            click.echo(f"  {visible(line)}")
