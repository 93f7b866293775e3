"""Two neutral-axis depths in equilibrium when A's sits at the edge of the block (issue 11.6).

Written out independently here: the net axial force of a rectangle with
tension steel As at d and compression steel A's at d', by ACI 318-19 22.2
(εcu = 0.003, Whitney block 0.85 f'c over a = β1 c, β1 = 0.85 for 4000 psi by
Table 22.2.2.4.3, steel elastic–plastic with Es = 29,000 ksi by 20.2.2.1–2), A's
displacing 0.85 f'c of the block's concrete once inside it (common practice).
Its roots are found with scipy's brentq, not with the engine's solver.
"""

from __future__ import annotations

import re

import pytest
from scipy.optimize import brentq

import engine

FC, FY, ES, B, D, ASC, DC = 4.0, 60.0, 29000.0, 12.0, 20.0, 4.0, 2.5  # ksi, in, in²
BETA1 = 0.85


def net_force(c: float, As: float) -> float:
    """kips, compression positive."""
    def stress(depth):
        return max(-FY, min(FY, ES * 0.003 * (c - depth) / c))
    block = 0.85 * FC * B * BETA1 * c
    displaced = 0.85 * FC * ASC if DC < BETA1 * c else 0.0
    return block + ASC * stress(DC) - displaced + As * stress(D)


def test_both_roots_are_found_and_the_smaller_is_reported():
    As = 2.344  # chosen so the first root falls just short of the step at c = d'/β1
    step = DC / BETA1
    first = brentq(net_force, 0.5, step - 1e-9, args=(As,), xtol=1e-12)
    second = brentq(net_force, step + 1e-9, D, args=(As,), xtol=1e-12)
    result = engine.check(units="us", fc=4000, fy=60000, b=B, d=D, As=As, asc=ASC, dc=DC)
    assert result.state.c == pytest.approx(first, rel=1e-9)
    warning = [text for text in result.warnings if text.startswith("Two neutral-axis depths")]
    assert len(warning) == 1
    shown = [float(x) for x in re.findall(r"c = ([0-9.]+) in", warning[0])]
    assert shown[0] == pytest.approx(first, rel=5e-4) and shown[1] == pytest.approx(second, rel=5e-4)
    assert "reports the smaller" in warning[0]


def test_no_warning_when_the_force_never_returns_below_zero():
    As = 1.0  # the root lies well short of the step; N stays positive past it
    result = engine.check(units="us", fc=4000, fy=60000, b=B, d=D, As=As, asc=ASC, dc=DC)
    assert not [text for text in result.warnings if text.startswith("Two neutral-axis depths")]
    step = DC / BETA1
    assert net_force(step + 1e-9, As) > 0  # the independent force agrees: one root only
