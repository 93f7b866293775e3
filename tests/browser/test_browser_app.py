"""The app in Chromium against `python -m webapp serve`: what an engineer sees and shares."""

from __future__ import annotations

import time
from pathlib import Path
from urllib.parse import parse_qsl, quote, urlsplit

import pytest
from playwright.sync_api import expect

import engine

from app_driver import (UPDATE_TIMEOUT_MS, bokeh_models, entry, open_app, shown, shown_number, type_value,
                        wait_for_change)

pytestmark = pytest.mark.browser

DISPLAY_REL = 5e-4  # results are shown to 4 significant figures
CLASS_TEXT = {"tension-controlled": "Tension-controlled", "transition": "Transition",
              "compression-controlled": "Compression-controlled"}


def assert_page_shows(page, expected: engine.FlexuralCheck) -> None:
    r = expected.to_dict()
    assert shown_number(page, "phiMn") == pytest.approx(r["phiMn"], rel=DISPLAY_REL)
    assert shown_number(page, "Mn") == pytest.approx(r["Mn"], rel=DISPLAY_REL)
    assert shown_number(page, "eps_t") == pytest.approx(r["eps_t"], rel=DISPLAY_REL)
    assert shown_number(page, "rho") == pytest.approx(r["rho"], rel=DISPLAY_REL)
    assert shown(page, "section_class") == CLASS_TEXT[r["section_class"]]


def query_of(page) -> dict[str, str]:
    return dict(parse_qsl(urlsplit(page.url).query, keep_blank_values=True))


def test_opens_with_beam_b204_and_the_caution_in_view(page, app_url, screenshots):
    open_app(page, app_url)
    # Hand computation for B-204, ACI 318-19 22.2.2: a = As fy / (0.85 f'c b),
    # φMn = 0.9 As fy (d − a/2) (tension-controlled, Table 21.2.2).
    a = 3.16 * 60000 / (0.85 * 4000 * 14)
    assert shown_number(page, "phiMn") == pytest.approx(
        0.9 * 3.16 * 60000 * (21.5 - a / 2) / 12000, rel=DISPLAY_REL)
    caution = page.locator("[data-q=caution]")
    expect(caution).to_contain_text(engine.CAUTION)
    box = caution.bounding_box()
    assert box is not None and box["y"] + box["height"] <= 768  # no scrolling on 1366×768
    page.screenshot(path=screenshots / "01-default.png")
    assert page.page_errors == []


def test_changing_fc_and_as_moves_phimn_and_class(page, app_url, screenshots):
    open_app(page, app_url)
    old = shown(page, "phiMn")
    type_value(page, "fc", "5000")
    wait_for_change(page, "phiMn", old)
    assert_page_shows(page, engine.check(units="us", fc=5000, fy=60000, b=14, d=21.5,
                                         As=3.16, Mu=190))
    old = shown(page, "phiMn")
    type_value(page, "As", "7.9")
    wait_for_change(page, "phiMn", old)
    expected = engine.check(units="us", fc=5000, fy=60000, b=14, d=21.5, As=7.9, Mu=190)
    assert expected.state.section_class.value != "tension-controlled"  # the class moved
    assert_page_shows(page, expected)
    # each settled edit is in the address bar, ready to share
    expect(page).to_have_url(
        app_url + "?units=us&fc=5000&fy=60000&b=14&d=21.5&As=7.9&Mu=190")
    page.screenshot(path=screenshots / "02-edited.png")


def test_slider_drag_updates_live_and_adds_one_history_entry(page, app_url):
    open_app(page, app_url)
    before = page.evaluate("history.length")
    old = shown(page, "phiMn")
    handle = page.locator(".rs-input-As .noUi-handle").first
    box = handle.bounding_box()
    x, y = box["x"] + box["width"] / 2, box["y"] + box["height"] / 2
    page.mouse.move(x, y)
    page.mouse.down()
    for step in range(1, 16):
        page.mouse.move(x + 4 * step, y)
    page.mouse.up()
    wait_for_change(page, "phiMn", old)
    expect(page).not_to_have_url(app_url)
    # Once the drag has settled, the φMn on screen is the check of the As the address holds
    # (one redraw per burst of slider events: it may come a moment after the first change).
    deadline = time.monotonic() + UPDATE_TIMEOUT_MS / 1000
    while True:
        As = float(query_of(page)["As"])
        expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=As, Mu=190)
        if shown_number(page, "phiMn") == pytest.approx(expected.phiMn, rel=DISPLAY_REL):
            break
        assert time.monotonic() < deadline, (shown_number(page, "phiMn"), As, expected.phiMn)
        page.wait_for_timeout(100)  # polling interval
    assert page.evaluate("history.length") == before + 1  # one entry for the whole drag


