"""The least tension steel whose φMn reaches a demand, for a fixed b, d and dt."""

from __future__ import annotations

import math

from .flexure import analyse, capacity_point
from .limits import EPS_T_BEAM_MINIMUM, steel_for_strain
from .materials import BLOCK_STRESS_FACTOR
from .section import BeamSection
from .strength_reduction import PHI_TENSION_CONTROLLED, SectionClass

_GRID = 48  # coarse scan: φMn can fall in the transition zone, so no blind bisection
_BISECTIONS = 60


def design_moment(beam: BeamSection, As: float) -> float:
    """φMn in base units for `beam` with `As` of tension steel."""
    point = capacity_point(beam.with_tension_area(As))
    return point.phi * point.Mn_base


def required_steel(beam: BeamSection, Mu_base: float) -> float | None:
    """Least As with φMn ≥ Mu and εt ≥ 0.004 (9.3.3.1), or None if none exists.

    φMn rises with As while the section is tension-controlled but may fall
    across the transition zone as φ drops (ACI 318-19 Table 21.2.2), so the
    first crossing is bracketed on a grid up to the 9.3.3.1 limit and then
    bisected.
    """
    if Mu_base <= 0:
        return 0.0
    closed_form = _tension_controlled_steel(beam, Mu_base)
    if closed_form is not None:
        return closed_form
    As_limit = steel_for_strain(beam, EPS_T_BEAM_MINIMUM)
    below = 0.0
    for step in range(1, _GRID + 1):
        above = As_limit * step / _GRID
        if design_moment(beam, above) >= Mu_base:
            break
        below = above
    else:
        return None
    for _ in range(_BISECTIONS):
        middle = 0.5 * (below + above)
        if design_moment(beam, middle) >= Mu_base:
            above = middle
        else:
            below = middle
    return above


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
    state = analyse(beam.with_tension_area(As))
    if state.steel_yields and state.section_class is SectionClass.TENSION_CONTROLLED:
        return As
    return None
