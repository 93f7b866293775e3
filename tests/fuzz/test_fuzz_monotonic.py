"""9.6.1.3 is monotonic in Mu: a smaller demand never needs more steel, never fails As,min.

ACI 318-19 9.6.1.3 waives As,min where As ≥ 4/3 of the As required by analysis.
The least As with φMn ≥ Mu (9.5.1.1) and εt ≥ 0.004 (9.3.3.1) cannot grow as Mu
falls (any area meeting the larger Mu meets the smaller), so neither can the
minimum-steel check turn from pass to fail. Sections from `sections.py`, a
tenth as many as the equilibrium test, each at two demands.
"""

from __future__ import annotations

import random

import engine
from fuzz.sections import cli_command, fuzz_count, sections


def test_a_smaller_demand_never_needs_more_steel_nor_fails_the_minimum():
    count = max(1, fuzz_count() // 10)
    failures = []
    for seed, kw in sections(count, first_seed=1_000_000):
        rng = random.Random(seed)
        Mu_high = kw.pop("Mu", None) or rng.uniform(1.0, 500.0)
        Mu_low = Mu_high * rng.choice((0.0, rng.random(), 0.999))
        high, low = engine.check(**kw, Mu=Mu_high), engine.check(**kw, Mu=Mu_low)
        need_high = float("inf") if high.As_req is None else high.As_req
        need_low = float("inf") if low.As_req is None else low.As_req
        if need_low > need_high or (high.checks[0].passed and not low.checks[0].passed):
            failures.append(f"Mu {Mu_low:g} needs {need_low:g} (As,min "
                            f"{'pass' if low.checks[0].passed else 'FAIL'}), Mu {Mu_high:g} needs "
                            f"{need_high:g} (As,min {'pass' if high.checks[0].passed else 'FAIL'}):"
                            f"\n  {cli_command(kw)}")
    print(f"\nfuzz 9.6.1.3 monotonic: {count} sections, {len(failures)} failures")
    assert not failures, f"{len(failures)} of {count}; the first: {failures[0]}"
