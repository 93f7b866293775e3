"""`curvature`: moment–curvature of one section, from zero to crushing (h required)."""

from __future__ import annotations

import argparse
import json

from ..provisions.checks import CAUTION
from ..provisions.moment_curvature import (DEFAULT_POINTS, MAX_POINTS, MIN_POINTS, MomentCurvature,
                                           moment_curvature)
from .arguments import add_section_flags, section_inputs


def register(commands) -> None:
    parser = commands.add_parser("curvature",
                                 help="moment–curvature from zero to crushing (needs --h)")
    add_section_flags(parser)
    parser.add_argument("--points", type=int, default=DEFAULT_POINTS, metavar="N",
                        help=f"points on the curve, {MIN_POINTS} to {MAX_POINTS:,} "
                             f"(default {DEFAULT_POINTS}), the key states among them")
    parser.set_defaults(run=run_curvature)


def run_curvature(args: argparse.Namespace) -> str:
    result = moment_curvature(**section_inputs(args), points=args.points)
    if args.json:
        return json.dumps({**result.to_dict(), "caution": CAUTION}, ensure_ascii=False)
    return summary(result)


def summary(result: MomentCurvature) -> str:
    """A readable, plain-text account of the curve's key states."""
    beam = result.beam
    u = beam.system
    per_length = f"1/{u.length}"

    def state(name: str, point, missing: str) -> str:
        if point is None:
            return f"  {name:<12}{missing}"
        return (f"  {name:<12}φ = {point.curvature:.4e} {per_length}   M = {point.moment:.4g} {u.moment}"
                f"   ε top = {point.eps_top:.5f}   ε at dt = {point.eps_t:+.5f}")

    ductility = "none (no first yield)" if result.ductility is None else f"{result.ductility:.3g}"
    lines = [
        f"Moment–curvature, ACI 318-19 materials ({u.name.upper()} units)",
        f"  f'c = {beam.fc:g} {u.stress}   Ec = {result.Ec:,.0f} {u.stress} (19.2.2.1(b))"
        f"   fr = {result.fr:.4g} {u.stress} (19.2.3.1)   ε0 = {result.eps0:.5f}"
        f"   εcr = {result.eps_cr:.6f}   εty = {result.eps_ty:.5f}",
        "",
        state("cracking", result.cracking, "not found"),
        state("first yield", result.first_yield, "none: the top reaches 0.003 first"),
        state("crushing", result.crushing, "not found"),
        "",
        f"  μφ = {ductility}",
        f"  Mcr = {result.Mcr:.4g} {u.moment} (24.2.3.5, gross section)   Mn = {result.Mn:.4g} "
        f"{u.moment}   Mn/Mcr = {result.Mn_over_Mcr:.3g}",
        f"  {result.redistribution.reason}",
        f"  {len(result.points)} points; --json lists them.",
    ]
    lines += [f"  warning: {w}" for w in result.warnings]
    lines += ["", CAUTION]
    return "\n".join(lines)
