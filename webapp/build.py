"""`python -m webapp build --out DIR`: the static site, run in the browser by Pyodide.

The page starts in two phases (webapp/static_site/worker.js says how):

1. First look. The page holds no number until the worker has computed the
   link's own check with the Pyodide core and the project's wheel alone, both
   shipped in DIR; it shows that check as text.
2. Full page. The worker loads every package the page imports, in one
   parallel `loadPackage` call from the build's own Pyodide lock file, and
   Panel builds the page with the link already applied.

Steps, each checked (a failed step stops the build with a message, never a
half-written site that looks complete):

1. `panel convert webapp/app.py --to pyodide-worker --skip-embed` writes the
   page; nothing is pre-rendered, so no default value is ever in it. The
   page's own scripts (BokehJS, Panel) are taken out of its head and fetched
   after the first look; the first-look frame, its boot script and the
   service worker come from webapp/static_site/. Panel's worker is replaced
   by Rhoscope's.
2. The project ships as a wheel built from this repository (engine/ and
   webapp/, nothing else), in DIR/wheels/.
3. The Pyodide core (pyodide.js/.mjs, pyodide.asm.js/.wasm, python_stdlib.zip)
   is copied from the pinned npm package into DIR/pyodide/, with a lock file
   of the build's own. The packages the page imports are the closure of
   Panel's, Bokeh's and the app's requirements in Pyodide's environment, less
   `NEVER_IMPORTED` (tests/test_imports.py drives every tab with those
   blocked). Each is a wheel in DIR/wheels/ when PyPI serves it as a
   pure-Python wheel at the version wanted (Panel's and Bokeh's slimmed of the
   JS bundles the page loads from DIR/static/); only the others (numpy and
   other compiled packages) come from the Pyodide CDN, whose base URL is a
   build option. Nothing is ever fetched from PyPI at run time.
4. URLs that BokehJS builds at run time for features the app does not use (the
   unpinned tabler icon font, MathJax) are rewritten inside the shipped JS to
   stand-ins in DIR; no page, worker, JS or CSS file may then name a CDN but
   the Pyodide base.
5. The service worker caches the whole build under a name that carries a
   digest of its files, and what the page fetched from the CDN.

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
from urllib.parse import quote, unquote

from packaging.markers import default_environment
from packaging.requirements import Requirement
from packaging.utils import canonicalize_name
from packaging.version import Version

from . import build_page, lazy_packages

PANEL_VERSION = "1.9.4"
BOKEH_VERSION = "3.9.2"
PYODIDE_VERSION = "0.29.3"  # what panel 1.9.4's panel/io/convert.py loads (PYODIDE_VERSION)
DEFAULT_PYODIDE_CDN = f"https://cdn.jsdelivr.net/pyodide/v{PYODIDE_VERSION}/full/"

REPO = Path(__file__).resolve().parent.parent
APP = REPO / "webapp" / "app.py"
PYODIDE_LOCK = REPO / "tests" / "pyodide" / "node_modules" / "pyodide" / "pyodide-lock.json"

PAGE = "index.html"
WORKER = "worker.js"
SERVICE_WORKER = "service-worker.js"
WHEELS = "wheels"
CORE = "pyodide"
# The Pyodide core, copied from the pinned npm package into DIR/pyodide/.
CORE_FILES = ("pyodide.js", "pyodide.mjs", "pyodide.asm.js", "pyodide.asm.wasm", "python_stdlib.zip")
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

# Requirements of Panel and Bokeh that the page never imports in the worker, so
# never installed: tests/test_imports.py drives every tab and action with them
# blocked. Panel 1.9.4 lists panel-material-ui and markdown but uses neither
# here; Bokeh imports pandas, pillow, contourpy, narwhals and xyzservices only
# for data or features the app does not use; requests and typing-extensions
# are imported by nothing the page runs.
NEVER_IMPORTED = {"panel-material-ui", "markdown", "pandas", "pillow", "contourpy", "narwhals",
                  "xyzservices", "requests", "typing-extensions"}
# Imported by the worker although no requirement names it: without pyodide-http,
# panel.io.pyodide imports pandas to patch its URL readers (Panel 1.9.4).
WORKER_EXTRAS = {"pyodide-http": "panel.io.pyodide (instead of pandas)"}

MARKER = ".rhoscope-build"


class BuildError(RuntimeError):
    """A build step failed; the message says which and what to do."""


@dataclass
class Plan:
    """The packages the full page loads: not in Pyodide's lock (from PyPI), and in it."""

    wheels: dict[str, str] = field(default_factory=dict)  # canonical name -> version
    pyodide: dict[str, str] = field(default_factory=dict)  # canonical name -> lock version
    why: dict[str, str] = field(default_factory=dict)  # canonical name -> who required it

    def names(self) -> list[str]:
        return sorted({*self.wheels, *self.pyodide})


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
        downloads = _download(plan, lock, scratch / "downloads")
        wheel_dir = out / WHEELS
        wheel_dir.mkdir(parents=True)
        project = _precompile(project_wheel, wheel_dir / project_wheel.name)
        shipped: dict[str, Path] = {}
        for name, path in downloads.items():
            target = wheel_dir / path.name
            if name in ("panel", "bokeh"):
                _slim_wheel(path, target, _panel_keeps if name == "panel" else _bokeh_keeps)
            else:
                shutil.copy2(path, target)
            shipped[name] = target
        html = _convert(app, scratch / "converted")
    remote = sorted(set(plan.pyodide) - set(shipped))
    _copy_core(out / CORE, _site_lock(lock, plan, shipped, cdn))
    page, page_scripts = build_page.static_page(
        _local_page(html, out), worker=WORKER, pyodide=f"./{CORE}/", cdn=cdn,
        service_worker=f"./{SERVICE_WORKER}")
    (out / PAGE).write_text(page, encoding="utf-8")
    (out / WORKER).write_text(build_page.worker_script(
        pyodide=f"./{CORE}/", wheel=f"./{WHEELS}/{Path(project).name}",
        packages=[name for name in plan.names() if name not in lazy_packages.LAZY],
        remote=remote, cdn=cdn, app_source=app.read_text(encoding="utf-8")), encoding="utf-8")
    _copy_panel_runtime(out)
    _local_runtime_urls(out)
    _refuse_remote(out, cdn)
    _write_service_worker(out, cdn)
    return _report(out, plan, Path(project), page_scripts, shipped, remote, cdn)


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


