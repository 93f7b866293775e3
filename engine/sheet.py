"""The calculation sheet: one check written out for filing, as one HTML page.

`calculation_sheet` returns a complete, self-contained HTML document (inline
CSS, no scripts, no outside resources) that prints on one Letter or A4 page:
a header of user text (project, beam mark, engineer, date), the inputs with
their units, every step as its equation, the equation with the numbers put
in and the result, each with its ACI 318-19 clause, the checks, the
warnings, the caution and the share link with its QR code.

Every number on the sheet is an input or a value of the engine's result,
formatted; none is computed here another way. The only arithmetic done here
is for the substituted lines of the limit ratios, which show the neutral
axis depth and steel stress at each limit strain by the same formulas the
engine uses (22.2.1.2, 20.2.2.1), so a reviewer can follow them.

User text is always escaped, never rendered as HTML.
"""

from __future__ import annotations

import html
import math
import re
from collections.abc import Mapping
from dataclasses import dataclass

from .checks import CAUTION, FlexuralCheck, check
from .errors import InputError
from .share_link import format_number
from .units import UnitSystem, unit_system

SHEET_INPUTS = ("units", "fc", "fy", "b", "d", "As", "dt", "es", "Mu", "spiral")
"""The `engine.check` keywords a sheet covers: a singly reinforced rectangular section."""

EPS_CU = 0.003  # ACI 318-19 22.2.2.1, written on the sheet

# ACI 318-19 Table 22.2.2.4.3 as printed (f'c bounds of its three rows, step).
_BETA1_ROWS = {"us": ("4000", "8000", "1000"), "si": ("28", "55", "7")}
# ACI 318-19 9.6.1.2 coefficients as printed: (a) k√f'c/fy·bw·d, (b) k/fy·bw·d.
_AS_MIN_TEXT = {"us": ("3", "200"), "si": ("0.25", "1.4")}
_CONTROL_CHARACTERS = re.compile(r"[\x00-\x08\x0b-\x1f\x7f]")

_FC, _FY, _ES = "f′<sub>c</sub>", "f<sub>y</sub>", "E<sub>s</sub>"
_AS, _DT, _FS = "A<sub>s</sub>", "d<sub>t</sub>", "f<sub>s</sub>"
_B1, _EPS_CU, _EPS_TY = "β<sub>1</sub>", "ε<sub>cu</sub>", "ε<sub>ty</sub>"
_EPS_T, _EPS_S, _MN = "ε<sub>t</sub>", "ε<sub>s</sub>", "M<sub>n</sub>"


@dataclass(frozen=True)
class SheetStep:
    """One line of the calculation: HTML fragments built only from fixed text and numbers.

    `key` is the name of `value` in `FlexuralCheck.to_dict()`.
    """

    key: str
    quantity: str
    equation: str
    substituted: str
    result: str
    value: float
    clause: str


def significant(value: float, digits: int = 4) -> str:
    """`value` in fixed notation to `digits` significant figures (whole numbers kept whole)."""
    if value == 0:
        return "0"
    if math.isinf(value):
        return "∞" if value > 0 else "−∞"
    exponent = math.floor(math.log10(abs(value)))
    decimals = max(0, digits - 1 - exponent)
    return f"{value:.{decimals}f}".replace("-", "−")


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


def _inputs(inputs: Mapping[str, object]) -> _Inputs:
    """The inputs as the engine used them (dt = d and Es of 20.2.2.2 when not given)."""
    system = unit_system(inputs["units"])
    d = float(inputs["d"])  # type: ignore[arg-type]
    dt, es, Mu = inputs.get("dt"), inputs.get("es"), inputs.get("Mu")
    return _Inputs(
        system=system, fc=float(inputs["fc"]), fy=float(inputs["fy"]),  # type: ignore[arg-type]
        b=float(inputs["b"]), d=d, As=float(inputs["As"]),  # type: ignore[arg-type]
        dt=d if dt is None else float(dt),  # type: ignore[arg-type]
        es=system.default_es if es is None else float(es),  # type: ignore[arg-type]
        Mu=None if Mu is None else float(Mu),  # type: ignore[arg-type]
        spiral=bool(inputs.get("spiral", False)),
    )


