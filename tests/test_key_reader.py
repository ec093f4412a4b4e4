# SPDX-License-Identifier: MIT
"""The catalogue's length shortcut gives pint's own float, and pint's own refusal."""

from hypothesis import given
from hypothesis import strategies as st

from kit.errors import InputError
from kit.files.part_keys import KeyReader
from kit.files.sheets import Table
from kit.engine.units import to_si

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
