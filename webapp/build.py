"""`python -m webapp build --out DIR`: the static site, run in the browser by Pyodide.

Steps, each checked (a failed step stops the build with a message, never a
half-written site that looks complete):

1. `panel convert webapp/app.py --to pyodide-worker` writes app.html and its
   web worker app.js. The page becomes index.html and the worker worker.js.
2. The project ships as a wheel built from this repository (engine/ and
   webapp/, nothing else), in DIR/wheels/.
3. Every other file obtainable from PyPI or npm lives in DIR too and is loaded
   by relative URL: Panel's and Bokeh's JS and CSS (copied from the installed
   packages) and the pure-Python wheels the app needs that the Pyodide
   distribution lacks (downloaded from PyPI at the versions installed here;
   Panel's and Bokeh's slimmed of the JS bundles the page already loads).
   Only the Pyodide distribution itself comes from its CDN, whose base URL is
   a build option.
4. The worker's package install is written by this build, not inferred by
   Panel: Panel's import inference would send `engine` and `webapp` to PyPI,
   where they do not exist. The list is the closure of Panel's, Bokeh's and
   the app's requirements, resolved against the pinned Pyodide distribution's
   lock file (tests/pyodide/node_modules/pyodide/pyodide-lock.json): a
   requirement that Pyodide provides at a satisfying version is loaded from
   the Pyodide CDN by name, any other is a wheel in DIR/wheels/. micropip runs
   with deps=False, so nothing is ever fetched from PyPI at run time.
5. URLs that BokehJS builds at run time for features the app does not use (the
   unpinned tabler icon font, MathJax) are rewritten inside the shipped JS to
   stand-ins in DIR; no page, worker, JS or CSS file may then name a CDN but
   the Pyodide base. index.html gets a small boot watch: if the worker fails
   or nothing has rendered after 60 s, it says so in plain text.

All URLs are relative, so DIR works from any sub-path of any static host.
"""

from __future__ import annotations

import ast
import base64
import gzip
import hashlib
import importlib.metadata as metadata
import io
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile
import zipfile
from dataclasses import dataclass, field
from pathlib import Path

from packaging.markers import default_environment
from packaging.requirements import Requirement
from packaging.utils import canonicalize_name
from packaging.version import Version

PANEL_VERSION = "1.9.4"
BOKEH_VERSION = "3.9.2"
PYODIDE_VERSION = "0.29.3"  # what panel 1.9.4's panel/io/convert.py loads (PYODIDE_VERSION)
DEFAULT_PYODIDE_CDN = f"https://cdn.jsdelivr.net/pyodide/v{PYODIDE_VERSION}/full/"

REPO = Path(__file__).resolve().parent.parent
APP = REPO / "webapp" / "app.py"
PYODIDE_LOCK = REPO / "tests" / "pyodide" / "node_modules" / "pyodide" / "pyodide-lock.json"

PAGE = "index.html"
WORKER = "worker.js"
WHEELS = "wheels"
# Panel builds its resource URLs as PANEL_CDN_ROOT + "<version>/dist/", both while
# converting (in CPython) and at run time in the worker, so one relative root
# makes every Panel URL, including those computed later in the worker, local.
PANEL_ROOT = "./static/panel/"
PANEL_DIST = f"{PANEL_ROOT}{PANEL_VERSION}/dist/"
BOKEH_STATIC = "./static/bokeh/"
BOKEH_CDN = "https://cdn.bokeh.org/bokeh/release/"
PANEL_CDN_DIST = f"https://cdn.holoviz.org/panel/{PANEL_VERSION}/dist/"

# Panel's stylesheets are chosen at run time by the components a page shows;
# these folders hold every one Panel can name, so all are shipped (small).
PANEL_RUNTIME_DIRS = ("css", "assets", "bundled/theme")

# Panel 1.9.4 lists panel-material-ui as a requirement but never imports it; it is
# shipped only when the app itself imports it.
UNUSED_REQUIREMENTS = {"panel": {"panel-material-ui"}}

