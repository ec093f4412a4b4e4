# SPDX-License-Identifier: MIT
"""The catalogue's length shortcut gives pint's own float, and pint's own refusal; the key reader's
cached keys are the engine's own (:func:`kit.engine.parts.part_key`), and so are its refusals."""

from hypothesis import given
from hypothesis import strategies as st

from kit.errors import InputError
from kit.engine.parts import PART_KINDS, part_key
from kit.engine.units import to_si
from kit.files.part_keys import DIMENSIONS, KeyReader
from kit.files.safe_text import CONTROL, NO_CONTROL
from kit.files.sheets import Row, Table

UNITS = ["mm", "in", "m", "cm", "inch", "ft", "um", "MM", "mil", "yd", "bar", "L", "foo"]


def _pint_mm(text: str):
    try:
        return to_si(text, "length", source="", field="") * 1000.0
    except InputError as exc:
        return exc.expected


def _reader_mm(text: str):
    try:
        return KeyReader(Table("catalogue.csv", None, (), []))._parse_mm(text)
    except InputError as exc:
        return exc.expected


@given(st.integers(0, 10**6), st.integers(0, 9999), st.integers(0, 4), st.sampled_from(UNITS), st.sampled_from(["", " "]))
def test_plain_lengths_match_pint(whole, fraction, places, unit, space):
    number = f"{whole}.{fraction:04d}"[: len(str(whole)) + 1 + places] if places else str(whole)
    text = f"{number}{space}{unit}"
    assert _reader_mm(text) == _pint_mm(text)


def test_other_texts_go_to_pint():
    for text in ("1e3 mm", "0280 mm", "280 mm ", "12 in + 3 mm", "-5 mm", "280"):
        assert _reader_mm(text) == _pint_mm(text)


# --- whole keys: the reader's cached way against the engine's own, row by row ------------------

KINDS = [*PART_KINDS, "seal", "", "ROD_SEAL"]
LENGTHS = ["280 mm", "300 mm", "25 mm", "2.5 mm", "11.02 in", "0.3 m", "0 mm", "-5 mm", "25", "abc", "1e3 mm",
           "280.004 mm", "280.005 mm", "0.001 mm", 25.0, 7]
SPECS = [None, "NBR", "nbr", " AU ", "HM 46", "SYN-RE-063-10", "bad\x07", " ", 46, 46.0]


def _reference_key(table: Table, row: Row) -> str:
    """The key as the engine builds it (:func:`kit.engine.parts.part_key`), each length by
    :func:`kit.engine.units.to_si`, refused in the order the columns are checked."""
    v = row.values
    if v.get("part_key") is not None:
        return KeyReader(table).key(row)  # the given key is taken as it is, by one path only
    kind = v.get("part_kind")
    if kind not in PART_KINDS:
        raise table.error(row, "part_kind", "one of " + ", ".join(PART_KINDS) + " (or fill part_key)", kind)
    names = PART_KINDS[kind][1]
    for name in names:
        if v.get(name) is None:
            raise table.error(row, name, f"a length with a unit, e.g. \"25 mm\" (every {kind} gives {', '.join(names)})",
                              "an empty cell")
    dims = {}
    for name in names:
        try:
            mm = to_si(v[name], "length", source="", field="") * 1000.0
        except InputError as exc:
            raise table.error(row, name, exc.expected, v[name]) from None
        if mm <= 0:
            raise table.error(row, name, "a positive length", v[name])
        dims[name] = mm
    pair = {"piston_seal": ("d", "D"), "rod_seal": ("d", "D"), "stock_seal": ("d", "D"), "wiper": ("d", "D"),
            "guide_ring": ("d", "D")}.get(kind)
    if pair and dims[pair[0]] >= dims[pair[1]]:
        raise table.error(row, pair[0], f"{pair[0]} smaller than {pair[1]}", v[pair[0]])
    spec = v.get("spec")
    if spec is not None and CONTROL.search(str(spec)):
        raise table.error(row, "spec", NO_CONTROL, spec)
    if not names and spec is None:
        raise table.error(row, "spec", f"the part's grade or reference (a {kind} has no dimensions)", "an empty cell")
    return part_key(kind, dims, "" if spec is None else str(spec))


def _outcome(make_key, table: Table, row: Row):
    try:
        return make_key(row)
    except InputError as exc:
        return (exc.source, exc.field, exc.expected, exc.got)


ROWS = st.lists(st.fixed_dictionaries(
    {"part_kind": st.sampled_from(KINDS), "spec": st.sampled_from(SPECS)},
    optional={name: st.sampled_from([*LENGTHS, None]) for name in DIMENSIONS}), min_size=1, max_size=30)


@given(ROWS)
def test_keys_match_the_engines_way(rows):
    # one reader for all the rows, as an import has: its caches are warm after the first rows
    table = Table("catalogue.csv", None, ("part_kind", *DIMENSIONS, "spec"), [])
    reader = KeyReader(table)
    for line, values in enumerate(rows, start=2):
        row = Row(line, values)
        assert _outcome(reader.key, table, row) == _outcome(lambda r: _reference_key(table, r), table, row), values


def test_keys_of_plain_rows():
    table = Table("catalogue.csv", None, ("part_kind", *DIMENSIONS, "spec"), [])
    reader = KeyReader(table)
    # the key format of kit.engine.parts.part_key's docstring; 11.02 in is 279.908 mm, two decimals kept
    assert reader.key(Row(2, {"part_kind": "rod_seal", "d": "280 mm", "D": "300 mm", "L": "25 mm", "spec": "NBR"})) == \
        "rod_seal:d=280:D=300:L=25:nbr"
    assert reader.key(Row(3, {"part_kind": "rod_seal", "d": "11.02 in", "D": "300 mm", "L": "25 mm"})) == \
        "rod_seal:d=279.91:D=300:L=25"
    assert reader.key(Row(4, {"part_kind": "oil", "spec": "HM 46"})) == "oil:hm 46"
