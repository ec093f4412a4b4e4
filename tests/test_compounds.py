# SPDX-License-Identifier: MIT
"""Seal compounds against the fluid (common practice, from seal makers' compatibility charts)."""

from __future__ import annotations

import pytest

import kit.engine.compounds
from kit.engine import compounds
from kit.errors import IncompatibleFluidError


def test_phosphate_ester_refuses_au_and_nbr():
    # HFDR (phosphate ester) attacks AU and NBR; FKM is the usual choice (common practice).
    assert compounds.rating("HFDR", "AU") == "no"
    assert compounds.rating("HFDR", "NBR") == "no"
    choice = compounds.choose("HFDR", "dynamic")
    assert (choice.compound, choice.rating, choice.warning) == ("FKM", "ok", None)
    assert compounds.choose("HFDR", "static").compound == "FKM"


def test_mineral_oil_takes_polyurethane_for_dynamic_and_nitrile_for_static():
    # AU for dynamic and NBR for static seals in mineral oil (common practice).
    assert compounds.choose("HM", "dynamic").compound == "AU"
    assert compounds.choose("HM", "static").compound == "NBR"


def test_epdm_is_refused_in_mineral_oil():
    # EPDM swells in mineral oil (common practice).
    with pytest.raises(IncompatibleFluidError) as info:
        compounds.choose("HM", "dynamic", "EPDM")
    assert str(info.value) == "no seal compound in the table is compatible with HM for dynamic seals in EPDM"


def test_stated_incompatible_compound_raises():
    with pytest.raises(IncompatibleFluidError) as info:
        compounds.choose("HFDR", "dynamic", "NBR")
    assert (info.value.fluid, info.value.function) == ("HFDR", "dynamic seals in NBR")
    assert str(info.value) == "no seal compound in the table is compatible with HFDR for dynamic seals in NBR"
    assert isinstance(info.value, ValueError)


def test_stated_limited_compound_is_kept_with_a_warning():
    choice = compounds.choose("HEES", "dynamic", "AU")
    assert (choice.compound, choice.rating) == ("AU", "limited")
    assert choice.warning == "AU is of limited compatibility with HEES; confirm with the seal maker"


def test_ester_skips_limited_compounds_for_one_rated_ok():
    # HEES: AU and NBR limited, HNBR ok (common practice).
    assert compounds.choose("HEES", "dynamic").compound == "HNBR"


def test_unknown_pair_rates_no():
    assert compounds.rating("HM", "silicone") == "no"


def test_only_limited_compounds_give_a_warning(monkeypatch):
    monkeypatch.setattr(kit.engine.compounds, "rating", lambda cat, c: "limited" if c == "NBR" else "no")
    choice = compounds.choose("HM", "dynamic")
    assert (choice.compound, choice.rating) == ("NBR", "limited")
    assert choice.warning == ("no compound fully compatible with HM for dynamic seals; NBR chosen, "
                              "confirm with the seal maker")


def test_no_compatible_compound_raises(monkeypatch):
    monkeypatch.setattr(kit.engine.compounds, "rating", lambda cat, c: "no")
    with pytest.raises(IncompatibleFluidError, match=r"^no seal compound in the table is compatible with HFC for static seals$"):
        compounds.choose("HFC", "static")


@pytest.mark.parametrize(("category", "compound"), [("HFAE", "NBR"), ("HFAS", "NBR"), ("HFB", "NBR")])
def test_high_water_content_fluids_get_nitrile(category, compound):
    # Seal makers' charts (from memory): NBR for HFA and HFB fluids; polyurethane (AU) at best
    # limited in water (hydrolysis); EPDM not with the mineral oil of HFAE and HFB.
    assert compounds.choose(category, "dynamic").compound == compound
    assert compounds.rating(category, "AU") in ("limited", "no")
    assert compounds.rating("HFAE", "EPDM") == compounds.rating("HFB", "EPDM") == "no"
