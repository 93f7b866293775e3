"""Inputs that make bar sizing work hardest, for the design benchmark and its tests.

Bar sizing tries counts of each bar size until one arrangement meets every rule.
It works hardest where many bars fit across b (wide sections), where a rule
that no count can meet fails for every size (a cover below Table 20.5.1.3.1,
crack-control spacing on a wide web), where Mu is out of reach, or where it is
so small that As,min or 9.6.1.3 decides. The grid crosses those, in both systems.
"""

from __future__ import annotations

import itertools

# (b, h) pairs from a narrow joist to the widest web the engine takes, US in / SI mm.
_SHAPES = {"us": [(6, 12), (14, 24), (48, 48), (160, 48), (400, 48), (1200, 60), (36, 1200)],
           "si": [(150, 300), (350, 600), (1200, 1200), (4000, 1200), (10000, 1200),
                  (30000, 1500), (900, 30000)]}
_COVERS = {"us": (None, 0.5), "si": (None, 12.0)}
_MOMENTS = {"us": (0.5, 190.0, 5_000.0, 1.0e6), "si": (0.7, 260.0, 7_000.0, 1.4e6)}
_MATERIALS = {"us": dict(fc=4000, fy=60000), "si": dict(fc=28, fy=420)}


def worst_cases() -> list[dict]:
    """Keywords of `engine.design_section`, every combination of the grid above."""
    cases = []
    for units in ("us", "si"):
        for (b, h), cover, Mu, layers in itertools.product(
                _SHAPES[units], _COVERS[units], _MOMENTS[units], (1, 2)):
            kw = dict(units=units, **_MATERIALS[units], b=b, h=h, Mu=Mu, layers=layers)
            if cover is not None:
                kw["cover"] = cover
            cases.append(kw)
    return cases


def case_id(kw: dict) -> str:
    return (f"{kw['units']}-b{kw['b']:g}-h{kw['h']:g}-Mu{kw['Mu']:g}-layers{kw['layers']}"
            f"{'-cover' + format(kw['cover'], 'g') if 'cover' in kw else ''}")
