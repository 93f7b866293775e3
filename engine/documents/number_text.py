"""Numbers as printed on a sheet or a drawing: fixed notation to a number of significant figures."""

from __future__ import annotations

import math


def significant(value: float, digits: int = 4) -> str:
    """`value` in fixed notation to `digits` significant figures (whole numbers kept whole)."""
    if value == 0:
        return "0"
    if math.isinf(value):
        return "∞" if value > 0 else "−∞"
    exponent = math.floor(math.log10(abs(value)))
    decimals = max(0, digits - 1 - exponent)
    return f"{value:.{decimals}f}".replace("-", "−")
