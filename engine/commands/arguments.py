"""Flags and parsing shared by the subcommands that describe one section."""

from __future__ import annotations

import argparse

from ..section.errors import InputError


def parse_float(field: str, text: str | None) -> float | None:
    """`text` as a float (None stays None), or an `InputError` naming `field`."""
    if text is None:
        return None
    try:
        return float(text)
    except ValueError:
        raise InputError(field, text, "a number") from None


def parse_layer(text: str, number: int) -> tuple[float, float]:
    """`AREA@DEPTH` as (area, depth); `number` counts layers as `engine.check` does."""
    area, separator, depth = text.partition("@")
    if not separator:
        raise InputError(f"layer {number}", text, "AREA@DEPTH, e.g. 1.58@21.5")
    return parse_float(f"layer {number} area", area), parse_float(f"layer {number} depth", depth)


def add_required_flags(parser: argparse.ArgumentParser, *more: tuple[str, str]) -> None:
    """--units, --fc, --fy and --b, then each (flag, meaning) in `more`, all required."""
    parser.add_argument("--units", required=True, help="us (psi, in, kip·ft) or si (MPa, mm, kN·m)")
    for flag, meaning in (("--fc", "f'c, concrete strength"), ("--fy", "fy, steel yield strength"),
                          ("--b", "b, width (the web width bw of a T or L)"), *more):
        parser.add_argument(flag, required=True, metavar="F", help=meaning)


def add_section_flags(parser: argparse.ArgumentParser) -> None:
    """Every flag that describes a section: units, materials, shape and steel."""
    add_required_flags(parser)
    parser.add_argument("--d", metavar="F", help="d, depth to the tension steel (with --as)")
    parser.add_argument("--as", metavar="F", help="As, tension steel area at d")
    parser.add_argument("--layer", action="append", default=[], metavar="AREA@DEPTH",
                        help="a tension steel layer; repeat for more (then --as/--d may be left out)")
    parser.add_argument("--asc", metavar="F", help="A's, compression steel area (with --dc)")
    parser.add_argument("--dc", metavar="F", help="d', depth to the compression steel")
    parser.add_argument("--h", metavar="F", help="h, overall depth")
    parser.add_argument("--bf", metavar="F", help="bf, effective flange width (with --hf)")
    parser.add_argument("--hf", metavar="F", help="hf, flange thickness")
    parser.add_argument("--dt", metavar="F",
                        help="dt, depth to the extreme tension layer (default: the deepest layer)")
    parser.add_argument("--es", metavar="F", help="Es (default 29,000,000 psi or 200,000 MPa)")
    parser.add_argument("--spiral", action="store_true",
                        help="spiral transverse reinforcement (φ, Table 21.2.2)")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def section_inputs(args: argparse.Namespace) -> dict:
    """The section flags as keyword arguments of `engine.check`."""
    return {
        "units": args.units,
        **{name: parse_float(name, getattr(args, attr)) for name, attr in
           (("fc", "fc"), ("fy", "fy"), ("b", "b"), ("d", "d"), ("As", "as"),
            ("dt", "dt"), ("es", "es"), ("h", "h"), ("bf", "bf"), ("hf", "hf"),
            ("asc", "asc"), ("dc", "dc"))},
        # Numbered as the engine numbers them: the As at d layer, when given, is layer 1.
        "layers": [parse_layer(text, number) for number, text in
                   enumerate(args.layer, start=1 if args.d is None else 2)],
        "spiral": args.spiral,
    }
