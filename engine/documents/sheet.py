"""The calculation sheet: one check written out for filing, as one HTML page.

`calculation_sheet` returns a complete, self-contained HTML document (inline
CSS, no scripts, no outside resources) that prints on two Letter or A4
pages, each headed by the project, beam mark, date and "page N of 2": a
header of user text (project, beam mark, engineer, checked by, date; a blank
line where none was typed), the inputs with their units and the bars as
placed beside the section drawn to scale (`section_drawing`), every step as
its equation, the equation with the numbers put in and the result, each
with its ACI 318-19 clause, the checks, the warnings, with h the curvature
ductility μφ, Mcr, Mn/Mcr and the 6.6.5 redistribution (the engine's
moment–curvature values), the caution and the share link with its QR code
(and, for a link to this machine or a private network, where it opens).

It covers every section `engine.check` takes. A singly reinforced rectangle
with one steel layer is written out in the textbook closed form (a from
C = T, then c). Any other section (a T or L flange, compression steel,
several tension layers, an overall depth h) is written out by strain
compatibility, as the engine solves it: c from the force balance; the block
over the flange only or over flange and web, with the equation for each
case; each layer's strain, stress, yield and force (a bar inside the block
displaces its concrete: (fs − 0.85 f'c)·As); the force balance; Mn as the
sum of moments about the tension centroid d.

Every number on the sheet is an input or a value of the engine's result,
formatted; none is computed here another way. The only arithmetic done here
is for the substituted lines: the forces and the limit ratios are shown by
the engine's own functions (the block of 22.2.2.4.1, each layer's force by
22.2.1.2 and 20.2.2.1), so a reviewer can follow them and the sums agree
with the engine's result.

User text is always escaped, never rendered as HTML.
"""

from __future__ import annotations

import html
import ipaddress
import math
import re
from collections.abc import Mapping
from dataclasses import dataclass
from urllib.parse import urlsplit

from ..mechanics.equilibrium import in_block, layer_force
from ..mechanics.stress_block import block_force, compressed_area
from ..provisions.checks import CAUTION, FlexuralCheck, check
from ..provisions.limits import AS_MIN_COEFFICIENTS, forces_at_strain
from ..provisions.special_frame import special_frame_check
from ..section.bar_groups import bar_group
from ..section.beam import BeamSection, Role
from ..section.errors import InputError
from ..section.materials import BETA1_TABLE, EPS_CU, steel_stress
from ..section.units import UnitSystem, unit_system
from .number_text import significant
from .section_drawing import section_svg
from .share_link import format_number, read_bars

SHEET_INPUTS = ("units", "fc", "fy", "b", "d", "As", "dt", "es", "Mu", "spiral", "h", "bf", "hf",
                "asc", "dc", "layers")
"""The `engine.check` keywords a sheet covers: all of them."""

# The code's constants as printed, taken from the engine so the two cannot drift:
# Table 22.2.2.4.3 (f'c bounds of its rows, step) and 9.6.1.2's coefficients.
_BETA1_ROWS = {system: tuple(f"{x:g}" for x in row) for system, row in BETA1_TABLE.items()}
_AS_MIN_TEXT = {system: tuple(f"{x:g}" for x in pair)
                for system, pair in AS_MIN_COEFFICIENTS.items()}
_CONTROL_CHARACTERS = re.compile(r"[\x00-\x08\x0b-\x1f\x7f]")

_FC, _FY, _ES = "f′<sub>c</sub>", "f<sub>y</sub>", "E<sub>s</sub>"
_AS, _DT, _FS = "A<sub>s</sub>", "d<sub>t</sub>", "f<sub>s</sub>"
_B1, _EPS_CU, _EPS_TY = "β<sub>1</sub>", "ε<sub>cu</sub>", "ε<sub>ty</sub>"
_EPS_T, _EPS_S, _MN = "ε<sub>t</sub>", "ε<sub>s</sub>", "M<sub>n</sub>"


@dataclass(frozen=True)
class SheetStep:
    """One line of the calculation: HTML fragments built only from fixed text and numbers.

    `key` is the name of `value` in `FlexuralCheck.to_dict()`, or for the
    general write-up a name of the sheet's own (Ac, y_c, Cc, layer1, balance).
    `keyed_result` means `result` carries its own `data-key` spans (a layer
    row shows strain, stress and force); `group` is "strength" or "limits".
    """

    key: str
    quantity: str
    equation: str
    substituted: str
    result: str
    value: float
    clause: str
    keyed_result: bool = False
    group: str = "strength"


def _q(value: float, unit: str = "", digits: int = 4) -> str:
    """A formatted quantity with its (escaped) unit."""
    text = significant(value, digits)
    return f"{text} {html.escape(unit)}" if unit else text


def _given(value: float, unit: str = "") -> str:
    """An input exactly as the engine received it (shortest exact form)."""
    text = format_number(value).replace("-", "−")
    return f"{text} {html.escape(unit)}" if unit else text


@dataclass(frozen=True)
class _Inputs:
    system: UnitSystem
    fc: float
    fy: float
    b: float
    d: float
    dt: float
    As: float
    es: float
    Mu: float | None
    spiral: bool


def _inputs(inputs: Mapping[str, object], beam: BeamSection) -> _Inputs:
    """A one-layer rectangle's inputs as the engine used them (dt, Es defaulted)."""
    layer = beam.layers[0]
    Mu = inputs.get("Mu")
    return _Inputs(system=beam.system, fc=beam.fc, fy=beam.fy, b=beam.bw, d=layer.depth,
                   As=layer.area, dt=beam.dt, es=beam.es,
                   Mu=None if Mu is None else float(Mu),  # type: ignore[arg-type]
                   spiral=beam.spiral)


