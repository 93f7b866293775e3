"""Warnings for inputs that compute but lie outside ACI 318-19's stated scope.

Each message names the clause, so the engineer can judge whether the result
still applies to the job at hand.
"""

from __future__ import annotations

from ..section.beam import BeamSection

# (f'c minimum, fy for special seismic systems, fy maximum for flexure, fy
# minimum of the listed grades), per system.
_SCOPE = {
    "us": (2_500.0, 80_000.0, 100_000.0, 40_000.0),
    "si": (17.0, 550.0, 690.0, 280.0),
}


def scope_warnings(beam: BeamSection) -> tuple[str, ...]:
    """Plain-text warnings for the inputs of `beam`, empty when all are in scope."""
    fc_min, fy_seismic, fy_max, fy_min = _SCOPE[beam.system.name]
    stress = beam.system.stress
    warnings = []
    if beam.fc < fc_min:
        warnings.append(
            f"f'c = {beam.fc:g} {stress} is below the {fc_min:g} {stress} minimum for "
            f"structural concrete (ACI 318-19 Table 19.2.1.1); β1 taken as 0.85.")
    if beam.fy > fy_max:
        warnings.append(
            f"fy = {beam.fy:g} {stress} exceeds {fy_max:g} {stress}, the highest fy "
            f"permitted for flexural reinforcement (ACI 318-19 Table 20.2.2.4(a)).")
    elif beam.fy > fy_seismic:
        warnings.append(
            f"fy = {beam.fy:g} {stress} exceeds {fy_seismic:g} {stress}, the limit for "
            f"flexural bars of special seismic systems (ACI 318-19 Table 20.2.2.4(a)).")
    if beam.fy < fy_min:
        warnings.append(
            f"fy = {beam.fy:g} {stress} is below the lowest listed grade, {fy_min:g} "
            f"{stress} (ACI 318-19 Table 20.2.2.4(a)).")
    if beam.es != beam.system.default_es:
        warnings.append(
            f"Es = {beam.es:g} {stress} differs from the {beam.system.default_es:g} "
            f"{stress} of ACI 318-19 20.2.2.2.")
    return tuple(warnings)
