"""Release a closed session's JavaScript callbacks, which Panel itself keeps for ever.

Panel records every `jscallback`/`js_on_click` in `panel.links.Callback.registry`,
a WeakKeyDictionary keyed by the source widget whose value (the callbacks) holds
the widget again (and, for EditableFloatSlider, its slider and so the whole
page). The key can then never be freed: each closed session kept its page, about
2.8 MB on the local server. When a session ends, the entries of widgets that are
shown nowhere any more are dropped.
"""

from __future__ import annotations

from panel.links import Callback


def forget_unshown_callbacks(session_context) -> int:
    """Drop registry entries of widgets with no model left; the number dropped."""
    gone = [source for source in list(Callback.registry.keys())
            if not getattr(source, "_models", None)]
    for source in gone:
        Callback.registry.pop(source, None)
    return len(gone)