def _strength_steps(x: _Inputs, r: dict) -> list[SheetStep]:
    u = x.system
    L, A, S, M = u.length, u.area, u.stress, u.moment
    steps = _common_steps(u, x.fc, x.fy, x.es, r)
    if r["steel_yields"]:
        steps.append(SheetStep(
            "a", "a", f"a = {_AS} {_FY} / (0.85 {_FC} b)",
            f"{_given(x.As, A)} × {_given(x.fy, S)} / (0.85 × {_given(x.fc, S)} × {_given(x.b, L)})",
            _q(r["a"], L), r["a"], "22.2.2.4.1, C = T (22.2.1.1)"))
        steps.append(SheetStep(
            "c", "c", f"c = a / {_B1}", f"{_q(r['a'], L)} / {_q(r['beta1'], digits=3)}",
            _q(r["c"], L), r["c"], "22.2.2.4.1"))
    else:
        steps.append(SheetStep(
            "c", "c",
            f"0.85 {_FC} b {_B1} c = {_AS} {_ES} {_EPS_CU} (d − c) / c, solved for c &gt; 0",
            f"0.85 × {_given(x.fc, S)} × {_given(x.b, L)} × {_q(r['beta1'], digits=3)} × c = "
            f"{_given(x.As, A)} × {_given(x.es, S)} × {EPS_CU} × ({_given(x.d, L)} − c) / c",
            _q(r["c"], L), r["c"], "C = T (22.2.1.1) with 22.2.1.2, 20.2.2.1"))
        steps.append(SheetStep(
            "a", "a", f"a = {_B1} c", f"{_q(r['beta1'], digits=3)} × {_q(r['c'], L)}",
            _q(r["a"], L), r["a"], "22.2.2.4.1"))
    steps.append(SheetStep(
        "eps_t", _EPS_T, f"{_EPS_T} = {_EPS_CU} ({_DT} − c) / c",
        f"{EPS_CU} × ({_given(x.dt, L)} − {_q(r['c'], L)}) / {_q(r['c'], L)}",
        _q(r["eps_t"]), r["eps_t"], "22.2.1.2, 22.2.2.1"))
    strain = (f"{_EPS_S} = {_EPS_CU} (d − c) / c = {EPS_CU} × ({_given(x.d, L)} − {_q(r['c'], L)})"
              f" / {_q(r['c'], L)} = {_q(r['eps_s'])}")
    if r["steel_yields"]:
        steps.append(SheetStep(
            "fs", _FS, f"{_FS} = {_FY} when {_EPS_S} ≥ {_EPS_TY}",
            f"{strain} ≥ {_q(r['eps_ty'])}", _q(r["fs"], S), r["fs"], "20.2.2.1"))
    else:
        steps.append(SheetStep(
            "fs", _FS, f"{_FS} = {_ES} {_EPS_S} when {_EPS_S} &lt; {_EPS_TY}",
            f"{strain} &lt; {_q(r['eps_ty'])}; {_given(x.es, S)} × {_q(r['eps_s'])}",
            _q(r["fs"], S), r["fs"], "20.2.2.1"))
    steps.append(_phi_step(x.spiral, r))
    factor = format_number(u.moment_to_base)
    base_moment = f"{u.force}·{u.length}"
    steps.append(SheetStep(
        "Mn", _MN, f"{_MN} = {_AS} {_FS} (d − a/2)",
        f"{_given(x.As, A)} × {_q(r['fs'], S)} × ({_given(x.d, L)} − {_q(r['a'], L)}/2)"
        f" = {_q(r['Mn'] * u.moment_to_base, base_moment)} ÷ {factor}",
        _q(r["Mn"], M), r["Mn"], "22.2.2.4.1, 22.2.1.1"))
    return steps + _capacity_steps(r, M)


def _phi_step(spiral: bool, r: dict) -> SheetStep:
    low, span = ("0.75", "0.15") if spiral else ("0.65", "0.25")
    kind = "spiral (25.7.3)" if spiral else "other transverse reinforcement"
    limit = f"{_q(r['eps_ty'])} + 0.003 = {_q(r['eps_ty'] + 0.003)}"
    section_class = r["section_class"]
    if section_class == "tension-controlled":
        eq = f"φ = 0.90 when {_EPS_T} ≥ {_EPS_TY} + 0.003"
        sub = f"{_EPS_T} = {_q(r['eps_t'])} ≥ {limit}"
    elif section_class == "compression-controlled":
        eq = f"φ = {low} when {_EPS_T} ≤ {_EPS_TY} ({kind})"
        sub = f"{_EPS_T} = {_q(r['eps_t'])} ≤ {_q(r['eps_ty'])}"
    else:
        eq = f"φ = {low} + {span} ({_EPS_T} − {_EPS_TY}) / 0.003 ({kind})"
        sub = f"{low} + {span} × ({_q(r['eps_t'])} − {_q(r['eps_ty'])}) / 0.003"
    return SheetStep("phi", "φ", eq, sub, f"{_q(r['phi'], digits=3)} ({html.escape(section_class)})",
                     r["phi"], "Table 21.2.2")


def _limit_steps(x: _Inputs, r: dict) -> list[SheetStep]:
    steps = _minimum_steps(x.system, x.fc, x.fy, x.b, x.d, x.As, r, exact_d=True)
    for limit in _LIMITS(r):
        steps.append(_limit_ratio_step(x, r, *limit))
    return steps


def _minimum_steps(u: UnitSystem, fc: float, fy: float, bw: float, d: float, As: float, r: dict,
                   *, exact_d: bool) -> list[SheetStep]:
    """As,min by 9.6.1.2 on bw·d, ρmin and ρ; `exact_d`: d is an input (else the centroid)."""
    L, A, S = u.length, u.area, u.stress
    k_sqrt, k_flat = _AS_MIN_TEXT[u.name]
    d_text = _given(d, L) if exact_d else _q(d, L)
    As_text = _given(As, A) if exact_d else _q(As, A)
    bd = f"{_given(bw, L)} × {d_text}"
    width = "b" if exact_d else _BW
    return [
        SheetStep("As_min_sqrt_term", f"{_AS},min (a)",
                  f"{_AS},min(a) = {k_sqrt} √{_FC} / {_FY} × {width} d",
                  f"{k_sqrt} × √{_given(fc)} / {_given(fy, S)} × {bd}",
                  _q(r["As_min_sqrt_term"], A), r["As_min_sqrt_term"], "9.6.1.2(a)",
                  group="limits"),
        SheetStep("As_min_flat_term", f"{_AS},min (b)",
                  f"{_AS},min(b) = {k_flat} / {_FY} × {width} d",
                  f"{k_flat} / {_given(fy, S)} × {bd}",
                  _q(r["As_min_flat_term"], A), r["As_min_flat_term"], "9.6.1.2(b)",
                  group="limits"),
        SheetStep("As_min", f"{_AS},min", f"{_AS},min = max((a), (b))",
                  f"max({_q(r['As_min_sqrt_term'], A)}, {_q(r['As_min_flat_term'], A)})",
                  _q(r["As_min"], A), r["As_min"], "9.6.1.2", group="limits"),
        SheetStep("rho_min", "ρ<sub>min</sub>", f"ρ<sub>min</sub> = {_AS},min / ({width} d)",
                  f"{_q(r['As_min'], A)} / ({bd})", _q(r["rho_min"]), r["rho_min"], "9.6.1.2",
                  group="limits"),
        SheetStep("rho", "ρ", f"ρ = {_AS} / ({width} d)", f"{As_text} / ({bd})",
                  _q(r["rho"]), r["rho"], "2.2 (notation)", group="limits"),
    ]


def _limit_ratio_step(x: _Inputs, r: dict, key: str, area_key: str, name: str,
                      strain_text: str, strain: float, clause: str) -> SheetStep:
    """ρ at a limit strain εt at dt: c from the strain profile, fs from the strain at d."""
    u = x.system
    L, A, S = u.length, u.area, u.stress
    c = EPS_CU * x.dt / (EPS_CU + strain)  # 22.2.1.2, as the engine does
    elastic_stress = x.es * EPS_CU * (x.d - c) / c  # 20.2.2.1 below yield
    # At the balanced limit with dt = d, Es·εs is fy to within rounding.
    yields = elastic_stress >= x.fy * (1 - 1e-12)
    equation = (f"{name} = 0.85 {_FC} {_B1} c / ({_FS} d); "
                f"c = {_EPS_CU} {_DT} / ({_EPS_CU} + {_EPS_T})")
    depth = f"c = {EPS_CU} × {_given(x.dt, L)} / ({EPS_CU} + {_q(strain)}) = {_q(c, L)}"
    if elastic_stress <= 0:
        substituted = f"{depth}; the strain at d is not tensile, so no {_AS} reaches this {_EPS_T}"
    else:
        fs = x.fy if yields else elastic_stress
        fs_text = (f"{_FS} = {_FY}" if yields else
                   f"{_FS} = {_ES} {_EPS_CU} (d − c)/c = {_q(fs, S)}")
        substituted = (
            f"{depth}; {fs_text}; 0.85 × {_given(x.fc, S)} × {_q(r['beta1'], digits=3)} × "
            f"{_q(c, L)} / ({_given(fs, S) if yields else _q(fs, S)} × {_given(x.d, L)})")
    quantity = f"{name} at {_EPS_T} = {strain_text}"
    if r[key] is None:  # to_dict writes an unreachable (infinite) limit as None
        return SheetStep(key, quantity, equation, substituted, "none: no A<sub>s</sub> reaches it",
                         math.inf, clause, group="limits")
    result = f"{_q(r[key])}<br>{_AS} = {_q(r[area_key], A)}"
    return SheetStep(key, quantity, equation, substituted, result, r[key], clause, group="limits")


