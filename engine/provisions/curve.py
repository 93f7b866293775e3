"""Capacity against the tension steel ratio ρ, for the plot of limits.

For fixed f'c, fy, b, d and dt, the curve gives Mn, φMn, φ and εt as ρ
runs from 0 to well past ρb. The limit ratios (ρmin, tension-controlled,
εt = 0.004, ρb) and the section's own ρ are included exactly, so a marker
drawn at a limit sits on the curve.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..section.beam import BeamSection, beam_section
from ..section.units import quoted_moment
from .flexure import capacity_point
from .limits import ReinforcementLimits, reinforcement_limits
from .strength_reduction import PHI_TENSION_CONTROLLED, SectionClass

DEFAULT_POINTS = 400
_PAST_BALANCED = 1.5  # the curve ends at 1.5 ρb (or past the section's own ρ)


@dataclass(frozen=True)
class CapacityCurve:
    """Columns of equal length, ordered by ρ; moments in kip·ft or kN·m.

    At ρ = 0 a section with tension steel only has no strength: Mn = φMn = 0,
    φ = 0.90 and εt is infinite. A section with other steel starts at the
    first ρ > 0 instead, since its strength does not vanish there.
    """

    rho: tuple[float, ...]
    As: tuple[float, ...]
    Mn: tuple[float, ...]
    phiMn: tuple[float, ...]
    phi: tuple[float, ...]
    eps_t: tuple[float, ...]
    section_class: tuple[str, ...]
    marks: dict[str, float]  # rho_min, rho_tc, rho_max, rho_b, rho (the section's own)

    def to_dict(self) -> dict:
        columns = {name: list(getattr(self, name)) for name in
                   ("rho", "As", "Mn", "phiMn", "phi", "section_class")}
        columns["eps_t"] = [None if math.isinf(e) else e for e in self.eps_t]
        # A limit no steel area can reach is infinite; JSON has no infinity, so null.
        marks = {name: None if math.isinf(rho) else rho for name, rho in self.marks.items()}
        return {**columns, "marks": marks}


def last_ratio(limits: ReinforcementLimits, rho_section: float) -> float:
    """Where a curve against ρ ends: 1.5 ρb, or just past the section's own ρ.

    A limit no steel area can reach (dt far below d) is infinite: the curve
    then ends past the largest limit that is finite.
    """
    finite_limits = [rho for rho in (limits.rho_b, limits.rho_max, limits.rho_tc) if math.isfinite(rho)]
    return max(_PAST_BALANCED * max(finite_limits, default=rho_section), 1.1 * rho_section)


def capacity_curve(*, points: int = DEFAULT_POINTS, **inputs) -> CapacityCurve:
    """The curve for the section described by `inputs` (as for `check`)."""
    inputs.pop("Mu", None)
    return curve_for_beam(beam_section(**inputs), points)


def curve_for_beam(beam: BeamSection, points: int = DEFAULT_POINTS) -> CapacityCurve:
    """The curve for an already validated beam, `points` evenly spaced ratios plus the marks."""
    limits = reinforcement_limits(beam)
    bd = beam.bw * beam.d
    rho_section = beam.As / bd
    marks = {"rho_min": limits.rho_min, "rho_tc": limits.rho_tc, "rho_max": limits.rho_max,
             "rho_b": limits.rho_b, "rho": rho_section}
    rho_end = last_ratio(limits, rho_section)
    finite_marks = {rho for rho in marks.values() if math.isfinite(rho)}
    ratios = sorted({rho_end * i / (points - 1) for i in range(points)} | finite_marks)
    if len(beam.tension_layers) != len(beam.layers):
        ratios = [rho for rho in ratios if rho > 0]
    columns: dict[str, list] = {name: [] for name in
                                ("rho", "As", "Mn", "phiMn", "phi", "eps_t", "section_class")}
    for rho in ratios:
        if rho <= 0:
            row = (0.0, 0.0, 0.0, 0.0, PHI_TENSION_CONTROLLED, math.inf,
                   SectionClass.TENSION_CONTROLLED.value)
        else:
            point = capacity_point(beam.with_tension_area(rho * bd))
            Mn = quoted_moment(point.Mn_base, beam.system)
            row = (rho, rho * bd, Mn, point.phi * Mn, point.phi, point.eps_t,
                   point.section_class.value)
        for column, value in zip(columns.values(), row):
            column.append(value)
    return CapacityCurve(**{name: tuple(values) for name, values in columns.items()},
                         marks=marks)
