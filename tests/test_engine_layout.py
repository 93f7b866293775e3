"""The engine's layout (issue 12 item 9): its public names, unchanged by the regrouping."""

from __future__ import annotations

from pathlib import Path

import engine

# `engine.__all__` as it stood before the modules were grouped into packages
# (main at 76768d3): moving code must not change what `import engine` offers.
PUBLIC_NAMES = [
    "Arrangement", "Bar", "BarOption", "BeamSection", "CAUTION", "CapacityCurve", "CodeCheck",
    "CurvaturePoint", "DesignResult", "DesignSection", "DuctilitySweep", "Exposure", "FailedRule",
    "Flange", "FlexuralCheck", "InputError", "MomentCurvature", "NotChecked", "Order",
    "Redistribution", "RhoscopeError", "Role", "SI", "SectionClass", "SpecialFrameCheck",
    "SteelLayer", "Support", "US", "UnitSystem", "arrange", "bar", "beam_section",
    "capacity_curve", "check", "check_beam", "convert", "curvature_for_beam", "curve_for_beam",
    "design_section", "detailing_checks", "ductility_sweep", "ductility_sweep_for_beam",
    "effective_flange_width", "moment_curvature", "rectangular_beam", "special_frame_check",
    "special_frame_for_beam", "standard_bars", "unit_system",
]


def test_the_engine_under_test_is_this_checkout():
    # The venv may hold an editable install of another checkout; these tests are about this one.
    assert Path(engine.__file__).resolve().parent == Path(__file__).resolve().parent.parent / "engine"


def test_the_public_names_are_unchanged():
    assert sorted(engine.__all__) == PUBLIC_NAMES


def test_every_public_name_is_there():
    missing = [name for name in PUBLIC_NAMES if not hasattr(engine, name)]
    assert missing == []
