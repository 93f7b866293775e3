"""Effective flange width of T- and L-beams, ACI 318-19 Table 6.3.2.1."""

from __future__ import annotations

from ..section.errors import InputError
from ..section.validation import number

# Per overhang: (multiple of hf, fraction of the span ln), Table 6.3.2.1.
_OVERHANG_LIMITS = {"T": (8.0, 1 / 8), "L": (6.0, 1 / 12)}


def effective_flange_width(shape: str, bw: float, hf: float, clear_web_spacing: float,
                           span: float) -> float:
    """bf from the slab: bw plus each overhang's least permitted width.

    T (slab on both sides): each overhang is the least of 8 hf, half the
    clear distance sw to the next web, and ln/8. L (slab on one side): the
    one overhang is the least of 6 hf, sw/2 and ln/12. All lengths in one unit.
    """
    if shape not in _OVERHANG_LIMITS:
        raise InputError("shape", shape, "'T' or 'L'")
    for field, value in (("b", bw), ("hf", hf), ("sw", clear_web_spacing), ("span", span)):
        if number(field, value) <= 0:
            raise InputError(field, value, "a positive number")
    per_hf, per_span = _OVERHANG_LIMITS[shape]
    overhang = min(per_hf * hf, clear_web_spacing / 2, per_span * span)
    sides = 2 if shape == "T" else 1
    return bw + sides * overhang
