"""Detailing and serviceability rules, each at its edges (ACI 318-19).

Expected values are the clause's own numbers, worked by hand in the comments.
"""

from __future__ import annotations

import pytest

import engine
from engine.provisions.detailing import (Exposure, Support, depth_modification, maximum_bar_spacing,
                              minimum_clear_spacing, minimum_cover, minimum_depth,
                              minimum_layer_gap, minimum_steel_area, minimum_steel_satisfied,
                              service_stress, skin_reinforcement_required)

US, SI = engine.US, engine.SI
US_BAR = {b.designation: b for b in engine.standard_bars(US)}
SI_BAR = {b.designation: b for b in engine.standard_bars(SI)}


@pytest.mark.parametrize("system, db, agg, expected", [
    (US, 0.75, 0.75, 1.0),     # 4/3 × 0.75 = 1.0 ties the 1 in floor
    (US, 0.5, 0.5, 1.0),       # 1 in governs
    (US, 1.128, 0.75, 1.128),  # db of a #9 governs
    (US, 1.0, 1.5, 2.0),       # 4/3 × 1.5 in aggregate governs
    (US, 1.0, 0.7499, 1.0),    # just below the tie: 1 in
    (SI, 19.1, 19.0, 25.333333333),  # 4/3 × 19 = 25.33 mm just over 25 mm
    (SI, 32.3, 19.0, 32.3),    # db of a No. 32 governs
    (SI, 12.7, 10.0, 25.0),    # 25 mm governs
], ids=["tie", "floor", "db", "aggregate", "below-tie", "si-agg", "si-db", "si-floor"])
def test_minimum_clear_spacing_25_2_1(system, db, agg, expected):
    # ACI 318-19 25.2.1: the greatest of 1 in (25 mm), db and (4/3) dagg.
    assert minimum_clear_spacing(system, db, agg) == pytest.approx(expected)


def test_minimum_layer_gap_25_2_2():
    # ACI 318-19 25.2.2: at least 1 in (25 mm) clear between layers.
    assert minimum_layer_gap(US) == 1.0
    assert minimum_layer_gap(SI) == 25.0


@pytest.mark.parametrize("system, exposure, bar, expected", [
    (US, Exposure.NOT_EXPOSED, US_BAR["#11"], 1.5),          # beams: primary bars and stirrups
    (US, Exposure.NOT_EXPOSED, US_BAR["#18"], 1.5),
    (US, Exposure.EXPOSED, US_BAR["#5"], 1.5),              # #5 and smaller
    (US, Exposure.EXPOSED, US_BAR["#6"], 2.0),              # #6 through #18
    (US, Exposure.CAST_AGAINST_GROUND, US_BAR["#3"], 3.0),
    (SI, Exposure.NOT_EXPOSED, SI_BAR["36"], 40.0),
    (SI, Exposure.EXPOSED, SI_BAR["16"], 40.0),
    (SI, Exposure.EXPOSED, SI_BAR["19"], 50.0),
    (SI, Exposure.CAST_AGAINST_GROUND, SI_BAR["25"], 75.0),
], ids=["us-interior", "us-interior-18", "us-ext-5", "us-ext-6", "us-ground", "si-interior",
        "si-ext-16", "si-ext-19", "si-ground"])
def test_minimum_cover_table_20_5_1_3_1(system, exposure, bar, expected):
    # ACI 318-19 Table 20.5.1.3.1, nonprestressed cast-in-place concrete.
    assert minimum_cover(system, exposure, bar) == expected


def test_service_stress_is_two_thirds_fy():
    # ACI 318-19 24.3.2.1: fs may be taken as 2/3 fy.
    assert service_stress(60_000) == pytest.approx(40_000)
    assert service_stress(420) == pytest.approx(280)


@pytest.mark.parametrize("system, fs, cc, expected", [
    (US, 40_000, 2.0, 10.0),    # 15 − 5 = 10 < 12 (the usual 2 in cover case; from memory, ACI R24.3.2)
    (US, 40_000, 1.2, 12.0),    # the two terms meet: 15 − 3 = 12 = 12
    (US, 40_000, 1.0, 12.0),    # 12 (40,000/fs) caps it: min(12.5, 12)
    (US, 40_000, 1.875, 10.3125),  # 1.5 in cover + #3 stirrup: 15 − 4.6875
    (US, 60_000, 2.0, 5.0),     # 15 (2/3) − 5 = 5 < 8
    (SI, 280, 50.0, 255.0),     # 380 − 125 = 255 < 300
    (SI, 280, 32.0, 300.0),     # the terms meet: 380 − 80 = 300
    (SI, 420, 50.0, 128.333333),  # 380 (2/3) − 125 = 128.3 < 200
], ids=["us-2in", "us-meet", "us-cap", "us-typical", "us-high-fs", "si-50", "si-meet", "si-high-fs"])
def test_maximum_bar_spacing_table_24_3_2(system, fs, cc, expected):
    # ACI 318-19 Table 24.3.2, deformed bars.
    assert maximum_bar_spacing(system, fs, cc) == pytest.approx(expected)


