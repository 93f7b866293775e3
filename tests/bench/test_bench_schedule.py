"""Benchmark of the beam schedule: 10,000 rows, against the bare engine calls.

Target (issue 6): 10,000 rows in under 1 s in CPython. The two benchmarks of
group 'schedule' time the same rows: the whole schedule (parse CSV text,
check, write CSV) and the bare `engine.check` calls on already parsed
inputs; their ratio is the schedule's overhead. Under `make test`
(--benchmark-disable) each runs once as a smoke test.
"""

from __future__ import annotations

from pathlib import Path

import pytest

import engine
from engine.documents.schedule import parse_schedule, run_schedule, schedule_csv

ROWS = 10_000
DEMO = Path(__file__).resolve().parent.parent / "data" / "harbourline_schedule.csv"


def _ten_thousand_rows() -> str:
    """The Harbourline Depot demo, repeated with varied steel and demand, 10,000 beams."""
    header, *beams = [line for line in DEMO.read_text(encoding="utf-8").splitlines() if line]
    names = header.split(",")
    lines = [header]
    for i in range(ROWS):
        cells = dict(zip(names, beams[i % len(beams)].split(",")))
        scale = 0.8 + 0.4 * (i % 97) / 96  # As from 0.8 to 1.2 times the demo's
        cells["mark"] = f"{cells['mark']}-{i}"
        cells["As"] = f"{float(cells['As']) * scale:.4g}"
        cells["Mu"] = f"{float(cells['Mu']) * (0.7 + 0.5 * (i % 89) / 88):.4g}"
        lines.append(",".join(cells[name] for name in names))
    return "\n".join(lines) + "\n"


TEXT = _ten_thousand_rows()
INPUTS = [row.inputs for row in parse_schedule(TEXT).rows]


def _schedule_to_csv(text: str) -> str:
    return schedule_csv(run_schedule(text))


def _bare_checks(inputs: list[dict]) -> int:
    """The engine calls alone; results are dropped, as the schedule drops them after use
    (holding 10,000 results alive would time the garbage collector instead)."""
    count = 0
    for item in inputs:
        engine.check(**item)
        count += 1
    return count


@pytest.mark.benchmark(group="schedule")
def test_schedule_10k_rows(benchmark):
    table = benchmark(_schedule_to_csv, TEXT)
    assert table.count("\n") == ROWS + 1


@pytest.mark.benchmark(group="schedule")
def test_bare_engine_checks_10k_rows(benchmark):
    assert all(item is not None for item in INPUTS)
    assert benchmark(_bare_checks, INPUTS) == ROWS
