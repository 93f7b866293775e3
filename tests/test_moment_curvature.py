"""Moment–curvature (engine.moment_curvature), each check against a source outside the engine.

- The elastic cracked transformed section (closed form) at first yield, low ρ.
- Mcr = fr·Ig/yt by hand (ACI 318-19 24.2.3.5, 19.2.3.1), rectangle, T and SI.
- The crushing moment against the Whitney-block Mn by hand (22.2.2.4.1).
- μφ against ρ: falling, and 1 at the model's balanced ratio, found by hand
  with a sympy integral, which lies within a few per cent of ACI's ρb.
- An independent fibre integration of the stated model, written here with
  numpy fibres and scipy.optimize.brentq, over seeded random sections (US
  and SI, flanged, doubly reinforced, several layers): 0.5 % on every
  curvature and moment.
- 6.6.5 redistribution by hand; the Mn ≤ Mcr warning; bad input.
"""

from __future__ import annotations

import math
import random

import numpy as np
import pytest
import sympy
from scipy.optimize import brentq

import engine
from engine.provisions.redistribution import permitted_redistribution
from reference_cases import EPS_CU, ES_SI, ES_US, beta1_reference

KIP_FT = 12_000.0  # lb·in per kip·ft
KN_M = 1e6  # N·mm per kN·m
MOMENT_UNIT = {"us": KIP_FT, "si": KN_M}
EC_COEFFICIENT = {"us": 57_000.0, "si": 4_700.0}  # ACI 318-19 19.2.2.1(b)
FR_COEFFICIENT = {"us": 7.5, "si": 0.62}  # ACI 318-19 19.2.3.1, λ = 1
EPS_LINE_END = 0.0038  # the stated model: the line reaches 0.85 f'c here (issue 12)

# Harbourline Depot (invented): B-204, a second-floor beam, US units.
B204 = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, h=24)


# --- the elastic cracked transformed section at first yield -------------------------------

@pytest.mark.parametrize("units, fc, fy, es, b, d, h, rho", [
    pytest.param("us", 4000, 60000, ES_US, 12, 21.5, 24, 0.003, id="us-rho0.003"),
    pytest.param("us", 4000, 60000, ES_US, 12, 21.5, 24, 0.005, id="us-rho0.005"),
    pytest.param("us", 5000, 60000, ES_US, 16, 30, 33, 0.004, id="us-5000psi-rho0.004"),
    pytest.param("si", 28, 420, ES_SI, 300, 540, 600, 0.003, id="si-rho0.003"),
    pytest.param("si", 35, 420, ES_SI, 350, 640, 700, 0.005, id="si-35MPa-rho0.005"),
])
def test_first_yield_matches_the_cracked_transformed_section(units, fc, fy, es, b, d, h, rho):
    """Closed form, singly reinforced rectangle, concrete tension neglected, linear concrete:
    k = √(2ρn + (ρn)²) − ρn, φy = εy/(d − kd), My = As·fy·d(1 − k/3), with n = Es/Ec."""
    As = rho * b * d
    ec = EC_COEFFICIENT[units] * math.sqrt(fc)  # 19.2.2.1(b)
    n = es / ec
    k = math.sqrt(2 * rho * n + (rho * n) ** 2) - rho * n
    phi_y = fy / es / (d - k * d)
    My = As * fy * d * (1 - k / 3) / MOMENT_UNIT[units]
    result = engine.moment_curvature(units=units, fc=fc, fy=fy, b=b, d=d, As=As, h=h, es=es)
    # 3 %: the model's concrete is a parabola (softer than Ec·ε) and keeps the uncracked
    # tension fibres near the neutral axis, which the closed form leaves out.
    assert result.first_yield.curvature == pytest.approx(phi_y, rel=0.03)
    assert result.first_yield.moment == pytest.approx(My, rel=0.03)


# --- Mcr by 24.2.3.5 -----------------------------------------------------------------------

