"""Flags and parsing shared by the subcommands that describe one section."""

from __future__ import annotations

import argparse

from ..errors import InputError


def parse_float(field: str, text: str | None) -> float | None:
    """`text` as a float (None stays None), or an `InputError` naming `field`."""
    if text is None:
        return None
    try:
        return float(text)
    except ValueError:
        raise InputError(field, text, "a number") from None


def add_section_flags(parser: argparse.ArgumentParser) -> None:
    """The flags of issue 2's section contract: units, f'c, fy, b, d, As, dt, Es, spiral, json."""
    parser.add_argument("--units", required=True, help="us (psi, in, kip·ft) or si (MPa, mm, kN·m)")
    for flag, meaning in (("--fc", "f'c, concrete strength"), ("--fy", "fy, steel yield strength"),
                          ("--b", "b, width"), ("--d", "d, depth to the steel centroid"),
                          ("--as", "As, tension steel area")):
        parser.add_argument(flag, required=True, metavar="F", help=meaning)
    parser.add_argument("--dt", metavar="F", help="dt, depth to the extreme tension layer (default d)")
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
            ("dt", "dt"), ("es", "es"))},
        "spiral": args.spiral,
    }
