"""Drive every tab and action of the page in CPython with some distributions absent.

    python tests/page_tour.py [--without-pyodide-http] DIST [DIST ...]

Each DIST's modules are made not installed (the import system finds nothing,
exactly as in a Pyodide worker that never loaded the package). The tour then
imports Panel's worker glue (panel.io.pyodide, with stand-ins for the browser
modules `js` and `pyodide`, and `pyodide_http`, which the worker loads) and
builds the page, renders it to Bokeh models, and uses every tab: the check
(a link with a T section, compression steel and a second layer; a unit switch),
Size the bars (an option put into the check), the calculation sheet (refresh,
QR code, download), the beam schedule (the demo file, checked and
downloaded) and Ductility (drawn for the link's section, then in SI). It
prints one JSON line {"attempted": [...]} naming every blocked module
something tried to import, and exits 0 when the tour finished.
"""

from __future__ import annotations

import asyncio
import importlib.machinery
import importlib.metadata
import json
import sys
import types
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent
# This checkout's packages, not whichever one the environment installed (an editable
# install of another worktree would otherwise be the one toured).
sys.path.insert(0, str(REPO))


def block(distributions: list[str]) -> list[str]:
    """Hide the top-level modules of `distributions`; returns the list that records attempts."""
    owners = importlib.metadata.packages_distributions()
    wanted = {name.lower().replace("_", "-") for name in distributions}
    hidden = {module for module, dists in owners.items()
              if any(d.lower().replace("_", "-") in wanted for d in dists)}
    attempted: list[str] = []
    path_finder = importlib.machinery.PathFinder.find_spec

    def find_spec(name, path=None, target=None):
        if name.split(".")[0] in hidden:
            attempted.append(name)
            return None
        return path_finder(name, path, target)

    importlib.machinery.PathFinder.find_spec = staticmethod(find_spec)
    return attempted


def browser_stand_ins(pyodide_http: bool = True) -> None:
    """Just enough of Pyodide's `js` and `pyodide` modules for panel.io.pyodide to import."""
    js = types.ModuleType("js")
    js.JSON = js.XMLHttpRequest = js.document = object()
    sys.modules["js"] = js
    pyodide = types.ModuleType("pyodide")
    for part in ("code", "ffi", "http"):
        module = types.ModuleType(f"pyodide.{part}")
        setattr(pyodide, part, module)
        sys.modules[f"pyodide.{part}"] = module
    pyodide.code.run_js = lambda source: None
    pyodide.ffi.jsnull = None
    sys.modules["pyodide"] = pyodide
    if pyodide_http:
        http = types.ModuleType("pyodide_http")  # the worker loads the real one (webapp/build.py)
        http.patch_all = lambda: None
        sys.modules["pyodide_http"] = http


def tour() -> None:
    import panel as pn
    import panel.io.pyodide  # noqa: F401 - the worker's glue, imported before the app

    from webapp.page import BeamCheckPage

    pn.extension(notifications=False)
    page = BeamCheckPage()
    page.__panel__().get_root()
    page.apply_link("?units=us&fc=5000&fy=60000&b=14&d=24&As=4.8&Mu=350&shape=T&bf=48&hf=5"
                    "&asc=0.88&dc=2.5&layer=1.2@20.5&h=27")
    view = page.size_bars
    view.update(page.inputs())
    passing = [i for i, option in enumerate(view.result.options or []) if option.ok]
    if passing:
        view.choice.value = passing[0]
        view.use_selected()
    page.sheet_view.refresh()
    page.sheet_view._download_file()
    schedule = (REPO / "tests" / "data" / "harbourline_schedule.csv").read_text(encoding="utf-8")
    asyncio.run(page.schedule_view.run(schedule))
    page.schedule_view._download_file()
    page.views.active = list(page.views._names).index("Ductility")  # the link above has h
    if page.ductility_view.results is None:
        raise SystemExit(f"the Ductility tab drew nothing: {page.ductility_view.message.object}")
    page.unit_switch.value = "si"
    page.views.active = len(page.views) - 1


def main(argv: list[str]) -> int:
    without_http = "--without-pyodide-http" in argv
    attempted = block([arg for arg in argv if not arg.startswith("--")] + (["pyodide-http"] if without_http else []))
    browser_stand_ins(pyodide_http=not without_http)
    tour()
    print(json.dumps({"attempted": sorted(set(attempted))}))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
