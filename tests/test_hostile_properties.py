# SPDX-License-Identifier: MIT
"""Particulars generated in and past the valid ranges (hypothesis): the engine either returns a
result that meets its invariants, or raises the project's own error, never anything else.

Invariants checked on the JSON the engine reports (the README's scripting contract): every seal
has d < D; every quantity is non-negative and finite; the oil bought never falls short of the
oil needed (the package rule: cover the need, README "Oil"); the filter elements cover the
changes due plus the spare sets (README "Filters"). The output is valid JSON (no NaN or Infinity).
"""

from __future__ import annotations

import json
import math

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from engine_helpers import cylinder_unit, ram_unit, vane_unit, vessel
from kit.errors import KitError
from kit.engine.report import vessel_json
from kit.engine.requirements import assess_vessel
from kit.files.policy_file import load_policy

SETTINGS = settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.too_slow])
POLICY = load_policy()


def plain(unit: str, low: float, high: float):
    """A value with a unit inside the plausible range."""
    return st.floats(low, high).map(lambda x: f"{x!r} {unit}")


def wild(unit: str, high: float):
    """A value from far outside the range: negative, zero, tiny, huge, not finite, or no unit."""
    number = st.one_of(st.floats(-10 * high, 10 * high), st.sampled_from([0.0, -0.0, 1e-300, 1e300]))
    return st.one_of(number.map(lambda x: f"{x!r} {unit}"), number.map(repr),
                     st.sampled_from([f"nan {unit}", f"1e999 {unit}", f"1 {unit} * 10**400", "9**9**9 " + unit]))


# field -> (unit, low, high) of the plausible range; integers as (None, low, high)
COMMON = {"working_pressure": ("bar", 20, 350), "pump_flow": ("L/min", 1, 2000), "reservoir": ("L", 10, 5000),
          "max_rudder_angle": ("deg", 20, 45), "pumps": (None, 1, 4), "oil_leakage": ("L/day", 0, 10)}
KINDS = {
    "ram": (ram_unit, {"ram_diameter": ("mm", 100, 600), "stroke": ("mm", 800, 2000), "tiller_radius": ("mm", 300, 900),
                       "count": (None, 1, 2)}),
    "cylinder": (cylinder_unit, {"bore": ("mm", 80, 400), "rod": ("mm", 30, 70), "stroke": ("mm", 300, 1500),
                                 "tiller_radius": ("mm", 200, 700), "count": (None, 1, 2)}),
    "rotary_vane": (vane_unit, {"vanes": (None, 2, 3), "vane_height": ("mm", 200, 900), "housing_bore": ("mm", 700, 2000),
                                "hub_diameter": ("mm", 400, 650), "stock_diameter": ("mm", 200, 380)}),
}


def field_value(name: str, spec, go_wild: bool):
    unit, low, high = spec
    if unit is None:  # counts: pairs of rams and cylinders, so the count is drawn as pairs
        pairs = name == "count"
        values = st.integers(-2, 5000) if go_wild else st.integers(low, high)
        return values.map(lambda n: 2 * n if pairs and not go_wild else n)
    return wild(unit, high) if go_wild else plain(unit, low, high)


@st.composite
def particulars(draw, wild_fields: int):
    """A unit with every field in range except ``wild_fields`` of them, chosen at random."""
    kind = draw(st.sampled_from(sorted(KINDS)))
    make, fields = KINDS[kind]
    specs = {**COMMON, **fields}
    chosen = set(draw(st.permutations(sorted(specs)))[:wild_fields])
    over = {name: draw(field_value(name, spec, name in chosen)) for name, spec in specs.items()}
    if kind == "rotary_vane":
        over.pop("count", None)
    wild_filter = wild_fields > 0 and draw(st.integers(0, 3)) == 0
    over["filter"] = [{"position": "return", "elements": draw(st.integers(-1, 5000) if wild_filter else st.integers(1, 4)),
                       "change_interval": draw(wild("h", 20000) if wild_filter else plain("h", 500, 5000))}]
    return make(**over), draw(st.sampled_from(["cargo", "passenger", "tanker"])), draw(st.floats(0, 3650))


def check_invariants(doc: dict) -> None:
    text = json.dumps(doc, allow_nan=False)  # raises ValueError on NaN or Infinity
    assert json.loads(text) == doc
    for unit in doc["units"]:
        for seal in unit["seals"]:
            if seal["d_mm"] is not None and seal["D_mm"] is not None:
                assert seal["d_mm"] < seal["D_mm"], seal
            assert seal["qty"] >= 0
        for f in unit["filters"]:
            assert f["elements"] >= f["elements_per_change"] * (f["changes_due"] + f["spare_sets"])
    for line in doc["lines"]:
        assert math.isfinite(line["quantity"]) and line["quantity"] >= 0, line
    for oil in doc["oil"]:
        assert oil["supply_l"] >= oil["need_l"] - 1e-9, oil
        assert all(p["count"] >= 0 for p in oil["packages"])


@SETTINGS
@given(st.integers(1, 3).flatmap(particulars))
def test_engine_returns_a_sound_result_or_its_own_error(case):
    data, ship_type, days = case
    try:
        v = vessel(data, ship_type=ship_type)
        doc = vessel_json(assess_vessel(v, days, POLICY))
    except KitError as exc:
        message = str(exc)
        assert message and "\n" not in message  # one line, as the CLI prints it
        return
    check_invariants(doc)


@SETTINGS
@given(particulars(0))
def test_particulars_in_range_always_give_a_sound_result(case):
    data, ship_type, days = case
    try:
        v = vessel(data, ship_type=ship_type)
    except KitError as exc:  # the one cross-field rule a draw can break
        assert "smaller than" in str(exc), exc
        return
    check_invariants(vessel_json(assess_vessel(v, days, POLICY)))
