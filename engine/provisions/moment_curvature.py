"""Moment–curvature of a beam section, from zero to crushing, and μφ against ρ.

The model is `section_response`'s: plane sections, perfect bond, the
parabola-and-line concrete law in compression, linear tension up to fr
with cracked fibres carrying nothing, elastic–perfectly plastic steel, bars
displacing concrete, flanges at their own width. It leaves out confinement,
strain hardening, tension stiffening, bond slip and long-term effects.

Each state is found by fixing one strain condition (a curvature, or the
strain of one fibre) and solving for the neutral-axis depth c at which the
net axial force vanishes, with the engine's bracketed Illinois root finder
(`root_finding`). The three points:

- cracking: the extreme tension fibre (depth h) at εcr = fr/Ec (19.2.3.1),
  steel included in the section;
- first yield: the strain at dt at εty = fy/Es (21.2.2.1, 20.2.2.1); none
  where the extreme compression fibre reaches 0.003 first;
- crushing: the extreme compression fibre at εcu = 0.003 (22.2.2.1).

Curvature ductility μφ = φ(crushing)/φ(first yield). Alongside: Mcr of the
gross section (24.2.3.5), Mn by 22.2 with Mn/Mcr (9.6.1 exists so that
Mn > Mcr), and the moment redistribution 6.6.5 permits at Mn's εt.

Curvatures are in 1/in or 1/mm; moments cross the boundary in kip·ft or kN·m.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

from ..mechanics.cracking import cracking_moment
from ..mechanics.root_finding import least_root_from_above
from ..mechanics.section_response import ResponseModel, forces, response_model
from ..section.beam import BeamSection, beam_section
from ..section.errors import InputError
from ..section.materials import EPS_CU, yield_strain
from ..section.units import quoted_moment
from ..section.validation import hard_maximum, range_text
from .curve import last_ratio
from .flexure import analyse
from .limits import reinforcement_limits
from .redistribution import Redistribution, permitted_redistribution

DEFAULT_POINTS = 60
MIN_POINTS = 40
MAX_POINTS = 2_000
DEFAULT_SWEEP_POINTS = 40
MAX_SWEEP_POINTS = 1_000

JUST_AFTER_CRACKING = 1.001
"""The curve's point just past cracking sits at 1.001 φcr, where the cracked fibres first drop out."""

_RELATIVE_WIDTH = 1e-12  # the root search stops when c is known to this fraction
_RELATIVE_FORCE = 1e-12  # or when N is this fraction of the section's squash force
_MAX_STEPS = 300
_PRE_CRACKING_SHARE = 0.1  # of the curve's free points, spent on the straight elastic part


@dataclass(frozen=True)
class CurvaturePoint:
    """One equilibrium state: φ (1/in or 1/mm), M (kip·ft or kN·m) and two strains.

    `eps_top` is the extreme compression fibre's strain (compression positive),
    `eps_t` the strain at dt (tension positive), `c` the neutral-axis depth
    (None at zero curvature, where it is undefined).
    """

    curvature: float
    moment: float
    eps_top: float
    eps_t: float
    c: float | None

    def to_dict(self) -> dict:
        return {"curvature": self.curvature, "moment": self.moment, "eps_top": self.eps_top,
                "eps_t": self.eps_t}


@dataclass(frozen=True)
class MomentCurvature:
    """The curve, its three points and what they imply, in the units of `beam.system`."""

    beam: BeamSection
    Ec: float  # 19.2.2.1(b), psi or MPa
    fr: float  # 19.2.3.1
    eps0: float  # strain at f'c in the parabola, 2f'c/Ec
    eps_cr: float  # fr/Ec
    eps_ty: float  # fy/Es, 21.2.2.1
    cracking: CurvaturePoint | None
    first_yield: CurvaturePoint | None
    crushing: CurvaturePoint | None
    ductility: float | None  # μφ = φ(crushing)/φ(first yield)
    Mcr: float  # 24.2.3.5, gross section, kip·ft or kN·m
    Mn: float  # 22.2, kip·ft or kN·m
    redistribution: Redistribution  # 6.6.5, at Mn's εt
    points: tuple[CurvaturePoint, ...]
    warnings: tuple[str, ...]

    @property
    def Mn_over_Mcr(self) -> float:
        return self.Mn / self.Mcr

    def to_dict(self) -> dict:
        """The result under the stable names of the CLI's JSON contract."""
        def key_point(point: CurvaturePoint | None) -> dict | None:
            return None if point is None else {"curvature": point.curvature, "moment": point.moment}

        return {
            "units": self.beam.system.name,
            "Ec": self.Ec, "fr": self.fr, "eps0": self.eps0, "eps_cr": self.eps_cr,
            "eps_ty": self.eps_ty,
            "cracking": key_point(self.cracking), "first_yield": key_point(self.first_yield),
            "crushing": key_point(self.crushing), "ductility": self.ductility,
            "Mcr": self.Mcr, "Mn": self.Mn, "Mn_over_Mcr": self.Mn_over_Mcr,
            "eps_t": self.redistribution.eps_t,
            "redistribution_percent": self.redistribution.percent,
            "redistribution": self.redistribution.reason,
            "points": [point.to_dict() for point in self.points],
            "warnings": list(self.warnings),
        }


