"""'Size the bars': Mu → options → the chosen option sets the check (no browser)."""

from __future__ import annotations

import pytest

import engine
from webapp.design_view import option_key
from webapp.page import BeamCheckPage
from webapp.state import parse_query

from webapp_html import displayed, number

DISPLAY_REL = 5e-4


@pytest.fixture
def page():
    return BeamCheckPage()


def test_options_are_the_engines_best_first(page):
    view = page.size_bars
    expected = engine.design_section(units="us", fc=4000, fy=60000, b=14, h=24, Mu=190,
                                     cover=1.5, stirrup="#3", agg=0.75, layers=2)
    assert [o.label for o in view.result.options] == [o.label for o in expected.options]
    shown = displayed(view.table.object)["option_label"]
    assert shown == [o.label for o in expected.options]
    assert view.result.options[view.choice.value].ok  # the lightest that works is selected
    assert "9.7.2.3" in view.detail.object  # the detailing checks of the selected option


def test_choosing_an_option_sets_the_check_sketch_and_link(page):
    view = page.size_bars
    two_layer = next(i for i, o in enumerate(view.result.options) if o.ok and o.layers == 2)
    option = view.result.options[two_layer]
    view.choice.value = two_layer
    view.use_selected()
    (As, d), *upper = option.arrangement.steel_layers
    assert (page.As, page.d, page.layers, page.h) == (As, d, tuple(upper), 24.0)
    # The check of the same bars, layer by layer (22.2.1.2), equals the option's φMn.
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, Mu=190, h=24,
                            layers=list(option.arrangement.steel_layers))
    assert page.result.phiMn == pytest.approx(expected.phiMn, rel=1e-12)
    assert page.result.phiMn == pytest.approx(option.phiMn, rel=1e-12)
    assert number(displayed(page.cards.object)["phiMn"][0]) == pytest.approx(
        option.phiMn, rel=DISPLAY_REL)
    # the sketch draws the real bars: count, size and the layer heights from the bottom
    bars = page.sketch.bars.data
    assert len(bars["x"]) == option.count
    assert set(bars["r"]) == {option.bar.db / 2}
    assert sorted({round(y, 9) for y in bars["y"]}) == sorted(
        round(24 - depth, 9) for depth in option.arrangement.layer_depths)
    assert not page.sketch.drawing.schematic
    # the link names the bars and reopens to the same check and the same drawing
    assert f"bars={option_key(option).replace('#', '%23')}" in page._written_search
    other = BeamCheckPage()
    other.apply_link(page._written_search)
    assert other.inputs() == page.inputs()
    assert other.sketch.bars.data["x"] == bars["x"]


def test_moving_as_after_choosing_makes_the_bars_schematic(page):
    view = page.size_bars
    view.use_selected()
    assert not page.sketch.drawing.schematic
    page.sliders["As"].value = 3.5
    assert page.sketch.drawing.schematic and page.bars is None


def test_no_working_option_shows_the_verdict_and_ways_out(page):
    page.mu_input.value = "2000.0"
    html = page.size_bars.verdict.object
    assert "No singly reinforced" in html and "deeper section" in html
    assert displayed(html)["remedies"]


def test_design_inputs_travel_in_the_link(page):
    view = page.size_bars
    view.cover_input.value = 2.0
    view.stirrup_input.value = "#4"
    view.layers_input.value = 1
    view.span_input.value = 300.0
    view.support_input.value = "simply supported"
    query = page._written_search
    inputs, messages = parse_query(query)
    assert messages == ()
    assert (inputs.cover, inputs.stirrup, inputs.nlayers, inputs.span, inputs.support) == (
        2.0, "#4", 1, 300.0, "simple")
    assert all(o.layers == 1 for o in view.result.options)
    # Table 9.3.1.1: simply supported, h ≥ ℓ/16 = 18.75 in for fy = 60,000 psi.
    assert "Table 9.3.1.1" in view.detail.object and "18.75" in view.detail.object


def test_bad_design_value_in_a_link_is_named(page):
    page.apply_link("?units=us&stirrup=%237&cover=-1")
    assert any(m.startswith("stirrup:") for m in page.link_messages)
    assert any(m.startswith("cover:") for m in page.link_messages)
    assert page.size_bars.result is not None


@pytest.mark.parametrize("widget, value, field", [("mu_input", -10.0, "Mu"),
                                                  ("h_input", 5.0, "h")])
def test_refused_design_input_is_named_in_the_tab_and_no_table_is_left(widget, value, field):
    # Mu ≥ 0, and h must hold the steel (h > dt): the engine refuses both, so
    # the tab may not keep the options of the earlier inputs.
    page = BeamCheckPage()
    assert page.size_bars.table.object  # B-204 with Mu = 190 kip·ft has options
    getattr(page.size_bars, widget).value = value
    message = displayed(page.size_bars.message.object)["design_message"][0]
    assert message.startswith(f"Not computed: {field}: ")
    assert page.size_bars.table.object == "" and page.size_bars.result is None
    assert page.size_bars.choice.options == {}