MARKER = ".rhoscope-build"


class BuildError(RuntimeError):
    """A build step failed; the message says which and what to do."""


@dataclass
class Plan:
    """What the worker installs: wheel files shipped in DIR, and Pyodide packages by name."""

    wheels: dict[str, str] = field(default_factory=dict)  # canonical name -> version
    pyodide: dict[str, str] = field(default_factory=dict)  # canonical name -> lock version
    why: dict[str, str] = field(default_factory=dict)  # canonical name -> who required it


def build(out: str = "build", pyodide_cdn: str | None = None, app: str | os.PathLike | None = None) -> int:
    """Write the static site into `out`; return a process exit status (0 on success)."""
    try:
        summary = _build(Path(out), _cdn_base(pyodide_cdn or DEFAULT_PYODIDE_CDN), Path(app or APP))
    except BuildError as error:
        print(f"python -m webapp build: {error}", file=sys.stderr)
        return 1
    print(summary)
    return 0


def _cdn_base(url: str) -> str:
    # The base goes into JavaScript string literals and an importScripts call.
    if not re.fullmatch(r"(https?://|\.{0,2}/)[A-Za-z0-9._~:/@%+=,-]+", url):
        raise BuildError(f"--pyodide-cdn: {url!r} is not accepted; expected an http(s) URL or a path "
                         "without spaces or quotes, e.g. https://cdn.jsdelivr.net/pyodide/v0.29.3/full/")
    return url if url.endswith("/") else url + "/"


def _build(out: Path, cdn: str, app: Path) -> str:
    _check_versions()
    if not app.is_file():
        raise BuildError(f"the app script {app} does not exist")
    lock = _pyodide_lock()
    _prepare_out(out)
    with tempfile.TemporaryDirectory(prefix="rhoscope-build-") as scratch:
        scratch = Path(scratch)
        project_wheel = _project_wheel(scratch / "project")
        plan = _plan(app, lock)
        downloads = _download(plan, scratch / "downloads")
        wheel_dir = out / WHEELS
        wheel_dir.mkdir(parents=True)
        shipped = [shutil.copy2(project_wheel, wheel_dir / project_wheel.name)]
        for name, path in downloads.items():
            target = wheel_dir / path.name
            if name in ("panel", "bokeh"):
                _slim_wheel(path, target, _panel_keeps if name == "panel" else _bokeh_keeps)
            else:
                shutil.copy2(path, target)
            shipped.append(target)
        html, worker = _convert(app, scratch / "converted")
    html = _local_page(html, out)
    worker = _local_worker(worker, cdn, [f"./{WHEELS}/{Path(p).name}" for p in shipped], plan)
    (out / PAGE).write_text(html, encoding="utf-8")
    (out / WORKER).write_text(worker, encoding="utf-8")
    _copy_panel_runtime(out)
    _local_runtime_urls(out)
    (out / PAGE).write_text(_with_boot_watch(html, cdn), encoding="utf-8")
    _refuse_remote(out, cdn)
    return _report(out, plan, cdn)


def _check_versions() -> None:
    from panel.io import convert

    found = {"panel": metadata.version("panel"), "bokeh": metadata.version("bokeh"),
             "pyodide (panel convert)": convert.PYODIDE_VERSION}
    wanted = {"panel": PANEL_VERSION, "bokeh": BOKEH_VERSION, "pyodide (panel convert)": f"v{PYODIDE_VERSION}"}
    wrong = [f"{k} {found[k]} (expected {wanted[k]})" for k in wanted if found[k] != wanted[k]]
    if wrong:
        raise BuildError("installed versions differ from the ones this build pins: " + ", ".join(wrong)
                         + "; update webapp/build.py, pyproject.toml and tests/pyodide/package.json together")


