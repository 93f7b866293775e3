"""`batch`: check every beam of a schedule (CSV) and write the results.

Exit status: 0 when every row was computed (even if some beams fail their
checks), 1 when some rows could not be computed, 2 when the file cannot be
read at all (missing, not UTF-8, no header or a required column missing).
"""

from __future__ import annotations

import argparse
import json
import sys

from ..documents.schedule import ScheduleError, check_schedule, parse_schedule, schedule_csv
from ..provisions.checks import CAUTION
from ..section.errors import QUOTE_LIMIT, quoted
from .output_file import write_text

EXIT_ROWS_NOT_COMPUTED = 1


def register(commands) -> None:
    parser = commands.add_parser("batch", help="check every beam of a schedule (CSV)")
    parser.add_argument("schedule", metavar="IN.csv",
                        help="one beam a row; header: mark, units, fc, fy, b, d, As, Mu "
                             "(optional: dt, es, spiral, h, bf, hf, asc, dc)")
    parser.add_argument("--out", metavar="OUT.csv",
                        help="the results as CSV: the input columns, then phiMn, section_class, "
                             "eps_t, utilization, ok, message (default: standard output)")
    parser.add_argument("--json", action="store_true",
                        help="print the rows and the summary as one JSON object")
    parser.set_defaults(run=run_batch)


def read_text(path: str) -> str:
    """The file at `path` as text (UTF-8, with or without a byte-order mark)."""
    try:
        with open(path, "rb") as file:
            data = file.read()
    except OSError as error:
        raise ScheduleError(f"{shown_path(path)}: cannot be read "
                            f"({error.strerror or error})") from None
    except (ValueError, UnicodeError):  # a NUL in the name, or a name no file system holds
        raise ScheduleError(f"{shown_path(path)}: cannot be read "
                            "(not a possible file name)") from None
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as error:
        raise ScheduleError(f"{shown_path(path)}: not UTF-8 text (byte {error.start}); save the "
                            "spreadsheet as 'CSV UTF-8'") from None


def shown_path(path: str) -> str:
    """`path` as a one-line message shows it: as given, or quoted (shortened) when it is long
    or holds characters that would break the line."""
    if len(path) <= QUOTE_LIMIT and path.isprintable():
        return path
    return quoted(path)


def run_batch(args: argparse.Namespace) -> tuple[str, int]:
    text = read_text(args.schedule)
    try:
        schedule = check_schedule(parse_schedule(text))
    except ScheduleError as error:
        raise ScheduleError(f"{shown_path(args.schedule)}: {error}") from None
    status = EXIT_ROWS_NOT_COMPUTED if schedule.summary.errors else 0
    table = schedule_csv(schedule)
    if args.out is not None:
        write_text(args.out, table)
    if args.json:
        return json.dumps({**schedule.to_dict(), "caution": CAUTION}, ensure_ascii=False), status
    if args.out is None:
        # The CSV alone goes to stdout, so it can be piped; the account goes to stderr.
        print(f"{schedule.summary.text()}\n{CAUTION}", file=sys.stderr)
        return table.rstrip("\n"), status
    lines = [f"wrote {args.out}: {schedule.summary.text()}"]
    lines += [f"  {note}" for note in schedule.notes()]
    lines += ["", CAUTION]
    return "\n".join(lines), status
