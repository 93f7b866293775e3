"""`check` (one section) and `curve` (capacity against ρ)."""

from __future__ import annotations

import argparse
import json
import math

from ..provisions.checks import CAUTION, FlexuralCheck, check
from ..provisions.curve import DEFAULT_POINTS, capacity_curve
from ..provisions.special_frame import SpecialFrameCheck, special_frame_check
from ..section.errors import InputError
from .arguments import add_section_flags, parse_float, section_inputs


def register(commands) -> None:
    check_parser = commands.add_parser("check", help="check one section")
    add_section_flags(check_parser)
    check_parser.add_argument("--mu", metavar="F", help="Mu, factored moment (kip·ft or kN·m)")
    check_parser.add_argument("--special-frame", action="store_true",
                              help="add the checks of a special moment frame beam "
                                   "(ACI 318-19 18.6.3, 18.6.5, 20.2.2.5; one section only)")
    check_parser.add_argument("--top-as", metavar="F",
                              help="top steel area, for --special-frame (with --top-d)")
    check_parser.add_argument("--top-d", metavar="F",
                              help="top steel depth from the bottom face (d for negative moment)")
    check_parser.set_defaults(run=run_check)
    curve_parser = commands.add_parser("curve", help="capacity against ρ, for a plot")
    add_section_flags(curve_parser)
    curve_parser.add_argument("--points", type=int, default=DEFAULT_POINTS, metavar="N",
                              help=f"evenly spaced ratios (default {DEFAULT_POINTS}), plus the limits")
    curve_parser.set_defaults(run=run_curve)


def run_check(args: argparse.Namespace) -> str:
    top = {"top_As": parse_float("top_As", args.top_as), "top_d": parse_float("top_d", args.top_d)}
    if not args.special_frame:
        given = next((name for name, value in top.items() if value is not None), None)
        if given is not None:
            raise InputError(given, getattr(args, given.lower()), "--special-frame with it",
                             why="the top steel is used only by the special frame checks")
    result = check(**section_inputs(args), Mu=parse_float("Mu", args.mu))
    frame = None
    if args.special_frame:
        frame = special_frame_check(**section_inputs(args), **top)
    if args.json:
        data = result.to_dict()
        if frame is not None:
            data["special_frame"] = frame.to_dict()
        return json.dumps(data, ensure_ascii=False)
    return summary(result, frame)


def run_curve(args: argparse.Namespace) -> str:
    if not 2 <= args.points <= 100_000:
        raise InputError("points", args.points, "a whole number from 2 to 100000")
    curve = capacity_curve(**section_inputs(args), points=args.points)
    if args.json:
        return json.dumps(curve.to_dict(), ensure_ascii=False)
    return "\n".join(f"ρ = {r:.5f}  φMn = {m:.4g}  φ = {p:.3f}  {k}" for r, m, p, k in
                     zip(curve.rho, curve.phiMn, curve.phi, curve.section_class))


def _ratio(rho: float) -> str:
    """A limit ratio, or why there is none."""
    return "not reachable" if math.isinf(rho) else f"{rho:.5f}"