def _pyodide_lock() -> dict:
    if not PYODIDE_LOCK.is_file():
        raise BuildError(f"{PYODIDE_LOCK} is missing; run `npm ci --prefix tests/pyodide` "
                         "(or `make build`) to install the pinned Pyodide package")
    package = json.loads((PYODIDE_LOCK.parent / "package.json").read_text(encoding="utf-8"))
    if package["version"] != PYODIDE_VERSION:
        raise BuildError(f"tests/pyodide holds pyodide {package['version']}, the build pins {PYODIDE_VERSION}")
    return json.loads(PYODIDE_LOCK.read_text(encoding="utf-8"))


def _prepare_out(out: Path) -> None:
    # Only ever delete a folder this build wrote (it carries the marker file).
    if out.exists():
        if not out.is_dir():
            raise BuildError(f"--out {out} exists and is not a folder")
        if any(out.iterdir()) and not (out / MARKER).is_file():
            raise BuildError(f"--out {out} is not empty and was not written by this build; "
                             "choose an empty or new folder")
        shutil.rmtree(out)
    out.mkdir(parents=True)
    (out / MARKER).write_text("written by `python -m webapp build`; safe to delete\n", encoding="utf-8")


def _project_wheel(work: Path) -> Path:
    """Build the rhoscope wheel from a clean copy of the sources (no stray build/ folder in the repo)."""
    source = work / "src"
    source.mkdir(parents=True)
    for name in ("pyproject.toml", "LICENSE", "README.md"):
        if (REPO / name).is_file():
            shutil.copy2(REPO / name, source / name)
    ignore = shutil.ignore_patterns("__pycache__", "*.pyc", "*.egg-info")
    for package in ("engine", "webapp"):
        shutil.copytree(REPO / package, source / package, ignore=ignore)
    command = [sys.executable, "-m", "pip", "wheel", str(source), "--no-deps", "--quiet", "-w", str(work)]
    if _setuptools_recent():
        command.insert(4, "--no-build-isolation")
    done = subprocess.run(command, capture_output=True, text=True)
    wheels = sorted(work.glob("rhoscope-*.whl"))
    if done.returncode != 0 or len(wheels) != 1:
        raise BuildError(f"building the rhoscope wheel failed:\n{done.stdout}{done.stderr}")
    return wheels[0]


def _setuptools_recent() -> bool:
    try:
        return Version(metadata.version("setuptools")) >= Version("77")
    except metadata.PackageNotFoundError:
        return False


def _emscripten_environment(lock: dict) -> dict[str, str]:
    python = lock["info"]["python"]
    environment = dict(default_environment())
    environment.update(sys_platform="emscripten", platform_system="Emscripten", os_name="posix",
                       platform_machine="wasm32", implementation_name="cpython",
                       platform_python_implementation="CPython", python_full_version=python,
                       python_version=".".join(python.split(".")[:2]), extra="")
    return environment


def _third_party_imports(app: Path) -> set[str]:
    """Distributions imported by the app script and the webapp package (AST, not execution)."""
    modules: set[str] = set()
    sources = [app, *sorted((REPO / "webapp").glob("*.py"))]
    for source in sources:
        tree = ast.parse(source.read_text(encoding="utf-8"), filename=str(source))
        for node in ast.walk(tree):
            if isinstance(node, ast.Import):
                modules.update(alias.name.split(".")[0] for alias in node.names)
            elif isinstance(node, ast.ImportFrom) and node.level == 0 and node.module:
                modules.add(node.module.split(".")[0])
    ours = {"engine", "webapp", "__future__"}
    distributions = metadata.packages_distributions()
    found: set[str] = set()
    for module in sorted(modules - ours - set(sys.stdlib_module_names)):
        names = distributions.get(module)
        if not names:
            raise BuildError(f"the app imports {module!r}, which no installed distribution provides; "
                             "add it to pyproject.toml's web extra and install it")
        found.update(canonicalize_name(n) for n in names)
    return found


