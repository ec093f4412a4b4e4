# SPDX-License-Identifier: MIT
"""The ``kit`` command line: a thin layer over the engine.

Commands live in ``kit/commands/`` and are imported only when they run, so ``kit --help``
starts without loading pint, openpyxl or the database layer. Each command turns the
project's own errors into one line on stderr and exit status 2.
"""

from __future__ import annotations

import contextlib
import gc
import importlib
from typing import Any, Iterator

import click

from kit.safety import SAFETY


# command name -> (module, attribute, one-line summary shown in ``kit --help``)
COMMANDS: dict[str, tuple[str, str, str]] = {
    "calc": ("kit.commands.calc", "calc", "Work out seals, oil, filters, spares and checks for one vessel."),
    "bom": ("kit.commands.bom", "bom", "Write the bill of materials workbook for vessels or the whole fleet."),
    "check": ("kit.commands.check", "check", "Check a vessel's on-board stock against a voyage (exit 1 if short)."),
    "demo": ("kit.commands.demo", "demo", "Build the demo fleet and write its workbook and a pre-voyage check."),
    "db": ("kit.commands.db", "db", "Build, upgrade and inspect the fleet database."),
    "load": ("kit.commands.load", "load", "Load vessel particulars (.toml, .xlsx or a folder) into the fleet database."),
    "parts": ("kit.commands.parts", "parts", "Register the generic parts the fleet needs; list them."),
    "catalogue": ("kit.commands.catalogue", "catalogue", "Import a supplier's catalogue and match it to generic parts."),
    "stock": ("kit.commands.stock", "stock", "Import a vessel's on-board stock count or receipts and issues."),
    "template": ("kit.commands.template", "template", "Write the particulars, stock or catalogue spreadsheet to fill in."),
    "policy": ("kit.commands.policy", "policy", "Set or show the spares policy in force for a company or vessel."),
    "purchasing": ("kit.commands.purchasing", "purchasing", "Set or show the base currency and the handling margin."),
    "rates": ("kit.commands.rates", "rates", "Enter exchange rates into the base currency (by hand or CSV); list them."),
    "supplier": ("kit.commands.supplier", "supplier", "List suppliers; prefer one over price, for everything or one part."),
    "delivery": ("kit.commands.delivery", "delivery", "Set, list or remove where and when an order must be on board."),
    "vessels": ("kit.commands.vessels", "vessels", "List the fleet's vessels: units, last stock count, next delivery."),
    "serve": ("kit.commands.serve", "serve", "Serve the fleet database as pages in a browser on this PC."),
    "people": ("kit.commands.people", "people", "Add, change and list who may sign in to the office server, and their roles."),
    "audit": ("kit.commands.audit", "audit", "List who changed what in the fleet database, and when."),
    "enquiry": ("kit.commands.enquiry", "enquiry", "Write enquiries to suppliers from the order; read their replies back."),
}


@contextlib.contextmanager
def without_cycle_collector() -> Iterator[None]:
    """Run a command with Python's cyclic garbage collector paused, then restart it.

    A command builds many small objects (a fleet's particulars, line items, rows, cells) that
    hold no reference cycles: reference counting frees them, and the collector only walks them
    again and again. Measured: 0.14 s of a 1,000-vessel BOM and 0.23 s of a 100,000-row
    catalogue import, with the same peak memory with the collector paused (96 MB, 264 MB).
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


class LazyGroup(click.Group):
    """A group whose commands are imported on first use (keeps start-up light), and where every
    command starts: each runs with the cyclic garbage collector paused
    (:func:`without_cycle_collector`, which says what that saves)."""

    def invoke(self, ctx: click.Context) -> Any:
        with without_cycle_collector():
            return super().invoke(ctx)

    def list_commands(self, ctx: click.Context) -> list[str]:
        return sorted(COMMANDS)

    def get_command(self, ctx: click.Context, name: str) -> click.Command | None:
        if name not in COMMANDS:
            return None
        module, attr, _ = COMMANDS[name]
        return getattr(importlib.import_module(module), attr)

    def format_commands(self, ctx: click.Context, formatter: click.HelpFormatter) -> None:
        # Summaries come from COMMANDS so listing them imports nothing.
        with formatter.section("Commands"):
            formatter.write_dl([(name, COMMANDS[name][2]) for name in sorted(COMMANDS)])


@click.group(cls=LazyGroup, epilog=SAFETY)
@click.version_option(package_name="kit")
def main() -> None:
    """kit: seals, oil, filter elements and spares for ship steering gear and other shipboard
    hydraulics, worked out from each unit's particulars.

    Example: kit calc demo_fleet/corvina_bay.toml --days 90
    """