def summary(result: FlexuralCheck, frame: SpecialFrameCheck | None = None) -> str:
    """A readable, plain-text account of one check, and of the special frame checks if given."""
    beam, s, lim = result.beam, result.state, result.limits
    u = beam.system
    shape = "Rectangular section" if beam.flange is None else (
        f"Flanged section, bf = {beam.flange.width:g} {u.length}, hf = {beam.flange.thickness:g} {u.length}")
    depth = "" if beam.h is None else f"   h = {beam.h:g} {u.length}"
    lines = [
        f"{shape}, ACI 318-19 ({u.name.upper()} units)",
        f"  f'c = {beam.fc:g} {u.stress}   fy = {beam.fy:g} {u.stress}   Es = {beam.es:,.10g} {u.stress}",
        f"  b = {beam.b:g} {u.length}   d = {beam.d:.4g} {u.length}   dt = {beam.dt:g} {u.length}"
        f"   As = {beam.As:.4g} {u.area}{depth}",
    ]
    if len(s.layers) > 1:
        lines += [f"  {ls.layer.role.value} layer {ls.layer.area:g} {u.area} at {ls.layer.depth:g} {u.length}:"
                  f" ε = {ls.strain:+.5f}, fs = {ls.stress:+.5g} {u.stress}"
                  f"{' (yields)' if ls.yields else ''}" for ls in s.layers]
    lines += [
        "",
        f"  β1 = {s.beta1:.3f}   εty = {s.eps_ty:.5f}",
        f"  c = {s.c:.4g} {u.length}   a = {s.a:.4g} {u.length}   εt = {s.eps_t:.5f}"
        f"   fs = {s.fs_t:.5g} {u.stress} at dt ({'yields' if s.fs_t >= beam.fy else 'below yield'})",
        *([] if beam.d == beam.dt else
          [f"  at d = {beam.d:.4g} {u.length}: εs = {s.eps_s:.5f}   fs = {s.fs:.5g} {u.stress}"]),
        f"  Mn = {result.Mn:.4g} {u.moment}   φ = {s.phi:.3f}   φMn = {result.phiMn:.4g} {u.moment}",
        f"  class: {s.section_class.value}",
        "",
        f"  ρ = {result.rho:.5f}   ρmin = {lim.rho_min:.5f}   ρtc = {_ratio(lim.rho_tc)}"
        f"   ρ(εt=0.004) = {_ratio(lim.rho_max)}   ρb = {_ratio(lim.rho_b)}",
    ]
    if result.Mu is not None:
        lines.append(f"  Mu = {result.Mu:g} {u.moment}   Mu/φMn = {result.utilization:.3f}")
    lines.append("")
    lines += [f"  [{'PASS' if c.passed else 'FAIL'}] {c.clause} {c.title}: {c.detail}"
              for c in result.checks]
    lines += [f"  warning: {w}" for w in result.warnings]
    if frame is not None:
        lines += ["", *frame_summary(frame)]
    lines += ["", CAUTION]
    return "\n".join(lines)


def frame_summary(frame: SpecialFrameCheck) -> list[str]:
    """The special moment frame checks as lines of text."""
    u = frame.beam.system
    top = frame.negative_beam
    lines = [
        "Special moment frame beam, one section (ACI 318-19 18.6.3, 18.6.5, 20.2.2.5)",
        f"  bottom: As = {frame.beam.As:.4g} {u.area}   ρ = {frame.rho_bottom:.5f}"
        f"   As,min = {frame.As_min_bottom.value:.4g} {u.area}",
        (f"  top: As = {top.As:.4g} {u.area} at d = {top.d:g} {u.length} from the bottom face"
         f"   ρ = {frame.rho_top:.5f}   As,min = {frame.As_min_top.value:.4g} {u.area}"
         if top is not None else "  top: not given (--top-as, --top-d)"),
        f"  Mn+ = {frame.Mn_pos:.4g} {u.moment}"
        + ("" if frame.Mn_neg is None else f"   Mn− = {frame.Mn_neg:.4g} {u.moment}")
        + f"   ({frame.strength_basis})",
        f"  Mpr+ = {frame.Mpr_pos:.4g} {u.moment}"
        + ("" if frame.Mpr_neg is None else f"   Mpr− = {frame.Mpr_neg:.4g} {u.moment}")
        + "   (1.25 fy, φ = 1.0; ACI 318-19 2.3, 18.6.5.1)",
        "",
    ]
    lines += [f"  [{'PASS' if c.passed else 'FAIL'}] {c.clause} {c.title}: {c.detail}"
              for c in frame.checks]
    lines += [f"  [NOT CHECKED] {n.clause} {n.title}: {n.reason}" for n in frame.not_checked]
    lines += [f"  warning: {w}" for w in frame.warnings]
    lines += [f"  out of scope: {frame.out_of_scope}"]
    return lines
