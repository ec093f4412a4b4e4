# SPDX-License-Identifier: MIT
"""The vessel page in a real browser: a chief engineer opens a vessel whose check shows lines
short, counts stock on the vessel page by keyboard until the check shows nothing short; and the
page on paper."""

from __future__ import annotations

from tests.browser_support import SCREENS, chromium, page, screenshot, served  # noqa: F401
from tests.db_support import db_url, engine  # noqa: F401

VESSEL = "CORVINA-BAY"


def shot(tab, name: str) -> None:
    """A whole-page screenshot from the top (a page opened at #stock is scrolled, and the sticky
    table headers would be drawn where the viewport stood)."""
    tab.evaluate("window.scrollTo(0, 0)")
    screenshot(tab, name)


def short_rows(tab) -> list[tuple[str, str]]:
    """(part, needed) of each line the check page lists as short."""
    rows = tab.locator("table.grid").first.locator("tbody tr")
    return [(rows.nth(i).locator("td").nth(1).inner_text().strip(), rows.nth(i).locator("td").nth(3).inner_text().strip())
            for i in range(rows.count())]


def test_a_chief_engineer_counts_until_nothing_is_short(page, served):
    from kit.engine.preflight import shortfall_rows
    from kit.services.vessels import voyage_check

    name = served.engine.dialect.name
    page.get_by_role("link", name=VESSEL).click()
    page.wait_for_url(f"**/vessel/{VESSEL}")
    page.get_by_role("link", name="Pre-voyage check").click()
    page.wait_for_url(f"**/vessel/{VESSEL}/check")
    short = short_rows(page)
    assert short and len(short) == len(shortfall_rows(voyage_check(served.engine, VESSEL).short))
    assert f"{len(short)} lines short" in page.locator("#verdict").inner_text()
    shot(page, f"vessel-check-short-{name}")

    page.get_by_role("link", name="Count stock on the vessel page").click()
    page.wait_for_url(f"**/vessel/{VESSEL}#stock")
    shot(page, f"vessel-{name}")
    for part, needed in short:  # each count typed by keyboard into its labelled field
        field = page.get_by_label(f"Counted, {part},").first
        field.focus()
        page.keyboard.type(needed.replace(",", ""))
    page.keyboard.press("Enter")  # the form sends from any of its fields
    page.wait_for_url(f"**/vessel/{VESSEL}?recorded={len(short)}&hours=0#stock")
    assert page.get_by_role("status").inner_text().startswith(f"Recorded {len(short)} count(s)")
    assert "Nothing short" in page.locator("#verdict").inner_text()
    shot(page, f"vessel-counted-{name}")

    page.get_by_role("link", name="Pre-voyage check").click()
    page.wait_for_url(f"**/vessel/{VESSEL}/check")
    assert page.locator("#verdict").inner_text().startswith("Nothing short")
    assert not shortfall_rows(voyage_check(served.engine, VESSEL).short)
    shot(page, f"vessel-check-nothing-short-{name}")


def test_every_field_is_labelled_and_reached_by_keyboard(page, served):
    page.goto(f"{served.url}/vessel/{VESSEL}")
    unlabelled = page.evaluate("""[...document.querySelectorAll('input:not([type=hidden]), select, button')]
        .filter(e => e.tagName !== 'BUTTON' && e.labels.length === 0).map(e => e.id || e.name)""")
    assert unlabelled == []
    reached = set()
    for _ in range(200):  # Tab through the page: every count field and the record button come in turn
        page.keyboard.press("Tab")
        reached.add(page.evaluate("document.activeElement.id || document.activeElement.textContent"))
    counted = page.evaluate("[...document.querySelectorAll('input[name=counted]')].map(e => e.id)")
    assert set(counted) <= reached and "Record the count" in reached


def test_the_pages_print_their_tables_without_the_forms(page, served):
    name = served.engine.dialect.name
    page.goto(f"{served.url}/vessel/{VESSEL}")
    page.emulate_media(media="print")
    assert not page.locator("#count-form").is_visible() and not page.locator("input[name=counted]").first.is_visible()
    assert page.locator("table.stock").first.is_visible() and page.locator("footer.caution").is_visible()
    assert not page.locator("header.bar").is_visible()
    shot(page, f"vessel-print-{name}")
    SCREENS.mkdir(parents=True, exist_ok=True)
    page.pdf(path=str(SCREENS / f"vessel-print-{name}.pdf"), format="A4", landscape=True)
    page.goto(f"{served.url}/vessel/{VESSEL}/check")
    page.emulate_media(media="print")
    assert not page.locator("form").first.is_visible() and page.locator("#verdict").is_visible()
    page.pdf(path=str(SCREENS / f"vessel-check-print-{name}.pdf"), format="A4", landscape=True)
