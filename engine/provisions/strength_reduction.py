"""The strength reduction factor φ for moment and the section's strain class.

ACI 318-19 Table 21.2.2 (classification per 21.2.2 and its commentary).
"""

from __future__ import annotations

from enum import Enum

TENSION_CONTROL_MARGIN = 0.003
"""εt must exceed εty by this much to be tension-controlled, ACI 318-19 Table 21.2.2."""

PHI_TENSION_CONTROLLED = 0.90

# A strain computed at a limit (say, for ρ exactly at ρtc) can land a few
# ulps short of it; within this much it counts as on the limit.
STRAIN_ROUNDING = 1e-15


class SectionClass(str, Enum):
    """Strain class of a section, ACI 318-19 Table 21.2.2."""

    TENSION_CONTROLLED = "tension-controlled"
    TRANSITION = "transition"
    COMPRESSION_CONTROLLED = "compression-controlled"


def section_class(eps_t: float, eps_ty: float) -> SectionClass:
    """Tension-controlled when εt ≥ εty + 0.003, compression-controlled when εt ≤ εty."""
    if eps_t >= eps_ty + TENSION_CONTROL_MARGIN - STRAIN_ROUNDING:
        return SectionClass.TENSION_CONTROLLED
    if eps_t <= eps_ty + STRAIN_ROUNDING:
        return SectionClass.COMPRESSION_CONTROLLED
    return SectionClass.TRANSITION


def phi_flexure(eps_t: float, eps_ty: float, spiral: bool = False) -> float:
    """φ for moment from the net tensile strain εt, ACI 318-19 Table 21.2.2.

    Transverse reinforcement "other" by default: 0.65 to 0.90; spirals
    conforming to 25.7.3: 0.75 to 0.90. Linear in εt across the transition.
    """
    low, span = (0.75, 0.15) if spiral else (0.65, 0.25)
    if eps_t >= eps_ty + TENSION_CONTROL_MARGIN - STRAIN_ROUNDING:
        return PHI_TENSION_CONTROLLED
    if eps_t <= eps_ty + STRAIN_ROUNDING:
        return low
    return low + span * (eps_t - eps_ty) / TENSION_CONTROL_MARGIN