@dataclass(frozen=True)
class DuctilitySweep:
    """μφ against ρ = As/(bw·d), the tension layers scaled together as the capacity curve does.

    `ductility` is None where the section has no first yield (past about ρb).
    `rho_b` is ACI 318-19's balanced ratio (21.2.2, None where unreachable),
    `rho` the section's own.
    """

    units: str
    rho: tuple[float, ...]
    As: tuple[float, ...]
    ductility: tuple[float | None, ...]
    rho_b: float | None
    rho_section: float

    def to_dict(self) -> dict:
        return {"units": self.units, "rho": list(self.rho), "As": list(self.As),
                "ductility": list(self.ductility), "rho_b": self.rho_b, "rho_section": self.rho_section}


def moment_curvature(*, points: object = DEFAULT_POINTS, **inputs) -> MomentCurvature:
    """Moment–curvature of the section described by `inputs` (as for `engine.check`; h required).

    `points` (40 to 2,000) is how many points the curve has, zero and the
    three states included. Raises `InputError` naming the first bad field.
    """
    inputs.pop("Mu", None)
    beam = beam_section(**inputs)
    count = _whole_number("points", points, MIN_POINTS, MAX_POINTS)
    return curvature_for_beam(_with_depth(beam), count)


def ductility_sweep(*, points: object = DEFAULT_SWEEP_POINTS, **inputs) -> DuctilitySweep:
    """μφ at `points` (2 to 1,000) evenly spaced ρ from ρ_end/points up to the capacity curve's end."""
    inputs.pop("Mu", None)
    beam = beam_section(**inputs)
    count = _whole_number("points", points, 2, MAX_SWEEP_POINTS)
    return ductility_sweep_for_beam(_with_depth(beam), count)


def curvature_ductility(beam: BeamSection) -> float | None:
    """μφ of an already validated beam with h, or None without first yield (or without h)."""
    if beam.h is None:
        return None
    model = response_model(beam)
    crushing = _crushing(model, beam)
    first_yield = _first_yield(model, beam, crushing)
    return _ductility(first_yield, crushing)


def curvature_for_beam(beam: BeamSection, points: int = DEFAULT_POINTS) -> MomentCurvature:
    """`moment_curvature` for an already validated beam that has h."""
    model = response_model(beam)
    eps_ty = yield_strain(beam.fy, beam.es)
    cracking = _cracking(model, beam)
    crushing = _crushing(model, beam)
    first_yield = _first_yield(model, beam, crushing)
    state = analyse(beam)
    Mn = quoted_moment(state.Mn_base, beam.system)
    Mcr = quoted_moment(cracking_moment(beam), beam.system)
    curve = () if crushing is None else _curve(model, beam, cracking, first_yield, crushing, points)
    return MomentCurvature(
        beam=beam, Ec=model.ec, fr=model.fr, eps0=model.eps0, eps_cr=model.eps_cr, eps_ty=eps_ty,
        cracking=cracking, first_yield=first_yield, crushing=crushing,
        ductility=_ductility(first_yield, crushing), Mcr=Mcr, Mn=Mn,
        redistribution=permitted_redistribution(state.eps_t), points=curve,
        warnings=_warnings(beam, model, cracking, first_yield, crushing, Mn, Mcr))


