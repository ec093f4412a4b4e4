# SPDX-License-Identifier: MIT
"""``kit purchasing``: the base currency offers are compared in, and the handling margin."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, db_option


@click.group(epilog=SAFETY)
def purchasing() -> None:
    """The office's purchasing settings: the base currency offers are compared in and the
    handling margin, the days between an order's dispatch by the supplier and its delivery on
    board (forwarding, customs, the agent, the launch).

    Example: kit purchasing show
    """


def _echo_settings(shown) -> None:
    from kit.engine.purchasing import DEFAULT_HANDLING_DAYS
    from kit.files.safe_text import visible

    settings = shown.settings
    base = settings.base_currency
    click.echo(f"base currency: {base}" if base else "base currency: none set (kit purchasing set --base-currency CODE)")
    if settings.handling_days is None:
        click.echo(f"handling margin: {DEFAULT_HANDLING_DAYS} days (kit's default, common practice)")
    else:
        click.echo(f"handling margin: {settings.handling_days} days")
    if base:
        click.echo(f"rates into {base} in force today: {shown.rates_today}")
    for other, count in shown.rate_counts.items():
        if other != base:
            click.echo(visible(f"{count} rate(s) into {other} stay stored (each rate carries its base) and are not used "
                               f"while the base currency is {base or 'not set'}"))


@purchasing.command("set", epilog=SAFETY)
@click.option("--base-currency", help="ISO 4217 code offers are compared in, e.g. EUR.")
@click.option("--handling-days", type=Days(whole=True, maximum=365), help="Days from the supplier's dispatch to delivery on board, 0 to 365 "
              "(default 7, common practice).")
@db_option()
def set_(engine, base_currency, handling_days) -> None:
    """Set the base currency and/or the handling margin; the other stays as it was. Rates stored
    into an earlier base currency stay stored (each carries its base) and are used again if that
    base is set again; enter rates into the new base with kit rates set or kit rates import.

    Example: kit purchasing set --base-currency EUR --handling-days 10
    """
    from kit.services.purchasing import set_purchasing

    _echo_settings(set_purchasing(engine, base_currency=base_currency, handling_days=handling_days))


@purchasing.command(epilog=SAFETY)
@db_option()
def show(engine) -> None:
    """Show the base currency, the handling margin and how many rates are in force today.

    Example: kit purchasing show
    """
    from kit.services.purchasing import show_purchasing

    _echo_settings(show_purchasing(engine))
