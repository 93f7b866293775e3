"""A limit no tension steel reaches (null in the engine) is shown as such on the page, never a crash.

The section is issue 10's example: so much compression steel that no positive
tension area is tension-controlled (tests/test_unreachable_limits.py works out
why by hand). The page must draw every view and say "not reachable".
"""

from __future__ import annotations

import engine
from webapp.first_look import first_look
from webapp.page import BeamCheckPage

LINK = "?units=si&fc=20.58&fy=678.5&b=763.74&As=24590.2&d=1071.082&asc=23557.4&dc=456.112"
SECTION = dict(units="si", fc=20.58, fy=678.5, b=763.74, As=24590.2, d=1071.082, asc=23557.4, dc=456.112)


def test_the_page_and_the_first_look_say_not_reachable():
    assert engine.check(**SECTION).to_dict()["rho_tc"] is None  # the engine's contract (README)
    page = BeamCheckPage()
    page.apply_link(LINK)
    assert page.result is not None
    assert 'data-q="rho_tc">not reachable<' in page.details.object
    ratios = {row[0]: row[2] for row in first_look(LINK)["ratios"]}
    assert ratios["ρtc"] == "not reachable"
