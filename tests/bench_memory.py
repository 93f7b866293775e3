"""Benchmark: the local server's memory over many page sessions opened and closed.

Run: .venv/bin/python tests/bench_memory.py [--sessions N] [--settle S]
Starts `python -m webapp serve` on a free port and, in headless Chromium, opens
the app N times one after another (each tab waits for φMn, then closes). The
server's resident memory (VmRSS of its process, from /proc) is printed after
the first session, every tenth, and again once Bokeh has had time to discard
the closed sessions (its unused-session check runs every 17 s and drops a
session 15 s after its socket closed). Prints one JSON line of figures last.
Not collected by pytest (the file name does not start with test_).
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE / "browser"))

from conftest import CHROMIUM, CHROMIUM_ARGS, ROOT, free_port, wait_until_answers  # noqa: E402

BOOT_TIMEOUT_MS = 60_000


def rss_mb(pid: int) -> float:
    """Resident memory of process `pid` in MB (VmRSS, Linux /proc)."""
    for line in Path(f"/proc/{pid}/status").read_text().splitlines():
        if line.startswith("VmRSS:"):
            return int(line.split()[1]) / 1024
    raise RuntimeError(f"no VmRSS for process {pid}")


def measure(sessions: int, settle: float) -> dict:
    from playwright.sync_api import sync_playwright

    port = free_port()
    log = tempfile.TemporaryFile()
    server = subprocess.Popen([sys.executable, "-m", "webapp", "serve", "--port", str(port)],
                              cwd=ROOT, stdout=log, stderr=subprocess.STDOUT)
    url = f"http://localhost:{port}/"
    samples = []
    try:
        wait_until_answers(url, server, 90.0)
        start = rss_mb(server.pid)
        with sync_playwright() as playwright:
            browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS,
                                                 headless=True)
            context = browser.new_context(viewport={"width": 1366, "height": 768})
            for index in range(1, sessions + 1):
                tab = context.new_page()
                tab.goto(url)
                tab.locator("[data-q=phiMn]").first.wait_for(timeout=BOOT_TIMEOUT_MS)
                tab.close()
                if index == 1 or index % 10 == 0:
                    samples.append((index, round(rss_mb(server.pid), 1)))
                    print(f"after {index:4d} sessions: {samples[-1][1]:7.1f} MB", flush=True)
            context.close()
            browser.close()
        time.sleep(settle)
        settled = rss_mb(server.pid)
        print(f"{settle:g} s after the last one closed: {settled:7.1f} MB", flush=True)
    finally:
        server.terminate()
        try:
            server.wait(timeout=10)
        except subprocess.TimeoutExpired:
            server.kill()
            server.wait()
        log.close()
    first = samples[0][1]
    last = samples[-1][1]
    return {"sessions": sessions, "rss_idle_mb": round(start, 1), "rss_after_first_mb": first,
            "rss_after_last_mb": last, "rss_settled_mb": round(settled, 1),
            "growth_per_session_mb": round((last - first) / max(sessions - 1, 1), 3)}


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sessions", type=int, default=100)
    parser.add_argument("--settle", type=float, default=40.0,
                        help="seconds to wait after the last session before the final reading")
    args = parser.parse_args(argv)
    if not Path(CHROMIUM).exists():
        print(f"{CHROMIUM} is missing", file=sys.stderr)
        return 1
    print(json.dumps(measure(args.sessions, args.settle)))
    return 0


if __name__ == "__main__":
    sys.exit(main())
