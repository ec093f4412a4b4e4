# SPDX-License-Identifier: MIT
"""What the command line draws on a terminal (rich): the readable report of ``kit calc``, the
shortfall table of ``kit check``, progress bars; and stored text made safe to print there.
The library below knows nothing of terminals; only the commands import this."""

from __future__ import annotations

import sys
from dataclasses import dataclass
from typing import Any, Iterable

VERDICT_MARKUP = {True: "[green]{}[/green]", False: "[red]{}[/red]"}  # a check's verdict: met or enough, not met or short
VERDICT_STYLE = {"met": "[green]{}[/green]", "not met": "[red]NOT MET[/red]", "not shown": "[yellow]{}[/yellow]"}


def shown(value: Any) -> str:
    """``value`` as text for a rich console: control characters replaced and markup escaped, so
    stored text like ``[/b]`` is printed as it is rather than read as a style (or refused)."""
    from rich.markup import escape

    from kit.files.safe_text import visible

    return escape(str(visible(value)))


def progress_bar(items: list, label: str) -> Iterable:
    """Yield ``items``, with a progress bar on stderr when it is a terminal and the work is long
    (the ``progress`` wrapper the services take, see :mod:`kit.services`)."""
    if len(items) < 5 or not sys.stderr.isatty():
        yield from items
        return
    from rich.console import Console
    from rich.progress import track

    yield from track(items, description=label, console=Console(stderr=True), transient=True)


WRAP_MIN = 24  # a wrapped column narrower than this reads one or two words a line


@dataclass(frozen=True)
class Col:
    """A column of a :func:`fitted_table`: its heading, its rank (0 is kept longest; the highest
    rank is left out first on a narrow console), right-aligned or not, and whether its text wraps
    (at spaces, never narrower than its longest word nor ``least``)."""

    name: str
    rank: int = 0
    right: bool = False
    wraps: bool = False
    least: int = WRAP_MIN


def _cell_width(text: str) -> int:
    from rich.text import Text

    return max((Text.from_markup(line).cell_len for line in str(text).split("\n")), default=0)


def fitted_table(columns: list[Col], rows: list[list[str]], width: int, **table_options: Any) -> Any:
    """A rich table of ``rows`` that fits ``width`` console columns: a column that does not wrap
    keeps its cells on one line, one that wraps keeps at least its longest word (or ``least``) a
    line, and columns are left out, highest rank first, until the rest fit (the caption names
    them). Text already escaped for rich (:func:`shown`)."""
    from rich.table import Table

    def natural(i: int, col: Col) -> int:
        return max([_cell_width(r[i]) for r in rows] + [_cell_width(col.name)])

    def need(i: int, col: Col) -> int:
        if not col.wraps:
            return natural(i, col)
        words = [_cell_width(w) for r in rows for w in str(r[i]).split()] + [_cell_width(col.name)]
        return min(natural(i, col), max(col.least, *words))

    widths = [need(i, c) for i, c in enumerate(columns)]
    kept = list(range(len(columns)))
    # a table with the default box: one rule between columns and at each edge, one space of padding either side
    while len(kept) > 1 and sum(widths[i] + 3 for i in kept) + 1 > width:
        kept.remove(max(kept, key=lambda i: (columns[i].rank, i)))
    # what is left over widens the wrapping columns, each up to its longest cell, in turn
    spare = width - sum(widths[i] + 3 for i in kept) - 1
    for i in kept:
        if columns[i].wraps and spare > 0:
            grow = min(spare, natural(i, columns[i]) - widths[i])
            widths[i] += grow
            spare -= grow
    left_out = [columns[i].name for i in range(len(columns)) if i not in kept]
    caption = f"left out at {width} columns: {', '.join(left_out)} (a wider terminal shows them)" if left_out else None
    table = Table(caption=caption, caption_justify="left", title_justify="left", **table_options)
    for i in kept:
        col = columns[i]
        # a fixed width: rich's own narrowing could take a wrapping column below its longest word
        table.add_column(col.name, justify="right" if col.right else "left", no_wrap=not col.wraps,
                         width=widths[i], overflow="fold")
    for r in rows:
        table.add_row(*(r[i] for i in kept))
    return table


SHORTFALL_COLUMNS = [Col("no", 1, right=True), Col("part", wraps=True), Col("uom"), Col("needed", right=True),
                     Col("on board", right=True), Col("short", right=True), Col("basis", 2)]


def shortfall_table(check, width: int = 80) -> Any:
    """The rich table of a :class:`kit.services.orders.VoyageCheck` with lines short, fitted to ``width``."""
    from kit.engine.preflight import shortfall_rows
    from kit.engine.report_rows import quantity

    vessel, days = check.vessel, check.days
    rows = []
    for n, row in enumerate(shortfall_rows(check.short), 1):
        rows.append([str(n), shown(row.part), shown(row.uom), quantity(row.needed, row.uom), quantity(row.on_board, row.uom),
                     quantity(row.short, row.uom), shown(row.basis)])
    return fitted_table(SHORTFALL_COLUMNS, rows, width,
                        title=f"{shown(vessel.name)} ({shown(vessel.id)}): short for a {days:g}-day voyage")