PRECOMPILE = REPO / "webapp" / "static_site" / "precompile.mjs"


def _precompile(wheel: Path, target: Path) -> Path:
    """`wheel` with its modules as bytecode for the pinned Pyodide (static_site/precompile.mjs).

    The first look imports the whole engine; from bytecode that takes about
    half the time it takes from source in Pyodide (`make bench` measures it).
    """
    node = shutil.which("node")
    if node is None:
        raise BuildError("node (Node.js 18 or newer) is needed to precompile the project wheel for Pyodide")
    done = subprocess.run([node, str(PRECOMPILE), str(PYODIDE_LOCK.parent), str(wheel), str(target)],
                          capture_output=True, text=True)
    if done.returncode != 0 or not target.is_file():
        raise BuildError(f"precompiling {wheel.name} in Pyodide failed:\n{done.stdout}{done.stderr}")
    return target


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
    # Pyodide's own modules (its JavaScript bridges) are there in every worker.
    ours = {"engine", "webapp", "__future__", "js", "pyodide", "pyodide_js"}
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
    """Every package the full page imports, with the lock's own dependencies, as Pyodide sees them."""
    packages = {canonicalize_name(k): v for k, v in lock["packages"].items()}
    environment = _emscripten_environment(lock)
    plan = Plan()
    imported = _third_party_imports(app)
    pending = [(Requirement(f"panel=={PANEL_VERSION}"), "the app"), (Requirement(f"bokeh=={BOKEH_VERSION}"), "the app")]
    pending += [(Requirement(name), "an import in webapp/") for name in sorted(imported)]
    pending += [(Requirement(name), by) for name, by in WORKER_EXTRAS.items()]
    while pending:
        requirement, by = pending.pop(0)
        name = canonicalize_name(requirement.name)
        if requirement.marker is not None and not requirement.marker.evaluate(environment):
            continue
        if name in NEVER_IMPORTED and name not in imported:
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
            # loadPackage would bring these too; they are listed so that the build ships them.
            pending += [(Requirement(dep), f"{name} {in_lock['version']} (Pyodide)") for dep in in_lock["depends"]]
            continue
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


