# SPDX-License-Identifier: MIT
"""The particulars reader: good files load in SI, bad ones name the file, the field and what was expected."""

from __future__ import annotations

import copy
import math
import tomllib
from pathlib import Path

import pytest

from kit.errors import InputError
from kit.engine.particulars import vessel_from_dict
from kit.files.particulars_file import load_folder, load_vessel

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"

BASE = {
    "vessel": {"id": "TEST-1", "name": "Test Vessel", "ship_type": "cargo", "gross_tonnage": 5000},
    "unit": [{
        "id": "SG1", "service": "steering", "actuator": "ram", "count": 2,
        "ram_diameter": "200 mm", "stroke": "800 mm", "tiller_radius": "500 mm",
        "max_rudder_angle": "35 deg", "working_pressure": "160 bar", "fluid": "HM 46",
        "pumps": 2, "pump_flow": "60 L/min", "reservoir": "250 L",
        "filter": [{"position": "return", "elements": 1, "change_interval": "2000 h"}],
    }],
}


def with_unit(**changes):
    data = copy.deepcopy(BASE)
    for key, value in changes.items():
        if value is None:
            data["unit"][0].pop(key, None)
        else:
            data["unit"][0][key] = value
    return data


def test_demo_fleet_loads():
    vessels = load_folder(DEMO)
    assert len(vessels) >= 6
    kinds = {(v.ship_type, u.actuator) for v in vessels for u in v.units}
    assert ("cargo", "ram") in kinds and ("tanker", "ram") in kinds and ("passenger", "rotary_vane") in kinds
    assert any(u.actuator == "cylinder" and u.is_steering for v in vessels for u in v.units)
    assert any(not u.is_steering for v in vessels for u in v.units)


def test_values_are_si():
    v = vessel_from_dict(BASE, "t.toml")
    u = v.units[0]
    assert u.geometry.ram_diameter == pytest.approx(0.200)
    assert u.working_pressure == pytest.approx(160e5)  # 1 bar = 1e5 Pa (ISO 80000-4)
    assert u.pump_flow == pytest.approx(0.060 / 60)
    assert u.reservoir == pytest.approx(0.250)
    assert u.max_rudder_angle == pytest.approx(math.radians(35))
    assert u.filters[0].change_interval == pytest.approx(2000 * 3600)


@pytest.mark.parametrize(
    "changes, field, expected",
    [
        ({"ram_diameter": "200"}, "unit[0].ram_diameter", "a length with a unit"),
        ({"ram_diameter": 200}, "unit[0].ram_diameter", "a length with a unit"),
        ({"working_pressure": "180 mm"}, "unit[0].working_pressure", "a pressure with a unit"),
        ({"ram_diameter": "-200 mm"}, "unit[0].ram_diameter", "a positive length"),
        ({"ram_diameter": "0 mm"}, "unit[0].ram_diameter", "a positive length"),
        ({"ram_diameter": "nan mm"}, "unit[0].ram_diameter", "a length with a unit"),
        ({"ram_diameter": "5 m"}, "unit[0].ram_diameter", "a length of at most 2 m"),
        ({"actuator": "screw"}, "unit[0].actuator", "one of ram, rotary_vane, cylinder"),
        ({"pumps": 0}, "unit[0].pumps", "a whole number of at least 1"),
        ({"count": 3}, "unit[0].count", "an even number"),
        ({"fluid": "XX 46"}, "unit[0].fluid", "an ISO 6743-4 category"),
        ({"fluid": "HM 47"}, "unit[0].fluid", "an ISO 3448 viscosity grade"),
        ({"stroke": None}, "unit[0].stroke", "a value (field is required)"),
        ({"ram_diamter": "200 mm"}, "unit[0].ram_diamter", "a known field"),
    ],
)
def test_bad_fields_are_named(changes, field, expected):
    with pytest.raises(InputError) as err:
        vessel_from_dict(with_unit(**changes), "bad.toml")
    assert err.value.field == field
    assert expected in err.value.expected
    assert str(err.value).startswith(f"bad.toml: {field}: expected ")


def test_rod_not_smaller_than_bore():
    data = with_unit(actuator="cylinder", ram_diameter=None, bore="100 mm", rod="100 mm")
    with pytest.raises(InputError, match=r"unit\[0\]\.rod: expected a rod diameter smaller than the bore"):
        vessel_from_dict(data, "c.toml")


def test_hub_not_smaller_than_housing():
    data = with_unit(actuator="rotary_vane", count=1, ram_diameter=None, stroke=None, tiller_radius=None,
                     vanes=2, vane_height="400 mm", housing_bore="900 mm", hub_diameter="900 mm", stock_diameter="300 mm")
    with pytest.raises(InputError, match=r"unit\[0\]\.hub_diameter: expected a hub diameter smaller than the housing bore"):
        vessel_from_dict(data, "v.toml")


def test_duplicate_unit_ids():
    data = copy.deepcopy(BASE)
    data["unit"].append(copy.deepcopy(data["unit"][0]))
    with pytest.raises(InputError, match=r"unit\[1\]\.id: expected a unit id not used before"):
        vessel_from_dict(data, "d.toml")


