"""Random valid beam sections of every kind, for the fuzz tests to share.

`section(seed)` draws one section from its own `random.Random(seed)`, so a
failing case is rebuilt from its seed alone; `sections(count)` yields
`(seed, kwargs)` pairs. The kwargs are those of `engine.check` (plus `Mu`
about half the time): US or SI, rectangles, T and L flanges, h or none, one
to four tension layers, compression steel anywhere above dt (also below the
neutral axis), dt at or below the deepest layer, spirals, Es other than the
default, and materials both inside and outside ACI 318-19's stated scope.
Every section is valid by construction: `engine.check` must accept it.

`cli_command(kwargs)` writes the same inputs as a `python -m engine check` line.
"""

from __future__ import annotations

import os
import random

FUZZ_SIZE_VARIABLE = "RHOSCOPE_FUZZ_SECTIONS"
DEFAULT_COUNT = 5_000  # 10-25 s on the 2-core CI machine, by its load; `make fuzz` runs 100,000

# Ranges per system: f'c, fy, Es, web width, depth to the deepest layer, Mu scale.
_RANGES = {
    "us": dict(fc=(2_000.0, 12_000.0), fy=(30_000.0, 120_000.0), es=(25e6, 32e6),
               b=(6.0, 60.0), depth=(6.0, 80.0), bar=(0.11, 1.56)),
    "si": dict(fc=(14.0, 85.0), fy=(200.0, 830.0), es=(170_000.0, 220_000.0),
               b=(150.0, 1_500.0), depth=(150.0, 2_000.0), bar=(71.0, 1_006.0)),
}
_KIP_FT = {"us": 12_000.0, "si": 1e6}  # lb·in per kip·ft, N·mm per kN·m


def fuzz_count(default: int = DEFAULT_COUNT) -> int:
    """How many sections to draw: $RHOSCOPE_FUZZ_SECTIONS, else `default`."""
    text = os.environ.get(FUZZ_SIZE_VARIABLE, "").strip()
    return int(text) if text else default


def _round(value: float, figures: int = 6) -> float:
    """To `figures` significant figures, as a person would type it."""
    return float(f"{value:.{figures}g}")


def section(seed: int) -> dict:
    """One valid section's keywords for `engine.check`, drawn from `seed`."""
    rng = random.Random(seed)
    units = rng.choice(("us", "si"))
    r = _RANGES[units]
    kw: dict = dict(units=units, fc=_round(rng.uniform(*r["fc"])),
                    fy=_round(rng.uniform(*r["fy"])), b=_round(rng.uniform(*r["b"])))
    bw = kw["b"]
    deepest = _round(rng.uniform(*r["depth"]))
    # Tension layers: the first at the deepest depth, the others anywhere above it
    # (sometimes high in the section, where they end up in compression).
    count = rng.choice((1, 1, 1, 2, 2, 3, 4))
    depths = [deepest] + [_round(deepest * rng.uniform(0.05, 0.98)) for _ in range(count - 1)]
    rho = rng.choice((rng.uniform(0.0005, 0.004), rng.uniform(0.002, 0.03), rng.uniform(0.02, 0.12)))
    total = rho * bw * deepest
    shares = [rng.uniform(0.1, 1.0) for _ in depths]
    areas = [_round(total * s / sum(shares)) for s in shares]
    if rng.random() < 0.5:
        kw.update(d=depths[0], As=areas[0], layers=list(zip(areas[1:], depths[1:])))
    else:
        kw.update(layers=list(zip(areas, depths)))
    dt = deepest
    if rng.random() < 0.2:
        dt = _round(deepest * rng.uniform(1.0, 1.15))
        kw["dt"] = dt
    if rng.random() < 0.4:
        kw["h"] = _round(dt * rng.uniform(1.0001, 1.3))
    if rng.random() < 0.35:  # T (or L: the engine treats both in plane bending)
        kw.update(bf=_round(bw * rng.uniform(1.0, 8.0)), hf=_round(dt * rng.uniform(0.05, 0.5)))
    if rng.random() < 0.4:
        kw.update(asc=_round(total * rng.uniform(0.05, 1.5)), dc=_round(dt * rng.uniform(0.03, 0.9)))
    if rng.random() < 0.1:
        kw["spiral"] = True
    if rng.random() < 0.1:
        kw["es"] = _round(rng.uniform(*r["es"]))
    if rng.random() < 0.6:
        # Up to about twice the section's plastic capacity As·fy·d, and sometimes none.
        scale = total * kw["fy"] * deepest / _KIP_FT[units]
        kw["Mu"] = _round(rng.choice((0.0, rng.uniform(0, 0.2), rng.uniform(0, 2.0))) * scale)
    gross = bw * kw.get("h", dt)
    if sum(areas) >= 0.9 * gross:  # keep the steel inside the concrete
        factor = 0.5 * gross / sum(areas)
        kw["layers"] = [(_round(a * factor), y) for a, y in kw["layers"]]
        if "As" in kw:
            kw["As"] = _round(kw["As"] * factor)
    return kw


def sections(count: int, first_seed: int = 0):
    """`(seed, kwargs)` for `count` sections from consecutive seeds."""
    for seed in range(first_seed, first_seed + count):
        yield seed, section(seed)


def cli_command(kw: dict) -> str:
    """The `python -m engine check` line for the keywords `kw`."""
    parts = ["python -m engine check", f"--units {kw['units']}"]
    for key, flag in (("fc", "fc"), ("fy", "fy"), ("b", "b"), ("d", "d"), ("As", "as"),
                      ("dt", "dt"), ("h", "h"), ("bf", "bf"), ("hf", "hf"), ("asc", "asc"),
                      ("dc", "dc"), ("es", "es"), ("Mu", "mu")):
        if kw.get(key) is not None:
            parts.append(f"--{flag} {kw[key]:g}")
    parts += [f"--layer {area:g}@{depth:g}" for area, depth in kw.get("layers", ())]
    if kw.get("spiral"):
        parts.append("--spiral")
    return " ".join(parts)
