# SPDX-License-Identifier: MIT
"""The suppliers and particulars pages in a real browser, used by keyboard through their labels:
a catalogue with a bad row is refused in one line and changes nothing; a good one is imported
with its unmatched rows listed; a particulars file adds a vessel that the fleet page then lists."""

from __future__ import annotations

import csv
from pathlib import Path

from tests.browser_support import chromium, page, screenshot, served  # noqa: F401
from tests.db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401


def catalogue(served, path: Path, bad: bool = False) -> Path:
    """Five of the demo catalogue's rows and two O-rings no demo vessel keeps (so unmatched);
    ``bad``: the last row priced in a currency that is no ISO 4217 code."""
    rows = list(csv.reader((served.imports / "catalogue.csv").open(encoding="utf-8")))
    out = [rows[0] + ["part_kind", "id", "cs", "spec"]] + [r + [""] * 4 for r in rows[1:6]]
    for n in range(2):
        out.append([f"WEB-OR-{n}", "", f"o-ring {431 + n} x 5.33", "", "10", "12.5", "EURO" if bad and n else "EUR", "9",
                    "o_ring", f"{431 + n} mm", "5.33 mm", "NBR"])
    with path.open("w", newline="", encoding="utf-8") as f:
        csv.writer(f).writerows(out)
    return path


def send_by_keyboard(tab, button: str) -> None:
    """Focus the form's button and press Enter, as a keyboard user would."""
    tab.get_by_role("button", name=button).focus()
    with tab.expect_navigation():
        tab.keyboard.press("Enter")


def test_a_bad_catalogue_is_refused_in_one_line_then_a_good_one_lists_its_unmatched_rows(page, served, tmp_path):
    tab = page
    tab.goto(served.url + "/suppliers")
    assert tab.get_by_role("heading", name="Suppliers", exact=True).is_visible()
    screenshot(tab, f"suppliers-{served.engine.dialect.name}")
    before = dump(served.engine)
    tab.get_by_label("Supplier name").fill("Web Test Seals")
    tab.keyboard.press("Tab")  # the next field in order is the file
    assert tab.evaluate("document.activeElement.id") == "catalogue"
    tab.get_by_label("Catalogue file").set_input_files(str(catalogue(served, tmp_path / "offer.csv", bad=True)))
    send_by_keyboard(tab, "Import the catalogue")
    alert = tab.get_by_role("alert")
    assert alert.inner_text().startswith("offer.csv, line 8: column currency: expected an ISO 4217 currency code")
    assert "\n" not in alert.inner_text().strip()  # one line
    assert "kit-upload-" not in tab.content()
    screenshot(tab, f"suppliers-refused-{served.engine.dialect.name}")
    assert dump(served.engine) == before  # nothing half-imported

    tab.go_back()
    tab.goto(served.url + "/suppliers")
    tab.get_by_label("Supplier name").fill("Web Test Seals")
    tab.get_by_label("Catalogue file").set_input_files(str(catalogue(served, tmp_path / "offer.csv")))
    send_by_keyboard(tab, "Import the catalogue")
    status = tab.get_by_role("status")
    assert "Web Test Seals: 7 row(s), 5 matched a generic part, 2 matched nothing" in status.inner_text()
    unmatched = status.locator("tbody tr")
    assert unmatched.count() == 2
    assert unmatched.first.inner_text().split("\t") == ["offer.csv, line 7", "WEB-OR-0", "o_ring:id=431:cs=5.33:nbr"]
    row = tab.locator("table.grid").last.locator("tr", has_text="Web Test Seals")
    assert row.locator("td").nth(1).inner_text() == "7"
    screenshot(tab, f"suppliers-imported-{served.engine.dialect.name}")


def test_a_particulars_upload_adds_a_vessel_the_fleet_page_lists(page, served, tmp_path):
    tab = page
    tab.goto(served.url + "/particulars")
    screenshot(tab, f"particulars-{served.engine.dialect.name}")
    path = tmp_path / "brackwater.toml"
    path.write_text(TOML_CYLINDER.replace('name = "Test One"', 'name = "Brackwater Test"'), encoding="utf-8")
    tab.get_by_label("Particulars file").set_input_files(str(path))
    assert tab.get_by_label("Also register the generic parts").is_checked()
    send_by_keyboard(tab, "Load the particulars")
    status = tab.get_by_role("status")
    assert "1 vessel(s) added or updated: TEST-ONE" in status.inner_text()
    screenshot(tab, f"particulars-loaded-{served.engine.dialect.name}")
    tab.get_by_role("link", name="Fleet").click()
    tab.get_by_label("Find a vessel").fill("brackwater")
    tab.keyboard.press("Enter")
    tab.wait_for_url("**/?q=brackwater")
    rows = tab.locator("tbody tr")
    assert rows.count() == 1 and "TEST-ONE" in rows.first.inner_text()
    screenshot(tab, f"particulars-on-fleet-{served.engine.dialect.name}")