def _strength_steps(x: _Inputs, r: dict) -> list[SheetStep]:
    u = x.system
    L, A, S, M = u.length, u.area, u.stress, u.moment
    steps = []
    low, high, step = _BETA1_ROWS[u.name]
    if r["beta1"] == 0.85:
        eq, sub = f"{_B1} = 0.85 for {_FC} ≤ {low} {S}", f"{_FC} = {_given(x.fc, S)} ≤ {low} {S}"
    elif r["beta1"] == 0.65:
        eq, sub = f"{_B1} = 0.65 for {_FC} ≥ {high} {S}", f"{_FC} = {_given(x.fc, S)} ≥ {high} {S}"
    else:
        eq = f"{_B1} = 0.85 − 0.05 ({_FC} − {low}) / {step}"
        sub = f"0.85 − 0.05 × ({_given(x.fc)} − {low}) / {step}"
    steps.append(SheetStep("beta1", _B1, eq, sub, _q(r["beta1"], digits=3), r["beta1"],
                           "Table 22.2.2.4.3"))
    steps.append(SheetStep(
        "eps_ty", _EPS_TY, f"{_EPS_TY} = {_FY} / {_ES}",
        f"{_given(x.fy, S)} / {_given(x.es, S)}", _q(r["eps_ty"]), r["eps_ty"], "21.2.2.1"))
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
    steps.append(_phi_step(x, r))
    factor = format_number(u.moment_to_base)
    base_moment = f"{u.force}·{u.length}"
    steps.append(SheetStep(
        "Mn", _MN, f"{_MN} = {_AS} {_FS} (d − a/2)",
        f"{_given(x.As, A)} × {_q(r['fs'], S)} × ({_given(x.d, L)} − {_q(r['a'], L)}/2)"
        f" = {_q(r['Mn'] * u.moment_to_base, base_moment)} ÷ {factor}",
        _q(r["Mn"], M), r["Mn"], "22.2.2.4.1, 22.2.1.1"))
    steps.append(SheetStep(
        "phiMn", f"φ{_MN}", f"φ{_MN} = φ × {_MN}",
        f"{_q(r['phi'], digits=3)} × {_q(r['Mn'], M)}", _q(r["phiMn"], M), r["phiMn"],
        "21.2.1, 9.5.1.1"))
    if r.get("utilization") is not None:
        steps.append(SheetStep(
            "utilization", "M<sub>u</sub> / φM<sub>n</sub>", "M<sub>u</sub> / φ" + _MN + " ≤ 1",
            f"{_given(r['Mu'], M)} / {_q(r['phiMn'], M)}", _q(r["utilization"], digits=3),
            r["utilization"], "9.5.1.1"))
    return steps


