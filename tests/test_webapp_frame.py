"""The special moment frame option on the page (ACI 318-19 Chapter 18, issue 12.3).

The checks themselves are tested against hand calculations in
tests/test_special_frame.py; here the page must show what the engine gives for
its inputs, keep the option in the link, and never show a pass it could not make.
"""

from __future__ import annotations

import pytest

import engine
from webapp.page import BeamCheckPage
from webapp.state import parse_query

from webapp_html import displayed


@pytest.fixture
def page():
    return BeamCheckPage()


def test_without_top_steel_the_frame_checks_do_not_pass(page):
    assert page.frame_pane.object == ""  # off by default: nothing shown
    page.frame_switch.value = True
    shown = displayed(page.frame_pane.object)
    assert shown["frame_verdict"][0].startswith("✘")
    assert "not checked" in page.frame_pane.object


def test_the_page_shows_the_engines_frame_checks_and_the_link_keeps_them(page):
    page.frame_switch.value = True
    page.entries["top_As"].value = "4"
    page.entries["top_d"].value = "21.5"
    expected = engine.special_frame_check(units="us", fc=4000, fy=60000, b=14, d=21.5,
                                          As=3.16, top_As=4.0, top_d=21.5)
    shown = displayed(page.frame_pane.object)
    assert shown["frame_verdict"][0].startswith("✔" if expected.ok else "✘")
    assert float(shown["Mpr_pos"][0]) == pytest.approx(expected.Mpr_pos, rel=5e-4)
    assert float(shown["Mpr_neg"][0]) == pytest.approx(expected.Mpr_neg, rel=5e-4)
    for item in expected.checks:
        assert item.clause in page.frame_pane.object
    query = page.share_query()
    assert "frame=1" in query and "top_As=4" in query and "top_d=21.5" in query
    inputs, messages = parse_query(query)
    assert messages == () and inputs == page.inputs()


def test_a_unit_switch_converts_the_top_steel(page):
    page.frame_switch.value = True
    page.entries["top_As"].value = "4"
    page.entries["top_d"].value = "21.5"
    page.unit_switch.value = "si"
    # 4 in² × 645.16 mm²/in² = 2580.64 -> 2581, 21.5 in × 25.4 mm/in = 546.1 (NIST SP 811
    # B.9; a switch keeps 4 significant figures)
    assert page.top_As == 2581.0 and page.top_d == pytest.approx(546.1)
    assert page.frame_box.visible


def test_the_sheet_carries_the_frame_checks_on_a_page_of_its_own(page):
    page.frame_switch.value = True
    page.entries["top_As"].value = "4"
    page.entries["top_d"].value = "21.5"
    sheet = page.sheet_view.sheet_html()
    expected = engine.special_frame_check(units="us", fc=4000, fy=60000, b=14, d=21.5,
                                          As=3.16, top_As=4.0, top_d=21.5)
    assert "data-frame" in sheet and "page 3 of 3" in sheet
    for item in expected.checks:
        assert f'data-clause="{item.clause}" data-passed="{"true" if item.passed else "false"}"' \
            in sheet
    page.frame_switch.value = False
    sheet = page.sheet_view.sheet_html()
    assert "data-frame" not in sheet and "page 2 of 2" in sheet
