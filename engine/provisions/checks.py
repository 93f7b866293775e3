"""The flexural check of a beam section: results, code checks and warnings.

`check` is the engine's main entry point. Its result carries every
intermediate value an engineer needs to audit it, each code check with its
ACI 318-19 clause, and the warnings, in the units the inputs came in
(moments in kip·ft or kN·m).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cached_property

from ..mechanics.cracking import cracking_moment
from ..mechanics.equilibrium import later_equilibrium
from ..section.beam import BeamSection, Role, beam_section
from ..section.materials import beta1
from ..section.units import quoted_moment
from ..section.validation import hard_maximum, in_range
from .flexure import FlexuralState, analyse
from .limits import EPS_T_BEAM_MINIMUM, ReinforcementLimits, reinforcement_limits, unreachable_reason
from .moment_curvature import curvature_ductility
from .redistribution import Redistribution, permitted_redistribution
from .required_steel import required_steel_for
from .scope import scope_warnings
from .section_warnings import misplaced_tension_steel, section_warnings
from .strength_reduction import STRAIN_ROUNDING, TENSION_CONTROL_MARGIN

CAUTION = (
    "Rhoscope is a design aid, not a substitute for engineering judgement. "
    "Verify every result against ACI 318-19 and the code adopted where the "
    "structure is built, and have a licensed engineer check the design."
)


@dataclass(frozen=True)
class CodeCheck:
    """One pass/fail requirement, identified by its ACI 318-19 clause."""

    clause: str
    title: str
    passed: bool
    detail: str


@dataclass(frozen=True)
class FlexuralCheck:
    """Everything the check found, in the units of `beam.system`."""

    beam: BeamSection
    state: FlexuralState
    limits: ReinforcementLimits
    Mn: float  # kip·ft or kN·m
    phiMn: float
    Mu: float | None
    checks: tuple[CodeCheck, ...]
    warnings: tuple[str, ...]

    @cached_property
    def As_req(self) -> float | None:
        """Least As for Mu within 9.3.3.1 at this b, d and dt, when Mu is given.

        None when no Mu is given or no area reaches it. Found on first use:
        the check itself needs it only for 9.6.1.3, when As < As,min.
        """
        return _required_steel(self.beam, self.Mu)

    @cached_property
    def Mcr(self) -> float | None:
        """Mcr = fr·Ig/yt of the gross section (24.2.3.5), kip·ft or kN·m; None without h."""
        if self.beam.h is None:
            return None
        return quoted_moment(cracking_moment(self.beam), self.beam.system)

    @cached_property
    def ductility(self) -> float | None:
        """Curvature ductility μφ (`engine.moment_curvature`); None without h or first yield.

        Found on first use: it takes two more equilibrium solutions.
        """
        return curvature_ductility(self.beam)

    @property
    def redistribution(self) -> Redistribution:
        """The moment redistribution ACI 318-19 6.6.5 permits at this section's εt."""
        return permitted_redistribution(self.state.eps_t)

    @property
    def rho(self) -> float:
        return self.beam.As / (self.beam.b * self.beam.d)

    @property
    def utilization(self) -> float | None:
        """Mu / φMn, when Mu is given."""
        return None if self.Mu is None else self.Mu / self.phiMn

    @property
    def ok(self) -> bool:
        return all(item.passed for item in self.checks)

    def to_dict(self) -> dict:
        """The result under the stable names of the CLI's JSON contract."""
        s, lim, beam = self.state, self.limits, self.beam
        result = {
            "units": beam.system.name,
            "beta1": s.beta1, "eps_ty": s.eps_ty, "a": s.a, "c": s.c,
            "eps_t": s.eps_t, "fs_t": s.fs_t, "eps_s": s.eps_s, "fs": s.fs,
            "steel_yields": s.steel_yields,
            "phi": s.phi, "Mn": self.Mn, "phiMn": self.phiMn,
            "rho": self.rho, "As": beam.As,
            "As_min": lim.As_min.value, "As_min_sqrt_term": lim.As_min.sqrt_term,
            "As_min_flat_term": lim.As_min.flat_term,
            "rho_min": lim.rho_min, "rho_tc": lim.rho_tc, "rho_max": lim.rho_max,
            "rho_b": lim.rho_b, "As_tc": lim.As_tc, "As_max": lim.As_max, "As_b": lim.As_b,
            "section_class": s.section_class.value,
            "b": beam.bw, "d": beam.d, "dt": beam.dt, "h": beam.h,
            "bf": None if beam.flange is None else beam.flange.width,
            "hf": None if beam.flange is None else beam.flange.thickness,
            "layers": [{"area": ls.layer.area, "depth": ls.layer.depth, "role": ls.layer.role.value,
                        "strain": ls.strain, "stress": ls.stress, "yields": ls.yields}
                       for ls in s.layers],
            "checks": [vars(item) for item in self.checks],
            "Mcr": self.Mcr, "ductility": self.ductility,
            "redistribution_percent": self.redistribution.percent,
            "ok": self.ok,
            "warnings": list(self.warnings),
            "caution": CAUTION,
        }
        if self.Mu is not None:
            result.update(Mu=self.Mu, utilization=self.utilization, As_req=self.As_req)
        # A limit no steel area can reach is infinite; JSON has no infinity, so null.
        return {key: None if isinstance(value, float) and math.isinf(value) else value
                for key, value in result.items()}