@pytest.mark.parametrize("inputs, Mcr", [
    # fr = 7.5√4000 = 474.34 psi; Ig = 12·24³/12 = 13,824 in⁴; yt = 12 in;
    # Mcr = 474.34 × 13,824 / 12 = 546,440 lb·in = 45.54 kip·ft.
    pytest.param(B204, 7.5 * math.sqrt(4000) * 12 * 24**3 / 12 / 12 / KIP_FT, id="us-rectangle"),
    # T: bf = 48, hf = 4, bw = 12, h = 24 in. A = 192 + 240 = 432 in²;
    # ȳ = (192·2 + 240·14)/432 = 8.6667 in from the top; Ig = 48·4³/12 + 192(2 − 8.6667)²
    # + 12·20³/12 + 240(14 − 8.6667)² = 256 + 8,533.3 + 8,000 + 6,826.7 = 23,616 in⁴;
    # yt = 24 − 8.6667 = 15.333 in; Mcr = 474.34 × 23,616/15.333 = 730,570 lb·in = 60.88 kip·ft.
    pytest.param(dict(B204, bf=48, hf=4),
                 7.5 * math.sqrt(4000) * 23_616 / (24 - 3744 / 432) / KIP_FT, id="us-tee"),
    # fr = 0.62√30 = 3.3959 MPa; Ig = 300·600³/12 = 5.4e9 mm⁴; yt = 300 mm;
    # Mcr = 3.3959 × 5.4e9 / 300 = 61.13e6 N·mm = 61.13 kN·m.
    pytest.param(dict(units="si", fc=30, fy=420, b=300, d=540, As=1500, h=600),
                 0.62 * math.sqrt(30) * 5.4e9 / 300 / KN_M, id="si-rectangle"),
])
def test_cracking_moment_by_hand(inputs, Mcr):
    assert engine.moment_curvature(**inputs).Mcr == pytest.approx(Mcr, rel=1e-4)
    assert engine.check(**inputs).Mcr == pytest.approx(Mcr, rel=1e-4)


def test_mn_at_or_below_mcr_is_warned():
    # Lightly reinforced deep beam. By hand: a = 400·420/(0.85·28·300) = 23.53 mm;
    # Mn = 400·420·(1140 − 11.76) = 189.5 kN·m. Mcr = 0.62√28 × 300·1200²/6 = 236.2 kN·m.
    result = engine.moment_curvature(units="si", fc=28, fy=420, b=300, d=1140, As=400, h=1200)
    assert result.Mn == pytest.approx(400 * 420 * (1140 - 400 * 420 / (0.85 * 28 * 300) / 2) / KN_M,
                                      rel=1e-6)
    assert result.Mcr == pytest.approx(0.62 * math.sqrt(28) * 300 * 1200**2 / 6 / KN_M, rel=1e-6)
    assert result.Mn_over_Mcr < 1
    assert any("Mcr" in w and "9.6.1" in w for w in result.warnings)
    ordinary = engine.moment_curvature(**B204)
    assert not any("Mcr" in w for w in ordinary.warnings)


# --- crushing against the Whitney block ----------------------------------------------------

@pytest.mark.parametrize("units, fc, fy, b, d, h, rho", [
    pytest.param("us", 4000, 60000, 12, 21.5, 24, 0.005, id="us-4000-rho0.005"),
    pytest.param("us", 4000, 60000, 12, 21.5, 24, 0.015, id="us-4000-rho0.015"),
    pytest.param("us", 5000, 60000, 14, 27.5, 30, 0.01, id="us-5000-rho0.01"),
    pytest.param("us", 6000, 75000, 16, 33, 36, 0.008, id="us-6000-rho0.008"),
    pytest.param("si", 28, 420, 300, 540, 600, 0.01, id="si-28-rho0.01"),
    pytest.param("si", 40, 500, 350, 640, 700, 0.012, id="si-40-rho0.012"),
])
def test_crushing_moment_near_whitney_mn(units, fc, fy, b, d, h, rho):
    """Mn = As·fy·(d − a/2), a = As·fy/(0.85 f'c b) (22.2.2.4.1), with the steel yielding:
    c = a/β1 (Table 22.2.2.4.3) gives εt = 0.003(d − c)/c > εty, checked here."""
    As = rho * b * d
    es = ES_US if units == "us" else ES_SI
    a = As * fy / (0.85 * fc * b)
    c = a / beta1_reference(fc, units)
    assert EPS_CU * (d - c) / c > fy / es  # the hand Mn's premise: the steel yields
    Mn = As * fy * (d - a / 2) / MOMENT_UNIT[units]
    result = engine.moment_curvature(units=units, fc=fc, fy=fy, b=b, d=d, As=As, h=h)
    assert result.crushing.moment == pytest.approx(Mn, rel=0.05)
    assert result.crushing.eps_top == pytest.approx(EPS_CU, rel=1e-9)


