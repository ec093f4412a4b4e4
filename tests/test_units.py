# SPDX-License-Identifier: MIT
"""Units at the edge: pint parsing, and a unit in inch/psi/US gallons sizes as it does in metric."""

from __future__ import annotations

import math

import pint
import pytest

from engine_helpers import ram_unit, vessel
from kit.engine import oil
from kit.engine.checks import check_unit
from kit.errors import InputError
from kit.engine.seal_kit import build_seal_kit
from kit.files.policy_file import load_policy
from kit.engine.units import COMMON_FACTORS, KINDS, convert, to_si

UREG = pint.UnitRegistry()  # independent of kit.engine.units.ureg: the reference the test checks against


@pytest.mark.parametrize(
    ("text", "kind", "si"),
    [
        ("280 mm", "length", 0.280),
        ("11 in", "length", 11 * 0.0254),  # NIST SP 811: 1 in = 25.4 mm exactly
        ("160 bar", "pressure", 160e5),
        ("2400 psi", "pressure", 2400 * 6894.757293168),  # NIST SP 811: 1 psi = 6894.757 Pa
        ("120 L/min", "flow", 0.002),
        ("50 gal/min", "flow", 50 * 3.785411784e-3 / 60),  # NIST SP 811: US gallon
        ("400 L", "volume", 0.400),
        ("2000 h", "time", 7.2e6),
        ("35 deg", "angle", math.radians(35)),
        ("25 kg", "mass", 25.0),
        ("24 V", "voltage", 24.0),
    ],
)
def test_to_si(text, kind, si):
    assert to_si(text, kind, source="f.toml", field="x") == pytest.approx(si, rel=1e-9)


@pytest.mark.parametrize(
    ("value", "kind", "got"),
    [("280", "length", "'280'"), ("160 bar", "length", "'160 bar'"), (280, "length", "280"), (True, "length", "True"),
     ("35", "angle", "'35'"), ("nonsense units", "volume", "'nonsense units'")],
)
def test_to_si_refuses(value, kind, got):
    with pytest.raises(InputError) as info:
        to_si(value, kind, source="f.toml", field="unit[0].x")
    assert info.value.got == got
    article = "an" if kind == "angle" else "a"  # English: "an angle", "a length"
    assert str(info.value).startswith(f"f.toml: unit[0].x: expected {article} {kind} with a unit")


def test_convert_against_pint():
    assert convert(0.41, "m**3", "gallon") == pytest.approx(UREG.Quantity(410, "L").to("gallon").magnitude, rel=1e-12)


def _imperial(metric: dict, fields: dict[str, str]) -> dict:
    out = dict(metric)
    for key, unit_name in fields.items():
        q = UREG.Quantity(metric[key]).to(unit_name)
        out[key] = f"{q.magnitude!r} {unit_name}"
    return out


def test_inch_psi_gallons_give_the_metric_results():
    metric = ram_unit(ram_diameter="280 mm", stroke="900 mm", tiller_radius="600 mm", working_pressure="160 bar",
                      pump_flow="120 L/min", reservoir="300 L", oil_leakage="0.5 L/day",
                      pipe=[{"outside_diameter": "33.4 mm", "wall": "3.38 mm", "length": "24 m"}])
    imperial = _imperial(metric, {"ram_diameter": "inch", "stroke": "inch", "tiller_radius": "inch",
                                  "working_pressure": "psi", "pump_flow": "gallon/minute", "reservoir": "gallon",
                                  "oil_leakage": "gallon/day"})
    imperial["pipe"] = [_imperial(metric["pipe"][0], {"outside_diameter": "inch", "wall": "inch", "length": "foot"})]
    assert imperial["ram_diameter"].startswith("11.0236")  # 280 mm = 11.0236 in
    assert imperial["working_pressure"].startswith("2320.6")  # 160 bar = 2320.6 psi

    policy = load_policy()
    v_m, v_i = vessel(metric), vessel(imperial)
    c_m, c_i = check_unit(v_m.units[0], v_m, policy), check_unit(v_i.units[0], v_i, policy)
    for name in ("torque_midships", "torque_max_angle", "swing_time_one_pump", "swing_time_all_pumps", "travel"):
        assert getattr(c_i, name) == pytest.approx(getattr(c_m, name), rel=1e-9), name

    k_m, k_i = build_seal_kit(v_m.units[0]), build_seal_kit(v_i.units[0])
    assert k_i.warnings == k_m.warnings  # the same (only the assumed gland spigot is warned)
    assert [(s.role, s.housing, s.oring) for s in k_i.lines] == [(s.role, s.housing, s.oring) for s in k_m.lines]

    assert oil.system_charge(v_i.units[0])[0] == pytest.approx(oil.system_charge(v_m.units[0])[0], rel=1e-9)
    assert oil.top_up(v_i.units[0].oil_leakage, 90) == pytest.approx(0.045, rel=1e-9)


@pytest.mark.parametrize("kind, unit", [(k, u) for k, units in COMMON_FACTORS.items() for u in units])
def test_common_factors_agree_with_pint(kind, unit):
    # pint (the reference library) converts one of the unit to the kind's SI unit
    si = KINDS[kind][1]
    assert COMMON_FACTORS[kind][unit] == pytest.approx(UREG.Quantity(f"1 {unit}").to(si).magnitude, rel=1e-12)


def test_plain_numbers_times_the_factor_match_pint():
    for text, kind in [("3.38 mm", "length"), ("2400 psi", "pressure"), ("45 gal/min", "flow"), ("0.5 L/day", "flow"),
                       ("6 months", "time"), ("13 in", "length"), ("35 deg", "angle"), ("7.25 ft", "length")]:
        si = KINDS[kind][1]
        assert to_si(text, kind, source="t", field="f") == pytest.approx(UREG.Quantity(text).to(si).magnitude, rel=1e-15)


def test_reading_a_demo_file_in_common_units_does_not_import_pint():
    import subprocess
    import sys
    from pathlib import Path

    demo = Path(__file__).resolve().parents[1] / "demo_fleet" / "corvina_bay.toml"
    code = ("import sys; from kit.files.particulars_file import load_vessel; load_vessel(sys.argv[1]); "
            "print('pint' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code, str(demo)], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "False"
