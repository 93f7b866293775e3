"""Flanged sections (T and L): textbook examples and the textbook closed forms.

In this model a flange is a width bf and a thickness hf on the compression
face; an L-beam is the same geometry as a T (its flange is narrower by
Table 6.3.2.1), so both go through the same equations. Tension steel ratios
and As,min are on the web width bw (9.6.1.2).
"""

from __future__ import annotations

import math

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import engine
from reference_cases import EPS_CU, ES_US, beta1_reference

PROFILE = settings(max_examples=80, deadline=None)
KIP_FT = 12_000.0  # lb·in per kip·ft


def test_mccormac_t_beam_block_inside_the_flange():
    # McCormac & Brown, Design of Reinforced Concrete, 9th ed., Chapter 5, T-beam analysis example
    # (from memory): 30-ft span, 4-in slab, 50 in clear between webs, bw = 10 in, d = 24 in,
    # four #9 (As = 4.00 in²), f'c = 4000 psi, fy = 60 ksi.
    # Effective width, ACI 318-19 Table 6.3.2.1: each overhang ≤ 8hf = 32, sw/2 = 25, ln/8 = 45 in,
    #   so bf = 10 + 2·25 = 60 in (the book, under the older code: least of ln/4 = 90, 16hf + bw = 74,
    #   bw + sw = 60, also 60 in).
    # Published: a = 4.00·60/(0.85·4·60) = 1.18 in < hf = 4 in, so the beam acts as a 60-in
    #   rectangle; by hand Mn = 240(24 − 0.588) = 5619 in-kips = 468.2 kip-ft, εt =
    #   0.003(24 − 1.384)/1.384 = 0.0490 (tension-controlled), φMn = 421.4 kip-ft.
    bf = engine.effective_flange_width("T", 10, 4, 50, 30 * 12)
    assert bf == pytest.approx(60.0, rel=1e-12)
    r = engine.check(units="us", fc=4000, fy=60000, b=10, d=24, As=4.00, bf=bf, hf=4)
    assert r.state.a == pytest.approx(1.18, rel=3e-3)
    assert r.state.a == pytest.approx(240 / 204, rel=1e-9)
    assert r.state.c == pytest.approx(1.384, rel=1e-3)
    assert r.state.eps_t == pytest.approx(0.0490, rel=1e-3)
    assert r.Mn == pytest.approx(468.2, rel=1e-4)
    assert r.state.phi == pytest.approx(0.90, rel=1e-12)  # Table 21.2.2, tension-controlled
    assert r.phiMn == pytest.approx(421.4, rel=1e-4)
    # ρ and As,min on the web (9.6.1.2): 200·10·24/60000 = 0.80 in² > 3√4000·10·24/60000 = 0.759.
    d = r.to_dict()
    assert d["rho"] == pytest.approx(4.00 / (10 * 24), rel=1e-12)
    assert d["As_min"] == pytest.approx(0.80, rel=1e-12)
    assert (d["bf"], d["hf"]) == (pytest.approx(60.0), pytest.approx(4.0))


def test_nilson_isolated_t_beam_block_below_the_flange():
    # Nilson, Darwin & Dolan, Design of Concrete Structures, 13th ed., Example 3.8 (from memory):
    # an isolated T, flange 28 in by 6 in, web 10 in wide, h = 30 in, six No. 10 in two rows
    # (As = 7.59 in² as printed) with centroid d = 26 in and the lower row at dt = 27.5 in,
    # f'c = 3000 psi (β1 = 0.85), fy = 60 ksi.
    # Published: a as a rectangle = 7.59·60/(0.85·3·28) = 6.38 in > hf, so the web takes part;
    #   Asf = 0.85·3(28 − 10)·6/60 = 4.59 in²; a = (7.59 − 4.59)·60/(0.85·3·10) = 180/25.5 = 7.06 in;
    #   c = 7.06/0.85 = 8.30 in; εt = 0.003(27.5 − 8.30)/8.30 = 0.00693 > 0.005, φ = 0.90;
    #   Mn = 4.59·60(26 − 3) + 3.00·60(26 − 3.53) = 6334 + 4045 = 10,379 in-kips; φMn = 9341 in-kips.
    # By hand (ACI 318-19): εty + 0.003 = 0.00507 < 0.00693, still tension-controlled, φ = 0.90.
    r = engine.check(units="us", fc=3000, fy=60000, b=10, d=26, dt=27.5, h=30, As=7.59, bf=28, hf=6)
    assert r.state.a == pytest.approx(7.06, rel=1e-3)
    assert r.state.c == pytest.approx(8.30, rel=1e-3)
    assert r.state.eps_t == pytest.approx(0.00693, rel=2e-3)
    assert r.state.steel_yields
    assert r.Mn * 12 == pytest.approx(10379, rel=1e-4)
    assert r.state.section_class.value == "tension-controlled"
    assert r.phiMn * 12 == pytest.approx(9341, rel=1e-4)


