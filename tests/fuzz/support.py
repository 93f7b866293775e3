"""Sizes, seeds and the account of a fuzz run.

Each fuzz test draws its cases from `random.Random(seed)`, so a failure is
reproduced by its seed and case number. Sizes come from environment
variables; the defaults keep the whole fuzz folder near 30 s on two cores,
and `make fuzz` runs it larger.

| variable | cases | default |
|---|---|---|
| RHOSCOPE_FUZZ_SEED | the first seed | 2026 |
| RHOSCOPE_FUZZ_CLI | in-process CLI calls with one hostile flag value | 250 |
| RHOSCOPE_FUZZ_CLI_PROCESSES | real `python -m engine` runs with bytes arguments | 6 |
| RHOSCOPE_FUZZ_SCHEDULES | malformed schedules | 300 |
| RHOSCOPE_FUZZ_SCHEDULE_ROWS | most rows in one schedule | 25 |
"""

from __future__ import annotations

import os
import time
from dataclasses import dataclass, field


def size(name: str, default: int) -> int:
    """The environment's `RHOSCOPE_FUZZ_<name>` as a whole number, or `default`."""
    text = os.environ.get(f"RHOSCOPE_FUZZ_{name}", "")
    return int(text) if text.strip() else default


def seed() -> int:
    return size("SEED", 2026)


@dataclass
class Account:
    """What a fuzz run did: cases, failures (each with its input), the slowest case."""

    name: str
    cases: int = 0
    failures: list[str] = field(default_factory=list)
    slowest: float = 0.0
    slowest_input: str = ""
    started: float = field(default_factory=time.perf_counter)

    def timed(self, description: str, seconds: float) -> None:
        self.cases += 1
        if seconds > self.slowest:
            self.slowest, self.slowest_input = seconds, description

    def fail(self, description: str, why: str) -> None:
        self.failures.append(f"{why}: {description}")

    def report(self) -> str:
        """One paragraph for the test log (pytest -s or -rA shows it)."""
        lines = [f"fuzz {self.name}: {self.cases} cases, {len(self.failures)} failures, "
                 f"{time.perf_counter() - self.started:.1f} s; slowest {self.slowest * 1000:.0f} ms: "
                 f"{self.slowest_input[:300]}"]
        lines += [f"  {failure[:600]}" for failure in self.failures[:20]]
        return "\n".join(lines)


def shown(text: str, limit: int = 120) -> str:
    """A value for a failure report: its repr, cut short."""
    quoted = repr(text)
    return quoted if len(quoted) <= limit else f"{quoted[:limit]}… ({len(text)} characters)"
