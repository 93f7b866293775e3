"""Share-link state: query ⇄ inputs round trip, and hostile queries (no browser)."""

from __future__ import annotations

import math
from urllib.parse import quote

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from webapp import summary
from webapp.state import (DEFAULTS, QUERY_KEYS, Inputs, convert_inputs, default_inputs,
                          format_number, parse_query, rounded_inputs)

from webapp_html import tags

# Harbourline Depot beam B-204 (invented demo scenario), as a link carries it.
B204 = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"

HOSTILE_VALUES = [
    pytest.param("<script>alert(1)</script>", id="script-tag"),
    pytest.param('<img src=x onerror="alert(1)">', id="img-onerror"),
    pytest.param('"><svg onload=alert(1)>', id="attribute-break"),
    pytest.param("1e400", id="overflows-to-inf"),
    pytest.param("nan", id="nan"),
    pytest.param("NaN", id="NaN"),
    pytest.param("inf", id="inf"),
    pytest.param("-Infinity", id="minus-infinity"),
    pytest.param("", id="empty"),
    pytest.param("   ", id="blank"),
    pytest.param("４０００", id="fullwidth-digits"),
    pytest.param("٤٠٠٠", id="arabic-indic-digits"),
    pytest.param("4000abc", id="trailing-letters"),
    pytest.param("0x10", id="hexadecimal"),
    pytest.param("1_000", id="underscore"),
    pytest.param("4,000", id="thousands-comma"),
    pytest.param("-5", id="negative"),
    pytest.param("0", id="zero"),
    pytest.param("1e300", id="huge-finite"),
    pytest.param("9" * 5000, id="five-thousand-digits"),
    pytest.param("ρ≥∞ 🙂", id="unicode-symbols"),
]


def test_default_link_round_trip():
    inputs, messages = parse_query(B204)
    # The demo beam's values as typed into the link (common practice: 4 #8 bars
    # give As = 4 × 0.79 in², ASTM A615 Table 1).
    assert inputs == Inputs(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=3.16,
                            Mu=190.0)
    assert messages == ()
    assert default_inputs("us").to_query() == B204


def test_empty_query_gives_the_defaults():
    assert parse_query("") == (default_inputs("us"), ())
    assert parse_query("?") == (default_inputs("us"), ())


def test_units_are_read_before_the_numbers():
    inputs, messages = parse_query("?fc=30&units=si")
    assert inputs.units == "si" and inputs.fc == 30.0 and messages == ()


def test_blank_mu_means_no_demand():
    inputs, messages = parse_query("?units=us&Mu=")
    assert inputs.Mu is None and messages == ()


def test_missing_key_takes_default_unknown_key_ignored():
    inputs, messages = parse_query("?fc=5000&future_input=7")
    assert inputs.fc == 5000.0 and inputs.fy == DEFAULTS["us"]["fy"] and messages == ()


def test_repeated_key_uses_the_first_and_says_so():
    inputs, messages = parse_query("?fc=5000&fc=6000")
    assert inputs.fc == 5000.0
    assert len(messages) == 1 and messages[0].startswith("fc:") and "2 times" in messages[0]


def test_keys_match_without_case():
    inputs, _ = parse_query("?UNITS=SI&as=1500&FC=30")
    assert (inputs.units, inputs.As, inputs.fc) == ("si", 1500.0, 30.0)


@pytest.mark.parametrize("value", HOSTILE_VALUES)
@pytest.mark.parametrize("field", ["fc", "fy", "b", "d", "As"])
def test_hostile_value_falls_back_for_that_field_only(field, value):
    inputs, messages = parse_query(f"?units=us&{field}={quote(value)}&b=16")
    defaults = dict(DEFAULTS["us"], b=16.0)
    if field == "b":
        defaults["b"] = DEFAULTS["us"]["b"]
        # the link's "b=16" comes second, so the first (hostile) one is used
    assert getattr(inputs, field) == defaults[field]
    for other in ("fc", "fy", "d", "As"):
        if other != field:
            assert getattr(inputs, other) == defaults[other]
    assert any(m.startswith(f"{field}:") for m in messages)
    engine.check(**inputs.engine_kwargs())  # what the page will show is computable


