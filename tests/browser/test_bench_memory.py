"""`make bench` entry for the local server's memory over many sessions (tests/bench_memory.py).

Each closed session kept its page (about 2.8 MB) until Panel's JS-callback
registry was cleared when a session ends (webapp/session_cleanup.py); the
growth per session must stay well below that.
"""

import sys
from pathlib import Path

import pytest

from conftest import CHROMIUM, _missing

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

import bench_memory  # noqa: E402

SESSIONS = 100
LEAK_PER_SESSION_MB = 2.8  # what each closed session kept before the fix (measured)


@pytest.mark.bench
@pytest.mark.browser
def test_server_memory_over_sessions():
    try:
        import playwright  # noqa: F401
    except ImportError:
        _missing("the playwright Python package is not installed (pip install -e '.[test]')")
    if not Path(CHROMIUM).exists():
        _missing(f"{CHROMIUM} is missing (apt-get install chromium)")
    figures = bench_memory.measure(SESSIONS, settle=40.0)
    print(figures)
    # A fifth of the old leak per session: far above noise, far below a page kept per session.
    assert figures["growth_per_session_mb"] < LEAK_PER_SESSION_MB / 5, figures