def _phi_step(x: _Inputs, r: dict) -> SheetStep:
    low, span = ("0.75", "0.15") if x.spiral else ("0.65", "0.25")
    kind = "spiral (25.7.3)" if x.spiral else "other transverse reinforcement"
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
    u = x.system
    L, A, S = u.length, u.area, u.stress
    k_sqrt, k_flat = _AS_MIN_TEXT[u.name]
    bd = f"{_given(x.b, L)} × {_given(x.d, L)}"
    steps = [
        SheetStep("As_min_sqrt_term", f"{_AS},min (a)", f"{_AS},min(a) = {k_sqrt} √{_FC} / {_FY} × b d",
                  f"{k_sqrt} × √{_given(x.fc)} / {_given(x.fy, S)} × {bd}",
                  _q(r["As_min_sqrt_term"], A), r["As_min_sqrt_term"], "9.6.1.2(a)"),
        SheetStep("As_min_flat_term", f"{_AS},min (b)", f"{_AS},min(b) = {k_flat} / {_FY} × b d",
                  f"{k_flat} / {_given(x.fy, S)} × {bd}",
                  _q(r["As_min_flat_term"], A), r["As_min_flat_term"], "9.6.1.2(b)"),
        SheetStep("As_min", f"{_AS},min", f"{_AS},min = max((a), (b))",
                  f"max({_q(r['As_min_sqrt_term'], A)}, {_q(r['As_min_flat_term'], A)})",
                  _q(r["As_min"], A), r["As_min"], "9.6.1.2"),
        SheetStep("rho_min", "ρ<sub>min</sub>", f"ρ<sub>min</sub> = {_AS},min / (b d)",
                  f"{_q(r['As_min'], A)} / ({bd})", _q(r["rho_min"]), r["rho_min"], "9.6.1.2"),
        SheetStep("rho", "ρ", f"ρ = {_AS} / (b d)", f"{_given(x.As, A)} / ({bd})",
                  _q(r["rho"]), r["rho"], "2.2 (notation)"),
    ]
    for key, area_key, name, strain_text, strain, clause in (
            ("rho_tc", "As_tc", "ρ<sub>tc</sub>", f"{_EPS_TY} + 0.003", r["eps_ty"] + 0.003,
             "Table 21.2.2"),
            ("rho_max", "As_max", "ρ<sub>max</sub>", "0.004", 0.004, "9.3.3.1"),
            ("rho_b", "As_b", "ρ<sub>b</sub>", _EPS_TY, r["eps_ty"], "21.2.2 (balanced)")):
        steps.append(_limit_ratio_step(x, r, key, area_key, name, strain_text, strain, clause))
    return steps


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
                         math.inf, clause)
    result = f"{_q(r[key])}<br>{_AS} = {_q(r[area_key], A)}"
    return SheetStep(key, quantity, equation, substituted, result, r[key], clause)


_REQUIRED = ("units", "fc", "fy", "b", "d", "As")


