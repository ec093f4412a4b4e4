# SPDX-License-Identifier: MIT
"""Requirements over every demo vessel, and the line items of one unit."""

from __future__ import annotations

from pathlib import Path

import pytest

from engine_helpers import ram_unit, vessel
from kit.engine import solas
from kit.files.particulars_file import load_vessel
from kit.engine.requirements import assess_vessel
from kit.files.policy_file import load_policy

DEMO = sorted((Path(__file__).resolve().parent.parent / "demo_fleet").glob("*.toml"))
POLICY = load_policy()
SEAL_KINDS = {"piston_seal", "rod_seal", "stock_seal", "wiper", "guide_ring"}


def test_demo_fleet_found():
    assert len(DEMO) >= 6


@pytest.fixture(scope="module", params=DEMO, ids=lambda p: p.stem)
def result(request):
    return assess_vessel(load_vessel(request.param), 90, POLICY)


def test_quantities_non_negative_and_every_line_has_a_basis(result):
    assert result.lines
    for line in result.lines:
        assert line.quantity >= 0, line
        assert line.basis.strip(), line


def test_every_seal_line_has_d_below_D(result):
    for line in result.lines:
        if line.kind in SEAL_KINDS:
            assert line.dims["d"] < line.dims["D"], line
    for u in result.units:
        for s in u.kit.lines:
            if s.housing is not None:
                assert s.housing.d < s.housing.D
            if s.oring is not None:
                assert s.oring.groove_diameter < s.oring.bore


def test_demo_steering_units_meet_the_28_s_rule(result):
    # SOLAS II-1/29.3.2: 35 deg to 30 deg in not more than 28 s, judged on the 29.6.1 case.
    steering = [u for u in result.units if u.unit.is_steering]
    assert steering
    for u in steering:
        assert u.checks.swing_time_judged <= solas.SWING_LIMIT_S
        assert u.checks.swing_rule_met is True


def test_oil_plans_cover_storage_and_top_up(result):
    for fluid, plan in result.oil_plans.items():
        need = sum((u.storage_tank_min or 0) + u.top_up for u in result.units if u.unit.fluid == fluid)
        assert plan.need == pytest.approx(need)
        assert plan.supply >= need - 1e-12


def test_unit_lines_by_hand():
    data = ram_unit(system_oil="450 L", oil_leakage="0.5 L/day", pump_model="axial piston",
                    filter=[{"position": "return", "elements": 2, "change_interval": "2000 h"}],
                    solenoid=[{"voltage": "24 V DC", "count": 2}], hose=[{"bore": "25 mm", "count": 4}])
    r = assess_vessel(vessel(data), 90, POLICY)
    u = r.units[0]
    by_kind = {}
    for line in u.lines:
        by_kind.setdefault(line.kind, []).append(line)
    # Default policy: one seal set per distinct actuator size; two rams of one size take one set.
    rod = by_kind["rod_seal"][0]
    assert (rod.quantity, rod.basis) == (1, "common practice")
    assert by_kind["guide_ring"][0].quantity == 2  # two guide rings in a ram's set
    storage, top = by_kind["oil"]
    assert (storage.quantity, storage.uom, storage.basis) == (pytest.approx(450), "L", "SOLAS II-1/29.12.3")
    assert top.quantity == pytest.approx(45)  # 0.5 L/day x 90 days
    # 2160 h on 2000 h elements: 2 changes + 1 spare set, 2 elements each.
    assert by_kind["filter_element"][0].quantity == 6
    assert u.filters[0].changes == 2
    assert by_kind["spare"]
    assert r.oil_plans[u.unit.fluid].need == pytest.approx(0.495)


def test_zero_days():
    r = assess_vessel(vessel(ram_unit(filter=[{"position": "return", "elements": 1, "change_interval": "2000 h"}])), 0, POLICY)
    assert r.units[0].top_up == 0
    assert r.units[0].filters[0].elements == 1  # the spare set only


def test_negative_days_are_refused():
    with pytest.raises(ValueError, match="days must not be negative"):
        assess_vessel(vessel(ram_unit()), -1, POLICY)


