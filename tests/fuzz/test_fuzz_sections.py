"""Property test over generated sections of every kind: nothing raises, equilibrium holds.

The sections come from `sections.py` (seeded, so each case is rebuilt from its
seed); $RHOSCOPE_FUZZ_SECTIONS sets how many (`make fuzz` runs 100,000). For
each, `engine.check` and its JSON and text forms (and, for one in ten, the
capacity curve) must not raise, every number in the JSON must be finite (a
limit no area reaches is null, never NaN), and the forces the result reports
must balance. The balance is summed here from
ACI 318-19 22.2, not by the engine: the block 0.85 f'c over a (22.2.2.4.1) on
the flange, then the web, stopping at h; each layer's reported stress (tension
positive, 20.2.2.1) times its area; 0.85 f'c deducted over each bar inside the
block (common practice).
"""

from __future__ import annotations

import json
import time

import engine
from engine.commands.check import summary
from fuzz.sections import cli_command, fuzz_count, sections

RELATIVE_RESIDUAL = 1e-9  # of the largest force in the section
CURVE_EVERY, CURVE_POINTS = 10, 16  # the capacity curve too, for one section in ten


def block_force(kw: dict, a: float) -> float:
    """0.85 f'c over the part of the section within a of the top."""
    if kw.get("h") is not None:
        a = min(a, kw["h"])
    if kw.get("bf") is None or a <= kw["hf"]:
        return 0.85 * kw["fc"] * kw.get("bf", kw["b"]) * a
    return 0.85 * kw["fc"] * (kw["bf"] * kw["hf"] + kw["b"] * (a - kw["hf"]))


def relative_residual(kw: dict, result: dict) -> float:
    """|ΣF| over the largest force, from the reported a and layer stresses."""
    a = result["a"]
    compression = block_force(kw, a)
    forces = [compression]
    for layer in result["layers"]:
        force = -layer["area"] * layer["stress"]  # compression positive
        if layer["depth"] < a:
            force -= layer["area"] * 0.85 * kw["fc"]
        forces.append(force)
    return abs(sum(forces)) / max(abs(f) for f in forces)


def run_case(kw: dict, with_curve: bool) -> float:
    """Check one section as the CLI would (and its curve); returns the relative residual."""
    result = engine.check(**kw)
    data = json.loads(json.dumps(result.to_dict(), allow_nan=False))
    summary(result)
    if with_curve:
        section = {key: value for key, value in kw.items() if key != "Mu"}
        json.dumps(engine.capacity_curve(points=CURVE_POINTS, **section).to_dict(), allow_nan=False)
    return relative_residual(kw, data)


def test_every_generated_section_computes_and_balances():
    count = fuzz_count()
    started = time.perf_counter()
    failures, worst = [], (0.0, None, None)
    for seed, kw in sections(count):
        try:
            residual = run_case(kw, seed % CURVE_EVERY == 0)
        except Exception as error:  # noqa: BLE001: any exception is the failure being counted
            failures.append((seed, kw, f"{type(error).__name__}: {error}"))
            continue
        if not residual <= RELATIVE_RESIDUAL:
            failures.append((seed, kw, f"residual {residual:.3g} of the largest force"))
        if residual > worst[0]:
            worst = (residual, seed, kw)
    elapsed = time.perf_counter() - started
    print(f"\nfuzz sections: {count} cases, {len(failures)} failures, {elapsed:.1f} s; "
          f"largest relative residual {worst[0]:.3g}"
          + ("" if worst[2] is None else f" (seed {worst[1]}: {cli_command(worst[2])})"))
    if failures:
        # The worst: an exception before any imbalance, then the largest imbalance.
        raised = [f for f in failures if not f[2].startswith("residual")]
        seed, kw, what = raised[0] if raised else (worst[1], worst[2], f"residual {worst[0]:.3g}")
        raise AssertionError(f"{len(failures)} of {count} sections failed; the worst, seed {seed}, "
                             f"{what}:\n  {cli_command(kw)}")
