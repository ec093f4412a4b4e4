# SPDX-License-Identifier: MIT
"""``kit bom``: the bill of materials for one vessel, several, or the whole fleet."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, db_option, default_days, paper_option


@click.command(epilog=SAFETY)
@click.option("--vessel", "vessel_ids", multiple=True, metavar="ID", help="A vessel's id (repeatable); default the whole fleet.")
@click.option("--days", type=Days(), help="Period to cover, in days; default the days of cover of the vessels' spares "
              "policies in force (kit policy set --days; the largest where they differ). Required with --particulars "
              "or --policy: a policy file holds no days of cover.")
@click.option("--out", "out", type=click.Path(), default="kit-bom.xlsx", show_default=True,
              help="Workbook to write (.xlsx); never the fleet database, a device, a folder or a read-only file.")
@click.option("--csv", "csv_out", type=click.Path(), help="Also write the order lines as CSV.")
@click.option("--json", "json_out", type=click.Path(), help="Also write the order as JSON.")
@click.option("--particulars", type=click.Path(exists=False), help="Read vessels from particulars instead of the fleet "
              "database: a .toml file, a particulars workbook (.xlsx, see kit template particulars) or a folder of both "
              "(no stock, no catalogue, no database opened or made: a first list for a new-build series).")
@click.option("--policy", "policy_file", type=click.Path(),
              help="Company spares policy (TOML) for every vessel; default each vessel's policy in force in the fleet database.")
@click.option("--only-to-order", "to_order_only", is_flag=True,
              help="Leave out the lines with nothing to order (workbook, CSV and JSON).")
@paper_option
@db_option(unless="particulars")
def bom(engine, vessel_ids, days, out, csv_out, json_out, particulars, policy_file, to_order_only, paper) -> None:
    """Write the bill of materials: what the vessels need for the period, less what is on board,
    with the same generic part across units and vessels on one line and its split per vessel, oil
    and filter elements rounded to packs over the whole order, and supplier part numbers, prices
    and lead times where a catalogue matched. "To order", packs and totals are live formulas.

    Each line's supplier: one preferred for the part, else a preferred supplier, else the cheapest
    offer in the base currency that arrives by the vessel's next delivery (else the fastest,
    marked late); each line shows why, and the date it must be ordered by. Oil is planned once per
    fluid in the chosen supplier's packs (the cheapest mix that is never short).

    Each vessel is worked out under its spares policy in force today in the fleet database (its
    own, else its company's, else kit's default; see kit policy show) unless --policy is given.
    The oil packages are those of the first vessel's policy. Without --days the order covers the
    days of cover of the policies in force (the largest where the vessels' differ, said on stderr).
    Ends with the totals (lines, lines to order, the priced lines' total per currency) and the
    warnings that matter: lines to order with no catalogue price and rule checks of the gear not met.

    Sister ships built alike (same units, particulars and spares policy; ids and names aside) are
    one series: a line all its hulls need alike gives "Per hull" and "Hulls" beside "Required".

    Example: kit bom --days 180 --out fleet-order.xlsx
    """
    from kit.commands.terminal import progress_bar
    from kit.engine.order_notes import order_notes
    from kit.files.safe_text import visible
    from kit.files.output_targets import check_outputs
    from kit.services.orders import build_order
    from kit.files.workbook import write_workbook

    check_outputs({"--out": out, "--csv": csv_out, "--json": json_out})
    days = default_days(engine, days, vessel_ids, particulars, policy_file)
    order, scope = build_order(engine, vessel_ids, days, particulars, policy_file, progress_bar, to_order_only)
    path = write_workbook(order, out, days, scope, paper)
    written = [str(path)]
    if csv_out:
        from kit.files.bom_export import write_order_csv

        written.append(str(write_order_csv(order, csv_out)))
    if json_out:
        from kit.files.bom_export import write_json

        written.append(str(write_json(order, json_out, days)))
    for w in written:
        click.echo(f"wrote {w}")
    for line in order_notes(order):
        click.echo(visible(line))
