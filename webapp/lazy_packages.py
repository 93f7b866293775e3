"""Packages that one tab needs, loaded in the static site's worker when that tab first asks.

The static site's worker installs at start only what the page needs to open
(webapp/build.py). A package in `LAZY` stays in the build's lock file and is
fetched by `request` the first time a view wants it; the view draws without
it meanwhile and again once it is there. In CPython (the local server, the
tests) every package is installed already and `request` does nothing.
"""

from __future__ import annotations

import asyncio
import importlib
import sys
from collections.abc import Awaitable, Callable

LAZY = {"segno": "the calculation sheet's QR code, webapp/sheet_view.py"}

_loading: set[str] = set()


def _pyodide_loader() -> Callable[[str], Awaitable] | None:
    if sys.platform != "emscripten":
        return None
    import pyodide_js  # Pyodide's own JavaScript API, present only in its worker

    return pyodide_js.loadPackage


def request(package: str, then: Callable[[], None],
            loader: Callable[[str], Awaitable] | None = None) -> bool:
    """Start fetching `package`, and call `then()` once it imports; False where nothing can be fetched.

    `loader` is Pyodide's `loadPackage` by default (None outside Pyodide).
    A package already on its way is not asked for twice.
    """
    loader = loader or _pyodide_loader()
    if loader is None:
        return False
    if package in _loading:
        return True
    _loading.add(package)

    async def load() -> None:
        try:
            await loader(package)
        finally:
            _loading.discard(package)
        importlib.invalidate_caches()
        then()

    asyncio.ensure_future(load())
    return True
