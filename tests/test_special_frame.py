"""Special moment frame checks of one section (issue 12 item 3), against hand calculations.

The beam is Harbourline Depot's B-301, a beam of the level-3 special moment frame
on line C, at the face of column C-4: 14 in × 24 in, f'c = 4000 psi, fy = 60,000 psi,
bottom 3 #8 (As = 3 × 0.79 = 2.37 in², ASTM A615 Table 1) at d = 21.5 in, top 4 #8
(3.16 in²) at 21.5 in from the bottom face. Expected values are worked in the comments
and again in plain algebra in the test (the Whitney block of 22.2.2.4.1 with β1 of
Table 22.2.2.4.3), never taken from the engine.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine import InputError, special_frame_check

US_B301 = dict(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=2.37)
TOP = dict(top_As=3.16, top_d=21.5)


def whitney(As: float, fy: float, fc: float, b: float, d: float, beta1: float = 0.85):
    """a and Mn of a singly reinforced rectangle with yielded steel: a = As fy/(0.85 f'c b),
    Mn = As fy (d − a/2), 22.2.2.4.1; also εt = 0.003 (d − c)/c with c = a/β1 (22.2.1.2)."""
    a = As * fy / (0.85 * fc * b)
    c = a / beta1
    return a, As * fy * (d - a / 2), 0.003 * (d - c) / c


def test_the_engine_under_test_is_this_worktree():
    # The venv holds an editable install of another checkout; these tests must see this one.
    from pathlib import Path
    assert Path(engine.__file__).resolve().parent.parent == Path(__file__).resolve().parent.parent


def test_nominal_strengths_both_ways_and_the_half_rule():
    # Mn+: a = 2.37 × 60,000 / (0.85 × 4000 × 14) = 142,200 / 47,600 = 2.9874 in;
    #      Mn+ = 142,200 × (21.5 − 1.4937) = 2,844,896 lb·in = 237.07 kip·ft.
    # Mn−: a = 3.16 × 60,000 / 47,600 = 3.9832 in;
    #      Mn− = 189,600 × (21.5 − 1.9916) = 3,698,793 lb·in = 308.23 kip·ft.
    # 18.6.3.2: 237.07 ≥ ½ × 308.23 = 154.12, ratio 0.769: passes.
    result = special_frame_check(**US_B301, **TOP)
    a_pos, Mn_pos, _ = whitney(2.37, 60000, 4000, 14, 21.5)
    a_neg, Mn_neg, eps_neg = whitney(3.16, 60000, 4000, 14, 21.5)
    assert a_pos == pytest.approx(2.9874, abs=1e-4) and a_neg == pytest.approx(3.9832, abs=1e-4)
    assert result.positive.a == pytest.approx(a_pos, rel=1e-12)
    assert result.negative.a == pytest.approx(a_neg, rel=1e-12)
    assert result.Mn_pos == pytest.approx(Mn_pos / 12000, rel=1e-12)
    assert result.Mn_pos == pytest.approx(237.07, abs=0.01)
    assert result.Mn_neg == pytest.approx(Mn_neg / 12000, rel=1e-12)
    assert result.Mn_neg == pytest.approx(308.23, abs=0.01)
    half = next(c for c in result.checks if c.clause == "18.6.3.2")
    assert half.passed and "0.769" in half.detail and "nominal" in half.detail
    # εt under negative moment: c = 3.9832/0.85 = 4.6861, εt = 0.003 × 16.814/4.6861 = 0.01076.
    assert result.negative.eps_t == pytest.approx(eps_neg, rel=1e-12)
    assert next(c for c in result.checks if c.clause == "9.3.3.1").passed
    assert result.ok


def test_half_rule_fails_with_light_bottom_steel():
    # Bottom As = 1.20 in² (≥ As,min = 1.003), top 6 #8 = 4.74 in² at 21.5 in.
    # Mn+ = 72,000 × (21.5 − 0.7563) = 1,493,546 lb·in; a− = 284,400/47,600 = 5.9748 in,
    # Mn− = 284,400 × (21.5 − 2.9874) = 5,264,986 lb·in; ratio 0.284 < 0.5: fails.
    result = special_frame_check(**dict(US_B301, As=1.20), top_As=4.74, top_d=21.5)
    half = next(c for c in result.checks if c.clause == "18.6.3.2")
    assert not half.passed
    assert result.Mn_pos / result.Mn_neg == pytest.approx(1_493_546 / 5_264_986, rel=1e-5)
    assert not result.ok


def test_half_rule_at_its_edge():
    # With the same d and yielded steel, Mn ∝ As (d − k·As), k = fy/(2 × 0.85 f'c b).
    # Choose As+ so that Mn+ = ½ Mn− exactly: solve k As² − d As + ½ Mn−/fy = 0 (smaller root).
    top = 4.74
    k = 60000 / (2 * 0.85 * 4000 * 14)
    half_neg = 0.5 * top * (21.5 - k * top)
    edge = (21.5 - math.sqrt(21.5**2 - 4 * k * half_neg)) / (2 * k)
    just_pass = special_frame_check(**dict(US_B301, As=edge * (1 + 1e-9)), top_As=top, top_d=21.5)
    just_fail = special_frame_check(**dict(US_B301, As=edge * (1 - 1e-9)), top_As=top, top_d=21.5)
    assert next(c for c in just_pass.checks if c.clause == "18.6.3.2").passed
    assert not next(c for c in just_fail.checks if c.clause == "18.6.3.2").passed


@pytest.mark.parametrize("As, passes", [
    # 18.6.3.1: ρ ≤ 0.025, so As ≤ 0.025 × 14 × 21.5 = 7.525 in² (Grade 60).
    pytest.param(7.52, True, id="rho-0.02498-passes"),
    pytest.param(7.53, False, id="rho-0.02502-fails"),
])
def test_rho_limit_grade_60(As, passes):
    result = special_frame_check(**dict(US_B301, As=As), top_As=As, top_d=21.5)
    rho_checks = [c for c in result.checks if c.clause == "18.6.3.1" and "ρ" in c.title]
    assert [c.title for c in rho_checks] == ["bottom ρ ≤ 0.025", "top ρ ≤ 0.025"]
    assert all(c.passed is passes for c in rho_checks)
    assert result.rho_bottom == pytest.approx(As / (14 * 21.5), rel=1e-12)


def test_rho_limit_grade_80():
    # 18.6.3.1 (from memory): ρ ≤ 0.020 for Grade 80. 0.021 × 14 × 21.5 = 6.321 in² fails.
    result = special_frame_check(**dict(US_B301, fy=80000, As=6.321), top_As=3.16, top_d=21.5)
    assert result.rho_limit == 0.020
    bottom = next(c for c in result.checks if c.title.startswith("bottom ρ"))
    assert not bottom.passed and "0.02100" in bottom.detail


@pytest.mark.parametrize("As, passes", [
    # 9.6.1.2: max(3√4000 = 189.7, 200) = 200 psi governs; As,min = 200 × 14 × 21.5 / 60,000
    # = 1.00333 in², at the top (d = 21.5 from the bottom face) and at the bottom alike.
    pytest.param(1.004, True, id="just-above"),
    pytest.param(1.002, False, id="just-below"),
])
def test_minimum_steel_top_and_bottom_us(As, passes):
    result = special_frame_check(**dict(US_B301, As=As), top_As=As, top_d=21.5)
    assert result.As_min_bottom.value == pytest.approx(200 * 14 * 21.5 / 60000, rel=1e-12)
    assert result.As_min_top.value == pytest.approx(200 * 14 * 21.5 / 60000, rel=1e-12)
    minimums = [c for c in result.checks if "As,min" in c.title]
    assert [c.title for c in minimums] == ["bottom As ≥ As,min (9.6.1.2)", "top As ≥ As,min (9.6.1.2)"]
    assert all(c.passed is passes for c in minimums)


def test_minimum_steel_si_uses_the_si_terms_and_the_top_depth():
    # SI, f'c = 28 MPa, fy = 420 MPa, bw = 350 mm. 9.6.1.2: max(0.25√28 = 1.323, 1.4) = 1.4.
    # Bottom d = 545: As,min = 1.4 × 350 × 545 / 420 = 635.83 mm².
    # Top d = 530: As,min = 1.4 × 350 × 530 / 420 = 618.33 mm²; top As = 600 fails.
    result = special_frame_check(units="si", fc=28, fy=420, b=350, d=545, As=1530,
                                 top_As=600, top_d=530)
    assert result.As_min_bottom.value == pytest.approx(1.4 * 350 * 545 / 420, rel=1e-12)
    assert result.As_min_top.value == pytest.approx(1.4 * 350 * 530 / 420, rel=1e-12)
    top = next(c for c in result.checks if c.title.startswith("top As"))
    assert not top.passed and "9.6.1.2(b)" in top.detail


def test_probable_strength_at_125_fy_and_phi_one():
    # Mpr+ (2.3, 18.6.5.1): 1.25 × 2.37 × 60,000 = 177,750 lb; a = 177,750/47,600 = 3.7342 in;
    #   Mpr+ = 177,750 × (21.5 − 1.8671) = 3,489,744 lb·in = 290.81 kip·ft.
    # Mpr−: 1.25 × 3.16 × 60,000 = 237,000 lb; a = 4.9790 in;
    #   Mpr− = 237,000 × (21.5 − 2.4895) = 4,505,490 lb·in = 375.46 kip·ft.
    # At 1.25 fy, εy = 75,000/29e6 = 0.00259; εt− = 0.003 (21.5 − 5.8576)/5.8576 = 0.0080: yields.
    result = special_frame_check(**US_B301, **TOP)
    a_pos, Mpr_pos, _ = whitney(2.37, 1.25 * 60000, 4000, 14, 21.5)
    a_neg, Mpr_neg, _ = whitney(3.16, 1.25 * 60000, 4000, 14, 21.5)
    assert result.positive_probable.a == pytest.approx(a_pos, rel=1e-12)
    assert result.Mpr_pos == pytest.approx(Mpr_pos / 12000, rel=1e-12)
    assert result.Mpr_pos == pytest.approx(290.81, abs=0.01)
    assert result.negative_probable.a == pytest.approx(a_neg, rel=1e-12)
    assert result.Mpr_neg == pytest.approx(Mpr_neg / 12000, rel=1e-12)
    assert result.Mpr_neg == pytest.approx(375.46, abs=0.01)


def test_si_strengths_by_hand():
    # SI, f'c = 35 MPa: β1 = 0.85 − 0.05 × (35 − 28)/7 = 0.80 (Table 22.2.2.4.3).
    # Bottom 1530 mm² at 545: a = 1530 × 420/(0.85 × 35 × 350) = 642,600/10,412.5 = 61.71 mm,
    #   Mn+ = 642,600 × (545 − 30.86) = 330.4 kN·m.  Top 2040 mm² at 540: a = 82.29 mm,
    #   Mn− = 856,800 × (540 − 41.14) = 427.4 kN·m.
    result = special_frame_check(units="si", fc=35, fy=420, b=350, d=545, As=1530,
                                 top_As=2040, top_d=540)
    _, Mn_pos, _ = whitney(1530, 420, 35, 350, 545, beta1=0.80)
    _, Mn_neg, eps_neg = whitney(2040, 420, 35, 350, 540, beta1=0.80)
    assert result.Mn_pos == pytest.approx(Mn_pos / 1e6, rel=1e-12)
    assert result.Mn_pos == pytest.approx(330.4, abs=0.1)
    assert result.Mn_neg == pytest.approx(Mn_neg / 1e6, rel=1e-12)
    assert result.Mn_neg == pytest.approx(427.4, abs=0.1)
    assert result.negative.beta1 == pytest.approx(0.80)
    assert result.negative.eps_t == pytest.approx(eps_neg, rel=1e-12)


def test_with_h_the_bottom_bars_are_compression_steel_under_negative_moment():
    # h = 24 in: the bottom bars (2.37 in² at 21.5 in from the top) lie 2.5 in from the bottom
    # face. Independent strain compatibility, solved by bisection here:
    #   0.85 f'c b β1 c + A's (fs' − 0.85 f'c) = As fy, fs' = min(fy, Es × 0.003 (c − d')/c)
    # (the bars displace block concrete, 22.2.2.4.1), and Mn about the top bars.
    fc, fy, es, b, b1, As, Asc, d, dc = 4000, 60000, 29e6, 14, 0.85, 3.16, 2.37, 21.5, 2.5

    def net(c):
        fs = max(-fy, min(fy, es * 0.003 * (c - dc) / c))
        return 0.85 * fc * b * b1 * c + Asc * (fs - 0.85 * fc) - As * fy

    low, high = dc / b1 + 1e-9, d
    for _ in range(200):
        mid = (low + high) / 2
        low, high = (mid, high) if net(mid) < 0 else (low, mid)
    c = (low + high) / 2
    fs = max(-fy, min(fy, es * 0.003 * (c - dc) / c))
    Mn = 0.85 * fc * b * b1 * c * (d - b1 * c / 2) + Asc * (fs - 0.85 * fc) * (d - dc)
    result = special_frame_check(**US_B301, h=24, **TOP)
    assert result.negative.c == pytest.approx(c, rel=1e-9)
    assert result.Mn_neg == pytest.approx(Mn / 12000, rel=1e-9)
    # Compression steel adds a little: more than the singly reinforced 308.23 kip·ft.
    assert result.Mn_neg > 308.23
    assert not any("Without h" in w for w in result.warnings)
    assert any("leave the top bars out" in w for w in result.warnings)


def test_flanged_section_flips_to_the_web():
    # B-301 cast with the slab (bf = 48 in, hf = 5 in): under negative moment the flange is on the
    # tension side, so Mn− is the web's (bw = 14 in), the same 308.23 kip·ft as the rectangle.
    # Mn+ uses the flange: a = 142,200/(0.85 × 4000 × 48) = 0.8713 in < hf,
    # Mn+ = 142,200 × (21.5 − 0.4357) = 2,995,290 lb·in = 249.61 kip·ft.
    result = special_frame_check(**US_B301, bf=48, hf=5, **TOP)
    _, Mn_neg, _ = whitney(3.16, 60000, 4000, 14, 21.5)
    _, Mn_pos, _ = whitney(2.37, 60000, 4000, 48, 21.5)
    assert result.negative_beam.flange is None and result.negative_beam.bw == 14
    assert result.Mn_neg == pytest.approx(Mn_neg / 12000, rel=1e-12)
    assert result.Mn_pos == pytest.approx(Mn_pos / 12000, rel=1e-12)
    assert result.As_min_top.value == pytest.approx(200 * 14 * 21.5 / 60000, rel=1e-12)


def test_without_top_steel_the_top_checks_are_not_made_and_not_passed():
    result = special_frame_check(**US_B301)
    assert result.Mn_neg is None and result.Mpr_neg is None and result.As_min_top is None
    assert {(n.clause, n.title) for n in result.not_checked} == {
        ("18.6.3.1", "top ρ ≤ 0.025"), ("18.6.3.1", "top As ≥ As,min (9.6.1.2)"),
        ("18.6.3.2", "Mn+ ≥ ½ Mn− at the joint face"),
        ("9.3.3.1", "εt ≥ 0.004 under negative moment")}
    assert all(c.passed for c in result.checks)
    assert not result.ok  # undecided is not a pass
    data = result.to_dict()
    assert data["Mpr_neg"] is None and data["ok"] is False and len(data["not_checked"]) == 4


@pytest.mark.parametrize("units, fy, odd", [
    pytest.param("us", 60000, False, id="grade-60"),
    pytest.param("us", 80000, False, id="grade-80"),
    pytest.param("us", 75000, True, id="75-ksi"),
    pytest.param("si", 420, False, id="grade-420"),
    pytest.param("si", 550, False, id="grade-550"),
    pytest.param("si", 500, True, id="500-MPa"),
])
def test_grade_warnings_of_20_2_2_5(units, fy, odd):
    # 20.2.2.5 permits Grade 60 and 80 (420 and 550 in SI) only, A706 or A615 with mill limits;
    # the grade cannot be read from fy, so there is always a warning, and a second for other fy.
    section = US_B301 if units == "us" else dict(units="si", fc=28, b=350, d=545, As=1530)
    result = special_frame_check(**dict(section, fy=fy))
    assert "20.2.2.5" in result.warnings[0] and "A706" in result.warnings[0]
    assert ("18,000 psi" if units == "us" else "125 MPa") in result.warnings[0]
    assert "1.25" in result.warnings[0]
    assert any("permits only" in w for w in result.warnings) is odd


def test_out_of_scope_names_the_member_level_rules():
    text = special_frame_check(**US_B301).out_of_scope
    for words in ("joint shear", "hoops", "transverse reinforcement", "column", "development",
                  "splices"):
        assert words in text


@pytest.mark.parametrize("extra, field, match", [
    pytest.param(dict(top_As=3.16), "top_d", "missing", id="area-without-depth"),
    pytest.param(dict(top_d=21.5), "top_As", "missing", id="depth-without-area"),
    pytest.param(dict(top_As=-1, top_d=21.5), "top_As", "zero or negative", id="negative-area"),
    pytest.param(dict(top_As="3", top_d=21.5), "top_As", "not a number", id="text-area"),
    pytest.param(dict(top_As=3.16, top_d=float("nan")), "top_d", "not finite", id="nan-depth"),
    pytest.param(dict(top_As=3.16, top_d=25, h=24), "top_d", "at most h", id="below-h"),
    pytest.param(dict(top_As=3.16, top_d=2, h=24), "top_d", "bottom face", id="above-bottom-bars"),
    pytest.param(dict(top_As=400, top_d=21.5), "top_As", "gross area", id="area-too-large"),
])
def test_bad_top_steel_is_refused_naming_the_field(extra, field, match):
    with pytest.raises(InputError, match=match) as caught:
        special_frame_check(**dict(US_B301, **extra))
    assert caught.value.field == field
