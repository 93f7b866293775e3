"""The one bracketed root finder the engine's searches share (the Illinois method).

Used where a quantity rises with one input and the least input that meets a
demand is wanted: the tension steel for Mu (required_steel) and the f'c for
φMn,max (design). The answer is the bracket's upper end, so it always meets
the demand.
"""

from __future__ import annotations

from collections.abc import Callable


def least_root_from_above(f: Callable[[float], float], low: float, f_low: float, high: float,
                          f_high: float, settled: Callable[[float, float, float], bool],
                          max_steps: int) -> float:
    """A root of the increasing `f` in (low, high], with f(low) < 0 ≤ f(high); returns the upper end.

    Regula falsi kept bracketed (bisection when a step would leave the
    bracket), with the Illinois halving of a stale end's weight. Stops when
    `settled(low, high, f_high)` or after `max_steps` steps.
    """
    side = 0
    for _ in range(max_steps):
        if settled(low, high, f_high):
            break
        x = (low * f_high - high * f_low) / (f_high - f_low)
        if not low < x < high:
            x = 0.5 * (low + high)
        f_x = f(x)
        if f_x >= 0:
            high, f_high = x, f_x
            if side == 1:
                f_low *= 0.5  # the low end has gone stale: halve its weight
            side = 1
        else:
            low, f_low = x, f_x
            if side == -1:
                f_high *= 0.5
            side = -1
    return high
