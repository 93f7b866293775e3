"""`design`: size the tension steel for Mu and list bar arrangements that fit."""

from __future__ import annotations

import argparse
import json

from ..design.sizing import DesignResult, Order, design_section
from ..provisions.checks import CAUTION
from ..provisions.detailing import Exposure, Support
from .arguments import add_required_flags, parse_float


def register(commands) -> None:
    parser = commands.add_parser("design", help="tension steel and bar arrangements for Mu")
    add_required_flags(parser, ("--h", "h, overall depth"),
                       ("--mu", "Mu, factored moment (kip·ft or kN·m)"))
    parser.add_argument("--cover", metavar="F",
                        help="clear cover to the stirrup (default ACI 318-19 Table 20.5.1.3.1)")
    parser.add_argument("--stirrup", metavar="SIZE", help="stirrup bar, e.g. #3 or 10 (default)")
    parser.add_argument("--agg", metavar="F",
                        help="nominal maximum aggregate size (default 0.75 in or 19 mm)")
    parser.add_argument("--layers", metavar="N", help="most layers of bars, 1 or 2 (default 2)")
    parser.add_argument("--layer-gap", metavar="F",
                        help="clear distance between layers (default 1 in or 25 mm, 25.2.2)")
    parser.add_argument("--exposure", metavar="NAME",
                        help=f"cover exposure: {', '.join(e.value for e in Exposure)} (default "
                             f"{Exposure.NOT_EXPOSED.value})")
    parser.add_argument("--bars", metavar="LIST", help="bar sizes to try, e.g. '#6,#7,#8' (default all)")
    parser.add_argument("--fs", metavar="F", help="service bar stress for 24.3.2 (default 2/3 fy)")
    parser.add_argument("--es", metavar="F", help="Es (default 29,000,000 psi or 200,000 MPa)")
    parser.add_argument("--span", metavar="F", help="span, in or mm, for Table 9.3.1.1 (with --support)")
    parser.add_argument("--support", metavar="NAME",
                        help=f"support condition: {', '.join(s.value for s in Support)}")
    parser.add_argument("--order", metavar="NAME",
                        help=f"ranking of the options: {Order.PRACTICAL.value} (fewer layers, then "
                             f"fewer bars within 10 %% of the lightest area; default) or "
                             f"{Order.LIGHTEST.value} (least area first)")
    parser.add_argument("--waive-as-min", action="store_true",
                        help="let As >= 4/3 As,req stand in for As,min (ACI 318-19 9.6.1.3); "
                             "default: As,min of 9.6.1.2 always")
    parser.add_argument("--json", action="store_true", help="print one JSON object")
    parser.set_defaults(run=run_design)


def _layers(text: str | None) -> object:
    """'1' or '2' as an int; anything else is passed on for the engine to refuse."""
    if text is None:
        return 2
    return int(text) if text.strip() in ("1", "2") else text


def run_design(args: argparse.Namespace) -> str:
    result = design_section(
        units=args.units,
        **{name: parse_float(name, getattr(args, attr)) for name, attr in
           (("fc", "fc"), ("fy", "fy"), ("b", "b"), ("h", "h"), ("Mu", "mu"), ("cover", "cover"),
            ("agg", "agg"), ("layer_gap", "layer_gap"), ("fs", "fs"), ("es", "es"),
            ("span", "span"))},
        stirrup=args.stirrup, layers=_layers(args.layers),
        exposure=Exposure.NOT_EXPOSED.value if args.exposure is None else args.exposure,
        support=args.support, bars=args.bars,
        order=Order.PRACTICAL.value if args.order is None else args.order,
        waive_as_min=args.waive_as_min)
    return json.dumps(result.to_dict(), ensure_ascii=False) if args.json else summary(result)


def _num(value: float) -> str:
    """Four significant figures, without exponent notation for large values."""
    return f"{value:.4g}" if abs(value) < 10_000 else f"{value:,.0f}"


def summary(result: DesignResult) -> str:
    """A readable, plain-text table of the options, best first."""
    s = result.section
    u = s.system
    L, A, M = u.length, u.area, u.moment
    lines = [
        f"Tension steel for Mu, rectangular section, ACI 318-19 ({u.name.upper()} units)",
        f"  f'c = {s.fc:g} {u.stress}   fy = {s.fy:g} {u.stress}   b = {s.b:g} {L}   h = {s.h:g} {L}"
        f"   Mu = {s.Mu:g} {M}",
        f"  cover = {s.cover:g} {L} to {s.stirrup.designation} stirrups   aggregate = {s.aggregate:g} {L}"
        f"   up to {s.max_layers} layer{'s' if s.max_layers > 1 else ''}",
        f"  order: {s.order.value}   As,min: "
        + ("9.6.1.2, or 4/3 As,req where 9.6.1.3 waives it" if s.waive_as_min else
           "9.6.1.2 (the 9.6.1.3 waiver not allowed)"),
        "",
        "  " + result.verdict,
    ]
    lines += [f"  way out: {text}" for text in result.remedies]
    header = (f"  {'bars':<16}{'As ' + A:>10}{'d ' + L:>10}{'dt ' + L:>10}{'φMn ' + M:>14}"
              f"{'εt':>9}{'clear ' + L:>10}  result")
    lines += ["", header, "  " + "-" * (len(header) - 2)]
    for o in result.options:
        verdict = ("ok" + (" by 9.6.1.3" if o.min_steel_waived else "") if o.ok else
                   "fails " + ", ".join(rule.clause for rule in o.failed_rules))
        if o is result.lightest:
            verdict += "  <- lightest"
        lines.append(f"  {o.label:<16}{_num(o.As):>10}{_num(o.d):>10}{_num(o.dt):>10}"
                     f"{_num(o.phiMn):>14}{o.eps_t:>9.4f}{_num(o.clear_spacing):>10}  {verdict}")
    best = result.best
    if best is not None:
        lines += ["", f"  Checks of {best.label}:"]
        lines += [f"  [{'PASS' if c.passed else 'FAIL'}] {c.clause} {c.title}: {c.detail}"
                  for c in result.detailing(best)]
    failing = [o for o in result.options if not o.ok]
    if failing:
        lines += ["", "  Rules broken:"]
        lines += [f"  {o.label}: {rule.clause} {rule.message}" for o in failing
                  for rule in o.failed_rules]
    lines += [f"  warning: {w}" for w in result.warnings]
    lines += ["", CAUTION]
    return "\n".join(lines)
