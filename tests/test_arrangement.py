"""Bar placement: d, dt, clear spacing, how many bars fit, and layer splits.

Expected values are worked by hand in the comments from the section geometry
(dt = h − cover − stirrup db − db/2; an upper layer db + clear gap higher,
ACI 318-19 25.2.2; clear spacing = (b − 2(cover + stirrup) − n db)/(n − 1)).
"""

from __future__ import annotations

import pytest

import engine
from engine.design.arrangement import bars_that_fit, clear_spacing, distributions, nearest_distribution

US_BAR = {b.designation: b for b in engine.standard_bars(engine.US)}
SI_BAR = {b.designation: b for b in engine.standard_bars(engine.SI)}


def test_one_layer_depths():
    # h 24, cover 1.5, #3 stirrup, #8 bars: dt = 24 − 1.5 − 0.375 − 0.5 = 21.625 in; d = dt.
    a = engine.arrange(b=12, h=24, cover=1.5, stirrup=US_BAR["#3"], bar=US_BAR["#8"],
                       per_layer=(3,), layer_gap=1.0)
    assert a.dt == pytest.approx(21.625)
    assert a.d == pytest.approx(21.625)
    assert a.As == pytest.approx(3 * 0.79)
    assert (a.count, a.layers, a.layer_gap) == (3, 1, 0.0)
    # clear spacing (12 − 2 × 1.875 − 3 × 1.0)/2 = 2.625 in; centres 3.625 in.
    assert a.clear_spacing == pytest.approx(2.625)
    assert a.centre_spacing == pytest.approx(3.625)


def test_two_layer_depths_use_the_centroid_of_the_bars_placed():
    # 4 + 2 #8, 1 in between layers: bottom at 21.625, top at 21.625 − 1 − 1 = 19.625 in;
    # d = (4 × 21.625 + 2 × 19.625)/6 = 20.9583 in; dt = 21.625 in.
    a = engine.arrange(b=14, h=24, cover=1.5, stirrup=US_BAR["#3"], bar=US_BAR["#8"],
                       per_layer=(4, 2), layer_gap=1.0)
    assert a.layer_depths == pytest.approx((21.625, 19.625))
    assert a.d == pytest.approx((4 * 21.625 + 2 * 19.625) / 6)
    assert a.dt == pytest.approx(21.625)
    (a1, y1), (a2, y2) = a.steel_layers
    assert (a1, y1, a2, y2) == pytest.approx((4 * 0.79, 21.625, 2 * 0.79, 19.625))


def test_si_depths():
    # h 600, cover 40, No. 10 stirrup, No. 25 bars: dt = 600 − 40 − 9.5 − 12.7 = 537.8 mm.
    a = engine.arrange(b=300, h=600, cover=40, stirrup=SI_BAR["10"], bar=SI_BAR["25"],
                       per_layer=(3, 3), layer_gap=25)
    assert a.dt == pytest.approx(537.8)
    # Upper layer 25.4 + 25 = 50.4 mm higher; equal layers put d halfway.
    assert a.d == pytest.approx(537.8 - 50.4 / 2)


def test_bars_that_fit_at_the_edge_of_25_2_1():
    # #8 bars, 1 in clear: n bars need 2 × 1.875 + n + (n − 1) in; 4 bars need 10.75 in.
    bar, stirrup = US_BAR["#8"], US_BAR["#3"]
    assert bars_that_fit(10.75, 1.5, stirrup, bar, 1.0) == 4
    assert bars_that_fit(10.75 - 1e-6, 1.5, stirrup, bar, 1.0) == 3
    assert clear_spacing(10.75, 1.5, stirrup, bar, 4) == pytest.approx(1.0)


@pytest.mark.parametrize("count, fits, max_layers, expected", [
    (3, 5, 2, ((3,),)),            # fits in one layer: one layer only
    (5, 5, 2, ((5,),)),            # exactly fills the layer
    (6, 4, 2, ((4, 2), (3, 3))),   # every split, fullest bottom layer first; upper ≤ bottom
    (5, 4, 2, ((4, 1), (3, 2))),   # one bar above is allowed (25.2.2 sets no least number)
    (3, 2, 2, ((2, 1),)),          # 2 + 1: corner bars below, one bar above
    (7, 6, 2, ((6, 1), (5, 2), (4, 3))),  # every split that fits, not only the fullest
    (9, 4, 2, ()),                 # 4 + 5 puts more bars above than below
    (6, 4, 1, ()),                 # one layer allowed and it is full
    (1, 5, 2, ()),                 # a bar in each stirrup corner: at least 2
    (3, 1, 2, ()),                 # the bottom layer needs its 2 corner bars
], ids=["one", "full", "two", "lone-top", "two-plus-one", "every-split", "too-many",
        "one-layer-only", "single", "no-corners"])
def test_distributions(count, fits, max_layers, expected):
    assert distributions(count, fits, max_layers) == expected


def test_nearest_distribution_halves_the_bars():
    assert nearest_distribution(9, 2) == (5, 4)
    assert nearest_distribution(9, 1) == (9,)
    assert nearest_distribution(3, 2) == (2, 1)
    assert nearest_distribution(2, 2) == (2,)
