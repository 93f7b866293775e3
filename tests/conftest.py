"""Shared fixtures for the engine tests (keep small; tables live in reference_cases.py)."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

REPO_ROOT = Path(__file__).resolve().parent.parent


@pytest.fixture
def run_cli():
    """Run `python -m engine ARGS...` from the repository root; returns CompletedProcess."""

    def run(*args: str) -> subprocess.CompletedProcess:
        return subprocess.run([sys.executable, "-m", "engine", *args], cwd=REPO_ROOT,
                              capture_output=True, text=True, timeout=60)

    return run

