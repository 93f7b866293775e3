"""Fast input in Chromium: once the page settles, what it shows is what it uses.

A person who drags, types and switches units faster than the server answers
must not be left with widgets that show one value while the check, the share
link or φMn use another (issue 10.7), nor with a mix of US and SI values after a
unit switch that overtook queued changes. Each test drives the page without
waiting between actions, polls until nothing on the page changes any more, and
then compares every input widget, the address bar and φMn with each other: the
address bar's query is read by the page's own reader (`webapp.state.parse_query`,
through `engine.documents.share_link`) and checked by `engine.check`.
"""

from __future__ import annotations

import random
import time
from urllib.parse import urlsplit

import pytest
from playwright.sync_api import expect

import engine
from webapp.state import SLIDER_SPANS, SWITCH_FIGURES, parse_query

from app_driver import entry, open_app

pytestmark = pytest.mark.browser

DISPLAY_REL = 5e-4  # results are shown to 4 significant figures
SHOWN_ABS = 5e-5 * 1.01  # input widgets show at most 4 decimals ("0[.][0000]")
SLIDERS = ("fc", "fy", "b", "d", "As")
SECTION_ENTRIES = ("h", "dt", "asc", "dc", "es")  # the typed entries always in view
UNIT_BUTTONS = {"us": "US customary", "si": "SI"}
QUIET_S = 2.5  # unchanged this long (several times the page's 300 ms settle time): settled
SETTLE_TIMEOUT_S = 60.0
POLL_S = 0.25  # polling interval
# Values a person might type, per unit system shown; each is accepted in either system,
# so a value typed into a widget the browser has not yet rebuilt still checks.
TYPED = {"us": {"b": ("12", "16", "18"), "d": ("18", "22.5", "26"), "As": ("2.4", "3", "4"),
                "Mu": ("150", "250", "")},
         "si": {"b": ("300", "400", "450"), "d": ("450", "550", "600"),
                "As": ("1500", "2000", "2600"), "Mu": ("200", "300", "")}}


def handle(page, name: str):
    return page.locator(f".rs-input-{name} .noUi-handle").first


def shown_units(page) -> str:
    """The unit system the switch shows as chosen."""
    si = page.get_by_role("button", name=UNIT_BUTTONS["si"], exact=True)
    return "si" if "bk-active" in (si.get_attribute("class") or "") else "us"


def snapshot(page) -> dict:
    """Everything compared: the address, φMn, each input widget as shown."""
    phi = page.locator("[data-q=phiMn]")
    state = {"url": page.url, "phiMn": phi.first.inner_text() if phi.count() else None,
             "units": shown_units(page)}
    for name in SLIDERS:
        state[name] = entry(page, name).input_value()
        # the handle's own label (its tooltip): where the slider's knob stands
        state[name + " handle"] = handle(page, name).locator(".noUi-tooltip").text_content()
    for name in ("Mu", *SECTION_ENTRIES):
        state[name] = entry(page, name).input_value()
    return state


def settled(page) -> dict:
    """Poll until the page has not changed for QUIET_S seconds; the final snapshot."""
    deadline = time.monotonic() + SETTLE_TIMEOUT_S
    last, since = snapshot(page), time.monotonic()
    while time.monotonic() < deadline:
        time.sleep(POLL_S)
        now = snapshot(page)
        if now != last:
            last, since = now, time.monotonic()
        elif time.monotonic() - since >= QUIET_S:
            return now
    pytest.fail(f"the page never settled within {SETTLE_TIMEOUT_S:g} s; last: {last}")


def assert_all_agree(state: dict) -> engine.FlexuralCheck | None:
    """Widgets, address bar and φMn of a settled page describe one set of inputs."""
    query = urlsplit(state["url"]).query
    assert query, "the address bar holds no inputs after the edits"
    inputs, messages = parse_query(query)
    assert messages == (), messages  # the page writes only links it can read back
    assert state["units"] == inputs.units, (state["units"], query)
    for name in SLIDERS:
        used = getattr(inputs, name)
        assert float(state[name]) == pytest.approx(used, abs=SHOWN_ABS), (name, state, query)
        # The knob stands on the slider's step grid (noUiSlider snaps to it): within
        # half a step of the value in use (27.579 MPa shows the knob at 27.5).
        half_step = SLIDER_SPANS[inputs.units][name][2] / 2
        assert float(state[name + " handle"]) == pytest.approx(used, abs=half_step + SHOWN_ABS), (
            name, state, query)
    for name in ("Mu", *SECTION_ENTRIES):
        used = getattr(inputs, name)
        if used is None:
            assert state[name] == "", (name, state, query)
        else:
            assert float(state[name]) == pytest.approx(used, abs=SHOWN_ABS), (name, state, query)
    try:
        expected = engine.check(**inputs.engine_kwargs())
    except engine.InputError:
        assert state["phiMn"] is None, state  # no strength shown for inputs that do not check
        return None
    assert state["phiMn"] is not None, state
    shown_phi = float(state["phiMn"].replace(",", "").replace("−", "-"))
    assert shown_phi == pytest.approx(expected.phiMn, rel=DISPLAY_REL), (state, query)
    return expected


