# SPDX-License-Identifier: MIT
"""``kit catalogue``: suppliers' catalogues in the fleet database."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option, decimal_mark_option


@click.group(epilog=SAFETY)
def catalogue() -> None:
    """Suppliers' catalogues: import one and see which rows match the fleet's generic parts.

    Example: kit catalogue import northwind_seals.xlsx --supplier "Northwind Seals"
    """


@catalogue.command("import", epilog=SAFETY)
@click.argument("file", type=click.Path(path_type=str))
@click.option("--supplier", required=True, help="The supplier whose catalogue FILE is.")
@click.option("--show-unmatched", default=20, show_default=True, help="How many unmatched rows to list.")
@decimal_mark_option
@db_option()
def import_(engine, file: str, supplier: str, show_unmatched: int, decimal: str | None) -> None:
    """Replace SUPPLIER's catalogue by FILE (.xlsx sheet "catalogue", or .csv).

    Columns: supplier_ref, part_kind with the dimension columns of that kind (d, D, L, t, cut,
    id, cs, length, h; lengths with a unit, "280 mm") or part_key, spec (seal compound, oil
    grade or element reference), description, pack (one pack with its unit in the part's unit:
    "208 L", "5 US_gal" for oil, required there; "10 pcs" for pieces), pack_qty (pieces per pack,
    1 to 1,000,000, for parts counted in pieces), price per pack (0 to 10^12),
    currency (ISO 4217), lead_time_days (0 to 3650). Numbers are plain decimals: a semicolon-
    separated CSV has a decimal comma, a comma- or tab-separated one a decimal point (see
    --decimal-mark). The whole file is refused if one row is bad. Rows that match no generic
    part are kept and listed.

    Example: kit catalogue import northwind_seals.csv --supplier "Northwind Seals"
    """
    from kit.services.imports import import_catalogue

    report = import_catalogue(engine, file, supplier, decimal)
    click.echo(f"{report.supplier}: {report.rows} row(s), {report.matched} matched a generic part, "
               f"{len(report.unmatched)} matched nothing")
    for where, ref, key in report.unmatched[:show_unmatched]:
        click.echo(f"  unmatched: {where}: {ref} ({key})")
    if len(report.unmatched) > show_unmatched:
        click.echo(f"  ... and {len(report.unmatched) - show_unmatched} more")
