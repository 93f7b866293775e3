"""Links into the page (issue 10): every input carried, nothing dropped unsaid, no blank page.

References: hand computations beside each number (ACI 318-19 22.2, Table
21.2.2); `engine.check` of the very keywords a link was written from (the
page must check what the link says, so the engine is the reference for the
round trip); the link format of engine.documents.share_link.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

import engine
from engine.documents.share_link import share_query
from webapp.location_guard import RawQueryLocation
from webapp.page import BeamCheckPage

SPIRAL = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=9&Mu=190&spiral=1"


def opened(link: str) -> BeamCheckPage:
    page = BeamCheckPage()
    page.apply_link(link)
    return page


def test_a_spiral_link_opens_with_the_spiral_phi():
    # By hand: steel elastic, 0.85·4000·14·0.85·c² = 9·29e6·0.003·(21.5 − c) gives c = 12.90 in,
    # fs = 87,000·(21.5 − 12.90)/12.90 = 58.0 ksi < fy, a = 10.97 in,
    # Mn = 9·58.0·(21.5 − 5.48)/12 = 696.7 kip·ft; εt = 0.0020 < εty: compression-controlled,
    # φ = 0.75 for spirals (Table 21.2.2), so φMn = 522.5 kip·ft (0.65 with ties: 452.9).
    A, B = 0.85 * 4000 * 14 * 0.85, 9 * 29e6 * 0.003
    c = (-B + math.sqrt(B * B + 4 * A * B * 21.5)) / (2 * A)
    fs = 29e6 * 0.003 * (21.5 - c) / c
    Mn = 9 * fs * (21.5 - 0.85 * c / 2) / 12000
    page = opened(SPIRAL)
    assert page.current_inputs()["spiral"] is True
    assert page.result.phiMn == pytest.approx(0.75 * Mn, rel=1e-9)
    assert page.result.phiMn == pytest.approx(522.5, abs=0.1)
    assert "spiral=1" in page.share_query()


def test_an_es_link_is_checked_with_that_es():
    page = opened("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=9&Mu=190&es=30000000")
    assert page.current_inputs()["es"] == 30e6
    reference = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=9, Mu=190, es=30e6)
    assert page.result.phiMn == reference.phiMn
    assert "es=30000000" in page.share_query()


sections = st.fixed_dictionaries({
    "units": st.just("us"),
    "fc": st.sampled_from([3000.0, 4000.0, 5000.0, 6500.0, 8000.0]),
    "fy": st.sampled_from([40000.0, 60000.0, 75000.0, 80000.0]),
    "b": st.floats(8, 30).map(lambda x: round(x, 2)),
    "d": st.floats(12, 40).map(lambda x: round(x, 2)),
    "rho": st.floats(0.002, 0.035),
    "Mu": st.one_of(st.none(), st.floats(10, 800).map(lambda x: round(x, 1))),
    "spiral": st.booleans(),
    "es": st.sampled_from([None, 29e6, 28.5e6]),
    "layer": st.one_of(st.none(), st.floats(0.2, 2.0).map(lambda x: round(x, 2))),
    "asc": st.one_of(st.none(), st.floats(0.2, 2.0).map(lambda x: round(x, 2))),
})


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(sections)
def test_any_link_reopens_the_same_check(drawn):
    kwargs = {k: drawn[k] for k in ("units", "fc", "fy", "b", "d", "spiral")}
    kwargs["As"] = round(drawn["rho"] * drawn["b"] * drawn["d"], 3)
    kwargs["Mu"] = drawn["Mu"]
    if drawn["es"] is not None:
        kwargs["es"] = drawn["es"]
    if drawn["layer"] is not None:
        kwargs["layers"] = [(drawn["layer"], round(drawn["d"] - 3, 2))]
    if drawn["asc"] is not None:
        kwargs.update(asc=drawn["asc"], dc=2.5)
    try:
        expected = engine.check(**kwargs)
    except engine.InputError:
        assume(False)
    page = opened("?" + share_query(kwargs))
    assert page.link_messages == [] or page.link_messages == ()
    shown = page.current_inputs()
    defaults = {"spiral": False, "es": 29e6}  # left out of a link and of the keywords alike
    for key, value in kwargs.items():
        expected_value = [tuple(v) for v in value] if key == "layers" else value
        assert shown.get(key, defaults.get(key)) == expected_value, key
    assert page.result.phiMn == expected.phiMn


def test_a_link_with_many_layers_opens_with_every_layer():
    # The CLI and the engine take any number of layers; the page must not cut them (issue 10).
    layers = [(0.2, 20.5 - 0.3 * i) for i in range(12)]
    kwargs = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=2, Mu=190, layers=layers, h=24)
    page = opened("?" + share_query(kwargs))
    assert list(page.link_messages) == []
    assert len(page.layers) == 12
    assert page.result.phiMn == engine.check(**kwargs).phiMn


@pytest.mark.parametrize("link", [
    "?units=us&fc=4000&fy=60000&b=14&d=4&As=0.5&Mu=10&h=5",   # issue 10: d = 4 in, h = 5 in
    "?units=us&fc=4000&fy=60000&b=3&d=21.5&As=3.16&Mu=190",   # issue 11: b = 3 in from Copy link
    "?units=si&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190",  # US numbers under si
], ids=["h5-d4", "b3", "si-with-us-numbers"])
def test_links_that_once_blanked_the_page_draw_every_view(link):
    page = opened(link)
    page.__panel__()
    page.size_bars.update(page.inputs())
    page.set_inputs(As=page.As * 1.1)  # then move As, as the issue did
    page.sheet_view.refresh()
    assert page.cards.object  # the headline is drawn, a result or "Not checked"


def test_slab_fields_are_named_as_themselves():
    base = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3&Mu=100&shape=T&hf=5&sw=96"
    assert any(m.startswith("ln: 0.0 is not accepted") for m in opened(base + "&ln=0").link_messages)
    assert any(m.startswith("ln: missing") for m in opened(base).link_messages)


def test_a_query_panel_cannot_parse_still_reaches_the_page():
    # int('²') and a 5,000-digit int raise inside Panel's own parse_query.
    for search in ("?x=%C2%B2&fc=4000", "?fc=" + "9" * 5000):
        location = RawQueryLocation()
        location.search = search
        assert isinstance(location.query_params, dict)
    page = opened("?x=%C2%B2&units=us&fc=3000&fy=60000&b=10&d=15&As=6&Mu=500")
    assert page.result.phiMn == pytest.approx(129.6, abs=0.05)  # tests/test_first_look.py, by hand
    long = opened("?units=us&fc=" + "9" * 5000 + "&fy=60000&b=14&d=21.5&As=3.16&Mu=190")
    assert any(m.startswith("fc: ") and "characters" in m or m.startswith("fc: '9999")
               for m in long.link_messages)


def test_fields_past_what_is_read_are_counted_aloud():
    query = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3&Mu=100&" + "&".join(f"x{i}=1" for i in range(70))
    assert any("more fields than the 64 that are read" in m for m in opened(query).link_messages)


def test_in_the_pyodide_worker_a_change_redraws_at_once(monkeypatch):
    # The worker's document has Panel's stand-in session context, but no event loop runs the
    # callbacks a server session would: a scheduled redraw would never come (blank results).
    from bokeh.document import Document
    from panel.io.document import MockSessionContext
    from panel.io.state import state

    import webapp.page as page_module

    page = BeamCheckPage()
    doc = Document()
    doc._session_context = lambda: MockSessionContext(document=doc)
    monkeypatch.setattr(page_module.sys, "platform", "emscripten")
    state.curdoc = doc
    try:
        page.set_inputs(As=4.0)
    finally:
        state.curdoc = None
    assert page.result.phiMn == engine.check(**page.current_inputs()).phiMn
    assert page.result.to_dict()["As"] == 4.0