def _download(plan: Plan, lock: dict, target: Path) -> dict[str, Path]:
    """Pure-Python wheels from PyPI: every `plan.wheels` one, and each lock package PyPI serves.

    A lock package whose Pyodide wheel is pure Python is shipped when PyPI has
    that very version as a wheel; the others (compiled for WebAssembly, or not
    on PyPI) stay on the Pyodide CDN.
    """
    entries = {canonicalize_name(k): v for k, v in lock["packages"].items()}
    pure = sorted(name for name in plan.pyodide if entries[name]["file_name"].endswith("-none-any.whl"))
    pins = [f"{name}=={version}" for name, version in sorted(plan.wheels.items())]
    done = _pip_download(pins + [f"{name}=={plan.pyodide[name]}" for name in pure], target)
    if done.returncode != 0:  # some lock version is not on PyPI: find which, one by one
        done = _pip_download(pins, target)
        if done.returncode != 0:
            raise BuildError(f"downloading wheels from PyPI failed:\n{done.stdout}{done.stderr}")
        for name in pure:
            _pip_download([f"{name}=={plan.pyodide[name]}"], target)
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


def _pip_download(pins: list[str], target: Path) -> subprocess.CompletedProcess:
    command = [sys.executable, "-m", "pip", "download", "--no-deps", "--only-binary=:all:", "--quiet",
               "--disable-pip-version-check", "-d", str(target), *pins]
    return subprocess.run(command, capture_output=True, text=True)


def _site_lock(lock: dict, plan: Plan, shipped: dict[str, Path], cdn: str) -> dict:
    """The build's Pyodide lock: the packages the page loads, shipped ones by relative path.

    Only those packages (and Pyodide's own stdlib entries) are listed: a
    smaller file to fetch before the first look. Pyodide resolves a relative
    file_name against the lock file's folder (DIR/pyodide/) and checks each
    download against its sha256.
    """
    packages = {}
    wanted = set(plan.names())
    for key, entry in lock["packages"].items():
        name = canonicalize_name(key)
        if name not in wanted and entry["package_type"] == "package":
            continue
        entry = dict(entry)
        if name in shipped:
            entry.update(file_name=f"../{WHEELS}/{shipped[name].name}", sha256=_sha256(shipped[name]))
        elif "://" not in entry["file_name"]:
            entry["file_name"] = cdn + entry["file_name"]
        packages[key] = entry
    for name in plan.wheels:
        wheel = shipped[name]
        packages[name] = {
            "name": name, "version": plan.wheels[name], "file_name": f"../{WHEELS}/{wheel.name}",
            "install_dir": "site", "sha256": _sha256(wheel), "package_type": "package",
            "imports": _top_level_modules(wheel), "depends": [], "unvendored_tests": False}
    return {"info": lock["info"], "packages": packages}


def _sha256(path: Path) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest()


def _top_level_modules(wheel: Path) -> list[str]:
    with zipfile.ZipFile(wheel) as archive:
        tops = {name.split("/")[0] for name in archive.namelist()}
    return sorted(top.removesuffix(".py") for top in tops
                  if not top.endswith((".dist-info", ".data")) and (top.endswith(".py") or "." not in top))


def _copy_core(target: Path, site_lock: dict) -> None:
    """The Pyodide core from the pinned npm package, and the build's lock file, into `target`."""
    target.mkdir(parents=True)
    for name in CORE_FILES:
        source = PYODIDE_LOCK.parent / name
        if not source.is_file():
            raise BuildError(f"{source} is missing from the pinned Pyodide npm package")
        shutil.copy2(source, target / name)
    (target / "pyodide-lock.json").write_text(json.dumps(site_lock, indent=1), encoding="utf-8")


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


def _convert(app: Path, work: Path) -> str:
    work.mkdir(parents=True)
    # An explicit requirements file stops Panel inferring requirements from the
    # imports; the worker's real install list is written by _local_worker.
    requirements = work / "requirements.txt"
    requirements.write_text("# installs are written by webapp/build.py\n", encoding="utf-8")
    env = dict(os.environ, PANEL_CDN_ROOT=PANEL_ROOT, PYTHONPATH=os.pathsep.join(
        [str(REPO), *filter(None, [os.environ.get("PYTHONPATH")])]))
    # --skip-embed: nothing pre-rendered, so the page never holds the default inputs' numbers.
    command = [sys.executable, "-m", "panel", "convert", str(app), "--to", "pyodide-worker",
               "--out", str(work), "--requirements", str(requirements), "--disable-http-patch",
               "--skip-embed"]
    done = subprocess.run(command, capture_output=True, text=True, env=env, cwd=REPO)
    html_path, worker_path = work / f"{app.stem}.html", work / f"{app.stem}.js"
    if done.returncode != 0 or not html_path.is_file() or not worker_path.is_file():
        raise BuildError(f"panel convert failed:\n{done.stdout}{done.stderr}")
    return html_path.read_text(encoding="utf-8")


def _local_page(html: str, out: Path) -> str:
    """Point the page at DIR: BokehJS and Panel's files, all relative."""

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


