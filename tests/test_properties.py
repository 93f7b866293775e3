"""Properties that must hold for every section (hypothesis).

Equilibrium (ACI 318-19 22.2.2.4.1 with 20.2.2.1), monotonic and continuous Mn,
class changes exactly at the limit ratios (Table 21.2.2), and the capacity curve
agreeing with the point check.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine

PROFILE = settings(max_examples=60, deadline=None)

materials = st.fixed_dictionaries({
    "fc": st.floats(2500, 12000),
    "fy": st.floats(40000, 100000),
    "b": st.floats(8, 48),
    "d": st.floats(8, 60),
    "dt_extra": st.floats(0, 0.25),  # dt = d(1 + extra): one or several layers
})
ratios = st.floats(1e-4, 0.08)


def _inputs(m, rho):
    return dict(units="us", fc=m["fc"], fy=m["fy"], b=m["b"], d=m["d"],
                dt=m["d"] * (1 + m["dt_extra"]), As=rho * m["b"] * m["d"])


@PROFILE
@given(materials, ratios)
def test_horizontal_equilibrium(m, rho):
    # ACI 318-19 22.2.2.4.1: C = 0.85 f'c b a must equal T = As fs.
    inputs = _inputs(m, rho)
    r = engine.check(**inputs)
    C = 0.85 * m["fc"] * m["b"] * r.state.a
    T = inputs["As"] * r.state.fs
    assert math.isclose(C, T, rel_tol=1e-9)
    # fs never exceeds fy and follows the strain at d (20.2.2.1, 22.2.1.2).
    assert r.state.fs <= m["fy"] * (1 + 1e-12)
    eps_s = 0.003 * (m["d"] - r.state.c) / r.state.c
    assert math.isclose(r.state.fs, min(m["fy"], 29e6 * eps_s), rel_tol=1e-9)
    # Moment about the block centroid (22.2.2.4.1).
    assert math.isclose(r.Mn * 12000, T * (m["d"] - r.state.a / 2), rel_tol=1e-9)


@PROFILE
@given(materials, ratios, st.floats(1.001, 1.5))
def test_mn_strictly_increasing_in_as(m, rho, factor):
    low = engine.check(**_inputs(m, rho))
    high = engine.check(**_inputs(m, min(rho * factor, 0.9)))
    assert high.Mn > low.Mn


@PROFILE
@given(materials, ratios)
def test_mn_continuous_in_as(m, rho):
    here = engine.check(**_inputs(m, rho)).Mn
    nudged = engine.check(**_inputs(m, rho * (1 + 1e-9))).Mn
    assert math.isclose(here, nudged, rel_tol=1e-7)


@PROFILE
@given(materials)
def test_mn_continuous_across_yield(m):
    # At the balanced area the solution switches from yielded to elastic steel; Mn must not jump.
    r = engine.check(**_inputs(m, 0.01))
    As_b = r.limits.As_b
    if not math.isfinite(As_b) or As_b > m["b"] * m["d"]:
        return
    below = engine.check(**{**_inputs(m, 0.01), "As": As_b * (1 - 1e-9)}).Mn
    above = engine.check(**{**_inputs(m, 0.01), "As": As_b * (1 + 1e-9)}).Mn
    assert math.isclose(below, above, rel_tol=1e-7)


@PROFILE
@given(materials)
def test_class_changes_exactly_at_limit_ratios(m):
    # ACI 318-19 Table 21.2.2: more steel lowers εt. Just below ρtc: tension-controlled, just above:
    # transition; just below ρb: transition, just above: compression-controlled.
    base = _inputs(m, 0.01)
    lim = engine.check(**base).limits
    bd = m["b"] * m["d"]

    def klass(rho):
        return engine.check(**{**base, "As": rho * bd}).state.section_class.value

    eps = 1e-9
    if lim.rho_tc * (1 + eps) < 1:
        assert klass(lim.rho_tc * (1 - eps)) == "tension-controlled"
        assert klass(lim.rho_tc * (1 + eps)) == "transition"
    if lim.rho_b * (1 + eps) < 1:
        assert klass(lim.rho_b * (1 - eps)) == "transition"
        assert klass(lim.rho_b * (1 + eps)) == "compression-controlled"
    if lim.rho_max * (1 + eps) < 1:
        # ACI 318-19 9.3.3.1 flips at ρ(εt = 0.004).
        passed = [engine.check(**{**base, "As": lim.rho_max * f * bd}).checks[1].passed
                  for f in (1 - eps, 1 + eps)]
        assert passed == [True, False]


@PROFILE
@given(materials, st.floats(1e-3, 0.05))
def test_curve_passes_through_point_check(m, rho):
    inputs = _inputs(m, rho)
    r = engine.check(**inputs)
    curve = engine.capacity_curve(**inputs, points=60)
    # The marks are points of the curve, and the section's own ρ gives the check's numbers.
    for name in ("rho_min", "rho_tc", "rho_max", "rho_b", "rho"):
        mark = curve.marks[name]
        assert any(math.isclose(mark, x, rel_tol=1e-12) for x in curve.rho), name
    assert curve.marks["rho"] == pytest.approx(r.rho, rel=1e-12)
    assert curve.marks["rho_b"] == pytest.approx(r.limits.rho_b, rel=1e-12)
    i = min(range(len(curve.rho)), key=lambda k: abs(curve.rho[k] - r.rho))
    assert curve.phiMn[i] == pytest.approx(r.phiMn, rel=1e-9)
    assert curve.Mn[i] == pytest.approx(r.Mn, rel=1e-9)
    assert curve.phi[i] == pytest.approx(r.state.phi, rel=1e-9)
    assert curve.eps_t[i] == pytest.approx(r.state.eps_t, rel=1e-9)
    assert curve.section_class[i] == r.state.section_class.value


@PROFILE
@given(materials)
def test_curve_shape_and_continuity(m):
    inputs = _inputs(m, 0.01)
    curve = engine.capacity_curve(**inputs, points=400)
    rho = curve.rho
    assert rho[0] == 0.0 and curve.phiMn[0] == 0.0  # no steel, no moment
    assert all(b > a for a, b in zip(rho, rho[1:]))  # strictly ordered
    assert rho[-1] >= 1.5 * curve.marks["rho_b"] * (1 - 1e-12)  # "well past ρb"
    lengths = {len(getattr(curve, k)) for k in ("rho", "As", "Mn", "phiMn", "phi", "eps_t",
                                                "section_class")}
    assert len(lengths) == 1 and lengths.pop() >= 400
    # φMn continuous: Mn is concave in ρ and φ only falls, so no step between neighbours
    # exceeds the first, evenly spaced one; a jump in φ at a class boundary (0.90 → 0.65)
    # would.
    steps = [b - a for a, b in zip(curve.phiMn, curve.phiMn[1:])]
    assert all(abs(step) <= steps[0] * (1 + 1e-9) for step in steps)
    # And across each limit, where φ and the class change (Table 21.2.2), no jump at all.
    for name in ("rho_tc", "rho_b"):
        mark = curve.marks[name]
        if not mark * (1 + 1e-9) < 1:  # beyond the gross area: not a section the check takes
            continue
        below, above = (engine.check(**{**inputs, "As": mark * f * m["b"] * m["d"]}).phiMn
                        for f in (1 - 1e-9, 1 + 1e-9))
        assert above == pytest.approx(below, rel=1e-6), name
    assert all(math.isclose(p * mn, q, rel_tol=1e-12, abs_tol=1e-12)
               for p, mn, q in zip(curve.phi, curve.Mn, curve.phiMn))


def test_curve_stays_finite_when_balanced_steel_is_unreachable():
    # With dt far below d (here dt = 2d) the strain at d is compressive when εt = εty at dt
    # (c = 0.003·40/0.00507 = 23.7 in > d = 20 in), so no steel area reaches the balanced
    # condition and ρb is unbounded. The curve must still run from ρ = 0 through finite
    # numbers; rule 7 of the house rules: never a silent NaN.
    curve = engine.capacity_curve(units="us", fc=4000, fy=60000, b=12, d=20, As=3, dt=40,
                                  points=50)
    assert curve.rho[0] == 0.0
    assert len(curve.rho) >= 50
    assert all(math.isfinite(x) for x in curve.rho)
    assert all(math.isfinite(x) for x in curve.phiMn)
