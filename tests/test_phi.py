"""φ for moment and the strain class, against ACI 318-19 Table 21.2.2.

Each section is built in the test to put εt at a chosen value: c = εcu·dt/(εcu + εt)
(22.2.1.2), then As = 0.85 f'c β1 c b / fs with fs from the strain at d (20.2.2.1).
"""

from __future__ import annotations

import pytest

import engine
from reference_cases import EPS_CU, ES_US, beta1_reference

B, D = 12.0, 20.0


def steel_for_eps_t(fc: float, fy: float, eps_t: float, dt: float = D) -> float:
    c = EPS_CU * dt / (EPS_CU + eps_t)
    fs = min(fy, ES_US * EPS_CU * (D - c) / c)
    return 0.85 * fc * beta1_reference(fc, "us") * c * B / fs


def section_at(eps_t: float, fy: float = 60000.0, fc: float = 4000.0, spiral: bool = False):
    As = steel_for_eps_t(fc, fy, eps_t)
    return engine.check(units="us", fc=fc, fy=fy, b=B, d=D, As=As, spiral=spiral)


EPS_TY_60 = 60000.0 / ES_US  # 0.0020690, ACI 318-19 21.2.2.1 (fy/Es; not the 0.002 shortcut)
EPS_TY_80 = 80000.0 / ES_US  # 0.0027586

# (εt, fy, φ "other", φ spiral, class). ACI 318-19 Table 21.2.2:
# other: 0.65 + 0.25(εt − εty)/0.003; spiral: 0.75 + 0.15(εt − εty)/0.003, in the transition.
PHI_CASES = [
    pytest.param(EPS_TY_60 * 0.8, 60000.0, 0.65, 0.75, "compression-controlled", id="gr60-below-eps_ty"),
    pytest.param(EPS_TY_60, 60000.0, 0.65, 0.75, None, id="gr60-at-eps_ty"),
    pytest.param(EPS_TY_60 + 0.00075, 60000.0, 0.7125, 0.7875, "transition", id="gr60-quarter"),
    pytest.param(EPS_TY_60 + 0.0015, 60000.0, 0.775, 0.825, "transition", id="gr60-midway"),
    pytest.param(0.004, 60000.0, 0.65 + 0.25 * (0.004 - EPS_TY_60) / 0.003,
                 0.75 + 0.15 * (0.004 - EPS_TY_60) / 0.003, "transition", id="gr60-beam-limit-0.812"),
    # ACI 318-14 fixed 0.005 as the limit; with εty = fy/Es, 318-19 puts 0.005 in the transition.
    pytest.param(0.005, 60000.0, 0.65 + 0.25 * (0.005 - EPS_TY_60) / 0.003,
                 0.75 + 0.15 * (0.005 - EPS_TY_60) / 0.003, "transition", id="gr60-0.005-transition"),
    pytest.param(EPS_TY_60 + 0.003, 60000.0, 0.90, 0.90, None, id="gr60-at-tension-controlled"),
    pytest.param(0.0075, 60000.0, 0.90, 0.90, "tension-controlled", id="gr60-0.0075"),
    pytest.param(0.02, 60000.0, 0.90, 0.90, "tension-controlled", id="gr60-0.02"),
    pytest.param(0.005, 80000.0, 0.65 + 0.25 * (0.005 - EPS_TY_80) / 0.003,
                 0.75 + 0.15 * (0.005 - EPS_TY_80) / 0.003, "transition", id="gr80-0.005-0.837"),
    pytest.param(EPS_TY_80 + 0.003, 80000.0, 0.90, 0.90, None, id="gr80-at-tension-controlled"),
    pytest.param(0.0065, 80000.0, 0.90, 0.90, "tension-controlled", id="gr80-0.0065"),
]


@pytest.mark.parametrize("eps_t, fy, phi_other, phi_spiral, klass", PHI_CASES)
def test_phi_other(eps_t, fy, phi_other, phi_spiral, klass):
    r = section_at(eps_t, fy)
    assert r.state.eps_t == pytest.approx(eps_t, rel=1e-9)
    assert r.state.phi == pytest.approx(phi_other, abs=1e-9)  # ACI 318-19 Table 21.2.2, "other"
    assert r.phiMn == pytest.approx(phi_other * r.Mn, rel=1e-9)


@pytest.mark.parametrize("eps_t, fy, phi_other, phi_spiral, klass", PHI_CASES)
def test_phi_spiral(eps_t, fy, phi_other, phi_spiral, klass):
    r = section_at(eps_t, fy, spiral=True)
    assert r.state.phi == pytest.approx(phi_spiral, abs=1e-9)  # ACI 318-19 Table 21.2.2, spirals


@pytest.mark.parametrize("eps_t, fy, phi_other, phi_spiral, klass",
                         [p for p in PHI_CASES if p.values[-1] is not None])
def test_section_class(eps_t, fy, phi_other, phi_spiral, klass):
    # ACI 318-19 Table 21.2.2: compression-controlled εt ≤ εty; tension-controlled εt ≥ εty + 0.003.
    assert section_at(eps_t, fy).state.section_class.value == klass


def test_phi_hand_value_gr60_at_0_004():
    # By hand: 0.65 + 0.25·(0.004 − 0.0020690)/0.003 = 0.65 + 0.1609 = 0.8109.
    assert section_at(0.004).state.phi == pytest.approx(0.8109, abs=1e-4)


def test_phi_independent_of_dt_except_through_eps_t():
    # Table 21.2.2 keys φ to εt at dt; a deeper extreme layer raises εt and so φ.
    As = steel_for_eps_t(4000.0, 60000.0, 0.0045)
    shallow = engine.check(units="us", fc=4000, fy=60000, b=B, d=D, As=As)
    deep = engine.check(units="us", fc=4000, fy=60000, b=B, d=D, As=As, dt=D + 2.0)
    c = shallow.state.c
    assert deep.state.eps_t == pytest.approx(EPS_CU * (D + 2.0 - c) / c, rel=1e-9)
    assert deep.state.phi == pytest.approx(
        min(0.90, 0.65 + 0.25 * (deep.state.eps_t - EPS_TY_60) / 0.003), abs=1e-9)
    assert deep.state.phi > shallow.state.phi