def test_out_of_range_message_names_field_value_and_range():
    _, messages = parse_query("?b=-3")
    assert messages == ("b: '-3' is not accepted; expected a number in (0, 1,200] in "
                        "(zero or negative). Using 14 in.",)


def test_bad_units_fall_back_to_us_with_message():
    inputs, messages = parse_query("?units=<b>metric</b>&fc=4000")
    assert inputs.units == "us" and inputs.fc == 4000.0
    assert messages[0].startswith("units:")


def test_value_outside_slider_span_is_kept_exactly():
    inputs, messages = parse_query("?fc=15123.456&b=60.125")
    assert inputs.fc == 15123.456 and inputs.b == 60.125 and messages == ()


def test_long_message_quotes_a_shortened_value():
    _, messages = parse_query("?fc=" + "x" * 10_000)
    assert len(messages[0]) < 200


def test_huge_query_is_read_without_error():
    parse_query("&".join(f"k{i}=v" for i in range(100_000)) + "&fc=5000")


def test_value_the_engine_cannot_compute_falls_back_with_a_message(monkeypatch):
    real_check = engine.check

    def failing_check(**kwargs):
        if kwargs.get("Mu") == 123.0:  # stands in for an engine failure on an extreme value
            raise ZeroDivisionError("float division by zero")
        return real_check(**kwargs)

    monkeypatch.setattr(engine, "check", failing_check)
    inputs, messages = parse_query("?Mu=123")
    assert inputs.Mu == DEFAULTS["us"]["Mu"] and messages[0].startswith("Mu:")


def test_conversion_uses_the_engine_factors():
    si = convert_inputs(default_inputs("us"), "si")
    # 1 psi = 0.00689475729 MPa, 1 in = 25.4 mm, 1 kip·ft = 1.35581795 kN·m
    # (NIST SP 811, Appendix B.9).
    assert si.fc == pytest.approx(4000 * 0.00689475729, rel=1e-9)
    assert si.b == pytest.approx(14 * 25.4, rel=1e-12)
    assert si.As == pytest.approx(3.16 * 645.16, rel=1e-12)
    assert si.Mu == pytest.approx(190 * 1.35581795, rel=1e-8)


def test_switch_rounding_keeps_four_figures_of_every_quantity():
    us = Inputs(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=2.37, Mu=None,
                h=24.0, layers=((1.58, 19.0),), cover=None)
    si = rounded_inputs(convert_inputs(us, "si"))
    # 1 in = 25.4 mm, 1 in² = 645.16 mm² exactly (NIST SP 811, Appendix B.9), by hand:
    # 1.58 in² = 1019.3528 mm² -> 1019; 2.37 in² = 1529.0292 mm² -> 1529; 19 in = 482.6 mm;
    # 24 in = 609.6 mm (4 significant figures: the precision engineers write).
    assert si.layers == ((1019.0, 482.6),) and si.As == 1529.0 and si.h == 609.6
    assert si.Mu is None and si.cover is None  # blanks stay blank


def test_format_number_is_shortest_and_url_safe():
    assert [format_number(x) for x in (4000.0, 3.16, 0.1 + 0.2, 1e20, 2.5e-7)] == [
        "4000", "3.16", "0.30000000000000004", "1e20", "2.5e-07"]


def _valid_inputs(units: str):
    hard = {"us": dict(fc=30_000.0, fy=200_000.0, b=1_200.0, d=1_200.0),
            "si": dict(fc=200.0, fy=1_400.0, b=30_000.0, d=30_000.0)}[units]
    # From 0.01: the engine refuses sizes below 1e-12 of their maximum (engine/section/validation.py),
    # and As = share·b·d must stay above that floor too.
    positive = {name: st.floats(min_value=1e-2, max_value=top, allow_nan=False)
                for name, top in hard.items()}
    return st.builds(
        lambda fc, fy, b, d, share, Mu: Inputs(units=units, fc=fc, fy=fy, b=b, d=d,
                                               As=share * b * d, Mu=Mu),
        positive["fc"], positive["fy"], positive["b"], positive["d"],
        st.floats(min_value=1e-3, max_value=0.2),
        st.none() | st.just(0.0) | st.floats(min_value=0.0, max_value=1e6))


