"""Which widget values the page sends the browser again once input settles (webapp.widget_sync).

The rule (issue 10.7, and a lost arrow key seen in CI): only a value the server
itself set can have crossed a person's change, so only those are sent again; a
value the browser sent is never sent back over a change the person may be making.
"""

from __future__ import annotations

from bokeh.document import Document
from bokeh.models import Slider

from webapp.widget_sync import ServerSetValues


class _Connection:
    """Stands in for the browser connection that Bokeh passes as `setter`."""


def _slider_in(document: Document) -> Slider:
    slider = Slider(start=0, end=40, value=21.5, step=0.25)
    document.add_root(slider)
    return slider


def test_a_value_the_server_sets_is_recorded():
    document = Document()
    slider = _slider_in(document)
    record = ServerSetValues.of(document)
    slider.value = 22.0  # set by server code: no setter
    assert slider.id in record.ids


def test_a_value_the_browser_sent_is_not_recorded():
    document = Document()
    slider = _slider_in(document)
    record = ServerSetValues.of(document)
    slider.update(value=21.75)  # noqa: a server change first, then cleared
    record.ids.clear()
    # What Bokeh does with a browser's patch: the property set with the connection as setter.
    slider.set_from_json("value", 22.0, setter=_Connection())
    assert slider.value == 22.0
    assert record.ids == set()


def test_other_properties_are_not_recorded():
    document = Document()
    slider = _slider_in(document)
    record = ServerSetValues.of(document)
    slider.end = 60  # a span, not a value: a re-send is never needed for it
    assert record.ids == set()


def test_one_record_per_document():
    document = Document()
    assert ServerSetValues.of(document) is ServerSetValues.of(document)
    assert ServerSetValues.of(Document()) is not ServerSetValues.of(document)
