"""The calculation sheet in Chromium: the tab, a hostile header shown as text, the download, print.

References: `engine.calculation_sheet` and `engine.check` for the numbers;
Chromium's own print-to-PDF (the path a user takes with the browser's
print) for the page count.
"""

from __future__ import annotations

import re

import pytest
from self_contained import outside_resources
from playwright.sync_api import expect

import engine
from engine.commands.report import qr_svg
from engine.documents.share_link import format_number
from engine.documents.sheet import calculation_sheet

from app_driver import BOOT_TIMEOUT_MS, UPDATE_TIMEOUT_MS, open_app

pytestmark = pytest.mark.browser

HOSTILE = {
    "project": '<script>alert("p")</script><img src=x onerror=alert(1)>',
    "mark": 'B-204"><b id=bold>bold</b>',
    "engineer": "</iframe><script>alert(2)</script>",
}
# The page's default beam B-204 (webapp/state.py DEFAULTS, Harbourline Depot).
B204 = dict(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=3.16, Mu=190.0)


def show_tab(page, title: str) -> None:
    """Show the results tab called `title`."""
    page.locator(".bk-tab", has_text=title).first.click()


def open_sheet_tab(page, app_url: str):
    open_app(page, app_url)
    show_tab(page, "Calculation sheet")
    frame = page.frame_locator("iframe.rs-sheet")
    expect(frame.locator("[data-key=phiMn]")).to_be_visible(timeout=UPDATE_TIMEOUT_MS)
    return frame


def fill_header(page, name: str, text: str) -> None:
    box = page.locator(f".rs-sheet-{name} input").first
    box.fill(text)
    box.press("Enter")


def test_the_tab_shows_the_engines_sheet_for_the_current_check(page, app_url, screenshots):
    frame = open_sheet_tab(page, app_url)
    phiMn = engine.check(**B204).phiMn
    expect(frame.locator("[data-key=phiMn]")).to_have_attribute("data-value", format_number(phiMn))
    expect(frame.locator("[data-caution]")).to_contain_text(engine.CAUTION)
    expect(frame.locator(".url")).to_contain_text("As=3.16")  # the share link, printed
    expect(frame.locator(".footer svg")).to_be_visible()  # and as a QR code
    page.screenshot(path=screenshots / "sheet-01-tab.png", full_page=True)
    assert page.page_errors == []


def test_hostile_header_text_is_shown_as_text(page, app_url, screenshots):
    frame = open_sheet_tab(page, app_url)
    for name, text in HOSTILE.items():
        fill_header(page, name, text)
    cell = frame.locator("[data-field=engineer]")
    expect(cell).to_have_text(HOSTILE["engineer"], timeout=UPDATE_TIMEOUT_MS)
    expect(frame.locator("[data-field=project]")).to_have_text(HOSTILE["project"])
    expect(frame.locator("[data-field=mark]")).to_have_text(HOSTILE["mark"])
    assert frame.locator("script, img, #bold").count() == 0
    assert page.locator("#bold").count() == 0
    assert page.dialogs == [] and page.page_errors == []
    page.screenshot(path=screenshots / "sheet-02-hostile-header.png", full_page=True)


def test_download_is_self_contained_and_shows_the_engines_phimn(page, app_url, tmp_path):
    frame = open_sheet_tab(page, app_url)
    fill_header(page, "mark", "B-204")
    fill_header(page, "engineer", "R. Ortega")
    expect(frame.locator("[data-field=engineer]")).to_have_text("R. Ortega",
                                                               timeout=UPDATE_TIMEOUT_MS)
    with page.expect_download(timeout=UPDATE_TIMEOUT_MS) as info:
        page.locator(".rs-sheet-download").get_by_role("button").click()
    download = info.value
    assert download.suggested_filename == "B-204-calculation-sheet.html"
    path = tmp_path / download.suggested_filename
    download.save_as(path)
    document = path.read_text(encoding="utf-8")
    assert outside_resources(document) == []
    phiMn = engine.check(**B204).phiMn
    assert f'data-key="phiMn" data-value="{format_number(phiMn)}"' in document
    link = re.search(r'<span class="url">([^<]*)</span>', document).group(1).replace("&amp;", "&")
    assert document == calculation_sheet(B204, mark="B-204",
                                         engineer="R. Ortega",
                                         date=re.search(r'data-field="date">([^<]*)<',
                                                        document).group(1),
                                         link=link, qr_svg=qr_svg(link))
    # The downloaded file on its own, with the page's server gone from the picture.
    viewer = page.context.new_page()
    requests: list[str] = []
    viewer.on("request", lambda request: requests.append(request.url))
    viewer.goto(path.as_uri())
    expect(viewer.locator("[data-key=phiMn]")).to_contain_text(f"{phiMn:.1f}")
    assert requests == [path.as_uri()]
    viewer.close()