def check(*, Mu: object | None = None, **section) -> FlexuralCheck:
    """Check a beam section in flexure to ACI 318-19.

    `section` takes the keywords of `engine.section.beam.beam_section`: units, fc,
    fy, b, d, As, and optionally dt, es, spiral, h, bf, hf, asc, dc, layers.
    Inputs are in the base units of `units` ("us": psi, in, in², kip·ft;
    "si": MPa, mm, mm², kN·m). Raises `InputError` naming the first bad field.
    """
    beam = beam_section(**section)
    Mu_value = None if Mu is None else in_range(
        "Mu", Mu, beam.system.moment, hard_maximum(beam.system, "moment"), allow_zero=True)
    return check_beam(beam, Mu_value)


def check_beam(beam: BeamSection, Mu: float | None = None) -> FlexuralCheck:
    """`check` for an already validated beam; `Mu` in kip·ft or kN·m."""
    state = analyse(beam)
    limits = reinforcement_limits(beam)
    Mn = quoted_moment(state.Mn_base, beam.system)
    phiMn = state.phi * Mn
    As_req = None
    if Mu is not None and beam.As < limits.As_min.value:  # only 9.6.1.3 needs it
        As_req = _required_steel(beam, Mu)
    warnings = scope_warnings(beam) + section_warnings(beam) + _dt_warnings(beam)
    if not state.steel_yields:
        u = beam.system
        elastic = [f"{ls.stress:.5g} {u.stress} at {ls.layer.depth:g} {u.length}"
                   for ls in state.layers if ls.layer.role is Role.TENSION
                   and not (ls.yields and ls.stress > 0)]
        warnings += (
            f"Tension steel does not yield (fs = {', '.join(elastic)}; fy = {beam.fy:g} {u.stress}); "
            f"c found by strain compatibility (ACI 318-19 22.2.1.2, 20.2.2.1).",)
    for ls in state.layers:
        if ls.layer.role is Role.COMPRESSION and ls.strain > 0:
            warnings += (
                f"The compression steel at d' = {ls.layer.depth:g} {beam.system.length} lies below "
                f"the neutral axis (c = {state.c:.4g} {beam.system.length}) and is in tension "
                f"(fs = {ls.stress:.5g} {beam.system.stress}); it is counted so (22.2.1.2, 20.2.2.1).",)
    warnings += misplaced_tension_steel(beam, state.layers, state.c)
    warnings += _second_equilibrium_warning(beam, state.c)
    warnings += _unreachable_limit_warnings(beam, limits, state.eps_ty)
    checks = (_minimum_steel_check(beam, limits, As_req, Mu),
              _strain_limit_check(state))
    if Mu is not None:
        checks += (_strength_check(beam, phiMn, Mu),)
    return FlexuralCheck(beam=beam, state=state, limits=limits, Mn=Mn, phiMn=phiMn, Mu=Mu,
                         checks=checks, warnings=warnings)


# dt beyond the deepest layer given by more than this fraction of it is warned:
# a lumped layer stands for bars a layer or two apart (25.2.2), not for steel
# a quarter of the depth lower.
_DT_BELOW_STEEL = 0.25


def _second_equilibrium_warning(beam: BeamSection, c: float) -> tuple[str, ...]:
    """Two neutral-axis depths satisfy equilibrium: say which one the check reports."""
    b1 = beta1(beam.fc, beam.system)
    later = later_equilibrium(beam, b1, c)
    if later is None:
        return ()
    L = beam.system.length
    return (f"Two neutral-axis depths satisfy equilibrium (22.2.1.1): c = {c:.4g} {L} and "
            f"c = {later:.4g} {L}, because a bar at the edge of the stress block a = β1c "
            f"displaces its concrete as the block passes it. The check reports the smaller, "
            f"c = {c:.4g} {L}, the first equilibrium reached as the section is loaded; check "
            f"the compression steel's depth d'.",)


