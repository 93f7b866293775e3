"""Nominal flexural strength of a singly reinforced rectangular section.

ACI 318-19 22.2: plane sections (22.2.1.2), εcu = 0.003 at the extreme
compression fibre (22.2.2.1), concrete tension neglected (22.2.2.2), the
equivalent rectangular block 0.85 f'c over a = β1·c (22.2.2.4.1), and steel
stress from its strain (20.2.2.1). Yield is never assumed: when the steel
strain at d is below εty, c comes from strain compatibility instead.
All values are in the beam's base units (force·length for moments).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .materials import BLOCK_STRESS_FACTOR, EPS_CU, beta1, yield_strain
from .section import RectangularBeam
from .strength_reduction import SectionClass, phi_flexure, section_class


@dataclass(frozen=True)
class FlexuralState:
    """The section at nominal strength (εcu at the top fibre)."""

    beta1: float
    eps_ty: float
    a: float
    c: float
    eps_s: float  # strain at the steel centroid d
    eps_t: float  # net tensile strain at dt
    fs: float
    steel_yields: bool
    Mn_base: float  # nominal moment, base units (lb·in or N·mm)
    phi: float
    section_class: SectionClass


def neutral_axis_depth(beam: RectangularBeam, b1: float, eps_ty: float) -> tuple[float, float]:
    """c and the steel stress fs that satisfy equilibrium C = T.

    First with fs = fy (ACI 318-19 20.2.2.1, yielded steel). If the strain at d
    that this c implies is below εty the steel has not yielded and fs = Es·εs;
    then 0.85 f'c b β1 c = As Es εcu (d − c)/c, a quadratic in c whose positive
    root is written in the form that does not cancel for small As.
    """
    block = BLOCK_STRESS_FACTOR * beam.fc * beam.b * b1
    c_yielded = beam.As * beam.fy / block
    if EPS_CU * (beam.d - c_yielded) >= eps_ty * c_yielded:
        return c_yielded, beam.fy
    stiffness = beam.As * beam.es * EPS_CU
    c = 2 * stiffness * beam.d / (stiffness + math.sqrt(stiffness**2 + 4 * block * stiffness * beam.d))
    return c, beam.es * EPS_CU * (beam.d - c) / c


def analyse(beam: RectangularBeam) -> FlexuralState:
    """The section's state at nominal flexural strength, ACI 318-19 22.2."""
    b1 = beta1(beam.fc, beam.system)
    eps_ty = yield_strain(beam.fy, beam.es)
    c, fs = neutral_axis_depth(beam, b1, eps_ty)
    a = b1 * c
    eps_s = EPS_CU * (beam.d - c) / c
    eps_t = EPS_CU * (beam.dt - c) / c  # linear strain profile, 22.2.1.2
    return FlexuralState(
        beta1=b1,
        eps_ty=eps_ty,
        a=a,
        c=c,
        eps_s=eps_s,
        eps_t=eps_t,
        fs=fs,
        steel_yields=fs >= beam.fy,
        Mn_base=beam.As * fs * (beam.d - a / 2),  # T about the block's centroid
        phi=phi_flexure(eps_t, eps_ty, beam.spiral),
        section_class=section_class(eps_t, eps_ty),
    )
