"""SI inputs: agreement with US customary after conversion, and where ACI's SI
provisions legitimately differ.

Conversions here use the exact definitions 1 in = 25.4 mm and
1 lbf = 4.4482216152605 N, written out in the test (not taken from the engine).
ACI 318-19 states β1 (Table 22.2.2.4.3) and As,min (9.6.1.2) separately in SI
with rounded constants (28/55 MPa; 0.25√f'c and 1.4 MPa), and Es = 200,000 MPa
(20.2.2.2) is not exactly 29,000,000 psi (= 199,948 MPa).
"""

from __future__ import annotations

import math

import pytest

import engine
from reference_cases import PSI_PER_MPA

MM_PER_IN = 25.4  # exact
MPA_PER_PSI = 4.4482216152605 / MM_PER_IN**2  # exact by definition
KNM_PER_KIPFT = 4.4482216152605 * 1000 * 12 * MM_PER_IN / 1e6

US_SECTIONS = [
    pytest.param(dict(fc=4000.0, fy=60000.0, b=12.0, d=20.0, As=3.0), id="typical-yielding"),
    pytest.param(dict(fc=3000.0, fy=60000.0, b=10.0, d=18.0, As=1.2), id="light"),
    pytest.param(dict(fc=4000.0, fy=60000.0, b=12.0, d=20.0, As=9.0), id="over-reinforced"),
    pytest.param(dict(fc=3500.0, fy=60000.0, b=14.0, d=22.0, As=4.0, dt=24.0), id="dt-gt-d"),
]


def to_si(us: dict) -> dict:
    si = dict(fc=us["fc"] * MPA_PER_PSI, fy=us["fy"] * MPA_PER_PSI, b=us["b"] * MM_PER_IN,
              d=us["d"] * MM_PER_IN, As=us["As"] * MM_PER_IN**2)
    if "dt" in us:
        si["dt"] = us["dt"] * MM_PER_IN
    return si


def test_conversion_factors():
    # exact definitions: 1 psi = 0.00689475729 MPa, 1 in² = 645.16 mm², 1 kip·ft = 1.35581795 kN·m.
    assert engine.convert(1.0, "stress", engine.US, engine.SI) == pytest.approx(0.00689475729, rel=1e-9)
    assert engine.convert(1.0, "area", engine.US, engine.SI) == pytest.approx(645.16, rel=1e-12)
    assert engine.convert(1.0, "length", engine.US, engine.SI) == pytest.approx(25.4, rel=1e-12)
    assert engine.convert(1.0, "moment", engine.US, engine.SI) == pytest.approx(1.35581795, rel=1e-8)
    assert engine.convert(1.35581795, "moment", engine.SI, engine.US) == pytest.approx(1.0, rel=1e-8)
    assert PSI_PER_MPA * MPA_PER_PSI == pytest.approx(1.0, rel=1e-15)


@pytest.mark.parametrize("us", US_SECTIONS)
def test_converted_section_agrees(us):
    # f'c ≤ 4000 psi (≤ 27.58 MPa < 28 MPa): β1 = 0.85 in both tables (22.2.2.4.3), so with Es
    # converted too the two systems describe the same physics and must agree to rounding.
    es_si = 29e6 * MPA_PER_PSI
    r_us = engine.check(units="us", **us)
    r_si = engine.check(units="si", es=es_si, **to_si(us))
    assert r_si.state.beta1 == pytest.approx(r_us.state.beta1, rel=1e-12)
    assert r_si.state.a == pytest.approx(r_us.state.a * MM_PER_IN, rel=1e-9)
    assert r_si.state.c == pytest.approx(r_us.state.c * MM_PER_IN, rel=1e-9)
    assert r_si.state.eps_t == pytest.approx(r_us.state.eps_t, rel=1e-9)
    assert r_si.state.fs == pytest.approx(r_us.state.fs * MPA_PER_PSI, rel=1e-9)
    assert r_si.Mn == pytest.approx(r_us.Mn * KNM_PER_KIPFT, rel=1e-9)
    assert r_si.state.phi == pytest.approx(r_us.state.phi, rel=1e-9)
    for name in ("rho_b", "rho_tc", "rho_max"):
        assert getattr(r_si.limits, name) == pytest.approx(getattr(r_us.limits, name), rel=1e-9)


@pytest.mark.parametrize("us", US_SECTIONS)
def test_default_es_differs_by_0_03_percent(us):
    # ACI 318-19 20.2.2.2: 200,000 MPa vs 29,000,000 psi = 199,948 MPa. εty and the
    # non-yielding steel stress shift by that 0.026 %; Mn moves less than 0.1 %.
    r_us = engine.check(units="us", **us)
    r_si = engine.check(units="si", **to_si(us))
    assert r_si.Mn == pytest.approx(r_us.Mn * KNM_PER_KIPFT, rel=1e-3)
    assert r_si.limits.rho_b == pytest.approx(r_us.limits.rho_b, rel=1e-3)
    assert r_si.state.eps_ty == pytest.approx(r_us.state.eps_ty * 29e6 * MPA_PER_PSI / 200_000, rel=1e-12)


