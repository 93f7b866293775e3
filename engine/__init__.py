"""Rhoscope's engine: ACI 318-19 flexural checks of reinforced-concrete beams.

Standard library only, no I/O. The same code runs in CPython and in Pyodide.
"""

from .design.arrangement import Arrangement, arrange
from .design.sizing import (BarOption, DesignResult, DesignSection, FailedRule, Order, design_section,
                            detailing_checks)
from .provisions.checks import CAUTION, CodeCheck, FlexuralCheck, check, check_beam
from .provisions.curve import CapacityCurve, capacity_curve, curve_for_beam
from .provisions.detailing import Exposure, Support
from .provisions.flange_width import effective_flange_width
from .provisions.moment_curvature import (CurvaturePoint, DuctilitySweep, MomentCurvature, curvature_for_beam,
                                          ductility_sweep, ductility_sweep_for_beam, moment_curvature)
from .provisions.redistribution import Redistribution
from .provisions.special_frame import (NotChecked, SpecialFrameCheck, special_frame_check,
                                       special_frame_for_beam)
from .provisions.strength_reduction import SectionClass
from .section.bars import Bar, bar, standard_bars
from .section.beam import BeamSection, Flange, Role, SteelLayer, beam_section, rectangular_beam
from .section.errors import InputError, RhoscopeError
from .section.units import SI, US, UnitSystem, convert, unit_system

__version__ = "0.1.0"

__all__ = [
    "CAUTION", "Arrangement", "Bar", "BarOption", "BeamSection", "CapacityCurve", "CodeCheck",
    "CurvaturePoint", "DesignResult", "DesignSection", "DuctilitySweep", "Exposure", "FailedRule",
    "Flange", "FlexuralCheck", "InputError", "MomentCurvature", "NotChecked", "Order",
    "Redistribution", "RhoscopeError", "Role", "SI", "SectionClass", "SpecialFrameCheck",
    "SteelLayer", "Support", "US", "UnitSystem", "arrange", "bar",
    "beam_section", "capacity_curve", "check", "check_beam", "convert", "curvature_for_beam",
    "curve_for_beam", "design_section", "detailing_checks", "ductility_sweep",
    "ductility_sweep_for_beam", "effective_flange_width", "moment_curvature", "rectangular_beam",
    "special_frame_check", "special_frame_for_beam",
    "standard_bars", "unit_system",
]