_AS_I, _D_I, _ASC, _DC = "A<sub>s,i</sub>", "d<sub>i</sub>", "A′<sub>s</sub>", "d′"
_BW, _BF, _HF, _AC, _CC = "b<sub>w</sub>", "b<sub>f</sub>", "h<sub>f</sub>", "A<sub>c</sub>", "C<sub>c</sub>"
_FORCE = {"us": "kip", "si": "kN"}  # forces are printed in 1000 base units (lb, N) ÷ 1000
_LEVER = {"us": "kip·in", "si": "kN·mm"}


def is_closed_form(beam: BeamSection, a: float) -> bool:
    """Whether the textbook closed form describes the section: one tension layer in a rectangle.

    Any flange, compression steel or second layer, or a block cut off at h,
    needs the general strain-compatibility write-up.
    """
    return (beam.flange is None and len(beam.layers) == 1
            and (beam.h is None or a <= beam.h))


def _kilo(force: float, u: UnitSystem) -> str:
    """A force in base units (lb or N), printed in kip or kN."""
    return _q(force / 1000, _FORCE[u.name])


def _common_steps(u: UnitSystem, fc: float, fy: float, es: float, r: dict) -> list[SheetStep]:
    """β1 and εty, the same for every section."""
    S = u.stress
    low, high, step = _BETA1_ROWS[u.name]
    if r["beta1"] == 0.85:
        eq, sub = f"{_B1} = 0.85 for {_FC} ≤ {low} {S}", f"{_FC} = {_given(fc, S)} ≤ {low} {S}"
    elif r["beta1"] == 0.65:
        eq, sub = f"{_B1} = 0.65 for {_FC} ≥ {high} {S}", f"{_FC} = {_given(fc, S)} ≥ {high} {S}"
    else:
        eq = f"{_B1} = 0.85 − 0.05 ({_FC} − {low}) / {step}"
        sub = f"0.85 − 0.05 × ({_given(fc)} − {low}) / {step}"
    return [
        SheetStep("beta1", _B1, eq, sub, _q(r["beta1"], digits=3), r["beta1"], "Table 22.2.2.4.3"),
        SheetStep("eps_ty", _EPS_TY, f"{_EPS_TY} = {_FY} / {_ES}",
                  f"{_given(fy, S)} / {_given(es, S)}", _q(r["eps_ty"]), r["eps_ty"], "21.2.2.1"),
    ]


def _span(key: str, value: float, text: str) -> str:
    """A result with its machine-readable value, for a cell that shows several."""
    return f'<span data-key="{key}" data-value="{_data_value(value)}">{text}</span>'


def _block_step(beam: BeamSection, a: float) -> tuple[SheetStep, float, float]:
    """The compressed area within a (22.2.2.4.1): which case applies, its area and centroid."""
    u = beam.system
    L, A = u.length, u.area
    area, centroid = compressed_area(beam, a)
    depth, cut = a, beam.h is not None and a > beam.h
    if cut:
        depth = beam.h
    flange = beam.flange
    depth_text = f"h = {_given(beam.h, L)}" if cut else f"a = {_q(a, L)}"
    cut_note = f"a = {_q(a, L)} &gt; h: the block stops at h; " if cut else ""
    if flange is None:
        eq = f"{_AC} = b a" if not cut else f"{_AC} = b h (a &gt; h)"
        sub = f"{cut_note}{_given(beam.bw, L)} × {_q(depth, L) if not cut else _given(depth, L)}"
        y_eq, y_sub = ("ȳ = a / 2", f"{_q(depth, L)} / 2")
    elif depth <= flange.thickness:
        eq = f"a ≤ {_HF}: the block lies in the flange, {_AC} = {_BF} a"
        sub = (f"{cut_note}{depth_text} ≤ {_HF} = {_given(flange.thickness, L)}; "
               f"{_given(flange.width, L)} × {_q(depth, L)}")
        y_eq, y_sub = ("ȳ = a / 2", f"{_q(depth, L)} / 2")
    else:
        eq = (f"a &gt; {_HF}: the block covers the flange and the web, "
              f"{_AC} = {_BF} {_HF} + {_BW} (a − {_HF})")
        sub = (f"{cut_note}{depth_text} &gt; {_HF} = {_given(flange.thickness, L)}; "
               f"{_given(flange.width, L)} × {_given(flange.thickness, L)} + "
               f"{_given(beam.bw, L)} × ({_q(depth, L)} − {_given(flange.thickness, L)})")
        y_eq = (f"ȳ = [{_BF} {_HF} · {_HF}/2 + {_BW} (a − {_HF}) · ({_HF} + a)/2] / {_AC}")
        y_sub = (f"[{_given(flange.width, L)} × {_given(flange.thickness, L)} × "
                 f"{_given(flange.thickness, L)}/2 + {_given(beam.bw, L)} × ({_q(depth, L)} − "
                 f"{_given(flange.thickness, L)}) × ({_given(flange.thickness, L)} + "
                 f"{_q(depth, L)})/2] / {_q(area, A)}")
    step = SheetStep("Ac", _AC, eq, sub, _q(area, A), area, "22.2.2.4.1")
    centroid_step = SheetStep("y_c", "ȳ", f"{y_eq} (depth of {_CC})", y_sub,
                              _q(centroid, L), centroid, "22.2.2.4.1")
    return step, centroid_step, area


def _layer_name(index: int, role: str) -> str:
    return f"Layer {index}, {role}"