def _dt_warnings(beam: BeamSection) -> tuple[str, ...]:
    """A dt far below every tension layer given: εt, φ and 9.3.3.1 are read there."""
    deepest = max(layer.depth for layer in beam.tension_layers)
    if beam.dt <= (1 + _DT_BELOW_STEEL) * deepest:
        return ()
    L = beam.system.length
    return (f"dt = {beam.dt:g} {L} lies {beam.dt - deepest:.4g} {L} below the deepest tension "
            f"layer given ({deepest:g} {L}). dt is the depth of the extreme tension steel "
            f"(ACI 318-19 2.2); εt, φ (Table 21.2.2) and 9.3.3.1 are read there, so check it.",)


def _unreachable_limit_warnings(beam: BeamSection, limits: ReinforcementLimits,
                                eps_ty: float) -> tuple[str, ...]:
    """Why each limit that no positive tension steel area reaches is not given."""
    named = (("As,tc", limits.As_tc, eps_ty + TENSION_CONTROL_MARGIN,
              "the tension-controlled limit εt = εty + 0.003 (Table 21.2.2)"),
             ("As,max", limits.As_max, EPS_T_BEAM_MINIMUM, "εt = 0.004 (9.3.3.1)"),
             ("As,b", limits.As_b, eps_ty, "the balanced condition εt = εty (21.2.2)"))
    return tuple(f"{name} is not given: {unreachable_reason(beam, eps_t, what)}."
                 for name, area, eps_t, what in named if math.isinf(area))


def _required_steel(beam: BeamSection, Mu: float | None) -> float | None:
    return None if Mu is None else required_steel_for(beam, Mu)


def _minimum_steel_check(beam: BeamSection, limits: ReinforcementLimits,
                         As_req: float | None, Mu: float | None) -> CodeCheck:
    area = beam.system.area
    As_min = limits.As_min.value
    if beam.As >= As_min:
        return CodeCheck("9.6.1.2", "As ≥ As,min", True,
                         f"As = {beam.As:.4g} {area} ≥ As,min = {As_min:.4g} {area} "
                         f"({limits.As_min.governing} governs)")
    # 9.6.1.3: As,min need not be provided where As ≥ 4/3 of the As required by
    # analysis. As,req never grows as Mu falls, so neither can this check fail
    # where a larger Mu passed; As,req = 0 (other steel carries Mu) waives it too.
    if As_req is not None and beam.As >= 4 / 3 * As_req:
        why = " (the other steel carries Mu without it)" if As_req == 0 else ""
        return CodeCheck("9.6.1.3", "As ≥ As,min, or As ≥ 4/3 As,req", True,
                         f"As = {beam.As:.4g} {area} < As,min = {As_min:.4g} {area}, but "
                         f"As ≥ 4/3 × As,req = {4 / 3 * As_req:.4g} {area}{why}, "
                         f"so 9.6.1.2 is waived")
    if Mu is None:
        waiver = "9.6.1.3 could waive it only with Mu given, where As ≥ 4/3 of the As required"
    elif As_req is None:
        waiver = (f"no tension steel area at this b, d and dt carries Mu = {Mu:.4g} "
                  f"{beam.system.moment} with εt ≥ 0.004 (9.3.3.1), so there is no As,req "
                  f"for 9.6.1.3 to waive it")
    else:
        waiver = f"9.6.1.3 waives it only where As ≥ 4/3 × As,req = {4 / 3 * As_req:.4g} {area}"
    return CodeCheck("9.6.1.2", "As ≥ As,min", False,
                     f"As = {beam.As:.4g} {area} < As,min = {As_min:.4g} {area} "
                     f"({limits.As_min.governing} governs; {waiver})")


def _strain_limit_check(state: FlexuralState) -> CodeCheck:
    # As exactly at As,max (εt = 0.004 by construction) may compute a few ulps short.
    passed = state.eps_t >= EPS_T_BEAM_MINIMUM - STRAIN_ROUNDING
    sign = "≥" if passed else "<"
    return CodeCheck("9.3.3.1", "εt ≥ 0.004", passed,
                     f"εt = {state.eps_t:.5f} {sign} 0.004")


def _strength_check(beam: BeamSection, phiMn: float, Mu: float) -> CodeCheck:
    passed = phiMn >= Mu
    sign = "≥" if passed else "<"
    unit = beam.system.moment
    return CodeCheck("9.5.1.1", "φMn ≥ Mu", passed,
                     f"φMn = {phiMn:.4g} {unit} {sign} Mu = {Mu:.4g} {unit}")
