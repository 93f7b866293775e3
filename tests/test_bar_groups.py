"""Bars as drawn ("4-#9"): read as a count and an ASTM size, their area exact (engine.section.bar_groups).

Areas: ASTM A615/A615M Table 1 nominal areas (#9: 1.00 in², #8: 0.79 in²,
No. 25: 510 mm², No. 29: 645 mm²).
"""

from __future__ import annotations

import pytest

import engine
from engine.section.bar_groups import bar_group


@pytest.mark.parametrize("text", ["4-#9", "4 #9", "4#9", "4x9", "4 x #9", "4×9", "4 No. 9"])
def test_the_ways_a_drawing_writes_four_number_9_bars(text):
    group = bar_group("bars", text, engine.US)
    assert (group.count, group.bar.designation) == (4, "#9")
    assert group.area == 4 * 1.00  # ASTM A615 Table 1: #9 is 1.00 in²
    assert group.text == "4 #9" and group.link_text == "4x9"


def test_si_bars():
    group = bar_group("bars", "3 No. 25", engine.SI)
    assert group.area == 3 * 510.0  # ASTM A615M Table 1: No. 25 is 510 mm²
    assert group.text == "3 No. 25" and group.link_text == "3x25"
    assert bar_group("bars", "3-25M", engine.SI) == group


@pytest.mark.parametrize("text, why", [("49", "a count and a bar size"),
                                       ("x9", "a count and a bar size"),
                                       ("0x9", "1 to 99 bars"),
                                       ("4 #12", "ASTM A615 bar designations"),
                                       ("4 bars", "a count and a bar size")])
def test_what_is_not_a_bar_group_is_refused_with_the_field_named(text, why):
    with pytest.raises(engine.InputError) as caught:
        bar_group("As bars", text, engine.US)
    assert str(caught.value).startswith("As bars: ") and why in str(caught.value)