# --- μφ against ρ --------------------------------------------------------------------------

def test_ductility_falls_with_rho_and_ends_near_rho_b():
    section = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, h=24)
    sweep = engine.ductility_sweep(**section, points=40)
    assert len(sweep.rho) == 40
    values = [mu for mu in sweep.ductility if mu is not None]
    assert len(values) >= 20
    assert all(later < earlier for earlier, later in zip(values, values[1:]))
    assert all(mu is None for mu in sweep.ductility[len(values):])  # none once crushing comes first
    # ρb = 0.85 β1 f'c/fy · εcu/(εcu + εty) (21.2.2, 22.2.2.4.1), εty = 60,000/29e6 = 0.0020690:
    # 0.85 · 0.85 · 4000/60000 · 0.003/0.0050690 = 0.028507.
    rho_b = 0.85 * 0.85 * 4000 / 60000 * EPS_CU / (EPS_CU + 60000 / ES_US)
    assert sweep.rho_b == pytest.approx(rho_b, rel=1e-9)
    # The last ρ with first yield lies just below ρb, the first without it beyond.
    last = sweep.rho[len(values) - 1]
    assert last < 1.1 * rho_b and sweep.rho[len(values)] > 0.95 * rho_b


def _model_balanced_ratio(units, fc, fy, es, b, d, h):
    """ρ at which the stated model's crushing and first yield coincide, by hand.

    Balanced profile: 0.003 at the top, εty at d = dt, so c = 0.003 d/(0.003 + εty).
    Compression: b·(c/0.003)·∫₀^0.003 σ(ε) dε with the parabola to ε0 and the line past it
    (exact with sympy). Tension concrete: the uncracked triangle below the neutral axis,
    εcr = fr/Ec deep in strain, so ½·fr·b·c·εcr/0.003. As·fy balances the difference.
    """
    ec = EC_COEFFICIENT[units] * math.sqrt(fc)
    fr = FR_COEFFICIENT[units] * math.sqrt(fc)
    eps0 = 2 * fc / ec
    e = sympy.symbols("e")
    parabola = fc * (2 * e / eps0 - (e / eps0) ** 2)
    line = fc + (0.85 * fc - fc) * (e - eps0) / (EPS_LINE_END - eps0)
    area = (sympy.integrate(parabola, (e, 0, min(eps0, EPS_CU)))
            + (sympy.integrate(line, (e, eps0, EPS_CU)) if eps0 < EPS_CU else 0))
    eps_ty = fy / es
    c = EPS_CU * d / (EPS_CU + eps_ty)
    compression = b * c / EPS_CU * float(area)
    tension = 0.5 * fr * b * c * (fr / ec) / EPS_CU
    return (compression - tension) / (fy * b * d)


