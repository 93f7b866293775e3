"""Benchmark: time from a changed input to the updated φMn on screen, in Chromium.

Run: .venv/bin/python tests/bench_browser.py [--runs N]
Starts `python -m webapp serve` on a free port, opens the app in headless
Chromium and, inside the page, changes an input and times until the φMn text
in the page changes (performance.now() on both ends, so Playwright's own
round trips are not counted). Two inputs are timed: a typed entry (As box,
committed like Enter) and a slider step (arrow key on the f'c handle, the
same path as a drag). Prints the median and 95th percentile of each.
Not collected by pytest (the file name does not start with test_).
"""

from __future__ import annotations

import argparse
import statistics
import subprocess
import sys
import tempfile
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE / "browser"))

from conftest import CHROMIUM, CHROMIUM_ARGS, ROOT, free_port, wait_until_answers  # noqa: E402

# Helpers defined once in the page: a query that crosses shadow roots, and a
# timer that resolves when the φMn text differs from what it was.
SETUP_JS = """
() => {
  const deep = (root, selector) => {
    const found = root.querySelector(selector);
    if (found) return found;
    for (const el of root.querySelectorAll('*')) {
      if (el.shadowRoot) { const inner = deep(el.shadowRoot, selector); if (inner) return inner; }
    }
    return null;
  };
  window.__deep = (selector) => deep(document, selector);
  window.__deepIn = (host, selector) => { const el = deep(document, host); return deep(el.shadowRoot || el, selector); };
  window.__untilChanged = (t0, old) => new Promise((resolve, reject) => {
    const limit = t0 + 10000;
    const poll = () => {
      const el = window.__deep('[data-q=phiMn]');
      if (el && el.textContent !== old) { resolve(performance.now() - t0); return; }
      if (performance.now() > limit) { reject(new Error('φMn did not change')); return; }
      requestAnimationFrame(poll);
    };
    poll();
  });
}
"""

TYPED_JS = """
async (value) => {
  const old = window.__deep('[data-q=phiMn]').textContent;
  const input = window.__deepIn('.rs-input-As', 'input');
  const t0 = performance.now();
  input.value = value;
  input.dispatchEvent(new Event('change', {bubbles: true}));
  return await window.__untilChanged(t0, old);
}
"""

SLIDER_JS = """
async (key) => {
  const old = window.__deep('[data-q=phiMn]').textContent;
  const handle = window.__deepIn('.rs-input-fc', '.noUi-handle');
  const t0 = performance.now();
  handle.dispatchEvent(new KeyboardEvent('keydown', {key, bubbles: true}));
  return await window.__untilChanged(t0, old);
}
"""


def percentile(values: list[float], share: float) -> float:
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, round(share * (len(ordered) - 1)))]


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=60)
    args = parser.parse_args(argv)
    from playwright.sync_api import sync_playwright

    port = free_port()
    server = subprocess.Popen([sys.executable, "-m", "webapp", "serve", "--port", str(port)],
                              cwd=ROOT, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    try:
        url = f"http://localhost:{port}/"
        wait_until_answers(url, server, 90)
        with tempfile.TemporaryDirectory() as profile, sync_playwright() as playwright:
            context = playwright.chromium.launch_persistent_context(
                profile, executable_path=CHROMIUM, args=CHROMIUM_ARGS, headless=True,
                viewport={"width": 1366, "height": 768})
            page = context.new_page()
            page.goto(url)
            page.locator("[data-q=phiMn]").wait_for(timeout=60_000)
            page.evaluate(SETUP_JS)
            for _ in range(5):  # warm-up: first callbacks compile and cache
                page.evaluate(TYPED_JS, "4.0")
                page.evaluate(TYPED_JS, "3.16")
            typed = [page.evaluate(TYPED_JS, f"{2.0 + 0.05 * (i % 40):.2f}")
                     for i in range(args.runs)]
            slider = [page.evaluate(SLIDER_JS, "ArrowRight" if i % 2 == 0 else "ArrowLeft")
                      for i in range(args.runs)]
            context.close()
    finally:
        server.terminate()
        server.wait(timeout=10)
    print(f"Update latency, input change -> new φMn on screen ({args.runs} runs each, "
          f"Chromium headless, local Panel server):")
    for name, times in (("typed entry (As)", typed), ("slider step (f'c)", slider)):
        print(f"  {name:18s} median {statistics.median(times):6.1f} ms   "
              f"p95 {percentile(times, 0.95):6.1f} ms   max {max(times):6.1f} ms")
    return 0


if __name__ == "__main__":
    sys.exit(main())
