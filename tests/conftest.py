# SPDX-License-Identifier: MIT
"""Shared test settings.

CI runs the property tests derandomized: the same examples every run, so a submission lands or
fails on its code, not on the draw. Locally they explore new examples each run. Neither has a
per-example deadline: speed is measured by the benchmark, and a busy machine made a pint check
miss hypothesis's default 200 ms.
"""

from __future__ import annotations

import os

from hypothesis import settings

settings.register_profile("local", deadline=None)
settings.register_profile("ci", derandomize=True, print_blob=True, deadline=None)
settings.load_profile("ci" if os.environ.get("CI") else "local")