@pytest.mark.parametrize("units, fc, fy, es, b, d, h", [
    pytest.param("us", 4000, 60000, ES_US, 12, 21.5, 24, id="us"),
    pytest.param("si", 28, 420, ES_SI, 300, 540, 600, id="si"),
])
def test_ductility_is_one_at_the_balanced_ratio(units, fc, fy, es, b, d, h):
    rho_model = _model_balanced_ratio(units, fc, fy, es, b, d, h)
    # ρb by 21.2.2 with the Whitney block: 0.85 β1 f'c/fy · εcu/(εcu + εty).
    rho_b = 0.85 * beta1_reference(fc, units) * fc / fy * EPS_CU / (EPS_CU + fy / es)
    # The parabola-and-line block at 0.003 carries a few per cent more than 0.85 β1 f'c.
    assert rho_model == pytest.approx(rho_b, rel=0.05)
    just_below = engine.moment_curvature(units=units, fc=fc, fy=fy, b=b, d=d, h=h,
                                         As=0.999 * rho_model * b * d)
    assert just_below.ductility == pytest.approx(1.0, abs=0.01)
    above = engine.moment_curvature(units=units, fc=fc, fy=fy, b=b, d=d, h=h,
                                    As=1.01 * rho_model * b * d)
    assert above.first_yield is None and above.ductility is None
    assert any("no first yield" in w for w in above.warnings)
    at_rho_b = engine.moment_curvature(units=units, fc=fc, fy=fy, b=b, d=d, h=h,
                                       As=rho_b * b * d)
    assert at_rho_b.ductility == pytest.approx(1.0, abs=0.1)


# --- 6.6.5 redistribution -----------------------------------------------------------------

@pytest.mark.parametrize("eps_t, percent, permitted", [
    pytest.param(0.005, 0.0, False, id="below-0.0075"),  # 6.6.5.1: εt < 0.0075, none
    pytest.param(0.0074999, 0.0, False, id="just-below"),
    pytest.param(0.0075, 7.5, True, id="at-0.0075"),  # 6.6.5.3: 1000 × 0.0075 = 7.5 %
    pytest.param(0.012, 12.0, True, id="1000-eps-t"),  # 1000 × 0.012 = 12 %
    pytest.param(0.02, 20.0, True, id="at-cap"),  # 1000 × 0.02 = 20 %
    pytest.param(0.035, 20.0, True, id="capped"),  # lesser of 35 % and 20 %
])
def test_redistribution_by_hand(eps_t, percent, permitted):
    result = permitted_redistribution(eps_t)
    assert result.percent == pytest.approx(percent, abs=1e-12)
    assert result.permitted is permitted
    assert ("not permitted" in result.reason) is (not permitted)
    assert ("6.6.5" in result.reason)


def test_redistribution_of_b204():
    # a = 3.16·60,000/(0.85·4000·12) = 4.6471 in; c = a/0.85 = 5.4671 in;
    # εt = 0.003(21.5 − 5.4671)/5.4671 = 0.0087978, so 1000εt = 8.80 % (6.6.5.3).
    a = 3.16 * 60000 / (0.85 * 4000 * 12)
    c = a / 0.85
    eps_t = EPS_CU * (21.5 - c) / c
    assert engine.moment_curvature(**B204).redistribution.percent == pytest.approx(1000 * eps_t, rel=1e-9)
    assert engine.check(**B204).to_dict()["redistribution_percent"] == pytest.approx(1000 * eps_t, rel=1e-9)


# --- the curve -----------------------------------------------------------------------------

def test_curve_points_include_the_states():
    result = engine.moment_curvature(**B204, points=60)
    points = result.points
    assert len(points) == 60
    curvatures = [p.curvature for p in points]
    assert curvatures[0] == 0 and points[0].moment == 0
    assert all(a < b for a, b in zip(curvatures, curvatures[1:]))
    for state in (result.cracking, result.first_yield, result.crushing):
        assert state in points
    assert points[-1] == result.crushing
    assert any(p.curvature == pytest.approx(1.001 * result.cracking.curvature, rel=1e-12)
               for p in points)
    assert max(p.eps_top for p in points) <= EPS_CU * (1 + 1e-9)
    assert sum(1 for p in points if p.curvature < result.cracking.curvature) >= 3
    # The fall after cracking is drawn: some point past cracking carries less than Mcr.
    assert any(p.moment < result.cracking.moment for p in points
               if result.cracking.curvature < p.curvature < result.first_yield.curvature)
    # Curvature ductility: crushing over first yield, by definition.
    assert result.ductility == pytest.approx(result.crushing.curvature / result.first_yield.curvature)


# --- an independent fibre integration of the stated model ---------------------------------

FIBRES = 20_000


