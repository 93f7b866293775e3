"""Malformed schedules: nothing raises, every row is accounted for, no value moves.

Each case writes a schedule of known beams (rectangles well inside the
engine's range, in US or SI units) with a random header (order, case,
optional and unknown columns, hostile column names), separator (comma, tab,
semicolon), line ends (LF, CRLF, CR), byte-order mark and blank lines, and
hostile text in marks and notes (formulas, quotes, separators, NUL, other
scripts, line breaks in notes). Then about a third of the rows are broken
on purpose: a decimal comma, an extra cell, cells left off the end, a stray
quote, a cell over the CSV size limit, a NUL in a number.

The schedule must then

- read without raising anything but `ScheduleError` (and that only for a
  broken header), with a one-line message;
- have one row at the line where each written row starts (row numbers are
  the file's lines, counted independently here);
- compute a row only with exactly the values written for that beam (a
  shifted cell would change them), and compute every row that was not
  broken;
- fail each row broken so that a value would be lost or moved;
- write a results CSV with one line per row in which no text starts a
  spreadsheet formula, and `batch` give the status that matches.

Sizes: tests/fuzz/support.py.
"""

from __future__ import annotations

import csv
import io
import random
import re
import time

from engine.cli import main
from engine.documents.schedule import (OPTIONAL_COLUMNS, REQUIRED_COLUMNS, ScheduleError, check_schedule,
                             parse_schedule, schedule_csv)

from fuzz.support import Account, seed, shown, size

NOTES = ["north bay", "=HYPERLINK(\"http://attacker.example\",\"x\")", "+cmd|' /C calc'!A0",
         "-1+1", "@SUM(1+1)", "\tlevel 2", "see B-3, B-4", 'the "old" beam', "a;b", "a\tb",
         "Überzug", "\u0664\u0660", "\x00", "\ufeff", "  ", "", "line\nbreak", "two\r\nlines",
         "\u2028", "x" * 3000, "'quoted'", "\\", "\x1b[31m"]
MARKS = ["B-101", "G-3", "=1+1", "+B", "-B-2", "@B", "\tB-4", 'B"5', "B,6", "B;7", "B\t8",
         "Träger 9", "\u0664", "B\x00", " B-10 ", "\ufeffB-11", "梁-12", "B-" + "9" * 300]
UNKNOWN_COLUMNS = ["note", "level", "=cmd", "@x", "+y", "-z", "Bemerkung", "\ttab", "q\"uote",
                   "semi;colon", "comma,name", "ok", "message"]
SEPARATORS = [",", ",", ",", "\t", ";"]
LINE_ENDS = ["\n", "\n", "\r\n", "\r"]
BREAKS = ["none"] * 6 + ["decimal_comma", "extra_cell", "extra_empty_cell", "drop_tail",
                         "stray_quote", "huge_cell", "nul_in_number", "blank_line_before"]
LINE_BREAK = re.compile(r"\r\n|\r|\n")  # RFC 4180 line ends


def beam(rng: random.Random, columns: list[str]) -> dict[str, str]:
    """The cells of one valid beam, as text, for the input columns in `columns`."""
    if rng.random() < 0.7:
        fc, fy = rng.choice(["3000", "4000", "5000", "6000"]), rng.choice(["40000", "60000"])
        b, d = rng.choice(["10", "12", "14", "16.5", "24"]), rng.choice(["17.5", "21.5", "27.25"])
        cells = {"units": rng.choice(["us", "US", " us "]), "fc": fc, "fy": fy, "b": b, "d": d,
                 "As": f"{rng.uniform(0.006, 0.015) * float(b) * float(d):.2f}",
                 "Mu": f"{rng.uniform(20, 400):.1f}", "dt": f"{float(d) + rng.choice((0, 1.25)):g}",
                 "h": f"{float(d) + 2.5:g}", "es": rng.choice(["29000000", "", "2.9e7"])}
    else:
        fc, fy = rng.choice(["25", "28", "35"]), rng.choice(["420", "500"])
        b, d = rng.choice(["300", "350", "400"]), rng.choice(["450", "540.5", "640"])
        cells = {"units": "si", "fc": fc, "fy": fy, "b": b, "d": d,
                 "As": f"{rng.uniform(0.006, 0.014) * float(b) * float(d):.0f}",
                 "Mu": f"{rng.uniform(50, 600):.1f}", "dt": d, "h": f"{float(d) + 60:g}",
                 "es": rng.choice(["200000", ""])}
    cells["spiral"] = rng.choice(["yes", "no", "", "TRUE"])
    cells["mark"] = rng.choice(MARKS) if rng.random() < 0.5 else f"B-{rng.randrange(1000)}"
    return {name: cells.get(name, "") for name in columns}


