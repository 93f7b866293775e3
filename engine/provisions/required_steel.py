"""The least tension steel whose φMn reaches a demand, for a fixed b, d and dt."""

from __future__ import annotations

import math

from ..mechanics.root_finding import least_root_from_above
from ..section.beam import BeamSection
from ..section.materials import BLOCK_STRESS_FACTOR, EPS_CU, beta1, yield_strain
from ..section.units import quoted_moment
from .flexure import capacity_point
from .limits import EPS_T_BEAM_MINIMUM, areas_reaching_strain
from .strength_reduction import PHI_TENSION_CONTROLLED, TENSION_CONTROL_MARGIN, SectionClass, section_class

_GRID = 24  # transition-zone scan: there φMn may fall as As rises
_RELATIVE_TOLERANCE = 1e-12
_NEGLIGIBLE = 1e-9  # of the tension-controlled area: "no tension steel" without dividing by zero


def design_moment(beam: BeamSection, As: float) -> float:
    """φMn in base units for `beam` with `As` of tension steel."""
    point = capacity_point(beam.with_tension_area(As))
    return point.phi * point.Mn_base


def required_steel_for(beam: BeamSection, Mu: float) -> float | None:
    """`required_steel` for Mu in kip·ft or kN·m, meeting Mu as the check reports φMn.

    The search works in base units; converting φMn back can lose an ulp, so
    the area is nudged up until the quoted φMn, computed as `check` computes
    it, is not below Mu.
    """
    As = required_steel(beam, Mu * beam.system.moment_to_base)
    if not As:
        return As
    for _ in range(8):
        point = capacity_point(beam.with_tension_area(As))
        if point.phi * quoted_moment(point.Mn_base, beam.system) >= Mu:
            break
        As = math.nextafter(As, math.inf)
    return As


def required_steel(beam: BeamSection, Mu_base: float) -> float | None:
    """Least As with φMn ≥ Mu and εt ≥ 0.004 (9.3.3.1), or None if none exists.

    Up to the tension-controlled limit φ = 0.90 and Mn rises with As, so φMn
    does too and the root is bracketed from 0. Across the transition zone φ
    drops (ACI 318-19 Table 21.2.2) and φMn may fall, so there the first
    crossing is bracketed on a grid up to the 9.3.3.1 limit first. The search
    never goes past the section's own area: where the 9.3.3.1 limit cannot be
    reached (εt stays above 0.004 whatever the area), it stops there.
    """
    # A demand this far below the section's scale needs no steel to twelve
    # digits; going on would only push areas into floating-point underflow.
    if Mu_base <= _RELATIVE_TOLERANCE * beam.fy * beam.bw * beam.d**2:
        return 0.0
    closed_form = _tension_controlled_steel(beam, Mu_base)
    if closed_form is not None:
        return closed_form
    within = areas_reaching_strain(beam, EPS_T_BEAM_MINIMUM)
    if within is None:  # no positive area keeps εt ≥ 0.004
        return None
    low, high = within[0], min(within[1], largest_steel_area(beam))
    if not low < high:
        return None
    shortfall = lambda As: design_moment(beam, As) - Mu_base  # noqa: E731
    eps_ty = yield_strain(beam.fy, beam.es)
    controlled = areas_reaching_strain(beam, eps_ty + TENSION_CONTROL_MARGIN)
    if low == 0 and controlled is not None and controlled[0] == 0:
        # Tension-controlled from no steel up to As_tc: φMn rises with As there.
        As_tc = min(controlled[1], high)
        # Other layers (say, "compression" steel below the neutral axis) may carry
        # Mu with next to no tension steel: then none is required.
        if shortfall(_NEGLIGIBLE * As_tc) >= 0:
            return 0.0
        f_tc = shortfall(As_tc)
        if f_tc >= 0:
            return _least_root(shortfall, 0.0, -Mu_base, As_tc, f_tc, Mu_base)
        below, f_below = As_tc, f_tc
    elif low == 0:
        if shortfall(_NEGLIGIBLE * high) >= 0:
            return 0.0
        below, f_below = 0.0, -Mu_base
    else:  # only areas from `low` up keep εt ≥ 0.004
        f_low = shortfall(low)
        if f_low >= 0:
            return low
        below, f_below = low, f_low
    start = below
    for step in range(1, _GRID + 1):
        above = start + (high - start) * step / _GRID
        f_above = shortfall(above)
        if f_above >= 0:
            return _least_root(shortfall, below, f_below, above, f_above, Mu_base)
        below, f_below = above, f_above
    return None


def largest_steel_area(beam: BeamSection) -> float:
    """The most tension steel the section could hold: its web area bw·h (bw·dt without h).

    `beam_section` refuses more, so no As the check accepts lies beyond it.
    """
    return beam.bw * (beam.h if beam.h is not None else beam.dt)


def _least_root(f, low: float, f_low: float, high: float, f_high: float, scale: float) -> float:
    """A root of the increasing `f` in (low, high] by the Illinois method, from above.

    The answer always has f ≥ 0 (the demand is met), within a relative
    tolerance of the root in both As and moment.
    """
    def settled(low: float, high: float, f_high: float) -> bool:
        return high - low <= _RELATIVE_TOLERANCE * high or f_high <= _RELATIVE_TOLERANCE * scale

    return least_root_from_above(f, low, f_low, high, f_high, settled, max_steps=200)


def _tension_controlled_steel(beam: BeamSection, Mu_base: float) -> float | None:
    """As from Mu/φ = As·fy·(d − As·fy/(2·0.85·f'c·b)) with φ = 0.90, if that holds.

    The usual closed form for yielded, tension-controlled steel (22.2.2.4.1,
    Table 21.2.2). Its smaller root is the least As; it is returned only when
    the section it gives really is tension-controlled with yielded steel,
    otherwise None and the caller searches. Only for one layer in a rectangle.
    """
    if not beam.is_rectangular or len(beam.layers) != 1:
        return None
    Mn_required = Mu_base / PHI_TENSION_CONTROLLED
    lever = beam.fy * beam.d
    k = beam.fy**2 / (2 * BLOCK_STRESS_FACTOR * beam.fc * beam.b)
    discriminant = lever**2 - 4 * k * Mn_required
    if discriminant < 0:
        return None
    As = 2 * Mn_required / (lever + math.sqrt(discriminant))
    # The assumptions, checked on the strain profile (22.2.1.2) this As gives.
    c = As * beam.fy / (BLOCK_STRESS_FACTOR * beam.fc * beam.b * beta1(beam.fc, beam.system))
    eps_ty = yield_strain(beam.fy, beam.es)
    yielded = EPS_CU * (beam.d - c) >= eps_ty * c
    eps_t = EPS_CU * (beam.dt - c) / c
    if not (yielded and section_class(eps_t, eps_ty) is SectionClass.TENSION_CONTROLLED):
        return None
    # The root can land an ulp short of the demand; the least As must meet it.
    for _ in range(8):
        if design_moment(beam, As) >= Mu_base:
            break
        As = math.nextafter(As, math.inf)
    return As