class FibreSection:
    """The stated model (issue 12) integrated over thin fibres with numpy; c by brentq."""

    def __init__(self, units, fc, fy, es, bw, h, layers, bf=None, hf=None):
        self.fc, self.fy, self.es, self.h = fc, fy, es, h
        self.ec = EC_COEFFICIENT[units] * math.sqrt(fc)  # 19.2.2.1(b)
        self.fr = FR_COEFFICIENT[units] * math.sqrt(fc)  # 19.2.3.1
        self.eps0 = 2 * fc / self.ec
        self.eps_cr = self.fr / self.ec
        self.dy = h / FIBRES
        self.y = (np.arange(FIBRES) + 0.5) * self.dy
        self.width = np.where(self.y < (hf or 0.0), bf or bw, bw)
        self.areas = np.array([area for area, _ in layers])
        self.depths = np.array([depth for _, depth in layers])

    def concrete(self, eps):
        """Compression positive; defined up to 0.0038, the stated line's end."""
        eps = np.asarray(eps, dtype=float)
        ratio = eps / self.eps0
        parabola = self.fc * (2 * ratio - ratio**2)
        line = self.fc - 0.15 * self.fc * (eps - self.eps0) / (EPS_LINE_END - self.eps0)
        tension = np.where(eps >= -self.eps_cr, self.ec * eps, 0.0)
        return np.where(eps < 0, tension, np.where(eps <= self.eps0, parabola, line))

    def forces(self, c, phi):
        eps = phi * (c - self.y)
        concrete = self.concrete(eps) * self.width * self.dy
        eps_bar = phi * (c - self.depths)
        steel = self.areas * (np.clip(self.es * eps_bar, -self.fy, self.fy) - self.concrete(eps_bar))
        N = concrete.sum() + steel.sum()
        M = (concrete * (self.h / 2 - self.y)).sum() + (steel * (self.h / 2 - self.depths)).sum()
        return N, M

    def solve(self, curvature_of, low, high):
        c = brentq(lambda c: self.forces(c, curvature_of(c))[0], low, high, xtol=1e-12 * self.h,
                   rtol=1e-14, maxiter=500)
        phi = curvature_of(c)
        return phi, self.forces(c, phi)[1], c

    def cracking(self):
        top = 0.9 * self.h  # the top strain there, 9 εcr, is well within the law
        return self.solve(lambda c: self.eps_cr / (self.h - c), 0.0, top)

    def crushing(self):
        return self.solve(lambda c: EPS_CU / c, 1e-6 * self.h, 3 * self.h)

    def first_yield(self, dt):
        eps_ty = self.fy / self.es
        return self.solve(lambda c: eps_ty / (dt - c), 0.0, EPS_CU * dt / (EPS_CU + eps_ty))

    def at_curvature(self, phi):
        return self.solve(lambda c: phi, 0.0, EPS_LINE_END / phi)


def generated_sections(count=24, seed=2026):
    """Seeded random sections: US and SI, rectangles, T and L flanges, A's, two layers."""
    rng = random.Random(seed)
    for number in range(count):
        units = ("us", "si")[number % 2]
        scale = 1.0 if units == "us" else 25.4
        fc = rng.uniform(3000, 9000) if units == "us" else rng.uniform(20, 60)
        fy = rng.uniform(40000, 80000) if units == "us" else rng.uniform(280, 550)
        bw = rng.uniform(10, 24) * scale
        h = rng.uniform(16, 48) * scale
        dt = h - rng.uniform(2, 3.5) * scale
        kind = number % 4  # 0 rectangle, 1 flanged, 2 doubly reinforced, 3 flanged with A's
        rho = rng.uniform(0.003, 0.02)
        layers = [(rho * bw * dt, dt)]
        if rng.random() < 0.5:  # a second tension layer above the first
            share = rng.uniform(0.2, 0.5)
            layers = [((1 - share) * rho * bw * dt, dt), (share * rho * bw * dt, dt - 2.5 * scale)]
        inputs = dict(units=units, fc=round(fc, 1), fy=round(fy, 1), b=bw, h=h,
                      layers=layers)
        flange = kind in (1, 3)
        if flange:
            inputs.update(bf=bw * rng.uniform(1.5, 5), hf=h * rng.uniform(0.1, 0.25))
        if kind in (2, 3):
            inputs.update(asc=rho * bw * dt * rng.uniform(0.2, 0.6), dc=rng.uniform(2, 3) * scale)
        yield pytest.param(inputs, id=f"{units}-{('rect', 'flanged', 'doubly', 'flanged-doubly')[kind]}-{number}")


