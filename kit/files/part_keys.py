# SPDX-License-Identifier: MIT
"""The columns that name a generic part in a sheet, and :class:`KeyReader`, which turns a row of
them into the part's normalised key (:func:`kit.engine.parts.part_key`).

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

from kit.errors import InputError
from kit.engine.parts import PART_KINDS, part_key
from kit.engine.units import to_si
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Table

DIMENSIONS = ("d", "D", "L", "t", "cut", "id", "cs", "length", "h")
assert {n for _, names in PART_KINDS.values() for n in names} <= set(DIMENSIONS), "a part kind has a dimension with no column"
PART_COLUMNS = ("part_key", "part_kind", *DIMENSIONS, "spec")
# Kinds whose first two dimensions are an inner and an outer diameter.
_INNER_OUTER = {"piston_seal": ("d", "D"), "rod_seal": ("d", "D"), "stock_seal": ("d", "D"), "wiper": ("d", "D"),
                "guide_ring": ("d", "D")}


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
