"""Bar sizing does no more work than what can fit and what can pass allows.

Work is counted as arrangements analysed (each a full strain-compatibility
check), not timed: speed itself is measured by the benchmark in
tests/bench/test_bench_design.py. Expected arrangements come from the
detailing rules, worked by hand here.
"""

from __future__ import annotations

import math

import pytest

import engine
import engine.design.sizing as design_module

US_BAR_SIZES = 11  # #3–#11, #14, #18 (ASTM A615)


@pytest.fixture
def analysed(monkeypatch):
    """How many arrangements `engine.design_section` analyses."""
    count = [0]
    evaluate = design_module._evaluate

    def counting(*args, **kwargs):
        count[0] += 1
        return evaluate(*args, **kwargs)

    monkeypatch.setattr(design_module, "_evaluate", counting)
    return count


def test_a_cover_no_count_can_meet_stops_each_size_at_its_nearest_miss(analysed):
    # 0.5 in clear cover is below the 1-1/2 in of Table 20.5.1.3.1 for every bar and stirrup,
    # whatever the count, so no arrangement passes: each size needs only its nearest miss.
    # The search once tried about 19,000 arrangements of this 400 in wide beam.
    result = engine.design_section(units="us", fc=4000, fy=60000, b=400, h=48, Mu=190, cover=0.5)
    assert not any(option.ok for option in result.options)
    assert all("20.5.1.3.1" in {rule.clause for rule in option.failed_rules}
               for option in result.options)
    assert analysed[0] <= 2 * US_BAR_SIZES


def test_a_wide_web_jumps_to_the_bars_crack_control_needs(analysed):
    # Table 24.3.2 with fs = 2/3·60,000 = 40,000 psi (24.3.2.1): s ≤ min(15 − 2.5 cc, 12) in,
    # cc = 1.5 + 0.375 = 1.875 in, so s ≤ 10.3125 in. Across 400 − 2·1.875 = 396.25 in the bar
    # centres span 396.25 − db, so (396.25 − db)/(n − 1) ≤ 10.3125: n = 40 for #3 … #18. Mu =
    # 190 kip·ft needs far less steel, and with the 9.6.1.3 waiver allowed As,min of 9.6.1.2
    # (200/60000·400·d, about 60 in²) does not govern, so 40 bars of each size is the
    # lightest that passes.
    result = engine.design_section(units="us", fc=4000, fy=60000, b=400, h=48, Mu=190,
                                   waive_as_min=True)
    for option in result.options:
        db = option.bar.db
        assert option.ok and option.count == math.ceil(1 + (396.25 - db) / 10.3125)
    assert analysed[0] <= 4 * US_BAR_SIZES
