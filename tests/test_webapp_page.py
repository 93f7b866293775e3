"""The page without a browser: widget → engine → displayed values, links, unit switch."""

from __future__ import annotations

import math

import param
import pytest

import engine
from webapp.page import BeamCheckPage
from webapp.plot import LIMIT_KEYS
from webapp.state import parse_query

from webapp_html import displayed, number, tags

# 1 kip·ft in kN·m: 4.4482216152605 N × 304.8 mm (NIST SP 811, Appendix B.9).
KNM_PER_KIPFT = 4.4482216152605 * 0.3048
DISPLAY_REL = 5e-4  # values are shown to 4 significant figures


@pytest.fixture
def page():
    return BeamCheckPage()


def shown(page) -> dict[str, list[str]]:
    return displayed(page.cards.object + page.details.object)


def assert_shows(page, expected: engine.FlexuralCheck):
    values = shown(page)
    r = expected.to_dict()
    for key in ("phiMn", "Mn", "eps_t", "c", "a", "rho", *LIMIT_KEYS):
        assert number(values[key][0]) == pytest.approx(r[key], rel=DISPLAY_REL), key
    assert number(values["phi"][0]) == pytest.approx(r["phi"], rel=1e-3)  # 3 figures
    for key in LIMIT_KEYS:
        assert number(values["margin_" + key][0]) == pytest.approx(
            r["rho"] - r[key], rel=DISPLAY_REL, abs=1e-7), key
    classes = {"tension-controlled": "Tension-controlled", "transition": "Transition",
               "compression-controlled": "Compression-controlled"}
    assert values["section_class"] == [classes[r["section_class"]]]
    assert [text.startswith("✔") for text in values["check"]] == [
        item["passed"] for item in r["checks"]]
    if r.get("utilization") is None:
        assert "utilization" not in values
    else:
        assert number(values["utilization"][0]) == pytest.approx(r["utilization"], rel=2e-3)


def test_default_page_is_beam_b204_checked_by_hand(page):
    values = shown(page)
    # Independent hand computation, ACI 318-19 22.2.2 (rectangular stress block,
    # steel yields): a = As fy / (0.85 f'c b), Mn = As fy (d − a/2), φ = 0.90
    # for a tension-controlled section (Table 21.2.2).
    a = 3.16 * 60000 / (0.85 * 4000 * 14)
    Mn = 3.16 * 60000 * (21.5 - a / 2) / 12000
    assert number(values["a"][0]) == pytest.approx(a, rel=DISPLAY_REL)
    assert number(values["Mn"][0]) == pytest.approx(Mn, rel=DISPLAY_REL)
    assert number(values["phiMn"][0]) == pytest.approx(0.9 * Mn, rel=DISPLAY_REL)
    assert number(values["utilization"][0]) == pytest.approx(190 / (0.9 * Mn), rel=2e-3)
    assert values["section_class"] == ["Tension-controlled"]


@pytest.mark.parametrize("field, value", [
    ("fc", 6000.0), ("fy", 80000.0), ("b", 10.0), ("d", 30.0), ("As", 7.5), ("As", 0.6),
])
def test_each_slider_drives_the_engine_and_the_display(page, field, value):
    page.sliders[field].value = value
    assert getattr(page, field) == value
    assert_shows(page, engine.check(**page.inputs().engine_kwargs()))


def test_heavy_steel_shows_the_failing_strain_check(page):
    page.sliders["As"].value = 8.0
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=8.0, Mu=190)
    assert_shows(page, expected)
    assert not expected.ok
    assert "9.3.3.1" in displayed(page.cards.object)["verdict"][0]


def test_mu_entry_blank_means_no_strength_check(page):
    page.mu_input.value = ""
    assert page.Mu is None
    assert_shows(page, engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16))
    assert "9.5.1.1" not in page.details.object


def test_as_slider_reaches_past_balanced_steel(page):
    for b, d in ((14, 21.5), (24, 40), (8, 10)):
        page.param.update(b=float(b), d=float(d))
        As_b = engine.check(units="us", fc=4000, fy=60000, b=b, d=d, As=1.0).limits.As_b
        assert page.sliders["As"].end > As_b


def test_unit_switch_converts_and_keeps_the_same_check(page):
    us = page.result
    page.unit_switch.value = "si"
    assert page.units == "si"
    # 1 in = 25.4 mm exactly (NIST SP 811).
    assert page.b == pytest.approx(14 * 25.4, rel=1e-12)
    assert page.sliders["b"].value == pytest.approx(14 * 25.4, rel=1e-12)
    # The switch keeps 4 significant figures of each converted value (the precision
    # engineers write), so the strength matches the exact conversion to about 1e-3.
    assert page.result.phiMn == pytest.approx(us.phiMn * KNM_PER_KIPFT, rel=2e-3)
    assert page.result.ok == us.ok and page.result.state.section_class == us.state.section_class
    assert_shows(page, engine.check(**page.inputs().engine_kwargs()))
    assert "kN·m" in page.cards.object
    page.unit_switch.value = "us"
    assert page.inputs() == parse_query("?units=us")[0]  # back to the exact values


