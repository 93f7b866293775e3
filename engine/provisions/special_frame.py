"""What one section of a special moment frame beam can show, ACI 318-19 Chapter 18.

A beam of a special moment frame must be ductile, and 18.6 adds rules to the
flexural check. Those a single section can show are checked here:

- 18.6.3.1: at the top and at the bottom, As ≥ As,min of 9.6.1.2 (without
  the 9.6.1.3 waiver, which 18.6.3.1 does not call on) and ρ = As/(bw·d) at
  most 0.025 for Grade 60 and 0.020 for Grade 80 (from memory; a fy between
  the two takes the stricter);
- 18.6.3.2: at a joint face the positive-moment strength at least half the
  negative-moment strength, compared as nominal strengths Mn (the clause
  compares "moment strengths"; φ is the same for both faces when both are
  tension-controlled, and nominal values keep the comparison free of it);
- 9.3.3.1 for the negative-moment section too (εt ≥ 0.004), since it is a
  beam section like the positive one;
- the probable flexural strengths Mpr+ and Mpr− (ACI 318-19 2.3, used by
  18.6.5.1): the same strain-compatibility analysis with every bar's stress
  capped at 1.25 fy instead of fy, and φ = 1.0;
- 20.2.2.5 as warnings: the bar grade and mill properties it asks for cannot
  be told from fy.

The section as `engine.check` takes it is the positive-moment section, its
tension steel the bottom bars. The top bars are `top_As` at `top_d`, where
`top_d` is the effective depth for negative moment: from the bottom face (the
compression face under negative moment) to the top bars' centroid. The
negative-moment section is the web alone (bw wide: a flange, on the top, is
then in tension and carries nothing, 22.2.2.2), with the top bars in tension
and, when `h` is given, the bottom bars as compression steel at h − depth.
Without `top_As` the top checks cannot be made and are listed as not checked
(never passed). Moments are in kip·ft or kN·m.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from ..section.beam import BeamSection, Role, SteelLayer, _both_or_neither, beam_section
from ..section.errors import InputError
from ..section.units import quoted_moment
from ..section.validation import hard_maximum, in_range
from .checks import CodeCheck, _strain_limit_check
from .flexure import FlexuralState, analyse
from .limits import AsMin, minimum_steel

PROBABLE_STRESS_FACTOR = 1.25
"""Mpr takes the bars' tensile stress as at least 1.25 fy, with φ = 1.0: ACI 318-19 2.3, 18.6.5.1."""

POSITIVE_TO_NEGATIVE = 0.5
"""Positive-moment strength at a joint face ≥ ½ the negative-moment strength, ACI 318-19 18.6.3.2."""

# ACI 318-19 18.6.3.1 (from memory): ρ ≤ 0.025 for Grade 60, ≤ 0.020 for Grade 80.
# Keyed per system: (fy of Grade 60, its ρ limit, the ρ limit above it).
RHO_MAX_SPECIAL = {"us": (60_000.0, 0.025, 0.020), "si": (420.0, 0.025, 0.020)}

# ACI 318-19 20.2.2.5: the only grades permitted, Grade 60 and Grade 80, in psi or MPa,
# and how far the mill yield may exceed fy for A615 bars (18,000 psi / 125 MPa).
SEISMIC_GRADES = {"us": (60_000.0, 80_000.0), "si": (420.0, 550.0)}
YIELD_EXCESS_TEXT = {"us": "18,000 psi", "si": "125 MPa"}

OUT_OF_SCOPE = (
    "Only what one section shows is checked. Member-level rules of ACI 318-19 Chapter 18 are "
    "out of scope and must be checked separately: the dimensional limits of 18.6.2; at least two "
    "continuous bars top and bottom, and no moment strength along the member below ¼ of the "
    "largest at either joint face (18.6.3.1, 18.6.3.2); lap splices (18.6.3.3); hoops and "
    "transverse reinforcement (18.6.4); shear strength from Mpr (18.6.5); joint shear and "
    "anchorage (18.8); column strength, strong column–weak beam (18.7.3.2); development and "
    "splices of bars (18.8.5, 25.4, 25.5)."
)


@dataclass(frozen=True)
class NotChecked:
    """A rule the inputs given cannot decide: neither passed nor failed."""

    clause: str
    title: str
    reason: str