def _layer_steps(beam: BeamSection, r: dict, c: float, b1: float) -> tuple[list[SheetStep], list]:
    """Each layer's strain, stress (yield or not) and force; forces compression positive."""
    u = beam.system
    L, A, S = u.length, u.area, u.stress
    steps, forces = [], []
    for index, (layer, state) in enumerate(zip(beam.layers, r["layers"]), start=1):
        inside = in_block(layer.depth, c, b1)
        force = layer_force(beam, layer.depth, layer.area, c, inside)
        forces.append((index, layer, force))
        compression = layer.role is Role.COMPRESSION
        strain, stress = state["strain"], state["stress"]
        if compression:
            e, f, ai, di = "ε′<sub>s</sub>", "f′<sub>s</sub>", _ASC, _DC
            strain_eq = f"{e} = {_EPS_CU} (c − {di}) / c"  # written compression positive
            shown_strain, shown_stress = -strain, -stress
            strain_sub = (f"{EPS_CU} × ({_q(c, L)} − {_given(layer.depth, L)}) / {_q(c, L)}"
                          f" = {_q(shown_strain)}")
            force_name = "C<sub>s</sub>"
        else:
            e, f = f"ε<sub>s,{index}</sub>", f"f<sub>s,{index}</sub>"
            ai, di = f"A<sub>s,{index}</sub>", f"d<sub>{index}</sub>"
            strain_eq = f"{e} = {_EPS_CU} ({di} − c) / c"
            shown_strain, shown_stress = strain, stress
            strain_sub = (f"{EPS_CU} × ({_given(layer.depth, L)} − {_q(c, L)}) / {_q(c, L)}"
                          f" = {_q(shown_strain)}")
            force_name = f"T<sub>{index}</sub>"
        if shown_strain < 0:
            strain_sub += " (in compression)" if not compression else " (in tension)"
        if state["yields"]:
            sign = "−" if shown_stress < 0 else ""
            stress_sub = f"|{e}| ≥ {_EPS_TY} = {_q(r['eps_ty'])}: {f} = {sign}{_given(beam.fy, S)}"
        else:
            stress_sub = (f"|{e}| &lt; {_EPS_TY} = {_q(r['eps_ty'])}: {f} = {_given(beam.es, S)} × "
                          f"{_q(shown_strain)} = {_q(shown_stress, S)}")
        shown_force = force if compression else -force
        if inside:
            force_eq = f"{force_name} = {ai} ({f} − 0.85 {_FC}), the bar displaces concrete"
            force_sub = (f"{_given(layer.area, A)} × ({_q(shown_stress, S)} "
                         f"{'−' if compression else '+'} 0.85 × {_given(beam.fc, S)}) ÷ 1000"
                         f" = {_kilo(shown_force, u)}")
        else:
            force_eq = f"{force_name} = {ai} {f}"
            force_sub = (f"{_given(layer.area, A)} × {_q(shown_stress, S)} ÷ 1000"
                         f" = {_kilo(shown_force, u)}")
        equation = f"{strain_eq}; {f} = {_ES} {e} ≤ {_FY}; {force_eq}"
        substituted = f"{strain_sub}; {stress_sub}; {force_sub}"
        key = f"layer{index}"
        yielded = "yields" if state["yields"] else "below yield"
        result = (f"{e} = {_span(key + '_strain', strain, _q(shown_strain))}<br>"
                  f"{f} = {_span(key + '_stress', stress, _q(shown_stress, S))} ({yielded})<br>"
                  f"{force_name} = {_span(key + '_force', force, _kilo(shown_force, u))}")
        role = "compression" if compression else "tension"
        quantity = _layer_name(index, role)
        clause = "22.2.1.2, 20.2.2.1" + (", 22.2.2.4.1" if inside else "")
        steps.append(SheetStep(key, quantity, equation, substituted, result, stress, clause,
                               keyed_result=True))
    return steps, forces


def _general_strength_steps(result: FlexuralCheck, r: dict, given_dt: bool) -> list[SheetStep]:
    beam = result.beam
    u = beam.system
    L, A, S, M = u.length, u.area, u.stress, u.moment
    c, a, b1 = r["c"], r["a"], r["beta1"]
    steps = _common_steps(u, beam.fc, beam.fy, beam.es, r)
    tension = beam.tension_layers
    if len(tension) > 1:
        steps.append(SheetStep(
            "As", _AS, f"{_AS} = Σ {_AS_I}", " + ".join(_given(t.area, A) for t in tension),
            _q(r["As"], A), r["As"], "2.2 (notation)"))
        steps.append(SheetStep(
            "d", "d", f"d = Σ {_AS_I} {_D_I} / {_AS} (centroid of the tension steel)",
            "(" + " + ".join(f"{_given(t.area, A)} × {_given(t.depth, L)}" for t in tension)
            + f") / {_q(r['As'], A)}", _q(r["d"], L), r["d"], "2.2 (notation)"))
    deepest = max(t.depth for t in tension)
    if given_dt:
        dt_sub = f"given; the deepest tension layer is at {_given(deepest, L)}"
    elif len(tension) == 1:
        dt_sub = f"the tension steel's depth, {_given(deepest, L)}"
    else:
        dt_sub = "max(" + ", ".join(_given(t.depth, L) for t in tension) + ")"
    steps.append(SheetStep(
        "dt", _DT, f"{_DT} = depth of the extreme tension steel", dt_sub, _given(r["dt"], L),
        r["dt"], "2.2, 21.2.2"))
    block, centroid_step, area = _block_step(beam, a)
    concrete = block_force(beam, a)[0]
    layer_steps, forces = _layer_steps(beam, r, c, b1)
    compression_sum = sum(f for _, layer, f in forces if f > 0)
    tension_sum = -sum(f for _, layer, f in forces if f <= 0)
    balance_terms = f"{_kilo(concrete, u)}" + "".join(
        f" {'+' if f > 0 else '−'} {_kilo(abs(f), u)}" for _, _, f in forces)
    steps.append(SheetStep(
        "c", "c",
        f"{_CC} + Σ C = Σ T, ε(y) = {_EPS_CU} (y − c) / c; solved for c",
        f"{_kilo(concrete + compression_sum, u)} = {_kilo(tension_sum, u)} at c = {_q(c, L)} "
        f"(the force balance below)",
        _q(c, L), c, "22.2.1.1, 22.2.1.2, 22.2.2.1"))
    steps.append(SheetStep("a", "a", f"a = {_B1} c", f"{_q(b1, digits=3)} × {_q(c, L)}",
                           _q(a, L), a, "22.2.2.4.1"))
    steps.append(block)
    centroid = centroid_step.value
    steps.append(SheetStep(
        "Cc", _CC, f"{_CC} = 0.85 {_FC} {_AC}, at {centroid_step.equation}",
        f"0.85 × {_given(beam.fc, S)} × {_q(area, A)} ÷ 1000; ȳ = {centroid_step.substituted}",
        f"{_span('Cc', concrete, _kilo(concrete, u))}<br>ȳ = {_span('y_c', centroid, _q(centroid, L))}",
        concrete, "22.2.2.4.1", keyed_result=True))
    steps += layer_steps
    residual = concrete + sum(f for _, _, f in forces)
    scale = max(concrete, tension_sum, 1e-300)
    residual_text = ("0 (to solver precision)" if abs(residual) <= 1e-9 * scale
                     else _kilo(residual, u))
    steps.append(SheetStep(
        "balance", "ΣF", f"{_CC} + Σ C − Σ T = 0 (forces compression positive)",
        f"{balance_terms} = {residual_text.split(' (')[0]}", residual_text, residual, "22.2.1.1"))
    steps.append(SheetStep(
        "eps_t", _EPS_T, f"{_EPS_T} = {_EPS_CU} ({_DT} − c) / c",
        f"{EPS_CU} × ({_given(r['dt'], L)} − {_q(c, L)}) / {_q(c, L)}", _q(r["eps_t"]), r["eps_t"],
        "22.2.1.2, 22.2.2.1"))
    steps.append(_phi_step(beam.spiral, r))
    d = r["d"]
    terms = f"{_kilo(concrete, u)} × ({_q(d, L)} − {_q(compressed_area(beam, a)[1], L)})"
    for _, layer, force in forces:
        if layer.depth == d:
            continue  # a layer at d has no lever arm about d
        terms += f" + ({_kilo(force, u)}) × ({_q(d, L)} − {_given(layer.depth, L)})"
    factor = format_number(u.moment_to_base / 1000)
    steps.append(SheetStep(
        "Mn", _MN, f"{_MN} = {_CC} (d − ȳ) + Σ F<sub>i</sub> (d − {_D_I}), moments about d, "
        f"forces compression positive",
        f"{terms} = {_q(r['Mn'] * u.moment_to_base / 1000, _LEVER[u.name])} ÷ {factor}",
        _q(r["Mn"], M), r["Mn"], "22.2.2.4.1, 22.2.1.1"))
    steps += _capacity_steps(r, M)
    return steps


