"""c and Mn of general sections against scipy's brentq on an equilibrium written here.

The model below is ACI 318-19 22.2 written out again, without the engine:
εcu = 0.003 at the top (22.2.2.1), a linear strain profile (22.2.1.2), each
layer's stress Es·ε capped at ±fy (20.2.2.1), the block 0.85 f'c over depth
a = β1·c (22.2.2.4.1, β1 from Table 22.2.2.4.3) over the flange alone or the
flange and the web, stopped at h, and the concrete a bar displaces inside the
block deducted (f's − 0.85 f'c), as is common practice in ACI-based texts.

The net force N(c) is continuous except where the block's edge passes a bar
(a downward step of 0.85 f'c·A), so the root is bracketed between those steps
and found there by `scipy.optimize.brentq`. Sections come from a fixed
pseudo-random list: rectangles, T and L flanges (an L is the same geometry as a T in this model;
its flange width comes from the L row of Table 6.3.2.1), compression steel,
and two or three tension layers, in US and SI units.
"""

from __future__ import annotations

import math
import random
import sys
from dataclasses import dataclass

import pytest
from scipy.optimize import brentq

import engine
from reference_cases import EPS_CU, ES_SI, ES_US, beta1_reference

BLOCK = 0.85  # ACI 318-19 22.2.2.4.1


@dataclass(frozen=True)
class Shape:
    """A section as plain numbers: psi, in, in² (us) or MPa, mm, mm² (si)."""

    units: str
    fc: float
    fy: float
    bw: float
    h: float
    tension: tuple[tuple[float, float], ...]  # (area, depth)
    bf: float | None = None
    hf: float | None = None
    compression: tuple[float, float] | None = None  # (area, depth)

    @property
    def es(self) -> float:
        return ES_US if self.units == "us" else ES_SI

    @property
    def beta1(self) -> float:
        return beta1_reference(self.fc, self.units)

    @property
    def bars(self) -> tuple[tuple[float, float], ...]:
        return self.tension + ((self.compression,) if self.compression else ())

    def kwargs(self) -> dict:
        """The same section as keywords of `engine.check`."""
        kw = dict(units=self.units, fc=self.fc, fy=self.fy, b=self.bw, h=self.h,
                  layers=list(self.tension))
        if self.bf is not None:
            kw.update(bf=self.bf, hf=self.hf)
        if self.compression is not None:
            kw.update(asc=self.compression[0], dc=self.compression[1])
        return kw


def concrete_area(s: Shape, a: float) -> tuple[float, float]:
    """Area within depth a of the top (flange first, then web, stopping at h) and its centroid."""
    a = min(a, s.h)
    if s.bf is None or a <= s.hf:
        width = s.bw if s.bf is None else s.bf
        return width * a, a / 2
    parts = [(s.bf * s.hf, s.hf / 2), (s.bw * (a - s.hf), (s.hf + a) / 2)]
    area = sum(p for p, _ in parts)
    return area, sum(p * y for p, y in parts) / area


def forces(s: Shape, c: float, displaced: frozenset[int] | None = None) -> list[tuple[float, float]]:
    """(force, depth) pairs, compression positive, at neutral-axis depth c.

    `displaced` fixes which bars count as inside the block (by index in
    `s.bars`); by default, those shallower than a.
    """
    a = s.beta1 * c
    area, centroid = concrete_area(s, a)
    result = [(BLOCK * s.fc * area, centroid)]
    for index, (bar_area, depth) in enumerate(s.bars):
        stress = max(-s.fy, min(s.fy, s.es * EPS_CU * (c - depth) / c))
        inside = depth < a if displaced is None else index in displaced
        if inside:
            stress -= BLOCK * s.fc
        result.append((bar_area * stress, depth))
    return result


def solve_c(s: Shape) -> float:
    """The least c with N(c) = 0, by brentq between the steps of N."""
    steps = sorted(depth / s.beta1 for _, depth in s.bars)
    deepest = max(depth for _, depth in s.tension)
    upper = deepest  # at c = deepest bar every bar is in compression, so N > 0
    edges = [1e-9 * deepest] + [x for x in steps if x < upper] + [upper]
    for low, high in zip(edges, edges[1:]):
        inside = frozenset(i for i, (_, depth) in enumerate(s.bars) if depth / s.beta1 <= low)

        def net(c, inside=inside):
            return sum(f for f, _ in forces(s, c, inside))

        if net(low) < 0 <= net(high):
            return brentq(net, low, high, xtol=1e-15 * high, rtol=4 * sys.float_info.epsilon, maxiter=500)
    raise AssertionError(f"no root bracketed for {s}")


def nominal_moment(s: Shape, c: float) -> float:
    """Mn in kip·ft or kN·m: minus the sum of force × depth (the top fibre as reference)."""
    moment = -sum(f * y for f, y in forces(s, c))
    return moment / (12_000.0 if s.units == "us" else 1.0e6)


