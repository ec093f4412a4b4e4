# SPDX-License-Identifier: MIT
"""Consolidation: the same part across units and vessels is one line; packages rounded once."""

from __future__ import annotations

import copy
import math

import pytest

from kit.engine.bom import consolidate
from kit.engine.purchasing import Offer
from kit.engine.preflight import preflight_order
from kit.engine.particulars import vessel_from_dict
from kit.engine.requirements import assess_vessel
from kit.files.policy_file import load_policy

UNIT = {
    "id": "SG1", "service": "steering", "actuator": "ram", "count": 2,
    "ram_diameter": "200 mm", "stroke": "800 mm", "tiller_radius": "500 mm",
    "max_rudder_angle": "35 deg", "working_pressure": "160 bar", "fluid": "HM 46",
    "pumps": 2, "pump_flow": "60 L/min", "reservoir": "250 L", "system_oil": "310 L",
    "oil_leakage": "0.5 L/day",
    "filter": [{"position": "return", "elements": 2, "change_interval": "2000 h", "element": "RF-10"}],
}


def vessel(vid: str, **unit_changes):
    unit = copy.deepcopy(UNIT)
    unit.update(unit_changes)
    return vessel_from_dict({"vessel": {"id": vid, "name": vid.title(), "ship_type": "cargo", "gross_tonnage": 6000},
                             "unit": [unit]}, f"{vid}.toml")


@pytest.fixture(scope="module")
def policy():
    return load_policy()


def test_shared_seal_size_is_one_line_with_the_sum(policy):
    a, b = assess_vessel(vessel("ALPHA"), 30, policy), assess_vessel(vessel("BRAVO"), 30, policy)
    order = consolidate([a, b])
    rod = [line for line in order.lines if line.kind == "rod_seal"]
    assert len(rod) == 1
    each = next(li.quantity for li in a.lines if li.kind == "rod_seal")
    assert rod[0].required == 2 * each
    assert rod[0].split == {"ALPHA": each, "BRAVO": each}


def test_different_sizes_stay_apart(policy):
    order = consolidate([assess_vessel(vessel("ALPHA"), 30, policy),
                         assess_vessel(vessel("BRAVO", ram_diameter="250 mm"), 30, policy)])
    assert len([line for line in order.lines if line.kind == "rod_seal"]) == 2


def test_oil_rounded_once_over_the_order(policy):
    results = [assess_vessel(vessel(v), 30, policy) for v in ("ALPHA", "BRAVO", "CHARLIE")]
    order = consolidate(results)
    (oil,) = order.oil
    per_vessel = sum(li.quantity for r in results for li in r.lines if li.kind == "oil")
    assert oil.required_l == pytest.approx(per_vessel)
    # 3 x (310 L storage + 15 L top-up) = 975 L: one rounding of the total, never short,
    # and over by less than the smallest package (20 L pail)
    assert oil.required_l == pytest.approx(3 * (310 + 0.5 * 30))
    supply_l = oil.plan.supply
    assert oil.required_l <= supply_l < oil.required_l + 20
    # the order holds one oil line per fluid, not one per vessel
    assert len([line for line in order.lines if line.kind == "oil"]) == 1


def test_stock_reduces_the_order_and_packs_round_up(policy):
    a = assess_vessel(vessel("ALPHA"), 90, policy)
    key = next(li.key for li in a.lines if li.kind == "filter_element")
    need = next(li.quantity for li in a.lines if li.kind == "filter_element")
    order = consolidate([a], {("ALPHA", key): 1}, {key: [Offer("Northgate Supply", "NG-RF10", 4, "4 pcs", 12.5, "EUR", 14)]})
    line = next(li for li in order.lines if li.key == key)
    assert line.to_order == need - 1
    assert line.packs == math.ceil((need - 1) / 4)
    assert line.line_total == pytest.approx(line.packs * 12.5)
    assert order.totals_by_currency() == {"EUR": pytest.approx(line.packs * 12.5)}


def test_shortfalls_empty_when_everything_is_on_board(policy):
    a = assess_vessel(vessel("ALPHA"), 90, policy)
    full: dict = {}
    for li in a.lines:  # storage charge and top-up are the same oil: one key
        full[("ALPHA", li.key)] = full.get(("ALPHA", li.key), 0) + li.quantity
    assert preflight_order(a, full).lines == []
    short = dict(full)
    key = a.lines[0].key
    short[("ALPHA", key)] = 0
    (gap,) = preflight_order(a, short).lines
    assert gap.key == key and gap.number == 1 and gap.to_order == pytest.approx(a.lines[0].quantity)
