"""The concrete compression force of the equivalent rectangular block.

ACI 318-19 22.2.2.4.1: a uniform stress 0.85 f'c over the part of the
section within a = β1·c of the compression face. The part is the flange
alone while a ≤ hf, then the flange and the web below it; the block stops
at the section's depth h when one is given. Concrete tension is neglected
(22.2.2.2).
"""

from __future__ import annotations

from ..section.beam import BeamSection
from ..section.materials import BLOCK_STRESS_FACTOR


def compressed_area(section: BeamSection, a: float) -> tuple[float, float]:
    """Area of the section within depth `a` of the compression face, and its centroid's depth."""
    if section.h is not None:
        a = min(a, section.h)
    flange = section.flange
    if flange is None or a <= flange.thickness:
        width = section.bw if flange is None else flange.width
        return width * a, a / 2
    flange_area = flange.width * flange.thickness
    web_area = section.bw * (a - flange.thickness)
    centroid = (flange_area * flange.thickness / 2
                + web_area * (flange.thickness + a) / 2) / (flange_area + web_area)
    return flange_area + web_area, centroid


def block_force(section: BeamSection, a: float) -> tuple[float, float]:
    """The block's compression force 0.85 f'c·A and the depth at which it acts."""
    area, centroid = compressed_area(section, a)
    return BLOCK_STRESS_FACTOR * section.fc * area, centroid


def block_width(section: BeamSection, a: float) -> float:
    """Width of the section at depth `a`: where the block grows as c does (0 past h)."""
    if section.h is not None and a >= section.h:
        return 0.0
    flange = section.flange
    if flange is not None and a < flange.thickness:
        return flange.width
    return section.bw
