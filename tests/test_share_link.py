"""The share link: a query that reproduces a check exactly.

Reference: the link format of issue 6 (keys units, fc, fy, b, d, As, Mu, dt,
es, spiral; defaults left out; numbers that read back as the same float) and
Python's own `urllib.parse` as the independent parser.
"""

from __future__ import annotations

import json
import math
from urllib.parse import parse_qsl, urlsplit

import pytest
from hypothesis import given
from hypothesis import strategies as st

import engine
from engine.share_link import (CHECK_KEYS, KEYS, PAGE_KEYS, format_number, parse_share_query,
                               read_share_query, share_query, share_url)

# Harbourline Depot roof beam B-101 (invented).
B101 = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, Mu=180)


def test_query_of_a_plain_check_is_short_and_in_key_order():
    # The format written in issue 6: keys in their documented order, whole numbers without ".0".
    assert share_query(B101) == "units=us&fc=4000&fy=60000&b=12&d=21.5&As=3.16&Mu=180"


@pytest.mark.parametrize("inputs, absent", [
    pytest.param({**B101, "dt": None, "es": None, "spiral": False}, ("dt", "es", "spiral"),
                 id="none-and-false-left-out"),
    pytest.param({**B101, "es": 29_000_000.0}, ("es",), id="us-default-Es"),  # ACI 318-19 20.2.2.2
    pytest.param(dict(units="si", fc=28, fy=420, b=300, d=500, As=1500, es=200_000),
                 ("es", "Mu"), id="si-default-Es"),  # ACI 318-19 20.2.2.2: 200,000 MPa
])
def test_defaults_are_left_out(inputs, absent):
    keys = [key for key, _ in parse_qsl(share_query(inputs))]
    assert not set(absent) & set(keys)


def test_non_default_inputs_are_kept():
    query = share_query({**B101, "dt": 23.5, "es": 28_500_000.0, "spiral": True, "units": "US"})
    assert dict(parse_qsl(query)) == {"units": "us", "fc": "4000", "fy": "60000", "b": "12",
                                      "d": "21.5", "As": "3.16", "Mu": "180", "dt": "23.5",
                                      "es": "28500000", "spiral": "1"}


@pytest.mark.parametrize("value, text", [
    pytest.param(4000.0, "4000", id="whole-float"),
    pytest.param(4000, "4000", id="int"),
    pytest.param(0.1, "0.1", id="shortest-repr"),  # repr(0.1) is '0.1' (Python float repr)
    pytest.param(1e20, "1e20", id="no-plus-in-exponent"),
    pytest.param(2.5e-7, "2.5e-07", id="small"),
    pytest.param(1 / 3, "0.3333333333333333", id="seventeen-digits"),
])
def test_number_text(value, text):
    assert format_number(value) == text


@pytest.mark.parametrize("value", [math.nan, math.inf, True, "4000", None],
                         ids=["nan", "inf", "bool", "str", "none"])
def test_number_text_refuses_what_is_not_a_finite_number(value):
    with pytest.raises(engine.InputError, match="fc"):
        format_number(value, "fc")


positive = st.floats(min_value=1e-300, max_value=1e300, allow_nan=False, allow_infinity=False)


@given(fc=positive, fy=positive, b=positive, d=positive, As=positive, Mu=positive,
       dt=st.none() | positive, es=st.none() | positive, spiral=st.booleans(),
       units=st.sampled_from(["us", "si"]))
def test_round_trip_through_urllib_is_exact(fc, fy, b, d, As, Mu, dt, es, spiral, units):
    inputs = dict(units=units, fc=fc, fy=fy, b=b, d=d, As=As, Mu=Mu, dt=dt, es=es, spiral=spiral)
    url = share_url("https://example.org/rhoscope/index.html", inputs)
    parsed = dict(parse_qsl(urlsplit(url).query, strict_parsing=True))
    assert parsed["units"] == units
    for key in ("fc", "fy", "b", "d", "As", "Mu", "dt", "es"):
        default = 29e6 if units == "us" else 2e5  # ACI 318-19 20.2.2.2
        if inputs[key] is None or (key == "es" and inputs[key] == default):
            assert key not in parsed
        else:
            # Bit for bit: the same float, not merely close (float.hex is exact).
            assert float(parsed[key]).hex() == inputs[key].hex()
    assert ("spiral" in parsed) is spiral
    back = parse_share_query(url)
    assert {k: v for k, v in back.items() if k != "units"} == {
        k: v for k, v in inputs.items()
        if k != "units" and v is not None and v is not False and k in back}


@pytest.mark.parametrize("inputs", [
    pytest.param(B101, id="B-101-us"),
    pytest.param(dict(units="si", fc=32, fy=420, b=300, d=540, As=1963.5, Mu=310.7, dt=585.3,
                      spiral=True), id="G-3-si-two-layers-spiral"),
    pytest.param(dict(units="us", fc=4000 + 1 / 3, fy=60000, b=12.1, d=21.5, As=3.1600000000000001,
                      es=28_999_999.5), id="awkward-floats"),
])
def test_parsed_link_reproduces_the_check_exactly(inputs):
    back = parse_share_query(share_url("http://localhost:8000/", inputs))
    # JSON text of both results: identical strings mean identical floats.
    assert json.dumps(engine.check(**back).to_dict()) == json.dumps(
        engine.check(**inputs).to_dict())


def test_url_keeps_the_base_path_query_and_fragment_and_replaces_old_inputs():
    url = share_url("https://host.example/app/?lang=en&fc=1#sheet", B101)
    parts = urlsplit(url)
    assert (parts.scheme, parts.netloc, parts.path, parts.fragment) == (
        "https", "host.example", "/app/", "sheet")
    pairs = parse_qsl(parts.query)
    assert pairs[0] == ("lang", "en")
    assert [value for key, value in pairs if key == "fc"] == ["4000"]


def test_bare_host_gets_a_root_path():
    assert share_url("http://localhost:8000", B101).startswith("http://localhost:8000/?units=us")


@pytest.mark.parametrize("query, field", [
    pytest.param("units=us&As=3,16", "As", id="decimal-comma"),
    pytest.param("units=us&fc=nan", "fc", id="nan"),
    pytest.param("units=us&fc=1_000", "fc", id="underscore"),
    pytest.param("units=us&fc=4000&fc=5000", "fc", id="twice"),
    pytest.param("units=us&spiral=maybe", "spiral", id="spiral-word"),
])
def test_parse_refuses_bad_values_naming_the_key(query, field):
    with pytest.raises(engine.InputError, match=f"^{field}:"):
        parse_share_query(query)


def test_parse_ignores_other_keys_and_accepts_a_leading_question_mark():
    assert parse_share_query("?units=si&theme=dark&fc=28") == {"units": "si", "fc": 28.0}


def test_unknown_input_is_refused_rather_than_dropped():
    with pytest.raises(engine.InputError, match="^colour:"):
        share_query({**B101, "colour": 40})
    with pytest.raises(engine.InputError, match="^bf:"):
        share_query(B101, {"bf": 40})  # a check input is not a page setting


def test_keys_are_the_check_keywords():
    # The link's check keys are engine.check's own keyword names (issues 2 and 5), `layers`
    # travelling as the CLI's repeatable `layer`.
    import inspect
    from engine.section import beam_section
    keywords = set(inspect.signature(beam_section).parameters) | {"Mu"}
    assert set(CHECK_KEYS) == keywords
    assert set(KEYS) == (keywords - {"layers"}) | {"layer"} | set(PAGE_KEYS)