def _plan(app: Path, lock: dict) -> Plan:
    packages = {canonicalize_name(k): v for k, v in lock["packages"].items()}
    environment = _emscripten_environment(lock)
    plan = Plan()
    imported = _third_party_imports(app)
    pending = [(Requirement(f"panel=={PANEL_VERSION}"), "the app"), (Requirement(f"bokeh=={BOKEH_VERSION}"), "the app")]
    pending += [(Requirement(name), "an import in webapp/") for name in sorted(imported)]
    while pending:
        requirement, by = pending.pop(0)
        name = canonicalize_name(requirement.name)
        if requirement.marker is not None and not requirement.marker.evaluate(environment):
            continue
        if name in UNUSED_REQUIREMENTS.get(canonicalize_name(by.split()[0]), ()) and name not in imported:
            continue
        chosen = plan.wheels.get(name) or plan.pyodide.get(name)
        if chosen is not None:
            if not requirement.specifier.contains(chosen, prereleases=True):
                raise BuildError(f"{by} needs {requirement}, but the plan already holds {name} {chosen}")
            continue
        in_lock = packages.get(name)
        if (in_lock and name not in ("panel", "bokeh")
                and requirement.specifier.contains(in_lock["version"], prereleases=True)):
            plan.pyodide[name] = in_lock["version"]
            plan.why[name] = by
            continue  # Pyodide's loadPackage brings the lock's own dependencies
        try:
            version = metadata.version(name)
        except metadata.PackageNotFoundError:
            raise BuildError(f"{by} needs {requirement}, which Pyodide {PYODIDE_VERSION} does not provide "
                             "and which is not installed here; pip install it") from None
        if not requirement.specifier.contains(version, prereleases=True):
            raise BuildError(f"{by} needs {requirement}; installed {name} is {version}")
        plan.wheels[name] = version
        plan.why[name] = by
        for line in metadata.requires(name) or []:
            pending.append((Requirement(line), f"{name} {version}"))
    return plan


def _download(plan: Plan, target: Path) -> dict[str, Path]:
    pins = [f"{name}=={version}" for name, version in sorted(plan.wheels.items())]
    command = [sys.executable, "-m", "pip", "download", "--no-deps", "--only-binary=:all:", "--quiet",
               "--disable-pip-version-check", "-d", str(target), *pins]
    done = subprocess.run(command, capture_output=True, text=True)
    if done.returncode != 0:
        raise BuildError(f"downloading wheels from PyPI failed:\n{done.stdout}{done.stderr}")
    found: dict[str, Path] = {}
    for path in target.glob("*.whl"):
        name = canonicalize_name(path.name.split("-")[0])
        if not path.name.endswith("-none-any.whl"):
            raise BuildError(f"{path.name} is not a pure-Python wheel; Pyodide cannot install it")
        found[name] = path
    missing = sorted(set(plan.wheels) - set(found))
    if missing:
        raise BuildError(f"pip download did not produce wheels for: {', '.join(missing)}")
    return found


def _panel_keeps(name: str) -> bool:
    # The page loads Panel's JS and CSS from DIR/static; the Python side in the
    # worker only needs panel/dist/css (read for inlined loading styles).
    if name.startswith("panel/dist/"):
        return name.startswith("panel/dist/css/")
    if name.startswith("panel/tests/") or name in ("panel/package.json", "panel/package-lock.json"):
        return False
    return not name.endswith((".ts", ".tsx", ".less", ".js.map"))


def _bokeh_keeps(name: str) -> bool:
    # bokeh/server/static holds BokehJS, which the page loads from DIR/static/bokeh.
    return not name.startswith("bokeh/server/static/")


def _slim_wheel(source: Path, target: Path, keeps) -> None:
    """Copy a wheel without the files `keeps` rejects; RECORD lists only what remains."""
    with zipfile.ZipFile(source) as wheel_in, zipfile.ZipFile(target, "w", zipfile.ZIP_DEFLATED) as wheel_out:
        record_name = next(n for n in wheel_in.namelist() if n.endswith(".dist-info/RECORD"))
        kept = [info for info in wheel_in.infolist() if info.filename != record_name and keeps(info.filename)]
        lines = []
        for info in kept:
            data = wheel_in.read(info)
            wheel_out.writestr(info, data, compress_type=zipfile.ZIP_DEFLATED, compresslevel=9)
            digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
            lines.append(f"{info.filename},sha256={digest},{len(data)}")
        lines.append(f"{record_name},,")
        wheel_out.writestr(record_name, "\n".join(lines) + "\n")


