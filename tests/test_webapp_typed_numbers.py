"""Number boxes compute what they show, or say plainly that nothing was checked (issue 11.2).

Each case was seen with Bokeh's number box: −100 stayed in the Mu box while
Mu = 190 was checked, a cleared box showed "NaN", letters and "5,000" reverted
without a word, and d = 30 with h = 24 blamed only h.
"""

from __future__ import annotations

import pytest

import engine
from webapp.page import BeamCheckPage

from webapp_html import displayed

DISPLAY_REL = 5e-4  # values are shown to 4 significant figures


@pytest.fixture
def page():
    return BeamCheckPage()  # the demo beam, B-204: Mu = 190 kip·ft


def verdict(page) -> str:
    return displayed(page.cards.object)["verdict"][0]


def message(page) -> str:
    return displayed(page.input_pane.object)["message"][0]


def test_a_negative_mu_is_not_checked_and_stays_in_the_box(page):
    page.mu_input.value = "-100"
    assert page.mu_input.value == "-100" and page.Mu == -100
    assert verdict(page).startswith("VerdictNot checked")
    # the engine's own range for Mu (ACI 318-19 9.5.1.1 needs a demand of 0 or more)
    assert message(page).startswith("Not checked. Mu: -100")
    assert "phiMn" not in displayed(page.cards.object)


def test_a_blank_mu_is_no_demand_shown_blank(page):
    page.mu_input.value = ""
    assert page.Mu is None and page.mu_input.value == ""
    assert "strength not checked" in verdict(page) and "Passes" not in verdict(page)
    assert "Mu=&" in page.share_query() + "&" or page.share_query().endswith("Mu=")


@pytest.mark.parametrize("typed, why", [("abc", "a decimal number"),
                                        ("5,000", "without a comma"),
                                        ("1e999", "finite")])
def test_unreadable_text_is_refused_with_the_field_named(page, typed, why):
    page.mu_input.value = typed
    assert page.Mu == 190  # nothing read, nothing used
    assert page.mu_input.value == typed  # the box keeps what was typed until corrected
    assert verdict(page).startswith("VerdictNot checked")
    text = message(page)
    assert text.startswith(f"Not checked. Mu: {typed!r} is not accepted") and why in text
    page.mu_input.value = "200"
    assert page.Mu == 200 and page.refusals == {}
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=200)
    assert verdict(page).startswith("Verdict✔ Passes") == (expected.utilization <= 1)


def test_a_section_entry_refuses_letters_too(page):
    page.entries["h"].value = "24 in"
    assert page.h is None and "Not checked. h: '24 in'" in message(page)
    page.entries["h"].value = "24"
    assert page.h == 24 and page.refusals == {}


def test_a_conflict_names_the_field_just_changed_and_the_one_it_meets(page):
    page.entries["h"].value = "24"
    page.sliders["d"].value = 30.0
    text = message(page)
    # ACI 318-19 needs the steel inside the section: h > dt (the engine's rule names h).
    assert "h: 24" in text and "change to d: change d or h" in text


def test_a_new_layer_starts_empty_and_a_blank_existing_one_is_refused(page):
    before = displayed(page.cards.object)["phiMn"][0]
    page._add_layer()
    assert page.layers == () and displayed(page.cards.object)["phiMn"][0] == before
    page.layer_rows[1][0].value = "0.79"
    page.layer_rows[1][1].value = "19"
    assert page.layers == ((0.79, 19.0),)
    page.layer_rows[1][0].value = ""
    assert page.layers == ((0.79, 19.0),)
    assert "layer 2 area" in message(page) and "✕ removes the layer" in message(page)


def test_a_unit_switch_clears_a_refusal_and_shows_the_values_in_use(page):
    page.mu_input.value = "lots"
    page.unit_switch.value = "si"
    assert page.refusals == {}
    # 190 kip·ft × 1.35581795 kN·m per kip·ft (NIST SP 811 B.9) = 257.605 -> 257.6 kN·m
    assert page.mu_input.value == "257.6"
