"""Send widgets' values to the browser again, whatever Panel believes the browser shows.

Panel sends a widget's value only when it changes on the server. When a person
changes a widget while the server's own change of it is on its way, each side
applies the other's message last: the server holds the person's value, the
browser shows the server's, and neither sends again (the drift of issue 10.7).
Re-sending the value, as a Bokeh change event of the property's current value,
closes that gap; the browser applies it like any other update.
"""

from __future__ import annotations

import panel as pn

# The Bokeh property that carries a Panel widget's value, by model.
_VALUE_PROPERTIES = ("value", "active")


def _parts(widget) -> list:
    """`widget`, or the slider and entry an EditableFloatSlider is made of."""
    if isinstance(widget, pn.widgets.EditableFloatSlider):
        return [widget._slider, widget._value_edit]
    return [widget]


def resend_values(widgets) -> int:
    """Re-send the value of each widget's Bokeh models to the browser; the number sent."""
    sent = 0
    for widget in widgets:
        for part in _parts(widget):
            for model, _ in list(getattr(part, "_models", {}).values()):
                document = model.document
                if document is None:
                    continue
                for name in _VALUE_PROPERTIES:
                    if name in model.properties():
                        current = getattr(model, name)
                        document.callbacks.notify_change(model, name, current, current)
                        sent += 1
    return sent