def _convert(app: Path, work: Path) -> tuple[str, str]:
    work.mkdir(parents=True)
    # An explicit requirements file stops Panel inferring requirements from the
    # imports; the worker's real install list is written by _local_worker.
    requirements = work / "requirements.txt"
    requirements.write_text("# installs are written by webapp/build.py\n", encoding="utf-8")
    env = dict(os.environ, PANEL_CDN_ROOT=PANEL_ROOT, PYTHONPATH=os.pathsep.join(
        [str(REPO), *filter(None, [os.environ.get("PYTHONPATH")])]))
    command = [sys.executable, "-m", "panel", "convert", str(app), "--to", "pyodide-worker",
               "--out", str(work), "--requirements", str(requirements), "--disable-http-patch"]
    done = subprocess.run(command, capture_output=True, text=True, env=env, cwd=REPO)
    html_path, worker_path = work / f"{app.stem}.html", work / f"{app.stem}.js"
    if done.returncode != 0 or not html_path.is_file() or not worker_path.is_file():
        raise BuildError(f"panel convert failed:\n{done.stdout}{done.stderr}")
    return html_path.read_text(encoding="utf-8"), worker_path.read_text(encoding="utf-8")


def _local_page(html: str, out: Path) -> str:
    """Point the page at DIR: its worker, BokehJS and Panel's files, all relative."""
    worker_ref = re.findall(r'new Worker\("\./([^"]+\.js)"\)', html)
    if len(worker_ref) != 1:
        raise BuildError("the converted page does not start exactly one worker")
    html = html.replace(f'new Worker("./{worker_ref[0]}")', f'new Worker("./{WORKER}")')

    def bokeh_local(match: re.Match) -> str:
        bundle, version = match.group(1), match.group(2)
        if version != BOKEH_VERSION:
            raise BuildError(f"the page asks for BokehJS {version}, Bokeh {BOKEH_VERSION} is installed")
        source = _bokeh_js_dir() / f"{bundle}.min.js"
        if not source.is_file():
            raise BuildError(f"BokehJS bundle {source.name} is not in the installed bokeh package")
        name = f"{bundle}-{version}.min.js"
        _copy(source, out / BOKEH_STATIC / name)
        return f"{BOKEH_STATIC}{name}"

    html = re.sub(re.escape(BOKEH_CDN) + r"(bokeh(?:-[a-z]+)?)-(\d+\.\d+\.\d+)\.min\.js", bokeh_local, html)
    for reference in sorted(set(re.findall(re.escape(PANEL_DIST) + r"([^\"'?#\s)]+)", html))):
        source = _panel_dist_dir() / reference
        if not source.is_file():
            raise BuildError(f"the page loads {PANEL_DIST}{reference}, which the installed panel lacks")
        _copy(source, out / PANEL_DIST / reference)
    return html


def _local_worker(worker: str, cdn: str, wheel_urls: list[str], plan: Plan) -> str:
    """Load Pyodide from `cdn`; install the shipped wheels and Pyodide's own packages, nothing from PyPI."""
    default_js = f"https://cdn.jsdelivr.net/pyodide/v{PYODIDE_VERSION}/full/pyodide.js"
    if worker.count(f'importScripts("{default_js}");') != 1:
        raise BuildError(f"the converted worker does not import {default_js} exactly once")
    worker = worker.replace(f'importScripts("{default_js}");', f"importScripts({json.dumps(cdn + 'pyodide.js')});")
    if worker.count("await loadPyodide();") != 1:
        raise BuildError("the converted worker does not call loadPyodide() exactly once")
    # PANEL_CDN_ROOT must be set before panel is first imported in the worker.
    set_root = ("self.pyodide.runPython(" + json.dumps(
        f"import os; os.environ['PANEL_CDN_ROOT'] = {PANEL_ROOT!r}") + ");")
    worker = worker.replace("await loadPyodide();",
                            f"await loadPyodide({{indexURL: {json.dumps(cdn)}}});\n  {set_root}")
    install = re.findall(r"await micropip\.install\(\[[^\]]*\]\);", worker)
    if len(install) != 1:
        raise BuildError("the converted worker does not hold exactly one micropip.install call")
    names = [*wheel_urls, *sorted(plan.pyodide)]
    worker = worker.replace(install[0], f"await micropip.install({_py_list(names)}, deps=False);")
    return worker


