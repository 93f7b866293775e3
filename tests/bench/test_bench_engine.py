"""CPython benchmarks of the engine (pytest-benchmark; `make bench` enables them).

Under `make test` pytest's addopts carry --benchmark-disable, so each runs once
as a plain smoke test. Targets (issue 2): a check well under 50 µs, a 400-point
curve under 5 ms. tests/bench/compare_runtimes.py times the same calls in
Pyodide and prints the side-by-side table.
"""

import math

import pytest

import engine

# Harbourline Depot roof beam B-101 (invented), US customary units.
SECTION = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16)
SECTION_SI = dict(units="si", fc=28, fy=420, b=300, d=500, As=1500)


@pytest.mark.benchmark(group="engine.check")
def test_check_us(benchmark):
    result = benchmark(engine.check, **SECTION, Mu=180)
    assert result.ok and math.isfinite(result.phiMn)


@pytest.mark.benchmark(group="engine.check")
def test_check_si(benchmark):
    result = benchmark(engine.check, **SECTION_SI, Mu=250)
    assert math.isfinite(result.phiMn)


@pytest.mark.benchmark(group="engine.capacity_curve (400 points)")
def test_capacity_curve_400_us(benchmark):
    curve = benchmark(engine.capacity_curve, **SECTION, points=400)
    assert len(curve.rho) >= 400


@pytest.mark.benchmark(group="engine.capacity_curve (400 points)")
def test_capacity_curve_400_si(benchmark):
    curve = benchmark(engine.capacity_curve, **SECTION_SI, points=400)
    assert len(curve.rho) >= 400
