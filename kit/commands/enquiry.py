# SPDX-License-Identifier: MIT
"""``kit enquiry``: the order put to suppliers as enquiries, and their replies read back."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, IsoDate, db_option, default_days, paper_option


@click.group(epilog=SAFETY)
def enquiry() -> None:
    """Enquiries (requests for quotation): write one workbook per supplier from the order, and
    read a supplier's filled-in reply back as its offers.

    Example: kit enquiry write --out enquiries --days 180
    """


@enquiry.command("write", epilog=SAFETY)
@click.option("--vessel", "vessel_ids", multiple=True, metavar="ID", help="A vessel's id (repeatable); default the whole fleet.")
@click.option("--out", "out", type=click.Path(), required=True,
              help="Folder for the workbooks (made if new); a workbook of the same name in it is replaced.")
@click.option("--days", type=Days(), help="Period to cover, in days; default the days of cover of the vessels' spares "
              "policies in force, as kit bom takes them. Required with --policy: a policy file holds no days of cover.")
@click.option("--reply-by", type=IsoDate(), default=None, help="The day replies are asked by (today or later); default 7 days from today.")
@click.option("--policy", "policy_file", type=click.Path(),
              help="Company spares policy (TOML) for every vessel; default each vessel's policy in force in the fleet database.")
@paper_option
@db_option()
def write(engine, vessel_ids, out, days, reply_by, policy_file, paper) -> None:
    """Write the order as enquiries into folder OUT: one workbook per supplier the order buys from
    (named after the supplier) with only that supplier's lines, and any-supplier.xlsx, an open
    enquiry, for the lines no catalogue offers. Lines with nothing to order are left out.

    Each line has our line reference, the generic designation with every dimension, the standard,
    compound, service conditions (working pressure, fluid), the quantity in the part's unit and in
    the supplier's packs, the vessels and units, and the delivery port and date (kit delivery set).
    Only the supplier's columns can be typed in: part number, unit price, currency, pack, lead time,
    remarks. No part key, stock or other supplier's price goes out. Each enquiry is recorded in the
    fleet database so that kit enquiry read can match the reply.

    Example: kit enquiry write --vessel CORVINA-BAY --out enquiries --days 180
    """
    from kit.commands.terminal import progress_bar
    from kit.files.output_targets import check_folder
    from kit.services.enquiries import write_enquiries

    check_folder(out, "--out")
    days = default_days(engine, days, vessel_ids, None, policy_file)
    result = write_enquiries(engine, vessel_ids, days, out, reply_by, policy_file, progress_bar, paper)
    click.echo(f"{result.lines} order line(s) for {result.scope}; {result.nothing_to_order} with nothing to order left out")
    if not result.written:
        click.echo("nothing to order: no enquiry written")
    for e, path in result.written:
        to = e.supplier if e.supplier is not None else "any supplier (open enquiry)"
        click.echo(f"wrote {path}: enquiry {e.id} to {to}, {len(e.lines)} line(s), reply by {e.reply_by.isoformat()}")


@enquiry.command("read", epilog=SAFETY)
@click.argument("reply", type=click.Path(path_type=str))
@db_option()
def read(engine, reply: str) -> None:
    """Read REPLY, an enquiry workbook a supplier filled in, and store its quoted lines as that
    supplier's offers for those parts (the rest of its catalogue stays); the next order compares
    them with every other offer. The reply is checked as a catalogue is: all of it, or nothing is
    stored. A reply to an enquiry this fleet database did not write, with a line reference not of
    that enquiry, or with a designation, quantity or unit changed is refused. Lines left blank
    were not quoted: they are listed and skipped.

    Example: kit enquiry read "replies/Northwind Seals.xlsx"
    """
    from kit.services.enquiries import read_enquiry_reply

    report = read_enquiry_reply(engine, reply)
    click.echo(f"{report.supplier}: enquiry {report.enquiry_id}, {report.quoted} line(s) quoted, "
               f"{len(report.skipped)} not quoted")
    if report.skipped:
        click.echo("  not quoted: " + ", ".join(report.skipped))
    for where, ref, _ in report.unmatched:
        click.echo(f"  {where}: {ref} is for a part not registered (kit parts register), kept unmatched")
