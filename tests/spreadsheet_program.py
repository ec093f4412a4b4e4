# SPDX-License-Identifier: MIT
"""LibreOffice (headless) as an independent spreadsheet program: it opens a workbook kit wrote,
recalculates every formula and exports each sheet as CSV, which the tests then read.

`.ci/run` installs Debian's libreoffice-calc-nogui when it is missing and sets
KIT_REQUIRE_SOFFICE=1, so in CI these tests fail rather than skip when the program is absent.
"""

from __future__ import annotations

import csv
import os
import shutil
import subprocess
from pathlib import Path

import pytest

CSV_ALL_SHEETS = "csv:Text - txt - csv (StarCalc):44,34,UTF8,1,,0,false,true,false,false,false,-1"


def soffice() -> str:
    exe = shutil.which("soffice") or shutil.which("libreoffice")
    if exe is None:
        if os.environ.get("KIT_REQUIRE_SOFFICE"):
            pytest.fail("KIT_REQUIRE_SOFFICE is set but LibreOffice (soffice) is not installed")
        pytest.skip("LibreOffice (soffice) is not installed")
    return exe


def recalculated_sheets(workbook: Path, work: Path) -> dict[str, list[list[str]]]:
    """Every sheet of ``workbook`` as LibreOffice computes it: sheet name -> rows of strings."""
    out = work / "lo-out"
    out.mkdir(exist_ok=True)
    profile = (work / "lo-profile").resolve().as_uri()
    subprocess.run([soffice(), f"-env:UserInstallation={profile}", "--headless", "--calc", "--convert-to", CSV_ALL_SHEETS,
                    "--outdir", str(out), str(workbook)], check=True, capture_output=True, timeout=180)
    sheets = {}
    for f in out.glob(f"{workbook.stem}-*.csv"):
        with f.open(newline="", encoding="utf-8") as fh:
            sheets[f.stem[len(workbook.stem) + 1:]] = list(csv.reader(fh))
    if not sheets:
        raise AssertionError(f"LibreOffice wrote no CSV for {workbook}")
    return sheets
