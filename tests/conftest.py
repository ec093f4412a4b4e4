# SPDX-License-Identifier: MIT
"""Shared test settings.

CI runs the property tests derandomized: the same examples every run, so a submission lands or
fails on its code, not on the draw. Locally they explore new examples each run. Neither has a
per-example deadline: speed is measured by the benchmark, and a busy machine made a pint check
miss hypothesis's default 200 ms.
"""

from __future__ import annotations

import os

import pytest
from hypothesis import settings

settings.register_profile("local", deadline=None)
settings.register_profile("ci", derandomize=True, print_blob=True, deadline=None)
settings.load_profile("ci" if os.environ.get("CI") else "local")


# No test may open the user's own fleet database (~/.local/share/kit/fleet.sqlite, or KIT_DB): one
# that ran a command without --db would read, build or upgrade it, and one built by another kit
# version would make the test fail for a reason that is not in the code. Each test gets its own
# empty data folder; subprocesses inherit it.
@pytest.fixture(autouse=True)
def _own_data_folder(tmp_path_factory, monkeypatch):
    monkeypatch.setenv("XDG_DATA_HOME", str(tmp_path_factory.mktemp("xdg-data")))
    monkeypatch.delenv("KIT_DB", raising=False)
