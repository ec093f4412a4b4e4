# SPDX-License-Identifier: MIT
"""The spares policy: the default file, a company override merged over it, and refused values."""

from __future__ import annotations

import dataclasses

import pytest

from kit.errors import InputError
from kit.engine.spares import ITEM_KINDS
from kit.files.policy_file import load_policy, policy_from_text


def write(tmp_path, text):
    path = tmp_path / "company.toml"
    path.write_text(text, encoding="utf-8")
    return path


def test_default_policy():
    p = load_policy()
    assert p.name == "kit default" and p.source == "kit default spares policy"
    assert p.spare_filter_sets == 1 and p.housing_length == "medium"
    assert {pkg.name: pkg.volume for pkg in p.packages} == pytest.approx({"pail": 0.020, "drum": 0.208, "IBC": 1.0})
    assert {i.kind for i in p.items} == set(ITEM_KINDS)
    assert all(i.basis.strip() for i in p.items)
    # SOLAS II-1/29.12.3: the storage tank charge is a rule, not a habit.
    assert p.item("storage_oil").basis == "SOLAS II-1/29.12.3"
    assert p.ratings["hose"] == pytest.approx(250e5)
    assert "wiper" not in p.ratings  # a wiper is not a pressure seal: no rating, not checked


def test_override_replaces_values_and_items(tmp_path):
    path = write(tmp_path, """
[policy]
name = "Marrowgate"
spare_filter_sets = 2

[[item]]
kind = "solenoid_coil"
text = "coil"
per = "voltage"
quantity = 4
basis = "company policy"

[[item]]
kind = "hose"
per = "hose_size"
quantity = 0
basis = "company policy"
""")
    p = load_policy(path)
    assert (p.name, p.spare_filter_sets, p.housing_length, p.source) == ("Marrowgate", 2, "medium", str(path))
    coil = p.item("solenoid_coil")
    assert (coil.quantity, coil.basis) == (4, "company policy")
    assert p.item("hose") is None  # quantity 0 drops it
    assert p.item("seal_set") is not None  # untouched items stay


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ("[policy]\nspare_filter_sets = -1\n", "policy.spare_filter_sets: expected a whole number from 0 to 100 (got -1)"),
        ('[policy]\nhousing_length = "huge"\n', "policy.housing_length: expected one of short, medium, long (got 'huge')"),
        ('[[item]]\nkind = "anchor"\nper = "unit"\nquantity = 1\nbasis = "x"\n',
         "item[0].kind: expected one of " + ", ".join(ITEM_KINDS) + " (got 'anchor')"),
        ('[[item]]\nkind = "hose"\nper = "unit"\nquantity = 1\nbasis = " "\n',
         "item[0].basis: expected the basis, e.g. \"common practice\" or \"company policy\" (got ' ')"),
        ('[ratings]\nhose = "250"\n', "ratings.hose: expected a pressure with a unit"),
    ],
)
def test_bad_override_is_refused(tmp_path, text, message):
    path = write(tmp_path, text)
    with pytest.raises(InputError) as info:
        load_policy(path)
    assert str(info.value).startswith(f"{path}: {message}")


def test_unreadable_and_invalid_files(tmp_path):
    with pytest.raises(InputError, match=r"file: expected a readable spares policy file"):
        load_policy(tmp_path / "missing.toml")
    with pytest.raises(InputError, match=r"file: expected valid TOML"):
        load_policy(write(tmp_path, "[policy\n"))


def test_policy_from_stored_text_is_the_file_policy(tmp_path):
    text = '[policy]\nname = "Marrowgate"\nspare_filter_sets = 2\n[[oil.package]]\nname = "drum"\nvolume = "208 L"\n'
    from_file, stored = load_policy(write(tmp_path, text)), policy_from_text(text, "fleet database: fleet-2025")
    assert stored.source == "fleet database: fleet-2025"
    assert stored == dataclasses.replace(from_file, source="fleet database: fleet-2025")
    assert policy_from_text(None) == load_policy()  # no content: kit's default
    with pytest.raises(InputError, match=r"^fleet database: x: policy.housing_length: expected one of short, medium, long"):
        policy_from_text('[policy]\nhousing_length = "huge"\n', "fleet database: x")
    with pytest.raises(InputError, match=r"^fleet database: x: file: expected valid TOML"):
        policy_from_text("[policy", "fleet database: x")


def test_bad_item_is_named_by_its_place_in_the_file(tmp_path):
    path = write(tmp_path, '[[item]]\nkind = "hose"\nper = "unit"\nquantity = 1\nbasis = "company policy"\n'
                           '[[item]]\nkind = "relief_cartridge"\nper = "everywhere"\nquantity = 1\nbasis = "company policy"\n')
    with pytest.raises(InputError) as info:
        load_policy(path)
    assert str(info.value).startswith(f"{path}: item[1].per: expected one of ")