def test_prefilled_link_shows_the_same_check(page, app_url, screenshots):
    query = "?units=si&fc=35&fy=420&b=300&d=500&As=1500&Mu=250"
    open_app(page, app_url, query)
    expected = engine.check(units="si", fc=35, fy=420, b=300, d=500, As=1500, Mu=250)
    expect(page.locator("[data-q=phiMn]").first).not_to_have_text(
        f"{277.4}")  # not the default beam
    assert_page_shows(page, expected)
    assert shown_number(page, "utilization") == pytest.approx(expected.utilization, rel=2e-3)
    expect(entry(page, "b")).to_have_value("300")
    page.screenshot(path=screenshots / "03-shared-si.png")


def test_link_value_outside_the_slider_is_used_exactly(page, app_url):
    open_app(page, app_url, "?units=us&fc=14321.5&fy=60000&b=14&d=21.5&As=3.16&Mu=")
    assert_page_shows(page, engine.check(units="us", fc=14321.5, fy=60000, b=14, d=21.5,
                                         As=3.16))
    expect(entry(page, "fc")).to_have_value("14321.5")


def test_link_with_bad_values_names_the_fields_and_falls_back(page, app_url, screenshots):
    open_app(page, app_url, "?units=us&fc=abc&fy=60000&b=-3&d=21.5&As=3.16&Mu=190")
    messages = page.locator("[data-q=message]")
    expect(messages.filter(has_text="fc: 'abc'")).to_be_visible()
    expect(messages.filter(has_text="b: '-3'")).to_be_visible()
    assert_page_shows(page, engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5,
                                         As=3.16, Mu=190))
    page.screenshot(path=screenshots / "04-bad-link.png")


def assert_in_view_at_768(locator) -> None:
    """`locator` ends above the fold of a 1366×768 screen (seen without scrolling)."""
    box = locator.bounding_box()
    assert box is not None and box["y"] + box["height"] <= 768, box


@pytest.mark.parametrize("field, value", [("b", "0"), ("fc", "-5")])
def test_refused_typed_value_says_not_checked_in_view(page, app_url, screenshots, field, value):
    # b > 0 and f'c > 0 (ACI 318-19 22.2): such a section cannot be checked,
    # so the headline must not keep the earlier green verdict or its φMn.
    open_app(page, app_url)
    expect(page.locator("[data-q=verdict]")).to_contain_text("Passes")
    type_value(page, field, value)
    verdict = page.locator("[data-q=verdict]")
    expect(verdict).to_contain_text("Not checked", timeout=10_000)
    expect(verdict).to_contain_text(f"{field} = {value} is not accepted")
    expect(verdict).not_to_contain_text("Passes")
    assert page.locator("[data-q=phiMn]").count() == 0  # no strength for unchecked inputs
    message = page.locator("[data-q=message]", has_text=f"{field}: ")
    expect(message).to_be_visible()
    assert_in_view_at_768(message)
    assert_in_view_at_768(verdict)
    page.screenshot(path=screenshots / f"04-refused-{field}.png")
    assert page.page_errors == []


def test_bad_link_value_notice_is_in_view_and_the_address_is_corrected(page, app_url,
                                                                      screenshots):
    open_app(page, app_url, "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.l6&Mu=190")
    notice = page.locator("[data-q=message]", has_text="As: '3.l6'")
    expect(notice).to_be_visible()
    assert_in_view_at_768(notice)
    # The fallback As is the default 3.16 in², so the check is B-204's and passes.
    verdict = page.locator("[data-q=verdict]")
    expect(verdict).to_contain_text("Passes")
    assert_in_view_at_768(verdict)
    expect(page).to_have_url(app_url + "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190")
    page.screenshot(path=screenshots / "04-bad-link-notice.png")


def test_link_markup_is_shown_as_text_and_never_run(page, app_url, screenshots):
    img = '<img src=x onerror="window.__rhoscope_pwned=1;alert(1)">'
    script = "<script>window.__rhoscope_pwned=2;alert(2)</script>"
    svg = "<svg onload=alert(3)>"
    open_app(page, app_url, f"?units=us&fc={quote(img)}&b={quote(script)}&Mu={quote(svg)}")
    messages = page.locator("[data-q=message]")
    expect(messages.filter(has_text=img)).to_be_visible()  # the markup, as characters
    expect(messages.filter(has_text=script)).to_be_visible()
    expect(messages.filter(has_text=svg)).to_be_visible()
    assert page.locator("img[src=x]").count() == 0
    assert page.locator("[data-q=message] svg").count() == 0
    assert page.locator("script", has_text="__rhoscope_pwned").count() == 0
    assert page.evaluate("window.__rhoscope_pwned") is None
    assert page.dialogs == []
    page.screenshot(path=screenshots / "05-markup-link.png")


