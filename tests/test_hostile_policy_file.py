# SPDX-License-Identifier: MIT
"""The company spares policy file (TOML), at its worst: keys and tables kit does not know (a
typing error that would leave the default in force unseen), ratings that are zero, negative or
past any component, oil packages too small to be bought, counts past any fleet, control
characters. Each is refused naming the key, with one line and exit status 2, whether the file
is given with --policy or stored with kit policy set --file (and then nothing is stored); a
policy stored by another program is refused the same way when it is read."""

from __future__ import annotations

import sqlite3

import pytest

from hostile_support import Fleet, refused_without_db

KNOWN_TOP = "a known key here (item, oil, policy, ratings)"

CASES = [
    ("unknown top-level key", 'polcy = "x"\n', "polcy", f"{KNOWN_TOP} (got an unknown key)"),
    ("unknown table", "[oils]\n", "oils", f"{KNOWN_TOP} (got an unknown key)"),
    ("unknown key in [policy]", "[policy]\nspare_filter_set = 2\n", "policy.spare_filter_set",
     "a known key here (housing_length, name, spare_filter_sets) (got an unknown key)"),
    ("unknown key in [[item]]", '[[item]]\nkind = "hose"\nper = "unit"\nquantity = 1\nbasis = "x"\nqty = 2\n', "item[0].qty",
     "a known key here (basis, kind, per, quantity, text) (got an unknown key)"),
    ("unknown key in [[oil.package]]", '[[oil.package]]\nname = "can"\nvolume = "5 L"\nprice = 3\n', "oil.package[0].price",
     "a known key here (name, volume) (got an unknown key)"),
    ("unknown table in [oil]", "[oil.tank]\n", "oil.tank", "a known key here (package) (got an unknown key)"),
    ("policy not a table", "policy = 3\n", "policy", "a table ([policy]) (got int)"),
    ("zero rating", '[ratings]\nhose = "0 bar"\n', "ratings.hose",
     "a positive pressure of at most 10,000 bar (leave out what is not rated) (got '0 bar')"),
    ("negative rating", '[ratings]\nhose = "-250 bar"\n', "ratings.hose",
     "a positive pressure of at most 10,000 bar (leave out what is not rated) (got '-250 bar')"),
    ("rating past any component", '[ratings]\nhose = "1e300 bar"\n', "ratings.hose",
     "a positive pressure of at most 10,000 bar (leave out what is not rated) (got '1e300 bar')"),
    ("infinite rating", "[ratings]\nhose = inf\n", "ratings.hose", 'a pressure with a unit, e.g. "160 bar" or "2400 psi" (got inf)'),
    ("tiny package", '[[oil.package]]\nname = "sachet"\nvolume = "0.1 L"\n', "oil.package[0].volume",
     "a volume of at least 0.5 L (got '0.1 L')"),
    ("package in mL by mistake", '[[oil.package]]\nname = "drum"\nvolume = "208 mL"\n', "oil.package[0].volume",
     "a volume of at least 0.5 L (got '208 mL')"),
    ("zero package", '[[oil.package]]\nname = "none"\nvolume = "0 L"\n', "oil.package[0].volume",
     "a volume of at least 0.5 L (got '0 L')"),
    ("spare sets past any fleet", "[policy]\nspare_filter_sets = 9223372036854775807\n", "policy.spare_filter_sets",
     "a whole number from 0 to 100 (got 9223372036854775807)"),
    ("item quantity past any fleet", '[[item]]\nkind = "hose"\nper = "unit"\nquantity = 1001\nbasis = "x"\n', "item[0].quantity",
     "a whole number from 0 to 1000 (got 1001)"),
    ("control character in an item", '[[item]]\nkind = "hose"\nper = "unit"\nquantity = 1\nbasis = "x"\ntext = "hose\\u001b[2J"\n',
     "item[0].text", "text without control characters (tab, newline, NUL, escape and the like) or bytes that are not UTF-8 "
                     "(got 'hose\\x1b[2J', U+001B at character 5)"),
    ("control character in the name", '[policy]\nname = "Co\\u0085"\n', "policy.name",
     "text without control characters (tab, newline, NUL, escape and the like) or bytes that are not UTF-8 "
     "(got 'Co\\x85', U+0085 at character 3)"),
]


@pytest.mark.parametrize(("text", "field", "expected"), [c[1:] for c in CASES], ids=[c[0] for c in CASES])
def test_a_bad_policy_file_is_refused_naming_the_key(tmp_path, text, field, expected):
    from db_support import TOML_CYLINDER

    vessel = tmp_path / "v.toml"
    vessel.write_text(TOML_CYLINDER)
    policy = tmp_path / "company.toml"
    policy.write_text(text, encoding="utf-8")
    refused_without_db(["calc", vessel, "--policy", policy], f"{policy}: {field}: expected {expected}")
    fleet = Fleet(tmp_path)
    try:
        fleet.refused(["policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", "90", "--from", "2025-01-01",
                       "--file", policy], f"{policy}: {field}: expected {expected}")
    finally:
        fleet.engine.dispose()


def test_a_policy_stored_by_another_program_with_an_unknown_key_is_refused_when_read(tmp_path):
    fleet = Fleet(tmp_path)
    policy = fleet.file("good.toml", '[policy]\nname = "Brackwater"\n')
    assert fleet.kit("policy", "set", "--vessel", "TEST-ONE", "--name", "p", "--days", "90", "--from", "2025-01-01",
                     "--file", policy).exit_code == 0
    fleet.engine.dispose()
    with sqlite3.connect(tmp_path / "fleet.sqlite") as db:
        db.execute("UPDATE spares_policies SET content = ?", ('[policy]\nname = "Brackwater"\nspare_filter_set = 3\n',))
    fleet.refused(["policy", "show", "--vessel", "TEST-ONE", "--on", "2025-06-01"],
                  "fleet database: p, vessel policy from 2025-01-01: policy.spare_filter_set: expected a known key here "
                  "(housing_length, name, spare_filter_sets) (got an unknown key)")


def test_the_default_policy_passes_its_own_checks():
    """kit's own file holds only known keys, positive ratings and packages a supplier sells."""
    from kit.engine.spares import MIN_PACKAGE_L, SCHEMA, default_policy_data
    from kit.files.policy_file import load_policy

    data = default_policy_data()
    assert set(data) <= set(SCHEMA)
    policy = load_policy()
    assert all(r > 0 for r in policy.ratings.values())
    # A 20 L pail, a 208 L (55 US gal) drum, a 1,000 L IBC: common practice for hydraulic oil.
    assert sorted(round(p.volume * 1000, 6) for p in policy.packages) == [20.0, 208.0, 1000.0]
    assert min(p.volume for p in policy.packages) * 1000 >= MIN_PACKAGE_L
