"""Bars as drawn on the page: each layer's count and size set its area exactly and travel
in the link (issue 11.3).

Areas: ASTM A615 Table 1 (#9: 1.00 in², #8: 0.79 in², nominal diameter of #9:
1.128 in) and A615M Table 1 (No. 29: 645 mm², the soft-metric #9).
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


def test_bars_typed_set_the_area_exactly_and_travel_in_the_link(page):
    page.bars_input.value = "4-#9"
    assert page.As == 4.0 and page.drawn == ("4x9",)
    assert page.bars_input.value == "4 #9"
    assert "As=4&" in page.share_query() and page.share_query().endswith("drawn=4x9")
    inputs, messages = parse_query(page.share_query())
    assert messages == () and inputs == page.inputs()
    # The sketch draws the four bars at their nominal diameter.
    tension = [r for r, kind in zip(page.sketch.bars.data["r"], page.sketch.bars.data["kind"])
               if kind == "tension"]
    assert len(tension) == 4 and all(r == pytest.approx(1.128 / 2) for r in tension)
    assert "4 #9" in displayed(page.sketch_note.object)["sketch_note"][0]


def test_moving_the_area_drops_the_bars_and_the_sketch_says_schematic(page):
    page.bars_input.value = "4 #9"
    page.sliders["As"].value = 3.5
    assert page.drawn == () and page.bars_input.value == ""
    assert "schematic" in displayed(page.sketch_note.object)["sketch_note"][0]


def test_unreadable_bars_are_refused_and_nothing_changes(page):
    page.bars_input.value = "four nines"
    assert page.As == 3.16 and page.drawn == ()
    message = displayed(page.input_pane.object)["message"][0]
    assert message.startswith("Not checked. As bars: 'four nines' is not accepted")


def test_a_unit_switch_keeps_the_same_bars(page):
    page.bars_input.value = "4 #9"
    page.unit_switch.value = "si"
    # ASTM A615M: the same bar is No. 29, 645 mm²; four of them are 2580 mm² exactly.
    assert page.drawn == ("4x29",) and page.As == 4 * 645.0
    assert page.bars_input.value == "4 No. 29"
    page.unit_switch.value = "us"
    assert page.drawn == ("4x9",) and page.As == 4.0


def test_an_extra_layer_takes_bars_and_the_as_slider_says_it_is_one_layer(page):
    page.set_inputs(layers=((1.0, 19.0),))
    row = page.layer_rows[1]
    row[2].value = "2 #8"
    assert page.layers == ((2 * 0.79, 19.0),) and page.drawn == (None, "2x8")
    # The As slider is layer 1 only; the total (3.16 + 1.58 = 4.74 in²) is beside it.
    assert "layer 1 of 2" in page.sliders["As"].name and "total 4.74" in page.sliders["As"].name
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190,
                            layers=[(1.58, 19.0)])
    assert float(displayed(page.cards.object)["phiMn"][0]) == pytest.approx(
        expected.phiMn, rel=5e-4)


def test_a_link_whose_bars_disagree_with_the_area_says_so(page):
    inputs, messages = parse_query("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3&Mu=190"
                                   "&drawn=4x9")
    assert inputs.As == 3 and inputs.drawn == ()
    assert messages and "4 #9 is 4 in²" in messages[0] and "the area is used" in messages[0]


def test_the_sheet_states_the_bars_as_drawn(page):
    from engine.documents.sheet import bars_text  # ASTM A615 #9, #8; A615M No. 29 (the soft-metric #9)
    page.set_inputs(layers=((1.0, 19.0),))
    page.layer_rows[1][2].value = "2 #8"
    page.bars_input.value = "4 #9"
    assert bars_text("4x9,2x8", "us") == "4 #9 + 2 #8 (2 layers, as drawn)"
    assert bars_text("4x29,", "si") == "4 No. 29 + area typed (2 layers, as drawn)"
    from webapp.sheet_view import _bars_of
    assert _bars_of(page) == "4x9,2x8"


def test_a_link_with_bars_in_an_extra_layer_shows_them_in_its_box(page):
    # 2 #8 = 2 × 0.79 in² (ASTM A615 Table 1)
    page.apply_link("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190&layer=1.58@19"
                    "&drawn=,2x8")
    assert page.drawn == (None, "2x8")
    assert page.layer_rows[1][2].value == "2 #8" and page.bars_input.value == ""
