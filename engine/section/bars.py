"""Standard deformed reinforcing bars: designations, nominal diameters and areas.

ASTM A615/A615M, Table 1 "Deformed bar designation numbers, nominal weights,
nominal dimensions and deformation requirements": inch-pound bars #3 to #11,
#14 and #18 (A615), and the soft-metric bars No. 10 to No. 57 (A615M) that
are the same bars measured in millimetres. Diameters and areas are the
nominal ones of a plain round bar of the same weight per length.
"""

from __future__ import annotations

from dataclasses import dataclass

from .errors import InputError
from .units import UnitSystem


@dataclass(frozen=True)
class Bar:
    """One standard bar, in the base units of its system (in, in² or mm, mm²)."""

    designation: str  # "#8" (A615) or "25" (A615M)
    number: int
    db: float  # nominal diameter
    area: float  # nominal cross-sectional area
    weight: float  # nominal weight, lb/ft or kg/m


# ASTM A615, Table 1 (inch-pound): number, diameter in, area in², weight lb/ft.
_A615 = (
    (3, 0.375, 0.11, 0.376), (4, 0.500, 0.20, 0.668), (5, 0.625, 0.31, 1.043),
    (6, 0.750, 0.44, 1.502), (7, 0.875, 0.60, 2.044), (8, 1.000, 0.79, 2.670),
    (9, 1.128, 1.00, 3.400), (10, 1.270, 1.27, 4.303), (11, 1.410, 1.56, 5.313),
    (14, 1.693, 2.25, 7.650), (18, 2.257, 4.00, 13.600),
)
# ASTM A615M, Table 1 (SI): number, diameter mm, area mm², mass kg/m.
_A615M = (
    (10, 9.5, 71.0, 0.560), (13, 12.7, 129.0, 0.994), (16, 15.9, 199.0, 1.552),
    (19, 19.1, 284.0, 2.235), (22, 22.2, 387.0, 3.042), (25, 25.4, 510.0, 3.973),
    (29, 28.7, 645.0, 5.060), (32, 32.3, 819.0, 6.404), (36, 35.8, 1006.0, 7.907),
    (43, 43.0, 1452.0, 11.38), (57, 57.3, 2581.0, 20.24),
)

BARS = {
    "us": tuple(Bar(f"#{n}", n, db, area, w) for n, db, area, w in _A615),
    "si": tuple(Bar(f"{n}", n, db, area, w) for n, db, area, w in _A615M),
}

# Stirrup sizes in ordinary use (common practice): #3 to #5, or No. 10 to No. 16.
STIRRUP_NUMBERS = {"us": (3, 4, 5), "si": (10, 13, 16)}
DEFAULT_STIRRUP = {"us": 3, "si": 10}


def standard_bars(system: UnitSystem) -> tuple[Bar, ...]:
    """Every standard bar of `system`, smallest first."""
    return BARS[system.name]


def _designations(bars: tuple[Bar, ...]) -> str:
    return ", ".join(bar.designation for bar in bars)


def bar(field: str, designation: object, system: UnitSystem,
        allowed: tuple[int, ...] | None = None) -> Bar:
    """The standard bar written `designation` ("#8", "8", "No. 8"; "25", "25M" in SI).

    Raises `InputError` naming `field` when it is not a standard size of
    `system` (or not among `allowed` bar numbers).
    """
    choices = tuple(b for b in standard_bars(system) if allowed is None or b.number in allowed)
    if isinstance(designation, Bar):
        designation = designation.designation
    if isinstance(designation, int) and not isinstance(designation, bool):
        text = str(designation)
    elif isinstance(designation, str):
        text = designation.strip().lower().replace(" ", "")
        for prefix in ("no.", "no", "#"):
            if text.startswith(prefix):
                text = text[len(prefix):]
                break
        if system.name == "si" and text.endswith("m"):
            text = text[:-1]
    else:
        text = ""
    for candidate in choices:
        if text == str(candidate.number):
            return candidate
    raise InputError(field, designation, f"one of {_designations(choices)}",
                     why=f"ASTM {'A615M' if system.name == 'si' else 'A615'} bar designations")


def bars(field: str, designations: object, system: UnitSystem) -> tuple[Bar, ...]:
    """Several bars, from a sequence or a comma-separated string; sorted, no repeats."""
    if isinstance(designations, str):
        items = [item for item in designations.split(",") if item.strip()]
    elif isinstance(designations, (list, tuple)):
        items = list(designations)
    else:
        raise InputError(field, designations, "a list of bar designations")
    if not items:
        raise InputError(field, designations, "at least one bar designation")
    chosen = {bar(field, item, system) for item in items}
    return tuple(sorted(chosen, key=lambda b: b.number))
