"""Permitted redistribution of negative moment, ACI 318-19 6.6.5.

6.6.5.1: moments may be reduced only where εt ≥ 0.0075 at the section where
the moment is reduced (and only in continuous members, which a section
alone cannot tell). 6.6.5.3: the reduction is at most the lesser of 1000εt
percent and 20 percent.
"""

from __future__ import annotations

from dataclasses import dataclass

EPS_T_REDISTRIBUTION = 0.0075
"""Least εt at which moments may be redistributed, ACI 318-19 6.6.5.1(b)."""

MAX_REDISTRIBUTION_PERCENT = 20.0
"""Upper limit on the reduction, percent, ACI 318-19 6.6.5.3."""


@dataclass(frozen=True)
class Redistribution:
    """The reduction a section permits: percent (0 when none), and why."""

    eps_t: float
    percent: float
    permitted: bool
    reason: str


def permitted_redistribution(eps_t: float) -> Redistribution:
    """Percent by which a moment at a section with net tensile strain `eps_t` may be reduced."""
    if eps_t < EPS_T_REDISTRIBUTION:
        return Redistribution(
            eps_t, 0.0, False,
            f"Redistribution is not permitted: εt = {eps_t:.5f} < 0.0075 (ACI 318-19 6.6.5.1); "
            f"the section is not ductile enough for its moment to be reduced.")
    percent = min(1000 * eps_t, MAX_REDISTRIBUTION_PERCENT)  # 6.6.5.3
    limit = "20 % cap" if percent == MAX_REDISTRIBUTION_PERCENT else "1000εt"
    return Redistribution(
        eps_t, percent, True,
        f"Up to {percent:.3g} % ({limit}, ACI 318-19 6.6.5.3; εt = {eps_t:.5f} ≥ 0.0075, "
        f"6.6.5.1), in continuous members only.")