def test_l_beam_edge_of_the_mccormac_floor():
    # The edge beam of the floor above as an L (ACI 318-19 Table 6.3.2.1, L row), by hand:
    # the overhang ≤ 6hf = 24, sw/2 = 25, ln/12 = 30 in, so bf = 10 + 24 = 34 in;
    # a = 240/(0.85·4·34) = 2.076 in < 4 in; Mn = 240(24 − 1.038) = 5510.9 in-kips = 459.2 kip-ft.
    bf = engine.effective_flange_width("L", 10, 4, 50, 30 * 12)
    assert bf == pytest.approx(34.0, rel=1e-12)
    r = engine.check(units="us", fc=4000, fy=60000, b=10, d=24, As=4.00, bf=bf, hf=4)
    assert r.state.a == pytest.approx(240 / (0.85 * 4 * 34), rel=1e-9)
    assert r.Mn == pytest.approx(459.2, rel=1e-4)


flanged = st.fixed_dictionaries({
    "fc": st.floats(3000, 10000),
    "fy": st.floats(40000, 100000),
    "bw": st.floats(8, 24),
    "d": st.floats(12, 48),
    "hf_ratio": st.floats(0.05, 0.5),  # hf / d
    "overhang": st.floats(0.0, 6.0),  # (bf − bw) / bw
    "rho": st.floats(0.002, 0.06),  # on bw·d
})


def _inputs(m):
    bf = m["bw"] * (1 + m["overhang"])
    return dict(units="us", fc=m["fc"], fy=m["fy"], b=m["bw"], d=m["d"],
                As=m["rho"] * m["bw"] * m["d"], bf=bf, hf=m["hf_ratio"] * m["d"])


@PROFILE
@given(flanged, st.booleans())
def test_flange_as_wide_as_the_web_is_the_rectangle(m, doubly):
    # bf = bw: the section is the bw × h rectangle whatever hf is (issue 5 item 6).
    k = _inputs(m)
    k["bf"] = k["b"]
    extra = dict(asc=0.3 * k["As"], dc=0.1 * k["d"]) if doubly else {}
    rect = {key: v for key, v in k.items() if key not in ("bf", "hf")}
    t, r = engine.check(**k, **extra), engine.check(**rect, **extra)
    for name in ("a", "c", "eps_t", "fs", "phi"):
        assert math.isclose(getattr(t.state, name), getattr(r.state, name), rel_tol=1e-12), name
    assert math.isclose(t.Mn, r.Mn, rel_tol=1e-12)
    for name in ("As_b", "As_tc", "As_max"):
        assert math.isclose(getattr(t.limits, name), getattr(r.limits, name), rel_tol=1e-12), name
    assert t.limits.As_min.value == pytest.approx(r.limits.As_min.value, rel=1e-12)


@PROFILE
@given(flanged)
def test_textbook_closed_forms_of_the_t_beam(m):
    # Textbook T-beam analysis with yielded steel (e.g. Nilson, Darwin & Dolan, 13th ed., Sec. 3.8,
    # from memory; McCormac & Brown, 9th ed., Sec. 5.3, from memory):
    #   a ≤ hf: a rectangle of width bf, a = As fy/(0.85 f'c bf), Mn = As fy (d − a/2);
    #   a > hf: Asf = 0.85 f'c (bf − bw) hf / fy, a = (As − Asf) fy/(0.85 f'c bw),
    #           Mn = Asf fy (d − hf/2) + (As − Asf) fy (d − a/2).
    k = _inputs(m)
    fc, fy, bw, bf, hf, d, As = (k[x] for x in ("fc", "fy", "b", "bf", "hf", "d", "As"))
    a = As * fy / (0.85 * fc * bf)
    if a <= hf:
        Mn = As * fy * (d - a / 2)
    else:
        Asf = 0.85 * fc * (bf - bw) * hf / fy
        a = (As - Asf) * fy / (0.85 * fc * bw)
        Mn = Asf * fy * (d - hf / 2) + (As - Asf) * fy * (d - a / 2)
    c = a / beta1_reference(fc, "us")
    assume(EPS_CU * (d - c) / c >= fy / ES_US * (1 + 1e-9))  # the steel yields
    r = engine.check(**k)
    assert math.isclose(r.state.a, a, rel_tol=1e-9)
    assert math.isclose(r.state.c, c, rel_tol=1e-9)
    assert math.isclose(r.Mn, Mn / KIP_FT, rel_tol=1e-9)