@dataclass(frozen=True)
class SpecialFrameCheck:
    """The special moment frame checks of one section, in the units of `beam.system`.

    `positive` is the section at Mn+ (bottom bars in tension), `negative` the
    flipped section at Mn− (None without top steel); `*_probable` the same at
    1.25 fy. Moments in kip·ft or kN·m; `strength_basis` says what 18.6.3.2 compares.
    """

    beam: BeamSection
    negative_beam: BeamSection | None
    positive: FlexuralState
    negative: FlexuralState | None
    positive_probable: FlexuralState
    negative_probable: FlexuralState | None
    rho_limit: float
    As_min_bottom: AsMin
    As_min_top: AsMin | None
    checks: tuple[CodeCheck, ...]
    not_checked: tuple[NotChecked, ...]
    warnings: tuple[str, ...]
    strength_basis: str = "nominal, φ not applied"
    out_of_scope: str = OUT_OF_SCOPE

    @property
    def Mn_pos(self) -> float:
        return quoted_moment(self.positive.Mn_base, self.beam.system)

    @property
    def Mn_neg(self) -> float | None:
        return None if self.negative is None else quoted_moment(self.negative.Mn_base,
                                                                self.beam.system)

    @property
    def Mpr_pos(self) -> float:
        return quoted_moment(self.positive_probable.Mn_base, self.beam.system)

    @property
    def Mpr_neg(self) -> float | None:
        return None if self.negative_probable is None else quoted_moment(
            self.negative_probable.Mn_base, self.beam.system)

    @property
    def rho_bottom(self) -> float:
        return self.beam.As / (self.beam.bw * self.beam.d)

    @property
    def rho_top(self) -> float | None:
        top = self.negative_beam
        return None if top is None else top.As / (top.bw * top.d)

    @property
    def ok(self) -> bool:
        """Every check passed and none was left undecided."""
        return not self.not_checked and all(item.passed for item in self.checks)

    def to_dict(self) -> dict:
        """The `special_frame` object of the CLI's JSON."""
        top = self.negative_beam

        def block(state: FlexuralState | None) -> dict | None:
            return None if state is None else {"a": state.a, "c": state.c, "eps_t": state.eps_t}

        return {
            "units": self.beam.system.name,
            "strength_basis": self.strength_basis,
            "Mn_pos": self.Mn_pos, "Mn_neg": self.Mn_neg,
            "Mpr_pos": self.Mpr_pos, "Mpr_neg": self.Mpr_neg,
            "probable_stress_factor": PROBABLE_STRESS_FACTOR,
            "positive": block(self.positive), "negative": block(self.negative),
            "positive_probable": block(self.positive_probable),
            "negative_probable": block(self.negative_probable),
            "top_As": None if top is None else top.As, "top_d": None if top is None else top.d,
            "rho_bottom": self.rho_bottom, "rho_top": self.rho_top, "rho_limit": self.rho_limit,
            "As_min_bottom": self.As_min_bottom.value,
            "As_min_top": None if self.As_min_top is None else self.As_min_top.value,
            "checks": [vars(item) for item in self.checks],
            "not_checked": [vars(item) for item in self.not_checked],
            "ok": self.ok,
            "warnings": list(self.warnings),
            "out_of_scope": self.out_of_scope,
        }


def special_frame_check(*, top_As: object | None = None, top_d: object | None = None,
                        **section) -> SpecialFrameCheck:
    """The special moment frame checks for a beam section, ACI 318-19 18.6.3, 18.6.5, 20.2.2.5.

    `section` takes `engine.check`'s section keywords (not Mu); `top_As` at
    `top_d` are the top bars (area, and depth from the bottom face), both or
    neither. Raises `InputError` naming the first bad field.
    """
    beam = beam_section(**section)
    top = _top_steel(beam, top_As, top_d)
    return special_frame_for_beam(beam, *(top or (None, None)))


