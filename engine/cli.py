"""Command line: `python -m engine check|curve ...`.

The flags and the JSON keys are a stable contract (README, "Command line").
Bad input exits with status 2 and one line on stderr naming the field.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence

from .checks import CAUTION, FlexuralCheck, check
from .curve import DEFAULT_POINTS, capacity_curve
from .errors import InputError

EXIT_BAD_INPUT = 2


class _OneLineParser(argparse.ArgumentParser):
    """argparse that reports a usage error in one line, like every other input error."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(EXIT_BAD_INPUT, f"{self.prog}: {message}\n")


def _parse_float(field: str, text: str | None) -> float | None:
    if text is None:
        return None
    try:
        return float(text)
    except ValueError:
        raise InputError(field, text, "a number") from None


def _section_flags(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("--units", required=True, help="us (psi, in, kip·ft) or si (MPa, mm, kN·m)")
    for flag, meaning in (("--fc", "f'c, concrete strength"), ("--fy", "fy, steel yield strength"),
                          ("--b", "b, width"), ("--d", "d, depth to the steel centroid"),
                          ("--as", "As, tension steel area")):
        parser.add_argument(flag, required=True, metavar="F", help=meaning)
    parser.add_argument("--dt", metavar="F", help="dt, depth to the extreme tension layer (default d)")
    parser.add_argument("--es", metavar="F", help="Es (default 29,000,000 psi or 200,000 MPa)")
    parser.add_argument("--spiral", action="store_true", help="spiral transverse reinforcement (φ, Table 21.2.2)")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def _section_inputs(args: argparse.Namespace) -> dict:
    return {
        "units": args.units,
        **{name: _parse_float(name, getattr(args, attr)) for name, attr in
           (("fc", "fc"), ("fy", "fy"), ("b", "b"), ("d", "d"), ("As", "as"),
            ("dt", "dt"), ("es", "es"))},
        "spiral": args.spiral,
    }


def build_parser() -> argparse.ArgumentParser:
    parser = _OneLineParser(prog="python -m engine",
                            description="ACI 318-19 flexural check of a reinforced-concrete beam.")
    commands = parser.add_subparsers(dest="command", required=True, parser_class=_OneLineParser)
    check_parser = commands.add_parser("check", help="check one section")
    _section_flags(check_parser)
    check_parser.add_argument("--mu", metavar="F", help="Mu, factored moment (kip·ft or kN·m)")
    curve_parser = commands.add_parser("curve", help="capacity against ρ for the plot")
    _section_flags(curve_parser)
    curve_parser.add_argument("--points", type=int, default=DEFAULT_POINTS, metavar="N",
                              help=f"evenly spaced ratios (default {DEFAULT_POINTS}), plus the limits")
    return parser


def summary(result: FlexuralCheck) -> str:
    """A readable, plain-text account of one check."""
    beam, s, lim = result.beam, result.state, result.limits
    u = beam.system
    lines = [
        f"Singly reinforced rectangular section, ACI 318-19 ({u.name.upper()} units)",
        f"  f'c = {beam.fc:g} {u.stress}   fy = {beam.fy:g} {u.stress}   Es = {beam.es:g} {u.stress}",
        f"  b = {beam.b:g} {u.length}   d = {beam.d:g} {u.length}   dt = {beam.dt:g} {u.length}"
        f"   As = {beam.As:g} {u.area}",
        "",
        f"  β1 = {s.beta1:.3f}   εty = {s.eps_ty:.5f}",
        f"  c = {s.c:.4g} {u.length}   a = {s.a:.4g} {u.length}   εt = {s.eps_t:.5f}"
        f"   fs = {s.fs:.5g} {u.stress} ({'yields' if s.steel_yields else 'does not yield'})",
        f"  Mn = {result.Mn:.4g} {u.moment}   φ = {s.phi:.3f}   φMn = {result.phiMn:.4g} {u.moment}",
        f"  class: {s.section_class.value}",
        "",
        f"  ρ = {result.rho:.5f}   ρmin = {lim.rho_min:.5f}   ρtc = {lim.rho_tc:.5f}"
        f"   ρ(εt=0.004) = {lim.rho_max:.5f}   ρb = {lim.rho_b:.5f}",
    ]
    if result.Mu is not None:
        lines.append(f"  Mu = {result.Mu:g} {u.moment}   Mu/φMn = {result.utilization:.3f}")
    lines.append("")
    lines += [f"  [{'PASS' if c.passed else 'FAIL'}] {c.clause} {c.title}: {c.detail}"
              for c in result.checks]
    lines += [f"  warning: {w}" for w in result.warnings]
    lines += ["", CAUTION]
    return "\n".join(lines)


def _run(args: argparse.Namespace) -> str:
    inputs = _section_inputs(args)
    if args.command == "check":
        result = check(**inputs, Mu=_parse_float("Mu", args.mu))
        return json.dumps(result.to_dict(), ensure_ascii=False) if args.json else summary(result)
    if args.points < 2 or args.points > 100_000:
        raise InputError("points", args.points, "a whole number from 2 to 100000")
    curve = capacity_curve(**inputs, points=args.points)
    if args.json:
        return json.dumps(curve.to_dict(), ensure_ascii=False)
    return "\n".join(f"{r:.5f}  φMn = {m:.4g}  φ = {p:.3f}  {k}" for r, m, p, k in
                     zip(curve.rho, curve.phiMn, curve.phi, curve.section_class))


def main(argv: Sequence[str] | None = None) -> int:
    args = build_parser().parse_args(argv)
    try:
        output = _run(args)
    except InputError as error:
        print(f"python -m engine {args.command}: {error}", file=sys.stderr)
        return EXIT_BAD_INPUT
    print(output)
    return 0
