"""Warnings about how a section was entered: what computes, but a checker would question.

Each names the clause it leans on. They never change a result; they say where
the inputs may not describe the beam that will be built.
"""

from __future__ import annotations

from ..section.beam import BeamSection, Role

# Table 20.5.1.3.1: the least specified cover for beams not exposed to weather
# or in contact with ground (to stirrups, ties or main bars), per system.
_LEAST_BEAM_COVER = {"us": 1.5, "si": 40.0}
# Table 6.3.2.1: each overhang of a T beam's effective flange is at most 8 hf
# (6 hf for an L beam, whose single overhang cannot be told apart here).
_T_OVERHANG_PER_HF = 8.0
# A flange thinner than this reads as an entry slip (common practice: floor
# slabs are rarely under 4 in / 100 mm, and never under half that).
_THINNEST_FLANGE = {"us": 2.0, "si": 50.0}


def section_warnings(beam: BeamSection) -> tuple[str, ...]:
    """Plain-text warnings about the entered geometry of `beam` (empty when none apply)."""
    return _cover_warnings(beam) + _flange_warnings(beam)


def _cover_warnings(beam: BeamSection) -> tuple[str, ...]:
    if beam.h is None:
        return ()
    least, L = _LEAST_BEAM_COVER[beam.system.name], beam.system.length
    to_centre = beam.h - beam.dt
    if to_centre >= least:
        return ()
    return (f"h − dt = {to_centre:.4g} {L}: the extreme tension bar's centre is closer to the "
            f"face than the least cover its edge needs, {least:g} {L} for beams not exposed to "
            f"weather (ACI 318-19 Table 20.5.1.3.1); check h and dt.",)


def _flange_warnings(beam: BeamSection) -> tuple[str, ...]:
    flange = beam.flange
    if flange is None:
        return ()
    L = beam.system.length
    warnings = []
    overhang = (flange.width - beam.bw) / 2
    if overhang > _T_OVERHANG_PER_HF * flange.thickness:
        warnings.append(
            f"bf = {flange.width:g} {L} overhangs the web by {overhang:.4g} {L} a side, more than "
            f"8hf = {_T_OVERHANG_PER_HF * flange.thickness:.4g} {L} (ACI 318-19 Table 6.3.2.1; an L "
            f"beam's one overhang is at most 6hf): the effective flange width is overstated.")
    thinnest = _THINNEST_FLANGE[beam.system.name]
    if flange.thickness < thinnest:
        warnings.append(
            f"hf = {flange.thickness:g} {L} is thinner than any slab that carries a flange "
            f"(under {thinnest:g} {L}); check that hf is the slab thickness.")
    return tuple(warnings)


def misplaced_tension_steel(beam: BeamSection, layer_states, c: float) -> tuple[str, ...]:
    """A layer entered as tension steel that lies in the compression zone at equilibrium.

    It is counted as compression steel in the strength (22.2.1.2), but it
    still counts in As and d for As,min (9.6.1.2) and in ρ, and scaling it for
    the limit areas inflates them.
    """
    warnings = []
    L, S = beam.system.length, beam.system.stress
    tension = [state for state in layer_states if state.layer.role is Role.TENSION]
    for number, state in enumerate(tension, start=1):  # numbered as the inputs number them
        if state.strain < 0:
            warnings.append(
                f"Tension layer {number} at {state.layer.depth:g} {L} lies above the neutral axis "
                f"(c = {c:.4g} {L}) and is in compression (fs = {state.stress:.5g} {S}); the strength "
                f"counts it so (22.2.1.2), but As, d, ρ, As,min (9.6.1.2) and the limit areas "
                f"treat it as tension steel: enter it as compression steel (asc, dc).")
    return tuple(warnings)