def test_non_ascii_names_are_kept():
    data = copy.deepcopy(BASE)
    data["vessel"]["name"] = "Ærøskøbing Ståle"
    assert vessel_from_dict(data, "n.toml").name == "Ærøskøbing Ståle"


def test_malformed_toml(tmp_path):
    bad = tmp_path / "broken.toml"
    bad.write_text("[vessel\nid = 1\n")
    with pytest.raises(InputError, match=r"broken\.toml: file: expected valid TOML"):
        load_vessel(bad)


def test_missing_file(tmp_path):
    with pytest.raises(InputError, match=r"nowhere\.toml: file: expected a readable particulars file"):
        load_vessel(tmp_path / "nowhere.toml")


def test_demo_files_parse_as_plain_toml():
    # every demo file is plain TOML (tomllib, Python standard library)
    for f in DEMO.glob("*.toml"):
        assert "vessel" in tomllib.loads(f.read_text(encoding="utf-8"))


def test_pump_flow_below_a_tenth_of_a_litre_a_minute_is_refused():
    # a hypothesis case: a flow of 2.2e-311 L/min made the swing time infinite
    with pytest.raises(InputError) as err:
        vessel_from_dict(with_unit(pump_flow="2.225073858507e-311 L/min"), "tiny.toml")
    assert err.value.field == "unit[0].pump_flow"
    with pytest.raises(InputError, match=r"unit\[0\]\.pump_flow: expected a flow of at least 0\.1 L/min"):
        vessel_from_dict(with_unit(pump_flow="0.05 L/min"), "slow.toml")


def _vane(**over):
    from engine_helpers import vane_unit, vessel

    return vessel(vane_unit(**over))


def test_rotary_vane_that_cannot_swing_hard_over_to_hard_over_is_refused():
    # 6 moving vanes leave each chamber at most 360 / 6 = 60 deg, less than 2 x 35 deg.
    with pytest.raises(InputError, match=r"test particulars: unit\[0\]\.vanes: expected vanes whose chambers can swing "
                                         r"2 x max_rudder_angle = 70 deg \(6 moving vanes leave each at most 360/6 deg = 60\.0 deg\)"):
        _vane(vanes=6)
    # 3 vanes of 30 deg each: 120 - 2 x 30 = 60 deg, short of 70 deg.
    with pytest.raises(InputError, match=r"unit\[0\]\.vanes: .* at most 360/3 deg less 2 x vane_angle 30 deg = 60\.0 deg"):
        _vane(vanes=3, vane_angle="30 deg")
    assert _vane(vanes=3, vane_angle="20 deg").units[0].geometry.vane_angle == pytest.approx(math.radians(20))


@pytest.mark.parametrize(("duty", "hours"), [(12, 12.0), ("12 h/day", 12.0), ("84 h/week", 12.0), ("20 h/d", 20.0)])
def test_filter_duty_with_or_without_a_unit(duty, hours):
    from engine_helpers import ram_unit, vessel

    v = vessel(ram_unit(filter=[{"position": "return", "elements": 1, "change_interval": "2000 h", "duty": duty}]))
    assert v.units[0].filters[0].duty_hours_per_day == pytest.approx(hours)


@pytest.mark.parametrize("duty", ["25 h/day", "12 h", "12 bar/day", "-1 h/day"])
def test_filter_duty_out_of_range_or_unit_refused(duty):
    from engine_helpers import ram_unit, vessel

    with pytest.raises(InputError, match=r"unit\[0\]\.filter\[0\]\.duty: expected "):
        vessel(ram_unit(filter=[{"position": "return", "elements": 1, "change_interval": "2000 h", "duty": duty}]))


@pytest.mark.parametrize("fluid", ["HFAE 2", "HFAS 2", "HFB 68"])
def test_high_water_content_fluids_accepted(fluid):
    # ISO 6743-4: HFAE oil-in-water emulsions, HFAS aqueous solutions, HFB water-in-oil emulsions.
    from engine_helpers import ram_unit, vessel

    assert str(vessel(ram_unit(fluid=fluid)).units[0].fluid) == fluid


@pytest.mark.parametrize("ship_type", ["chemical_tanker", "gas_carrier"])
def test_ship_types_of_29_16_accepted(ship_type):
    from engine_helpers import ram_unit, vessel

    assert vessel(ram_unit(), ship_type=ship_type).ship_type == ship_type


def test_optional_stock_and_pressures():
    from engine_helpers import ram_unit, vessel

    u = vessel(ram_unit(stock_diameter="250 mm", max_working_pressure="140 bar", design_pressure="200 bar")).units[0]
    assert (u.stock_diameter, u.max_working_pressure, u.design_pressure) == (pytest.approx(0.250), pytest.approx(140e5), pytest.approx(200e5))
    assert _vane().units[0].stock_diameter == pytest.approx(0.380)  # a rotary vane's is its geometry's
