# SPDX-License-Identifier: MIT
"""The transcribed tables: checksums guard each file, and a tampered file is refused."""

from __future__ import annotations

import csv
import hashlib
import io
from importlib import resources

import pytest

import kit.engine.standard_tables
from kit.errors import TableChecksumError
from kit.engine.standard_tables import CHECKSUMS, load_table

DATA = resources.files("kit.data")
CSV_FILES = sorted(p.name for p in DATA.iterdir() if p.name.endswith(".csv"))


@pytest.fixture
def fresh_cache():
    load_table.cache_clear()
    yield
    load_table.cache_clear()


def test_every_csv_has_a_recorded_checksum():
    assert CSV_FILES, "no tables found in kit/data"
    assert set(CSV_FILES) == set(CHECKSUMS)


@pytest.mark.parametrize("name", CSV_FILES)
def test_checksum_matches_file(name):
    # Recomputed here with hashlib, independently of kit.engine.standard_tables.sha256.
    assert hashlib.sha256(DATA.joinpath(name).read_bytes()).hexdigest() == CHECKSUMS[name]


@pytest.mark.parametrize("name", CSV_FILES)
def test_every_row_names_its_provenance(name):
    rows = list(csv.DictReader(io.StringIO(DATA.joinpath(name).read_text(encoding="utf-8"))))
    assert rows
    # A row is from memory, common practice, confirmed from a named public source, or kit's own
    # extrapolation past the standard's scope (DEVELOPERS.md, "Adding or correcting a standard table").
    for r in rows:
        p = r["provenance"]
        assert p in {"from memory", "common practice", "published"} or (
            p.startswith(("confirmed (", "kit extrapolation: ")) and len(p) > 40), p


@pytest.mark.parametrize("name", CSV_FILES)
def test_load_table_returns_the_csv_rows(name, fresh_cache):
    rows = list(csv.DictReader(io.StringIO(DATA.joinpath(name).read_text(encoding="utf-8"))))
    assert list(load_table(name)) == rows


def test_tampered_table_raises(monkeypatch, fresh_cache):
    name = "iso3320_2013_bores_rods.csv"
    original = DATA.joinpath(name).read_bytes()
    tampered = original.replace(b"bore,320,preferred", b"bore,330,preferred")
    assert tampered != original
    monkeypatch.setattr(kit.engine.standard_tables, "table_bytes", lambda n: tampered if n == name else original)
    with pytest.raises(TableChecksumError) as info:
        load_table(name)
    err = info.value
    assert err.table == name
    assert err.expected == CHECKSUMS[name]
    assert err.actual == hashlib.sha256(tampered).hexdigest()
    assert str(err) == f"data table {name} changed: sha256 {err.actual}, recorded {CHECKSUMS[name]}"


def test_table_without_a_checksum_raises(monkeypatch, fresh_cache):
    monkeypatch.setattr(kit.engine.standard_tables, "table_bytes", lambda n: b"a,b\n1,2\n")
    with pytest.raises(TableChecksumError, match=r"data table extra\.csv changed: .* recorded \(none\)"):
        load_table("extra.csv")


def test_checksum_error_is_a_runtime_error():
    assert issubclass(TableChecksumError, RuntimeError)


def test_iso10766_corrected_rows():
    # Trelleborg Sealing Solutions, Orkot Slydring wear rings catalogue (January 2011), table XLII,
    # installation dimensions to ISO 10766: t 1.55 mm sits in a 4.0 mm groove (bores 16-50 mm);
    # t 4.0 mm in a 25.0 mm groove up to 999.9 mm.
    from kit.engine import housings

    small = housings.guide_housing(40, "piston")
    assert (small.extra["t"], small.L, small.d) == (1.55, 4.0, 40 - 3.10)
    big = housings.guide_housing(700, "piston")
    assert (big.extra["t"], big.L, big.d) == (4.0, 25.0, 700 - 8.0)
    assert big.standard == "kit extrapolation of ISO 10766" and "16-500" in big.past_scope


@pytest.mark.parametrize(("build", "inside", "past"), [
    ("wiper_housing", 360, 361), ("rod_seal_housing", 360, 361), ("piston_seal_housing", 500, 16 - 1)])
def test_scope_edges_label_the_extrapolation(build, inside, past):
    # ISO 6195:2013 covers rods 4-360 mm (its published abstract); ISO 5597 rods 6-360 mm and bores
    # 16-500 mm (from memory).
    from kit.engine import housings

    within, beyond = getattr(housings, build)(inside), getattr(housings, build)(past)
    assert within.past_scope == "" and within.standard.startswith("ISO ")
    assert beyond.past_scope and beyond.standard.startswith("kit extrapolation of ISO ")
