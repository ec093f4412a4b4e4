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
from kit.engine.parts import PART_KINDS, fmt_mm
from kit.engine.units import to_si
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Table

DIMENSIONS = ("d", "D", "L", "t", "cut", "id", "cs", "length", "h")
assert {n for _, names in PART_KINDS.values() for n in names} <= set(DIMENSIONS), "a part kind has a dimension with no column"
PART_COLUMNS = ("part_key", "part_kind", *DIMENSIONS, "spec")
# Kinds whose first two dimensions are an inner and an outer diameter.
_INNER_OUTER = {"piston_seal": ("d", "D"), "rod_seal": ("d", "D"), "stock_seal": ("d", "D"), "wiper": ("d", "D"),
                "guide_ring": ("d", "D")}
# kind -> (its dimension columns, each one's "name=" in the key, the positions of inner and outer or None)
_SHAPES = {kind: (names, tuple(f"{n}=" for n in names),
                  (names.index(_INNER_OUTER[kind][0]), names.index(_INNER_OUTER[kind][1])) if kind in _INNER_OUTER else None)
           for kind, (_, names) in PART_KINDS.items()}


def shape_of(kind: object) -> tuple[tuple[str, ...], tuple[str, ...], tuple[int, int] | None] | None:
    """A part kind's dimension columns, each one's "name=" in the key and the positions of its
    inner and outer diameter (None for other kinds); None for what is not a kind."""
    return _SHAPES.get(kind)  # type: ignore[arg-type]


class KeyReader:
    """Builds part keys from sheet rows, working each distinct cell text out once.

    :func:`kit.engine.units.to_si` works a length out as its number times the unit's factor (pint is
    asked once per unit word); each distinct length text is worked out and formatted as the key
    writes it (:func:`kit.engine.parts.fmt_mm`) once per import, and each distinct spec text
    checked and lowered once, so a row costs a few dictionary look-ups. The key is the one
    :func:`kit.engine.parts.part_key` gives (tests/test_part_keys_fast.py checks it on generated rows).
    """

    def __init__(self, table: Table):
        self.table = table
        self._mm: dict[object, tuple[float, str] | str] = {}  # length text -> (mm, as in the key) or what was expected
        self._spec: dict[str, str] = {}  # spec text -> the key's tail (":" and the text lowered)

    def _parse_mm(self, text: object) -> float:
        return to_si(text, "length", source="", field="") * 1000.0

    def length(self, text: object) -> tuple[float, str] | str:
        """A length text as (mm, as the key writes it), or what was expected of it."""
        try:
            mm = self._parse_mm(text)
        except InputError as exc:
            return exc.expected
        return (mm, fmt_mm(mm)) if mm > 0 else "a positive length"

    def key(self, row: Row) -> str:
        values = row.values
        given = values.get("part_key")
        if given is not None:
            text = str(given).strip()
            if CONTROL.search(text):
                raise self.table.error(row, "part_key", NO_CONTROL, given)
            if text.split(":", 1)[0] not in PART_KINDS:
                raise self.table.error(row, "part_key", "a part key starting with a part kind, e.g. rod_seal:d=280:D=300:L=25", given)
            return text
        kind = values.get("part_kind")
        shape = _SHAPES.get(kind)
        if shape is None:
            raise self.table.error(row, "part_kind", "one of " + ", ".join(PART_KINDS) + " (or fill part_key)", kind)
        names, prefixes, pair = shape
        texts = list(map(values.get, names))
        if None in texts:
            name = names[texts.index(None)]
            raise self.table.error(row, name, f"a length with a unit, e.g. \"25 mm\" (every {kind} gives {', '.join(names)})", "an empty cell")
        cache = self._mm
        parts = [kind]
        dims = []
        for name, prefix, text in zip(names, prefixes, texts):
            cached = cache.get(text)
            if cached is None:
                cached = cache[text] = self.length(text)
            if cached.__class__ is str:
                raise self.table.error(row, name, cached, text)
            dims.append(cached[0])
            parts.append(prefix + cached[1])
        if pair is not None and dims[pair[0]] >= dims[pair[1]]:
            inner, outer = names[pair[0]], names[pair[1]]
            raise self.table.error(row, inner, f"{inner} smaller than {outer}", values[inner])
        spec = values.get("spec")
        if spec is None:
            if not names:
                raise self.table.error(row, "spec", f"the part's grade or reference (a {kind} has no dimensions)", "an empty cell")
        else:
            tail = self._spec.get(spec) if spec.__class__ is str else None
            if tail is None:
                text = str(spec)
                if CONTROL.search(text):
                    raise self.table.error(row, "spec", NO_CONTROL, spec)
                tail = text.strip().lower() if text else None
                if spec.__class__ is str:
                    self._spec[spec] = tail
            if tail is not None:
                parts.append(tail)
        return ":".join(parts)