def _capacity_steps(r: dict, M: str) -> list[SheetStep]:
    """φMn and, with Mu, the utilisation."""
    steps = [SheetStep(
        "phiMn", f"φ{_MN}", f"φ{_MN} = φ × {_MN}",
        f"{_q(r['phi'], digits=3)} × {_q(r['Mn'], M)}", _q(r["phiMn"], M), r["phiMn"],
        "21.2.1, 9.5.1.1")]
    if r.get("utilization") is not None:
        steps.append(SheetStep(
            "utilization", "M<sub>u</sub> / φM<sub>n</sub>", "M<sub>u</sub> / φ" + _MN + " ≤ 1",
            f"{_given(r['Mu'], M)} / {_q(r['phiMn'], M)}", _q(r["utilization"], digits=3),
            r["utilization"], "9.5.1.1"))
    return steps


def _general_limit_steps(result: FlexuralCheck, r: dict) -> list[SheetStep]:
    """As,min on bw·d (9.6.1.2), ρ, and the tension steel at each limit strain."""
    beam = result.beam
    u = beam.system
    L, A, S = u.length, u.area, u.stress
    steps = _minimum_steps(u, beam.fc, beam.fy, beam.bw, r["d"], r["As"], r, exact_d=False)
    for key, area_key, name, strain_text, strain, clause in _LIMITS(r):
        steps.append(_general_limit_step(beam, r, key, area_key, name, strain_text, strain, clause))
    return steps


def _LIMITS(r: dict):
    return (("rho_tc", "As_tc", "ρ<sub>tc</sub>", f"{_EPS_TY} + 0.003", r["eps_ty"] + 0.003,
             "Table 21.2.2"),
            ("rho_max", "As_max", "ρ", "0.004", 0.004, "9.3.3.1"),
            ("rho_b", "As_b", "ρ<sub>b</sub>", _EPS_TY, r["eps_ty"], "21.2.2 (balanced)"))


def _general_limit_step(beam: BeamSection, r: dict, key: str, area_key: str, name: str,
                        strain_text: str, strain: float, clause: str) -> SheetStep:
    """As at a limit strain: c fixed by εt at dt; the tension layers scaled together balance the rest."""
    u = beam.system
    L, A, S = u.length, u.area, u.stress
    b1 = r["beta1"]
    forces = forces_at_strain(beam, strain)  # the engine's own sums
    c, fixed, tension = forces.c, forces.fixed, forces.tension
    mean_stress = -tension / beam.As  # the tension layers' mean stress at this c
    equation = (f"{name} = {_AS} / ({_BW} d); {_AS} = ({_CC} + Σ C) / f̄<sub>s</sub> at "
                f"c = {_EPS_CU} {_DT} / ({_EPS_CU} + {_EPS_T}) (f̄<sub>s</sub>: mean stress)")
    depth = (f"c = {EPS_CU} × {_given(beam.dt, L)} / ({EPS_CU} + {_q(strain)}) = {_q(c, L)}; "
             f"a = {_q(b1 * c, L)}")
    quantity = f"{name} at {_EPS_T} = {strain_text}"
    if r[key] is None:
        return SheetStep(key, quantity, equation,
                         f"{depth}; the tension steel is not in tension there, so no "
                         f"{_AS} reaches this {_EPS_T}",
                         "none: no A<sub>s</sub> reaches it", math.inf, clause, group="limits")
    substituted = (f"{depth}; {_CC} + Σ C = {_kilo(fixed, u)}; f̄<sub>s</sub> = "
                   f"{_q(mean_stress, S)}; {_AS} = {_q(r[area_key], A)}; "
                   f"{_q(r[area_key], A)} / ({_given(beam.bw, L)} × {_q(r['d'], L)})")
    result = f"{_q(r[key])}<br>{_AS} = {_q(r[area_key], A)}"
    return SheetStep(key, quantity, equation, substituted, result, r[key], clause, group="limits")


_REQUIRED = ("units", "fc", "fy", "b")


def _calculate(inputs: Mapping[str, object]) -> tuple[FlexuralCheck, tuple[SheetStep, ...]]:
    """The engine's result for `inputs` and the sheet's steps drawn from it."""
    extra = sorted(set(inputs) - set(SHEET_INPUTS))
    if extra:
        raise InputError(extra[0], inputs[extra[0]], "one of the inputs of engine.check: "
                         + ", ".join(SHEET_INPUTS))
    for field in _REQUIRED:
        if field not in inputs:
            raise InputError(field, None, "a value (this input is required)")
    result = check(**inputs)  # type: ignore[arg-type]
    values = result.to_dict()
    if is_closed_form(result.beam, values["a"]):
        x = _inputs(inputs, result.beam)
        return result, tuple(_strength_steps(x, values) + _limit_steps(x, values))
    given_dt = inputs.get("dt") is not None
    return result, tuple(_general_strength_steps(result, values, given_dt)
                         + _general_limit_steps(result, values))


def sheet_steps(inputs: Mapping[str, object]) -> tuple[SheetStep, ...]:
    """The calculation's steps for `engine.check(**inputs)`, strength first, then limits."""
    return _calculate(inputs)[1]


def user_text(text: object, limit: int = 2000) -> str:
    """User-supplied text, escaped for HTML: control characters dropped, cut at `limit`."""
    cleaned = _CONTROL_CHARACTERS.sub("", str(text))
    if len(cleaned) > limit:
        cleaned = cleaned[:limit] + "…"
    return html.escape(cleaned, quote=True)


_SVG_FORBIDDEN = re.compile(r"<\s*script|href|url\s*\(|javascript:|\son\w+\s*=|<\s*foreignObject",
                            re.IGNORECASE)


def _checked_svg(svg: str) -> str:
    """The QR code's SVG if it is one plain inline <svg> element, else `InputError`."""
    text = svg.strip()
    if (not re.match(r"<svg[\s>]", text) or not text.endswith("</svg>")
            or _SVG_FORBIDDEN.search(text)):
        raise InputError("qr_svg", svg[:40], "one inline <svg> element without scripts or links")
    return text


