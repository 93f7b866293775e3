"""Warnings a checker expects (issue 11): entries that compute but would be questioned.

Each case is worked by hand beside it; the limits are ACI 318-19's
(Table 20.5.1.3.1, Table 6.3.2.1, 22.2.1.2) or common practice where marked.
"""

from __future__ import annotations

import engine

BASE = dict(units="us", fc=4000, fy=60000, b=12, d=20, As=2.0)


def warned(result, text: str) -> list[str]:
    return [w for w in result.warnings if text in w]


def test_a_tension_layer_near_the_top_face_is_in_compression():
    # By hand: with 2 in² at 20 in and 0.5 in² at 2 in, both yielding in tension would need
    # a = 2.5·60/(0.85·4·12) = 3.68 in, c = 3.68/0.85 = 4.33 in > 2 in: the top layer is above
    # the neutral axis, so it is in compression (22.2.1.2).
    result = engine.check(**BASE, layers=[(0.5, 2.0)], Mu=100)
    found = warned(result, "Tension layer 2 at 2 in lies above the neutral axis")
    assert len(found) == 1 and "enter it as compression steel" in found[0]
    assert not warned(engine.check(**BASE, Mu=100), "lies above the neutral axis")


def test_a_bar_closer_to_the_face_than_the_least_cover_is_warned():
    # Table 20.5.1.3.1: 1.5 in least cover for beams not exposed; h − dt = 21 − 20 = 1 in < 1.5 in.
    found = warned(engine.check(**BASE, h=21), "Table 20.5.1.3.1")
    assert len(found) == 1 and "h − dt = 1 in" in found[0]
    assert not warned(engine.check(**BASE, h=22.5), "Table 20.5.1.3.1")  # 2.5 in: a #3 stirrup, 1.5 in cover
    # SI: 40 mm (Table 20.5.1.3.1); 30 mm to the bar's centre is too little.
    si = engine.check(units="si", fc=28, fy=420, b=300, d=500, As=1500, h=530)
    assert len(warned(si, "40 mm for beams not exposed")) == 1


def test_a_flange_wider_than_table_6_3_2_1_allows_is_warned():
    # Table 6.3.2.1: each overhang ≤ 8hf. bw = 12, hf = 4: at most 12 + 2·32 = 76 in.
    assert not warned(engine.check(**BASE, bf=76, hf=4), "Table 6.3.2.1")
    found = warned(engine.check(**BASE, bf=80, hf=4), "Table 6.3.2.1")
    assert len(found) == 1 and "34 in a side" in found[0] and "8hf = 32 in" in found[0]


def test_a_vanishing_flange_is_warned():
    # Common practice: no slab carrying a flange is under 2 in (50 mm).
    assert len(warned(engine.check(**BASE, bf=24, hf=0.05), "thinner than any slab")) == 1
    assert not warned(engine.check(**BASE, bf=24, hf=4), "thinner than any slab")
