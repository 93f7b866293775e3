"""Command line: `python -m engine <command> ...`.

The commands, their flags and their JSON keys are a stable contract (README,
"Command line"). Bad input exits with status 2 and one line on stderr naming
the field, never a traceback.
"""

from __future__ import annotations

import argparse
import ast
import os
import re
import sys
from collections.abc import Sequence
from importlib import import_module

from .section.errors import QUOTE_LIMIT, InputError, quoted

EXIT_BAD_INPUT = 2

# Each module under engine/commands registers its own subcommands.
COMMAND_MODULES = ("check", "curvature", "design", "report", "batch")


class _OneLineParser(argparse.ArgumentParser):
    """argparse that reports a usage error in one line, like every other input error."""

    def error(self, message: str) -> None:  # type: ignore[override]
        # argparse quotes the value it refuses whole; a long one is shortened as in InputError.
        message = _LONG_REPR.sub(_shortened, message)
        self.exit(EXIT_BAD_INPUT, f"{self.prog}: {' '.join(message.splitlines())}\n")


def _shortened(match: re.Match) -> str:
    try:
        return quoted(ast.literal_eval(match.group(0)))
    except (ValueError, SyntaxError):
        return quoted(match.group(0)[1:-1])


# A repr of a text longer than InputError quotes whole, as argparse puts it in its messages.
_LONG_REPR = re.compile(r"'(?:[^'\\\n]|\\.){%d,}'" % (QUOTE_LIMIT + 21))


def build_parser() -> argparse.ArgumentParser:
    parser = _OneLineParser(prog="python -m engine",
                            description="ACI 318-19 flexural check of reinforced-concrete beams.")
    commands = parser.add_subparsers(dest="command", required=True, parser_class=_OneLineParser)
    for name in COMMAND_MODULES:
        import_module(f".commands.{name}", __package__).register(commands)
    return parser


def main(argv: Sequence[str] | None = None) -> int:
    args = build_parser().parse_args(argv)
    try:
        output = args.run(args)
    except InputError as error:
        print(f"python -m engine {args.command}: {error}", file=sys.stderr)
        return EXIT_BAD_INPUT
    # `run` returns the text, or (text, exit status) when it can partly fail (batch).
    text, status = output if isinstance(output, tuple) else (output, 0)
    try:
        try:
            print(text)
        except UnicodeEncodeError:
            # A file name of bytes that are not UTF-8 (a lone surrogate, PEP 383),
            # echoed in "wrote …": shown escaped rather than lost in a traceback.
            print(text.encode("utf-8", "backslashreplace").decode("utf-8"))
        sys.stdout.flush()
    except BrokenPipeError:  # the reader stopped early (`| head`): not an error of ours
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
    return status
