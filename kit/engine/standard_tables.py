# SPDX-License-Identifier: MIT
"""Transcribed standard tables, read from ``kit/data/`` and guarded by a checksum.

Each CSV is named after its source (``iso3320_2013_bores_rods.csv`` is ISO 3320:2013) and
carries a ``provenance`` column: ``from memory`` where the row could not be confirmed from the
standard itself, ``common practice`` for trade rules of thumb. A table whose bytes no longer
match the checksum recorded here raises :class:`~kit.errors.TableChecksumError`, so a slip of
the keyboard in a data file cannot pass unnoticed; after a deliberate correction, update the
checksum (see DEVELOPERS.md).
"""

from __future__ import annotations

import csv
import hashlib
import io
from dataclasses import dataclass
from functools import cache
from importlib import resources

from kit.errors import TableChecksumError

CHECKSUMS: dict[str, str] = {
    "iso10766_2015_guide_bands.csv": "ef8b77202ddaad1b7e96dbf8b24e02eca2aa611324919274a60c5398251cc260",
    "iso3320_2013_bores_rods.csv": "656209115532001c8124ecc07b0b01fdb15c9add045c3593d9e824a558728b3c",
    "iso3448_1992_viscosity_grades.csv": "8bf660be3d2d7969ba6cc2332c1da7b7d8f9e8672f47f5ce2f39153e60138297",
    "iso3601_1_2012_o_ring_sizes.csv": "0edc9ec5bee374fc3b1de5882187b6d24ef0548ae9be92d1c354ff6d249c0e73",
    "iso3601_2_2016_static_radial_glands.csv": "35ce0e2649f01aa681291a5443d0dcab38d17689d331cec0dae2262452ecc1fa",
    "iso4217_2015_currency_codes.csv": "5ad58d03ed32732969ddfdbcfd520f4af44a711dcee0d6924bf5c7ef7eb88d12",
    "iso5597_2018_housing_bands.csv": "ec9aebdbdcd0a9f7220296f41ceb0f7b4c3a8d90d2e7982c50acbb9c6d28e949",
    "iso6195_2013_wiper_bands.csv": "35e77e66e4b9e539623987df90a8f3555fc0fe4ca582495877433a29b9d42f76",
    "seal_compound_compatibility.csv": "61b4276b692d125c3436a54fab2b7a7fcf16f3f6f711b83be8f6084c05da0a4a",
}


@dataclass(frozen=True)
class Scope:
    """The sizes a standard covers [mm], per side ("rod", "piston", "bore", "inside diameter"), and
    where that was read. A size past it is sized by the table's proportions and labelled as kit's
    extrapolation, never as the standard's size."""

    standard: str
    ranges: dict[str, tuple[float, float]]
    source: str

    def covers(self, side: str, size_mm: float) -> bool:
        low, high = self.ranges[side]
        return low <= size_mm <= high

    def text(self, side: str) -> str:
        low, high = self.ranges[side]
        return f"{self.standard} covers {_PLURAL[side]} of {low:g}-{high:g} mm"


_PLURAL = {"rod": "rods", "piston": "bores", "bore": "bores", "inside diameter": "inside diameters"}


SCOPES: dict[str, Scope] = {
    "iso6195_2013_wiper_bands.csv": Scope(
        "ISO 6195:2013", {"rod": (4, 360)},
        "ISO 6195:2013 clause 1 as its published abstract states it (rods 4-360 mm; housing types A-E)"),
    "iso5597_2018_housing_bands.csv": Scope(
        "ISO 5597", {"rod": (6, 360), "piston": (16, 500)},
        "from memory: rods 6-360 mm and bores 16-500 mm (1987 edition); the file is named for the 2018 "
        "edition, whose scope was not confirmed"),
    "iso10766_2015_guide_bands.csv": Scope(
        "ISO 10766", {"rod": (12, 360), "piston": (16, 500)},
        "bores 16-500 mm and rods 12-360 mm as a public summary of the 2006 edition states them; "
        "the 2015 edition's scope from memory"),
    "iso3320_2013_bores_rods.csv": Scope(
        "ISO 3320:2013", {"bore": (8, 500), "rod": (4, 500)}, "the table's own range, from memory"),
    "iso3601_1_2012_o_ring_sizes.csv": Scope(
        "ISO 3601-1:2012", {"inside diameter": (1.8, 670)},
        "the table's own range, from memory; past it kit gives vulcanised cord, labelled as such"),
}


def table_bytes(name: str) -> bytes:
    return resources.files("kit.data").joinpath(name).read_bytes()


def sha256(name: str) -> str:
    return hashlib.sha256(table_bytes(name)).hexdigest()


@cache
def load_table(name: str) -> tuple[dict[str, str], ...]:
    """Rows of the CSV table ``name`` as dicts of strings, after checking its checksum."""
    data = table_bytes(name)
    actual = hashlib.sha256(data).hexdigest()
    expected = CHECKSUMS.get(name, "")
    if actual != expected:
        raise TableChecksumError(name, expected or "(none)", actual)
    return tuple(csv.DictReader(io.StringIO(data.decode("utf-8"))))
