# SPDX-License-Identifier: MIT
"""``kit people``: who may sign in to the office server, with which role, keeping which vessels."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import db_option

ROLE_HELP = ("administrator (people, policies, particulars), buyer (catalogues, rates, deliveries, orders, "
             "enquiries), vessel_keeper (stock counts and filter hours of the vessels they keep), reader (reads only)")


def _password(password_file: str | None, prompt: str = "Password") -> str:
    """The password from the first line of a file, or typed twice at a hidden prompt; never an
    argument, which other users of the machine could read in the process list."""
    if password_file:
        from kit.files.input_files import PASSWORD_FILE, read_text

        text = read_text(password_file, PASSWORD_FILE)
        return text.splitlines()[0] if text else ""
    return click.prompt(prompt, hide_input=True, confirmation_prompt=True)


@click.group(epilog=SAFETY)
def people() -> None:
    """Who may sign in to kit serve, and with which role. Once anyone is added, the server asks
    for a login and password instead of its start token.

    Example: kit people list
    """


@people.command(epilog=SAFETY)
@click.argument("login")
@click.option("--name", required=True, help="The person's name as pages and the audit trail show it.")
@click.option("--role", required=True, type=click.Choice(["administrator", "buyer", "vessel_keeper", "reader"]), help=ROLE_HELP)
@click.option("--vessel", "vessels", multiple=True, metavar="ID", help="A vessel a vessel keeper keeps (repeat for more).")
@click.option("--password-file", type=click.Path(dir_okay=False), help="Read the password from this file's first line "
              "instead of asking for it.")
@db_option()
def add(engine, login, name, role, vessels, password_file) -> None:
    """Add someone who may sign in, with a role; a vessel keeper with the vessels they keep. The
    password (at least 12 characters) is asked for twice, hidden, and only its argon2 hash is kept.

    Example: kit people add ingrid.vos --name "Ingrid Vos" --role vessel_keeper --vessel CORVINA-BAY
    """
    from kit.files.safe_text import visible
    from kit.services.people import add_person

    added = add_person(engine, login, name, role, _password(password_file), vessels)
    click.echo(visible(f"{added.login}: {added.role}" + (f", keeps {', '.join(added.vessels)}" if added.vessels else "")))


@people.command(epilog=SAFETY)
@click.argument("login")
@click.option("--role", type=click.Choice(["administrator", "buyer", "vessel_keeper", "reader"]), help="A new role.")
@click.option("--name", help="A new name.")
@click.option("--new-password", is_flag=True, help="Set a new password (asked for, or --password-file).")
@click.option("--password-file", type=click.Path(dir_okay=False), help="With --new-password: read it from this file's first line.")
@click.option("--keep", multiple=True, metavar="ID", help="Add a vessel they keep (repeat for more).")
@click.option("--drop", multiple=True, metavar="ID", help="Remove a vessel they keep.")
@click.option("--disable", is_flag=True, help="They may no longer sign in; their sessions end (kept for the audit trail).")
@click.option("--enable", is_flag=True, help="They may sign in again.")
@db_option()
def change(engine, login, role, name, new_password, password_file, keep, drop, disable, enable) -> None:
    """Change someone's role, name, password or vessels, or disable them. A new role, a new
    password or disabling ends their open sessions.

    Example: kit people change ingrid.vos --keep OXBOW-LANTERN
    """
    from kit.files.safe_text import visible
    from kit.services.people import change_person

    password = _password(password_file, "New password") if new_password or password_file else None
    done = change_person(engine, login, role=role, name=name, password=password, disable=disable, enable=enable,
                         keep=keep, drop=drop)
    state = "disabled" if done.disabled_at else "may sign in"
    click.echo(visible(f"{done.login}: {done.role}, {state}" + (f", keeps {', '.join(done.vessels)}" if done.vessels else "")))


@people.command("list", epilog=SAFETY)
@db_option()
def list_(engine) -> None:
    """List the people: login, role, name, vessels kept, and whether they may sign in.

    Example: kit people list
    """
    from kit.files.safe_text import visible
    from kit.services.people import list_people

    found = list_people(engine)
    if not found:
        click.echo("no people: kit serve lets in whoever has its start token on this PC (kit people add adds someone)")
    for p in found:
        click.echo("\t".join(visible(x) for x in (p.login, p.role, p.name, " ".join(p.vessels) or "-",
                                                 "disabled" if p.disabled_at else "may sign in")))
