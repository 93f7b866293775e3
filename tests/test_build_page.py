"""The static page's pieces as text: values go into scripts as inert JSON, the worker's Python is valid.

No build here (tests/test_build.py builds the site): these check build_page's
own guarantees on small inputs.
"""

from __future__ import annotations

import ast
import json

import pytest

from webapp.build_page import PageError, app_code, script_json, static_page


def test_script_json_cannot_end_a_script_element():
    text = script_json({"cdn": "https://x.example/</script><script>alert(1)</script>", "s": "\u2028"})
    assert "<" not in text and "\u2028" not in text
    assert json.loads(text)["cdn"].endswith("</script>")


def test_the_workers_python_is_valid_with_top_level_await():
    code = app_code("print('app')")
    compile(code, "<worker>", "exec", flags=ast.PyCF_ALLOW_TOP_LEVEL_AWAIT)
    assert code.index("rhoscope_set_location(rs_location)") < code.index("print('app')")
    assert code.rstrip().endswith("await write_doc()")


def test_the_link_reaches_panels_location_even_when_panels_own_parsing_refuses_it():
    # Panel 1.9.4 parses a query's values with int() and raises for "²" (issue 10);
    # the page must still read the link (its own reader names the bad value).
    from bokeh.document import Document
    from panel.io.state import state
    from panel.util import edit_readonly

    from webapp.location_guard import page_location

    code = app_code("")
    function = code[code.index("def rhoscope_set_location"):code.index("init_doc()")]
    namespace = {"json": json, "edit_readonly": edit_readonly, "page_location": page_location}
    exec(function, namespace)  # panel.io.pyodide itself needs the browser's `js` module
    search = "?x=%C2%B2&units=us&fc=3000"
    state.curdoc = Document()
    try:
        namespace["rhoscope_set_location"](json.dumps({"search": search, "href": "http://h/" + search,
                                                      "ancestorOrigins": {}}))
        assert state.location.search == search
        assert state.location.query_params["x"] == "²"  # the page's location never refuses it
    finally:
        state.curdoc = None


def test_a_page_not_shaped_as_panel_writes_it_is_refused():
    with pytest.raises(PageError):
        static_page("<html><head></head><body></body></html>", worker="worker.js", pyodide="./pyodide/",
                    cdn="https://x.example/", service_worker="./service-worker.js")