def _write_service_worker(out: Path, cdn: str) -> None:
    """service-worker.js, caching every file of the build under a name that carries their digest."""
    digest = hashlib.sha256()
    files = ["./"]
    for path in sorted(p for p in out.rglob("*") if p.is_file() and p.name not in (MARKER, SERVICE_WORKER)):
        relative = path.relative_to(out).as_posix()
        digest.update(relative.encode() + b"\0" + path.read_bytes())
        files.append("./" + quote(relative, safe="/@^~!$&'()*+,;=:-._"))
    script = build_page.service_worker_script(cache=f"rhoscope-{digest.hexdigest()[:16]}", files=files, cdn=cdn)
    (out / SERVICE_WORKER).write_text(script, encoding="utf-8")


def fetched_size(path: Path) -> int:
    """Bytes of `path` as a browser fetches it from a static host: gzip at level 6, except zip files."""
    data = path.read_bytes()
    # Wheels and the standard library are zip files already; hosts do not gzip them again.
    return len(data) if path.suffix in (".whl", ".zip") else len(gzip.compress(data, 6))


def measure(out: Path) -> tuple[int, int, int]:
    """(files, bytes on disk, bytes as fetched: see `fetched_size`)."""
    paths = sorted(p for p in out.rglob("*") if p.is_file() and p.name != MARKER)
    return len(paths), sum(p.stat().st_size for p in paths), sum(fetched_size(p) for p in paths)


def phase_bytes(out: Path, project: Path, page_scripts: list[str], shipped: dict[str, Path]) -> dict[str, int]:
    """What each phase of a cold start fetches from the site, compressed as a browser fetches it.

    `first look` is everything before the link's check is on screen: the page,
    its worker and style sheet, the Pyodide core and the project's wheel.
    """
    def size(relative: str) -> int:
        return fetched_size(out / unquote(relative.removeprefix("./")))

    page = (out / PAGE).read_text(encoding="utf-8")
    head_css = re.findall(r'<link rel="stylesheet" href="([^"]+)"', page.partition("</head>")[0])
    phases = {
        "page": size(PAGE) + size(WORKER) + sum(size(href) for href in head_css),
        "Pyodide core": sum(size(f"{CORE}/{name}") for name in CORE_FILES if name != "pyodide.mjs")
        + size(f"{CORE}/pyodide-lock.json"),
        "project wheel": fetched_size(project),
    }
    phases["first look"] = sum(phases.values())
    phases["page scripts (after the first look)"] = sum(size(src) for src in page_scripts)
    phases["shipped wheels (full page)"] = sum(fetched_size(path) for path in shipped.values())
    return phases


FIRST_LOOK_TARGET = 6_000_000  # bytes fetched before the first look (issue 9)


def _report(out: Path, plan: Plan, project: Path, page_scripts: list[str], shipped: dict[str, Path],
            remote: list[str], cdn: str) -> str:
    files, raw, compressed = measure(out)
    phases = phase_bytes(out, project, page_scripts, shipped)
    buffer = io.StringIO()
    print(f"Wrote {out}/ ({files} files, {raw / 1e6:.2f} MB on disk, {compressed / 1e6:.2f} MB as fetched "
          "with gzip)", file=buffer)
    print(f"  page {PAGE}, worker {WORKER}, service worker {SERVICE_WORKER}; Pyodide {PYODIDE_VERSION} "
          f"core in {CORE}/", file=buffer)
    print("  fetched by phase (gzip as a browser fetches it):", file=buffer)
    for name, size in phases.items():
        note = ""
        if name == "first look":
            met = "within" if size <= FIRST_LOOK_TARGET else "OVER"
            note = f"  ({met} the {FIRST_LOOK_TARGET / 1e6:.0f} MB target)"
        print(f"    {name}: {size / 1e6:.2f} MB{note}", file=buffer)
    print("  full page loads, shipped here: " + ", ".join(
        f"{n} {v}" for n, v in sorted({**plan.wheels, **plan.pyodide}.items())
        if n in shipped and n not in lazy_packages.LAZY), file=buffer)
    print(f"  full page loads, from {cdn} (compiled for WebAssembly): "
          + ", ".join(f"{n} {plan.pyodide[n]}" for n in remote), file=buffer)
    print("  loaded when a tab first needs it: " + ", ".join(
        f"{name} ({why})" for name, why in sorted(lazy_packages.LAZY.items())), file=buffer)
    print("  never installed (not imported by the page): " + ", ".join(sorted(NEVER_IMPORTED)), file=buffer)
    return buffer.getvalue().rstrip()
