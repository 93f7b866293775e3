"""Reinforcement limits at the section's f'c and fy, each with its clause.

The strain limits are found by fixing εt at dt, which fixes c by the linear
strain profile (22.2.1.2), and so every layer's strain and stress (20.2.2.1)
and the block (22.2.2.4.1). The tension layers, scaled together, must then
balance the rest; for a singly reinforced rectangle this is the textbook
As = 0.85 f'c β1 c b / fs.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..mechanics.equilibrium import in_block, layer_force
from ..mechanics.stress_block import block_force
from ..section.beam import BeamSection, Role
from ..section.materials import EPS_CU, beta1, yield_strain
from .strength_reduction import TENSION_CONTROL_MARGIN

EPS_T_BEAM_MINIMUM = 0.004
"""Least εt for nonprestressed beams with Pu < 0.10 f'c Ag, ACI 318-19 9.3.3.1."""

# ACI 318-19 9.6.1.2, per system: As,min = max(k_sqrt·√f'c, k_flat)·bw·d / fy.
AS_MIN_COEFFICIENTS = {"us": (3.0, 200.0), "si": (0.25, 1.4)}


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
    """Tension steel areas at each limit and their ratios to bw·d."""

    As_min: AsMin
    As_tc: float  # εt = εty + 0.003: tension-controlled limit, Table 21.2.2
    As_max: float  # εt = 0.004: beam limit, 9.3.3.1
    As_b: float  # εt = εty: balanced strain condition, 21.2.2
    # Each is infinite (null in JSON) where no positive area gives that strain.
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


def minimum_steel(beam: BeamSection) -> AsMin:
    """As,min on the web width, ACI 318-19 9.6.1.2 (9.6.1.3 may waive it; see `checks`)."""
    k_sqrt, k_flat = AS_MIN_COEFFICIENTS[beam.system.name]
    bd_over_fy = beam.bw * beam.d / beam.fy
    return AsMin(sqrt_term=k_sqrt * math.sqrt(beam.fc) * bd_over_fy,
                 flat_term=k_flat * bd_over_fy)


@dataclass(frozen=True)
class ForcesAtStrain:
    """The forces when εt at dt is fixed, compression positive, base units."""

    c: float
    fixed: float  # the block and every layer that is not tension steel
    tension: float  # the tension layers at their present areas


def forces_at_strain(beam: BeamSection, eps_t: float) -> ForcesAtStrain:
    """Fix εt at dt, so c = εcu·dt / (εcu + εt) (22.2.1.2), and sum the forces there."""
    b1 = beta1(beam.fc, beam.system)
    c = EPS_CU * beam.dt / (EPS_CU + eps_t)
    fixed = block_force(beam, b1 * c)[0]
    tension = 0.0
    for layer in beam.layers:
        force = layer_force(beam, layer.depth, layer.area, c, in_block(layer.depth, c, b1))
        if layer.role is Role.TENSION:
            tension += force
        else:
            fixed += force
    return ForcesAtStrain(c=c, fixed=fixed, tension=tension)


def areas_reaching_strain(beam: BeamSection, eps_t: float) -> tuple[float, float] | None:
    """The tension steel areas (low, high) that keep the strain at dt at least `eps_t`.

    The tension layers are scaled together by s. At the c that `eps_t` fixes,
    N = fixed + s·tension, and εt ≥ `eps_t` exactly where N ≥ 0 there (N rises
    with c, so the root then lies at or above that c's strain). Usually the
    tension layers pull (tension < 0) and the areas are (0, high]; where they
    stand mostly above that c and push, more of them raises εt and the areas
    are [low, ∞). None when no positive area does: the rest of the section
    alone holds εt below `eps_t`. `high` is ∞ when every area does.
    """
    forces = forces_at_strain(beam, eps_t)
    if forces.tension == 0:
        return (0.0, math.inf) if forces.fixed >= 0 else None
    scale = -forces.fixed / forces.tension
    if forces.tension < 0:
        return (0.0, scale * beam.As) if scale > 0 else None
    return (max(0.0, scale) * beam.As, math.inf)


def steel_for_strain(beam: BeamSection, eps_t: float) -> float:
    """The tension steel area that puts the strain at dt at exactly `eps_t`.

    With c fixed by the strain, every force but the tension layers' is fixed,
    and theirs is proportional to a common scale factor, so equilibrium gives
    the factor directly. Infinite when no positive area gives that strain
    (`unreachable_reason` says why), so a limit is never a zero area.
    """
    areas = areas_reaching_strain(beam, eps_t)
    if areas is None:
        return math.inf
    low, high = areas
    boundary = high if math.isfinite(high) else low
    return boundary if 0 < boundary < math.inf else math.inf


def unreachable_reason(beam: BeamSection, eps_t: float, what: str) -> str:
    """Why no tension steel area puts the strain at dt at `eps_t` (`what` names it)."""
    if areas_reaching_strain(beam, eps_t) is None:
        return (f"the steel given as compression steel lies below the neutral axis and pulls, "
                f"so εt stays below {what} whatever the tension steel area")
    return (f"the layers given as tension steel, taken together, are in compression there "
            f"(they lie too far above dt), so εt stays above {what} whatever their area")


def reinforcement_limits(beam: BeamSection) -> ReinforcementLimits:
    """Every limit the check compares As with."""
    eps_ty = yield_strain(beam.fy, beam.es)
    return ReinforcementLimits(
        As_min=minimum_steel(beam),
        As_tc=steel_for_strain(beam, eps_ty + TENSION_CONTROL_MARGIN),
        As_max=steel_for_strain(beam, EPS_T_BEAM_MINIMUM),
        As_b=steel_for_strain(beam, eps_ty),
        bd=beam.bw * beam.d,
    )
