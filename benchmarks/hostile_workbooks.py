# SPDX-License-Identifier: MIT
"""Hostile workbooks of a few kilobytes, and what refusing each costs kit (not a test).

    python -m benchmarks.hostile_workbooks [--runs 3]

Each case is a good stock workbook (written by openpyxl) whose sheet or shared-string part is
replaced by one that implies billions of rows or millions of cells. The suite checks the refusal
(tests/test_hostile_workbooks.py); this prints its wall time and peak resident memory, measured
through ``benchmarks/launch.py`` so the figure is kit's own process (Python and its libraries
included), and the time :func:`kit.files.sheets.read_table` takes to refuse it in this process.
"""

from __future__ import annotations

import argparse
import json
import statistics
import subprocess
import sys
import tempfile
import time
import zipfile
from dataclasses import dataclass
from pathlib import Path
from typing import Callable

MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main"
SHEET = "xl/worksheets/sheet1.xml"
STRINGS = "xl/sharedStrings.xml"


def sheet_xml(key: str, rows: str, dimension: str | None = None, prefix: str = "") -> str:
    """A stock sheet: the header row, one good row, then ``rows``."""
    p = f"{prefix}:" if prefix else ""
    header = "".join(f'<{p}c r="{c}1" t="inlineStr"><{p}is><{p}t>{name}</{p}t></{p}is></{p}c>'
                     for c, name in zip("ABC", ("part_key", "location", "quantity")))
    good = (f'<{p}row r="2"><{p}c r="A2" t="inlineStr"><{p}is><{p}t>{key}</{p}t></{p}is></{p}c>'
            f'<{p}c r="C2"><{p}v>1</{p}v></{p}c></{p}row>')
    dim = f'<{p}dimension ref="{dimension}"/>' if dimension else ""
    xmlns = f'xmlns:{prefix}="{MAIN}"' if prefix else f'xmlns="{MAIN}"'
    return (f'<?xml version="1.0" encoding="UTF-8"?><{p}worksheet {xmlns}>{dim}<{p}sheetData>'
            f'<{p}row r="1">{header}</{p}row>{good}{rows}</{p}sheetData></{p}worksheet>')


def strings_xml(items: str, attributes: str = "") -> str:
    return f'<?xml version="1.0" encoding="UTF-8"?><sst xmlns="{MAIN}"{attributes}>{items}</sst>'


@dataclass(frozen=True)
class Case:
    name: str
    part: str  # the part named in the refusal
    refusal: str  # the line after "FILE, PART"
    parts: Callable[[str], dict[str, str]]  # the part key -> the parts written over the good workbook