def _calculate(inputs: Mapping[str, object]) -> tuple[FlexuralCheck, tuple[SheetStep, ...]]:
    """The engine's result for `inputs` and the sheet's steps drawn from it."""
    extra = sorted(set(inputs) - set(SHEET_INPUTS))
    if extra:
        raise InputError(extra[0], inputs[extra[0]], "only the inputs of a singly reinforced "
                         "rectangular section: " + ", ".join(SHEET_INPUTS))
    for field in _REQUIRED:
        if field not in inputs:
            raise InputError(field, None, "a value (this input is required)")
    result = check(**inputs)  # type: ignore[arg-type]
    values = result.to_dict()
    x = _inputs(inputs)
    return result, tuple(_strength_steps(x, values) + _limit_steps(x, values))


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
td { overflow-wrap: anywhere; }
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
.url { font-family: "DejaVu Sans Mono", monospace; font-size: 85%; overflow-wrap: anywhere; }
.footer svg { width: 24mm; height: 24mm; flex: none; }
section, table, tr, .footer { page-break-inside: avoid; break-inside: avoid; }
h2 { page-break-after: avoid; break-after: avoid; }
@page { size: auto; margin: 10mm; }
@media print {
  body { font-size: 7pt; line-height: 1.2; }
  main { max-width: none; margin: 0; padding: 0; }
  h1 { font-size: 10pt; }
  h2 { font-size: 8pt; margin: 1.5mm 0 0.3mm; }
  th, td { padding: 0.2mm 0.8mm; }
  .footer svg { width: 20mm; height: 20mm; }
}
"""


def _header(project: object, mark: object, engineer: object, date: object) -> str:
    cells = [f'<td class="label">{label}</td><td data-field="{field}">{user_text(value)}</td>'
             for label, field, value in (("Project", "project", project), ("Beam mark", "mark", mark),
                                         ("Engineer", "engineer", engineer), ("Date", "date", date))]
    return (f'<table class="header"><tr>{cells[0]}{cells[1]}</tr>'
            f'<tr>{cells[2]}{cells[3]}</tr></table>')


def _inputs_table(x: _Inputs) -> str:
    u = x.system
    cells = [
        ("Units", "units", "US customary" if u.name == "us" else "SI"),
        (f"{_FC}", "fc", _given(x.fc, u.stress)), (_FY, "fy", _given(x.fy, u.stress)),
        (_ES, "es", _given(x.es, u.stress)), ("b", "b", _given(x.b, u.length)),
        ("d", "d", _given(x.d, u.length)), (_DT, "dt", _given(x.dt, u.length)),
        (_AS, "As", _given(x.As, u.area)),
        ("M<sub>u</sub>", "Mu", "not given" if x.Mu is None else _given(x.Mu, u.moment)),
        ("Transverse", "spiral", "spiral (25.7.3)" if x.spiral else "other (ties or none)"),
    ]
    rows = []
    for i in range(0, len(cells), 4):
        rows.append("<tr>" + "".join(
            f'<td class="label">{label}</td><td data-input="{field}">{text}</td>'
            for label, field, text in cells[i:i + 4]) + "</tr>")
    return f'<table class="inputs">{"".join(rows)}</table>'


def _data_value(value: float) -> str:
    return format_number(value) if math.isfinite(value) else "inf"


def _steps_table(steps: tuple[SheetStep, ...], title: str, keys: set[str]) -> str:
    rows = "".join(
        f'<tr data-step="{s.key}"><td class="quantity">{s.quantity}</td>'
        f'<td class="equation">{s.equation}</td><td class="substituted">{s.substituted}</td>'
        f'<td class="result" data-key="{s.key}" data-value="{_data_value(s.value)}">'
        f'{s.result}</td><td class="clause">{html.escape(s.clause)}</td></tr>'
        for s in steps if s.key in keys)
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


def _footer(link: str, qr_svg: str | None) -> str:
    """The caution, and the share link printed and as a QR code."""
    caution = f'<p class="caution" data-caution>{html.escape(CAUTION)}</p>'
    if not link:
        return f'<section class="footer"><div>{caution}</div></section>'
    qr = _checked_svg(qr_svg) if qr_svg else '<p class="no-qr">(no QR code)</p>'
    return (f'<section class="footer"><div>{caution}<p class="link"><strong>Reopen this check:'
            f'</strong> <span class="url">{user_text(link, limit=8000)}</span></p></div>'
            f'{qr}</section>')


def calculation_sheet(
    inputs: Mapping[str, object],
    *,
    project: object = "",
    mark: object = "",
    engineer: object = "",
    date: object = "",
    link: str = "",
    qr_svg: str | None = None,
    title: str = "Rhoscope",
) -> str:
    """The calculation sheet for `engine.check(**inputs)` as one HTML document.

    `inputs` are `engine.check`'s keywords (singly reinforced rectangular
    section: `SHEET_INPUTS`); bad inputs raise `InputError` as `check` does.
    `project`, `mark`, `engineer` and `date` are user text, shown escaped.
    `link` is the share link (see `share_link.share_url`), printed as text;
    `qr_svg` its QR code as one inline <svg> element (the engine makes none:
    it has no dependencies), refused with `InputError` if it holds scripts
    or links.
    """
    result, steps = _calculate(inputs)
    x = _inputs(inputs)
    strength_keys = {"beta1", "eps_ty", "a", "c", "eps_t", "fs", "phi", "Mn", "phiMn",
                     "utilization"}
    limit_keys = {s.key for s in steps} - strength_keys
    heading = "Flexural strength of a singly reinforced rectangular section, ACI 318-19"
    page_title = user_text(f"{mark} {project}".strip() or "Calculation sheet", limit=120)
    return (
        f'<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
        f'<meta name="viewport" content="width=device-width, initial-scale=1">'
        f'<title>{page_title} · calculation sheet</title><style>{_CSS}</style></head>'
        f'<body><main>'
        f'<h1>{html.escape(title)} calculation sheet</h1><p>{heading}</p>'
        f'{_header(project, mark, engineer, date)}'
        f'<section><h2>Inputs</h2>{_inputs_table(x)}</section>'
        f'{_steps_table(steps, "Strength (ε<sub>cu</sub> = 0.003, 22.2.2.1)", strength_keys)}'
        f'{_steps_table(steps, "Reinforcement limits", limit_keys)}'
        f'{_checks_section(result)}'
        f'{_footer(link, qr_svg)}'
        f'</main></body></html>\n'
    )
