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
from engine.documents.share_link import (CHECK_KEYS, KEYS, PAGE_KEYS, format_number, parse_share_query,
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
    from engine.section.beam import beam_section
    keywords = set(inspect.signature(beam_section).parameters) | {"Mu"}
    assert set(CHECK_KEYS) == keywords
    assert set(KEYS) == (keywords - {"layers"}) | {"layer"} | set(PAGE_KEYS)


layer = st.tuples(positive, positive)


@given(h=st.none() | positive, bf=st.none() | positive, hf=st.none() | positive,
       asc=st.none() | positive, dc=st.none() | positive, layers=st.lists(layer, max_size=4),
       shape=st.none() | st.sampled_from(["rect", "T", "L"]), sw=st.none() | positive,
       cover=st.none() | positive, stirrup=st.none() | st.sampled_from(["#3", "#4", "10"]),
       nlayers=st.none() | st.sampled_from([1, 2]),
       support=st.none() | st.sampled_from(["simple", "one-end", "both-ends", "cantilever"]),
       bars=st.none() | st.sampled_from(["#8:4", "#5:5,2", "25:3,3"]))
def test_new_keys_round_trip_exactly(h, bf, hf, asc, dc, layers, shape, sw, cover, stirrup,
                                     nlayers, support, bars):
    inputs = {**B101, "h": h, "bf": bf, "hf": hf, "asc": asc, "dc": dc, "layers": layers}
    settings = dict(shape=shape, sw=sw, cover=cover, stirrup=stirrup, nlayers=nlayers,
                    support=support, bars=bars)
    url = share_url("https://example.org/rhoscope/", inputs, settings)
    # Python's own parser sees one `layer` per layer, written AREA@DEPTH (the CLI's form).
    pairs = parse_qsl(urlsplit(url).query, strict_parsing=True)
    assert [v for k, v in pairs if k == "layer"] == [
        f"{format_number(a)}@{format_number(d)}" for a, d in layers]
    back = parse_share_query(url)
    expected = {k: v for k, v in inputs.items() if v is not None and v != []}
    assert {k: (list(v) if k == "layers" else v) for k, v in back.items()} == {
        k: ([tuple(x) for x in v] if k == "layers" else v) for k, v in expected.items()}
    reading = read_share_query(url)
    assert reading.problems == () and reading.repeated == {}
    assert {k: reading.values.get(k) for k in settings} == settings


@pytest.mark.parametrize("key, text", [
    pytest.param("shape", "<b>T</b>", id="shape-markup"),
    pytest.param("layer", "1.58", id="layer-without-depth"),
    pytest.param("layer", "1.58@nan", id="layer-nan"),
    pytest.param("nlayers", "3", id="three-layers"),
    pytest.param("bars", "#8:four", id="bars-words"),
    pytest.param("stirrup", "#3;drop", id="stirrup-junk"),
    pytest.param("support", "fixed", id="support-unknown"),
    pytest.param("h", "1e400", id="h-overflows"),
])
def test_bad_new_values_are_named_never_raised_by_the_reader(key, text):
    from urllib.parse import quote
    reading = read_share_query(f"units=us&{key}={quote(text)}&fc=5000")
    assert reading.values["fc"] == 5000.0 and key not in reading.values
    assert len(reading.problems) == 1 and reading.problems[0].field.startswith(key)
    with pytest.raises(engine.InputError, match=f"^{key}"):
        parse_share_query(f"units=us&{key}={quote(text)}")


def test_blank_mu_is_no_demand_both_ways():
    assert "Mu=&" in share_query({**B101, "Mu": None}) + "&"
    assert parse_share_query("units=us&Mu=") == {"units": "us", "Mu": None}


def test_cli_style_link_of_layers_checks_as_the_cli():
    # `--layer 1.58@21.5 --layer 0.62@19` (issue 5's CLI form) as a link.
    back = parse_share_query("units=us&fc=4000&fy=60000&b=12&layer=1.58@21.5&layer=0.62@19")
    assert back["layers"] == [(1.58, 21.5), (0.62, 19.0)]
    engine.check(**back)
