"""The first look: a shared link's own check as plain text, before the interactive page exists.

The static page's worker runs this with nothing but the Pyodide core and the
project's wheel (no numpy, Bokeh or Panel), seconds before the full page can
be built. It reads the link exactly as the page does (`state.parse_query`),
runs the same `engine.check` and formats the numbers with the page's own
`summary.fmt`, so the full page that replaces it shows the same values.

Everything returned is plain text: the page puts it on screen with
`textContent`, never as markup. This module must not import Panel, Bokeh or
numpy (tests/test_first_look.py checks it in a fresh interpreter).
"""

from __future__ import annotations

import json

import engine
from engine.documents.share_link import format_number

from .state import parse_query
from .summary import CLASS_NAMES, LIMITS, fmt, refused_reason, signed, verdict

NOT_REACHABLE = "not reachable"


def first_look(search: str) -> dict:
    """The check a link's query (`?fc=...`, or without "?") asks for, as text fields.

    Keys: `verdict` ({kind, title, note}), `quantities` (label, value, unit
    rows: φMn, Mu/φMn, class, εt), `ratios` (symbol, meaning, ρ at the limit,
    ρ − limit rows), `inputs` (the values checked, one line), `messages` (each
    problem with the link, plain text) and `caution`. Never raises: inputs the
    engine cannot check come back as a "Not checked" verdict with the reason.
    """
    inputs, messages = parse_query(search)
    look = {"caution": engine.CAUTION, "messages": list(messages), "units": inputs.units,
            "inputs": inputs_line(inputs.engine_kwargs()), "quantities": [], "ratios": []}
    try:
        result = engine.check(**inputs.engine_kwargs()).to_dict()
    except (engine.InputError, ArithmeticError) as error:
        look["verdict"] = {"kind": "none", "title": "Not checked",
                           "note": refused_reason(error) + ": no result is shown for this link."}
        return look
    kind, title, note = verdict(result)
    look["verdict"] = {"kind": kind, "title": title, "note": note}
    look["quantities"] = _quantities(result)
    look["ratios"] = _ratios(result)
    return look


def first_look_json(search: str) -> str:
    """`first_look(search)` as JSON text, for the worker to post to the page.

    The last resort against a blank page: an unexpected error becomes a
    "Not checked" look that names it, rather than an exception in the worker.
    """
    try:
        look = first_look(search)
    except Exception as error:  # noqa: BLE001 - reported on the page, not swallowed
        look = {"caution": engine.CAUTION, "messages": [], "units": "", "inputs": "",
                "quantities": [], "ratios": [],
                "verdict": {"kind": "none", "title": "Not checked",
                            "note": f"the link could not be read ({type(error).__name__}); "
                                    "no result is shown for it."}}
    return json.dumps(look, ensure_ascii=False)


def inputs_line(kwargs: dict) -> str:
    """The checked inputs in one line of text: "f'c = 3,000 psi, fy = 60,000 psi, ..."."""
    system = engine.unit_system(kwargs["units"])
    exact = format_number  # the value as linked, not rounded
    parts = [f"f'c = {exact(kwargs['fc'])} {system.stress}", f"fy = {exact(kwargs['fy'])} {system.stress}",
             f"b = {exact(kwargs['b'])} {system.length}", f"d = {exact(kwargs['d'])} {system.length}",
             f"As = {exact(kwargs['As'])} {system.area}"]
    for key, symbol in (("dt", "dt"), ("h", "h")):
        if kwargs.get(key) is not None:
            parts.append(f"{symbol} = {exact(kwargs[key])} {system.length}")
    if kwargs.get("bf") is not None:
        parts.append(f"bf = {exact(kwargs['bf'])} {system.length}, hf = {exact(kwargs['hf'])} {system.length}")
    for area, depth in kwargs.get("layers", ()):
        parts.append(f"layer {exact(area)} {system.area} at {exact(depth)} {system.length}")
    if kwargs.get("asc") is not None:
        parts.append(f"A's = {exact(kwargs['asc'])} {system.area} at {exact(kwargs['dc'])} {system.length}")
    if kwargs.get("es") is not None:
        parts.append(f"Es = {exact(kwargs['es'])} {system.stress}")
    if kwargs.get("spiral"):
        parts.append("spiral transverse reinforcement")
    Mu = kwargs.get("Mu")
    parts.append("no Mu" if Mu is None else f"Mu = {exact(Mu)} {system.moment}")
    return ", ".join(parts)


def _quantities(r: dict) -> list[list[str]]:
    system = engine.unit_system(r["units"])
    rows = [["Design strength φMn", fmt(r["phiMn"]), system.moment]]
    if r.get("Mu") is not None:
        rows.append(["Mu/φMn", fmt(r["utilization"], 3), f"(Mu = {fmt(r['Mu'])} {system.moment})"])
    else:
        rows.append(["Mu/φMn", "—", "(no Mu given)"])
    rows.append(["Section class", CLASS_NAMES[r["section_class"]], f"(φ = {fmt(r['phi'], 3)})"])
    rows.append(["Net tensile strain εt", fmt(r["eps_t"]), ""])
    return rows


def _ratios(r: dict) -> list[list[str]]:
    rows = [["ρ", "this section, As/bd", fmt(r["rho"]), ""]]
    for key, _, symbol, what, clause in LIMITS:
        limit = r.get(key)
        if limit is None:
            rows.append([symbol, f"{what}; {clause}", NOT_REACHABLE, ""])
        else:
            rows.append([symbol, f"{what}; {clause}", fmt(limit), signed(r["rho"] - limit)])
    return rows
