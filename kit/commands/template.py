# SPDX-License-Identifier: MIT
"""``kit template``: the spreadsheets kit reads, written empty or pre-filled."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, db_option, default_days, paper_option, reports_errors


@click.group(epilog=SAFETY)
def template() -> None:
    """Write a spreadsheet for typing particulars, a stock count or a catalogue into.

    Example: kit template particulars new_vessel.xlsx
    """


@template.command(epilog=SAFETY)
@click.argument("out", type=click.Path(path_type=str))
@click.option("--from", "from_toml", type=click.Path(path_type=str), help="Fill it from a .toml particulars file.")
@paper_option
@reports_errors
def particulars(out: str, from_toml: str | None, paper: str) -> None:
    """Write the particulars workbook OUT (.xlsx); `kit load OUT` reads it back.

    Example: kit template particulars corvina.xlsx --from demo_fleet/corvina_bay.toml
    """
    from kit.files.output_targets import check_outputs
    from kit.services.templates import write_particulars_template

    check_outputs({"OUT": out})
    if not out.lower().endswith(".xlsx"):
        from kit.errors import InputError

        raise InputError(out, "output file", "a name ending in .xlsx", got=repr(out))
    write_particulars_template(out, from_toml, paper)
    click.echo(f"wrote {out}")


@template.command("stock", epilog=SAFETY)
@click.argument("out", type=click.Path(path_type=str))
@click.option("--vessel", help="Write this vessel's count sheet: its own parts, with what the database holds.")
@click.option("--days", type=Days(), help="Length of the voyage, in days (with --vessel; default the days of cover of the "
              "vessel's spares policy in force, as for kit check).")
@paper_option
@db_option()
def stock_(engine, out: str, vessel: str | None, days: float | None, paper: str) -> None:
    """Write the stock sheet OUT (.xlsx or .csv).

    With --vessel: that vessel's count sheet, for the chief engineer's count on board: each
    part it keeps (register them first: kit parts register) with its unit of measure, location,
    what a voyage of --days needs, what the database last had, and an empty column counted; a
    sheet filter_hours for the running hours since each filter change; printed on A4 with the
    vessel, date and page numbers. It names the vessel, and `kit stock import` refuses it for
    another. Without --vessel: one row per generic part in the database.

    Example: kit template stock corvina_count.xlsx --vessel CORVINA-BAY --days 60
    """
    from kit.files.output_targets import check_outputs
    from kit.services.templates import write_stock_template

    check_outputs({"OUT": out})
    if vessel is not None:
        days = default_days(engine, days, [vessel])  # the voyage's days, as kit check takes them
    rows = write_stock_template(engine, out, vessel, days, paper)
    click.echo(f"wrote {out} ({rows} part row(s))")


@template.command("catalogue", epilog=SAFETY)
@click.argument("out", type=click.Path(path_type=str))
@paper_option
@reports_errors
def catalogue_(out: str, paper: str) -> None:
    """Write an empty catalogue sheet OUT (.xlsx or .csv) with kit's column names.

    Example: kit template catalogue northwind.xlsx
    """
    from kit.files.output_targets import check_outputs
    from kit.services.templates import write_catalogue_template

    check_outputs({"OUT": out})
    write_catalogue_template(out, paper)
    click.echo(f"wrote {out}")
