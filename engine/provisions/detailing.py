"""Detailing and serviceability rules for beam reinforcement, ACI 318-19.

Each function states one rule in the base units of its system (psi, in or
MPa, mm) and names its clause. They are plain functions of trusted numbers;
`design` validates the inputs and turns the results into code checks.
"""

from __future__ import annotations

from enum import Enum

from ..section.bars import Bar
from ..section.beam import BeamSection, SteelLayer
from ..section.units import UnitSystem
from .limits import minimum_steel

# 25.2.1: least clear spacing, a fixed length per system.
_SPACING_FLOOR = {"us": 1.0, "si": 25.0}
# 25.2.2: least clear distance between layers.
_LAYER_GAP_MIN = {"us": 1.0, "si": 25.0}
# Nominal maximum aggregate assumed when none is given (common practice: 3/4 in, 19 mm).
DEFAULT_AGGREGATE = {"us": 0.75, "si": 19.0}
# 9.7.2.3: skin reinforcement is needed when h exceeds this.
_SKIN_DEPTH = {"us": 36.0, "si": 900.0}
# Table 24.3.2, deformed bars: s ≤ min(k1 (f0/fs) − 2.5 cc, k2 (f0/fs)).
_CRACK_SPACING = {"us": (15.0, 12.0, 40_000.0), "si": (380.0, 300.0, 280.0)}
# 9.3.1.1.1: the Table 9.3.1.1 depths are for this fy; others scale by 0.4 + fy/k.
_DEPTH_FY = {"us": 100_000.0, "si": 700.0}


class Exposure(str, Enum):
    """Exposure rows of ACI 318-19 Table 20.5.1.3.1 (nonprestressed, cast in place)."""

    NOT_EXPOSED = "not-exposed"  # not exposed to weather or in contact with ground
    EXPOSED = "exposed"  # exposed to weather or in contact with ground
    CAST_AGAINST_GROUND = "cast-against-ground"  # cast against and permanently in contact


class Support(str, Enum):
    """Support conditions of ACI 318-19 Table 9.3.1.1."""

    SIMPLE = "simple"
    ONE_END = "one-end"  # one end continuous
    BOTH_ENDS = "both-ends"  # both ends continuous
    CANTILEVER = "cantilever"


# Table 9.3.1.1: minimum h = span / divisor (normalweight concrete, fy = 60,000 psi).
MINIMUM_DEPTH_DIVISOR = {Support.SIMPLE: 16.0, Support.ONE_END: 18.5,
                         Support.BOTH_ENDS: 21.0, Support.CANTILEVER: 8.0}


def minimum_clear_spacing(system: UnitSystem, db: float, aggregate: float) -> float:
    """Least clear spacing between parallel bars in a layer, ACI 318-19 25.2.1.

    The greatest of 1 in (25 mm), db and 4/3 of the nominal maximum aggregate size.
    """
    return max(_SPACING_FLOOR[system.name], db, 4.0 / 3.0 * aggregate)


def minimum_layer_gap(system: UnitSystem) -> float:
    """Least clear distance between layers of bars, 1 in (25 mm), ACI 318-19 25.2.2."""
    return _LAYER_GAP_MIN[system.name]


def minimum_cover(system: UnitSystem, exposure: Exposure, bar: Bar) -> float:
    """Specified cover for `bar` in a cast-in-place beam, ACI 318-19 Table 20.5.1.3.1.

    Not exposed: 1-1/2 in (40 mm) for primary bars, stirrups, ties and hoops.
    Exposed to weather or ground: 2 in (50 mm) for #6 (No. 19) and larger,
    1-1/2 in (40 mm) for #5 (No. 16) and smaller. Cast against and permanently
    in contact with ground: 3 in (75 mm).
    """
    us = system.name == "us"
    if exposure is Exposure.CAST_AGAINST_GROUND:
        return 3.0 if us else 75.0
    if exposure is Exposure.EXPOSED and bar.number >= (6 if us else 19):
        return 2.0 if us else 50.0
    return 1.5 if us else 40.0


def service_stress(fy: float) -> float:
    """fs = 2/3 fy, the stress ACI 318-19 24.3.2.1 permits in place of a calculated one."""
    return 2.0 / 3.0 * fy


def maximum_bar_spacing(system: UnitSystem, fs: float, cc: float) -> float:
    """Largest spacing of bars nearest the tension face, ACI 318-19 Table 24.3.2.

    US: min(15 (40,000/fs) − 2.5 cc, 12 (40,000/fs)), fs in psi, cc in in.
    SI: min(380 (280/fs) − 2.5 cc, 300 (280/fs)), fs in MPa, cc in mm.
    cc is the least distance from the surface of the bars to the tension face.
    """
    k1, k2, f0 = _CRACK_SPACING[system.name]
    ratio = f0 / fs
    return min(k1 * ratio - 2.5 * cc, k2 * ratio)


def skin_reinforcement_required(system: UnitSystem, h: float) -> bool:
    """True when h exceeds 36 in (900 mm), ACI 318-19 9.7.2.3."""
    return h > _SKIN_DEPTH[system.name]


def skin_depth_limit(system: UnitSystem) -> float:
    """The h above which 9.7.2.3 asks for skin reinforcement."""
    return _SKIN_DEPTH[system.name]


def minimum_steel_area(system: UnitSystem, fc: float, fy: float, b: float, d: float) -> float:
    """As,min, ACI 318-19 9.6.1.2: the larger of 3√f'c/fy·bw·d and 200/fy·bw·d (US),
    or 0.25√f'c/fy·bw·d and 1.4/fy·bw·d (SI), as `limits.minimum_steel` states it."""
    beam = BeamSection(system=system, fc=fc, fy=fy, es=system.default_es, bw=b,
                       layers=(SteelLayer(1.0, d),), dt=d)
    return minimum_steel(beam).value


def minimum_steel_satisfied(As: float, As_min: float, As_req: float | None) -> bool:
    """As ≥ As,min (9.6.1.2), or As ≥ 4/3 of the As required by analysis (9.6.1.3)."""
    return As >= As_min or (As_req is not None and As >= 4.0 / 3.0 * As_req)


def depth_modification(system: UnitSystem, fy: float) -> float:
    """Factor on Table 9.3.1.1 depths for fy other than 60,000 psi (420 MPa), ACI 318-19
    9.3.1.1.1: 0.4 + fy/100,000 (US) or 0.4 + fy/700 (SI)."""
    return 0.4 + fy / _DEPTH_FY[system.name]


def minimum_depth(system: UnitSystem, span: float, support: Support, fy: float) -> float:
    """Least h without a deflection calculation, ACI 318-19 Table 9.3.1.1 and 9.3.1.1.1.

    For normalweight concrete and beams not supporting or attached to
    partitions or other construction likely to be damaged by large deflections.
    """
    return span / MINIMUM_DEPTH_DIVISOR[support] * depth_modification(system, fy)
