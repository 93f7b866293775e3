"""Checks every public entry point applies to its inputs, once, at the edge.

Hard ranges here are the limits of what the engine will compute at all (a
number, finite, positive, of a physically possible size). Limits of ACI
318-19's stated scope are softer: such values are computed and warned about
in `provisions/scope.py`.
"""

from __future__ import annotations

import math
import re
from numbers import Real

from .errors import InputError
from .units import UnitSystem

# Upper bounds well past any real beam, so a typo (an extra zero) is caught
# while every practical and most unusual sections still compute.
_HARD_MAXIMA = {
    "us": {"stress_fc": 30_000.0, "stress_fy": 200_000.0, "modulus": 100_000_000.0,
           "length": 1_200.0, "moment": 1.0e7},
    "si": {"stress_fc": 200.0, "stress_fy": 1_400.0, "modulus": 700_000.0,
           "length": 30_000.0, "moment": 1.4e7},
}


# Positive values below this fraction of a quantity's maximum are refused as
# well: no beam has them, and carried through a check they underflow.
_SMALLEST_FRACTION = 1e-12


def hard_maximum(system: UnitSystem, kind: str) -> float:
    """The largest value of `kind` the engine computes in `system`."""
    return _HARD_MAXIMA[system.name][kind]


# A decimal number as a person or a link writes one: digits, one point, an exponent.
# No thousands separators, no decimal comma, no underscores or other digits.
DECIMAL_TEXT = re.compile(r"[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?")


def decimal_text(field: str, text: str) -> float:
    """The number `text` writes, or an `InputError` naming `field` and saying why not.

    "5,000" is refused rather than read: a comma is a thousands separator in
    one office and a decimal point in the next, and either reading can be wrong.
    """
    stripped = text.strip()
    if not DECIMAL_TEXT.fullmatch(stripped):
        if "," in stripped and DECIMAL_TEXT.fullmatch(stripped.replace(",", "")):
            raise InputError(field, text, "a number without a comma, such as 5000 or 3.16",
                             why="a comma can be a thousands separator or a decimal point")
        raise InputError(field, text, "a decimal number such as 4000 or 3.16")
    number = float(stripped)
    if not math.isfinite(number):
        raise InputError(field, text, "a finite decimal number (this one is too large)")
    return number


def number(field: str, value: object, accepted: str = "a finite number") -> float:
    """`value` as a finite float, or an `InputError` naming `field` and `accepted`."""
    if isinstance(value, bool) or not isinstance(value, Real):
        raise InputError(field, value, accepted, why="not a number")
    result = float(value)
    if not math.isfinite(result):
        raise InputError(field, value, accepted, why="not finite")
    return result


def range_text(unit: str, maximum: float, *, allow_zero: bool = False) -> str:
    """How an accepted range reads: "a number in (0, 1,200] in"."""
    return f"a number in {'[0' if allow_zero else '(0'}, {maximum:,.10g}] {unit}"


def in_range(
    field: str, value: object, unit: str, maximum: float, *, allow_zero: bool = False
) -> float:
    """`value` as a float in (0, maximum] (or [0, maximum] with `allow_zero`)."""
    accepted = range_text(unit, maximum, allow_zero=allow_zero)
    result = number(field, value, accepted)
    low_ok = result >= 0 if allow_zero else result > 0
    if not low_ok or result > maximum:
        too_low = "negative" if allow_zero else "zero or negative"
        raise InputError(field, value, accepted,
                         why=too_low if not low_ok else "larger than any real beam")
    smallest = _SMALLEST_FRACTION * maximum
    if 0 < result < smallest and not allow_zero:
        raise InputError(field, value, accepted,
                         why=f"below {smallest:.3g} {unit}, too small for any real beam")
    return result


def flag(field: str, value: object) -> bool:
    """`value` as a bool; only real booleans are accepted."""
    if not isinstance(value, bool):
        raise InputError(field, value, "true or false")
    return value
