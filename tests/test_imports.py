"""Load only what runs: the packages the static build never installs are never needed.

webapp/build.py leaves out `NEVER_IMPORTED` (Panel's and Bokeh's requirements
that the page does not import). Here the whole page is driven in CPython, every
tab and action, with those packages made absent (tests/page_tour.py), in a
fresh interpreter so that nothing another test imported can hide an import.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

from webapp.build import NEVER_IMPORTED, WORKER_EXTRAS

TOUR = Path(__file__).with_name("page_tour.py")


def tour(*arguments: str) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, str(TOUR), *arguments], capture_output=True, text=True,
                          timeout=300, cwd=TOUR.parent.parent)


def test_every_tab_runs_without_the_packages_the_build_leaves_out():
    done = tour(*sorted(NEVER_IMPORTED))
    assert done.returncode == 0, done.stderr[-3000:]
    report = json.loads(done.stdout.strip().splitlines()[-1])
    # Looked for, and found absent, is fine: Bokeh asks whether pandas is installed.
    print(f"asked for while absent: {report['attempted']}")


def test_the_tour_fails_when_a_needed_package_is_absent():
    # The control: the same tour with a package the page does need (param) made absent.
    done = tour("param")
    assert done.returncode != 0 and "param" in done.stderr


def test_without_pyodide_http_panels_worker_glue_needs_pandas():
    # Why the build adds pyodide-http (Panel 1.9.4, panel/io/pyodide.py imports pandas without it).
    assert "pyodide-http" in WORKER_EXTRAS
    done = tour("--without-pyodide-http", "pandas")
    assert done.returncode != 0 and "No module named 'pandas'" in done.stderr