@pytest.mark.parametrize("inputs", list(generated_sections()))
def test_agrees_with_an_independent_fibre_integration(inputs):
    result = engine.moment_curvature(**inputs)
    es = ES_US if inputs["units"] == "us" else ES_SI
    layers = list(inputs["layers"])
    if "asc" in inputs:
        layers.append((inputs["asc"], inputs["dc"]))
    fibres = FibreSection(inputs["units"], inputs["fc"], inputs["fy"], es, inputs["b"], inputs["h"],
                          layers, inputs.get("bf"), inputs.get("hf"))
    unit = MOMENT_UNIT[inputs["units"]]
    dt = max(depth for _, depth in inputs["layers"])

    def same(point, reference):
        phi, moment, _ = reference
        assert point.curvature == pytest.approx(phi, rel=0.005)
        assert point.moment == pytest.approx(moment / unit, rel=0.005)

    same(result.cracking, fibres.cracking())
    crushing = fibres.crushing()
    same(result.crushing, crushing)
    phi_u, _, c_u = crushing
    yields = phi_u * (dt - c_u) >= fibres.fy / fibres.es  # the strain at dt at crushing
    assert (result.first_yield is not None) is yields
    if yields:
        same(result.first_yield, fibres.first_yield(dt))
        assert result.ductility == pytest.approx(phi_u / fibres.first_yield(dt)[0], rel=0.005)
    for point in result.points[1::7]:
        phi, moment, _ = fibres.at_curvature(point.curvature)
        assert point.moment == pytest.approx(moment / unit, rel=0.005)


# --- check's new keys, and bad input -------------------------------------------------------

def test_check_carries_mcr_and_ductility_only_with_h():
    without_h = engine.check(**{k: v for k, v in B204.items() if k != "h"}).to_dict()
    assert without_h["Mcr"] is None and without_h["ductility"] is None
    assert without_h["redistribution_percent"] > 0  # 6.6.5 needs only εt
    with_h = engine.check(**B204).to_dict()
    curve = engine.moment_curvature(**B204)
    assert with_h["Mcr"] == pytest.approx(curve.Mcr, rel=1e-12)
    assert with_h["ductility"] == pytest.approx(curve.ductility, rel=1e-12)


def test_h_is_required():
    inputs = {k: v for k, v in B204.items() if k != "h"}
    with pytest.raises(engine.InputError, match=r"^h: missing") as caught:
        engine.moment_curvature(**inputs)
    assert caught.value.field == "h"
    with pytest.raises(engine.InputError, match=r"^h: ") as caught:
        engine.ductility_sweep(**inputs)
    assert caught.value.field == "h"


@pytest.mark.parametrize("points", [39, 2001, 60.0, True, "60"])
def test_points_out_of_range(points):
    with pytest.raises(engine.InputError, match=r"^points: .*whole number from 40 to 2,000") as caught:
        engine.moment_curvature(**B204, points=points)
    assert caught.value.field == "points"


@pytest.mark.parametrize("field, value", [("h", -24), ("h", math.nan), ("fc", 0), ("b", "twelve")])
def test_bad_section_inputs_name_the_field(field, value):
    with pytest.raises(engine.InputError, match=rf"^{field}: ") as caught:
        engine.moment_curvature(**dict(B204, **{field: value}))
    assert caught.value.field == field


def test_results_are_finite_and_json_safe():
    import json

    for inputs in (B204, dict(B204, bf=48, hf=4, asc=1.2, dc=2.5),
                   dict(units="si", fc=80, fy=500, b=300, d=540, As=4000, h=600)):
        data = engine.moment_curvature(**inputs).to_dict()
        json.dumps(data, allow_nan=False)
