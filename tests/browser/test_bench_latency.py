"""`make bench` entry for the browser update-latency benchmark (tests/bench_browser.py)."""

import sys
from pathlib import Path

import pytest

from conftest import CHROMIUM, _missing

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

import bench_browser  # noqa: E402


@pytest.mark.bench
@pytest.mark.browser
def test_update_latency():
    try:
        import playwright  # noqa: F401
    except ImportError:
        _missing("the playwright Python package is not installed (pip install -e '.[test]')")
    if not Path(CHROMIUM).exists():
        _missing(f"{CHROMIUM} is missing (apt-get install chromium)")
    assert bench_browser.main(["--runs", "60"]) == 0