VESSEL_COLUMNS = [Col("id"), Col("name", 1, wraps=True), Col("type", 4), Col("GT", 5, right=True), Col("units", 3, right=True),
                  Col("last count"), Col("next delivery", 2, wraps=True)]


def vessels_table(vessels: list, width: int = 80) -> Any:
    """The fleet at a glance (:func:`kit.services.fleet.list_vessels`), fitted to ``width``."""
    rows = [[shown(v.id), shown(v.name), shown(v.ship_type), f"{v.gross_tonnage:,.0f}", str(v.units),
             v.last_count.isoformat() if v.last_count else "",
             f"{shown(v.next_port)}, {v.next_due.isoformat()}" if v.next_due else ""] for v in vessels]
    return fitted_table(VESSEL_COLUMNS, rows, width, title=f"{len(vessels)} vessel(s) in the fleet database")


class _Rows:
    """The rows of a titled table, gathered before it is fitted (:func:`fitted_table`)."""

    def __init__(self, title: str):
        self.title, self.rows = title, []

    def add_row(self, *cells: str) -> None:
        self.rows.append(list(cells))


# The calculation report's tables: which columns give way first on a narrow terminal.
CHECK_COLUMNS = [Col("check", wraps=True, least=20), Col("value", right=True), Col("against", wraps=True, least=20)]
RULE_COLUMNS = [Col("clause", wraps=True, least=12), Col("verdict"), Col("judged on", wraps=True)]
SEAL_COLUMNS = [Col("role", 1), Col("part", wraps=True, least=16), Col("d mm", right=True), Col("D mm", right=True),
                Col("L mm", right=True), Col("qty", right=True), Col("compound", wraps=True, least=10), Col("from", 2, wraps=True, least=12)]
LINE_COLUMNS = [Col("unit"), Col("designation", wraps=True), Col("standard", 2, wraps=True, least=20),
                Col("compound", 1, wraps=True, least=10), Col("qty", right=True), Col("uom"), Col("basis", 3, wraps=True, least=20)]


def render(r, console) -> None:
    """Print the readable report of ``r`` on a rich ``console``, its tables fitted to its width."""
    from kit.engine.report import vessel_json
    from kit.engine.report_rows import gear_rows, oil_words, quantity, seal_cells
    from kit.files.safe_text import each_text

    width = console.width
    data = each_text(vessel_json(r), shown)  # text from files as it is: no markup, no control characters
    v = data["vessel"]
    console.print(f"[bold]{v['name']}[/bold] ({v['id']}), {v['ship_type']}, {v['gross_tonnage']:,.0f} GT"
                  f" -- period {r.days:g} days -- spares policy: {data['policy']}")
    for u in data["units"]:
        t = _Rows(f"Unit {u['id']}: {u['service']}, {u['actuator']} x {u['count']}, {u['fluid']}")
        for row in gear_rows(u):
            t.add_row(row.check, row.value, row.against_with(None if row.verdict is None else VERDICT_MARKUP[row.ok].format(row.verdict)))
        console.print(fitted_table(CHECK_COLUMNS, t.rows, width, title=t.title))
        if u["rules"]:
            rules = [[rule["clause"], VERDICT_STYLE.get(rule["verdict"], "{}").format(rule["verdict"]), rule["text"]]
                     for rule in u["rules"]]
            console.print(fitted_table(RULE_COLUMNS, rules, width, title=f"SOLAS II-1/29 verdicts of unit {u['id']}"))
        seals = [seal_cells(s) for s in u["seals"]]
        console.print(fitted_table(SEAL_COLUMNS, seals, width, title=f"Seal kit of unit {u['id']} (per unit)"))
        for line in u["inspections"]:
            console.print(f"inspect {u['id']}: {line}")
        for w in u["warnings"]:
            console.print(f"[yellow]warning[/yellow] {u['id']}: {w}")
    lines = [[li["unit"], li["designation"], li["standard"], li["compound"], quantity(float(li["quantity"]), li["uom"]),
              li["uom"], li["basis"]] for li in data["lines"]]
    console.print(fitted_table(LINE_COLUMNS, lines, width, title="Requirement list (to keep on board)"))
    for o in data["oil"]:
        console.print(f"oil {o['fluid']}: {oil_words(o)}")
    console.print("[dim]Series housings and O-rings are to be checked against the maker's drawing before ordering. "
                  "Table rows marked 'from memory' in kit/data are not confirmed from the standard's text.[/dim]")