def test_rho_b_si_common_practice():
    # ρb for 28 MPa / Grade 420 (SI), by hand: 0.85·0.85·28/420·0.003/(0.003 + 0.0021) = 0.02833;
    # the SI counterpart of the common-practice 0.0285 for 4000 psi / Grade 60 (common practice).
    r = engine.check(units="si", fc=28, fy=420, b=300, d=500, As=1500)
    assert r.limits.rho_b == pytest.approx(0.7225 * 28 / 420 * 0.003 / 0.0051, rel=1e-12)
    assert r.limits.rho_b == pytest.approx(0.0283, abs=5e-5)


def test_si_hand_example():
    # independent hand computation: f'c = 28 MPa, fy = 420 MPa, b = 300 mm, d = 500 mm, As = 1500 mm².
    # a = 1500·420/(0.85·28·300) = 630000/7140 = 88.24 mm; c = 103.81 mm;
    # εt = 0.003(500 − 103.81)/103.81 = 0.01145; Mn = 630000(500 − 44.12) = 287.2 kN·m; φ = 0.90.
    r = engine.check(units="si", fc=28, fy=420, b=300, d=500, As=1500)
    assert r.state.a == pytest.approx(88.24, abs=0.01)
    assert r.state.c == pytest.approx(103.81, abs=0.01)
    assert r.state.eps_t == pytest.approx(0.01145, abs=1e-5)
    assert r.Mn == pytest.approx(287.2, abs=0.05)
    assert r.phiMn == pytest.approx(0.9 * 287.2, abs=0.05)
    # 9.6.1.2 (SI): max(0.25√28, 1.4)/420·300·500 = max(472.5, 500) = 500 mm², (b) governs.
    assert r.limits.As_min.value == pytest.approx(500.0, rel=1e-12)


@pytest.mark.parametrize("fc_psi, beta1_us, beta1_si", [
    # ACI 318-19 Table 22.2.2.4.3, each system's own row evaluated at the same concrete.
    (4100.0, 0.845, 0.85 - 0.05 * (4100 * MPA_PER_PSI - 28) / 7),  # 28.27 MPa: 0.84808
    (5000.0, 0.80, 0.85 - 0.05 * (5000 * MPA_PER_PSI - 28) / 7),  # 34.47 MPa: 0.80376
    (8000.0, 0.65, 0.65),  # 55.16 MPa ≥ 55: 0.65 in both
    (7990.0, 0.6505, 0.65),  # 55.09 MPa: SI already 0.65, US row (b) 0.6505
])
def test_beta1_legitimately_differs(fc_psi, beta1_us, beta1_si):
    r_us = engine.check(units="us", fc=fc_psi, fy=60000, b=12, d=20, As=2.0)
    r_si = engine.check(units="si", **to_si(dict(fc=fc_psi, fy=60000, b=12, d=20, As=2.0)))
    assert r_us.state.beta1 == pytest.approx(beta1_us, abs=1e-12)
    assert r_si.state.beta1 == pytest.approx(beta1_si, abs=1e-12)


def test_as_min_legitimately_differs():
    # ACI 318-19 9.6.1.2: SI (b) 1.4 MPa vs US (b) 200 psi = 1.379 MPa: SI larger by 1.53 %;
    # SI (a) 0.25√f'c vs US 3√f'c → 3·√(MPa/psi) = 0.24911√f'c[MPa]: SI larger by 0.36 %.
    us = dict(fc=4000.0, fy=60000.0, b=12.0, d=20.0, As=3.0)
    r_us = engine.check(units="us", **us).to_dict()
    r_si = engine.check(units="si", **to_si(us)).to_dict()
    ratio_flat = r_si["As_min_flat_term"] / (r_us["As_min_flat_term"] * MM_PER_IN**2)
    ratio_sqrt = r_si["As_min_sqrt_term"] / (r_us["As_min_sqrt_term"] * MM_PER_IN**2)
    assert ratio_flat == pytest.approx(1.4 / (200 * MPA_PER_PSI), rel=1e-9)
    assert ratio_flat == pytest.approx(1.0153, abs=1e-4)
    assert ratio_sqrt == pytest.approx(0.25 / (3 * math.sqrt(MPA_PER_PSI)), rel=1e-9)
    assert ratio_sqrt == pytest.approx(1.0036, abs=1e-4)