LIMIT_ROWS = "200,100"
CASES = [
    Case("cell at XFD1048576", SHEET,
         ", row 3: cell XFD1048576: expected a column from A to IV (at most 256) (got column 16,384)",
         lambda key: {SHEET: sheet_xml(key, '<row r="3"><c r="XFD1048576"/></row>')}),
    Case("used range of the whole sheet", SHEET,
         ": dimension: expected a used range within A1:IV200100 of at most 5,000,000 cells (got 'A1:XFD1048576')",
         lambda key: {SHEET: sheet_xml(key, "", dimension="A1:XFD1048576")}),
    Case("row 999999999", SHEET,
         f": row number: expected 1 to {LIMIT_ROWS} (kit reads at most 100,000 data rows) (got row 999,999,999)",
         lambda key: {SHEET: sheet_xml(key, '<row r="999999999"><c r="A999999999"><v>1</v></c></row>')}),
    Case("100,000 empty cells in a row", SHEET, ", row 3: cells: expected at most 256 cells in a row (got more)",
         lambda key: {SHEET: sheet_xml(key, '<row r="3">' + "<c/>" * 100_000 + "</row>")}),
    Case("cells hidden between comments", SHEET, ", row 3: cells: expected at most 256 cells in a row (got more)",
         lambda key: {SHEET: sheet_xml(key, '<row r="3">' + "<c/>" * 200 + '<!-- </row><row r="4"> -->' + "<c/>" * 200
                                       + "</row>")}),
    Case("rows spelt with a prefix", SHEET,
         f": row number: expected 1 to {LIMIT_ROWS} (kit reads at most 100,000 data rows) (got row 999,999,999)",
         lambda key: {SHEET: sheet_xml(key, '<x:row r="999999999"><x:c r="A3"><x:v>1</x:v></x:c></x:row>', prefix="x")}),
    Case("cells padded past five million", SHEET,
         ": cells: expected at most 5,000,000 cells in the workbook (each row counted to its last cell) (got more)",
         lambda key: {SHEET: sheet_xml(key, "".join(f'<row r="{n}"><c r="IV{n}"/></row>' for n in range(3, 20_003)))}),
    Case("2**31 shared strings declared", STRINGS,
         ": shared strings uniqueCount: expected a whole number of at most 1,000,000 (got '2147483648')",
         lambda key: {STRINGS: strings_xml("<si><t>x</t></si>", ' count="1" uniqueCount="2147483648"')}),
    Case("2**31 string cells declared", STRINGS,
         ": shared strings count: expected a whole number of at most 5,000,000 (got '2147483648')",
         lambda key: {STRINGS: strings_xml("<si><t>x</t></si>", ' count="2147483648" uniqueCount="1"')}),
    Case("a million and one shared strings", STRINGS, ": shared strings: expected at most 1,000,000 strings (got more)",
         lambda key: {STRINGS: strings_xml("<si/>" * 1_000_001)}),
    Case("string table under another name", "xl/strs.xml",
         ": shared strings uniqueCount: expected a whole number of at most 1,000,000 (got '2147483648')",
         lambda key: {"xl/strs.xml": strings_xml("<si><t>x</t></si>", ' uniqueCount="2147483648"')}),
]


def hostile(folder: Path, case: Case | None, key: str, sheet: str | None = None) -> Path:
    """A good stock workbook (openpyxl writes it) with the parts of ``case`` (or ``sheet``) put in."""
    from openpyxl import Workbook

    good = folder / "good.xlsx"
    wb = Workbook()
    wb.active.title = "stock"
    wb.active.append(["part_key", "location", "quantity"])
    wb.save(good)
    parts = case.parts(key) if case else {SHEET: sheet}
    path = folder / "hostile.xlsx"
    with zipfile.ZipFile(good) as src, zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as dst:
        for info in src.infolist():
            if info.filename not in parts:
                dst.writestr(info, src.read(info.filename), zipfile.ZIP_DEFLATED)
        for name, text in parts.items():
            dst.writestr(name, text)
    return path


def reading(path: Path) -> float:
    """Seconds kit.files.sheets takes to read (or refuse) the stock sheet of ``path``, in this process."""
    from kit.errors import InputError
    from kit.files.sheets import read_table

    start = time.perf_counter()
    try:
        read_table(path, "stock")
    except InputError:
        pass
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=3)
    args = parser.parse_args()
    launch = Path(__file__).with_name("launch.py")
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp)
        db = f"sqlite:///{folder / 'fleet.sqlite'}"
        subprocess.run([sys.executable, "-m", "kit", "db", "upgrade", "--db", db], check=True, capture_output=True)
        print("| workbook | size | kit stock import (s) | peak memory (MB) | reading alone (s) |\n|---|---|---|---|---|")
        good = Case("for comparison: a good one-row workbook (refused: no such vessel)", SHEET, "",
                    lambda key: {SHEET: sheet_xml(key, "")})
        for case in [good, *CASES]:
            path = hostile(folder, case, "any-key")
            runs = [json.loads(subprocess.run([sys.executable, str(launch), sys.executable, "-m", "kit", "stock", "import",
                                               str(path), "--vessel", "V", "--db", db],
                                              capture_output=True, text=True, check=True).stdout) for _ in range(args.runs)]
            assert all(r["returncode"] == 2 for r in runs), runs[0]["stderr"]
            print(f"| {case.name} | {path.stat().st_size / 1024:.1f} KiB | {statistics.median(r['seconds'] for r in runs):.2f} "
                  f"| {max(r['peak_mb'] for r in runs):.0f} | {statistics.median(reading(path) for _ in range(args.runs)):.3f} |")


if __name__ == "__main__":
    main()