def special_frame_for_beam(beam: BeamSection, top_As: float | None = None,
                           top_d: float | None = None) -> SpecialFrameCheck:
    """`special_frame_check` for a validated beam and top steel (both or neither)."""
    system = beam.system
    grade60, rho_grade60, rho_grade80 = RHO_MAX_SPECIAL[system.name]
    rho_limit = rho_grade60 if beam.fy <= grade60 else rho_grade80
    positive = analyse(beam)
    positive_probable = analyse(_probable(beam))
    As_min_bottom = minimum_steel(beam)
    checks = [_rho_check("bottom", beam, rho_limit), _minimum_check("bottom", beam, As_min_bottom)]
    not_checked: list[NotChecked] = []
    negative_beam = negative = negative_probable = As_min_top = None
    if top_As is None:
        reason = "the top steel is not given (top_As and top_d)"
        not_checked += [NotChecked("18.6.3.1", f"top ρ ≤ {rho_limit:g}", reason),
                        NotChecked("18.6.3.1", "top As ≥ As,min (9.6.1.2)", reason),
                        NotChecked("18.6.3.2", "Mn+ ≥ ½ Mn− at the joint face", reason),
                        NotChecked("9.3.3.1", "εt ≥ 0.004 under negative moment", reason)]
    else:
        negative_beam = _negative_section(beam, top_As, top_d)
        negative = analyse(negative_beam)
        negative_probable = analyse(_probable(negative_beam))
        As_min_top = minimum_steel(negative_beam)
        checks += [_rho_check("top", negative_beam, rho_limit),
                   _minimum_check("top", negative_beam, As_min_top),
                   _half_strength_check(beam, positive, negative),
                   _negative_strain_check(negative)]
    return SpecialFrameCheck(
        beam=beam, negative_beam=negative_beam, positive=positive, negative=negative,
        positive_probable=positive_probable, negative_probable=negative_probable,
        rho_limit=rho_limit, As_min_bottom=As_min_bottom, As_min_top=As_min_top,
        checks=tuple(checks), not_checked=tuple(not_checked),
        warnings=_grade_warnings(beam) + _geometry_warnings(beam, top_As, top_d))


def _top_steel(beam: BeamSection, top_As: object | None,
               top_d: object | None) -> tuple[float, float] | None:
    """The validated top steel (area, depth from the bottom face), or None when not given."""
    if top_As is None and top_d is None:
        return None
    system = beam.system
    max_length = hard_maximum(system, "length")
    _both_or_neither(("top_As", top_As, system.area, beam.bw * max_length),
                     ("top_d", top_d, system.length, max_length), "the top steel")
    area = in_range("top_As", top_As, system.area, beam.bw * max_length)
    depth = in_range("top_d", top_d, system.length, max_length)
    L = system.length
    if beam.h is not None:
        if depth > beam.h:
            raise InputError("top_d", top_d, f"at most h = {beam.h:g} {L}",
                             why="the top bars must lie within the section")
        # The bottom bars, seen from the bottom face, must lie above the top bars' centroid.
        bottom = max(beam.h - layer.depth for layer in beam.tension_layers)
        if depth <= bottom:
            raise InputError("top_d", top_d, f"more than {bottom:g} {L}, the bottom bars' depth "
                             f"from the bottom face (h − d)",
                             why="top_d is measured from the bottom face")
    gross = beam.bw * (beam.h if beam.h is not None else depth)
    if area >= gross:
        raise InputError("top_As", top_As, f"less than the gross area {gross:g} {system.area}")
    return area, depth


def _negative_section(beam: BeamSection, top_As: float, top_d: float) -> BeamSection:
    """The section under negative moment: top bars in tension, the web alone in compression.

    With h, the bottom bars are compression steel at h − depth from the bottom face;
    a compression layer the user gave (A's) is not carried over: the top bars stand for it.
    """
    layers = [SteelLayer(top_As, top_d, Role.TENSION)]
    if beam.h is not None:
        layers += [SteelLayer(layer.area, beam.h - layer.depth, Role.COMPRESSION)
                   for layer in beam.tension_layers]
    return BeamSection(system=beam.system, fc=beam.fc, fy=beam.fy, es=beam.es, bw=beam.bw,
                       layers=tuple(layers), dt=top_d, h=beam.h, flange=None,
                       spiral=beam.spiral)


def _probable(beam: BeamSection) -> BeamSection:
    """The section with every bar's stress capped at 1.25 fy (ACI 318-19 2.3, 18.6.5.1)."""
    return replace(beam, fy=PROBABLE_STRESS_FACTOR * beam.fy)


def _rho_check(face: str, beam: BeamSection, limit: float) -> CodeCheck:
    rho = beam.As / (beam.bw * beam.d)  # ρ = As/(bw·d), ACI 318-19 18.6.3.1
    passed = rho <= limit
    sign = "≤" if passed else ">"
    u = beam.system
    return CodeCheck("18.6.3.1", f"{face} ρ ≤ {limit:g}", passed,
                     f"ρ = {beam.As:.4g} {u.area} / ({beam.bw:g} {u.length} × {beam.d:.4g} "
                     f"{u.length}) = {rho:.5f} {sign} {limit:g} (0.025 for Grade 60, 0.020 for Grade 80)")


