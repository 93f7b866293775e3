"""The section model and what holds for any section: closed forms, limits, the model's fields.

- The singly reinforced rectangle, through the general solver, reproduces
  issue 2's closed forms to 1e-9 (ACI 318-19 22.2; the quadratic when the
  steel stays elastic, 20.2.2.1).
- The limits As_b, As_tc and As_max of any section put εt at dt exactly at
  εty, εty + 0.003 (Table 21.2.2) and 0.004 (9.3.3.1) when the section is
  checked with that much tension steel, and the class changes there.
- BeamSection, SteelLayer, Flange and Role hold what was given.
"""

from __future__ import annotations

import dataclasses
import math

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import engine
from reference_cases import EPS_CU, ES_SI, ES_US, beta1_reference

PROFILE = settings(max_examples=80, deadline=None)

rectangles = st.one_of(
    st.fixed_dictionaries({"units": st.just("us"), "fc": st.floats(2500, 12000),
                           "fy": st.floats(40000, 100000), "b": st.floats(8, 48),
                           "d": st.floats(8, 60), "rho": st.floats(1e-4, 0.08)}),
    st.fixed_dictionaries({"units": st.just("si"), "fc": st.floats(17, 80),
                           "fy": st.floats(280, 690), "b": st.floats(200, 1200),
                           "d": st.floats(200, 1500), "rho": st.floats(1e-4, 0.08)}),
)


@PROFILE
@given(rectangles)
def test_rectangle_reproduces_the_closed_form(m):
    # Singly reinforced rectangle (ACI 318-19 22.2.2.4.1, 20.2.2.1, Table 22.2.2.4.3):
    #   steel yields:  a = As fy / (0.85 f'c b), Mn = As fy (d − a/2);
    #   steel elastic: 0.85 f'c b β1 c² + As Es εcu c − As Es εcu d = 0, Mn = 0.85 f'c b a (d − a/2).
    units, fc, fy, b, d = m["units"], m["fc"], m["fy"], m["b"], m["d"]
    As = m["rho"] * b * d
    es = ES_US if units == "us" else ES_SI
    b1 = beta1_reference(fc, units)
    a = As * fy / (0.85 * fc * b)
    c = a / b1
    fs = fy
    yields = EPS_CU * (d - c) / c >= fy / es
    if not yields:
        k = As * es * EPS_CU
        c = (-k + math.sqrt(k * k + 4 * 0.85 * fc * b * b1 * k * d)) / (2 * 0.85 * fc * b * b1)
        a = b1 * c
        fs = es * EPS_CU * (d - c) / c
    Mn = 0.85 * fc * b * a * (d - a / 2) / (12_000.0 if units == "us" else 1.0e6)
    r = engine.check(units=units, fc=fc, fy=fy, b=b, d=d, As=As)
    assume(abs(EPS_CU * (d - c) / c - fy / es) > 1e-9 * fy / es)  # not exactly at yield
    assert r.state.steel_yields is yields
    assert math.isclose(r.state.a, a, rel_tol=1e-9)
    assert math.isclose(r.state.c, c, rel_tol=1e-9)
    assert math.isclose(r.state.fs, fs, rel_tol=1e-9)
    assert math.isclose(r.Mn, Mn, rel_tol=1e-9)
    assert math.isclose(r.state.eps_t, EPS_CU * (d - c) / c, rel_tol=1e-9)
    assert len(r.state.layers) == 1


@st.composite
def any_section(draw):
    """Keywords of engine.check (US) for a rectangle, T or L, maybe doubly, 1-3 layers."""
    bw = draw(st.floats(8, 30))
    h = draw(st.floats(16, 48))
    count = draw(st.integers(1, 3))
    depths = [h - 2.5 - 2.5 * i for i in range(count)]
    shares = draw(st.lists(st.floats(0.3, 1.0), min_size=count, max_size=count))
    total = draw(st.floats(0.005, 0.03)) * bw * depths[0]
    kw = dict(units="us", fc=draw(st.floats(3000, 10000)), fy=draw(st.floats(40000, 100000)),
              b=bw, h=h, layers=[(total * s / sum(shares), y) for s, y in zip(shares, depths)])
    if draw(st.booleans()):
        kw.update(bf=bw * (1 + draw(st.floats(0, 5))), hf=h * draw(st.floats(0.08, 0.25)))
    if draw(st.booleans()):
        kw.update(asc=total * draw(st.floats(0.05, 0.5)), dc=draw(st.floats(1.5, 2.5)))
    return kw


