"""A T-beam with compression steel, opened from a shared link in Chromium."""

from __future__ import annotations

import pytest
from playwright.sync_api import expect

import engine

from app_driver import entry, open_app, shown_number, source_data, type_value, wait_for_change, shown

pytestmark = pytest.mark.browser

DISPLAY_REL = 5e-4
# Harbourline Depot B-204 with the level-2 slab, bf from the slab geometry, two #4 as A's.
T_LINK = ("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190&h=24&bf=86&hf=5&asc=0.4"
          "&dc=2.5&shape=T&sw=96&ln=288")


def test_t_beam_link_with_compression_steel(page, app_url, screenshots):
    open_app(page, app_url, T_LINK)
    # bf from ACI 318-19 Table 6.3.2.1 (T): 14 + 2 × min(8 × 5, 96/2, 288/8) = 86 in.
    bf = 14 + 2 * min(8 * 5, 96 / 2, 288 / 8)
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190,
                            h=24, bf=bf, hf=5, asc=0.4, dc=2.5)
    expect(page.locator("[data-q=bf_slab]")).to_have_text("86.00")
    assert shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    assert shown_number(page, "c") == pytest.approx(expected.state.c, rel=DISPLAY_REL)
    page.wait_for_function("() => window.Bokeh && window.Bokeh.documents.length > 0")
    outline = source_data(page, "sketch-outline")
    assert max(outline["x"]) - min(outline["x"]) == pytest.approx(bf)
    assert max(outline["y"]) == pytest.approx(24.0)
    bars = source_data(page, "sketch-bars")
    assert "compression" in bars["kind"] and "tension" in bars["kind"]
    block = source_data(page, "sketch-block")
    assert 24 - min(block["y"]) == pytest.approx(expected.state.a, rel=1e-9)
    expect(page.locator("canvas").nth(1)).to_be_visible()
    page.screenshot(path=screenshots / "11-t-beam-link.png")
    caution = page.locator("[data-q=caution]").bounding_box()
    assert caution["y"] + caution["height"] <= 768
    assert page.page_errors == []


def test_shape_and_compression_steel_typed_in_follow_into_the_link(page, app_url, screenshots):
    open_app(page, app_url)
    old = shown(page, "phiMn")
    page.get_by_role("button", name="L-beam", exact=True).click()
    wait_for_change(page, "phiMn", old)
    expect(entry(page, "bf")).to_have_value("48")
    old = shown(page, "phiMn")
    type_value(page, "asc", "0.62")
    type_value(page, "dc", "2.5")
    wait_for_change(page, "phiMn", old)
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190,
                            bf=48, hf=5, asc=0.62, dc=2.5)
    assert shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    expect(page).to_have_url(app_url + "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"
                             "&bf=48&hf=5&asc=0.62&dc=2.5&shape=L")
    page.screenshot(path=screenshots / "12-l-beam-typed.png")


@pytest.mark.parametrize("width, height", [(1366, 768), (768, 1024)])
def test_each_sidebar_label_sits_above_its_own_box(page, app_url, screenshots, width, height):
    # The SI labels are the longest ("A's, compression steel (mm²)"): each must stay
    # within its own box's width, above it, not run into its neighbour's label.
    page.set_viewport_size({"width": width, "height": height})
    open_app(page, app_url, "?units=si&shape=T&hf=125&sw=2400&ln=7300")
    for name in ("h", "dt", "asc", "dc", "bf", "hf", "sw", "ln"):
        label = page.locator(f".rs-input-{name} label").first
        box = entry(page, name)
        expect(label).to_be_visible()
        lb, bb = label.bounding_box(), box.bounding_box()
        assert lb["x"] >= bb["x"] - 1 and lb["x"] + lb["width"] <= bb["x"] + bb["width"] + 1, name
        assert lb["y"] + lb["height"] <= bb["y"] + 1, name
    page.locator(".rs-section-card").first.screenshot(
        path=screenshots / f"sections-labels-{width}x{height}.png")
