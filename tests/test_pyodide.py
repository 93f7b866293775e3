"""The engine inside real Pyodide (npm package under Node.js) agrees with CPython.

tests/pyodide/engine_cases.py runs once in each runtime over the same engine
source. The cross-runtime check is that the same code on the same IEEE doubles
gives the same numbers (1e-12 relative); the reference values that make those
numbers right live in the other engine tests. A few anchors below are also
computed here, independently, from closed forms.
"""

from __future__ import annotations

import json
import math
import os
import subprocess
import sys
from pathlib import Path

import pytest

from pyodide_node import ENGINE_DIR, PYODIDE_DIR, REPO, pinned_version, require_tools, run_in_pyodide

pytestmark = pytest.mark.pyodide

CASES_SCRIPT = PYODIDE_DIR / "engine_cases.py"
REL = 1e-12
MARKER = "RHOSCOPE-CASES "


def parse_cases(stdout: str) -> dict:
    lines = [line for line in stdout.splitlines() if line.startswith(MARKER)]
    assert len(lines) == 1, f"expected one result line, got stdout:\n{stdout[:2000]}"
    return json.loads(lines[0][len(MARKER):])


@pytest.fixture(scope="module")
def cpython_cases() -> dict:
    env = dict(os.environ, PYTHONPATH=str(REPO))
    done = subprocess.run([sys.executable, str(CASES_SCRIPT)], capture_output=True, text=True,
                          env=env, cwd=REPO, timeout=120)
    assert done.returncode == 0, done.stderr
    return parse_cases(done.stdout)


@pytest.fixture(scope="module")
def pyodide_cases() -> dict:
    require_tools()
    done = run_in_pyodide(CASES_SCRIPT, packages=(ENGINE_DIR,))
    assert done.returncode == 0, f"Pyodide run failed (status {done.returncode}):\n{done.stderr[-4000:]}"
    return parse_cases(done.stdout)


def assert_same(pyodide_value, cpython_value, where: str = "") -> None:
    """Equal structure; floats equal to 1e-12 relative; everything else exactly equal."""
    if isinstance(cpython_value, float) or isinstance(pyodide_value, float):
        assert isinstance(pyodide_value, (int, float)) and isinstance(cpython_value, (int, float)), where
        if math.isinf(cpython_value) or math.isnan(cpython_value):
            assert repr(pyodide_value) == repr(cpython_value), where
        else:
            assert math.isclose(pyodide_value, cpython_value, rel_tol=REL, abs_tol=1e-300), (
                f"{where}: Pyodide {pyodide_value!r} != CPython {cpython_value!r}")
    elif isinstance(cpython_value, dict):
        assert isinstance(pyodide_value, dict), where
        assert sorted(pyodide_value) == sorted(cpython_value), f"{where}: keys differ"
        for key in cpython_value:
            assert_same(pyodide_value[key], cpython_value[key], f"{where}.{key}")
    elif isinstance(cpython_value, list):
        assert isinstance(pyodide_value, list) and len(pyodide_value) == len(cpython_value), where
        for index, (p, c) in enumerate(zip(pyodide_value, cpython_value)):
            assert_same(p, c, f"{where}[{index}]")
    else:
        assert pyodide_value == cpython_value, f"{where}: Pyodide {pyodide_value!r} != CPython {cpython_value!r}"


def test_runs_in_pinned_pyodide(pyodide_cases):
    # Pyodide runs its own CPython build on Emscripten; the pin matches Panel 1.9.4's
    # panel/io/convert.py PYODIDE_VERSION = 'v0.29.3' (Pyodide 0.29 ships Python 3.13).
    assert pyodide_cases["platform"] == "emscripten"
    assert pyodide_cases["python"].startswith("3.13.")
    assert pinned_version() == "0.29.3"


def test_same_case_list(pyodide_cases, cpython_cases):
    assert sorted(pyodide_cases["cases"]) == sorted(cpython_cases["cases"])
    assert len(cpython_cases["cases"]) >= 20


CASE_IDS = [
    "us-B-101-tension-controlled", "us-B-204-not-yielding", "us-G-3-spiral-transition",
    "us-B-105-high-strength", "us-B-110-low-fc-warning", "si-B-301-tension-controlled",
    "si-B-302-not-yielding", "si-G-7-explicit-es",
    "bad-negative-fc", "bad-nan-b", "bad-inf-d", "bad-units", "bad-text-As", "bad-zero-fy",
    "curve-us-B-101", "curve-si-B-301",
    "cli-check-us-json", "cli-check-si-json", "cli-check-us-text", "cli-check-spiral-json",
    "cli-curve-us-json", "cli-bad-fc", "cli-bad-units",
]


