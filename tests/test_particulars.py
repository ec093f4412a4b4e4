# SPDX-License-Identifier: MIT
"""The particulars reader: good files load in SI, bad ones name the file, the field and what was expected."""

from __future__ import annotations

import copy
import math
import tomllib
from pathlib import Path

import pytest

from kit.errors import InputError
from kit.particulars import load_folder, load_vessel, vessel_from_dict

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
