"""Results as HTML text, built only from engine numbers and escaped strings.

Every string that reaches the markup (engine details and warnings, messages
quoting a user's or a link's value) passes through `html.escape`; numbers are
formatted here. Each displayed quantity carries `data-q="<name>"` so tests and
the latency benchmark can find it.
"""

from __future__ import annotations

import math
from html import escape

import engine

from .theme import TEXT_CSS

CSS = TEXT_CSS

# (key in FlexuralCheck.to_dict(), As key, symbol, what it is, clause)
LIMITS = (
    ("rho_min", "As_min", "ρmin", "minimum steel", "ACI 318-19 9.6.1.2"),
    ("rho_tc", "As_tc", "ρtc", "tension-controlled limit, εt = εty + 0.003",
     "ACI 318-19 Table 21.2.2"),
    # ACI 318-19 defines no "ρmax"; the beam limit is a strain, εt ≥ 0.004 (9.3.3.1).
    ("rho_max", "As_max", "ρ at εt = 0.004", "beam limit, εt ≥ 0.004", "ACI 318-19 9.3.3.1"),
    ("rho_b", "As_b", "ρb", "balanced, εt = εty", "ACI 318-19 21.2.2"),
)

CLASS_NAMES = {
    "tension-controlled": "Tension-controlled",
    "transition": "Transition",
    "compression-controlled": "Compression-controlled",
}


def fmt(value: float, digits: int = 4) -> str:
    """`value` to `digits` significant figures in fixed notation ("277.4", "60,000")."""
    if value == 0 or not math.isfinite(value):
        return "0" if value == 0 else escape(str(value))
    magnitude = math.floor(math.log10(abs(value)))
    decimals = max(0, digits - 1 - magnitude)
    return f"{value:,.{decimals}f}"


def signed(value: float, digits: int = 4) -> str:
    """`fmt` with an explicit sign ("+2.157", "−0.3100")."""
    text = fmt(abs(value), digits)
    return ("+" if value >= 0 else "−") + text


def _q(name: str, text: str) -> str:
    return f'<span data-q="{name}">{text}</span>'


def header_html() -> str:
    """The title bar and the caution, always at the top of the page."""
    return (
        '<div class="rs-head"><span class="rs-title">Rhoscope</span>'
        '<span class="rs-sub">beam section in flexure, ACI 318-19 · tension steel ratio ρ '
        'against its code limits</span></div>'
        f'<div class="rs-caution" data-q="caution"><b>Caution.</b> {escape(engine.CAUTION)}</div>'
    )


def verdict(r: dict) -> tuple[str, str, str]:
    """(kind, title, note) of a check's `to_dict()`, in plain text: ("bad", "✘ Does not pass", ...)."""
    failed = [item for item in r["checks"] if not item["passed"]]
    if failed:
        return "bad", "✘ Does not pass", "fails " + ", ".join(item["clause"] for item in failed)
    count = len(r["checks"])
    checks = "both checks" if count == 2 else f"all {count} checks"
    if r.get("Mu") is None:
        # Without Mu, 9.5.1.1 (φMn ≥ Mu) is not checked: never a strength "pass".
        return "none", "Limits met · strength not checked", (
            f"{checks} on the steel pass; no Mu given: enter Mu to check φMn ≥ Mu")
    return "ok", "✔ Passes", checks


def cards_html(result: engine.FlexuralCheck) -> str:
    """The headline: verdict, φMn, Mu and utilisation, class, εt and φ."""
    r = result.to_dict()
    system = engine.unit_system(r["units"])
    kind, title, note = verdict(r)
    moment = escape(system.moment)
    cards = [
        f'<div class="rs-card rs-verdict {kind}" data-q="verdict">'
        f'<div class="k">Verdict</div><div class="v rs-mark">{title}</div>'
        f'<div class="n">{escape(note)}</div></div>',
        f'<div class="rs-card"><div class="k">Design strength φMn</div>'
        f'<div class="v">{_q("phiMn", fmt(r["phiMn"]))}<span class="u">{moment}</span></div>'
        f'<div class="n">Mn = {_q("Mn_card", fmt(r["Mn"]))} {moment}</div></div>',
    ]
    if r.get("Mu") is not None:
        cards.append(
            f'<div class="rs-card"><div class="k">Demand Mu as a share of φMn</div>'
            f'<div class="v">{_q("utilization", fmt(r["utilization"], 3))}</div>'
            f'<div class="n">Mu = {_q("Mu", fmt(r["Mu"]))} {moment}</div></div>')
    else:
        cards.append('<div class="rs-card"><div class="k">Demand Mu</div>'
                     '<div class="v">—</div><div class="n">none entered: strength not checked'
                     '</div></div>')
    cards.append(
        f'<div class="rs-card"><div class="k">Section class</div>'
        f'<div class="v" style="font-size:17px">'
        f'{_q("section_class", escape(CLASS_NAMES[r["section_class"]]))}</div>'
        f'<div class="n">εt = {_q("eps_t_card", fmt(r["eps_t"]))} · φ = '
        f'{_q("phi_card", fmt(r["phi"], 3))}</div></div>')
    return f'<div class="rs-cards">{"".join(cards)}</div>'