def _with_tension_total(kw, As):
    """The same section with every tension layer scaled to a total of As (what the limits vary)."""
    total = sum(a for a, _ in kw["layers"])
    return dict(kw, layers=[(a * As / total, y) for a, y in kw["layers"]])


@PROFILE
@given(any_section())
def test_each_limit_puts_eps_t_at_its_strain(kw):
    # 21.2.2 (εty = fy/Es, 21.2.2.1), Table 21.2.2 (εty + 0.003) and 9.3.3.1 (0.004).
    eps_ty = kw["fy"] / ES_US
    limits = engine.check(**kw).limits
    for name, eps_t in (("As_b", eps_ty), ("As_tc", eps_ty + 0.003), ("As_max", 0.004)):
        As = getattr(limits, name)
        assume(0 < As < 0.5 * kw["b"] * kw["h"])
        r = engine.check(**_with_tension_total(kw, As))
        assert math.isclose(r.state.eps_t, eps_t, rel_tol=1e-9), name


@PROFILE
@given(any_section())
def test_the_class_changes_at_the_limits(kw):
    # Table 21.2.2: tension-controlled for εt ≥ εty + 0.003, compression-controlled for εt ≤ εty;
    # 9.3.3.1 permits εt ≥ 0.004. A hair (1e-6) of steel either side of each limit.
    limits = engine.check(**kw).limits
    assume(0 < limits.As_b < 0.4 * kw["b"] * kw["h"])

    def at(As):
        return engine.check(**_with_tension_total(kw, As))

    assert at(limits.As_tc * (1 - 1e-6)).state.section_class.value == "tension-controlled"
    assert at(limits.As_tc * (1 + 1e-6)).state.section_class.value == "transition"
    assert at(limits.As_b * (1 - 1e-6)).state.section_class.value == "transition"
    assert at(limits.As_b * (1 + 1e-6)).state.section_class.value == "compression-controlled"
    strain_check = [c for c in at(limits.As_max * (1 - 1e-6)).checks if c.clause == "9.3.3.1"]
    assert strain_check[0].passed
    strain_check = [c for c in at(limits.As_max * (1 + 1e-6)).checks if c.clause == "9.3.3.1"]
    assert not strain_check[0].passed


def test_limit_of_a_t_beam_by_hand():
    # The McCormac T of test_flanged.py (bw = 10, bf = 60, hf = 4, d = 24 in, f'c = 4000, fy = 60 ksi).
    # At εt = 0.004 (9.3.3.1): c = 0.003·24/0.007 = 10.2857 in, a = 8.7429 in > hf, so
    # C = 0.85·4000[60·4 + 10(8.7429 − 4)] = 3400·287.43 = 977,257 lb; the steel yields
    # (0.004 > 0.00207), so As_max = 977,257/60,000 = 16.288 in²; ρ_max = 16.288/240 = 0.06787
    # on bw·d (hand arithmetic).
    r = engine.check(units="us", fc=4000, fy=60000, b=10, d=24, As=4.00, bf=60, hf=4)
    assert r.limits.As_max == pytest.approx(16.288, rel=1e-4)
    assert r.limits.rho_max == pytest.approx(16.288 / 240, rel=1e-4)


