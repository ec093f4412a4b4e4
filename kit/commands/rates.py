# SPDX-License-Identifier: MIT
"""``kit rates``: exchange rates into the base currency, entered by hand or from a small CSV."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import IsoDate, db_option, decimal_mark_option


@click.group(epilog=SAFETY)
def rates() -> None:
    """Exchange rates into the base currency (kit purchasing set --base-currency), each with the
    day it was set and where it came from. The rate in force on a day is the latest set on or
    before it. kit fetches nothing from the internet: every rate is one you enter.

    Example: kit rates list
    """


@rates.command("set", epilog=SAFETY)
@click.argument("currency")
@click.argument("rate")
@click.option("--on", type=IsoDate(), help="The day the rate was set, YYYY-MM-DD, not after today (default today).")
@click.option("--source", required=True, help='Where the rate came from, e.g. "bank reference rate".')
@db_option()
def set_(engine, currency, rate, on, source) -> None:
    """Record that one unit of CURRENCY is worth RATE units of the base currency (a plain number
    with a decimal point). The same currency and day again replaces the rate. kit fetches nothing
    from the internet: every rate is one you enter, with its date and source.

    Example: kit rates set USD 0.92 --on 2026-11-30 --source "bank reference rate"
    """
    from kit.errors import ArgumentError
    from kit.files.numbers import parse_decimal
    from kit.files.rates_sheet import RATE_EXPECTED
    from kit.services.purchasing import set_rate

    value = parse_decimal(rate.strip(), "point")
    if value is None:
        raise ArgumentError("", "rate", RATE_EXPECTED + ", with a decimal point and no grouping separators", got=repr(rate))
    stored = set_rate(engine, currency, value, on, source)
    click.echo(_line(stored))


def _line(rate) -> str:
    from kit.files.safe_text import visible

    return visible(f"1 {rate.currency} = {rate.rate:g} {rate.base}, set on {rate.set_on.isoformat()}, source: {rate.source}")


@rates.command("import", epilog=SAFETY)
@click.argument("path", type=click.Path())
@decimal_mark_option
@db_option()
def import_(engine, path, decimal) -> None:
    """Store the rates of a CSV file with the columns currency, rate, set_on (YYYY-MM-DD) and
    source, one rate per row into the base currency; all or nothing, the first bad cell refuses
    the file naming its line and column. kit fetches nothing from the internet: every rate is one
    you enter, with its date and source.

    Example: kit rates import rates-2026-11.csv
    """
    from kit.services.purchasing import import_rates

    done = import_rates(engine, path, decimal)
    click.echo(f"{len(done.rates)} rate(s) into {done.base} stored from {click.format_filename(done.path)}")


@rates.command("list", epilog=SAFETY)
@click.option("--on", type=IsoDate(), help="The day, YYYY-MM-DD (default today).")
@db_option()
def list_(engine, on) -> None:
    """List the rate in force on a day for each currency: the latest set on or before it, with
    the day it was set and its source.

    Example: kit rates list --on 2026-12-01
    """
    from kit.services.purchasing import list_rates

    listed = list_rates(engine, on)
    if not listed.rates:
        click.echo(f"no rates into {listed.base} in force on {listed.on.isoformat()}")
    for rate in listed.rates:
        click.echo(_line(rate))
    for base, count in listed.other_bases.items():
        click.echo(f"({count} rate(s) into {base} stay stored, not used while the base currency is {listed.base})")
