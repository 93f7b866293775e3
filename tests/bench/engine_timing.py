"""Time engine.check, a 400-point capacity curve and the curvature view's work in this interpreter.

Standard library and engine only: tests/bench/compare_runtimes.py runs this same
file in CPython and inside Pyodide under Node, so both are timed the same way
(time.perf_counter around many calls, best and median of several repeats).
Prints one JSON line prefixed RHOSCOPE-TIMING.
"""

import json
import statistics
import sys
import time

import engine

# Harbourline Depot roof beam B-101 (invented), US customary units.
SECTION = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16)


def per_call_seconds(call, number: int, repeat: int) -> dict:
    call()  # warm caches and imports outside the timed loops
    samples = []
    for _ in range(repeat):
        start = time.perf_counter()
        for _ in range(number):
            call()
        samples.append((time.perf_counter() - start) / number)
    return {"best": min(samples), "median": statistics.median(samples), "number": number,
            "repeat": repeat}


def main() -> None:
    scale = float(sys.argv[1]) if len(sys.argv) > 1 else 1.0
    timings = {
        "check": per_call_seconds(lambda: engine.check(**SECTION, Mu=180),
                                  number=max(1, int(2000 * scale)), repeat=7),
        "capacity_curve_400": per_call_seconds(lambda: engine.capacity_curve(**SECTION, points=400),
                                               number=max(1, int(40 * scale)), repeat=7),
        # Issue 12.8: a 60-point moment–curvature curve plus a 40-value μφ sweep.
        "curvature_60_sweep_40": per_call_seconds(
            lambda: (engine.moment_curvature(**SECTION, h=24, points=60),
                     engine.ductility_sweep(**SECTION, h=24, points=40)),
            number=max(1, int(5 * scale)), repeat=5),
    }
    runtime = "pyodide" if sys.platform == "emscripten" else "cpython"
    print("RHOSCOPE-TIMING " + json.dumps({"runtime": runtime, "python": sys.version.split()[0],
                                           "timings": timings}))


main()
