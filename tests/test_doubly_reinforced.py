"""Doubly reinforced rectangles: textbook examples, closed forms and limits of the model.

The engine deducts the concrete a compression bar displaces inside the block,
so that bar carries (f's − 0.85 f'c)·A's, as is common practice in ACI-based
texts. Where a book neglects it, the book's value and the difference are both
written out below and both are checked.
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


def _compression_layer(r):
    (layer,) = [item for item in r.to_dict()["layers"] if item["role"] == "compression"]
    return layer


def test_nilson_doubly_reinforced_compression_steel_yields():
    # Nilson, Darwin & Dolan, Design of Concrete Structures, 13th ed., Example 3.5 (from memory):
    # b = 12 in, d = 24 in, six No. 10 (As = 7.59 in²), two No. 7 (A's = 1.20 in²) at d' = 2.5 in,
    # f'c = 5000 psi (β1 = 0.80, Table 22.2.2.4.3), fy = 60 ksi.
    # Published (the book neglects the displaced concrete): a = (7.59 − 1.20)·60/(0.85·5·12)
    #   = 383.4/51 = 7.52 in, c = 9.40 in, ε's = 0.003(9.40 − 2.5)/9.40 = 0.00220 > εty = 0.00207
    #   so A's yields, Mn = 383.4(24 − 3.76) + 1.20·60(24 − 2.5) = 9308 in-kips (φMn = 8377 in-kips).
    # With the displaced concrete (D = 0.85·5000·1.20 = 5100 lb) the block carries 5100 lb more:
    #   a = (7.59·60000 − 1.20(60000 − 4250))/51000 = 388,500/51,000 = 7.6176 in (Δa = 0.1000 in),
    #   c = 7.6176/0.80 = 9.5221 in, ε's = 0.003(9.5221 − 2.5)/9.5221 = 0.002212 > 0.002069: yields;
    #   Mn = 0.85·5000·12·7.6176·(24 − 3.8088) + 1.20·55,750·(24 − 2.5) = 9,282,622 lb·in
    #      = 9282.6 in-kips = 773.55 kip-ft.
    #   Difference, by hand: ΔMn = −Cc·Δa/2 + D(d' − a/2) = −383,400·0.05 + 5100(2.5 − 3.8088)
    #      = −19,170 − 6,675 = −25,845 lb·in = −25.8 in-kips (0.28 % below the book).
    r = engine.check(units="us", fc=5000, fy=60000, b=12, d=24, As=7.59, asc=1.20, dc=2.5)
    assert r.state.beta1 == pytest.approx(0.80, rel=1e-12)
    assert r.state.a == pytest.approx(7.6176, rel=1e-4)
    assert r.state.a - 0.1000 == pytest.approx(7.52, rel=1e-3)  # the book's a, at its rounding
    assert r.state.c == pytest.approx(9.5221, rel=1e-4)
    top = _compression_layer(r)
    assert top["strain"] == pytest.approx(-0.002212, rel=1e-3)  # tension positive in the JSON
    assert top["stress"] == pytest.approx(-60000, rel=1e-12)  # f's = fy
    assert top["yields"] is True
    assert r.state.steel_yields
    assert r.Mn == pytest.approx(9282.6 / 12, rel=1e-4)
    assert r.Mn * 12 + 25.845 == pytest.approx(9308, rel=1e-4)  # the book's Mn, less the difference


def test_mccormac_doubly_reinforced_compression_steel_does_not_yield():
    # McCormac & Brown, Design of Reinforced Concrete, 9th ed., Chapter 5, the example of a
    # doubly reinforced beam whose compression steel does not yield (from memory; the data are
    # as recalled): b = 14 in, d = 24 in, As = 6.25 in², A's = 2.00 in² at d' = 2.5 in,
    # f'c = 4000 psi (β1 = 0.85), fy = 60 ksi, Es = 29,000 ksi.
    # Trial with both yielding: a = (6.25 − 2.00)·60/(0.85·4·14) = 255/47.6 = 5.357 in,
    #   c = 6.303 in, ε's = 0.003(6.303 − 2.5)/6.303 = 0.00181 < εty = 0.00207: A's does not yield.
    # Strain compatibility with the displaced concrete (the method the book presents):
    #   0.85 f'c b β1 c + A's[Es·0.003(c − d')/c − 0.85 f'c] = As fy, times c:
    #   40,460 c² − 207,800 c − 435,000 = 0, so c = [207,800 + √(207,800² + 4·40,460·435,000)]/80,920
    #   = 6.7328 in; a = 5.7229 in; f's = 87,000(6.7328 − 2.5)/6.7328 = 54,695 psi < 60,000;
    #   εs = 0.003(24 − 6.7328)/6.7328 = 0.00769: the tension steel yields;
    #   Mn = 0.85·4000·14·5.7229(24 − 2.8614) + 2.00(54,695 − 3400)(24 − 2.5)
    #      = 5,758,364 + 2,205,677 = 7,964,040 lb·in = 7964.0 in-kips = 663.67 kip-ft.
    # Neglecting the displaced concrete, the same quadratic without −0.85 f'c A's c gives
    #   40,460 c² − 201,000 c − 435,000 = 0: c = 6.5975 in, f's = 54,033 psi, Mn = 7981.4 in-kips;
    #   the difference is −17.3 in-kips (−0.22 %).
    r = engine.check(units="us", fc=4000, fy=60000, b=14, d=24, As=6.25, asc=2.00, dc=2.5)
    assert r.state.c == pytest.approx(6.7328, rel=1e-4)
    assert r.state.a == pytest.approx(5.7229, rel=1e-4)
    top = _compression_layer(r)
    assert -top["stress"] == pytest.approx(54695, rel=1e-4)
    assert top["yields"] is False
    assert r.state.steel_yields  # the tension steel does
    assert r.state.eps_t == pytest.approx(0.00769, rel=1e-3)
    assert r.Mn == pytest.approx(7964.0 / 12, rel=1e-4)
    assert r.Mn * 12 == pytest.approx(7981.4 - 17.3, rel=1e-4)


def test_compression_steel_raises_mn_of_the_mccormac_beam():
    # Same beam, singly reinforced: a = 6.25·60/47.6 = 7.878 in, c = 9.268 in, εs = 0.00477 > εty,
    # Mn = 375(24 − 3.939) = 7522.8 in-kips (hand arithmetic); A's adds 441 in-kips and deepens εt.
    single = engine.check(units="us", fc=4000, fy=60000, b=14, d=24, As=6.25)
    double = engine.check(units="us", fc=4000, fy=60000, b=14, d=24, As=6.25, asc=2.00, dc=2.5)
    assert single.Mn * 12 == pytest.approx(7522.8, rel=1e-4)
    assert double.Mn > single.Mn
    assert double.state.eps_t > single.state.eps_t


doubly = st.fixed_dictionaries({
    "fc": st.floats(3000, 10000),
    "fy": st.floats(40000, 80000),
    "b": st.floats(8, 30),
    "d": st.floats(12, 48),
    "rho": st.floats(0.005, 0.06),
    "share": st.floats(0.05, 0.9),  # A's / As
    "dc_ratio": st.floats(0.04, 0.2),  # d' / d
})


def _inputs(m):
    As = m["rho"] * m["b"] * m["d"]
    return dict(units="us", fc=m["fc"], fy=m["fy"], b=m["b"], d=m["d"], As=As,
                asc=m["share"] * As, dc=m["dc_ratio"] * m["d"])


@PROFILE
@given(doubly)
def test_closed_forms_of_the_doubly_reinforced_rectangle(m):
    # The textbook closed forms (e.g. Wight & MacGregor, 7th ed., Sec. 4-7, from memory), with the
    # displaced concrete: (1) both steels yield: 0.85 f'c b a = As fy − A's(fy − 0.85 f'c);
    # (2) tension yields, A's elastic: the quadratic in c of test_mccormac_... above.
    k = _inputs(m)
    fc, fy, b, d, As, Asc, dp = (k[x] for x in ("fc", "fy", "b", "d", "As", "asc", "dc"))
    b1, eps_ty = beta1_reference(fc, "us"), fy / ES_US
    a = (As * fy - Asc * (fy - 0.85 * fc)) / (0.85 * fc * b)
    c = a / b1
    if c > 0 and EPS_CU * (c - dp) / c >= eps_ty:
        fsc = fy
    else:
        A = 0.85 * fc * b * b1
        B = Asc * (ES_US * EPS_CU - 0.85 * fc) - As * fy
        C = -Asc * ES_US * EPS_CU * dp
        c = (-B + math.sqrt(B * B - 4 * A * C)) / (2 * A)
        a = b1 * c
        fsc = ES_US * EPS_CU * (c - dp) / c
        assume(fsc < fy)
    assume(dp < a)  # the bar is inside the block, so it displaces concrete
    assume(EPS_CU * (d - c) / c >= eps_ty * (1 + 1e-9))  # the tension steel yields
    # N(c) steps down where the block's edge reaches the bar (c = d'/β1). If N is already
    # ≥ 0 just below that step, a smaller root exists with the bar outside the block, and the
    # least c is the one reported (as the brentq model in test_solver_scipy.py also takes);
    # the closed form above is the other root, so such sections are left out here.
    c_step = dp / b1
    f_step = min(fy, ES_US * EPS_CU * (c_step - dp) / c_step)
    assume(0.85 * fc * b * dp + Asc * f_step - As * fy < 0)
    r = engine.check(**k)
    assert math.isclose(r.state.c, c, rel_tol=1e-9)
    assert math.isclose(-_compression_layer(r)["stress"], fsc, rel_tol=1e-9)
    Mn = 0.85 * fc * b * a * (d - a / 2) + Asc * (fsc - 0.85 * fc) * (d - dp)
    assert math.isclose(r.Mn, Mn / KIP_FT, rel_tol=1e-9)


@PROFILE
@given(doubly)
def test_negligible_compression_steel_is_the_singly_reinforced_beam(m):
    # A's → 0 must recover the singly reinforced section (issue 5 item 6). The bar's force is at
    # most A's(fy + 0.85 f'c) (20.2.2.1 and the displaced concrete), so it can move C and T by no
    # more than that: Δc ≤ that force over the block's growth rate 0.85 f'c b β1 (22.2.2.4.1),
    # ΔMn ≤ that force times d, ΔAs at a limit ≤ that force over fy (hand bounds; the factor 2
    # leaves room for the lever arm's own change). ρ' = 1e-6, as small as the engine accepts.
    k = _inputs(m)
    k["asc"] = 1e-6 * k["b"] * k["d"]
    single = {key: value for key, value in k.items() if key not in ("asc", "dc")}
    with_tiny, without = engine.check(**k), engine.check(**single)
    force = k["asc"] * (k["fy"] + 0.85 * k["fc"])
    b1 = beta1_reference(k["fc"], "us")
    assert abs(with_tiny.state.c - without.state.c) <= 2 * force / (0.85 * k["fc"] * k["b"] * b1)
    assert abs(with_tiny.Mn - without.Mn) <= 2 * force * k["d"] / KIP_FT
    lim_tiny, lim = with_tiny.limits, without.limits
    for name in ("As_b", "As_tc", "As_max"):
        assert abs(getattr(lim_tiny, name) - getattr(lim, name)) <= 1.01 * force / k["fy"], name
    assert with_tiny.limits.As_min.value == pytest.approx(without.limits.As_min.value, rel=1e-12)


def test_omitted_compression_steel_reports_one_layer():
    # Without --asc the section is issue 2's: one tension layer, no compression layer.
    r = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=3).to_dict()
    assert [layer["role"] for layer in r["layers"]] == ["tension"]


@PROFILE
@given(doubly)
def test_compression_steel_adds_its_force_over_fy_to_each_limit(m):
    # With εt fixed (22.2.1.2), c and the block are fixed; compression steel in compression adds
    # to C, so the tension steel at each strain limit grows by exactly that force over fs:
    # ΔAs = A's(f's − 0.85 f'c if inside the block)/fy at As_b, As_tc and As_max (all yield there).
    k = _inputs(m)
    fc, fy, d, Asc, dp = k["fc"], k["fy"], k["d"], k["asc"], k["dc"]
    b1, eps_ty = beta1_reference(fc, "us"), fy / ES_US
    single = {key: value for key, value in k.items() if key not in ("asc", "dc")}
    with_top, without = engine.check(**k).limits, engine.check(**single).limits
    for name, eps_t in (("As_b", eps_ty), ("As_tc", eps_ty + 0.003), ("As_max", 0.004)):
        c = EPS_CU * d / (EPS_CU + eps_t)
        fsc = max(-fy, min(fy, ES_US * EPS_CU * (c - dp) / c))
        assume(abs(dp - b1 * c) > 1e-6 * d)  # not on the block's edge
        if dp < b1 * c:
            fsc -= 0.85 * fc
        expected = getattr(without, name) + Asc * fsc / fy
        assert math.isclose(getattr(with_top, name), max(expected, 0.0), rel_tol=1e-9,
                            abs_tol=1e-12 * k["As"]), name


def test_two_equilibria_about_the_block_edge_the_least_c_is_reported():
    # With the displaced concrete deducted only inside the block, N(c) steps down by 0.85 f'c A's
    # where a = β1·c reaches d'. Here both sides of the step hold a root (hand arithmetic):
    # b = 12 in, d = 20 in, As = 2.08 in², A's = 2.00 in² at d' = 2.5 in, f'c = 4000, fy = 60 ksi.
    # Step at c = 2.5/0.85 = 2.9412 in, where f's = 87,000(1 − 0.85) = 13,050 psi and
    #   N(step−) = 102,000 + 26,100 − 124,800 = +3,300 lb, N(step+) = 3,300 − 6,800 = −3,500 lb.
    # Below the step (bar outside the block): 34,680 c² + 49,200 c − 435,000 = 0 → c = 2.9026 in,
    #   f's = 12,068 psi, Mn = 0.85·4000·12·2.4672(20 − 1.2336) + 2.00·12,068(17.5)
    #   = 2,311,478 lb·in = 192.62 kip-ft. Above it (bar inside): 34,680 c² + 42,400 c − 435,000 = 0
    #   → c = 2.9827 in. The engine documents the least root (equilibrium.solve_neutral_axis).
    r = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=2.08, asc=2.00, dc=2.5)
    assert r.state.c == pytest.approx(2.9026, rel=1e-4)
    assert -_compression_layer(r)["stress"] == pytest.approx(12068, rel=1e-4)
    assert r.Mn == pytest.approx(192.62, rel=1e-4)


def test_compression_steel_below_the_neutral_axis_is_flagged():
    # A's at d' = 6 in with c ≈ 5.6 in (hand estimate: 0.85·4000·12·0.85·c ≈ 3·60000 − A's force)
    # is in tension (22.2.1.2): the result must say so, not call it compression steel silently.
    r = engine.check(units="us", fc=4000, fy=60000, b=12, d=22, As=3, asc=2, dc=6)
    assert r.state.c < 6
    assert any("below the neutral axis" in w and "in tension" in w for w in r.warnings)
