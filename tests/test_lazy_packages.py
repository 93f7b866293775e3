"""A package one tab needs (segno, the sheet's QR code) loads when that tab first draws.

In the static site segno is not installed at start (webapp/build.py leaves
`lazy_packages.LAZY` out of the worker's first install); the sheet is drawn
without the code, segno is fetched, and the sheet is drawn again with it.
Here Pyodide's `loadPackage` is stood in for by a loader that makes segno
importable, exactly what the real one does.
"""

from __future__ import annotations

import asyncio
import sys
from concurrent.futures import ThreadPoolExecutor

from webapp import lazy_packages
from webapp.sheet_view import SheetView

B204 = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190)  # demo beam, Harbourline Depot
LINK = "http://localhost:5006/?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"


def test_outside_pyodide_nothing_is_fetched():
    assert lazy_packages.request("segno", lambda: None) is False


def test_the_sheet_gains_its_qr_code_once_segno_arrives(monkeypatch):
    import segno

    monkeypatch.setitem(sys.modules, "segno", None)  # as in the worker before the tab opens
    asked = []

    async def load_package(name):
        asked.append(name)
        monkeypatch.setitem(sys.modules, "segno", segno)  # what loadPackage makes importable

    async def scenario():
        monkeypatch.setattr(lazy_packages, "_pyodide_loader", lambda: load_package)
        view = SheetView(lambda: dict(B204), lambda: LINK)
        view.refresh()
        without = view.document
        for _ in range(5):
            await asyncio.sleep(0)
        return without, view.document

    # In a thread of its own: the browser tests keep an event loop running in the main thread.
    with ThreadPoolExecutor(max_workers=1) as pool:
        without, with_code = pool.submit(lambda: asyncio.run(scenario())).result()
    assert asked == ["segno"]
    # Drawn at once without the code (the section sketch is an SVG of its own, so the QR
    # code is told apart by the sheet's placeholder for it).
    assert 'class="no-qr"' in without and without.count("<svg") == 1
    assert 'class="no-qr"' not in with_code and with_code.count("<svg") == 2
