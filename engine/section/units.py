"""Unit systems, and the only place where numbers change units.

The engine computes in the consistent base units of the system the user chose:
US customary (psi, in, in², lb, lb·in) or SI (MPa, mm, mm², N, N·mm). ACI 318-19
states its empirical equations (β1, As,min) separately for each system, so the
code constants that depend on units live with their clause, keyed by system.
Moments cross the boundary in the units engineers quote them in: kip·ft or kN·m.
"""

from __future__ import annotations

from dataclasses import dataclass

from .errors import InputError


@dataclass(frozen=True)
class UnitSystem:
    """Names and factors of one unit system."""

    name: str
    stress: str
    length: str
    area: str
    force: str
    moment: str
    moment_to_base: float  # one quoted moment unit in base force·length
    default_es: float  # ACI 318-19 20.2.2.2


US = UnitSystem(
    name="us", stress="psi", length="in", area="in²", force="lb",
    moment="kip·ft", moment_to_base=12_000.0, default_es=29_000_000.0,
)
SI = UnitSystem(
    name="si", stress="MPa", length="mm", area="mm²", force="N",
    moment="kN·m", moment_to_base=1_000_000.0, default_es=200_000.0,
)
SYSTEMS = {"us": US, "si": SI}

# Exact by definition: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N.
MM_PER_IN = 25.4
N_PER_LBF = 4.4482216152605
MPA_PER_PSI = N_PER_LBF / MM_PER_IN**2
KNM_PER_KIPFT = N_PER_LBF * 1000 * 12 * MM_PER_IN / 1e6

# Factor from US to SI for each kind of quantity the inputs carry.
_US_TO_SI = {
    "stress": MPA_PER_PSI,
    "length": MM_PER_IN,
    "area": MM_PER_IN**2,
    "moment": KNM_PER_KIPFT,
}


def unit_system(name: object) -> UnitSystem:
    """The unit system called `name` ("us" or "si", any case)."""
    key = name.strip().lower() if isinstance(name, str) else name
    if key not in SYSTEMS:
        raise InputError("units", name, "'us' or 'si'")
    return SYSTEMS[key]


def quoted_moment(moment_base: float, system: UnitSystem) -> float:
    """A moment in base force·length (lb·in, N·mm) in the quoted unit (kip·ft, kN·m).

    Every moment a user sees goes through here, so two results compare alike.
    """
    return moment_base / system.moment_to_base


def convert(value: float, quantity: str, source: UnitSystem, target: UnitSystem) -> float:
    """`value`, a `quantity` ("stress", "length", "area", "moment") in `source`, in `target`."""
    if source == target:
        return value
    factor = _US_TO_SI[quantity]
    return value * factor if source == US else value / factor