def test_blank_cover_stays_blank_in_si_and_meets_table_20_5_1_3_1(page):
    # ACI 318-19 Table 20.5.1.3.1: beams not exposed to weather, 1.5 in or 40 mm
    # of clear cover to the stirrups. A 1.5 in converted is 38.1 mm (25.4 mm/in),
    # short of 40 mm, so a blank cover must stay blank (the code's default).
    view = page.size_bars
    assert page.cover is None and view.cover_input.value is None
    page.unit_switch.value = "si"
    assert page.cover is None and view.cover_input.value is None
    assert view.result.section.cover >= 40.0
    cover_rules = [rule for option in view.result.options for rule in option.failed_rules
                   if "20.5.1.3" in rule.clause]
    assert cover_rules == []
    assert any(option.ok for option in view.result.options)


def test_typed_cover_is_converted_on_a_unit_switch(page):
    page.size_bars.cover_input.value = 2.0
    page.unit_switch.value = "si"
    assert page.cover == pytest.approx(2.0 * 25.4, rel=1e-9)  # 1 in = 25.4 mm (NIST SP 811)
    assert page.size_bars.cover_input.value == pytest.approx(50.8, rel=1e-9)


def _row_of_mark(table_html: str) -> str:
    """The option label of the one table row that carries the 'lightest' mark."""
    rows = [row for row in table_html.split("<tr") if 'data-q="lightest_mark"' in row]
    assert len(rows) == 1
    return displayed("<tr" + rows[0])["option_label"][0]


def test_order_selector_waiver_checkbox_and_the_lightest_mark(page):
    # B-204 (14 × 24 in) at Mu 300 kip·ft: practical puts a one-layer option first, the lightest
    # (8 #6 as 6 + 2 = 3.52 in², ASTM A615) is further down and marked in words, not colour only;
    # see test_design.test_practical_order_puts_one_layer_first_and_marks_the_lightest.
    view = page.size_bars
    page.mu_input.value = "300"
    assert view.result.section.order is engine.Order.PRACTICAL
    assert view.result.options[0].layers == 1
    assert _row_of_mark(view.table.object) == "8 #6 (6 + 2)"
    assert displayed(view.table.object)["lightest_mark"] == ["· lightest"]
    assert any(label.endswith("(lightest)") and "8 #6" in label for label in view.choice.options)
    assert "order=" not in page._written_search and "waiver=" not in page._written_search
    view.order_input.value = "lightest (least steel)"
    assert view.result.options[0].label == "8 #6 (6 + 2)"
    assert "order=lightest" in page._written_search
    view.waiver_input.value = True
    assert view.result.section.waive_as_min is True
    assert "waiver=1" in page._written_search
    # The link carries both and reopens to the same design; absent, they default.
    other = BeamCheckPage()
    other.apply_link(page._written_search)
    assert (other.order, other.waiver) == ("lightest", True)
    assert other.size_bars.order_input.value == "lightest (least steel)"
    assert other.size_bars.waiver_input.value is True
    assert [o.label for o in other.size_bars.result.options] == \
        [o.label for o in view.result.options]
    plain, messages = parse_query("?units=us&Mu=300")
    assert messages == () and (plain.order, plain.waiver) == (None, False)


def test_waiver_used_is_named_in_the_table(page):
    # Mu 15 kip·ft in B-204: 2 #3 (0.22 in²) are far below As,min of 9.6.1.2 (200/60000·14·d,
    # about 1.02 in² by hand) and pass only by 9.6.1.3 when the waiver is allowed.
    view = page.size_bars
    page.mu_input.value = "15"
    assert "9.6.1.3 waiver" not in view.table.object
    view.order_input.value = "lightest (least steel)"
    view.waiver_input.value = True
    assert view.result.options[0].label == "2 #3"
    assert displayed(view.table.object)["option_ok"][0].startswith("✔ ok (9.6.1.3 waiver)")
    assert "9.6.1.3" in view.verdict.object


def test_bad_order_or_waiver_in_a_link_is_named_and_defaults(page):
    page.apply_link("?units=us&order=cheapest&waiver=perhaps")
    assert any(m.startswith("order:") for m in page.link_messages)
    assert any(m.startswith("waiver:") for m in page.link_messages)
    assert (page.order, page.waiver) == (None, False)
    assert page.size_bars.result.section.order is engine.Order.PRACTICAL


def test_design_labels_are_short_and_the_stirrup_picker_has_no_unit(page):
    view = page.size_bars
    assert view.cover_input.label == "cover to stirrup (in)"
    assert view.cover_input.placeholder == "code"
    assert view.stirrup_input.label == "stirrup bar"  # a designation such as #3, not a length
    page.unit_switch.value = "si"
    assert view.cover_input.label == "cover to stirrup (mm)"
    assert "(" not in view.stirrup_input.label