def unchecked_cards_html(reason: str, units: str) -> str:
    """The headline when the current inputs cannot be checked: no verdict, no numbers.

    `reason` is plain text ("b = 0 is not accepted"; escaped here). The cards
    stay in place, greyed and empty, so nothing reads as a result for inputs
    that were not checked.
    """
    moment = escape(engine.unit_system(units).moment)
    cards = [
        '<div class="rs-card rs-verdict stale" data-q="verdict">'
        '<div class="k">Verdict</div><div class="v rs-mark">Not checked</div>'
        f'<div class="n">{escape(reason)}: see the message above. No result is shown '
        'for these inputs.</div></div>',
        f'<div class="rs-card stale"><div class="k">Design strength φMn</div>'
        f'<div class="v">—<span class="u">{moment}</span></div>'
        '<div class="n">not checked</div></div>',
        '<div class="rs-card stale"><div class="k">Demand Mu as a share of φMn</div>'
        '<div class="v">—</div><div class="n">not checked</div></div>',
        '<div class="rs-card stale"><div class="k">Section class</div>'
        '<div class="v" style="font-size:17px">—</div><div class="n">not checked</div></div>',
    ]
    return f'<div class="rs-cards">{"".join(cards)}</div>'


def refused_reason(error: Exception) -> str:
    """A short plain-text reason the engine gave no result ("b = 0 is not accepted")."""
    if isinstance(error, engine.InputError):
        value = error.value
        shown = f"{value:.6g}" if isinstance(value, (int, float)) and not isinstance(
            value, bool) else str(value)
        return f"{error.field} = {shown} is not accepted"
    return f"the engine could not compute these inputs ({type(error).__name__})"


def stale_html(markup: str) -> str:
    """`markup` under a note that it belongs to earlier inputs ("" stays "")."""
    if not markup:
        return ""
    return ('<div class="rs-note" data-q="stale_note">Not updated: these are the last '
            f'inputs that could be checked.</div>{markup}')


def details_html(result: engine.FlexuralCheck) -> str:
    """The audit trail: section state, ρ against each limit, checks, warnings."""
    r = result.to_dict()
    system = engine.unit_system(r["units"])
    length, area, stress, moment = (escape(system.length), escape(system.area),
                                    escape(system.stress), escape(system.moment))
    state_rows = [
        ("φMn", "phiMn_row", fmt(r["phiMn"]), moment, "design strength"),
        ("Mn", "Mn", fmt(r["Mn"]), moment, "nominal strength"),
        ("φ", "phi", fmt(r["phi"], 3), "", "ACI 318-19 Table 21.2.2"),
        ("εt", "eps_t", fmt(r["eps_t"]), "", "net tensile strain at dt"),
        ("c", "c", fmt(r["c"]), length, "neutral axis depth"),
        ("a", "a", fmt(r["a"]), length, "stress block depth, a = β1c (22.2.2.4.1)"),
        ("β1", "beta1", fmt(r["beta1"], 3), "", "ACI 318-19 Table 22.2.2.4.3"),
        ("fs", "fs", fmt(r["fs"]), stress, "steel stress"),
    ]
    layers = r.get("layers") or []
    for layer in layers:
        if layer["role"] == "compression":
            state_rows.append(("f's", "fs_comp", signed(layer["stress"]), stress,
                               "compression steel stress, tension positive (− is compression); "
                               + ("yields: |f's| = fy" if layer["yields"]
                                  else "elastic: |f's| < fy")))
            state_rows.append(("ε's", "eps_comp", signed(layer["strain"]), "",
                               "compression steel strain, tension positive"))
    if r.get("As_req") is not None:
        state_rows.append(("As,req", "As_req", fmt(r["As_req"]), area,
                           "least As for Mu within 9.3.3.1"))
    state = "".join(
        f'<tr><td>{sym}</td><td class="num">{_q(key, value)} {unit}</td>'
        f'<td class="rs-note">{escape(note)}</td></tr>'
        for sym, key, value, unit, note in state_rows)
    layer_table = ""
    if sum(layer["role"] == "tension" for layer in layers) > 1:
        layer_table = (
            '<h3>Steel layers</h3><table><tr><th>layer</th><th>area</th><th>depth</th>'
            '<th>strain</th><th>stress</th><th>yields</th></tr>'
            + "".join(
                f'<tr data-q="layer"><td>{index}, {escape(layer["role"])}</td>'
                f'<td class="num">{_q("layer_area", fmt(layer["area"]))} {area}</td>'
                f'<td class="num">{_q("layer_depth", fmt(layer["depth"]))} {length}</td>'
                f'<td class="num">{_q("layer_strain", signed(layer["strain"]))}</td>'
                f'<td class="num">{_q("layer_stress", signed(layer["stress"]))} {stress}</td>'
                f'<td>{_q("layer_yields", "yes" if layer["yields"] else "no (elastic)")}</td></tr>'
                for index, layer in enumerate(layers, start=1))
            + '</table><div class="rs-note">Strain and stress tension positive (− is '
              'compression), from the engine\'s strain compatibility (22.2.1.2).</div>')
    limit_rows = []
    for key, as_key, symbol, what, clause in LIMITS:
        if r[key] is None or r[as_key] is None:  # no tension steel area reaches it; the warnings say why
            limit_rows.append(
                f'<tr><td><b>{symbol}</b><br><span class="rs-note">{escape(what)}; '
                f'{escape(clause)}</span></td>'
                f'<td class="num">{_q(key, "not reachable")}</td><td class="num">{_q(as_key, "—")}</td>'
                f'<td class="num">—</td></tr>')
            continue
        d_rho, d_as = r["rho"] - r[key], r["As"] - r[as_key]
        side = "above" if d_rho >= 0 else "below"
        limit_rows.append(
            f'<tr><td><b>{symbol}</b><br><span class="rs-note">{escape(what)}; '
            f'{escape(clause)}</span></td>'
            f'<td class="num">{_q(key, fmt(r[key]))}</td>'
            f'<td class="num">{_q(as_key, fmt(r[as_key]))} {area}</td>'
            f'<td class="num">{_q("margin_" + key, signed(d_rho))}<br>'
            f'<span class="rs-note">{signed(d_as)} {area} {side}</span></td></tr>')
    checks = "".join(
        f'<tr><td class="{"pass" if item["passed"] else "fail"}" data-q="check">'
        f'{"✔ pass" if item["passed"] else "✘ fail"}</td>'
        f'<td>{escape(item["clause"])}</td><td>{escape(item["title"])}</td>'
        f'<td class="rs-note">{escape(item["detail"])}</td></tr>'
        for item in r["checks"])
    warnings = "".join(f'<div class="rs-msg rs-warn" data-q="warning">{escape(text)}</div>'
                       for text in r["warnings"])
    if not warnings:
        warnings = '<div class="rs-note">No warnings: the inputs are within the code\'s scope.</div>'
    return (
        '<div class="rs-grid">'
        f'<div><h3>Section state</h3><table>{state}</table>{layer_table}</div>'
        f'<div><h3>ρ = {_q("rho", fmt(r["rho"]))} against the limits</h3>'
        '<table><tr><th>limit</th><th>ρ at limit</th><th>As at limit</th>'
        f'<th>ρ − limit</th></tr>{"".join(limit_rows)}</table></div>'
        '</div>'
        f'<h3>Code checks</h3><table><tr><th>result</th><th>clause</th><th>requirement</th>'
        f'<th>detail</th></tr>{checks}</table>'
        f'<h3>Warnings</h3>{warnings}'
    )