def _fleet_order(*units: dict, sisters: bool = False) -> dict[str, list]:
    """Two or more one-unit vessels consolidated: designation -> (quantity, vessels) of each spare and
    filter line. Unless ``sisters``, each vessel's gross tonnage differs by a tonne, so that vessels
    with alike units are no series of hulls (kit.engine.series_of_hulls) and keep their own parts apart."""
    from dataclasses import replace

    from kit.engine.bom import consolidate

    results = [assess_vessel(replace(vessel(u, gross_tonnage=8000 + (0 if sisters else i)), id=f"V{i}"), 90, POLICY)
               for i, u in enumerate(units, 1)]
    return {line.designation: (line.required, sorted(line.split)) for line in consolidate(results).lines
            if line.kind in ("spare", "filter_element")}


BLOCK = {"valve_maker": "Tarnwick Hydraulik", "valve_model": "TVB-16", "maker": "Quillmarsh Steering Gear", "model": "QR2"}
FILTER = [{"position": "return", "elements": 1, "change_interval": "2000 h"}]


def test_identical_valve_blocks_consolidate_across_vessels_and_name_their_maker():
    coils = [{"voltage": "24 V DC", "count": 2}]
    lines = _fleet_order(ram_unit(**BLOCK, solenoid=coils), ram_unit(**BLOCK, solenoid=coils))
    # One kit a block (kit default policy), one block each: one line for both vessels.
    assert lines["valve block seal kit, valve block Tarnwick Hydraulik TVB-16"] == (2, ["V1", "V2"])
    bar = f"{float(ram_unit()['working_pressure'].split()[0]):g} bar"
    assert lines[f"relief valve cartridge, set to the working pressure, {bar}, valve block Tarnwick Hydraulik TVB-16"] == (2, ["V1", "V2"])
    assert lines["solenoid coil, 24 V DC, for valve block Tarnwick Hydraulik TVB-16"][1] == ["V1", "V2"]


def test_without_makers_each_units_valve_kit_is_its_own_line_naming_vessel_and_unit():
    lines = _fleet_order(ram_unit(), ram_unit())
    assert lines["valve block seal kit, steering unit SG1, vessel V1"] == (1, ["V1"])
    assert lines["valve block seal kit, steering unit SG1, vessel V2"] == (1, ["V2"])
    # sister ships built alike: each hull's own kit is the first hull's part, one line for the series
    sisters = _fleet_order(ram_unit(), ram_unit(), sisters=True)
    assert sisters["valve block seal kit, steering unit SG1, each hull of the V1 series"] == (2, ["V1", "V2"])
    assert not any("vessel V" in d for d in sisters)


def test_pump_shaft_seals_of_two_makers_stay_apart_and_name_them():
    lines = _fleet_order(ram_unit(pump_model="PX-36", pump_maker="Fennowby Pumpworks"), ram_unit(pump_model="PX-36", pump_maker="Ardley Pumps"))
    assert lines["pump shaft seal, Fennowby Pumpworks PX-36"] == (1, ["V1"])
    assert lines["pump shaft seal, Ardley Pumps PX-36"] == (1, ["V2"])


def test_hoses_of_one_bore_at_two_pressures_are_two_lines():
    hose = [{"bore": "19 mm", "count": 2}]
    lines = _fleet_order(ram_unit(hose=hose, working_pressure="125 bar"), ram_unit(hose=hose, working_pressure="180 bar"))
    assert lines["hydraulic hose assembly, bore 19 mm, 125 bar working"] == (1, ["V1"])
    assert lines["hydraulic hose assembly, bore 19 mm, 180 bar working"] == (1, ["V2"])


def test_filter_elements_carry_the_vessel_or_consolidate_by_reference():
    referenced = [{**FILTER[0], "element": "Tarnwick RF-160-10"}]
    lines = _fleet_order(ram_unit(filter=FILTER), ram_unit(filter=FILTER), ram_unit(filter=referenced), ram_unit(filter=referenced))
    # 2160 h on 2000 h elements: 2 changes + 1 spare set (as test_unit_lines_by_hand), one element each.
    assert lines["filter element, return filter, steering unit SG1, vessel V1"] == (3, ["V1"])
    assert lines["filter element, return filter, steering unit SG1, vessel V2"] == (3, ["V2"])
    assert lines["filter element, return filter, element Tarnwick RF-160-10"] == (6, ["V3", "V4"])