@settings(max_examples=300, deadline=None)
@given(st.sampled_from(["us", "si"]).flatmap(_valid_inputs))
def test_any_valid_state_survives_the_link_exactly(inputs):
    # A link must reproduce the check bit for bit (issue 3), hence == on floats.
    assert parse_query(inputs.to_query()) == (inputs, ())


@settings(max_examples=500, deadline=None)
@given(st.text(max_size=300))
def test_any_query_text_parses_to_a_checkable_state(text):
    inputs, messages = parse_query(text)
    engine.check(**inputs.engine_kwargs())
    assert all(isinstance(m, str) for m in messages)


@settings(max_examples=300, deadline=None)
@given(st.dictionaries(st.sampled_from(QUERY_KEYS), st.text(max_size=60), max_size=7))
def test_any_values_under_real_keys_are_checkable_and_shown_as_text(pairs):
    query = "?" + "&".join(f"{quote(k)}={quote(v)}" for k, v in pairs.items())
    inputs, messages = parse_query(query)
    result = engine.check(**inputs.engine_kwargs())
    assert math.isfinite(result.phiMn)
    markup = summary.messages_html(messages)
    # Only the app's own boxes are tags; nothing from the link became markup.
    assert {tag for tag, _ in tags(markup)} <= {"div"}
    assert all(set(attrs) <= {"class", "data-q"} for _, attrs in tags(markup))


def _flanged_inputs(units: str):
    def build(b, d, share, widen, thick, extra, comp):
        As = share * b * d
        layers = ((extra * As, 0.8 * d),) if extra else ()
        asc, dc = (comp * As, 0.1 * d) if comp else (None, None)
        return Inputs(units=units, fc=DEFAULTS[units]["fc"], fy=DEFAULTS[units]["fy"], b=b,
                      d=d, As=As, Mu=None, h=1.1 * d, shape="T", bf=widen * b,
                      hf=thick * d, asc=asc, dc=dc, layers=layers)
    size = st.floats(min_value=5.0, max_value=140.0, allow_nan=False)  # bf = 8 b stays in range
    return st.builds(build, size, size, st.floats(min_value=1e-3, max_value=0.04),
                     st.floats(min_value=1.0, max_value=8.0),
                     st.floats(min_value=0.05, max_value=0.5),
                     st.none() | st.floats(min_value=0.1, max_value=1.0),
                     st.none() | st.floats(min_value=0.05, max_value=0.5))


@settings(max_examples=150, deadline=None)
@given(st.sampled_from(["us", "si"]).flatmap(_flanged_inputs))
def test_any_flanged_doubly_reinforced_layered_state_survives_the_link(inputs):
    # T-beams with A's and a second layer (issue 5): the link is exact, hence ==.
    engine.check(**inputs.engine_kwargs())
    assert parse_query(inputs.to_query()) == (inputs, ())


@pytest.mark.parametrize("field", ["h", "dt", "bf", "hf", "asc", "dc", "sw", "ln", "cover",
                                   "agg", "span"])
@pytest.mark.parametrize("value", ["<script>alert(1)</script>", "nan", "1e400", "-5", "４"])
def test_hostile_new_value_is_named_and_the_rest_checks(field, value):
    query = (f"?units=us&shape=T&bf=48&hf=5&h=24&asc=0.4&dc=2.5&sw=96&ln=288&span=288"
             f"&support=simple&{field}={quote(value)}")
    inputs, messages = parse_query(query)
    engine.check(**inputs.engine_kwargs())
    assert any(m.startswith(f"{field}:") for m in messages), messages
    markup = summary.messages_html(messages)
    assert {tag for tag, _ in tags(markup)} <= {"div"}