def ductility_sweep_for_beam(beam: BeamSection, points: int = DEFAULT_SWEEP_POINTS) -> DuctilitySweep:
    """`ductility_sweep` for an already validated beam that has h."""
    limits = reinforcement_limits(beam)
    bd = beam.bw * beam.d
    rho_section = beam.As / bd
    rho_end = last_ratio(limits, rho_section)
    ratios = tuple(rho_end * i / points for i in range(1, points + 1))
    ductility = tuple(curvature_ductility(beam.with_tension_area(rho * bd)) for rho in ratios)
    return DuctilitySweep(units=beam.system.name, rho=ratios, As=tuple(rho * bd for rho in ratios),
                          ductility=ductility,
                          rho_b=limits.rho_b if math.isfinite(limits.rho_b) else None,
                          rho_section=rho_section)


def _whole_number(field: str, value: object, low: int, high: int) -> int:
    if isinstance(value, bool) or not isinstance(value, int) or not low <= value <= high:
        raise InputError(field, value, f"a whole number from {low} to {high:,}")
    return value


def _with_depth(beam: BeamSection) -> BeamSection:
    if beam.h is None:
        system = beam.system
        raise InputError("h", None, range_text(system.length, hard_maximum(system, "length")),
                         why="moment–curvature needs the overall depth: the concrete cracks "
                             "at the extreme tension fibre")
    return beam


def _ductility(first_yield: CurvaturePoint | None, crushing: CurvaturePoint | None) -> float | None:
    if first_yield is None or crushing is None:
        return None
    return crushing.curvature / first_yield.curvature


def _equilibrium(model: ResponseModel, beam: BeamSection, curvature_of: Callable[[float], float],
                 low: float, high: float, *, grow: bool = False) -> CurvaturePoint | None:
    """The state whose c makes N = 0 in (low, high], φ = curvature_of(c); None without a sign change.

    N(low) must be negative (everything pulls). With `grow`, `high` doubles
    until N(high) ≥ 0, as it must once every fibre is compressed.
    """
    def net_force(c: float) -> float:
        return forces(model, c, curvature_of(c))[0]

    f_low = net_force(low)
    f_high = net_force(high)
    for _ in range(60 if grow else 0):
        if f_high >= 0:
            break
        low, f_low = high, f_high
        high *= 2
        f_high = net_force(high)
    if not f_low < 0 <= f_high:
        return None
    squash = model.fc * model.h * model.flange_width + model.fy * sum(a for a, _ in model.layers)
    tolerance = _RELATIVE_FORCE * squash
    c = least_root_from_above(
        net_force, low, f_low, high, f_high,
        lambda lo, hi, f_hi: f_hi <= tolerance or hi - lo <= _RELATIVE_WIDTH * hi, _MAX_STEPS)
    return _point(model, beam, c, curvature_of(c))


def _point(model: ResponseModel, beam: BeamSection, c: float, phi: float) -> CurvaturePoint:
    moment = forces(model, c, phi)[1]
    return CurvaturePoint(curvature=phi, moment=quoted_moment(moment, beam.system),
                          eps_top=phi * c, eps_t=phi * (beam.dt - c), c=c)


def _cracking(model: ResponseModel, beam: BeamSection) -> CurvaturePoint | None:
    """The extreme tension fibre (depth h) at −εcr, searched while the top stays within 0.003."""
    h, eps_cr = model.h, model.eps_cr
    return _equilibrium(model, beam, lambda c: eps_cr / (h - c), 0.0, EPS_CU * h / (EPS_CU + eps_cr))


def _crushing(model: ResponseModel, beam: BeamSection) -> CurvaturePoint | None:
    """The extreme compression fibre at εcu = 0.003 (22.2.2.1)."""
    return _equilibrium(model, beam, lambda c: EPS_CU / c, 1e-9 * model.h, model.h, grow=True)


def _first_yield(model: ResponseModel, beam: BeamSection,
                 crushing: CurvaturePoint | None) -> CurvaturePoint | None:
    """The strain at dt at −εty, or None where the top reaches 0.003 first.

    Searched up to the balanced profile (0.003 at the top, εty at dt): the
    crushing state lies beyond εty at dt, so equilibrium is reached before.
    """
    eps_ty, dt = yield_strain(beam.fy, beam.es), beam.dt
    if crushing is None or crushing.eps_t < eps_ty:
        return None
    point = _equilibrium(model, beam, lambda c: eps_ty / (dt - c), 0.0,
                         EPS_CU * dt / (EPS_CU + eps_ty))
    return point if point is not None and point.eps_top <= EPS_CU else None