@pytest.mark.parametrize("system, h, expected", [
    (US, 36.0, False), (US, 36.0001, True), (US, 24.0, False),
    (SI, 900.0, False), (SI, 900.1, True),
], ids=["36", "just-over-36", "24", "900", "just-over-900"])
def test_skin_reinforcement_9_7_2_3(system, h, expected):
    # ACI 318-19 9.7.2.3: required where h exceeds 36 in (900 mm).
    assert skin_reinforcement_required(system, h) is expected


@pytest.mark.parametrize("support, divisor", [
    (Support.SIMPLE, 16.0), (Support.ONE_END, 18.5), (Support.BOTH_ENDS, 21.0),
    (Support.CANTILEVER, 8.0),
], ids=lambda v: getattr(v, "value", v))
def test_minimum_depth_table_9_3_1_1(support, divisor):
    # ACI 318-19 Table 9.3.1.1: ℓ/16, ℓ/18.5, ℓ/21, ℓ/8 for fy = 60,000 psi (420 MPa).
    assert minimum_depth(US, 240.0, support, 60_000) == pytest.approx(240.0 / divisor)
    assert minimum_depth(SI, 6000.0, support, 420) == pytest.approx(6000.0 / divisor)


@pytest.mark.parametrize("system, fy, factor", [
    (US, 60_000, 1.0), (US, 80_000, 1.2), (US, 40_000, 0.8),
    (SI, 420, 1.0), (SI, 520, 0.4 + 520 / 700), (SI, 280, 0.8),
], ids=["us-60", "us-80", "us-40", "si-420", "si-520", "si-280"])
def test_fy_modification_9_3_1_1_1(system, fy, factor):
    # ACI 318-19 9.3.1.1.1: multiply by 0.4 + fy/100,000 (US) or 0.4 + fy/700 (SI).
    assert depth_modification(system, fy) == pytest.approx(factor)
    assert minimum_depth(system, 160.0, Support.SIMPLE, fy) == pytest.approx(10.0 * factor)


@pytest.mark.parametrize("system, fc, fy, b, d, expected", [
    (US, 4000, 60_000, 12, 20, 200 / 60_000 * 240),             # 3√4000 = 189.7 < 200: (b) governs
    (US, 5000, 60_000, 12, 20, 3 * 5000**0.5 / 60_000 * 240),   # 3√5000 = 212.1 > 200: (a)
    (US, 4444.444444, 60_000, 12, 20, 200 / 60_000 * 240),      # 3√f'c = 200: the two terms meet
    (SI, 28, 420, 300, 500, 1.4 / 420 * 150_000),               # 0.25√28 = 1.32 < 1.4
    (SI, 40, 420, 300, 500, 0.25 * 40**0.5 / 420 * 150_000),    # 0.25√40 = 1.58 > 1.4
], ids=["us-b", "us-a", "us-meet", "si-b", "si-a"])
def test_minimum_steel_9_6_1_2(system, fc, fy, b, d, expected):
    # ACI 318-19 9.6.1.2(a) and (b).
    assert minimum_steel_area(system, fc, fy, b, d) == pytest.approx(expected, rel=1e-6)


def test_minimum_steel_alternative_9_6_1_3():
    # ACI 318-19 9.6.1.3: As,min need not apply where As ≥ 4/3 of the As required.
    assert minimum_steel_satisfied(0.80, 0.80, None)          # at As,min exactly
    assert not minimum_steel_satisfied(0.79, 0.80, None)
    assert minimum_steel_satisfied(0.40, 0.80, 0.30)          # 0.40 = 4/3 × 0.30
    assert not minimum_steel_satisfied(0.3999, 0.80, 0.30)
    assert not minimum_steel_satisfied(0.40, 0.80, None)      # no Mu: no waiver
