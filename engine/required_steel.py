"""The least tension steel whose φMn reaches a demand, for a fixed b, d and dt."""

from __future__ import annotations

from .flexure import analyse
from .limits import EPS_T_BEAM_MINIMUM, steel_for_strain
from .section import RectangularBeam

_GRID = 48  # coarse scan: φMn can fall in the transition zone, so no blind bisection
_BISECTIONS = 60


def design_moment(beam: RectangularBeam, As: float) -> float:
    """φMn in base units for `beam` with `As` of tension steel."""
    state = analyse(beam.with_steel(As))
    return state.phi * state.Mn_base


def required_steel(beam: RectangularBeam, Mu_base: float) -> float | None:
    """Least As with φMn ≥ Mu and εt ≥ 0.004 (9.3.3.1), or None if none exists.

    φMn rises with As while the section is tension-controlled but may fall
    across the transition zone as φ drops (ACI 318-19 Table 21.2.2), so the
    first crossing is bracketed on a grid up to the 9.3.3.1 limit and then
    bisected.
    """
    if Mu_base <= 0:
        return 0.0
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