# Words break only between words (no hyphenation, no break-all), so "compression" stays one
# word in a narrow cell; only user text and the link, which may hold no space at all, break
# anywhere (`overflow-wrap: anywhere` on every cell shrank columns until words split).
_CSS = """
* { box-sizing: border-box; }
body { font: 9.5pt/1.3 "DejaVu Sans", "Segoe UI", Arial, sans-serif; color: #111; margin: 0; }
main { max-width: 190mm; margin: 8mm auto; padding: 0 4mm; }
h1 { font-size: 12pt; margin: 0; }
h1 + p { margin: 0 0 1mm; }
h2 { font-size: 10pt; margin: 2.5mm 0 0.5mm; border-bottom: 0.3mm solid #555; }
table { border-collapse: collapse; width: 100%; }
th, td { text-align: left; vertical-align: top; padding: 0.4mm 1.2mm;
         border-bottom: 0.1mm solid #ccc; }
th { font-weight: 600; background: #eee; }
th, td { overflow-wrap: normal; word-break: normal; hyphens: manual; }
.header td.value, .url { overflow-wrap: anywhere; }
.header td { border: none; padding: 0.2mm 1.2mm; }
.label { color: #444; width: 1%; white-space: nowrap; }
.steps td.result { font-weight: 600; min-width: 22mm; }
.steps td.clause { color: #333; }
.steps td.quantity { width: 14mm; }
.pass { color: #0a5d1e; font-weight: 700; }
.fail { color: #a40e0e; font-weight: 700; }
.verdict { font-weight: 700; margin: 0.5mm 0 0; }
.verdict + p, .warnings, .warnings + p { margin: 0.5mm 0 0; }
.warnings { padding-left: 5mm; }
.footer { display: flex; gap: 3mm; align-items: flex-start; margin-top: 2mm; }
.footer > div { flex: 1; }
.caution { border: 0.3mm solid #555; padding: 1mm 1.5mm; margin: 0 0 1mm; }
.link { margin: 0; }
.reach { margin: 0.5mm 0 0; font-weight: 600; }
.url { font-family: "DejaVu Sans Mono", monospace; font-size: 85%; overflow-wrap: anywhere; }
.footer svg { width: 24mm; height: 24mm; flex: none; }
.running { display: flex; flex-wrap: wrap; gap: 1mm 5mm; font-size: 85%; color: #333;
           border-bottom: 0.2mm solid #999; padding-bottom: 0.5mm; margin-bottom: 1.5mm; }
.running .page-number { margin-left: auto; white-space: nowrap; }
.running span { overflow-wrap: anywhere; }
.page + .page { break-before: page; page-break-before: always; }
.section-block { display: flex; gap: 4mm; align-items: flex-start; }
.inputs-side { flex: 1; min-width: 0; }
.bars { margin: 0.8mm 0 0; }
.blank { white-space: nowrap; }
.sketch { flex: none; width: 62mm; margin: 2mm 0 0; }
.sketch svg { width: 100%; height: auto; display: block; font-family: inherit; }
.sketch figcaption { font-size: 80%; color: #444; }
@media screen {
  .page + .page { border-top: 0.6mm dashed #999; margin-top: 6mm; padding-top: 4mm; }
}
section, table, tr, .footer { page-break-inside: avoid; break-inside: avoid; }
h2 { page-break-after: avoid; break-after: avoid; }
@page { size: auto; margin: 10mm; }
@media print {
  body { font-size: 6.6pt; line-height: 1.15; }
  main { max-width: none; margin: 0; padding: 0; }
  h1 { font-size: 10pt; }
  h2 { font-size: 8pt; margin: 1.5mm 0 0.3mm; }
  th, td { padding: 0.2mm 0.8mm; }
  .steps td.clause { width: 17mm; }
  .footer svg { width: 20mm; height: 20mm; }
  .sketch { width: 66mm; }
}
"""


BLANK = "________________"
"""What the sheet prints for a header field left empty: a line to fill in by hand."""


def _field_text(value: object, limit: int = 2000) -> str:
    """User text for a header field, or the blank line when there is none."""
    text = user_text(value, limit=limit)
    return text if text.strip() else f'<span class="blank">{BLANK}</span>'


def _header(project: object, mark: object, engineer: object, checked_by: object,
            date: object) -> str:
    cells = [f'<td class="label">{label}:</td><td class="value" data-field="{field}">'
             f'{_field_text(value)}</td>'
             for label, field, value in (("Project", "project", project), ("Beam mark", "mark", mark),
                                         ("Engineer", "engineer", engineer),
                                         ("Checked by", "checked_by", checked_by),
                                         ("Date", "date", date))]
    return (f'<table class="header"><tr>{cells[0]}{cells[1]}</tr>'
            f'<tr>{cells[2]}{cells[3]}</tr><tr>{cells[4]}<td></td><td></td></tr></table>')


def _inputs_table(result: FlexuralCheck) -> str:
    beam = result.beam
    u = beam.system
    L, A = u.length, u.area
    cells = [
        ("Units", "units", "US customary" if u.name == "us" else "SI"),
        (f"{_FC}", "fc", _given(beam.fc, u.stress)), (_FY, "fy", _given(beam.fy, u.stress)),
        (_ES, "es", _given(beam.es, u.stress)),
        ("b" if beam.flange is None else _BW, "b", _given(beam.bw, L)),
    ]
    if beam.h is not None:
        cells.append(("h", "h", _given(beam.h, L)))
    if beam.flange is not None:
        cells += [(_BF, "bf", _given(beam.flange.width, L)),
                  (_HF, "hf", _given(beam.flange.thickness, L))]
    tension = beam.tension_layers
    if len(tension) == 1:
        cells += [("d", "d", _given(tension[0].depth, L)), (_AS, "As", _given(tension[0].area, A))]
    else:
        cells += [(f"Layer {i}", f"layer{i}", f"{_given(t.area, A)} at {_given(t.depth, L)}")
                  for i, t in enumerate(beam.layers, 1) if t.role is Role.TENSION]
    for layer in beam.layers:
        if layer.role is Role.COMPRESSION:
            cells += [(_ASC, "asc", _given(layer.area, A)), (_DC, "dc", _given(layer.depth, L))]
    cells += [
        (_DT, "dt", _given(beam.dt, L)),
        ("M<sub>u</sub>", "Mu", "not given" if result.Mu is None else _given(result.Mu, u.moment)),
        ("Transverse", "spiral", "spiral (25.7.3)" if beam.spiral else "other (ties or none)"),
    ]
    rows = []
    for i in range(0, len(cells), 4):
        rows.append("<tr>" + "".join(
            f'<td class="label">{label}</td><td data-input="{field}">{text}</td>'
            for label, field, text in cells[i:i + 4]) + "</tr>")
    return f'<table class="inputs">{"".join(rows)}</table>'


def bars_text(bars: str | None, units: str = "us") -> str:
    """The bars as placed, e.g. "4 #8 + 2 #8 (2 layers)", from a `bars` value such as "#8:4,2".

    Bars as drawn, one COUNTxBAR a tension layer ("4x9,,2x8", the link's
    `drawn`), read in `units`, name each layer, a blank one as "area typed".
    None (the area was typed, not chosen from bars) reads "area typed: bars not
    specified"; a malformed value raises `InputError` naming `bars`.
    """
    if bars is None or not str(bars).strip():
        return "area typed: bars not specified"
    if ":" not in str(bars):
        system = unit_system(units)
        entries = str(bars).split(",")
        parts = ["area typed" if not entry.strip() else bar_group("bars", entry, system).text
                 for entry in entries]
        return (" + ".join(parts) + f" ({len(entries)} layer{'s' if len(entries) > 1 else ''},"
                f" as drawn)")
    designation, counts = read_bars(str(bars))
    layers = len(counts)
    return (" + ".join(f"{n} {designation}" for n in counts)
            + f" ({layers} layer{'s' if layers > 1 else ''})")


