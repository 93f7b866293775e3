import pytest
from app_driver import open_app
from test_browser_widths import LINK, browser  # noqa
pytestmark = pytest.mark.browser
PROBE = """
(width) => { const out=[]; const walk=(root,depth)=>{ for (const el of root.querySelectorAll('*')) {
 if (el.shadowRoot) walk(el.shadowRoot, depth+1);
 const r=el.getBoundingClientRect(); if (r.right>width+1 && r.width>0) out.push(`${el.tagName}.${el.className} w=${Math.round(r.width)} right=${Math.round(r.right)} minw=${getComputedStyle(el).minWidth} style=${(el.getAttribute('style')||'').slice(0,80)}`);}};
 walk(document,0); return out.slice(0,40);}
"""
def test_probe(browser, app_url):
    context = browser.new_context(viewport={"width": 390, "height": 844}, is_mobile=True, has_touch=True)
    page = context.new_page(); open_app(page, app_url, LINK); page.wait_for_timeout(1500)
    print("\n".join(page.evaluate(PROBE, 390)))
    print("IW", page.evaluate("window.innerWidth"), page.evaluate("document.documentElement.scrollWidth"))
    assert False
