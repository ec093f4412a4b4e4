# SPDX-License-Identifier: MIT
"""``kit policy``: the spares policy in force per company or vessel."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import Days, IsoDate, db_option


@click.group(epilog=SAFETY)
def policy() -> None:
    """The spares policy in force for a company's fleet or for one vessel.

    Example: kit policy show --vessel CORVINA-BAY
    """


@policy.command("set", epilog=SAFETY)
@click.option("--company", help="The company the policy is for.")
@click.option("--vessel", help="The vessel the policy is for (wins over its company's).")
@click.option("--name", required=True, help="The policy's name, e.g. its file name.")
@click.option("--days", "cover_days", type=Days(whole=True), required=True, help="Days of cover on board (0 to 3650).")
@click.option("--from", "in_force_from", type=IsoDate(), required=True, help="In force from (YYYY-MM-DD, ISO 8601).")
@click.option("--note", help="Free text, e.g. who approved it.")
@click.option("--file", "policy_file", type=click.Path(),
              help="The company spares policy file (TOML, as for --policy); without it, kit's default policy.")
@db_option()
def set_(engine, company, vessel, name, cover_days, in_force_from, note, policy_file) -> None:
    """Record a spares policy for one company or one vessel from a date. With --file the policy
    file's content is stored too (checked first: a file that does not parse or validate is refused),
    and kit bom and kit check use it for the vessels it is in force for.

    Example: kit policy set --company "Marrowgate Ship Management Ltd" --name fleet-2025 --days 90 --from 2025-01-01 --file company-policy.toml
    """
    from kit.services.policies import set_policy

    set_policy(engine, name=name, cover_days=cover_days, in_force_from=in_force_from, company=company, vessel=vessel,
               note=note, policy_file=policy_file)
    click.echo(f"policy {name} in force from {in_force_from.isoformat()} for {company or vessel}")


@policy.command(epilog=SAFETY)
@click.option("--vessel", required=True, help="The vessel's id.")
@click.option("--on", type=IsoDate(), help="The date, YYYY-MM-DD (default today).")
@db_option()
def show(engine, vessel, on) -> None:
    """Show the spares policy in force for a vessel (its own, else its company's, else kit's
    default): the record, then the policy's name and source and each item with its basis.

    Example: kit policy show --vessel CORVINA-BAY --on 2025-06-30
    """
    from kit.files.safe_text import visible
    from kit.services.policies import show_policy

    shown = show_policy(engine, vessel, on)  # the policy checked before anything is printed
    found, rules, day, vessel = shown.record, shown.rules, shown.on, shown.vessel
    if found is None:
        click.echo(visible(f"{vessel}: no spares policy in force on {day.isoformat()}"))
    else:
        click.echo(visible(f"{vessel}: {found.name} ({found.scope} policy from {found.in_force_from.isoformat()}), "
                   f"{found.cover_days} days of cover" + (f"; {found.note}" if found.note else "")))
    click.echo(visible(f"  policy: {rules.name} ({rules.source})"))
    click.echo(visible(f"  spare filter element sets: {rules.spare_filter_sets}; housing length: {rules.housing_length}"))
    for item in rules.items:
        click.echo(visible(f"  {item.kind}: {item.quantity} per {item.per}, {item.text}; basis: {item.basis}"))