def section_title(beam: BeamSection) -> str:
    """What the sheet's heading calls the section, e.g. "flanged section, doubly reinforced"."""
    shape = "rectangular section" if beam.flange is None else "flanged (T or L) section"
    compression = any(layer.role is Role.COMPRESSION for layer in beam.layers)
    steel = "doubly reinforced" if compression else "singly reinforced"
    count = len(beam.tension_layers)
    if count > 1:
        steel += f", {count} tension layers"
    return f"{shape}, {steel}"


def _data_value(value: float) -> str:
    return format_number(value) if math.isfinite(value) else "inf"


def _steps_table(steps: tuple[SheetStep, ...], title: str, group: str) -> str:
    def result_cell(s: SheetStep) -> str:
        if s.keyed_result:
            return f'<td class="result">{s.result}</td>'
        return (f'<td class="result" data-key="{s.key}" data-value="{_data_value(s.value)}">'
                f'{s.result}</td>')

    rows = "".join(
        f'<tr data-step="{s.key}"><td class="quantity">{s.quantity}</td>'
        f'<td class="equation">{s.equation}</td><td class="substituted">{s.substituted}</td>'
        f'{result_cell(s)}<td class="clause">{html.escape(s.clause)}</td></tr>'
        for s in steps if s.group == group)
    return (f'<section><h2>{title}</h2><table class="steps"><tr><th>Quantity</th><th>Equation</th>'
            f'<th>With the numbers</th><th>Result</th><th>ACI 318-19</th></tr>{rows}</table>'
            f'</section>')


def _checks_section(result: FlexuralCheck) -> str:
    rows = "".join(
        f'<tr data-clause="{html.escape(c.clause)}" data-passed="{str(c.passed).lower()}">'
        f'<td>{html.escape(c.clause)}</td><td>{html.escape(c.title)}</td>'
        f'<td class="{"pass" if c.passed else "fail"}">{"PASS" if c.passed else "FAIL"}</td>'
        f'<td>{html.escape(c.detail)}</td></tr>' for c in result.checks)
    if result.ok:
        verdict = '<p class="verdict pass" data-ok="true">All checks pass.</p>'
    else:
        failed = ", ".join(html.escape(c.clause) for c in result.checks if not c.passed)
        verdict = f'<p class="verdict fail" data-ok="false">The section fails {failed}.</p>'
    if result.utilization is not None:
        verdict += (f'<p data-key="utilization" data-value="{format_number(result.utilization)}">'
                    f'Utilisation M<sub>u</sub> / φM<sub>n</sub> = '
                    f'{_q(result.utilization, digits=3)}</p>')
    warnings = "".join(f"<li>{html.escape(w)}</li>" for w in result.warnings)
    warnings_html = f'<ul class="warnings">{warnings}</ul>' if warnings else "<p>None.</p>"
    return (f'<section><h2>Checks</h2><table class="checks"><tr><th>ACI 318-19</th>'
            f'<th>Requirement</th><th>Result</th><th>Detail</th></tr>{rows}</table>{verdict}'
            f'</section><section><h2>Warnings</h2>{warnings_html}</section>')


def _ductility_section(result: FlexuralCheck) -> str:
    """μφ, Mcr, Mn/Mcr and the 6.6.5 redistribution; "" without h (moment–curvature needs it).

    μφ is the engine's moment–curvature result (`moment_curvature`), Mcr its
    24.2.3.5 value: both read from `result`, none computed here.
    """
    if result.Mcr is None:
        return ""
    M = result.beam.system.moment
    mu, Mcr, share = result.ductility, result.Mcr, result.redistribution
    if mu is None:
        mu_cell = ('<td class="result" data-key="ductility" data-value="none">none: the steel '
                   'at d<sub>t</sub> does not yield before ε<sub>cu</sub> = 0.003</td>')
    else:
        mu_cell = (f'<td class="result" data-key="ductility" data-value="{format_number(mu)}">'
                   f'{_q(mu, digits=3)}</td>')
    ratio = result.Mn / Mcr
    percent = (f"{_q(share.percent, digits=3)} %" if share.permitted else "none")
    rows = (
        f'<tr data-step="ductility"><td class="quantity">μ<sub>φ</sub></td>'
        f'<td class="equation">curvature at ε<sub>cu</sub> = 0.003 / curvature at first yield '
        f'of d<sub>t</sub></td>{mu_cell}<td class="clause">moment–curvature (no clause)</td></tr>'
        f'<tr data-step="Mcr"><td class="quantity">M<sub>cr</sub></td>'
        f'<td class="equation">f<sub>r</sub> I<sub>g</sub> / y<sub>t</sub>, gross section</td>'
        f'<td class="result" data-key="Mcr" data-value="{format_number(Mcr)}">{_q(Mcr, M)}</td>'
        f'<td class="clause">24.2.3.5, 19.2.3.1</td></tr>'
        f'<tr data-step="Mn_over_Mcr"><td class="quantity">{_MN} / M<sub>cr</sub></td>'
        f'<td class="equation">{_q(result.Mn, M)} / {_q(Mcr, M)} (9.6.1 keeps it above 1)</td>'
        f'<td class="result" data-key="Mn_over_Mcr" data-value="{format_number(ratio)}">'
        f'{_q(ratio, digits=3)}</td><td class="clause">9.6.1</td></tr>'
        f'<tr data-step="redistribution"><td class="quantity">Redistribution</td>'
        f'<td class="equation">{html.escape(share.reason)}</td>'
        f'<td class="result" data-key="redistribution_percent" '
        f'data-value="{format_number(share.percent)}">{percent}</td>'
        f'<td class="clause">6.6.5</td></tr>')
    return (f'<section><h2>Ductility (h given)</h2><table class="steps"><tr><th>Quantity</th>'
            f'<th>Definition</th><th>Result</th><th>ACI 318-19</th></tr>{rows}</table>'
            f'<p>μ<sub>φ</sub> from the moment–curvature model (parabola-and-line concrete, '
            f'elastic–plastic steel; no confinement or strain hardening): an aid for judging '
            f'ductility, not a code check.</p></section>')


_LOOPBACK_NAMES = ("localhost", "localhost.localdomain")


def link_reach(link: str) -> str | None:
    """What a reader must know about where `link` opens, or None when it opens anywhere.

    A page served on this machine (localhost, 127.0.0.0/8, ::1) writes links
    that open only on the machine that served them; a private LAN address
    (RFC 1918, fc00::/7, link-local) only inside that network. The sheet
    prints the note beside the link and the QR code, so nobody files a code
    that will not scan to the check.
    """
    try:
        host = (urlsplit(link).hostname or "").rstrip(".").lower()
    except ValueError:  # a malformed address ("http://[::1") is still printed, as text
        return None
    if not host:
        return None
    if host in _LOOPBACK_NAMES or host.endswith(".localhost"):
        address = None
        loopback = True
    else:
        try:
            address = ipaddress.ip_address(host)
        except ValueError:
            return None  # a name: assumed to resolve wherever the reader is
        loopback = address.is_loopback or address.is_unspecified
    if loopback:
        return (f"This link and QR code open only on the computer that served the page "
                f"({host}); on any other device they lead nowhere. Serve or publish the page "
                f"at a shared address to give others a link that works.")
    if address is not None and (address.is_private or address.is_link_local):
        return (f"This link and QR code point to a private network address ({host}): they "
                f"open only on a device inside that network.")
    return None


