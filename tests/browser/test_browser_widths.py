"""The served page at a phone's, a tablet's and a laptop's width (issue 11.4).

Each width opens a shared link cold in its own browser context: phones and
tablets as mobile devices (which honour the viewport meta tag, or lay the page
out 980 px wide at a fraction of the scale), the laptop as a desktop window.
The page must not scroll sideways, must not cut any text off, and must show
the inputs, the verdict, φMn and the capacity plot within the screen's width.
"""

from __future__ import annotations

import pytest

from app_driver import open_app
from conftest import CHROMIUM, CHROMIUM_ARGS

pytestmark = pytest.mark.browser

LINK = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"  # B-204, Harbourline Depot
SCREENS = {"phone": (390, 844, True), "tablet": (768, 1024, True), "laptop": (1366, 768, False)}

# Every element in the page, through Panel's shadow roots: text cut off by its own box
# (overflow hidden or clipped while its content is wider or taller), or anything with
# text reaching past the right edge of the screen, unless it sits in a box that scrolls
# across on its own (a wide table): that text is reached by scrolling the table.
FIND_CLIPPED = """
(width) => {
  const found = [];
  const scrolls = (el) => {
    for (let up = el.parentElement || el.getRootNode().host; up;
         up = up.parentElement || (up.getRootNode() !== document && up.getRootNode().host)) {
      if (['auto', 'scroll'].includes(getComputedStyle(up).overflowX)) return true;
    }
    return false;
  };
  const walk = (root) => {
    for (const el of root.querySelectorAll('*')) {
      if (el.shadowRoot) walk(el.shadowRoot);
      const style = getComputedStyle(el);
      if (style.display === 'none' || style.visibility === 'hidden') continue;
      const own = [...el.childNodes].some(n => n.nodeType === 3 && n.textContent.trim());
      if (!own) continue;
      const rect = el.getBoundingClientRect();
      if (rect.width === 0 || rect.height === 0) continue;
      const text = el.textContent.trim().slice(0, 60);
      const cuts = ['hidden', 'clip'];
      if (cuts.includes(style.overflowX) && el.scrollWidth > el.clientWidth + 1)
        found.push(`cut across: ${text} (${el.scrollWidth} > ${el.clientWidth})`);
      else if (cuts.includes(style.overflowY) && el.scrollHeight > el.clientHeight + 2)
        found.push(`cut down: ${text} (${el.scrollHeight} > ${el.clientHeight})`);
      else if (rect.right > width + 1 && !scrolls(el))
        found.push(`past the right edge: ${text} (right ${Math.round(rect.right)})`);
    }
  };
  walk(document);
  return found;
}
"""


@pytest.fixture(scope="module")
def browser(playwright_driver):
    browser = playwright_driver.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS,
                                                headless=True)
    yield browser
    browser.close()


@pytest.mark.parametrize("screen", list(SCREENS))
def test_the_page_fits_the_screen(browser, app_url, screenshots, screen):
    width, height, mobile = SCREENS[screen]
    context = browser.new_context(viewport={"width": width, "height": height},
                                  is_mobile=mobile, has_touch=mobile,
                                  device_scale_factor=2 if mobile else 1)
    try:
        page = context.new_page()
        open_app(page, app_url, LINK)
        page.wait_for_timeout(1500)  # let Bokeh finish laying out the plots
        page.screenshot(path=screenshots / f"20-width-{width}.png", full_page=True)
        # The viewport meta tag is honoured: the page is laid out at the device's width.
        assert page.evaluate("window.innerWidth") == width
        sideways = page.evaluate(
            "document.documentElement.scrollWidth - document.documentElement.clientWidth")
        assert sideways <= 0, f"the page scrolls sideways by {sideways} px at {width} px"
        assert page.evaluate(FIND_CLIPPED, width) == []
        for what in (".rs-input-fc", ".rs-input-Mu", "[data-q=verdict]", "[data-q=phiMn]"):
            box = page.locator(what).first.bounding_box()
            assert box is not None, f"{what} is not on the page at {width} px"
            assert box["x"] >= 0 and box["x"] + box["width"] <= width + 1, (what, box)
        # The plots of the check's own tab (Bokeh draws each on a canvas): all within the width.
        canvases = page.locator("canvas")
        assert canvases.count() >= 3  # the capacity plot, the section sketch, the f'c plot
        for index in range(canvases.count()):
            box = canvases.nth(index).bounding_box()
            if box is not None and box["width"] > 0:
                assert box["x"] >= 0 and box["x"] + box["width"] <= width + 1, (index, box)
    finally:
        context.close()


TABS = ("Size the bars", "Calculation sheet", "Beam schedule", "Ductility")


@pytest.mark.parametrize("screen", ["phone", "tablet"])
def test_every_tab_fits_the_screen(browser, app_url, screenshots, screen):
    width, height, mobile = SCREENS[screen]
    context = browser.new_context(viewport={"width": width, "height": height},
                                  is_mobile=mobile, has_touch=mobile, device_scale_factor=2)
    try:
        page = context.new_page()
        open_app(page, app_url, LINK + "&h=24")  # with h, the ductility tab draws its plots
        for tab in TABS:
            page.locator(".bk-tab", has_text=tab).first.click()
            page.wait_for_timeout(1500)
            page.screenshot(path=screenshots / f"21-{tab.replace(' ', '-')}-{width}.png",
                            full_page=True)
            sideways = page.evaluate(
                "document.documentElement.scrollWidth - document.documentElement.clientWidth")
            assert sideways <= 0, f"{tab}: the page scrolls sideways by {sideways} px"
            assert page.evaluate(FIND_CLIPPED, width) == [], tab
    finally:
        context.close()
