"""The built static site in Chromium, offline: real Pyodide from build/, a shared link's first look.

The site is served from 127.0.0.1 by a plain static server, and Chromium
resolves no other host (--host-resolver-rules), so the Pyodide CDN is out of
reach as it is on a machine without internet: the first look must come up
from the build alone, and the page must say plainly that the interactive page
needs packages it could not fetch.

Every state of the page's text is recorded from the moment the document
exists (an init script with a MutationObserver), so a number or verdict that
flashed on screen for a moment is caught, not only what is there at the end.

References: engine.check (the numbers the first look must show, computed here
in CPython); the link's beam is over-reinforced by hand as well: ρ = 6/(10·15)
= 0.040 > ρb = 0.0214 for 3000 psi / Grade 60 (common practice: ρb =
0.85β1 f'c/fy · 87/(87+fy,ksi) = 0.85·0.85·3/60·87/147 = 0.0214).
"""

from __future__ import annotations

import math
import shutil
import subprocess
import sys
import tempfile
import urllib.parse

import pytest

import engine
from webapp.state import DEFAULTS
from webapp.summary import fmt

from conftest import CHROMIUM, CHROMIUM_ARGS, free_port, wait_until_answers

FAILING_LINK = dict(units="us", fc=3000, fy=60000, b=10, d=15, As=6, Mu=500)
BOOT_TIMEOUT_MS = 180_000  # a cold Pyodide start on a loaded 2-core machine
OFFLINE_ARGS = CHROMIUM_ARGS + ["--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1"]

RECORDER = """
(() => {
  const frames = window.__rsFrames = [];
  const record = () => {
    const result = document.getElementById("rs-fl-result");
    frames.push({t: performance.now(), text: document.body ? document.body.innerText : "",
                 result: result ? result.innerText : ""});
  };
  new MutationObserver(record).observe(document, {subtree: true, childList: true,
                                                  characterData: true, attributes: true});
  document.addEventListener("readystatechange", record);
})();
"""


def query(values: dict) -> str:
    return "?" + urllib.parse.urlencode(values)


