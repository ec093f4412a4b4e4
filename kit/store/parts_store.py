# SPDX-License-Identifier: MIT
"""Generic parts in the fleet database, and the dimensional columns that name one in a sheet.

A generic part is one row per normalised key (:func:`kit.engine.parts.part_key`). Parts come from the
engine's line items (:func:`register_parts`), so the same housing on two vessels is one row;
catalogue and stock sheets then refer to them by kind and dimensions, or by key.

The columns a sheet uses to name a part (catalogue rows, see :data:`PART_COLUMNS`):

- ``part_kind``: one of the kinds in :data:`kit.engine.parts.PART_KINDS` (``rod_seal``, ``o_ring``, ...);
- one column per dimension of that kind, named as in the designation (``d``, ``D``, ``L``,
  ``t``, ``cut``, ``id``, ``cs``, ``length``, ``h``), each a length with a unit ("280 mm");
- ``spec``: the text the key carries after the dimensions: the seal compound for seals, guide
  rings and O-rings (``NBR``, ``AU``), the grade for oil (``HM 46``), the reference for a
  filter element or other spare (required for kinds without dimensions);
- or ``part_key``: the normalised key itself, which then wins over the columns above.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Iterable

from sqlalchemy import select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import CATALOGUE_ENTRIES, PARTS
from catalog_schema.locks import hold
from catalog_schema.sql import in_batches, upsert
from kit.errors import InputError
from kit.engine.parts import PART_KINDS, LineItem, part_key
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Table
from kit.engine.units import to_si

ENTRIES = CATALOGUE_ENTRIES
DIMENSIONS = ("d", "D", "L", "t", "cut", "id", "cs", "length", "h")
assert {n for _, names in PART_KINDS.values() for n in names} <= set(DIMENSIONS), "a part kind has a dimension with no column"
PART_COLUMNS = ("part_key", "part_kind", *DIMENSIONS, "spec")
# Kinds whose first two dimensions are an inner and an outer diameter.
_INNER_OUTER = {"piston_seal": ("d", "D"), "rod_seal": ("d", "D"), "stock_seal": ("d", "D"), "wiper": ("d", "D"),
                "guide_ring": ("d", "D")}


@dataclass(frozen=True)
class Registered:
    parts: int  # distinct part keys of the items (new or already there)
    entries_matched: int  # catalogue entries that matched nothing before and match one of them now


def register_parts(conn: Connection, items: Iterable[LineItem]) -> Registered:
    """Add the generic part of every line item not yet in the database, and match to them the
    catalogue entries imported before they were registered (kept with their key, see
    :mod:`kit.store.catalogue_import`).

    Matching is done twice, from each side: a catalogue import looks up the ids of the parts
    registered so far, and this updates the entries still unmatched. Two such transactions
    running at once on PostgreSQL could each miss the other's uncommitted rows (the import read
    the ids before this committed; this updated before the import's rows were committed), leaving
    the whole import unmatched. So both hold the lock ``part matching`` (:mod:`catalog_schema.locks`)
    from their first statement: one runs after the other has committed, and the second sees the
    first's rows, whichever order they come in. One statement per transaction, not per row; a
    set-based UPDATE after the insert would still need the lock, as it cannot see uncommitted parts.
    """
    rows = {i.key: {"key": i.key, "kind": i.kind, "designation": i.designation, "standard": i.standard or None}
            for i in items}
    if not rows:
        return Registered(0, 0)
    hold(conn, "part matching")
    keys = sorted(rows)
    conn.execute(upsert(conn, PARTS, ["key"]), [rows[k] for k in keys])
    part_id = select(PARTS.c.id).where(PARTS.c.key == ENTRIES.c.part_key).scalar_subquery()
    matched = 0
    for batch in in_batches(conn, keys):
        done = conn.execute(update(ENTRIES).where(ENTRIES.c.part_id.is_(None), ENTRIES.c.part_key.in_(batch))
                            .values(part_id=part_id))
        matched += done.rowcount
    return Registered(len(rows), matched)


def part_ids(conn: Connection) -> dict[str, int]:
    """Every generic part's key and id."""
    return dict(conn.execute(select(PARTS.c.key, PARTS.c.id)).all())


class KeyReader:
    """Builds part keys from sheet rows, parsing each distinct length string once.

    :func:`kit.engine.units.to_si` works a length out as its number times the unit's factor (pint is
    asked once per unit word), and each distinct text is worked out once per import.
    """

    def __init__(self, table: Table):
        self.table = table
        self._mm: dict[object, float | str] = {}

    def _parse_mm(self, text: object) -> float:
        return to_si(text, "length", source="", field="") * 1000.0

    def _length_mm(self, row: Row, column: str) -> float:
        text = row.values[column]
        cached = self._mm.get(text)
        if cached is None:
            try:
                cached = self._parse_mm(text)
                if cached <= 0:
                    cached = "a positive length"
            except InputError as exc:
                cached = exc.expected
            self._mm[text] = cached
        if isinstance(cached, str):
            raise self.table.error(row, column, cached, text)
        return cached

    def key(self, row: Row) -> str:
        given = row.values.get("part_key")
        if given is not None:
            text = str(given).strip()
            if CONTROL.search(text):
                raise self.table.error(row, "part_key", NO_CONTROL, given)
            if text.split(":", 1)[0] not in PART_KINDS:
                raise self.table.error(row, "part_key", "a part key starting with a part kind, e.g. rod_seal:d=280:D=300:L=25", given)
            return text
        kind = row.values.get("part_kind")
        if kind not in PART_KINDS:
            raise self.table.error(row, "part_kind", "one of " + ", ".join(PART_KINDS) + " (or fill part_key)", kind)
        names = PART_KINDS[kind][1]
        for name in names:
            if row.values.get(name) is None:
                raise self.table.error(row, name, f"a length with a unit, e.g. \"25 mm\" (every {kind} gives {', '.join(names)})", "an empty cell")
        dims = {name: self._length_mm(row, name) for name in names}
        if kind in _INNER_OUTER:
            inner, outer = _INNER_OUTER[kind]
            if dims[inner] >= dims[outer]:
                raise self.table.error(row, inner, f"{inner} smaller than {outer}", row.values[inner])
        spec = row.values.get("spec")
        if spec is not None and CONTROL.search(str(spec)):
            raise self.table.error(row, "spec", NO_CONTROL, spec)
        if not names and spec is None:
            raise self.table.error(row, "spec", f"the part's grade or reference (a {kind} has no dimensions)", "an empty cell")
        return part_key(kind, dims, "" if spec is None else str(spec))


def list_parts(conn: Connection, kind: str | None = None) -> list[tuple[str, str]]:
    """Every generic part (or those of ``kind``) as (key, designation), by kind then key."""
    query = select(PARTS.c.key, PARTS.c.designation).order_by(PARTS.c.kind, PARTS.c.key)
    if kind:
        query = query.where(PARTS.c.kind == kind)
    return [tuple(row) for row in conn.execute(query)]
