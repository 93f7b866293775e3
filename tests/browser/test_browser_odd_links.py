"""Links Panel's own query parsing cannot read still open the page (issue 10.5).

Panel turns query values into Python values with `int()` on anything
`str.isdigit()` accepts; '²' is such a digit that `int()` refuses, and so is
any number of more than 4,300 digits (Python's limit on text to int). Such a
link once left the page blank. The page must open, read the link with its own
reader and say what it did not accept, as plain text.
"""

from __future__ import annotations

import pytest
from playwright.sync_api import expect

import engine

from app_driver import entry, open_app, shown, shown_number

pytestmark = pytest.mark.browser

DISPLAY_REL = 5e-4  # results are shown to 4 significant figures
SUPERSCRIPT_TWO = "%C2%B2"  # '²', UTF-8 in a URL


def assert_page_in_view(page) -> None:
    """Not a blank page: the headline, φMn and the caution are there."""
    expect(page.locator("[data-q=verdict]")).to_be_visible()
    expect(page.locator("[data-q=caution]")).to_contain_text(engine.CAUTION)
    assert page.page_errors == []


def test_an_unread_key_panel_cannot_parse_leaves_the_link_in_use(page, app_url, screenshots):
    # `x` is no key of the link (ignored), and its value '²' is the one Panel's int() refuses.
    open_app(page, app_url,
             f"?x={SUPERSCRIPT_TWO}&units=us&fc=3000&fy=60000&b=10&d=15&As=6&Mu=500")
    assert_page_in_view(page)
    expected = engine.check(units="us", fc=3000, fy=60000, b=10, d=15, As=6, Mu=500)
    assert shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    expect(entry(page, "fc")).to_have_value("3000")
    expect(entry(page, "As")).to_have_value("6")
    expect(entry(page, "Mu")).to_have_value("500")
    page.screenshot(path=screenshots / "09-link-superscript-key.png")


@pytest.mark.parametrize("fc, quoted", [
    ("9" * 5000, "9" * 40),  # past Python's 4,300-digit limit on int()
    (SUPERSCRIPT_TWO, "²"),
    ("<b>x</b>" + "1" * 4999, "<b>x</b>" + "1" * 40),  # markup, then 4,999 digits
], ids=["5000-digits", "superscript", "markup-then-digits"])
def test_an_fc_panel_cannot_parse_is_named_in_plain_text(page, app_url, screenshots, fc, quoted):
    open_app(page, app_url, f"?units=us&fc={fc}&fy=60000&b=14&d=21.5&As=3.16&Mu=190")
    assert_page_in_view(page)
    message = page.locator("[data-q=message]", has_text="fc:").first
    expect(message).to_be_visible()
    assert message.inner_text().startswith("fc: ")
    assert quoted in message.inner_text()  # the value given is quoted back (shortened)
    assert message.evaluate("e => e.children.length") == 0  # text alone, no markup
    assert page.locator("[data-q=message] b").count() == 0
    # f'c falls back to B-204's 4000 psi; hand computation, ACI 318-19 22.2.2:
    # a = As fy / (0.85 f'c b), φMn = 0.9 As fy (d − a/2) (tension-controlled, Table 21.2.2).
    a = 3.16 * 60000 / (0.85 * 4000 * 14)
    assert shown_number(page, "phiMn") == pytest.approx(
        0.9 * 3.16 * 60000 * (21.5 - a / 2) / 12000, rel=DISPLAY_REL)
    expect(entry(page, "fc")).to_have_value("4000")
    assert "fc=4000" in page.url  # the address bar shows what is in use
    assert shown(page, "phiMn")
    page.screenshot(path=screenshots / f"09-link-fc-{len(fc)}.png")
