"""Concrete and steel properties that ACI 318-19 fixes, each with its clause."""

from __future__ import annotations

import math

from .units import US, UnitSystem

EPS_CU = 0.003
"""Maximum usable strain at the extreme concrete compression fibre, ACI 318-19 22.2.2.1."""

BLOCK_STRESS_FACTOR = 0.85
"""Stress of the equivalent rectangular block, 0.85 f'c, ACI 318-19 22.2.2.4.1."""

# ACI 318-19 Table 22.2.2.4.3, in each system's own terms: (f'c up to which
# β1 = 0.85, f'c from which β1 = 0.65, drop of 0.05 per this much f'c).
BETA1_TABLE = {
    "us": (4000.0, 8000.0, 1000.0),
    "si": (28.0, 55.0, 7.0),
}


def beta1(fc: float, system: UnitSystem = US) -> float:
    """β1, the ratio of stress-block depth a to neutral-axis depth c.

    ACI 318-19 Table 22.2.2.4.3. Below the table's lowest f'c the top row
    (0.85) is used; the caller warns that such concrete is out of scope.
    """
    upper_flat, lower_flat, per_step = BETA1_TABLE[system.name]
    if fc <= upper_flat:
        return 0.85
    if fc >= lower_flat:
        return 0.65
    return 0.85 - 0.05 * (fc - upper_flat) / per_step


def yield_strain(fy: float, es: float) -> float:
    """εty = fy / Es for deformed reinforcement, ACI 318-19 21.2.2.1."""
    return fy / es


def steel_stress(strain: float, fy: float, es: float) -> float:
    """Stress in deformed reinforcement, elastic-perfectly plastic.

    Below yield fs = Es·εs; beyond it fs = fy (ACI 318-19 20.2.2.1).
    Compression strain is negative and gives a negative stress.
    """
    return max(-fy, min(fy, es * strain))


# ACI 318-19 19.2.2.1(b): Ec = 57,000√f'c (psi) or 4,700√f'c (MPa), normalweight concrete.
EC_COEFFICIENT = {"us": 57_000.0, "si": 4_700.0}

# ACI 318-19 19.2.3.1: fr = 7.5λ√f'c (psi) or 0.62λ√f'c (MPa); λ = 1 for
# normalweight concrete (Table 19.2.4.2), the only kind the engine takes.
FR_COEFFICIENT = {"us": 7.5, "si": 0.62}


def concrete_modulus(fc: float, system: UnitSystem = US) -> float:
    """Ec of normalweight concrete, ACI 318-19 19.2.2.1(b), in psi or MPa."""
    return EC_COEFFICIENT[system.name] * math.sqrt(fc)


def modulus_of_rupture(fc: float, system: UnitSystem = US) -> float:
    """fr of normalweight concrete (λ = 1), ACI 318-19 19.2.3.1, in psi or MPa."""
    return FR_COEFFICIENT[system.name] * math.sqrt(fc)
