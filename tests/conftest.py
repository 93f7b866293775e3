"""Shared fixtures for the engine tests (keep small; tables live in reference_cases.py)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest


@pytest.fixture
def run_cli():
    """Run `python -m engine ARGS...` as a user would; returns the CompletedProcess.

    It runs from the folder holding the `engine` package this test process imported,
    so the CLI and the in-process API under test are the same code.
    """
    import engine

    package_root = Path(engine.__file__).resolve().parent.parent

    def run(*args: str) -> subprocess.CompletedProcess:
        return subprocess.run([sys.executable, "-m", "engine", *args], cwd=package_root,
                              capture_output=True, text=True, timeout=60)

    return run



@pytest.fixture(scope="session")
def built_site(tmp_path_factory) -> Path:
    """The static site, built once per session with the command a user runs (`python -m webapp build`)."""
    from pyodide_node import require_tools

    require_tools()  # the build reads the pinned Pyodide package from tests/pyodide
    out = tmp_path_factory.mktemp("site") / "build"
    root = Path(__file__).resolve().parent.parent
    done = subprocess.run([sys.executable, "-m", "webapp", "build", "--out", str(out)],
                          capture_output=True, text=True, cwd=root, timeout=600)
    assert done.returncode == 0, f"build failed:\n{done.stdout}\n{done.stderr}"
    print(done.stdout)
    return out
