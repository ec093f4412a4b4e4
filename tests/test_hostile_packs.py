# SPDX-License-Identifier: MIT
"""The catalogue's pack column at its worst: oil with no volume (the trap that turned 773 L into
774 packs), packs in the wrong unit, zero, negative, huge, arithmetic for pint to evaluate, long
text, a bare number from a workbook cell, and pack beside pack_qty. Each is refused with one line
naming file, line and column, exit status 2, and nothing written; the plain forms are read."""

from __future__ import annotations

import pytest
from sqlalchemy import select

from catalog_schema.core_tables import CATALOGUE_ENTRIES
from hostile_support import Fleet, workbook

VOLUME = 'a volume with a unit, e.g. "20 L", "208 L" or "5 US_gal" (the part is counted in litres)'
PIECES = 'a whole number of pieces, e.g. "10 pcs" or "1 set" (the part is counted in pieces)'
RANGE = ", more than 0 and at most 1,000,000 L"
OIL_PACK = 'a pack with its volume for oil, e.g. "208 L" (pack_qty counts pieces)'


@pytest.fixture
def fleet(tmp_path):
    f = Fleet(tmp_path)
    yield f
    f.engine.dispose()


def oil_key(fleet) -> str:
    return next(k for k in fleet.keys if k.startswith("oil:"))


def rod_key(fleet) -> str:
    return next(k for k in fleet.keys if k.startswith("rod_seal:"))


def catalogue(fleet, key: str, pack: str, pack_qty: str = "") -> str:
    return str(fleet.file("cat.csv", f'supplier_ref,part_key,pack,pack_qty,price,currency\nA1,{key},"{pack}",{pack_qty},95,EUR\n'))


@pytest.mark.parametrize("pack, pack_qty, column, expected", [
    ("", "", "pack", f"{OIL_PACK} (got 'an empty cell')"),
    ("", "20", "pack", f"{OIL_PACK} (got 'pack_qty 20')"),  # a bare 20 for oil: no unit, no pack
    ("10 pcs", "", "pack", f"{VOLUME} (got '10 pcs')"),
    ("25 kg", "", "pack", f"{VOLUME} (got '25 kg')"),
    ("20", "", "pack", f"{VOLUME} (got '20')"),
    ("0 L", "", "pack", f"{VOLUME}{RANGE} (got '0 L')"),
    ("-5 L", "", "pack", f"{VOLUME}{RANGE} (got '-5 L')"),
    ("1e9 L", "", "pack", f"{VOLUME}{RANGE} (got '1e9 L')"),
    ("9**9**9 L", "", "pack", f"{VOLUME} (got '9**9**9 L')"),
    ("1 L * 10**400", "", "pack", f"{VOLUME} (got '1 L * 10**400')"),
    ("nan L", "", "pack", f"{VOLUME} (got 'nan L')"),
    ("208 L", "1", "pack_qty", "an empty cell when pack is given (one of the two) (got 1)"),
    # A bare gallon is 3.785 L in the US and 4.546 L in the UK (NIST Handbook 44, Appendix C): a
    # "5 gal" pail read the wrong way is 17 % off, so it must say which.
    ("5 gal", "", "pack", f"{VOLUME}, a gallon, quart, pint or barrel named as US or imperial (5 US_gal, 5 imp_gal) (got '5 gal')"),
    ("5 gallons", "", "pack", f"{VOLUME}, a gallon, quart, pint or barrel named as US or imperial (5 US_gal, 5 imp_gal) (got '5 gallons')"),
    ("4 qt", "", "pack", f"{VOLUME}, a gallon, quart, pint or barrel named as US or imperial (5 US_gal, 5 imp_gal) (got '4 qt')"),
    ("1 barrel", "", "pack", f"{VOLUME}, a gallon, quart, pint or barrel named as US or imperial (5 US_gal, 5 imp_gal) (got '1 barrel')"),
])
def test_bad_oil_packs_are_refused_with_one_line(fleet, pack, pack_qty, column, expected):
    path = catalogue(fleet, oil_key(fleet), pack, pack_qty)
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column {column}: expected {expected}")


def test_long_pack_text_is_cut_in_the_message(fleet):
    path = catalogue(fleet, oil_key(fleet), "2" * 200 + " L")
    fleet.refused(["catalogue", "import", path, "--supplier", "S"],
                  f"{path}, line 2: column pack: expected {VOLUME} (got '{'2' * 60}...')")


@pytest.mark.parametrize("pack, expected", [
    ("20 L", f"{PIECES} (got '20 L')"),
    ("2.5 pcs", f"{PIECES} (got '2.5 pcs')"),
    ("10 bananas", f"{PIECES} (got '10 bananas')"),
    ("0 pcs", f"{PIECES}, more than 0 and at most 1,000,000 pcs (got '0 pcs')"),
])
def test_bad_piece_packs_are_refused(fleet, pack, expected):
    path = catalogue(fleet, rod_key(fleet), pack)
    fleet.refused(["catalogue", "import", path, "--supplier", "S"], f"{path}, line 2: column pack: expected {expected}")


def test_a_number_cell_in_a_workbook_is_no_volume(fleet, tmp_path):
    path = workbook(tmp_path / "cat.xlsx", "catalogue", [["supplier_ref", "part_key", "pack", "currency"],
                                                         ["A1", oil_key(fleet), 208, "EUR"]])
    fleet.refused(["catalogue", "import", path, "--supplier", "S"],
                  f"{path}, sheet catalogue, row 2: column pack: expected {VOLUME} (got '208')")


def test_plain_packs_are_read_in_the_parts_unit(fleet):
    rows = [f"A1,{oil_key(fleet)},5 US_gal,,88,EUR", f"A2,{oil_key(fleet)}, 208  L ,,905,EUR",
            f"A3,{rod_key(fleet)},10 pcs,,40,EUR", f"A4,{rod_key(fleet)},,3,12,EUR"]
    path = fleet.file("ok.csv", "supplier_ref,part_key,pack,pack_qty,price,currency\n" + "\n".join(rows) + "\n")
    done = fleet.kit("catalogue", "import", path, "--supplier", "S")
    assert done.exit_code == 0, done.output
    with fleet.engine.connect() as conn:
        got = {r.supplier_ref: (r.pack_content, r.pack_label, r.pack_qty) for r in conn.execute(select(CATALOGUE_ENTRIES))}
    # 1 US gallon = 231 in^3 = 3.785411784 L (NIST Handbook 44, Appendix C): 5 US gal = 18.92705892 L
    assert got["A1"][0] == pytest.approx(18.92705892, abs=1e-6) and got["A1"][1] == "5 US_gal"
    assert got["A2"][:2] == (208.0, "208 L") and got["A3"] == (10.0, "10 pcs", 10)
    assert got["A4"] == (None, None, 3)  # pack_qty still counts pieces


def test_an_empty_pack_cell_is_named_as_such():
    # an oil line of a reply with its pack left empty: the message says so, not "None"
    from kit.errors import InputError
    from kit.files.packs import read_pack

    with pytest.raises(InputError) as refused:
        read_pack(None, "L", "reply.xlsx, sheet Lines, row 2", "column Your pack")
    assert str(refused.value) == f"reply.xlsx, sheet Lines, row 2: column Your pack: expected {VOLUME} (got an empty cell)"
