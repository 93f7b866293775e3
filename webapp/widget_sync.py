"""Send widgets' values to the browser again, whatever Panel believes the browser shows.

Panel sends a widget's value only when it changes on the server. When a person
changes a widget while the server's own change of it is on its way, each side
applies the other's message last: the server holds the person's value, the
browser shows the server's, and neither sends again (the drift of issue 10.7).
Re-sending the value, as a Bokeh change event of the property's current value,
closes that gap; the browser applies it like any other update.

Only a widget whose value the server itself set can have crossed the person's
change, so only those are sent again. Re-sending every widget would cross a
change the person is making right then: an arrow key pressed as the re-send
left moved the knob back a step and the next key went on from there (a key
press lost).
"""

from __future__ import annotations

import weakref

import panel as pn

# The Bokeh property that carries a Panel widget's value, by model.
_VALUE_PROPERTIES = ("value", "active")


class ServerSetValues:
    """The ids of the models in one Bokeh document whose value the server set.

    Every property change in a document goes through its callbacks'
    `notify_change`; a change the browser sent carries the connection as its
    `setter`, one made on the server carries none.
    """

    _by_document: weakref.WeakKeyDictionary = weakref.WeakKeyDictionary()

    def __init__(self, document) -> None:
        self.ids: set[str] = set()
        notify = document.callbacks.notify_change

        def recording(model, attr, old, new, hint=None, setter=None, callback_invoker=None):
            if setter is None and attr in _VALUE_PROPERTIES:
                self.ids.add(model.id)
            return notify(model, attr, old, new, hint, setter, callback_invoker)

        document.callbacks.notify_change = recording

    @classmethod
    def of(cls, document) -> ServerSetValues:
        """The record of `document`, started the first time it is asked for."""
        record = cls._by_document.get(document)
        if record is None:
            record = cls._by_document[document] = cls(document)
        return record


def _parts(widget) -> list:
    """`widget`, or the slider and entry an EditableFloatSlider is made of."""
    if isinstance(widget, pn.widgets.EditableFloatSlider):
        return [widget._slider, widget._value_edit]
    return [widget]


def resend_values(widgets) -> int:
    """Re-send each widget model's value that the server set since the last re-send.

    Returns the number of values sent.
    """
    sent = 0
    for widget in widgets:
        for part in _parts(widget):
            for model, _ in list(getattr(part, "_models", {}).values()):
                document = model.document
                if document is None:
                    continue
                record = ServerSetValues.of(document)
                if model.id not in record.ids:
                    continue
                for name in _VALUE_PROPERTIES:
                    if name in model.properties():
                        current = getattr(model, name)
                        document.callbacks.notify_change(model, name, current, current)
                        sent += 1
                # After the re-send: the re-send itself is recorded as a server change.
                record.ids.discard(model.id)
    return sent
