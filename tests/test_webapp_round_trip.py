"""Every state the page can be in goes page → link → a fresh page intact, every tab drawn (issue 11.1).

Seen before: b = 3 in, *Copy link*, and the fresh page stayed blank with an
AttributeError in a view. Random states, failing and unusual ones included,
are put on a page; every tab is drawn; the page's own link is opened in a
new page, which must hold the very same inputs and draw every tab as well.
No view may fail (a failure is logged at ERROR and shown as "cannot be drawn").
The expected value is the first page's own inputs: the contract is the round trip.
"""

from __future__ import annotations

import logging
import random

import pytest

from webapp.page import BeamCheckPage
from webapp.state import SLIDER_SPANS, Inputs

STATES = 16  # random states per run (each builds two pages and draws five tabs twice)
SEED = 11_1


def draw_every_tab(page: BeamCheckPage) -> None:
    for index in range(len(page.views.objects)):
        page.views.active = index
    page.views.active = 0


def random_state(rng: random.Random) -> Inputs:
    units = rng.choice(("us", "si"))
    span = SLIDER_SPANS[units]

    def pick(name: str, low: float = 0.0, high: float = 1.0) -> float:
        start, end, step = span[name]
        value = start + (end - start) * rng.uniform(low, high)
        return float(f"{value:.4g}")

    d = pick("d", 0.1, 0.9)
    values = dict(units=units, fc=pick("fc"), fy=pick("fy"), b=pick("b"), d=d,
                  As=pick("As", 0.0, 0.6), Mu=rng.choice((None, pick("As") * 40)))
    length = 25.4 if units == "si" else 1.0
    area = 645.16 if units == "si" else 1.0
    if rng.random() < 0.4:
        values["h"] = float(f"{d + rng.uniform(-1.0, 4.0) * length:.4g}")  # sometimes h < d
    if rng.random() < 0.3:
        values["asc"], values["dc"] = 0.6 * area, 2.5 * length
    if rng.random() < 0.3:
        values["layers"] = ((float(f"{rng.uniform(0.3, 2.0) * area:.4g}"), d - 2.5 * length),)
    if rng.random() < 0.3:
        values.update(shape=rng.choice(("T", "L")), bf=3 * values["b"], hf=5 * length)
    if rng.random() < 0.2:
        values["spiral"] = True
    if rng.random() < 0.2:
        values.update(frame=True, top_As=1.5 * area, top_d=d)
    if rng.random() < 0.2:  # bars as drawn for the first layer: 4 #8 or 4 No. 25
        values["As"] = 4 * (510.0 if units == "si" else 0.79)
        values["drawn"] = ("4x25" if units == "si" else "4x8",) + (None,) * len(
            values.get("layers", ()))
    return Inputs(**values)


SEEN = [  # the states reported as blank pages, and other edges
    Inputs(units="us", fc=4000.0, fy=60000.0, b=3.0, d=21.5, As=3.16, Mu=190.0),
    Inputs(units="si", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=3.16, Mu=190.0),
    Inputs(units="si", fc=28.0, fy=420.0, b=50.0, d=545.0, As=2040.0, Mu=258.0),
    Inputs(units="us", fc=3000.0, fy=60000.0, b=10.0, d=15.0, As=6.0, Mu=500.0),
]


@pytest.mark.parametrize("state", SEEN + [random_state(random.Random(SEED + n))
                                          for n in range(STATES)],
                         ids=[f"seen-{n}" for n in range(len(SEEN))]
                         + [f"random-{n}" for n in range(STATES)])
def test_a_state_survives_its_own_link_with_every_tab_drawn(state, caplog):
    caplog.set_level(logging.ERROR)
    first = BeamCheckPage()
    first.apply_link(state.to_query())
    draw_every_tab(first)
    link = first.share_query()
    fresh = BeamCheckPage()
    fresh.apply_link(link)
    draw_every_tab(fresh)
    assert fresh.inputs() == first.inputs(), link
    assert fresh.link_messages == [], (link, fresh.link_messages)
    assert fresh.share_query() == link
    assert [record.getMessage() for record in caplog.records] == []
    for page in (first, fresh):
        shown = page.cards.object + page.details.object + page.plot_note.object
        assert "cannot be drawn" not in shown, link