@pytest.mark.parametrize("case_id", CASE_IDS)
def test_pyodide_agrees_with_cpython(case_id, pyodide_cases, cpython_cases):
    pyodide_case = pyodide_cases["cases"][case_id]
    cpython_case = cpython_cases["cases"][case_id]
    if "cli" in cpython_case and cpython_case["cli"]["stdout"].startswith("{"):
        # Compare the JSON the CLI printed as numbers, not as text.
        for case in (pyodide_case, cpython_case):
            case["cli"]["stdout"] = json.loads(case["cli"]["stdout"])
    assert_same(pyodide_case, cpython_case, case_id)


@pytest.mark.parametrize("case_id", [c for c in CASE_IDS if c.startswith("bad-")])
def test_invalid_input_raises_input_error_in_pyodide(case_id, pyodide_cases):
    case = pyodide_cases["cases"][case_id]
    error = case["error"]
    assert error is not None, f"{case_id}: no error raised"
    assert error["is_input_error"] and error["is_value_error"]
    assert error["field"] == case["expected_field"]
    assert error["message"].startswith(case["expected_field"])
    assert "\n" not in error["message"]


@pytest.mark.parametrize("case_id", ["us-B-204-not-yielding", "si-B-302-not-yielding"])
def test_non_yielding_case_in_pyodide(case_id, pyodide_cases):
    result = pyodide_cases["cases"][case_id]["result"]
    assert result["steel_yields"] is False
    assert result["fs"] < 0.99 * (60000 if case_id.startswith("us") else 420)
    assert result["section_class"] == "compression-controlled"


def test_cli_in_pyodide(pyodide_cases):
    cases = pyodide_cases["cases"]
    check = cases["cli-check-us-json"]["cli"]
    assert check["status"] == 0 and check["stderr"] == ""
    payload = json.loads(check["stdout"]) if isinstance(check["stdout"], str) else check["stdout"]
    required = {"beta1", "eps_ty", "a", "c", "eps_t", "fs", "steel_yields", "phi", "Mn", "phiMn", "rho",
                "As_min", "rho_min", "rho_tc", "rho_max", "rho_b", "section_class", "warnings",
                "Mu", "utilization"}
    assert required <= set(payload)
    for bad in ("cli-bad-fc", "cli-bad-units"):
        run = cases[bad]["cli"]
        assert run["status"] == 2
        assert run["stdout"] == ""
        assert run["stderr"].count("\n") == 1 and "Traceback" not in run["stderr"]
    assert "fc" in cases["cli-bad-fc"]["cli"]["stderr"]
    assert "units" in cases["cli-bad-units"]["cli"]["stderr"]


def test_independent_anchors_in_pyodide(pyodide_cases):
    """Closed forms computed here, not by the engine, checked against Pyodide's numbers."""
    r = pyodide_cases["cases"]["us-B-101-tension-controlled"]["result"]
    fc, fy, b, d, As = 4000.0, 60000.0, 12.0, 21.5, 3.16
    # ACI 318-19 Table 22.2.2.4.3: β1 = 0.85 for 2500 <= f'c <= 4000 psi.
    assert math.isclose(r["beta1"], 0.85, rel_tol=REL)
    # ACI 318-19 22.2.2.4.1 with yielded steel: a = As fy / (0.85 f'c b); Mn = As fy (d - a/2).
    a = As * fy / (0.85 * fc * b)
    assert math.isclose(r["a"], a, rel_tol=1e-12)
    assert math.isclose(r["Mn"], As * fy * (d - a / 2) / 12_000, rel_tol=1e-12)  # lb·in -> kip·ft
    # Table 21.2.2: tension-controlled, φ = 0.90.
    assert math.isclose(r["phi"], 0.90, rel_tol=REL)
    # Common practice: ρb ≈ 0.0285 for f'c = 4000 psi and Grade 60 (0.85 β1 f'c/fy · 87/(87+60)).
    assert math.isclose(r["rho_b"], 0.0285, rel_tol=5e-3)
