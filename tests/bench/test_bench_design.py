"""Benchmark of bar sizing over generated worst cases (design_cases.py).

Target (issue 10): `engine.design_section` within 0.2 s for any input. Each
case of the grid (wide webs, covers no bar meets, demands out of reach or
tiny, one or two layers, US and SI) is one benchmark of group 'design worst
cases'; the column `max` is the figure against the target. Under `make test`
(--benchmark-disable) each runs once as a smoke test.
"""

from __future__ import annotations

import pytest

import engine
from design_cases import case_id, worst_cases

CASES = worst_cases()


@pytest.mark.benchmark(group="design worst cases")
@pytest.mark.parametrize("inputs", CASES, ids=[case_id(kw) for kw in CASES])
def test_design_worst_case(benchmark, inputs):
    result = benchmark.pedantic(engine.design_section, kwargs=inputs, rounds=3, iterations=1)
    assert len(result.options) == len(result.section.bars)
