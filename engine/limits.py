"""Reinforcement limits at the section's f'c and fy, each with its clause.

The strain limits are found by fixing εt at dt, which fixes c by the linear
strain profile (22.2.1.2), and then asking what As balances the block:
As = 0.85 f'c β1 c b / fs, with fs from the strain at d (20.2.2.1).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .materials import BLOCK_STRESS_FACTOR, EPS_CU, beta1, steel_stress, yield_strain
from .section import RectangularBeam
from .strength_reduction import TENSION_CONTROL_MARGIN

EPS_T_BEAM_MINIMUM = 0.004
"""Least εt for nonprestressed beams with Pu < 0.10 f'c Ag, ACI 318-19 9.3.3.1."""

# ACI 318-19 9.6.1.2, per system: As,min = max(k_sqrt·√f'c, k_flat)·bw·d / fy.
_AS_MIN_COEFFICIENTS = {"us": (3.0, 200.0), "si": (0.25, 1.4)}


@dataclass(frozen=True)
class AsMin:
    """ACI 318-19 9.6.1.2: the larger of its two terms governs."""

    sqrt_term: float  # (a) 3√f'c/fy·bw·d (US) or 0.25√f'c/fy·bw·d (SI)
    flat_term: float  # (b) 200/fy·bw·d (US) or 1.4/fy·bw·d (SI)

    @property
    def value(self) -> float:
        return max(self.sqrt_term, self.flat_term)

    @property
    def governing(self) -> str:
        return "9.6.1.2(a)" if self.sqrt_term >= self.flat_term else "9.6.1.2(b)"


@dataclass(frozen=True)
class ReinforcementLimits:
    """Steel areas at each limit and their ratios to b·d."""

    As_min: AsMin
    As_tc: float  # εt = εty + 0.003: tension-controlled limit, Table 21.2.2
    As_max: float  # εt = 0.004: beam limit, 9.3.3.1
    As_b: float  # εt = εty: balanced strain condition, 21.2.2
    bd: float

    @property
    def rho_min(self) -> float:
        return self.As_min.value / self.bd

    @property
    def rho_tc(self) -> float:
        return self.As_tc / self.bd

    @property
    def rho_max(self) -> float:
        return self.As_max / self.bd

    @property
    def rho_b(self) -> float:
        return self.As_b / self.bd


def minimum_steel(beam: RectangularBeam) -> AsMin:
    """As,min, ACI 318-19 9.6.1.2 (9.6.1.3 may waive it; see `checks`)."""
    k_sqrt, k_flat = _AS_MIN_COEFFICIENTS[beam.system.name]
    bd_over_fy = beam.b * beam.d / beam.fy
    return AsMin(sqrt_term=k_sqrt * math.sqrt(beam.fc) * bd_over_fy,
                 flat_term=k_flat * bd_over_fy)


def steel_for_strain(beam: RectangularBeam, eps_t: float) -> float:
    """The tension steel area that puts the strain at dt at exactly `eps_t`.

    c = εcu·dt / (εcu + εt) from the strain profile (22.2.1.2); the strain at
    d then sets fs. If that strain is not tensile no area can reach `eps_t`
    and the result is infinite.
    """
    b1 = beta1(beam.fc, beam.system)
    c = EPS_CU * beam.dt / (EPS_CU + eps_t)
    fs = steel_stress(EPS_CU * (beam.d - c) / c, beam.fy, beam.es)
    if fs <= 0:
        return math.inf
    return BLOCK_STRESS_FACTOR * beam.fc * b1 * c * beam.b / fs


def reinforcement_limits(beam: RectangularBeam) -> ReinforcementLimits:
    """Every limit the check compares As with."""
    eps_ty = yield_strain(beam.fy, beam.es)
    return ReinforcementLimits(
        As_min=minimum_steel(beam),
        As_tc=steel_for_strain(beam, eps_ty + TENSION_CONTROL_MARGIN),
        As_max=steel_for_strain(beam, EPS_T_BEAM_MINIMUM),
        As_b=steel_for_strain(beam, eps_ty),
        bd=beam.b * beam.d,
    )
