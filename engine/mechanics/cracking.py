"""The cracking moment of the gross section, ACI 318-19 24.2.3.5.

Mcr = fr·Ig/yt: the gross concrete section, steel neglected, with fr from
19.2.3.1 and yt from the centroid to the extreme tension fibre (the face at
depth h; a flange is on the compression side). A T or L takes its gross
flanged section: bf over hf, bw below.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..section.beam import BeamSection
from ..section.materials import modulus_of_rupture


@dataclass(frozen=True)
class GrossSection:
    """Area, centroid depth from the compression face, Ig and yt, base units."""

    area: float
    centroid: float
    Ig: float
    yt: float


def gross_section(beam: BeamSection) -> GrossSection:
    """The gross concrete section of `beam` (which must have h), steel neglected."""
    h = beam.h
    flange = beam.flange
    # Rectangles of (width, top, bottom): the flange over hf, the web below it.
    parts = ([(beam.bw, 0.0, h)] if flange is None else
             [(flange.width, 0.0, flange.thickness), (beam.bw, flange.thickness, h)])
    area = sum(width * (bottom - top) for width, top, bottom in parts)
    centroid = sum(width * (bottom - top) * (top + bottom) / 2
                   for width, top, bottom in parts) / area
    # Parallel axis theorem: each rectangle's own b·t³/12 plus its area times the offset squared.
    Ig = sum(width * (bottom - top) ** 3 / 12 + width * (bottom - top) * ((top + bottom) / 2 - centroid) ** 2
             for width, top, bottom in parts)
    return GrossSection(area=area, centroid=centroid, Ig=Ig, yt=h - centroid)


def cracking_moment(beam: BeamSection) -> float:
    """Mcr = fr·Ig/yt, ACI 318-19 24.2.3.5, in base force·length (lb·in or N·mm)."""
    gross = gross_section(beam)
    return modulus_of_rupture(beam.fc, beam.system) * gross.Ig / gross.yt
