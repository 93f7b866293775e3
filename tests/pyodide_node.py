"""Run a Python script inside real Pyodide under Node.js (tests/pyodide/run.mjs).

Shared by tests/test_pyodide.py and the benchmarks. Pyodide is the npm package
pinned in tests/pyodide/package.json, loaded from its node_modules folder, so
this works offline.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parent.parent
PYODIDE_DIR = REPO / "tests" / "pyodide"
RUNNER = PYODIDE_DIR / "run.mjs"
PACKAGE = PYODIDE_DIR / "node_modules" / "pyodide"
ENGINE_DIR = REPO / "engine"


def in_ci() -> bool:
    return os.environ.get("CI", "").lower() in ("1", "true", "yes")


def pinned_version() -> str:
    """The pyodide version tests/pyodide/package.json pins (exact, no range)."""
    return json.loads((PYODIDE_DIR / "package.json").read_text())["dependencies"]["pyodide"]


def missing_tools() -> str | None:
    """Why Pyodide under Node cannot run here, or None when it can."""
    if shutil.which("node") is None:
        return "node is not on PATH (install Node.js 18 or newer)"
    if not (PACKAGE / "pyodide.asm.wasm").is_file():
        return f"npm package pyodide is not installed in {PYODIDE_DIR} (run: npm ci --prefix tests/pyodide)"
    installed = json.loads((PACKAGE / "package.json").read_text())["version"]
    if installed != pinned_version():
        return f"node_modules holds pyodide {installed}, package.json pins {pinned_version()} (run npm ci)"
    return None


def require_tools() -> None:
    """Skip with the reason locally; in CI (CI=true) a missing tool is a failure."""
    reason = missing_tools()
    if reason is None:
        return
    if in_ci():
        pytest.fail(f"Pyodide under Node is required in CI: {reason}", pytrace=False)
    pytest.skip(f"Pyodide under Node unavailable: {reason}")


def run_in_pyodide(script: Path, packages=(ENGINE_DIR,), timeout: float = 300) -> subprocess.CompletedProcess:
    """Run `script` as __main__ in Pyodide with `packages` importable; return the finished process."""
    command = ["node", str(RUNNER), str(script), *map(str, packages)]
    return subprocess.run(command, capture_output=True, text=True, timeout=timeout, cwd=REPO)