def _py_list(items: list[str]) -> str:
    # The install runs as Python inside a JS template literal: plain quoted names only.
    for item in items:
        if not re.fullmatch(r"[A-Za-z0-9._/+-]+", item):
            raise BuildError(f"refusing an install name with unexpected characters: {item!r}")
    return "[" + ", ".join(f"'{item}'" for item in items) + "]"


def _copy_panel_runtime(out: Path) -> None:
    dist = _panel_dist_dir()
    for folder in PANEL_RUNTIME_DIRS:
        shutil.copytree(dist / folder, out / PANEL_DIST / folder, dirs_exist_ok=True,
                        ignore=shutil.ignore_patterns("*.map", "logo"))


# URLs that BokehJS builds at run time for optional features. The tabler icon
# font (for widget icons; the app shows none) would come unpinned from @latest,
# MathJax only for LaTeX labels (the app has none): both point into the build
# instead, at a stand-in that loads nothing from elsewhere.
RUNTIME_URLS = {
    "https://cdn.jsdelivr.net/npm/@tabler/icons-webfont@latest": "./static/unshipped/tabler",
    "https://cdn.jsdelivr.net/npm/mathjax@3/es5/tex-svg.js": "./static/unshipped/mathjax.js",
}
STAND_INS = {
    "static/unshipped/tabler/tabler-icons.min.css":
        "/* Rhoscope's build ships no icon font; its widgets use no icons. */\n",
    "static/unshipped/mathjax.js":
        "console.warn('Rhoscope\\'s build does not ship MathJax; no label needs it.');\n",
}
BOOT_TIMEOUT_S = 60


def _local_runtime_urls(out: Path) -> None:
    """Rewrite `RUNTIME_URLS` inside the shipped JS and CSS; write their stand-ins."""
    for path in sorted((out / "static").rglob("*")):
        if path.suffix not in (".js", ".css") or not path.is_file():
            continue
        text = path.read_text(encoding="utf-8")
        changed = text
        for remote, local in RUNTIME_URLS.items():
            changed = changed.replace(remote, local)
        if changed != text:
            path.write_text(changed, encoding="utf-8")
    for name, text in STAND_INS.items():
        target = out / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_text(text, encoding="utf-8")


BOOT_WATCH_JS = """<script>
(function () {
  // Rhoscope's own boot watch: a plain-text notice if the worker fails or the
  // app has not rendered after a while (e.g. the Pyodide CDN is unreachable).
  var base = %(base)s, seconds = %(seconds)d, shown = false;
  function started() { return document.body && !document.body.classList.contains('pn-loading'); }
  function show(detail) {
    if (shown || started()) return;
    shown = true;
    var box = document.createElement('div');
    box.id = 'rs-boot-failure';
    box.setAttribute('role', 'alert');
    box.style.cssText = 'position:fixed;top:12px;left:12px;right:12px;z-index:10000;' +
      'padding:12px 16px;background:#fff;color:#1c2b33;border:2px solid #b3261e;' +
      'border-radius:6px;font:15px/1.4 sans-serif;white-space:pre-wrap;';
    box.textContent = 'Rhoscope could not start: the Pyodide runtime did not load from ' + base +
      (detail ? ' (' + detail + ')' : '') + '. Check that this network can reach it, or use ' +
      'a build with --pyodide-cdn pointing at a reachable copy.';
    document.body.appendChild(box);
  }
  var Native = window.Worker;
  if (Native) {
    var Watched = function (url, options) {
      var worker = new Native(url, options);
      worker.addEventListener('error', function (event) {
        show('worker error' + (event && event.message ? ': ' + event.message : ''));
      });
      return worker;
    };
    Watched.prototype = Native.prototype;
    window.Worker = Watched;
  }
  setTimeout(function () { show('nothing started within ' + seconds + ' s'); }, seconds * 1000);
})();
</script>
"""