def _minimum_check(face: str, beam: BeamSection, As_min: AsMin) -> CodeCheck:
    passed = beam.As >= As_min.value  # 18.6.3.1 asks for 9.6.1.2 at top and bottom
    sign = "≥" if passed else "<"
    area = beam.system.area
    return CodeCheck("18.6.3.1", f"{face} As ≥ As,min (9.6.1.2)", passed,
                     f"As = {beam.As:.4g} {area} {sign} As,min = {As_min.value:.4g} {area} "
                     f"({As_min.governing} governs; the 9.6.1.3 waiver does not apply)")


def _half_strength_check(beam: BeamSection, positive: FlexuralState,
                         negative: FlexuralState) -> CodeCheck:
    Mn_pos = quoted_moment(positive.Mn_base, beam.system)
    Mn_neg = quoted_moment(negative.Mn_base, beam.system)
    passed = Mn_pos >= POSITIVE_TO_NEGATIVE * Mn_neg
    sign = "≥" if passed else "<"
    unit = beam.system.moment
    return CodeCheck("18.6.3.2", "Mn+ ≥ ½ Mn− at the joint face", passed,
                     f"Mn+ = {Mn_pos:.4g} {unit} {sign} ½ × Mn− = "
                     f"{POSITIVE_TO_NEGATIVE * Mn_neg:.4g} {unit} (Mn+/Mn− = "
                     f"{Mn_pos / Mn_neg:.3f}; nominal strengths)")


def _negative_strain_check(negative: FlexuralState) -> CodeCheck:
    """9.3.3.1 as `check` applies it, for the negative-moment section."""
    made = _strain_limit_check(negative)
    return replace(made, title=f"{made.title} under negative moment",
                   detail=f"{made.detail} at the top bars")


def _grade_warnings(beam: BeamSection) -> tuple[str, ...]:
    """20.2.2.5: the bar grade and mill properties, which fy alone cannot show."""
    u = beam.system
    grades = SEISMIC_GRADES[u.name]
    text = (f"ACI 318-19 20.2.2.5: bars resisting earthquake moment in a special moment frame "
            f"must be ASTM A706 Grade {_grade(grades[0], u.name)} or {_grade(grades[1], u.name)}, "
            f"or ASTM A615 of those grades whose actual yield strength exceeds fy by at most "
            f"{YIELD_EXCESS_TEXT[u.name]}, whose actual tensile-to-yield strength ratio is at "
            f"least 1.25, and, for Grade {_grade(grades[1], u.name)}, the minimum elongation "
            f"20.2.2.5 lists; the check cannot tell the bar grade or mill properties from fy, so confirm them.")
    warnings = [text]
    if not any(math.isclose(beam.fy, grade, rel_tol=1e-9) for grade in grades):
        warnings.append(
            f"fy = {beam.fy:g} {u.stress} is neither {grades[0]:g} nor {grades[1]:g} {u.stress}: "
            f"ACI 318-19 20.2.2.5 permits only Grade {_grade(grades[0], u.name)} and "
            f"{_grade(grades[1], u.name)} bars in special seismic systems.")
    return tuple(warnings)


def _grade(fy: float, system: str) -> str:
    """The grade name of a fy: 60000 psi is Grade 60, 420 MPa is Grade 420."""
    return f"{fy / 1000:g}" if system == "us" else f"{fy:g}"


def _geometry_warnings(beam: BeamSection, top_As: float | None,
                       top_d: float | None) -> tuple[str, ...]:
    u = beam.system
    warnings = []
    if top_As is not None and beam.h is None:
        warnings.append(
            "Without h the bottom bars are not counted as compression steel under negative "
            "moment, so Mn− and Mpr− may be slightly low (and 18.6.3.2 slightly easy); give h.")
    asc = sum(layer.area for layer in beam.layers if layer.role is Role.COMPRESSION)
    if top_As is not None and asc and not math.isclose(asc, top_As, rel_tol=1e-9):
        warnings.append(
            f"A's = {asc:g} {u.area} (compression steel under positive moment) differs from the "
            f"top steel top_As = {top_As:g} {u.area}; Mn+ counts A's as given.")
    if top_As is not None and beam.h is not None and not asc:
        warnings.append(
            f"Mn+ and Mpr+ leave the top bars out as compression steel (no A's given); to count "
            f"them give asc = {top_As:g} {u.area} and dc = {beam.h - top_d:g} {u.length}.")
    return tuple(warnings)
