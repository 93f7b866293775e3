"""`make bench`: the static site's first look in Pyodide under Node, from source and from bytecode.

Builds the project wheel as `python -m webapp build` does, once as it is
(sources) and once precompiled in Pyodide (webapp/static_site/precompile.mjs,
what the build ships), and times, in fresh Pyodide instances, loading the core
and then unpacking the wheel and computing a link's first look. Issue 9's
target: the first look within 1 s of the core being ready.
"""

from __future__ import annotations

import json
import statistics
import subprocess
import sys
import tempfile
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent))

from pyodide_node import REPO, missing_tools  # noqa: E402

RUNS = 3
TARGET_MS = 1000


def main() -> int:
    reason = missing_tools()
    if reason:
        print(f"first look benchmark skipped: {reason}")
        return 0
    from webapp.build import _precompile, _project_wheel

    with tempfile.TemporaryDirectory(prefix="rhoscope-bench-") as scratch:
        source = _project_wheel(Path(scratch) / "source")
        (Path(scratch) / "compiled").mkdir()
        compiled = _precompile(source, Path(scratch) / "compiled" / source.name)
        print(f"first look in Pyodide under Node ({RUNS} fresh instances each; median):")
        for label, wheel in (("sources", source), ("precompiled (shipped)", compiled)):
            done = subprocess.run(["node", str(HERE / "first_look.mjs"), str(wheel), str(RUNS)],
                                  capture_output=True, text=True, cwd=REPO)
            if done.returncode != 0:
                print(done.stderr[-2000:])
                return 1
            times = json.loads(done.stdout.strip().splitlines()[-1])
            look = statistics.median(times["first_look_ms"])
            print(f"  {label:22s} wheel {wheel.stat().st_size / 1e3:6.0f} kB: core {statistics.median(times['core_ms']):6.0f} ms,"
                  f" first look {look:5.0f} ms after the core ({'within' if look <= TARGET_MS else 'OVER'}"
                  f" the {TARGET_MS} ms target)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