def test_unit_switch_writes_a_clean_link_and_typed_values_stay_exact(page):
    page.unit_switch.value = "si"
    query = dict(part.split("=", 1) for part in page._written_search[1:].split("&"))
    # B-204 (4000 psi, 60000 psi, 14 x 21.5 in, 3.16 in², 190 kip·ft) by NIST SP 811
    # Appendix B.9 factors (1 psi = 0.00689475729 MPa, 1 in = 25.4 mm, 1 kip·ft =
    # 1.35581795 kN·m), each worked by hand to 4 significant figures: 27.579 -> 27.58,
    # 413.685 -> 413.7, 355.6, 546.1, 2038.71 -> 2039, 257.605 -> 257.6.
    assert query == {"units": "si", "fc": "27.58", "fy": "413.7", "b": "355.6",
                     "d": "546.1", "As": "2039", "Mu": "257.6"}
    page.sliders["b"].value = 355.123456789  # typed: used and linked exactly
    assert page.b == 355.123456789 and "b=355.123456789&" in page.share_query()
    page.unit_switch.value = "us"  # no memo now: converted and rounded again
    assert "b=13.98&" in page._written_search  # 355.123456789 / 25.4 = 13.98123...
    assert "fc=4000&" in page._written_search  # 27.58 MPa / 0.00689475729 = 4000.14...
    page.apply_link("?units=si&b=355.59999999999997")  # a link's value: exact, not rounded
    assert page.b == 355.59999999999997


def test_bad_typed_value_shows_a_message_naming_the_field(page):
    page.sliders["b"].value = 0.0
    assert "b:" in page.input_pane.object and "0" in page.input_pane.object


@pytest.mark.parametrize("field, value", [("b", 0.0), ("fc", -5.0)])
def test_refused_input_leaves_no_verdict_or_strength_on_the_cards(page, field, value):
    # ACI 318-19 22.2 needs b > 0 and f'c > 0: nothing can be checked, so the
    # headline must not keep the earlier "Passes" or its φMn.
    page.sliders[field].value = value
    cards = displayed(page.cards.object)
    assert cards["verdict"][0].startswith("VerdictNot checked")
    assert f"{field} = {value:g} is not accepted" in cards["verdict"][0]
    assert "Passes" not in page.cards.object and "phiMn" not in cards
    assert "Not checked" in page.input_pane.object
    assert "Not computed" in page.size_bars.message.object
    assert page.size_bars.table.object == ""
    page.sliders[field].value = 14.0 if field == "b" else 4000.0
    assert displayed(page.cards.object)["verdict"][0].startswith("Verdict✔ Passes")
    assert page.input_pane.object == ""


def test_link_is_applied_exactly_even_outside_slider_spans(page):
    page.apply_link("?units=us&fc=15000&fy=60000&b=60.5&d=21.5&As=3.16&Mu=")
    assert (page.fc, page.b, page.Mu) == (15000.0, 60.5, None)
    assert page.sliders["fc"].end >= 15000 and page.sliders["fc"].value == 15000
    assert_shows(page, engine.check(units="us", fc=15000, fy=60000, b=60.5, d=21.5, As=3.16))
    assert page.link_pane.object == ""


def test_link_in_si(page):
    page.apply_link("?units=si&fc=35&fy=420&b=300&d=500&As=1500&Mu=250")
    assert page.unit_switch.value == "si"
    assert_shows(page, engine.check(units="si", fc=35, fy=420, b=300, d=500, As=1500, Mu=250))


@pytest.mark.parametrize("markup", [
    "<script>alert(1)</script>",
    '<img src=x onerror="alert(1)">',
    "</div><h1>x</h1>",
])
def test_link_markup_is_shown_as_text(page, markup):
    from urllib.parse import quote
    page.apply_link(f"?fc={quote(markup)}&units={quote(markup)}")
    html = page.link_pane.object
    assert {tag for tag, _ in tags(html)} <= {"div"}
    texts = displayed(html)["message"]
    assert any(markup in text for text in texts)  # shown, as text
    assert any(text.startswith("fc:") for text in texts)
    assert page.fc == 4000.0 and page.units == "us"
    assert_shows(page, engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16,
                                    Mu=190))


def test_good_link_clears_earlier_link_messages(page):
    page.apply_link("?fc=abc")
    assert page.link_pane.object
    page.apply_link("?fc=5000")
    assert page.link_pane.object == ""


def test_settled_change_writes_the_share_query(page):
    slider = page.sliders["fc"]
    slider.value = 5000.0
    with param.edit_constant(slider):
        slider.value_throttled = 5000.0
    assert page._written_search == "?units=us&fc=5000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"


