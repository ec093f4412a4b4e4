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
from functools import cache
from importlib import resources

from kit.errors import TableChecksumError

CHECKSUMS: dict[str, str] = {
    "iso10766_2015_guide_bands.csv": "b339f99fdd3c7b57c021384890d9aca69997ebb960a8dc06ac0bc340f09f2b8b",
    "iso3320_2013_bores_rods.csv": "656209115532001c8124ecc07b0b01fdb15c9add045c3593d9e824a558728b3c",
    "iso3448_1992_viscosity_grades.csv": "8bf660be3d2d7969ba6cc2332c1da7b7d8f9e8672f47f5ce2f39153e60138297",
    "iso3601_1_2012_o_ring_sizes.csv": "0edc9ec5bee374fc3b1de5882187b6d24ef0548ae9be92d1c354ff6d249c0e73",
    "iso3601_2_2016_static_radial_glands.csv": "35ce0e2649f01aa681291a5443d0dcab38d17689d331cec0dae2262452ecc1fa",
    "iso4217_2015_currency_codes.csv": "5ad58d03ed32732969ddfdbcfd520f4af44a711dcee0d6924bf5c7ef7eb88d12",
    "iso5597_2018_housing_bands.csv": "fc91532cb2e398c3b080971367d3237c3fc3fea5900b7ef8bc401665850f3f8a",
    "iso6195_2013_wiper_bands.csv": "0206448b283e01acc31c5f4dacde0c86a461ed24b3f223027441c653414bf4b9",
    "seal_compound_compatibility.csv": "7be82b312a6727039728d6d0464a5b88c065566e1b2fd1b0403e7f20dc515d91",
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