def _with_boot_watch(html: str, cdn: str) -> str:
    """`html` with `BOOT_WATCH_JS` at the end of its head (before the worker starts)."""
    if html.count("</head>") != 1:
        raise BuildError("the converted page does not have exactly one </head>")
    base = json.dumps(cdn).replace("<", "\\u003c")
    script = BOOT_WATCH_JS % {"base": base, "seconds": BOOT_TIMEOUT_S}
    return html.replace("</head>", script + "</head>")


# Hosts that serve code, styles or fonts: the build may load from none of them
# except the Pyodide base.
REMOTE_CODE_HOSTS = ("cdn.jsdelivr.net", "cdn.holoviz.org", "cdn.bokeh.org", "unpkg.com",
                     "cdnjs.cloudflare.com", "fonts.googleapis.com", "fonts.gstatic.com",
                     "pypi.org", "files.pythonhosted.org")


def _refuse_remote(out: Path, cdn: str) -> None:
    """No page, worker, JS or CSS file of the build may load from a CDN but Pyodide's base."""
    offenders = []
    paths = [out / PAGE, out / WORKER] + sorted(
        p for p in (out / "static").rglob("*") if p.suffix in (".js", ".css") and p.is_file())
    for path in paths:
        text = path.read_text(encoding="utf-8")
        for url in remote_code_urls(text):
            if not url.startswith(cdn):
                offenders.append(f"{path.relative_to(out)} still loads {url}")
    if offenders:
        raise BuildError("; ".join(offenders))


def remote_code_urls(text: str) -> list[str]:
    """Absolute URLs in `text` on one of `REMOTE_CODE_HOSTS` (scheme-relative ones too)."""
    hosts = "|".join(re.escape(host) for host in REMOTE_CODE_HOSTS)
    return re.findall(r"(?:https?:)?//(?:[a-z0-9-]+\.)*(?:" + hosts + r")[^\"'`\s)]*", text)


def _panel_dist_dir() -> Path:
    import panel

    return Path(panel.__file__).parent / "dist"


def _bokeh_js_dir() -> Path:
    import bokeh

    return Path(bokeh.__file__).parent / "server" / "static" / "js"


def _copy(source: Path, target: Path) -> None:
    target.parent.mkdir(parents=True, exist_ok=True)
    shutil.copy2(source, target)


def measure(out: Path) -> tuple[int, int, int]:
    """(files, bytes on disk, bytes gzip-compressed at level 6 as a static host would serve them)."""
    files = raw = compressed = 0
    for path in sorted(p for p in out.rglob("*") if p.is_file() and p.name != MARKER):
        data = path.read_bytes()
        files += 1
        raw += len(data)
        # Wheels are zip files already; hosts do not gzip them again.
        compressed += len(data) if path.suffix == ".whl" else len(gzip.compress(data, 6))
    return files, raw, compressed


def _report(out: Path, plan: Plan, cdn: str) -> str:
    files, raw, compressed = measure(out)
    buffer = io.StringIO()
    print(f"Wrote {out}/ ({files} files, {raw / 1e6:.2f} MB on disk, {compressed / 1e6:.2f} MB as fetched "
          "with gzip)", file=buffer)
    print(f"  page {PAGE}, worker {WORKER}; Pyodide {PYODIDE_VERSION} from {cdn}", file=buffer)
    print("  wheels shipped: " + ", ".join(f"{n} {v}" for n, v in sorted(plan.wheels.items())), file=buffer)
    print("  from the Pyodide distribution: " + ", ".join(f"{n} {v}" for n, v in sorted(plan.pyodide.items())),
          file=buffer)
    return buffer.getvalue().rstrip()