def _footer(link: str, qr_svg: str | None) -> str:
    """The caution, and the share link printed and as a QR code (with where it opens)."""
    caution = f'<p class="caution" data-caution>{html.escape(CAUTION)}</p>'
    if not link:
        return f'<section class="footer"><div>{caution}</div></section>'
    qr = _checked_svg(qr_svg) if qr_svg else '<p class="no-qr">(no QR code)</p>'
    reach = link_reach(link)
    reach_html = f'<p class="reach" data-reach>{html.escape(reach)}</p>' if reach else ""
    return (f'<section class="footer"><div>{caution}<p class="link"><strong>Reopen this check:'
            f'</strong> <span class="url">{user_text(link, limit=8000)}</span></p>{reach_html}'
            f'</div>{qr}</section>')


def _running_header(project: object, mark: object, date: object, number: int, pages: int) -> str:
    """The line at the top of every printed page: project, mark, date and "page N of M"."""
    return (f'<div class="running"><span>Project: {_field_text(project, limit=120)}</span>'
            f'<span>Beam mark: {_field_text(mark, limit=60)}</span>'
            f'<span>Date: {_field_text(date, limit=40)}</span>'
            f'<span class="page-number" data-page="{number}" data-pages="{pages}">'
            f'page {number} of {pages}</span></div>')


def _section_block(result: FlexuralCheck, bars: str | None) -> str:
    """The inputs and the bars as placed beside the section drawn to scale."""
    return (f'<section class="section-block"><div class="inputs-side"><h2>Inputs</h2>'
            f'{_inputs_table(result)}<p class="bars" data-bars>Bars: '
            f'{html.escape(bars_text(bars, result.beam.system.name))}</p></div>'
            f'<figure class="sketch">{section_svg(result)}<figcaption>Section to scale: the '
            f'compression block (grey) to depth a, each steel layer at its depth.'
            f'</figcaption></figure></section>')


def calculation_sheet(
    inputs: Mapping[str, object],
    *,
    project: object = "",
    mark: object = "",
    engineer: object = "",
    checked_by: object = "",
    date: object = "",
    bars: str | None = None,
    link: str = "",
    qr_svg: str | None = None,
    title: str = "Rhoscope",
    frame: Mapping[str, object] | None = None,
) -> str:
    """The calculation sheet for `engine.check(**inputs)` as one HTML document.

    `inputs` are `engine.check`'s keywords (any of `SHEET_INPUTS`; None
    means not given); bad inputs raise `InputError` as `check` does.
    `project`, `mark`, `engineer`, `checked_by` and `date` are user text,
    shown escaped; one left empty prints as a blank line (`BLANK`) to fill
    in by hand, so no sheet goes out under a name nobody typed.
    `bars` is the arrangement the areas came from (BAR:COUNTS, "#8:4,2"), or
    None when the area was typed. `link` is the share link (see
    `share_link.share_url`), printed as text with a note when it opens only
    locally (`link_reach`); `qr_svg` its QR code as one inline <svg> element
    (the engine makes none: it has no dependencies), refused with
    `InputError` if it holds scripts or links.

    `frame` asks for the special moment frame checks (ACI 318-19 Chapter 18)
    with its top steel (`top_As`, `top_d`; empty: none given): they take a
    page of their own after the others.

    The sheet prints on `PAGES` pages (one more with `frame`), each a block
    that breaks before the next and starts with the running header (project,
    mark, date, "page N of M"): the calculation of the strength, then the
    limits, checks, ductility, caution and link.
    """
    result, steps = _calculate(inputs)
    heading = f"Flexural strength of a {section_title(result.beam)}, ACI 318-19"
    page_title = user_text(f"{mark} {project}".strip() or "Calculation sheet", limit=120)
    pages = (
        f'<h1>{html.escape(title)} calculation sheet</h1><p>{heading}</p>'
        f'{_header(project, mark, engineer, checked_by, date)}'
        f'{_section_block(result, bars)}'
        f'{_steps_table(steps, "Strength (ε<sub>cu</sub> = 0.003, 22.2.2.1)", "strength")}',
        f'{_steps_table(steps, "Reinforcement limits", "limits")}'
        f'{_checks_section(result)}'
        f'{_ductility_section(result)}'
        f'{_footer(link, qr_svg)}',
    )
    if frame is not None:
        pages += (_frame_section(inputs, frame),)
    body = "".join(
        f'<div class="page" data-page="{n}">'
        f'{_running_header(project, mark, date, n, len(pages))}'
        f'{content}</div>' for n, content in enumerate(pages, start=1))
    return (
        f'<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
        f'<meta name="viewport" content="width=device-width, initial-scale=1">'
        f'<title>{page_title} · calculation sheet</title><style>{_CSS}</style></head>'
        f'<body><main>{body}</main></body></html>\n'
    )


PAGES = 2
"""Printed pages of every sheet: each fits one Letter or A4 page (tests/browser prints them).
A sheet with the special moment frame checks has one more."""


def _frame_section(inputs: Mapping[str, object], frame: Mapping[str, object]) -> str:
    """The special moment frame checks of `inputs` with the top steel in `frame`."""
    section = {key: value for key, value in inputs.items() if key != "Mu" and value is not None}
    result = special_frame_check(**section, **{key: value for key, value in frame.items()
                                               if value is not None})
    r = result.to_dict()
    moment = html.escape(unit_system(r["units"]).moment)
    rows = "".join(
        f'<tr data-clause="{html.escape(item["clause"])}" data-passed='
        f'"{"true" if item["passed"] else "false"}"><td>{html.escape(item["clause"])}</td>'
        f'<td>{html.escape(item["title"])}</td><td class="{"pass" if item["passed"] else "fail"}">'
        f'{"PASS" if item["passed"] else "FAIL"}</td><td>{html.escape(item["detail"])}</td></tr>'
        for item in r["checks"])
    rows += "".join(
        f'<tr data-clause="{html.escape(item["clause"])}" data-passed="none">'
        f'<td>{html.escape(item["clause"])}</td><td>{html.escape(item["title"])}</td>'
        f'<td class="fail">NOT CHECKED</td><td>{html.escape(item["reason"])}</td></tr>'
        for item in r["not_checked"])
    probable = f"M<sub>pr</sub>+ = {significant(r['Mpr_pos'])} {moment}" + (
        "" if r["Mpr_neg"] is None else f"; M<sub>pr</sub>− = {significant(r['Mpr_neg'])} {moment}")
    warnings = "".join(f"<li>{html.escape(text)}</li>" for text in r["warnings"])
    verdict = ("All section checks of Chapter 18 pass." if r["ok"] else
               "Not every section check of Chapter 18 passes or could be made.")
    return (f'<section data-frame><h2>Special moment frame (ACI 318-19 Chapter 18)</h2>'
            f'<table class="checks"><tr><th>ACI 318-19</th><th>Requirement</th><th>Result</th>'
            f'<th>Detail</th></tr>{rows}</table>'
            f'<p class="verdict {"pass" if r["ok"] else "fail"}">{verdict}</p>'
            f'<p>Probable strength (18.6.5, 1.25 f<sub>y</sub>, φ = 1.0): {probable}. '
            f'18.6.3.2 compares {html.escape(r["strength_basis"])}.</p>'
            + (f'<ul class="warnings">{warnings}</ul>' if warnings else "")
            + f'<p>{html.escape(r["out_of_scope"])}</p>'
            f'<p class="caution">{html.escape(CAUTION)}</p></section>')