def test_limit_of_a_doubly_reinforced_beam_by_hand():
    # The Nilson beam of test_doubly_reinforced.py (b = 12, d = 24, A's = 1.20 in² at 2.5 in,
    # f'c = 5000, β1 = 0.80, fy = 60 ksi). At εt = εty + 0.003 = 0.0050690 (Table 21.2.2):
    # c = 0.003·24/0.0080690 = 8.9231 in, a = 7.1385 in; ε's = 0.003(8.9231 − 2.5)/8.9231
    # = 0.0021595 > εty, so f's = fy and A's carries 1.20(60,000 − 4,250) = 66,900 lb;
    # C = 0.85·5000·12·7.1385 = 364,062 lb; As_tc = (364,062 + 66,900)/60,000 = 7.1826 in².
    r = engine.check(units="us", fc=5000, fy=60000, b=12, d=24, As=7.59, asc=1.20, dc=2.5)
    assert r.limits.As_tc == pytest.approx(7.1826, rel=1e-4)


def test_section_model_holds_what_was_given():
    beam = engine.beam_section(units="us", fc=4000, fy=60000, b=12, h=26, d=20, As=1.0,
                               layers=[(2.0, 23.0)], asc=0.6, dc=2.5, bf=40, hf=5)
    assert isinstance(beam, engine.BeamSection)
    assert beam.b == beam.bw == 12
    assert beam.As == pytest.approx(3.0, rel=1e-12)
    assert beam.d == pytest.approx((20 + 46) / 3, rel=1e-12)  # area-weighted tension centroid
    assert beam.dt == 23.0  # the deepest tension layer (21.2.2)
    assert beam.flange == engine.Flange(width=40, thickness=5)
    assert not beam.is_rectangular
    assert [(l.area, l.depth, l.role) for l in beam.layers] == [
        (1.0, 20.0, engine.Role.TENSION), (2.0, 23.0, engine.Role.TENSION),
        (0.6, 2.5, engine.Role.COMPRESSION)]
    with pytest.raises(dataclasses.FrozenInstanceError):
        beam.bw = 14  # type: ignore[misc]
    with pytest.raises(dataclasses.FrozenInstanceError):
        beam.layers[0].area = 5  # type: ignore[misc]


def test_scaling_the_tension_steel_keeps_depths_and_compression_steel():
    beam = engine.beam_section(units="us", fc=4000, fy=60000, b=12, layers=[(1.0, 20.0), (2.0, 23.0)],
                               asc=0.6, dc=2.5)
    scaled = beam.with_tension_area(6.0)
    assert scaled.As == pytest.approx(6.0, rel=1e-12)
    assert scaled.d == pytest.approx(beam.d, rel=1e-12)
    assert [(l.area, l.depth) for l in scaled.layers] == [
        (pytest.approx(2.0), 20.0), (pytest.approx(4.0), 23.0), (0.6, 2.5)]


def test_rectangular_beam_is_issue_2s_section():
    rect = engine.rectangular_beam(units="si", fc=30, fy=420, b=300, d=500, As=1500)
    assert rect.is_rectangular and rect.h is None and rect.dt == 500
    assert rect.es == ES_SI  # ACI 318-19 20.2.2.2
    assert rect.layers == (engine.SteelLayer(1500, 500, engine.Role.TENSION),)


@pytest.mark.parametrize("extra, field", [
    pytest.param(dict(bf=10, hf=4), "bf", id="flange-narrower-than-web"),
    pytest.param(dict(bf=40, hf=20), "hf", id="flange-down-to-dt"),
    pytest.param(dict(bf=40), "hf", id="bf-without-hf"),
    pytest.param(dict(asc=0.6), "dc", id="asc-without-dc"),
    pytest.param(dict(dc=2.5), "asc", id="dc-without-asc"),
    pytest.param(dict(asc=0.6, dc=20), "dc", id="compression-steel-at-dt"),
    pytest.param(dict(h=19), "h", id="h-above-the-steel"),
    pytest.param(dict(asc=-0.6, dc=2.5), "asc", id="asc-negative"),
])
def test_inconsistent_geometry_names_the_field(extra, field):
    with pytest.raises(engine.InputError, match=rf"^{field}\b") as caught:
        engine.beam_section(units="us", fc=4000, fy=60000, b=12, d=20, As=3.0, **extra)
    assert caught.value.field == field