def intended_inputs(cells: dict[str, str]) -> dict:
    """The `engine.check` keywords those cells mean, read independently of the engine."""
    inputs = {}
    for name, text in cells.items():
        text = text.strip()
        if name in ("mark",) or name not in REQUIRED_COLUMNS + OPTIONAL_COLUMNS:
            continue
        if name == "units":
            inputs["units"] = text
        elif name == "spiral":
            inputs["spiral"] = text.lower() in ("yes", "true", "y", "1")
        elif text:
            inputs[name] = float(text)
    return inputs


def quote(cell: str, separator: str) -> str:
    """`cell` as a CSV writer puts it (RFC 4180 quoting)."""
    if any(ch in cell for ch in (separator, '"', "\r", "\n")) or cell != cell.strip(" "):
        return '"' + cell.replace('"', '""') + '"'
    return cell


def one_schedule(rng: random.Random):
    """A schedule's text and, for each written row, (start line, cells, break, inputs or None)."""
    separator, line_end = rng.choice(SEPARATORS), rng.choice(LINE_ENDS)
    inputs_present = list(REQUIRED_COLUMNS) + rng.sample(["dt", "h", "es", "spiral"],
                                                         rng.randrange(5))
    unknown = rng.sample(UNKNOWN_COLUMNS, rng.randrange(3))
    names = inputs_present + unknown
    rng.shuffle(names)
    header = [rng.choice((name, name.upper(), f" {name} ")) if name in inputs_present else name
              for name in names]
    text = ("\ufeff" if rng.random() < 0.2 else "") + (line_end * rng.randrange(2))
    text += separator.join(quote(name, separator) for name in header)
    text += separator if rng.random() < 0.15 else ""  # a trailing separator in the header
    width = len(header) + (1 if text.endswith(separator) else 0)
    text += line_end
    rows = []
    for _ in range(rng.randrange(1, size("SCHEDULE_ROWS", 25) + 1)):
        cells = beam(rng, [n for n in names if n in inputs_present])
        for name in unknown:
            cells[name] = rng.choice(NOTES)
        written = [cells[name] for name in names] + [""] * (width - len(names))
        kind = rng.choice(BREAKS)
        inputs = intended_inputs(cells)
        may_fail = False
        pieces = [quote(cell, separator) for cell in written]
        numbers = [i for i, name in enumerate(names) if name in ("fc", "fy", "b", "d", "As", "Mu")]
        if kind == "decimal_comma":
            candidates = [i for i in numbers if "." in written[i]]
            if candidates:
                i = rng.choice(candidates)
                pieces[i] = written[i].strip().replace(".", ",")
                inputs = None
            else:
                kind = "none"
        elif kind in ("extra_cell", "extra_empty_cell"):
            pieces.append("" if kind == "extra_empty_cell" else rng.choice(["190", "x", "0"]))
            inputs = None
        elif kind == "drop_tail":
            keep = rng.randrange(1, len(pieces))
            dropped = names[keep:]
            pieces = pieces[:keep]
            if not any(cell.strip() for cell in written[:keep]):
                continue  # nothing left but blanks: a blank line, rightly skipped
            if any(name in REQUIRED_COLUMNS for name in dropped):
                inputs = None
            else:
                inputs = {k: v for k, v in inputs.items() if k not in dropped}
                if "spiral" in dropped and "spiral" in inputs_present:
                    inputs["spiral"] = False
        elif kind == "stray_quote":
            i = rng.randrange(len(pieces))
            at = rng.choice((0, len(pieces[i]), rng.randrange(len(pieces[i]) + 1)))
            pieces[i] = pieces[i][:at] + '"' + pieces[i][at:]
            may_fail = True  # fails, or (a quote inside a mark or note) computes as written
        elif kind == "huge_cell":
            pieces[rng.randrange(len(pieces))] = "9" * 140_000
            inputs = None
        elif kind == "nul_in_number":
            i = rng.choice(numbers)
            pieces[i] = written[i] + "\x00"
            inputs = None
        if kind == "blank_line_before":
            text += rng.choice(["", separator * rng.randrange(4)]) + line_end
        start_line = 1 + len(LINE_BREAK.findall(text.lstrip("\ufeff")))
        row_text = separator.join(pieces) + line_end
        rows.append((start_line, start_line + len(LINE_BREAK.findall(row_text)) - 1,
                     cells["mark"].strip(), kind, inputs, may_fail))
        text += row_text
    return text, rows


