"""ρb, ρtc and ρmax against closed forms derived here with sympy.

The derivation sets up the strain triangle (ACI 318-19 22.2.1.2, εcu = 0.003 at
the top, 22.2.2.1), the block 0.85 f'c over a = β1 c (22.2.2.4.1), steel stress
from its strain (20.2.2.1), and force equilibrium C = T, then solves for ρ with
εt fixed at dt: εt = εty (balanced, Table 21.2.2), εty + 0.003 (tension-controlled
limit, Table 21.2.2), 0.004 (beam limit, 9.3.3.1).
"""

from __future__ import annotations

import math
from functools import cache

import pytest
import sympy as sp

import engine
from reference_cases import ES_SI, ES_US, LIMIT_PAIRS, beta1_reference


@cache
def _derived_rho():
    """ρ(εt) for yielded and for elastic steel at d: two sympy expressions."""
    c, eps_t, eps_cu, d, dt, fc, fy, es, beta1, b, rho, fs = sp.symbols(
        "c eps_t eps_cu d d_t f_c f_y E_s beta_1 b rho f_s", positive=True)
    # Strain triangle: εcu / c = (εcu + εt) / dt.
    c_of_eps = sp.solve(sp.Eq(eps_cu / c, (eps_cu + eps_t) / dt), c)[0]
    eps_s = eps_cu * (d - c_of_eps) / c_of_eps  # strain at the steel centroid d
    # Force equilibrium: 0.85 f'c b β1 c = ρ b d fs.
    equilibrium = sp.Eq(sp.Rational(85, 100) * fc * b * beta1 * c_of_eps, rho * b * d * fs)
    rho_of_fs = sp.solve(equilibrium, rho)[0]
    yielded = sp.simplify(rho_of_fs.subs(fs, fy))
    elastic = sp.simplify(rho_of_fs.subs(fs, es * eps_s))
    symbols = (eps_t, eps_cu, d, dt, fc, fy, es, beta1)
    return (sp.lambdify(symbols, yielded), sp.lambdify(symbols, elastic),
            sp.lambdify(symbols, eps_s), yielded, symbols)


def rho_at_strain(m, eps_t: float) -> float:
    """ρ that puts the strain at dt at `eps_t`, from the sympy closed forms."""
    yielded, elastic, strain_at_d, _, _ = _derived_rho()
    es = ES_US if m.units == "us" else ES_SI
    args = (eps_t, 0.003, m.d, m.dt, m.fc, m.fy, es, beta1_reference(m.fc, m.units))
    steel_yields = es * strain_at_d(*args) >= m.fy
    return yielded(*args) if steel_yields else elastic(*args)


def _limits(m):
    b = 12.0 if m.units == "us" else 300.0
    return engine.check(units=m.units, fc=m.fc, fy=m.fy, b=b, d=m.d, dt=m.dt,
                        As=0.005 * b * m.d).limits


def test_derivation_reduces_to_textbook_balanced_ratio():
    # independent: for dt = d and yielded steel the sympy result is the familiar
    # ρ = 0.85 β1 f'c/fy · εcu/(εcu + εt), the balanced-ratio form found in textbooks (common practice).
    _, _, _, yielded, (eps_t, eps_cu, d, dt, fc, fy, es, beta1) = _derived_rho()
    textbook = sp.Rational(85, 100) * beta1 * fc / fy * eps_cu / (eps_cu + eps_t)
    assert sp.simplify(yielded.subs(dt, d) - textbook) == 0


@pytest.mark.parametrize("m", LIMIT_PAIRS)
def test_rho_b(m):
    es = ES_US if m.units == "us" else ES_SI
    expected = rho_at_strain(m, m.fy / es)  # independent: sympy closed form, εt = εty
    assert _limits(m).rho_b == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("m", LIMIT_PAIRS)
def test_rho_tc(m):
    es = ES_US if m.units == "us" else ES_SI
    expected = rho_at_strain(m, m.fy / es + 0.003)  # independent: sympy, εt = εty + 0.003
    assert _limits(m).rho_tc == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("m", LIMIT_PAIRS)
