"""`report`: the calculation sheet of one check, written to an HTML file."""

from __future__ import annotations

import argparse
import datetime
import json
import re
import sys

from ..documents.share_link import share_url
from ..documents.sheet import calculation_sheet
from ..provisions.checks import CAUTION, check
from ..section.errors import InputError
from .arguments import add_section_flags, parse_float, section_inputs
from .output_file import write_text

DEFAULT_LINK_BASE = "http://localhost:8000/"
"""A placeholder for where the team hosts the app (`make run` serves it here)."""


def register(commands) -> None:
    parser = commands.add_parser(
        "report", help="write the calculation sheet of one check (HTML, prints on two numbered pages)")
    add_section_flags(parser)
    parser.add_argument("--mu", metavar="F", help="Mu, factored moment (kip·ft or kN·m)")
    parser.add_argument("--out", required=True, metavar="FILE", help="the sheet to write (HTML)")
    parser.add_argument("--project", default="", metavar="TEXT", help="project name")
    parser.add_argument("--mark", default="", metavar="TEXT", help="beam mark, e.g. B-101")
    parser.add_argument("--engineer", default="", metavar="TEXT", help="who made the check")
    parser.add_argument("--date", metavar="YYYY-MM-DD", help="date of the check (default today)")
    parser.add_argument("--link-base", default=DEFAULT_LINK_BASE, metavar="URL",
                        help=f"address of the app for the share link (default {DEFAULT_LINK_BASE}, "
                             "a placeholder for where the app is hosted)")
    parser.set_defaults(run=run_report)


def report_inputs(args: argparse.Namespace) -> dict:
    """The check's inputs from the flags, without those left at their defaults."""
    inputs = {**section_inputs(args), "Mu": parse_float("Mu", args.mu)}
    return {key: value for key, value in inputs.items()
            if value is not None and value != [] and not (key == "spiral" and value is False)}


def report_link(base: str, inputs: dict) -> str:
    """The share link of `inputs`, or "" when a link cannot carry them all.

    `share_url` refuses an input it cannot carry rather than drop it (a link
    without a flange or a layer would reopen another beam); then the sheet
    has no link, and `run_report` says why.
    """
    try:
        return share_url(base, inputs)
    except InputError:
        return ""


def parse_date(text: str | None) -> str:
    """`text` as an ISO date YYYY-MM-DD; today when not given."""
    if text is None:
        return datetime.date.today().isoformat()
    try:
        if not re.fullmatch(r"\d{4}-\d{2}-\d{2}", text):
            raise ValueError
        return datetime.date.fromisoformat(text).isoformat()
    except ValueError:
        raise InputError("date", text, "a date as YYYY-MM-DD, e.g. 2025-03-14") from None


def qr_svg(text: str) -> str | None:
    """The QR code of `text` as inline SVG, or None without segno or for a too long text.

    segno is imported here, not at the top, so the engine stays standard
    library only; it is in the `web` extra.
    """
    try:
        import segno
    except ImportError:
        return None
    try:
        return segno.make(text, error="m").svg_inline(scale=1, omitsize=True, dark="#000")
    except ValueError:  # segno.DataOverflowError: longer than a QR code holds
        return None


def text_flag(flag: str, value: str) -> str:
    """`value` of a text flag, or an `InputError` naming `flag` when it is not UTF-8 text.

    Bytes that are not UTF-8 reach Python as lone surrogates (PEP 383); the
    sheet is UTF-8 and could not hold them, so they are refused before any
    file is touched.
    """
    try:
        value.encode("utf-8")
    except UnicodeEncodeError as error:
        code = ord(value[error.start])
        byte = f"the byte 0x{code - 0xDC00:02x}" if 0xDC80 <= code <= 0xDCFF else "a character"
        raise InputError(flag, value, "UTF-8 text",
                         why=f"{byte} at character {error.start + 1} is not UTF-8") from None
    return value


def run_report(args: argparse.Namespace) -> str:
    for flag, value in (("project", args.project), ("mark", args.mark),
                        ("engineer", args.engineer), ("link-base", args.link_base)):
        text_flag(flag, value)
    inputs = report_inputs(args)
    date = parse_date(args.date)
    result = check(**inputs)
    link = report_link(args.link_base, inputs)
    qr = qr_svg(link) if link else None
    if not link:
        print("python -m engine report: the sheet has no share link (a link cannot carry "
              "every input of this section)", file=sys.stderr)
    elif qr is None:
        print("python -m engine report: the sheet has no QR code (segno is not installed, "
              "or the link is too long for one)", file=sys.stderr)
    sheet = calculation_sheet(inputs, project=args.project, mark=args.mark,
                              engineer=args.engineer, date=date, link=link, qr_svg=qr)
    write_text(args.out, sheet)
    if args.json:
        return json.dumps({"out": args.out, "link": link, **result.to_dict()}, ensure_ascii=False)
    verdict = "all checks pass" if result.ok else "fails " + ", ".join(
        c.clause for c in result.checks if not c.passed)
    return (f"wrote {args.out}: {verdict}; " + (f"share link {link}" if link else "no share link")
            + f"\n{CAUTION}")