# Heavy steel, a narrow and thin flange: where the tension steel stays elastic and a > hf.
over_reinforced_t = st.fixed_dictionaries({
    "fc": st.floats(3000, 8000), "fy": st.floats(60000, 100000), "bw": st.floats(8, 24),
    "d": st.floats(12, 48), "hf_ratio": st.floats(0.05, 0.2), "overhang": st.floats(0.0, 2.0),
    "rho": st.floats(0.04, 0.1),
})


@PROFILE
@given(over_reinforced_t)
def test_t_beam_with_elastic_steel_solves_the_quadratic(m):
    # Tension steel below yield (fs = Es·0.003(d − c)/c, 20.2.2.1) and the block below the flange:
    #   0.85 f'c [(bf − bw) hf + bw β1 c] = As Es 0.003 (d − c)/c, times c, a quadratic in c:
    #   0.85 f'c bw β1 c² + [0.85 f'c (bf − bw) hf + As Es 0.003] c − As Es 0.003 d = 0.
    k = _inputs(m)
    fc, fy, bw, bf, hf, d, As = (k[x] for x in ("fc", "fy", "b", "bf", "hf", "d", "As"))
    b1, k_s = beta1_reference(fc, "us"), As * ES_US * EPS_CU
    A, B, C = 0.85 * fc * bw * b1, 0.85 * fc * (bf - bw) * hf + k_s, -k_s * d
    c = (-B + math.sqrt(B * B - 4 * A * C)) / (2 * A)
    fs = ES_US * EPS_CU * (d - c) / c
    assume(b1 * c > hf and fs < fy)
    r = engine.check(**k)
    assert math.isclose(r.state.c, c, rel_tol=1e-9)
    assert math.isclose(r.state.fs, fs, rel_tol=1e-9)
    a = b1 * c
    Mn = 0.85 * fc * ((bf - bw) * hf * (d - hf / 2) + bw * a * (d - a / 2))
    assert math.isclose(r.Mn, Mn / KIP_FT, rel_tol=1e-9)


def test_the_quadratic_case_is_reachable():
    # The hypothesis test above assumes its regime; this section is in it by hand:
    # bw = 10, bf = 20, hf = 3, d = 20 in, As = 10 in², f'c = 4000, fy = 60 ksi:
    # as a yielded T, a = (600,000 − 102,000)/34,000 = 14.65 in, c = 17.2 in, εs = 0.00048 < εty.
    k = dict(units="us", fc=4000, fy=60000, b=10, d=20, As=10.0, bf=20, hf=3)
    r = engine.check(**k)
    assert not r.state.steel_yields and r.state.a > 3


@PROFILE
@given(flanged, st.floats(1.01, 3.0))
def test_a_wider_flange_never_lowers_mn(m, widen):
    # More compression area at the top: c falls, the lever arm grows and the steel strain with it
    # (22.2.1.2), so Mn cannot drop (common practice).
    k = _inputs(m)
    wider = dict(k, bf=k["bf"] * widen)
    assert engine.check(**wider).Mn >= engine.check(**k).Mn * (1 - 1e-12)


def test_flanged_si_section_converts_to_the_us_one():
    # The Nilson T above in SI (1 in = 25.4 mm, 1 psi = 0.006894757 MPa): the same c and Mn after
    # conversion, except β1 and Es, which ACI gives per system; f'c = 3000 psi = 20.68 MPa keeps
    # β1 = 0.85 in both (Table 22.2.2.4.3), and Es = 200,000 MPa vs 29,000 ksi (= 199,948 MPa)
    # does not enter while the steel yields. 1 kip·ft = 1.3558 kN·m.
    mm, mpa = 25.4, 0.006894757293168361
    us = engine.check(units="us", fc=3000, fy=60000, b=10, d=26, dt=27.5, h=30, As=7.59, bf=28, hf=6)
    si = engine.check(units="si", fc=3000 * mpa, fy=60000 * mpa, b=10 * mm, d=26 * mm, dt=27.5 * mm,
                      h=30 * mm, As=7.59 * mm ** 2, bf=28 * mm, hf=6 * mm)
    assert si.state.c == pytest.approx(us.state.c * mm, rel=1e-9)
    assert si.Mn == pytest.approx(us.Mn * 1.3558179483314004, rel=1e-9)
