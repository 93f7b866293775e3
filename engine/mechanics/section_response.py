"""The section's axial force and moment under a plane strain profile, for moment–curvature.

The model (issue 12), in the section's base units (psi or MPa, in or mm):

- Plane sections and perfect bond (22.2.1.2): ε(y) = φ·(c − y) at depth y
  from the compression face, compression positive.
- Concrete in compression: the parabola f'c·[2ε/ε0 − (ε/ε0)²] up to
  ε0 = 2f'c/Ec (common textbook practice), then a straight line down to
  0.85 f'c at ε = 0.0038. Ec = 57,000√f'c psi or 4,700√f'c MPa (19.2.2.1(b)).
  The analysis stops at εcu = 0.003 (22.2.2.1), so past the peak only the
  line's start is used; where ε0 ≥ 0.003 (f'c above about 11,700 psi or
  80 MPa) only the parabola is. Past 0.0038 the stress is held (at 0.85 f'c,
  or at f'c where ε0 ≥ 0.0038): no state the analysis reports reaches it,
  but the root search may look there.
- Concrete in tension: Ec·ε up to fr = 7.5√f'c psi or 0.62√f'c MPa
  (19.2.3.1, λ = 1), that is up to εcr = fr/Ec. A fibre strained beyond εcr
  has cracked and carries nothing; fibres nearer the neutral axis that are
  still short of εcr carry Ec·ε. This is a stress–strain law of the fibre,
  not tension stiffening: cracked concrete between cracks gets no credit.
- Steel elastic–perfectly plastic with Es and fy, in tension and
  compression (20.2.2.1). Each bar displaces the concrete at its depth: the
  concrete stress there times the bar's area is deducted.
- Flanges take part with their own width: the width b(y) is bf above hf
  and bw below it, down to h.

Integration is exact: the section is cut where the width changes (hf) and
where the concrete law changes piece (ε0, 0.0038, 0 and −εcr); on each
piece the stress is a polynomial of degree two at most in y and the width is
constant, so the two-point Gauss–Legendre rule (exact to degree three)
gives the force and its moment without error beyond rounding.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..section.beam import BeamSection
from ..section.materials import BLOCK_STRESS_FACTOR, concrete_modulus, modulus_of_rupture, steel_stress

EPS_LINE_END = 0.0038
"""Strain at which the descending line reaches 0.85 f'c (the model issue 12 states)."""

_GAUSS = 1 / math.sqrt(3)  # two-point Gauss–Legendre abscissa on [−1, 1]


@dataclass(frozen=True)
class ResponseModel:
    """The material constants and geometry the integration needs, base units."""

    fc: float
    ec: float  # Ec, 19.2.2.1(b)
    eps0: float  # strain at f'c, 2f'c/Ec
    fr: float  # modulus of rupture, 19.2.3.1
    eps_cr: float  # fr/Ec, the strain at which a fibre cracks
    fy: float
    es: float
    h: float
    flange_width: float  # bf, or bw for a rectangle
    flange_depth: float  # hf, or 0 for a rectangle
    bw: float
    layers: tuple[tuple[float, float], ...]  # (area, depth) of every layer
    reference: float  # depth the moment is taken about (d); with N = 0 any would do
    line_slope: float  # of the descending line, stress per unit strain (≤ 0)
    held_stress: float  # past 0.0038


def response_model(beam: BeamSection) -> ResponseModel:
    """The model for `beam`, which must have h."""
    ec = concrete_modulus(beam.fc, beam.system)
    fr = modulus_of_rupture(beam.fc, beam.system)
    eps0 = 2 * beam.fc / ec
    if eps0 < EPS_LINE_END:
        slope = (BLOCK_STRESS_FACTOR - 1) * beam.fc / (EPS_LINE_END - eps0)
        held = BLOCK_STRESS_FACTOR * beam.fc
    else:  # the peak lies past 0.0038: no line, f'c held past it
        slope, held = 0.0, beam.fc
    flange = beam.flange
    return ResponseModel(
        fc=beam.fc, ec=ec, eps0=eps0, fr=fr, eps_cr=fr / ec, fy=beam.fy, es=beam.es, h=beam.h,
        flange_width=beam.bw if flange is None else flange.width,
        flange_depth=0.0 if flange is None else flange.thickness, bw=beam.bw,
        layers=tuple((layer.area, layer.depth) for layer in beam.layers),
        reference=beam.d, line_slope=slope, held_stress=held)


def concrete_stress(model: ResponseModel, eps: float) -> float:
    """Concrete stress at strain `eps`, compression positive (the laws above)."""
    if eps >= 0:
        if eps <= model.eps0:
            ratio = eps / model.eps0
            return model.fc * ratio * (2 - ratio)
        if eps < EPS_LINE_END:
            return model.fc + model.line_slope * (eps - model.eps0)
        return model.held_stress
    return model.ec * eps if eps >= -model.eps_cr else 0.0


def forces(model: ResponseModel, c: float, phi: float) -> tuple[float, float]:
    """Net axial force N (compression positive) and moment M about `model.reference`.

    The strain profile is ε(y) = φ·(c − y), φ > 0. M is positive when the
    compression face is in compression; with N = 0 it is the section's moment.
    """
    h, reference, eps_cr = model.h, model.reference, model.eps_cr
    cuts = [0.0, h]
    if 0 < model.flange_depth < h:
        cuts.append(model.flange_depth)
    for eps in (model.eps0, EPS_LINE_END, 0.0, -eps_cr):
        y = c - eps / phi
        if 0 < y < h:
            cuts.append(y)
    cuts.sort()
    N = M = 0.0
    for top, bottom in zip(cuts, cuts[1:]):
        half = 0.5 * (bottom - top)
        if half <= 0:
            continue
        mid = top + half
        if phi * (c - mid) < -eps_cr:  # cracked: carries nothing
            continue
        width = model.flange_width if mid < model.flange_depth else model.bw
        offset = half * _GAUSS
        upper, lower = mid - offset, mid + offset
        stress_upper = concrete_stress(model, phi * (c - upper))
        stress_lower = concrete_stress(model, phi * (c - lower))
        weight = width * half
        N += weight * (stress_upper + stress_lower)
        M += weight * (stress_upper * (reference - upper) + stress_lower * (reference - lower))
    for area, depth in model.layers:
        eps = phi * (c - depth)
        force = area * (steel_stress(eps, model.fy, model.es) - concrete_stress(model, eps))
        N += force
        M += force * (reference - depth)
    return N, M