def test_plot_is_drawn_with_its_limit_markers(page, app_url, screenshots):
    open_app(page, app_url, "?units=us&fc=5000&fy=60000&b=16&d=24&As=4&Mu=300")
    marks = engine.capacity_curve(units="us", fc=5000, fy=60000, b=16, d=24, As=4).marks

    def spans():
        return {s["name"]: s for s in bokeh_models(page, "Span")}

    page.wait_for_function("() => window.Bokeh && window.Bokeh.documents.length > 0")
    for key in ("rho_min", "rho_tc", "rho_max", "rho_b"):
        assert spans()[f"limit-{key}"]["location"] == pytest.approx(marks[key], rel=1e-9)
    assert spans()["Mu"]["visible"] and spans()["Mu"]["location"] == 300
    labels = next(s for s in bokeh_models(page, "ColumnDataSource")
                  if s["name"] == "limit-labels")
    assert labels["data"]["text"] == ["ρmin", "ρtc", "ρ at εt = 0.004", "ρb"]
    canvas = page.locator("canvas").first
    expect(canvas).to_be_visible()
    assert canvas.bounding_box()["width"] > 300
    # dragging As moves the markers' section, not the figure: same document models
    old = shown(page, "phiMn")
    type_value(page, "As", "6")
    wait_for_change(page, "phiMn", old)
    curve = next(s for s in bokeh_models(page, "ColumnDataSource") if s["name"] == "curve")
    expected = engine.capacity_curve(units="us", fc=5000, fy=60000, b=16, d=24, As=6)
    assert max(curve["data"]["rho"]) == pytest.approx(max(expected.rho), rel=1e-9)
    page.screenshot(path=screenshots / "06-plot.png")


def test_unit_switch_converts_the_current_values(page, app_url, screenshots):
    open_app(page, app_url)
    old = shown(page, "phiMn")
    page.get_by_role("button", name="SI", exact=True).click()
    wait_for_change(page, "phiMn", old)
    # 1 kip·ft = 1.35581795 kN·m (NIST SP 811, Appendix B.9)
    assert shown_number(page, "phiMn") == pytest.approx(277.41 * 1.35581795, rel=DISPLAY_REL)
    assert query_of(page)["units"] == "si"
    # 14 in = 355.6 mm and 4000 psi = 27.579 MPa -> 27.58 (4 significant figures, the
    # precision engineers write; NIST SP 811 Appendix B.9 factors, by hand): no float noise.
    assert query_of(page)["b"] == "355.6" and query_of(page)["fc"] == "27.58"
    page.screenshot(path=screenshots / "07-si.png")


def test_copy_link_puts_the_share_link_on_the_clipboard(page, app_url):
    page.context.grant_permissions(["clipboard-read", "clipboard-write"])
    open_app(page, app_url)
    old = shown(page, "phiMn")
    type_value(page, "d", "25")
    wait_for_change(page, "phiMn", old)
    page.get_by_role("button", name="Copy link").click()
    expect(page.get_by_role("button", name="Link copied")).to_be_visible()
    copied = page.evaluate("navigator.clipboard.readText()")
    assert copied == page.url and "d=25" in copied


BUTTON_LOOK_JS = "e => [getComputedStyle(e).backgroundColor, getComputedStyle(e).color]"


def test_download_buttons_look_like_the_other_action_buttons(page, app_url):
    # A download that can be used must not look grey and disabled beside the
    # primary "Copy link" button: same fill and text colour (the page's own look).
    open_app(page, app_url)
    primary = page.get_by_role("button", name="Copy link").evaluate(BUTTON_LOOK_JS)
    page.locator(".bk-tab", has_text="Calculation sheet").first.click()
    sheet = page.locator(".rs-sheet-download button").first
    expect(sheet).to_have_text("Download sheet (HTML)")
    assert sheet.evaluate(BUTTON_LOOK_JS) == primary
    page.locator(".bk-tab", has_text="Beam schedule").first.click()
    schedule = page.locator(".rs-schedule-download button").first
    expect(schedule).to_be_disabled()  # nothing checked yet
    page.locator(".rs-schedule-upload input[type=file]").set_input_files(
        str(Path(__file__).resolve().parents[1] / "data" / "harbourline_schedule.csv"))
    expect(schedule).to_be_enabled(timeout=60_000)
    expect(schedule).to_have_text("Download results (CSV)")
    assert schedule.evaluate(BUTTON_LOOK_JS) == primary
