"""How a test (or the benchmark) drives the page: find inputs, type values, read results."""

from __future__ import annotations

from playwright.sync_api import Page, expect

BOOT_TIMEOUT_MS = 60_000  # first load: Panel's JS bundle and the first session
UPDATE_TIMEOUT_MS = 10_000


def open_app(page: Page, base_url: str, query: str = "") -> None:
    """Open the app (optionally with a share-link query) and wait until φMn shows."""
    page.goto(base_url + query)
    expect(page.locator("[data-q=phiMn]")).to_be_visible(timeout=BOOT_TIMEOUT_MS)


def entry(page: Page, field: str):
    """The typed entry of input `field` ("fc", "fy", "b", "d", "As", "Mu")."""
    return page.locator(f".rs-input-{field} input").first


def type_value(page: Page, field: str, value: str) -> None:
    """Type `value` into the entry of `field` and commit it with Enter."""
    box = entry(page, field)
    box.fill(value)
    box.press("Enter")


def shown(page: Page, name: str) -> str:
    """The text of the first result called `name` (data-q)."""
    return page.locator(f"[data-q={name}]").first.inner_text()


def shown_number(page: Page, name: str) -> float:
    return float(shown(page, name).replace(",", "").replace("−", "-"))


def wait_for_change(page: Page, name: str, old: str) -> str:
    """Wait until result `name` no longer reads `old`; return the new text."""
    expect(page.locator(f"[data-q={name}]").first).not_to_have_text(
        old, timeout=UPDATE_TIMEOUT_MS)
    return shown(page, name)


BOKEH_MODELS_JS = """
(kind) => {
  const doc = window.Bokeh.documents[0];
  return [...doc._all_models.values()].filter(m => m.type === kind).map(m => {
    const out = {name: m.name};
    if (kind === 'Span') { out.location = m.location; out.visible = m.visible; out.dimension = m.dimension; }
    if (kind === 'ColumnDataSource') { out.data = {};
      const entries = m.data instanceof Map ? [...m.data] : Object.entries(m.data);
      for (const [k, v] of entries) out.data[k] = Array.from(v); }
    return out;
  });
}
"""


def bokeh_models(page: Page, kind: str) -> list[dict]:
    """Bokeh models of type `kind` ("Span", "ColumnDataSource") in the page's document."""
    return page.evaluate(BOKEH_MODELS_JS, kind)


def open_tab(page: Page, title: str) -> None:
    """Show the results tab called `title` ("Check", "Size the bars", ...)."""
    page.locator(".bk-tab", has_text=title).first.click()


def source_data(page: Page, name: str) -> dict:
    """The columns of the ColumnDataSource called `name` in the page's document."""
    return next(s for s in bokeh_models(page, "ColumnDataSource") if s["name"] == name)["data"]