def _at_curvature(model: ResponseModel, beam: BeamSection, phi: float) -> CurvaturePoint | None:
    return _equilibrium(model, beam, lambda c: phi, 0.0, model.h, grow=True)


def _curve(model: ResponseModel, beam: BeamSection, cracking: CurvaturePoint | None,
           first_yield: CurvaturePoint | None, crushing: CurvaturePoint,
           points: int) -> tuple[CurvaturePoint, ...]:
    """`points` states from zero to crushing, the three states and 1.001 φcr among them.

    The straight elastic part gets a tenth of the free points, evenly spaced;
    the rest are spaced evenly in log φ between the states, so the steep fall
    after cracking and the knee at yield are drawn closely.
    """
    phi_u = crushing.curvature
    anchors = {crushing.curvature: crushing}
    for point in (cracking, first_yield):
        if point is not None and point.curvature < phi_u:
            anchors[point.curvature] = point
    if cracking is not None and JUST_AFTER_CRACKING * cracking.curvature < phi_u:
        after = _at_curvature(model, beam, JUST_AFTER_CRACKING * cracking.curvature)
        if after is not None:
            anchors[after.curvature] = after
    ordered = sorted(anchors)
    free = points - 1 - len(ordered)
    gaps = list(zip(ordered, ordered[1:]))
    weights = [math.log(high / low) for low, high in gaps]
    first = free if not gaps or sum(weights) <= 0 else max(2, round(_PRE_CRACKING_SHARE * free))
    counts = _shares(free - first, weights)
    curvatures = [ordered[0] * j / (first + 1) for j in range(1, first + 1)]
    for (low, high), count in zip(gaps, counts):
        curvatures += [low * (high / low) ** (j / (count + 1)) for j in range(1, count + 1)]
    solved = [point for point in (_at_curvature(model, beam, phi) for phi in curvatures)
              if point is not None]
    zero = CurvaturePoint(curvature=0.0, moment=0.0, eps_top=0.0, eps_t=0.0, c=None)
    return tuple(sorted([zero, *anchors.values(), *solved], key=lambda point: point.curvature))


def _shares(total: int, weights: list[float]) -> list[int]:
    """`total` split in proportion to `weights`, whole numbers by largest remainder."""
    weight_sum = sum(weights)
    if total <= 0 or weight_sum <= 0:
        return [0] * len(weights)
    exact = [total * weight / weight_sum for weight in weights]
    counts = [math.floor(value) for value in exact]
    by_remainder = sorted(range(len(weights)), key=lambda i: counts[i] - exact[i])
    for i in by_remainder[:total - sum(counts)]:
        counts[i] += 1
    return counts


def _warnings(beam: BeamSection, model: ResponseModel, cracking: CurvaturePoint | None,
              first_yield: CurvaturePoint | None, crushing: CurvaturePoint | None,
              Mn: float, Mcr: float) -> tuple[str, ...]:
    u = beam.system
    warnings = []
    if Mn <= Mcr:
        warnings.append(
            f"Mn = {Mn:.4g} {u.moment} ≤ Mcr = {Mcr:.4g} {u.moment} (ACI 318-19 24.2.3.5): the "
            f"section would fail as the concrete cracks; the minimum steel of 9.6.1 exists to "
            f"prevent this.")
    if crushing is None:
        warnings.append("No equilibrium was found with the extreme compression fibre at "
                        "εcu = 0.003 (22.2.2.1): the steel cannot be balanced by the concrete.")
    elif first_yield is None:
        warnings.append(
            f"The steel at dt does not yield before the extreme compression fibre reaches "
            f"εcu = 0.003 (strain at dt then {crushing.eps_t:.5f} < εty = "
            f"{yield_strain(beam.fy, beam.es):.5f}): no first yield, so no curvature ductility.")
    if cracking is not None and first_yield is not None and first_yield.curvature < cracking.curvature:
        warnings.append("The steel at dt yields before the concrete cracks (fy is very low): the "
                        "first-yield point comes before the cracking point on the curve.")
    if model.eps0 >= EPS_CU:
        warnings.append(
            f"ε0 = 2f'c/Ec = {model.eps0:.5f} lies beyond εcu = 0.003: at crushing the concrete "
            f"is still on the rising parabola and never reaches f'c.")
    return tuple(warnings)
