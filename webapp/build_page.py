"""The static site's page, worker and service worker, written from webapp/static_site/.

`webapp.build` calls these with what it decided (file names, the packages to
load, the Pyodide CDN base); this module only assembles text. Every value it
puts into a script goes in as JSON (with "<" escaped, so no value can end a
<script> element), and the only text it puts into the page's markup is
`engine.CAUTION`, escaped.
"""

from __future__ import annotations

import json
import re
from html import escape
from pathlib import Path

import engine

SOURCES = Path(__file__).resolve().parent / "static_site"
VIEWPORT = '<meta name="viewport" content="width=device-width, initial-scale=1">'
NO_ICON = '<link rel="icon" href="data:,">'  # the site has no icon; this saves a request that fails'
BOOT_TIMEOUT_S = 60  # seconds without a first look before the page says the runtime did not load


class PageError(RuntimeError):
    """The converted page is not shaped as this module expects (a Panel upgrade changed it)."""


def script_json(value: object) -> str:
    """`value` as JSON that is safe inside a <script> element."""
    return (json.dumps(value, ensure_ascii=False).replace("<", "\\u003c")
            .replace("\u2028", "\\u2028").replace("\u2029", "\\u2029"))


def _fill(template: str, placeholder: str, value: object) -> str:
    if template.count(placeholder) != 1:
        raise PageError(f"{placeholder} must appear exactly once in the template")
    return template.replace(placeholder, script_json(value))


def app_code(app_source: str) -> str:
    """The Python the worker runs for the full page: Panel's document, the link applied first.

    Panel's own worker applies the page's address only after the page has
    rendered, so a link's page would first be built (and shown) with the
    default inputs. Here the address is given to the page's location
    (`webapp.location_guard`) before the app script runs, and the page reads
    the link while it is built.
    """
    return "\n".join([
        "import json",
        "from panel.io.pyodide import init_doc, write_doc",
        "from panel.util import edit_readonly",
        "from webapp.location_guard import page_location",
        "",
        "def rhoscope_set_location(text):",
        "    data = json.loads(text)",
        "    location = page_location()  # the page's own, which never refuses a query",
        "    if location is None:",
        "        return",
        "    try:",
        "        with edit_readonly(location):",
        "            location.param.update({k: v for k, v in data.items() if k in location.param})",
        "    except Exception:",
        "        pass  # Panel's own query parsing refused it; the page's reader names the problem",
        "",
        "init_doc()",
        "rhoscope_set_location(rs_location)",
        app_source,
        "await write_doc()",
    ])


def worker_script(*, pyodide: str, wheel: str, packages: list[str], remote: list[str],
                  cdn: str, app_source: str) -> str:
    """worker.js: the two-phase start (see static_site/worker.js).

    `packages` are what the full page loads (canonical names, as in the
    build's lock file); `remote` names those that come from the Pyodide CDN.
    """
    template = (SOURCES / "worker.js").read_text(encoding="utf-8")
    return _fill(template, "/*RHOSCOPE_CONFIG*/", {
        "pyodide": pyodide, "wheel": wheel, "packages": packages, "remote": remote, "cdn": cdn,
        "app": app_code(app_source)})


def service_worker_script(*, cache: str, files: list[str], cdn: str) -> str:
    """service-worker.js: the build's files (and the CDN's) for the next visit and offline."""
    template = (SOURCES / "service-worker.js").read_text(encoding="utf-8")
    return _fill(template, "/*RHOSCOPE_SW*/", {"cache": cache, "files": files, "cdn": cdn})


# The page scripts Panel puts in the head: BokehJS, Panel's bundle and the
# module shims. They load after the first look instead (boot.js).
_HEAD_SCRIPT = re.compile(r'\s*<script type="text/javascript" src="([^"]+)"></script>')
_LOG_LEVEL = re.compile(r'\s*<script type="text/javascript">\s*Bokeh\.set_log_level\("info"\);\s*</script>')
_STATUS_MARKUP = "loading_msg.innerHTML = msg.msg"


def static_page(html: str, *, worker: str, pyodide: str, cdn: str, service_worker: str) -> tuple[str, list[str]]:
    """The converted page made Rhoscope's; returns (page, the scripts moved out of its head).

    - no script in the head, and no loading overlay: the page paints its
      first-look frame at once;
    - the first-look frame (caution, status, empty slots) opens the body;
    - Panel's worker is replaced by `worker`, and its status text is set as text;
    - boot.js runs after Panel's page script and routes the worker's messages.
    """
    head, separator, body = html.partition("</head>")
    if not separator or "</head>" in body:
        raise PageError("the converted page does not have exactly one </head>")
    scripts = _HEAD_SCRIPT.findall(head)
    if not any("bokeh" in src for src in scripts) or not any(src.endswith("panel.min.js") for src in scripts):
        raise PageError("the converted page's head does not load BokehJS and Panel as expected")
    head = _HEAD_SCRIPT.sub("", head)
    head, count = _LOG_LEVEL.subn("", head)
    if count != 1:
        raise PageError("the converted page does not set Bokeh's log level exactly once")
    css = (SOURCES / "first_look.css").read_text(encoding="utf-8")
    if head.count('<meta charset="utf-8">') != 1:
        raise PageError("the converted page does not declare its charset exactly once")
    head = head.replace('<meta charset="utf-8">', f'<meta charset="utf-8">\n    {VIEWPORT}\n    {NO_ICON}')
    head += f"<style>\n{css}</style>\n"

    workers = re.findall(r'new Worker\("\./([^"]+\.js)"\)', body)
    if len(workers) != 1:
        raise PageError("the converted page does not start exactly one worker")
    body = body.replace(f'new Worker("./{workers[0]}")', f'new Worker("./{worker}")')
    if body.count(_STATUS_MARKUP) != 1:
        raise PageError("the converted page does not set its status message in one place")
    body = body.replace(_STATUS_MARKUP, "loading_msg.textContent = msg.msg")
    # Panel's loading overlay (class pn-loading) would veil the first look and stop the
    # page from scrolling; the first look's own status line says what is loading.
    body, count = re.subn(r'<body class="pn-loading pn-arc">', "<body>", body)
    if count != 1:
        raise PageError("the converted page's <body> is not the one Panel 1.9.4 writes")
    opening = re.search(r"<body>", body)
    if opening is None or "</body>" not in body:
        raise PageError("the converted page has no <body> element")
    frame = (SOURCES / "first_look.html").read_text(encoding="utf-8").replace(
        "{caution}", escape(engine.CAUTION))
    body = body[:opening.end()] + "\n" + frame + body[opening.end():]
    boot = _fill((SOURCES / "boot.js").read_text(encoding="utf-8"), "/*RHOSCOPE_PAGE*/", {
        "pageScripts": scripts, "pyodide": pyodide, "cdn": cdn, "serviceWorker": service_worker,
        "bootTimeoutS": BOOT_TIMEOUT_S})
    closing = body.rindex("</body>")
    body = body[:closing] + f"<script>\n{boot}</script>\n" + body[closing:]
    return head + separator + body, scripts