def burst(page, rng: random.Random, actions: int) -> list[str]:
    """`actions` slider key presses, typed entries and unit switches, with no waits between."""
    done = []
    for _ in range(actions):
        kind = rng.choices(("key", "type", "units"), weights=(6, 3, 1))[0]
        if kind == "key":
            name, key = rng.choice(SLIDERS), rng.choice(("ArrowRight", "ArrowLeft"))
            handle(page, name).press(key)
            done.append(f"{name} {key}")
        elif kind == "type":
            units = shown_units(page)
            name = rng.choice(tuple(TYPED[units]))
            value = rng.choice(TYPED[units][name])
            box = entry(page, name)
            box.fill(value)
            box.press("Enter")
            done.append(f"{name}={value!r} ({units})")
        else:
            other = "us" if shown_units(page) == "si" else "si"
            page.get_by_role("button", name=UNIT_BUTTONS[other], exact=True).click()
            done.append(f"units {other}")
    return done


@pytest.mark.parametrize("seed", [10_7, 2026])
def test_a_burst_of_input_settles_to_one_agreed_state(page, app_url, screenshots, seed):
    open_app(page, app_url)
    rng = random.Random(seed)
    started = time.monotonic()
    actions = burst(page, rng, 60)
    elapsed = time.monotonic() - started
    state = settled(page)
    page.screenshot(path=screenshots / f"08-burst-{seed}.png")
    print(f"seed {seed}: 60 actions in {elapsed:.1f} s: {'; '.join(actions)}")
    result = assert_all_agree(state)
    assert result is not None, f"the burst ended on inputs that do not check: {state}"
    assert page.page_errors == []


def test_slider_keys_alone_reach_the_address_bar(page, app_url):
    # Arrow keys on a slider handle are an edit like a drag: the link follows.
    open_app(page, app_url)
    step = SLIDER_SPANS["us"]["fc"][2]
    for _ in range(5):
        handle(page, "fc").press("ArrowRight")
    state = settled(page)
    # B-204's f'c 4000 psi, five steps of the slider's own step up
    assert float(state["fc"]) == pytest.approx(4000 + 5 * step)
    assert_all_agree(state)


@pytest.mark.parametrize("start, target", [("us", "si"), ("si", "us")])
def test_unit_switch_over_queued_changes_leaves_no_mixed_units(page, app_url, start, target):
    # Changes typed and keyed in one system, then the switch at once: every
    # change is converted with the rest, none is read in the new system.
    # Factors: NIST SP 811 Appendix B.9 (1 in = 25.4 mm, 1 psi = 0.00689475729 MPa,
    # 1 kip·ft = 1.35581795 kN·m).
    to_si = {"length": 25.4, "area": 25.4 ** 2, "stress": 0.00689475729, "moment": 1.35581795}
    quantity = {"fc": "stress", "fy": "stress", "b": "length", "d": "length", "As": "area",
                "Mu": "moment"}
    if start == "us":
        open_app(page, app_url)
        typed = {"fc": 5000.0, "b": 16.0, "Mu": 240.0}
    else:
        open_app(page, app_url, "?units=si&fc=28&fy=420&b=350&d=545&As=2040&Mu=258")
        typed = {"fc": 35.0, "b": 400.0, "Mu": 320.0}
    step = SLIDER_SPANS[start]["d"][2]
    d_before = float(entry(page, "d").input_value())
    for name, value in typed.items():
        box = entry(page, name)
        box.fill(f"{value:g}")
        box.press("Enter")
    handle(page, "d").press("ArrowRight")
    handle(page, "d").press("ArrowRight")
    page.get_by_role("button", name=UNIT_BUTTONS[target], exact=True).click()
    state = settled(page)
    inputs, messages = parse_query(urlsplit(state["url"]).query)
    assert inputs.units == target and state["units"] == target
    factor = {name: to_si[q] if target == "si" else 1 / to_si[q] for name, q in quantity.items()}
    expected = {**typed, "d": d_before + 2 * step}
    for name, value in expected.items():
        # a switch keeps SWITCH_FIGURES (4) significant figures of the exact conversion
        converted = float(f"{value * factor[name]:.{SWITCH_FIGURES}g}")
        assert getattr(inputs, name) == pytest.approx(converted, rel=1e-9), name
    assert_all_agree(state)
    expect(page.locator("[data-q=phiMn]").first).to_be_visible()
