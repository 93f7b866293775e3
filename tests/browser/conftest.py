"""Fixtures for browser tests: a real `python -m webapp serve` and Debian's Chromium.

The server is started exactly as a user starts it, on a free port, and polled
until it answers (no fixed sleeps). Chromium runs headless from
/usr/bin/chromium with a fresh profile. Without Chromium or Playwright the
tests skip with the reason, except in CI (CI=true), where they fail.
"""

from __future__ import annotations

import os
import shutil
import socket
import subprocess
import sys
import tempfile
import time
import urllib.request
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
SCREENSHOTS = ROOT / "tests" / "screenshots"
CHROMIUM = "/usr/bin/chromium"
CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic",
                 "--no-first-run", "--disable-background-networking",
                 "--disable-component-update", "--disable-sync"]
SERVER_START_TIMEOUT = 90.0  # seconds; Panel's first import is slow on a cold machine


def pytest_configure(config):
    config.addinivalue_line("markers", "bench: a benchmark; runs only when asked for (-m bench)")


def pytest_collection_modifyitems(config, items):
    if "bench" in (config.getoption("markexpr") or ""):
        return
    skip = pytest.mark.skip(reason="benchmark: runs only with -m bench (make bench)")
    for item in items:
        if "bench" in item.keywords:
            item.add_marker(skip)


def _missing(reason: str):
    if os.environ.get("CI") == "true":
        pytest.fail(f"{reason} (browser tests must run in CI)", pytrace=False)
    pytest.skip(reason)


def free_port() -> int:
    with socket.socket() as sock:
        sock.bind(("127.0.0.1", 0))
        return sock.getsockname()[1]


def wait_until_answers(url: str, process: subprocess.Popen, timeout: float) -> None:
    """Poll `url` until it returns 200; raise if `process` dies or time runs out."""
    deadline = time.monotonic() + timeout
    while time.monotonic() < deadline:
        if process.poll() is not None:
            raise RuntimeError(f"the server exited with code {process.returncode}")
        try:
            # A generous timeout: the first page a cold server renders can take seconds on a
            # loaded machine, and a request given up early is rendered again from scratch.
            with urllib.request.urlopen(url, timeout=30) as response:
                if response.status == 200:
                    return
        except OSError:
            pass
        time.sleep(0.1)  # polling interval, not a wait for readiness
    raise RuntimeError(f"{url} did not answer within {timeout:g} s")


@pytest.fixture(scope="session")
def app_url():
    """The base URL of a running `python -m webapp serve --port P` (stopped afterwards)."""
    port = free_port()
    log = tempfile.TemporaryFile()
    process = subprocess.Popen([sys.executable, "-m", "webapp", "serve", "--port", str(port)],
                               cwd=ROOT, stdout=log, stderr=subprocess.STDOUT)
    url = f"http://localhost:{port}/"
    try:
        wait_until_answers(url, process, SERVER_START_TIMEOUT)
    except RuntimeError as error:
        process.kill()
        process.wait()
        log.seek(0)
        pytest.fail(f"{error}\n{log.read().decode(errors='replace')}", pytrace=False)
    yield url
    process.terminate()
    try:
        process.wait(timeout=10)
    except subprocess.TimeoutExpired:
        process.kill()
        process.wait()
    log.close()


@pytest.fixture(scope="session")
def playwright_driver():
    """One Playwright driver for the session (its sync API allows one per process at a time)."""
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        _missing("the playwright Python package is not installed (pip install -e '.[test]')")
    if not Path(CHROMIUM).exists():
        _missing(f"{CHROMIUM} is missing (apt-get install chromium)")
    with sync_playwright() as playwright:
        yield playwright


@pytest.fixture(scope="session")
def chromium(playwright_driver):
    """Headless Chromium driven by Playwright, with a fresh profile."""
    profile = tempfile.mkdtemp(prefix="rhoscope-chromium-")
    context = playwright_driver.chromium.launch_persistent_context(
        profile, executable_path=CHROMIUM, args=CHROMIUM_ARGS, headless=True,
        viewport={"width": 1366, "height": 768})
    yield context
    context.close()
    shutil.rmtree(profile, ignore_errors=True)


@pytest.fixture
def page(chromium):
    """A new tab that records dialogs and page errors; closed after the test."""
    tab = chromium.new_page()
    tab.dialogs = []
    tab.page_errors = []
    tab.on("dialog", lambda dialog: (tab.dialogs.append(dialog.message), dialog.dismiss()))
    tab.on("pageerror", lambda error: tab.page_errors.append(str(error)))
    yield tab
    tab.close()


@pytest.fixture(scope="session")
def screenshots() -> Path:
    SCREENSHOTS.mkdir(parents=True, exist_ok=True)
    return SCREENSHOTS
