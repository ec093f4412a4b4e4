# SPDX-License-Identifier: MIT
"""Seal kits per actuator kind: which seals, how many, their housings and compounds."""

from __future__ import annotations

import pytest

from engine_helpers import cylinder_unit, ram_unit, unit, vane_unit
from kit.engine import housings, orings
from kit.errors import IncompatibleFluidError
from kit.engine.seal_kit import DRAWING, build_seal_kit, mm


def roles(kit):
    return [(s.role, s.qty_per_actuator) for s in kit.lines]


def test_ram_kit():
    # Per ram: rod seal, wiper, two guide rings, gland spigot O-ring (common practice).
    kit = build_seal_kit(unit(ram_unit(ram_diameter="280 mm")))
    assert kit.actuators == 2
    assert roles(kit) == [("rod", 1), ("wiper", 1), ("guide", 2), ("o-ring", 1)]
    rod, wiper, guide, oring = kit.lines
    assert rod.housing == housings.rod_seal_housing(280)
    assert wiper.housing == housings.wiper_housing(280)
    assert guide.housing == housings.guide_housing(280, "rod")
    assert (rod.compound, oring.compound) == ("AU", "NBR")  # mineral oil (common practice)
    # Spigot: next ISO 3320 bore above the larger gland housing D (310 mm): 320 mm (from memory),
    # an assumption the kit says it made.
    assert oring.oring == orings.static_oring(320.0)
    assert kit.warnings == ["gland spigot O-ring sized on an assumed spigot bore of 320 mm (the next ISO 3320 bore "
                            "above the gland's seal housings); state gland_spigot_bore from the maker's drawing"]


def test_ram_gland_spigot_from_the_particulars():
    # A spigot bore stated from the maker's drawing is used as it is, and nothing is assumed.
    kit = build_seal_kit(unit(ram_unit(ram_diameter="280 mm", gland_spigot_bore="330 mm")))
    oring = kit.lines[-1]
    assert oring.oring == orings.static_oring(330.0)
    assert "from the particulars" in oring.part
    assert kit.warnings == []


def test_vane_stock_and_hub_seals_are_labelled_for_oscillating_service_and_past_scope():
    # ISO 5597 is for reciprocating seals, rods 6-360 mm (from memory): a 380 mm stock and a 500 mm
    # hub are sized by its rod proportions as kit's extrapolation, for oscillating service.
    kit = build_seal_kit(unit(vane_unit()))
    stock, hub = [s for s in kit.lines if s.role == "stock"]
    assert "oscillating" in stock.part and "oscillating" in hub.part
    assert stock.housing.standard == "kit sizing for oscillating service (ISO 5597 rod proportions)"
    assert (stock.housing.d, stock.housing.D) == (380, housings.rod_seal_housing(380).D)
    assert [w.split(":")[0] for w in kit.warnings] == ["stock seal housing", "hub seal housing"]
    assert "ISO 5597 covers rods of 6-360 mm" in kit.warnings[0]


def test_cylinder_kit():
    # Per cylinder: piston seal, 2 piston guides, rod seal, wiper, rod guide, 2 static O-rings (common practice).
    kit = build_seal_kit(unit(cylinder_unit(bore="200 mm", rod="140 mm")))
    assert roles(kit) == [("piston", 1), ("guide", 2), ("rod", 1), ("wiper", 1), ("guide", 1), ("o-ring", 2)]
    assert kit.lines[0].housing == housings.piston_seal_housing(200)
    assert kit.lines[1].housing.side == "piston"
    assert kit.lines[4].housing.side == "rod"
    assert kit.lines[5].oring == orings.static_oring(200.0)


def test_vane_kit_strip_length():
    # Vane strip runs up one side of the vane, along the top and down: h + 2 (R - r).
    kit = build_seal_kit(unit(vane_unit(vanes=2, vane_height="450 mm", housing_bore="900 mm", hub_diameter="500 mm")))
    assert kit.actuators == 1
    strip = kit.lines[0]
    assert (strip.role, strip.qty_per_actuator) == ("vane", 4)  # moving and fixed vanes
    assert strip.strip_length_mm == pytest.approx(450 + 2 * (450 - 250))
    assert strip.strip_height_mm == 450
    stock = [s for s in kit.lines if s.role == "stock"]
    assert [s.housing.d for s in stock] == [380, 500]
    assert all(s.qty_per_actuator == 2 for s in stock)


def test_stated_housing_wins():
    kit = build_seal_kit(unit(ram_unit(housing=[{"role": "rod", "d": "280 mm", "D": "300 mm", "L": "22 mm"}])))
    rod = kit.lines[0].housing
    assert (rod.d, rod.D, rod.L, rod.origin) == (280, 300, 22, DRAWING)


def test_phosphate_ester_kit_is_fkm():
    # HFDR: FKM for dynamic and static seals (common practice).
    kit = build_seal_kit(unit(ram_unit(fluid="HFDR 46")))
    assert {s.compound for s in kit.lines if s.role != "guide"} == {"FKM"}


def test_stated_incompatible_compound_raises():
    with pytest.raises(IncompatibleFluidError, match=r"^no seal compound in the table is compatible with HFDR for dynamic seals in AU$"):
        build_seal_kit(unit(ram_unit(fluid="HFDR 46")), stated_compound="AU")


def test_off_series_ram_warns_as_ram():
    kit = build_seal_kit(unit(ram_unit(ram_diameter="330.2 mm")))
    assert kit.warnings[0] == ("ram 330.2 mm is not in the ISO 3320 series; nearest series sizes 320 mm and 360 mm; "
                               "housings sized for the actual diameter")


def test_out_of_series_housing_warns_and_drops_the_line():
    # A 1 m vane stock is past the ISO 5597 rod housings (800 mm, from memory).
    kit = build_seal_kit(unit(vane_unit(housing_bore="2000 mm", hub_diameter="1200 mm", stock_diameter="1000 mm")))
    assert [s.housing.d for s in kit.lines if s.role == "stock"] == []
    assert kit.warnings[0] == ("stock seal housing: 1000 mm lies outside ISO 5597 rod seal housings (limit 800 mm); "
                               "take its dimensions from the maker's drawing")


def test_mm_rounds_to_a_micrometre():
    assert mm(0.7) == 700.0
    assert mm(0.2801234) == 280.123