def test_a_flanged_check_from_a_link_gets_its_sheet(page, app_url, screenshots):
    inputs = dict(units="us", fc=4000.0, fy=60000.0, b=12.0, d=24.0, As=8.0, Mu=600.0,
                  bf=30.0, hf=3.0)
    query = "?" + engine.documents.share_link.share_query(inputs)
    open_app(page, app_url, query)
    show_tab(page, "Calculation sheet")
    frame = page.frame_locator("iframe.rs-sheet")
    expected = engine.check(**inputs).phiMn
    expect(frame.locator("[data-key=phiMn]")).to_have_attribute(
        "data-value", format_number(expected), timeout=BOOT_TIMEOUT_MS)
    expect(frame.locator("[data-step=Ac] .equation")).to_contain_text("covers the flange and the web")
    page.screenshot(path=screenshots / "sheet-03-flanged.png", full_page=True)


LONG_RECTANGLE = dict(units="us", fc=2000, fy=120000, b=10, d=18, dt=20.5, As=9,
                      es=28_000_000, Mu=900)  # every warning, steel below yield
LONG_GENERAL = dict(units="si", fc=35, fy=420, b=350, bf=1200, hf=120, h=800,
                    layers=[(2940, 720), (1470, 660)], asc=600, dc=60, Mu=900)
MANY_LAYERS = dict(units="us", fc=5000, fy=60000, b=14, bf=60, hf=5, h=40, asc=2, dc=2.5,
                   layers=[(1.58, 37.5 - 2.5 * k) for k in range(5)], Mu=900)
T_BEAM = dict(units="us", fc=4000, fy=60000, b=12, bf=30, hf=3, d=24, As=8, Mu=600)


def _pages(chromium, tmp_path, inputs: dict, paper: str, frame: dict | None = None) -> int:
    link = "http://localhost:8000/?" + engine.documents.share_link.share_query(
        {k: v for k, v in inputs.items() if k != "layers"})
    document = calculation_sheet(
        inputs, project="Harbourline Depot, level 2 roof framing, stage 3 review " * 3,
        mark="B-204", engineer="R. Ortega", checked_by="M. Lund", date="2025-03-14",
        bars="#8:4,2", link=link, qr_svg=qr_svg(link), frame=frame)
    path = tmp_path / "sheet.html"
    path.write_text(document, encoding="utf-8")
    tab = chromium.new_page()
    try:
        tab.goto(path.as_uri())
        pdf = tab.pdf(format=paper)
    finally:
        tab.close()
    return len(re.findall(rb"/Type\s*/Page\b(?!s)", pdf))


@pytest.mark.parametrize("paper", ["Letter", "A4"])
@pytest.mark.parametrize("inputs", [
    pytest.param(LONG_RECTANGLE, id="rectangle-every-warning"),
    pytest.param(T_BEAM, id="T-beam"),
    pytest.param(LONG_GENERAL, id="T-doubly-two-layers"),
    pytest.param(MANY_LAYERS, id="T-doubly-five-layers"),
])
def test_sheet_prints_on_as_many_pages_as_it_numbers(chromium, tmp_path, paper, inputs):
    """Print through Chromium (the browser's print) and count the pages.

    Each of the sheet's page blocks ("page N of M" in its running header)
    fits one printed page, so the numbers printed are the pages there are.
    """
    assert _pages(chromium, tmp_path, inputs, paper) == engine.documents.sheet.PAGES


@pytest.mark.parametrize("paper", ["Letter", "A4"])
def test_a_sheet_with_the_frame_checks_prints_on_one_more_page(chromium, tmp_path, paper):
    # The special moment frame checks take a page of their own: "page 3 of 3".
    frame = {"top_As": 2000.0, "top_d": 720.0}  # mm², mm: LONG_GENERAL is in SI
    assert _pages(chromium, tmp_path, LONG_GENERAL, paper, frame) == engine.documents.sheet.PAGES + 1
