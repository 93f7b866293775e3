"""Engine cases run twice, in CPython and inside Pyodide, by tests/test_pyodide.py.

Standard library and engine only, so the same file runs unchanged in both. It
prints one JSON object: for every case its result (to_dict()), or the error it
raised, and for every CLI call its exit status, stdout and stderr. The beams
are from the invented Harbourline Depot building.
"""

import contextlib
import io
import json
import runpy
import sys

import engine

# Each row: (id, keyword arguments of engine.check).
CHECKS = [
    # Roof beam B-101: Grade 60, 4000 psi, tension-controlled, with a demand.
    ("us-B-101-tension-controlled",
     dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, Mu=180)),
    # Level beam B-204: far above ρb, so the steel does not yield (strain compatibility).
    ("us-B-204-not-yielding",
     dict(units="us", fc=4000, fy=60000, b=10, d=14, As=9.0)),
    # Girder G-3: spiral ties, extreme layer deeper than the centroid, in the transition zone.
    ("us-G-3-spiral-transition",
     dict(units="us", fc=5000, fy=60000, b=14, d=20, dt=22, As=7.0, Mu=400, spiral=True)),
    # High-strength concrete (β1 at its floor) with Grade 80 bars and an explicit Es.
    ("us-B-105-high-strength",
     dict(units="us", fc=9000, fy=80000, b=16, d=28, As=6.0, es=29_000_000)),
    # Below ACI's stated f'c scope: computed, with a warning.
    ("us-B-110-low-fc-warning",
     dict(units="us", fc=2000, fy=60000, b=12, d=18, As=1.2)),
    # SI level beam B-301.
    ("si-B-301-tension-controlled",
     dict(units="si", fc=28, fy=420, b=300, d=500, As=1500, Mu=250)),
    # SI beam B-302 past balanced: steel does not yield.
    ("si-B-302-not-yielding",
     dict(units="si", fc=25, fy=420, b=250, d=400, As=6000)),
    # SI girder G-7 with Es given and a dt below d.
    ("si-G-7-explicit-es",
     dict(units="si", fc=35, fy=500, b=350, d=600, dt=640, es=200_000, As=2500, Mu=600)),
]

# Invalid input: each must raise engine.InputError naming the field.
INVALID = [
    ("bad-negative-fc", "fc", dict(units="us", fc=-4000, fy=60000, b=12, d=21.5, As=3.16)),
    ("bad-nan-b", "b", dict(units="us", fc=4000, fy=60000, b=float("nan"), d=21.5, As=3.16)),
    ("bad-inf-d", "d", dict(units="si", fc=28, fy=420, b=300, d=float("inf"), As=1500)),
    ("bad-units", "units", dict(units="metric", fc=28, fy=420, b=300, d=500, As=1500)),
    ("bad-text-As", "As", dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As="lots")),
    ("bad-zero-fy", "fy", dict(units="si", fc=28, fy=0, b=300, d=500, As=1500)),
]

CURVES = [
    ("curve-us-B-101", dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, points=400)),
    ("curve-si-B-301", dict(units="si", fc=28, fy=420, b=300, d=500, As=1500, points=60)),
]

US_SECTION = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "21.5", "--as", "3.16"]
SI_SECTION = ["--units", "si", "--fc", "28", "--fy", "420", "--b", "300", "--d", "500", "--as", "1500"]
CLI = [
    ("cli-check-us-json", ["check", *US_SECTION, "--mu", "180", "--json"]),
    ("cli-check-si-json", ["check", *SI_SECTION, "--mu", "250", "--json"]),
    ("cli-check-us-text", ["check", *US_SECTION, "--mu", "180"]),
    ("cli-check-spiral-json", ["check", *US_SECTION, "--dt", "23", "--spiral", "--json"]),
    ("cli-curve-us-json", ["curve", *US_SECTION, "--points", "25", "--json"]),
    ("cli-bad-fc", ["check", "--units", "us", "--fc", "-5", "--fy", "60000", "--b", "12",
                    "--d", "21.5", "--as", "3.16", "--json"]),
    ("cli-bad-units", ["check", "--units", "imperial", "--fc", "4000", "--fy", "60000",
                       "--b", "12", "--d", "21.5", "--as", "3.16"]),
]


def error_record(error: BaseException) -> dict:
    return {
        "type": type(error).__name__,
        "is_input_error": isinstance(error, engine.InputError),
        "is_value_error": isinstance(error, ValueError),
        "field": getattr(error, "field", None),
        "value": repr(getattr(error, "value", None)),
        "accepted": getattr(error, "accepted", None),
        "message": str(error),
    }


def run_cli(argv: list[str]) -> dict:
    """`python -m engine ARGV`, exactly: engine/__main__.py run as __main__."""
    out, err = io.StringIO(), io.StringIO()
    saved_argv = sys.argv
    sys.argv = ["python -m engine", *argv]
    status = 0
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            runpy.run_module("engine", run_name="__main__", alter_sys=False)
    except SystemExit as stop:
        status = stop.code if isinstance(stop.code, int) else (0 if stop.code is None else 1)
    finally:
        sys.argv = saved_argv
    return {"status": status, "stdout": out.getvalue(), "stderr": err.getvalue()}


def main() -> None:
    results = {"python": sys.version.split()[0], "platform": sys.platform, "cases": {}}
    cases = results["cases"]
    for case_id, kwargs in CHECKS:
        cases[case_id] = {"result": engine.check(**kwargs).to_dict()}
    for case_id, field, kwargs in INVALID:
        try:
            engine.check(**kwargs)
        except Exception as error:  # recorded, compared across runtimes
            cases[case_id] = {"expected_field": field, "error": error_record(error)}
        else:
            cases[case_id] = {"expected_field": field, "error": None}
    for case_id, kwargs in CURVES:
        cases[case_id] = {"result": engine.capacity_curve(**kwargs).to_dict()}
    for case_id, argv in CLI:
        cases[case_id] = {"cli": run_cli(argv)}
    print("RHOSCOPE-CASES " + json.dumps(results, ensure_ascii=False))


main()
