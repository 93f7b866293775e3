"""The engine's layout (issue 12 item 9): packages by role, imports one way, public names unchanged.

The layers, from the bottom up: section → mechanics → provisions → design →
documents, with the command line (`cli`, `commands`) and `engine/__init__`
on top. A module may import from its own layer and the layers below it,
never from one above (DEVELOPERS.md, "The engine").
"""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

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


ENGINE = Path(__file__).resolve().parent.parent / "engine"
LAYERS = ("section", "mechanics", "provisions", "design", "documents")
TOP = len(LAYERS)  # engine/__init__.py, __main__.py, cli.py and commands/
TOP_MODULES = {"engine", "engine.__main__", "engine.cli"}


def module_name(path: Path) -> str:
    parts = path.relative_to(ENGINE.parent).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def layer(module: str) -> int:
    parts = module.split(".")
    if module in TOP_MODULES or parts[1] == "commands":
        return TOP
    return LAYERS.index(parts[1])


def imported(source: str, package: str) -> list[tuple[int, str]]:
    """(line, module) of every engine module `source` imports, relative imports resolved from `package`."""
    parts = package.split(".")
    found = []
    for node in ast.walk(ast.parse(source)):
        if isinstance(node, ast.Import):
            found += [(node.lineno, alias.name) for alias in node.names]
        elif isinstance(node, ast.ImportFrom):
            base = parts[:len(parts) - node.level + 1] if node.level else []
            found.append((node.lineno, ".".join(base + ([node.module] if node.module else []))))
    return [(line, module) for line, module in found if module.split(".")[0] == "engine"]


def upward_imports(source: str, module: str, is_package: bool = False) -> list[str]:
    own = layer(module)
    package = module if is_package else module.rpartition(".")[0]
    return [f"line {line}: {target}" for line, target in imported(source, package)
            if layer(target) > own]


MODULES = sorted(ENGINE.rglob("*.py"))


def test_every_module_sits_in_a_layer():
    # A new module goes into the package of its role, not flat beside the command line.
    stray = [module_name(path) for path in MODULES
             if module_name(path) not in TOP_MODULES and module_name(path).split(".")[1]
             not in (*LAYERS, "commands")]
    assert stray == []
    assert {path.parent.name for path in ENGINE.glob("*/__init__.py")} == {*LAYERS, "commands"}


@pytest.mark.parametrize("path", MODULES, ids=module_name)
def test_imports_run_one_way(path):
    module = module_name(path)
    assert upward_imports(path.read_text(), module, path.name == "__init__.py") == [], \
        f"{module} imports from a layer above its own"


@pytest.mark.parametrize("source", [
    "from ..documents.sheet import calculation_sheet",
    "from ..provisions import flexure",
    "from .. import check",  # engine/__init__ is the top: it imports every layer
    "import engine.design.sizing",
    "def f():\n    from ..design.sizing import Order\n",  # no lazy import gets by
])
def test_the_rule_catches_an_upward_import(source):
    assert upward_imports(source, "engine.mechanics.probe") != []


@pytest.mark.parametrize("source", [
    "from .stress_block import block_force",
    "from ..section.beam import BeamSection",
    "import math",
])
def test_the_rule_lets_a_downward_import_by(source):
    assert upward_imports(source, "engine.mechanics.probe") == []


def test_the_engine_under_test_is_this_checkout():
    # The venv may hold an editable install of another checkout; these tests are about this one.
    assert Path(engine.__file__).resolve().parent == Path(__file__).resolve().parent.parent / "engine"


def test_the_public_names_are_unchanged():
    assert sorted(engine.__all__) == PUBLIC_NAMES


def test_every_public_name_is_there():
    missing = [name for name in PUBLIC_NAMES if not hasattr(engine, name)]
    assert missing == []
