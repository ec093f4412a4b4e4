# SPDX-License-Identifier: MIT
"""The order page in a real browser: a purchaser builds an order for two vessels by keyboard,
downloads the order workbook (read back with openpyxl, its totals recalculated by LibreOffice)
and writes the supplier enquiries (one zip of workbooks); the page on screen and as printed."""

from __future__ import annotations

import datetime as dt
import io
import zipfile

import openpyxl
import pytest

from tests.browser_support import chromium, page, screenshot, served  # noqa: F401
from tests.db_support import db_url, engine  # noqa: F401

TWO = ("CORVINA-BAY", "SALTMERE-CREST")


def test_a_purchaser_orders_for_two_vessels_and_downloads_the_workbook_and_enquiries(page, served, tmp_path):
    from kit.services.orders import build_order
    from kit.services.purchasing import set_delivery
    from tests.spreadsheet_program import recalculated_sheets

    today = dt.date.today()  # one vessel due too soon for every offer, one in good time (invented ports)
    set_delivery(served.engine, "CORVINA-BAY", "Port Vellin (invented)", today + dt.timedelta(days=5))
    set_delivery(served.engine, "SALTMERE-CREST", "Harrowgate Quay (invented)", today + dt.timedelta(days=60))
    page.reload()
    page.get_by_role("link", name="Order", exact=True).click()
    page.wait_for_url("**/order")
    page.get_by_label("CORVINA-BAY").focus()
    page.keyboard.press("Space")  # ticked by keyboard
    page.get_by_label("Vessel ids").fill("saltmere-crest")  # typed, in any letter case
    page.get_by_label("Days to cover").fill("120")
    page.keyboard.press("Enter")  # the form's first button: show the order
    page.wait_for_url("**/order?*go=1*")
    assert page.get_by_role("heading", name="Order for 2 vessel(s) over 120 days").is_visible()
    order = build_order(served.engine, list(TWO), 120.0)[0]
    assert page.locator("#order-lines tbody tr").count() == len(order.lines)
    assert page.locator("#order-lines [data-col=late]").count() == len(order.late_lines()) > 0
    screenshot(page, f"order-{served.engine.dialect.name}")
    page.emulate_media(media="print")
    screenshot(page, f"order-print-{served.engine.dialect.name}")
    assert not page.locator("form.order-choice").is_visible() and page.locator("#order-lines").is_visible()
    page.emulate_media(media="screen")

    with page.expect_download() as got:
        page.get_by_role("button", name="Download the order workbook (.xlsx)").click()
    path = tmp_path / got.value.suggested_filename
    got.value.save_as(path)
    assert path.suffix == ".xlsx"
    cover = {row[0]: row[1] for row in openpyxl.load_workbook(path)["Cover"].iter_rows(values_only=True) if row and row[0]}
    assert "Corvina Bay (CORVINA-BAY)" in cover["Vessels"] and "Saltmere Crest (SALTMERE-CREST)" in cover["Vessels"]
    assert cover["Period [days]"] == 120
    calc = {row[0]: row[1] for row in recalculated_sheets(path, tmp_path)["Cover"] if row and row[0]}
    for currency, total in order.totals_by_currency().items():  # LibreOffice sums the workbook's live formulas
        assert float(calc[f"Total of priced lines [{currency}]"]) == pytest.approx(total)

    with page.expect_download() as got:  # the zip is the form's answer; the order stays on screen
        page.get_by_role("button", name="Write the supplier enquiries").click()
    screenshot(page, f"order-enquiries-{served.engine.dialect.name}")
    data = (tmp_path / "enquiries.zip")
    got.value.save_as(data)
    suppliers = {line.supplier for line in order.lines if line.to_order > 0}
    with zipfile.ZipFile(data) as archive:
        names = archive.namelist()
        assert len(names) == len(suppliers)  # one per supplier (None: the open enquiry)
        for name in names:
            assert openpyxl.load_workbook(io.BytesIO(archive.read(name))).sheetnames


def test_the_order_choice_is_usable_by_keyboard_alone(page, served):
    page.goto(served.url + "/order")
    page.get_by_label("Find vessels to tick").fill("tide")
    with page.expect_navigation():
        page.keyboard.press("Enter")
    assert "q=tide" in page.url
    assert page.get_by_role("status").first.inner_text().startswith("Tick the vessels")
    box = page.get_by_label("TIDEWHISTLE")
    box.focus()
    page.keyboard.press("Space")
    page.get_by_role("button", name="Show the order").focus()
    with page.expect_navigation():
        page.keyboard.press("Enter")
    assert "vessel=TIDEWHISTLE" in page.url
    assert page.get_by_role("heading", name="Order for 1 vessel(s)").count() == 1
    for field in ("Days to cover", "Vessel ids", "Hide lines with nothing to order", "Sort lines by", "Replies by"):
        assert page.get_by_label(field).count() >= 1  # every input has a label
    page.get_by_role("link", name="Order by").click()  # the lines sorted by the date each must be ordered by
    page.wait_for_url("**sort=order_by*")
    dates = [d for d in page.locator("#order-lines [data-col=order_by]").all_inner_texts() if d]
    assert dates == sorted(dates)
