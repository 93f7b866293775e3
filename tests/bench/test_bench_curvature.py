"""CPython benchmark of moment–curvature (pytest-benchmark; `make bench` enables it).

Target (issue 12): a 60-point curve plus a 40-value μφ sweep in 30 ms or less.
Under `make test` pytest's addopts carry --benchmark-disable, so it runs once
as a plain smoke test.
"""

import pytest

import engine

# Harbourline Depot second-floor beam B-204 (invented), US customary units.
SECTION = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, h=24)
FLANGED_SI = dict(units="si", fc=30, fy=420, b=300, d=640, As=2400, h=700, bf=1200, hf=120,
                  asc=600, dc=60)


def curve_and_sweep(section: dict):
    return (engine.moment_curvature(**section, points=60),
            engine.ductility_sweep(**section, points=40))


@pytest.mark.benchmark(group="engine.moment_curvature (60 points) + ductility_sweep (40)")
def test_curve_and_sweep_us(benchmark):
    curve, sweep = benchmark(curve_and_sweep, SECTION)
    assert len(curve.points) == 60 and len(sweep.rho) == 40


@pytest.mark.benchmark(group="engine.moment_curvature (60 points) + ductility_sweep (40)")
def test_curve_and_sweep_si_flanged(benchmark):
    curve, sweep = benchmark(curve_and_sweep, FLANGED_SI)
    assert len(curve.points) == 60 and len(sweep.rho) == 40
