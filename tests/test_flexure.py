"""Mn, a, c, εt and fs against an independent numerical solution of equilibrium.

independent: the test writes horizontal equilibrium itself, C(c) = T(c) with
C = 0.85 f'c b β1 c (ACI 318-19 22.2.2.4.1) and T = As·min(fy, Es·εcu(d − c)/c)
(20.2.2.1, 22.2.1.2, εcu = 0.003 per 22.2.2.1), and solves it with scipy's
brentq; no yield is assumed. Mn = T·(d − a/2).
"""

from __future__ import annotations

import pytest
from scipy.optimize import brentq

import engine
from reference_cases import EPS_CU, ES_SI, ES_US, MN_SECTIONS, beta1_reference

MOMENT_TO_BASE = {"us": 12_000.0, "si": 1.0e6}  # lb·in per kip·ft; N·mm per kN·m


def solve_section(s):
    """(c, fs, Mn in kip·ft or kN·m) from brentq on C(c) − T(c) = 0."""
    es = ES_US if s.units == "us" else ES_SI
    b1 = beta1_reference(s.fc, s.units)

    def steel_stress(c):
        return min(s.fy, es * EPS_CU * (s.d - c) / c)

    def residual(c):
        return 0.85 * s.fc * s.b * b1 * c - s.As * steel_stress(c)

    # residual < 0 as c → 0 (T → As fy, C → 0) and > 0 at c = d (T = 0).
    c = brentq(residual, s.d * 1e-9, s.d, xtol=1e-15, rtol=1e-15, maxiter=500)
    fs = steel_stress(c)
    Mn = s.As * fs * (s.d - b1 * c / 2) / MOMENT_TO_BASE[s.units]
    return c, fs, Mn


def _check(s):
    return engine.check(units=s.units, fc=s.fc, fy=s.fy, b=s.b, d=s.d, As=s.As, dt=s.dt)


@pytest.mark.parametrize("s", MN_SECTIONS)
def test_mn_matches_brentq(s):
    c, fs, Mn = solve_section(s)  # independent: scipy brentq on C(c) = T(c)
    r = _check(s)
    assert r.state.c == pytest.approx(c, rel=1e-9)
    assert r.state.fs == pytest.approx(fs, rel=1e-9)
    assert r.Mn == pytest.approx(Mn, rel=1e-9)
    assert r.state.a == pytest.approx(beta1_reference(s.fc, s.units) * c, rel=1e-9)


@pytest.mark.parametrize("s", MN_SECTIONS)
def test_eps_t_from_strain_profile(s):
    c, _, _ = solve_section(s)
    dt = s.d if s.dt is None else s.dt
    # ACI 318-19 22.2.1.2: strain linear in depth, εcu = 0.003 at the top.
    assert _check(s).state.eps_t == pytest.approx(EPS_CU * (dt - c) / c, rel=1e-9)


@pytest.mark.parametrize("s", MN_SECTIONS)
def test_steel_yields_flag_and_warning(s):
    _, fs, _ = solve_section(s)
    r = _check(s)
    yields = fs >= s.fy * (1 - 1e-12)
    assert r.state.steel_yields is yields
    # 20.2.2.1: when the steel does not yield the result says so.
    assert any("does not yield" in w for w in r.warnings) is (not yields)


def test_reference_table_covers_both_branches():
    # The table must keep at least three non-yielding sections (strain compatibility).
    non_yielding = [p for p in MN_SECTIONS if solve_section(p.values[0])[1] < p.values[0].fy]
    assert len(non_yielding) >= 3


def test_over_reinforced_hand_value():
    # Hand solution (quadratic of 22.2.1.2 + 22.2.2.4.1): 4000 psi, Grade 60, b = 12, d = 20, As = 9.
    # 0.85·4000·12·0.85·c = 9·29e6·0.003·(20 − c)/c → 34680 c² + 783000 c − 15660000 = 0
    # → c = (−783000 + √(783000² + 4·34680·15660000))/(2·34680) = 12.773 in,
    # fs = 87000(20 − 12.773)/12.773 = 49,220 psi < fy, a = 10.857 in,
    # Mn = 9·49,220·(20 − 5.429)/12000 = 537.9 kip·ft.
    r = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=9.0)
    assert r.state.c == pytest.approx(12.773, abs=5e-4)
    assert r.state.fs == pytest.approx(49_220, rel=1e-4)
    assert r.Mn == pytest.approx(537.9, rel=1e-4)
    assert r.state.section_class.value == "compression-controlled"
    assert r.state.phi == pytest.approx(0.65)  # ACI 318-19 Table 21.2.2, εt ≤ εty
