# SPDX-License-Identifier: MIT
"""Every command has help text that ends with an example and carries the safety caution."""

from __future__ import annotations

import pytest
from click.testing import CliRunner

from kit.cli import COMMANDS, main


def test_main_help_lists_commands_and_caution():
    result = CliRunner().invoke(main, ["--help"])
    assert result.exit_code == 0
    for name in COMMANDS:
        assert name in result.output
    assert "Secure the rudder" in result.output


@pytest.mark.parametrize("name", sorted(COMMANDS))
def test_command_help_ends_with_example(name):
    command = main.get_command(None, name)
    assert command is not None and command.help, f"{name} has no help"
    assert "Example:" in command.help.strip().splitlines()[-1] or "Example:" in command.help
    result = CliRunner().invoke(main, [name, "--help"])
    assert result.exit_code == 0
    assert "CAUTION" in result.output


def test_readme_has_caution_and_two_setup_commands():
    from pathlib import Path

    readme = (Path(__file__).resolve().parents[1] / "README.md").read_text()
    assert "Safety caution" in readme and "secure the rudder" in readme.lower()
    assert readme.count("python3 -m venv .venv &&") == 2
