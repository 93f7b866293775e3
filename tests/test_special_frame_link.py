"""The share link's `frame`, `top_As` and `top_d` keys (issue 12 item 3).

They round-trip, default to "no frame checks" when absent, and a bad value is refused with
a message naming it while the rest of the link still opens. Demo values: Harbourline
Depot's B-301 (tests/test_special_frame.py).
"""

from __future__ import annotations

import pytest

import engine
from engine.documents.share_link import parse_share_query, read_share_query, share_query
from webapp.state import Inputs, convert_inputs, default_inputs, parse_query

B301 = "?units=us&fc=4000&fy=60000&b=14&d=21.5&As=2.37&Mu=&h=24"


def test_engine_link_writes_and_reads_the_keys():
    query = share_query({"units": "us", "fc": 4000, "fy": 60000, "b": 14, "d": 21.5, "As": 2.37},
                        {"frame": True, "top_As": 3.16, "top_d": 21.5})
    assert query.endswith("&frame=1&top_As=3.16&top_d=21.5")
    values = read_share_query(query).values
    assert values["frame"] is True and values["top_As"] == 3.16 and values["top_d"] == 21.5
    # Page keys: they add checks, the flexural check's keywords do not change.
    assert "frame" not in parse_share_query(query) and "top_As" not in parse_share_query(query)


def test_engine_link_refuses_a_bad_frame_value_when_writing():
    with pytest.raises(engine.InputError, match="frame") as caught:
        share_query({"units": "us"}, {"frame": "yes please"})
    assert caught.value.field == "frame"


def test_inputs_round_trip_with_the_frame_on():
    inputs, messages = parse_query(B301 + "&frame=1&top_As=3.16&top_d=21.5")
    assert messages == ()
    assert (inputs.frame, inputs.top_As, inputs.top_d) == (True, 3.16, 21.5)
    again, _ = parse_query(inputs.to_query())
    assert again == inputs
    kwargs = inputs.special_frame_kwargs()
    assert kwargs["top_As"] == 3.16 and "Mu" not in kwargs
    result = engine.special_frame_check(**kwargs)
    assert result.negative_beam.As == 3.16


def test_absent_keys_mean_no_frame_checks():
    inputs, messages = parse_query(B301)
    assert messages == () and inputs.frame is False and inputs.top_As is None
    assert inputs.special_frame_kwargs() is None
    assert "frame" not in inputs.to_query() and "top_" not in inputs.to_query()
    assert default_inputs().frame is False


def test_frame_without_top_steel_round_trips():
    inputs, messages = parse_query(B301 + "&frame=yes")
    assert messages == () and inputs.frame and inputs.top_As is None
    assert inputs.to_query().endswith("&frame=1")
    assert engine.special_frame_check(**inputs.special_frame_kwargs()).not_checked


@pytest.mark.parametrize("extra, field, words", [
    pytest.param("&frame=maybe", "frame", "expected 1 or 0", id="frame-word"),
    pytest.param("&frame=1&top_As=3,16&top_d=21.5", "top_As", "without a comma",
                 id="area-comma"),
    pytest.param("&frame=1&top_As=3.16", "top_d", "missing", id="depth-missing"),
    # h = 24 in: top bars 30 in from the bottom face lie outside the section.
    pytest.param("&frame=1&top_As=3.16&top_d=30", "top_d", "at most h = 24 in", id="below-h"),
    pytest.param("&frame=1&top_As=-2&top_d=21.5", "top_As", "zero or negative", id="negative"),
])
def test_bad_values_are_refused_with_a_message_and_left_out(extra, field, words):
    inputs, messages = parse_query(B301 + extra)
    assert len(messages) == 1 and messages[0].startswith(f"{field}:") and words in messages[0]
    assert inputs.top_As is None and inputs.top_d is None
    assert (inputs.b, inputs.As, inputs.h) == (14, 2.37, 24)  # the rest of the link opens


def test_unit_switch_converts_the_top_steel():
    # 1 in² = 645.16 mm², 1 in = 25.4 mm exactly.
    inputs = Inputs(units="us", fc=4000, fy=60000, b=14, d=21.5, As=2.37, Mu=None, frame=True,
                    top_As=3.16, top_d=21.5)
    si = convert_inputs(inputs, "si")
    assert si.frame and si.top_As == pytest.approx(3.16 * 645.16) and si.top_d == pytest.approx(
        21.5 * 25.4)