def test_rho_max_beam_limit(m):
    expected = rho_at_strain(m, 0.004)  # independent: sympy, εt = 0.004 (ACI 318-19 9.3.3.1)
    assert _limits(m).rho_max == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("m", LIMIT_PAIRS)
def test_limits_are_ordered(m):
    # εt falls as ρ rises, so ρtc < ρ(0.004) < ρb whenever εty + 0.003 > 0.004 > εty
    # (true for every grade up to 100 ksi: εty ≤ 0.00345). ACI 318-19 Table 21.2.2, 9.3.3.1.
    lim = _limits(m)
    assert lim.rho_tc < lim.rho_max < lim.rho_b


def test_rho_b_common_practice_figure():
    # common practice: ρb ≈ 0.0285 for f'c = 4000 psi, Grade 60 (to 3 significant figures);
    # by hand 0.85·0.85·4/60·0.003/(0.003 + 60/29000) = 0.02851.
    lim = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=2.0).limits
    assert float(f"{lim.rho_b:.3g}") == pytest.approx(0.0285, abs=1e-12)


def test_rho_tc_and_rho_max_common_practice_figures():
    # By hand for 4000 psi / Grade 60, dt = d: ρtc = 0.7225·(4/60)·0.003/0.0050690 = 0.02851·0.6281
    # = 0.01791; ρ(εt=0.004) = 0.7225·(4/60)·0.003/0.007 = 0.02064 (common practice tables).
    lim = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=2.0).limits
    assert lim.rho_tc == pytest.approx(0.01791, abs=5e-6)
    assert lim.rho_max == pytest.approx(0.02064, abs=5e-6)


@pytest.mark.parametrize("fc, governs", [
    (3000.0, "b"), (4000.0, "b"), (4444.0, "b"), (4445.0, "a"), (6000.0, "a"), (9000.0, "a"),
])
def test_as_min_both_terms_us(fc, governs):
    # ACI 318-19 9.6.1.2: As,min = max(3√f'c/fy, 200/fy)·bw·d; (a) governs above
    # f'c = (200/3)² = 4444 psi (common practice).
    b, d, fy = 12.0, 20.0, 60000.0
    r = engine.check(units="us", fc=fc, fy=fy, b=b, d=d, As=3.0).to_dict()
    sqrt_term = 3 * math.sqrt(fc) / fy * b * d  # 9.6.1.2(a)
    flat_term = 200 / fy * b * d  # 9.6.1.2(b)
    assert r["As_min_sqrt_term"] == pytest.approx(sqrt_term, rel=1e-12)
    assert r["As_min_flat_term"] == pytest.approx(flat_term, rel=1e-12)
    assert r["As_min"] == pytest.approx(sqrt_term if governs == "a" else flat_term, rel=1e-12)
    assert r["rho_min"] == pytest.approx(r["As_min"] / (b * d), rel=1e-12)
    assert f"9.6.1.2({governs}) governs" in r["checks"][0]["detail"]


@pytest.mark.parametrize("fc, governs", [(25.0, "b"), (31.0, "b"), (31.5, "a"), (40.0, "a")])
def test_as_min_both_terms_si(fc, governs):
    # ACI 318-19 9.6.1.2 (SI): max(0.25√f'c/fy, 1.4/fy)·bw·d; (a) governs above (1.4/0.25)² = 31.36 MPa.
    b, d, fy = 300.0, 500.0, 420.0
    r = engine.check(units="si", fc=fc, fy=fy, b=b, d=d, As=1500.0).to_dict()
    sqrt_term = 0.25 * math.sqrt(fc) / fy * b * d
    flat_term = 1.4 / fy * b * d
    assert r["As_min"] == pytest.approx(max(sqrt_term, flat_term), rel=1e-12)
    assert f"9.6.1.2({governs}) governs" in r["checks"][0]["detail"]
