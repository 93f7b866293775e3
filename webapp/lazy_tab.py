"""A tab that follows the page's inputs but redraws only while it is shown.

A change of the inputs while another tab is open only marks the view stale;
opening its tab redraws it. So a tab that costs tens of milliseconds (the
calculation sheet, the moment–curvature response) adds nothing to a slider
drag on the Check tab.
"""

from __future__ import annotations

from collections.abc import Callable

import panel as pn
import param


class LazyTab:
    """Mixin for a view with `refresh()` and its layout in `_layout` (what the tab holds)."""

    _stale = True
    _visible: Callable[[], bool] = staticmethod(lambda: True)  # not in tabs: drawn on request

    def follow(self, source: param.Parameterized, tabs: pn.Tabs | None = None):
        """Redraw when any parameter of `source` changes, but only while shown in `tabs`."""
        names = [name for name in source.param if name != "name"]
        source.param.watch(self._source_changed, names)
        if tabs is not None:
            self._visible = lambda: (0 <= tabs.active < len(tabs.objects)
                                     and tabs.objects[tabs.active] is self._layout)
            tabs.param.watch(self._tab_changed, "active")
        return self

    def _source_changed(self, *events) -> None:
        self._stale = True
        if self._visible():
            self.refresh()

    def _tab_changed(self, event) -> None:
        if self._stale and self._visible():
            self.refresh()