@pytest.fixture
def serve_site(built_site):
    """Start `python -m http.server` on build/; returns (base URL, process); stopped afterwards."""
    started = []

    def start() -> tuple[str, subprocess.Popen]:
        port = free_port()
        process = subprocess.Popen([sys.executable, "-m", "http.server", str(port), "--bind", "127.0.0.1",
                                    "--directory", str(built_site)],
                                   stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        started.append(process)
        url = f"http://127.0.0.1:{port}/"
        wait_until_answers(url + "index.html", process, 30)
        return url, process

    yield start
    for process in started:
        process.terminate()
        process.wait(timeout=10)


@pytest.fixture
def offline_browser(playwright_driver):
    """Chromium that reaches 127.0.0.1 only, with a fresh profile per context."""
    made = []

    def context(width: int = 1366, height: int = 768):
        profile = tempfile.mkdtemp(prefix="rhoscope-static-")
        browser = playwright_driver.chromium.launch_persistent_context(
            profile, executable_path=CHROMIUM, args=OFFLINE_ARGS, headless=True,
            viewport={"width": width, "height": height})
        browser.add_init_script(RECORDER)
        made.append((browser, profile))
        return browser

    yield context
    for browser, profile in made:
        browser.close()
        shutil.rmtree(profile, ignore_errors=True)


def first_look_text(page) -> dict:
    """The first look's fields as a person reads them."""
    page.locator("#rs-fl-verdict-title").filter(has_not_text="—").wait_for(timeout=BOOT_TIMEOUT_MS)
    rows = page.locator("#rs-fl-quantities tr")
    quantities = {row.locator("td").nth(0).inner_text(): row.locator("td").nth(1).inner_text()
                  for row in rows.all()}
    return {"verdict": page.inner_text("#rs-fl-verdict-title"), "quantities": quantities,
            "messages": page.locator("#rs-fl-messages li").all_inner_texts(),
            "ratios": [r.locator("td").nth(0).inner_text() for r in page.locator("#rs-fl-ratios tr").all()]}


def phase_marks(page) -> dict:
    return dict(page.evaluate(
        "performance.getEntriesByType('mark').filter(m => m.name.startsWith('rhoscope:'))"
        ".map(m => [m.name, Math.round(m.startTime)])"))


def test_a_failing_beams_link_shows_its_own_check_first_and_never_the_default(
        serve_site, offline_browser, screenshots, capsys):
    url, _ = serve_site()
    context = offline_browser()
    page = context.new_page()
    page.goto(url + query(FAILING_LINK))
    look = first_look_text(page)

    expected = engine.check(**FAILING_LINK)
    assert look["verdict"] == "✘ Does not pass"
    shown = float(look["quantities"]["Design strength φMn"].replace(",", ""))
    assert math.isclose(shown, expected.phiMn, abs_tol=0.05)  # shown to 4 figures: 129.6
    assert look["quantities"]["Section class"] == "Compression-controlled"
    assert float(look["quantities"]["Net tensile strain εt"]) == pytest.approx(expected.state.eps_t, rel=1e-3)
    assert look["ratios"] == ["ρ", "ρmin", "ρtc", "ρ at εt = 0.004", "ρb"]
    assert "Caution." in page.inner_text("#rs-first-look")

    # Nothing of any other beam, from the first paint on: the default beam
    # (B-204) passes with its own φMn, and neither may ever have been on screen.
    default = engine.check(units="us", **DEFAULTS["us"])
    frames = page.evaluate("window.__rsFrames")
    assert frames, "the recorder saw no page state"
    for frame in frames:
        assert "Passes" not in frame["text"], frame
        assert fmt(default.phiMn) not in frame["text"], frame
    first_number = next(f for f in frames if "Does not pass" in f["text"])
    for frame in frames:
        if frame["t"] < first_number["t"]:
            assert not any(ch.isdigit() for ch in frame["result"]), frame

    # The CDN is out of reach: numpy cannot be fetched; the page says so and keeps the first look.
    notice = page.locator("#rs-fl-notice")
    notice.wait_for(state="visible", timeout=BOOT_TIMEOUT_MS)
    assert "numpy" in notice.inner_text() and "could not fetch" in notice.inner_text()
    # Only the CDN's packages failed: every wheel shipped in the build loaded (its sha256 checked).
    assert "from this site" not in notice.inner_text()
    assert page.inner_text("#rs-fl-verdict-title") == "✘ Does not pass"

    marks = phase_marks(page)
    with capsys.disabled():
        print(f"\nstatic site, offline, cold start: {marks} (ms from navigation); "
              f"first look {marks['rhoscope:first-look'] - marks['rhoscope:core-ready']} ms "
              "after the core was ready")
    assert marks["rhoscope:core-ready"] <= marks["rhoscope:first-look"]
    page.screenshot(path=str(screenshots / "static-first-look-1366.png"), full_page=True)

    for width, height in ((390, 844), (768, 1024), (1366, 768)):
        page.set_viewport_size({"width": width, "height": height})
        overflow = page.evaluate("document.documentElement.scrollWidth - document.documentElement.clientWidth")
        assert overflow <= 0, f"sideways scrolling at {width} px: {overflow} px too wide"
        clipped = page.evaluate("""[...document.querySelectorAll('#rs-first-look *')]
            .filter(e => e.offsetParent !== null && e.scrollWidth > e.clientWidth + 1
                         && getComputedStyle(e).overflowX !== 'visible')
            .map(e => e.id || e.tagName)""")
        assert clipped == [], f"clipped text at {width} px: {clipped}"
        page.screenshot(path=str(screenshots / f"static-first-look-{width}.png"), full_page=True)


def test_a_bad_or_hostile_link_is_named_and_shown_as_text(serve_site, offline_browser):
    url, _ = serve_site()
    context = offline_browser()
    page = context.new_page()
    hostile = '<img src=x onerror="window.__rsPwned=1">'
    page.goto(url + query(dict(FAILING_LINK, fc="4000x", b=hostile)))
    look = first_look_text(page)
    text = "\n".join(look["messages"])
    assert "fc: '4000x' is not accepted" in text
    assert hostile in text  # shown literally, as text
    assert page.evaluate("window.__rsPwned") is None
    assert page.locator("#rs-first-look img").count() == 0


def test_a_second_visit_opens_from_the_cache_with_the_server_gone(serve_site, offline_browser):
    url, server = serve_site()
    context = offline_browser()
    page = context.new_page()
    page.goto(url + query(FAILING_LINK))
    first_look_text(page)
    # The service worker registers after the first look and caches the whole build.
    cached = page.evaluate("""async () => {
        const registration = await navigator.serviceWorker.ready;
        for (let i = 0; i < 600; i++) {
          const names = await caches.keys();
          for (const name of names) {
            const keys = await (await caches.open(name)).keys();
            if (registration.active && keys.some(k => k.url.endsWith('pyodide.asm.wasm'))
                && keys.some(k => k.url.endsWith('/index.html'))) return names;
          }
          await new Promise(r => setTimeout(r, 100));
        }
        return [];
    }""")
    assert len(cached) == 1 and cached[0].startswith("rhoscope-"), cached
    server.terminate()
    server.wait(timeout=10)

    # A passing beam this time. By hand (Whitney block, 22.2.2): a = 1.5·60/(0.85·3·10) = 3.53 in,
    # φMn = 0.9·1.5·60·(15 − 3.53/2)/12 = 89.3 kip·ft ≥ Mu = 80; ρ = 0.010 between ρmin and ρtc.
    other = dict(FAILING_LINK, As=1.5, Mu=80)
    second = context.new_page()
    second.goto(url + query(other))
    look = first_look_text(second)
    assert look["verdict"] == "✔ Passes"
    shown = float(look["quantities"]["Design strength φMn"].replace(",", ""))
    assert math.isclose(shown, engine.check(**other).phiMn, abs_tol=0.05)
    assert shown == pytest.approx(89.3, abs=0.1)
