"""Each code check's clause and its pass/fail at the edge.

ACI 318-19 9.3.3.1 (εt ≥ 0.004), 9.5.1.1 (φMn ≥ Mu), 9.6.1.2 (As ≥ As,min) and
its 9.6.1.3 alternative (As ≥ 4/3 of the As required by analysis).
"""

from __future__ import annotations

import math

import pytest

import engine

FC, FY, B, D = 4000.0, 60000.0, 12.0, 20.0
BETA1 = 0.85  # ACI 318-19 Table 22.2.2.4.3, f'c = 4000 psi
AS_AT_0_004 = 0.85 * FC * BETA1 * B * D * 0.003 / 0.007 / FY  # independent: C = T with εt = 0.004, yielded


def _by_clause(result, clause):
    return next(item for item in result.checks if item.clause == clause)


def phi_mn_tension_controlled(As: float) -> float:
    """independent: φMn (kip·ft) for yielded, tension-controlled steel, φ = 0.90 (Table 21.2.2)."""
    a = As * FY / (0.85 * FC * B)
    return 0.9 * As * FY * (D - a / 2) / 12000


def as_required(Mu: float) -> float:
    """independent: the smaller root of φ As fy (d − As fy/(1.7 f'c b)) = Mu (tension-controlled)."""
    k = FY**2 / (1.7 * FC * B)
    return (FY * D - math.sqrt((FY * D) ** 2 - 4 * k * Mu * 12000 / 0.9)) / (2 * k)


def test_check_clauses_without_mu():
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=3.0)
    assert [c.clause for c in r.checks] == ["9.6.1.2", "9.3.3.1"]
    assert r.ok is True and r.Mu is None and r.utilization is None


@pytest.mark.parametrize("factor, passed", [(1 - 1e-9, True), (1 + 1e-9, False)])
def test_strain_limit_edge(factor, passed):
    # ACI 318-19 9.3.3.1: εt ≥ 0.004. A hair less steel than the limit passes; a hair more fails.
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=AS_AT_0_004 * factor)
    assert r.state.eps_t == pytest.approx(0.004, rel=1e-8)
    assert _by_clause(r, "9.3.3.1").passed is passed
    assert r.ok is passed


@pytest.mark.parametrize("factor, passed", [(1 - 1e-9, True), (1.0, True), (1 + 1e-9, False)])
def test_strength_check_edge(factor, passed):
    # ACI 318-19 9.5.1.1: φMn ≥ Mu, with φMn computed independently here.
    As = 3.0
    Mu = phi_mn_tension_controlled(As) * factor
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=As, Mu=Mu)
    item = _by_clause(r, "9.5.1.1")
    assert item.passed is passed
    assert r.utilization == pytest.approx(factor, rel=1e-9)  # Mu / φMn
    assert r.to_dict()["utilization"] == pytest.approx(factor, rel=1e-9)


def test_minimum_steel_edge():
    # ACI 318-19 9.6.1.2(b) governs at 4000 psi: As,min = 200/60000·12·20 = 0.800 in².
    assert _by_clause(engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=0.800), "9.6.1.2").passed
    below = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=0.799)
    assert not below.checks[0].passed and below.checks[0].clause == "9.6.1.2"


@pytest.mark.parametrize("factor, passed, clause", [
    (1.0 + 1e-6, True, "9.6.1.3"), (1.0 - 1e-6, False, "9.6.1.2"),
])
def test_minimum_steel_waiver_9_6_1_3(factor, passed, clause):
    # ACI 318-19 9.6.1.3: As < As,min is acceptable where As ≥ 4/3 As,req (from analysis).
    As_req = 0.42  # in², independent: Mu below from φMn(0.42 in²)
    Mu = phi_mn_tension_controlled(As_req)
    assert as_required(Mu) == pytest.approx(As_req, rel=1e-12)
    As = 4 / 3 * As_req * factor  # 0.56 in² < As,min = 0.80 in²
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=As, Mu=Mu)
    item = r.checks[0]
    assert item.clause == clause and item.passed is passed
    assert r.to_dict()["As_req"] == pytest.approx(As_req, rel=1e-6)


def test_waiver_needs_mu():
    # Without Mu there is no As,req, so 9.6.1.3 cannot apply.
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=0.6)
    assert r.checks[0].clause == "9.6.1.2" and not r.checks[0].passed and not r.ok


def test_zero_mu_is_allowed():
    r = engine.check(units="us", fc=FC, fy=FY, b=B, d=D, As=3.0, Mu=0)
    assert _by_clause(r, "9.5.1.1").passed and r.utilization == pytest.approx(0.0, abs=1e-15)