def judge(text: str, rows) -> str | None:
    """Why the schedule's outcome breaks the rules above, or None."""
    try:
        parsed = parse_schedule(text)
    except ScheduleError as error:
        return None if "\n" not in str(error) else "a header message of several lines"
    except Exception as error:  # noqa: BLE001 - what this test looks for
        return f"parse_schedule raised {type(error).__name__}: {error}"
    try:
        schedule = check_schedule(parsed)
    except Exception as error:  # noqa: BLE001
        return f"check_schedule raised {type(error).__name__}: {error}"
    by_line = {row.row: row for row in schedule.rows}
    spans_of_errors = []
    for start, end, mark, kind, inputs, may_fail in rows:
        got = by_line.get(start)
        if got is None:
            return f"the row written at line {start} ({kind}) is missing"
        if not got.computed:
            spans_of_errors.append((start, end))
            if inputs is not None and not may_fail:
                return f"line {start} ({kind}) not computed: {got.message[:300]}"
            if not got.message.startswith(f"row {start}"):
                return f"line {start}: the message does not name its row: {got.message[:200]}"
            continue
        if inputs is None:
            return f"line {start} ({kind}) computed, though its cells were broken"
        if got.inputs != inputs:
            return f"line {start} ({kind}): computed {got.inputs}, written {inputs}"
        if got.mark != mark and not may_fail:
            return f"line {start} ({kind}): mark {shown(got.mark)}, written {shown(mark)}"
    starts = {start for start, *_ in rows}
    for row in schedule.rows:
        if row.row not in starts and not any(a < row.row <= b for a, b in spans_of_errors):
            return f"a row at line {row.row} that no written row starts"
    out = list(csv.reader(io.StringIO(schedule_csv(schedule))))
    if len(out) != len(schedule.rows) + 1:
        return f"the results CSV has {len(out) - 1} rows for {len(schedule.rows)}"
    for line in out:
        for cell in line:
            first = cell.lstrip(" ")[:1]
            if first in ("=", "+", "-", "@", "\t", "\r", "\n") and not re.fullmatch(
                    r"\s*[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?\s*", cell):
                return f"a results cell a spreadsheet would run: {shown(cell)}"
    return None


def test_malformed_schedules_lose_and_move_nothing(tmp_path):
    rng = random.Random(seed() + 1)
    account = Account("malformed schedules")
    rows_total = 0
    for case in range(size("SCHEDULES", 300)):
        text, rows = one_schedule(rng)
        rows_total += len(rows)
        started = time.perf_counter()
        why = judge(text, rows)
        account.timed(f"case {case}: {len(rows)} rows, {len(text):,} characters",
                      time.perf_counter() - started)
        if why:
            account.fail(f"case {case} {shown(text, 400)}", why)
    account.name += f" ({rows_total} rows)"
    print(account.report())
    assert not account.failures, account.report()


def test_batch_status_and_results_file_match_the_rows(tmp_path, capsys):
    rng = random.Random(seed() + 2)
    for case in range(max(1, size("SCHEDULES", 300) // 30)):
        text, rows = one_schedule(rng)
        path, out = tmp_path / "schedule.csv", tmp_path / "results.csv"
        path.write_text(text, encoding="utf-8", newline="")
        status = main(["batch", str(path), "--out", str(out)])
        captured = capsys.readouterr()
        try:
            schedule = check_schedule(parse_schedule(text))
        except ScheduleError:
            assert status == 2 and captured.err.count("\n") == 1, (case, captured.err)
            continue
        assert status == (1 if schedule.summary.errors else 0), (case, captured.out[-500:])
        written = list(csv.reader(io.StringIO(out.read_text(encoding="utf-8"))))
        assert len(written) == len(schedule.rows) + 1, case
