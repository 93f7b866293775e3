"""The section being checked: geometry, materials and steel, validated.

A `RectangularBeam` is a singly reinforced rectangular section with its
tension steel lumped at the centroid depth d; εt is read at dt, the depth of
the extreme tension layer (dt = d for one layer).
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from .errors import InputError
from .units import UnitSystem, unit_system
from .validation import flag, hard_maximum, in_range


@dataclass(frozen=True)
class RectangularBeam:
    """Inputs of one check, in the base units of `system` (psi, in or MPa, mm)."""

    system: UnitSystem
    fc: float
    fy: float
    b: float
    d: float
    As: float
    dt: float
    es: float
    spiral: bool = False

    def with_steel(self, As: float) -> "RectangularBeam":
        """The same section with another tension steel area (trusted: As > 0)."""
        return replace(self, As=As)


def rectangular_beam(
    *,
    units: object,
    fc: object,
    fy: object,
    b: object,
    d: object,
    As: object,
    dt: object | None = None,
    es: object | None = None,
    spiral: object = False,
) -> RectangularBeam:
    """A validated `RectangularBeam`; raises `InputError` naming the bad field."""
    system = unit_system(units)
    stress, length, area = system.stress, system.length, system.area
    max_length = hard_maximum(system, "length")
    fc_value = in_range("fc", fc, stress, hard_maximum(system, "stress_fc"))
    fy_value = in_range("fy", fy, stress, hard_maximum(system, "stress_fy"))
    b_value = in_range("b", b, length, max_length)
    d_value = in_range("d", d, length, max_length)
    dt_value = d_value if dt is None else in_range("dt", dt, length, max_length)
    if dt_value < d_value:
        raise InputError("dt", dt, f"at least d = {d_value:g} {length}",
                         why="the extreme tension layer cannot be above the steel centroid")
    As_value = in_range("As", As, area, b_value * d_value)
    es_value = system.default_es if es is None else in_range(
        "es", es, stress, hard_maximum(system, "modulus"))
    return RectangularBeam(
        system=system, fc=fc_value, fy=fy_value, b=b_value, d=d_value, As=As_value,
        dt=dt_value, es=es_value, spiral=flag("spiral", spiral),
    )
