# SPDX-License-Identifier: MIT
"""The transcribed tables: checksums guard each file, and a tampered file is refused."""

from __future__ import annotations

import csv
import hashlib
import io
from importlib import resources

import pytest

import kit.tables
from kit.errors import TableChecksumError
from kit.tables import CHECKSUMS, load_table

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
    # Recomputed here with hashlib, independently of kit.tables.sha256.
    assert hashlib.sha256(DATA.joinpath(name).read_bytes()).hexdigest() == CHECKSUMS[name]


@pytest.mark.parametrize("name", CSV_FILES)
def test_every_row_names_its_provenance(name):
    rows = list(csv.DictReader(io.StringIO(DATA.joinpath(name).read_text(encoding="utf-8"))))
    assert rows
    assert {r["provenance"] for r in rows} <= {"from memory", "common practice", "published"}


@pytest.mark.parametrize("name", CSV_FILES)
def test_load_table_returns_the_csv_rows(name, fresh_cache):
    rows = list(csv.DictReader(io.StringIO(DATA.joinpath(name).read_text(encoding="utf-8"))))
    assert list(load_table(name)) == rows


def test_tampered_table_raises(monkeypatch, fresh_cache):
    name = "iso3320_2013_bores_rods.csv"
    original = DATA.joinpath(name).read_bytes()
    tampered = original.replace(b"bore,320,preferred", b"bore,330,preferred")
    assert tampered != original
    monkeypatch.setattr(kit.tables, "table_bytes", lambda n: tampered if n == name else original)
    with pytest.raises(TableChecksumError) as info:
        load_table(name)
    err = info.value
    assert err.table == name
    assert err.expected == CHECKSUMS[name]
    assert err.actual == hashlib.sha256(tampered).hexdigest()
    assert str(err) == f"data table {name} changed: sha256 {err.actual}, recorded {CHECKSUMS[name]}"


def test_table_without_a_checksum_raises(monkeypatch, fresh_cache):
    monkeypatch.setattr(kit.tables, "table_bytes", lambda n: b"a,b\n1,2\n")
    with pytest.raises(TableChecksumError, match=r"data table extra\.csv changed: .* recorded \(none\)"):
        load_table("extra.csv")


def test_checksum_error_is_a_runtime_error():
    assert issubclass(TableChecksumError, RuntimeError)