def messages_html(messages: tuple[str, ...] | list[str], css: str = "") -> str:
    """Plain-text messages as escaped boxes ("" for none)."""
    return "".join(f'<div class="rs-msg {css}" data-q="message">{escape(text)}</div>'
                   for text in messages)


def frame_html(frame: engine.SpecialFrameCheck) -> str:
    """The special moment frame checks (ACI 318-19 Chapter 18) as a block of the Check tab."""
    r = frame.to_dict()
    system = engine.unit_system(r["units"])
    moment = escape(system.moment)
    rows = "".join(
        f'<tr><td class="{"pass" if item["passed"] else "fail"}">'
        f'{"✔ pass" if item["passed"] else "✘ fail"}</td><td>{escape(item["clause"])}</td>'
        f'<td>{escape(item["title"])}</td><td>{escape(item["detail"])}</td></tr>'
        for item in r["checks"])
    rows += "".join(
        f'<tr><td class="fail">— not checked</td><td>{escape(item["clause"])}</td>'
        f'<td>{escape(item["title"])}</td><td>{escape(item["reason"])}</td></tr>'
        for item in r["not_checked"])
    probable = (f"Mpr+ = {_q('Mpr_pos', fmt(r['Mpr_pos']))} {moment}"
                + ("" if r["Mpr_neg"] is None else
                   f" · Mpr− = {_q('Mpr_neg', fmt(r['Mpr_neg']))} {moment}"))
    verdict = ("✔ the section checks of Chapter 18 pass" if r["ok"] else
               "✘ not all section checks of Chapter 18 pass or could be made")
    warnings = "".join(f"<li>{escape(text)}</li>" for text in r["warnings"])
    return (f'<div data-q="frame"><h3>Special moment frame (ACI 318-19 Chapter 18)</h3>'
            f'<div class="rs-mark {"pass" if r["ok"] else "fail"}" data-q="frame_verdict">'
            f'{verdict}</div>'
            f'<table><tr><th>result</th><th>clause</th><th>requirement</th><th>detail</th></tr>'
            f'{rows}</table>'
            f'<div class="rs-note">Probable strength (18.6.5: 1.25 fy, φ = 1.0): {probable}. '
            f'18.6.3.2 compares {escape(r["strength_basis"])}.</div>'
            + (f'<ul class="rs-note">{warnings}</ul>' if warnings else "")
            + f'<div class="rs-note">{escape(r["out_of_scope"])}</div></div>')
