# SPDX-License-Identifier: MIT
"""``kit audit``: who changed what in the fleet database, and when."""

from __future__ import annotations

import click

from kit.safety import SAFETY
from kit.commands.common import IsoDate, db_option


@click.command(epilog=SAFETY)
@click.option("--since", type=IsoDate(), help="Only changes on or after this day, YYYY-MM-DD.")
@click.option("--person", help="Only this person's changes (a login, or the command line's user).")
@click.option("--subject", help="Only changes to this (a vessel id, a supplier, a login...).")
@click.option("--limit", type=click.IntRange(1, 100_000), default=200, show_default=True, help="At most this many, latest first.")
@click.option("--json", "as_json", is_flag=True, help="Print JSON, with each change's before and after in full.")
@db_option()
def audit(engine, since, person, subject, limit, as_json) -> None:
    """List the audit trail, latest first: when (UTC), who, through which face, what, to what, and
    what it was before and after. kit only ever adds to it.

    Example: kit audit --since 2026-12-01 --subject CORVINA-BAY
    """
    import datetime as dt
    import json

    from kit.files.safe_text import visible
    from kit.services.audit import read_audit

    found = read_audit(engine, since=None if since is None else dt.datetime.combine(since, dt.time()),
                       person=person, subject=subject, limit=limit)
    if as_json:
        click.echo(json.dumps([{"at": e.at.isoformat(), "person": e.person, "via": e.via, "action": e.action,
                                "subject": e.subject, "before": e.before, "after": e.after} for e in found], indent=2))
        return
    if not found:
        click.echo("no changes recorded" + (" matching that" if since or person or subject else ""))
    for e in found:
        click.echo("\t".join(visible(x) for x in (f"{e.at:%Y-%m-%d %H:%M:%S}", e.person, e.via, e.action, e.subject,
                                                 _brief(e.before), _brief(e.after))))


def _brief(value) -> str:
    import json

    if value is None:
        return "-"
    text = json.dumps(value, sort_keys=True, ensure_ascii=False)
    return text if len(text) <= 120 else text[:117] + "..."