def _random_shapes(count: int, start: int) -> list:
    """A reproducible mix (fixed start of the generator) of section kinds, each valid for the engine."""
    rng = random.Random(start)
    kinds = ["rect", "rect-doubly", "T", "L", "T-doubly", "rect-2-layers", "T-3-layers",
             "L-doubly-2-layers"]
    shapes = []
    for index in range(count):
        kind = kinds[index % len(kinds)]
        units = "us" if index % 3 else "si"
        scale = 1.0 if units == "us" else 25.4  # lengths; stresses drawn per system
        fc = rng.uniform(3000, 10000) if units == "us" else rng.uniform(20, 70)
        fy = rng.uniform(40000, 100000) if units == "us" else rng.uniform(280, 690)
        bw = rng.uniform(8, 24) * scale
        h = rng.uniform(14, 40) * scale
        cover = rng.uniform(1.5, 3.5) * scale
        count_layers = 3 if "3-layers" in kind else 2 if "2-layers" in kind else 1
        spacing = rng.uniform(1.5, 3.0) * scale
        depths = [h - cover - i * spacing for i in range(count_layers)]
        d_mean = sum(depths) / len(depths)
        bf = hf = None
        if kind.startswith(("T", "L")):
            hf = rng.uniform(0.08, 0.3) * h
            slab = rng.uniform(2, 12) * hf  # the least governing term, per Table 6.3.2.1
            bf = bw + (2 * min(8 * hf, slab) if kind.startswith("T") else min(6 * hf, slab))
        # From light to past balanced, on the web's bw·d: a dense steel ratio is
        # what makes the tension steel stay elastic and the flange carry the web too.
        rho = rng.choice([rng.uniform(0.002, 0.015), rng.uniform(0.015, 0.06)])
        total = rho * bw * d_mean
        shares = [rng.uniform(0.5, 1.5) for _ in depths]
        tension = tuple((total * w / sum(shares), y) for w, y in zip(shares, depths))
        compression = None
        if "doubly" in kind:
            compression = (rng.uniform(0.1, 0.5) * total, rng.uniform(1.2, 2.5) * scale)
        shapes.append(pytest.param(Shape(units, fc, fy, bw, h, tension, bf, hf, compression),
                                   id=f"{index:02d}-{units}-{kind}"))
    return shapes


SHAPES = _random_shapes(64, start=5)


@pytest.mark.parametrize("shape", SHAPES)
def test_c_and_mn_match_brentq(shape):
    c = solve_c(shape)
    r = engine.check(**shape.kwargs())
    assert math.isclose(r.state.c, c, rel_tol=1e-9)
    assert math.isclose(r.state.a, shape.beta1 * c, rel_tol=1e-9)
    assert math.isclose(r.Mn, nominal_moment(shape, c), rel_tol=1e-9)
    # εt read at the deepest bar (22.2.1.2, 21.2.2).
    dt = max(y for _, y in shape.tension)
    assert math.isclose(r.state.eps_t, EPS_CU * (dt - c) / c, rel_tol=1e-9)


def test_the_list_covers_every_regime():
    """The list holds the cases the check is meant to exercise; if not, widen it."""
    regimes = set()
    for param in SHAPES:
        s = param.values[0]
        c = solve_c(s)
        a = s.beta1 * c
        stresses = [s.es * EPS_CU * (y - c) / c for _, y in s.tension]
        regimes.add("tension steel elastic" if min(stresses) < s.fy else "tension steel yields")
        if s.bf is not None:
            regimes.add("block below the flange" if a > s.hf else "block inside the flange")
        if s.compression is not None:
            strain = EPS_CU * (c - s.compression[1]) / c
            regimes.add("compression steel yields" if s.es * strain >= s.fy
                        else "compression steel elastic")
    assert regimes == {"tension steel elastic", "tension steel yields", "block below the flange",
                       "block inside the flange", "compression steel yields",
                       "compression steel elastic"}


def test_brentq_model_reproduces_a_hand_case():
    """The independent model itself, on a case worked by hand (so it can be trusted above).

    Rectangle b = 12 in, d = 20 in, As = 3.00 in², f'c = 4000 psi, fy = 60 ksi:
    a = 3·60/(0.85·4·12) = 180/40.8 = 4.4118 in, c = a/0.85 = 5.1903 in,
    Mn = 180(20 − 2.2059) = 3202.9 in-kips = 266.91 kip-ft (hand arithmetic).
    """
    s = Shape("us", 4000, 60000, 12, 24, ((3.0, 20.0),))
    c = solve_c(s)
    assert c == pytest.approx(180 / 40.8 / 0.85, rel=1e-12)
    assert nominal_moment(s, c) == pytest.approx(180 * (20 - 180 / 40.8 / 2) / 12, rel=1e-12)
