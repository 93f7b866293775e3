"""'Size the bars' in Chromium: pick an option and see the check, the sketch and the link follow."""

from __future__ import annotations

from urllib.parse import parse_qsl, urlsplit

import pytest
from playwright.sync_api import expect

import engine

from app_driver import open_app, open_tab, shown, shown_number, source_data, wait_for_change

pytestmark = pytest.mark.browser

DISPLAY_REL = 5e-4


def test_pick_an_option_and_the_check_sketch_and_link_follow(page, app_url, screenshots):
    open_app(page, app_url)
    open_tab(page, "Size the bars")
    design = engine.design_section(units="us", fc=4000, fy=60000, b=14, h=24, Mu=190,
                                   cover=1.5, stirrup="#3", agg=0.75, layers=2)
    labels = page.locator("[data-q=option_label]")
    expect(labels.first).to_have_text(design.options[0].label)
    assert labels.count() == len(design.options)
    page.screenshot(path=screenshots / "21-size-the-bars.png", full_page=True)
    pick = next(i for i, o in enumerate(design.options) if o.ok and o.layers == 1)
    option = design.options[pick]
    page.locator(".rs-design-choice select").select_option(
        label=f"{pick + 1}. {option.label}" + (" (lightest)" if option is design.lightest else ""))
    expect(page.locator("tr.rs-chosen [data-q=option_label]")).to_have_text(option.label)
    old = shown(page, "phiMn")
    page.get_by_role("button", name="Use this option in the check").click()
    wait_for_change(page, "phiMn", old)
    # The engine's own check of the same bars (an independent path: engine.check, not the
    # design): φMn on screen and in the option agree.
    layers = list(option.arrangement.steel_layers)
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, Mu=190, h=24, layers=layers)
    assert shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    query = dict(parse_qsl(urlsplit(page.url).query))
    assert float(query["As"]) == layers[0][0] and float(query["d"]) == layers[0][1]
    assert query["bars"] == f"{option.bar.designation}:{option.count}"
    open_tab(page, "Check")
    bars = source_data(page, "sketch-bars")
    assert len(bars["x"]) == option.count
    assert bars["r"] == [pytest.approx(option.bar.db / 2)] * option.count
    expect(page.locator("[data-q=sketch_note]")).to_contain_text("Bars as arranged")
    page.screenshot(path=screenshots / "22-option-in-the-check.png")
    # the link reopens to the same check and the same bars
    open_app(page, page.url)
    assert shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    page.wait_for_function("() => window.Bokeh && window.Bokeh.documents.length > 0")
    expect(page.locator("[data-q=sketch_note]")).to_contain_text("Bars as arranged")
    assert page.page_errors == []


def test_demand_too_large_shows_the_ways_out(page, app_url, screenshots):
    open_app(page, app_url, "?units=us&fc=4000&fy=60000&b=12&d=21.5&As=3.16&Mu=900&h=24")
    open_tab(page, "Size the bars")
    expect(page.locator("[data-q=design_verdict]")).to_contain_text("No singly reinforced")
    expect(page.locator("[data-q=remedies]")).to_contain_text("deeper section")
    page.screenshot(path=screenshots / "23-no-option-works.png", full_page=True)