def test_plot_data_is_replaced_in_place(page):
    fig = page.capacity_plot.figure
    source = page.capacity_plot.curve
    page.sliders["fc"].value = 5000.0
    assert page.capacity_plot.figure is fig and page.capacity_plot.curve is source
    marks = engine.capacity_curve(units="us", fc=5000, fy=60000, b=14, d=21.5, As=3.16).marks
    for key in LIMIT_KEYS:
        assert page.capacity_plot.spans[key].location == pytest.approx(marks[key])
    assert list(source.data["rho"])[-1] == pytest.approx(max(
        engine.capacity_curve(units="us", fc=5000, fy=60000, b=14, d=21.5, As=3.16).rho))
    assert page.capacity_plot.mu_span.location == 190.0
    assert page.capacity_plot.section.data["phiMn"] == [pytest.approx(page.result.phiMn)]


def test_limit_sweep_follows_fy(page):
    page.sliders["fy"].value = 80000.0
    data = page.sweep_plot.source.data
    for fc, rho_b in zip(data["fc"][::10], data["rho_b"][::10]):
        expected = engine.check(units="us", fc=fc, fy=80000, b=14, d=21.5, As=3.16)
        assert rho_b == pytest.approx(expected.limits.rho_b)
    assert math.isclose(page.sweep_plot.fc_span.location, 4000.0)


def test_caution_is_in_the_header(page):
    assert engine.CAUTION.replace("'", "&#x27;") in page.header.object


def test_hooks_for_other_views(page):
    # The page API other views rely on: current_inputs, share_url, add_view.
    assert page.current_inputs()["Mu"] == 190.0
    engine.check(**page.current_inputs())
    assert page.share_url().endswith(page.share_query())
    import panel as pn
    page.add_view("Extra", pn.pane.Str("x"))
    assert page.views._names[-1] == "Extra" and page.views._names[:2] == ["Check", "Size the bars"]


def test_plot_legends_sit_outside_the_axes_and_ticks_are_plain(page):
    from bokeh.models import Legend, NumeralTickFormatter
    # The legends must not cover the curves or the section's marker, and the
    # regions' legend must wrap to fit the plot's least width (min_width).
    for figure in (page.capacity_plot.figure, page.sweep_plot.figure):
        assert not [item for item in figure.center if isinstance(item, Legend)]
    assert page.capacity_plot.region_legend in page.capacity_plot.figure.below
    assert page.capacity_plot.region_legend.ncols == 2
    # A moment axis reads 140,000, not 1.400e+5 (common practice: plain numbers).
    formatter = page.capacity_plot.figure.yaxis[0].formatter
    assert isinstance(formatter, NumeralTickFormatter) and formatter.format.startswith("0,0")


def test_verdict_without_mu_says_strength_was_not_checked(page):
    # Without Mu, ACI 318-19 9.5.1.1 (φMn ≥ Mu) cannot be checked: the verdict
    # must not read as if strength had passed.
    page.mu_input.value = ""
    verdict = displayed(page.cards.object)["verdict"][0]
    assert "Passes" not in verdict and "✔" not in verdict
    assert "strength not checked" in verdict and "no Mu given" in verdict
    assert 'rs-verdict ok' not in page.cards.object  # not drawn in the pass colour
    page.mu_input.value = "190.0"
    assert "not checked" not in displayed(page.cards.object)["verdict"][0]


def test_the_strain_limit_ratio_is_named_by_what_it_is(page):
    # ACI 318-19 defines no ρmax: the beam limit of 9.3.3.1 is a strain, εt ≥ 0.004,
    # and "ρmax" reads as the retired 0.75ρb (ACI 318-99 10.3.3, from memory).
    from webapp.plot import LIMIT_LABELS
    page_text = page.cards.object + page.details.object
    assert "ρmax" not in page_text and "ρmax" not in "".join(LIMIT_LABELS.values())
    assert "ρ at εt = 0.004" in page_text and "9.3.3.1" in page_text
    assert LIMIT_LABELS["rho_max"] == "ρ at εt = 0.004"


def test_the_demo_is_named_only_while_its_inputs_are_untouched(page):
    # Beam B-204 of the (fictional) Harbourline Depot is the demo; an edited beam is not it.
    assert page.demo_note.visible
    page.unit_switch.value = "si"
    assert page.demo_note.visible  # the same beam in SI
    page.sliders["b"].value = 400.0
    assert not page.demo_note.visible
    page.apply_link("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190")
    assert page.demo_note.visible
    page.mu_input.value = "200"
    assert not page.demo_note.visible


def test_a_switch_never_rounds_a_verdict_away(page):
    # B-204's φMn is 277.4095 kip·ft (3.16 × 60 × (21.5 − 3.9832/2) / 12 × 0.9, 22.2.2.4.1);
    # Mu = 277.4095 fails 9.5.1.1 by a hair. Rounded to 4 figures in SI, Mu = 376.1 kN·m
    # would pass, so the switch keeps the exact conversion instead (and says the same).
    page.mu_input.value = "277.4095"
    assert page.result.ok is False
    page.unit_switch.value = "si"
    assert page.result.ok is False
    # 277.4095 kip·ft × 1.35581795 kN·m per kip·ft (NIST SP 811 B.9) = 376.1168 kN·m, unrounded
    assert page.Mu == pytest.approx(277.4095 * 1.35581795, rel=1e-8) and page.Mu != 376.1
