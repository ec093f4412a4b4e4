# SPDX-License-Identifier: MIT
"""``kit calc`` on every demo file, text and JSON, and its bad-input errors."""

from __future__ import annotations

import json
from pathlib import Path

import pytest
from click.testing import CliRunner

from kit.cli import main

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"
DEMO_FILES = sorted(DEMO.glob("*.toml"))
ROLES = {"piston", "rod", "wiper", "guide", "o-ring", "vane", "stock"}


@pytest.fixture
def runner():
    return CliRunner()


@pytest.mark.parametrize("path", DEMO_FILES, ids=lambda p: p.stem)
def test_calc_text(runner, path):
    result = runner.invoke(main, ["calc", str(path), "--days", "90"])
    assert result.exit_code == 0, result.output
    assert "Requirement list" in result.output
    assert "maker's drawing" in result.output


@pytest.mark.parametrize("path", DEMO_FILES, ids=lambda p: p.stem)
def test_calc_json_contract(runner, path):
    result = runner.invoke(main, ["calc", str(path), "--days", "90", "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    assert data["days"] == 90 and data["vessel"]["id"]
    for u in data["units"]:
        for key in ("id", "actuator", "torque_knm", "swing_time_s", "swing_rule_met", "system_oil_l",
                    "storage_tank_min_l", "seals", "filters", "warnings"):
            assert key in u
        assert set(u["torque_knm"]) >= {"midships", "max_angle"}
        assert set(u["swing_time_s"]) >= {"one_pump", "all_pumps"}
        for s in u["seals"]:
            assert s["role"] in ROLES
            assert s["d_mm"] < s["D_mm"]
            assert s["qty"] > 0 and s["L_mm"] > 0 and s["standard"]
        for f in u["filters"]:
            assert f["elements"] >= f["elements_per_change"]


def test_calc_days_zero_keeps_spare_sets(runner):
    result = runner.invoke(main, ["calc", str(DEMO / "corvina_bay.toml"), "--json"])
    data = json.loads(result.output)
    for f in data["units"][0]["filters"]:
        assert f["elements"] == f["elements_per_change"] * f["spare_sets"]


def test_bad_input_one_line_exit_2(runner, tmp_path):
    text = (DEMO / "corvina_bay.toml").read_text().replace('ram_diameter = "200 mm"', 'ram_diameter = "200"')
    bad = tmp_path / "bad.toml"
    bad.write_text(text)
    result = runner.invoke(main, ["calc", str(bad)])
    assert result.exit_code == 2
    lines = result.output.strip().splitlines()
    assert lines == [f"kit: error: {bad}: unit[0].ram_diameter: expected a length with a unit, e.g. \"280 mm\" or \"11 in\" (got '200')"]


def test_wrong_kind_of_unit(runner, tmp_path):
    text = (DEMO / "corvina_bay.toml").read_text().replace('working_pressure = "160 bar"', 'working_pressure = "180 mm"')
    bad = tmp_path / "kind.toml"
    bad.write_text(text)
    result = runner.invoke(main, ["calc", str(bad)])
    assert result.exit_code == 2
    assert "unit[0].working_pressure: expected a pressure with a unit" in result.output
    assert "Traceback" not in result.output


def test_missing_file_exit_2(runner, tmp_path):
    result = runner.invoke(main, ["calc", str(tmp_path / "none.toml")])
    assert result.exit_code == 2
    assert "file: expected a readable particulars file" in result.output


def test_bad_policy_file(runner, tmp_path):
    policy = tmp_path / "company.toml"
    policy.write_text('[policy]\nhousing_length = "huge"\n')
    result = runner.invoke(main, ["calc", str(DEMO / "corvina_bay.toml"), "--policy", str(policy)])
    assert result.exit_code == 2
    assert f"{policy}: policy.housing_length: expected one of short, medium, long" in result.output


def test_company_policy_overrides(runner, tmp_path):
    policy = tmp_path / "company.toml"
    policy.write_text('[policy]\nname = "Marrowgate fleet standard"\nspare_filter_sets = 2\n'
                      '[[item]]\nkind = "seal_set"\nper = "actuator"\nquantity = 1\nbasis = "company policy"\n')
    result = runner.invoke(main, ["calc", str(DEMO / "corvina_bay.toml"), "--policy", str(policy), "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    assert data["policy"] == "Marrowgate fleet standard"
    assert all(f["spare_sets"] == 2 for f in data["units"][0]["filters"])
    seal_lines = [li for li in data["lines"] if li["basis"] == "company policy"]
    # one complete set per actuator: two rams, one rod seal each
    assert any(li["part"] == "ram gland rod seal" and li["quantity"] == 2 for li in seal_lines)
