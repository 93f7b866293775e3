"""The beam schedule: many checks from one CSV table, one beam a row.

`run_schedule(text)` reads a schedule (CSV text with a header row naming the
columns), checks every row with `engine.check` and returns a `Schedule`:
each row's inputs, results or the reason it could not be computed, and a
summary. `schedule_csv(schedule)` writes it back as CSV: the input columns
as they came, then the result columns.

Parsing is strict about values and forgiving about layout: column names are
matched without regard to case or surrounding spaces; unknown columns are
reported, not fatal; blank lines, a UTF-8 byte-order mark and a trailing
empty column are fine; tab- and semicolon-separated text (pasted from a
spreadsheet) is recognised from the header. A bad cell fails only its own
row, with a message naming the row (its line in the file, header = 1), the
column and the value. Decimal commas are refused: "3,16" would silently
mean something else to half the world's spreadsheets. A row with more cells
than the header has columns (what a decimal comma does to a comma-separated
row) is not read at all; missing cells at a row's end are blank. A line
that is not CSV (a stray quote, a cell over the `csv` size limit) fails
alone, and the lines after it are read as usual.

The results CSV is safe to open in a spreadsheet: text from the file that
a spreadsheet would run as a formula gets a leading quote (`spreadsheet_safe`).

Results are in each row's own units (kip·ft or kN·m for φMn).
"""

from __future__ import annotations

import csv
import io
import math
import re
from collections.abc import Callable, Iterable, Iterator, Mapping
from dataclasses import dataclass

from ..provisions.checks import check
from ..provisions.special_frame import special_frame_check
from ..section.errors import QUOTE_LIMIT, InputError, quoted
from .share_link import format_number

REQUIRED_COLUMNS = ("mark", "units", "fc", "fy", "b", "d", "As", "Mu")
OPTIONAL_COLUMNS = ("dt", "es", "spiral", "h", "bf", "hf", "asc", "dc", "layers", "frame",
                    "top_As", "top_d")
FRAME_COLUMNS = ("frame", "top_As", "top_d")  # the special moment frame checks, asked per row
"""dt, Es, spiral; overall depth h; flange bf and hf; compression steel asc at dc; further
tension layers as AREA@DEPTH pairs (the CLI's --layer), separated by spaces."""
RESULT_COLUMNS = ("phiMn", "section_class", "eps_t", "utilization", "Mcr", "ductility",
                  "frame_ok", "ok", "message")
INPUT_COLUMNS = REQUIRED_COLUMNS + OPTIONAL_COLUMNS
_CANONICAL = {name.lower(): name for name in INPUT_COLUMNS + RESULT_COLUMNS}

# ASCII digits only, as in share links: `\d` would also take other scripts' digits.
_NUMBER_TEXT = re.compile(r"[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?")
_COMMA_NUMBER = re.compile(r"[+-]?[0-9]*,[0-9]+([.,][0-9]+)*")
_TRUE, _FALSE = ("true", "yes", "y", "1"), ("false", "no", "n", "0", "")
_DELIMITERS = (",", "\t", ";")


class ScheduleError(InputError):
    """A schedule that cannot be read at all: no header, or a required column missing."""

    def __init__(self, message: str) -> None:
        self.message = message
        super().__init__("schedule", None, message)

    def __str__(self) -> str:
        return self.message


@dataclass(frozen=True)
class ScheduleRow:
    """One beam of the schedule and what became of it.

    `row` is the line in the file (header = 1), as a spreadsheet numbers it;
    `cells` the row's cells by input column name, as text; `inputs` the
    `engine.check` keywords (None when a cell was bad). When computed,
    `phiMn`, `section_class`, `eps_t`, `utilization`, `Mcr`, `ductility`
    (those two only for a row with h; None without) and `ok` are the engine's; `message` names failed checks and warnings, or says why the
    row could not be computed (then `computed` is False).
    """

    row: int
    mark: str
    cells: dict
    inputs: dict | None
    raw: tuple[str, ...] = ()  # every cell under the header, as given, for the output
    computed: bool = False
    phiMn: float | None = None
    section_class: str | None = None
    eps_t: float | None = None
    utilization: float | None = None
    Mcr: float | None = None  # 24.2.3.5, when the row gives h
    ductility: float | None = None  # curvature ductility μφ, when the row gives h
    frame: dict | None = None  # the frame checks asked for: their top steel (None: not asked)
    frame_ok: bool | None = None  # every Chapter 18 section check passed and could be made
    ok: bool | None = None
    message: str = ""

    def to_dict(self) -> dict:
        """The row as JSON-able data: its cells and results under the CSV's column names."""
        return {"row": self.row, **self.cells, "computed": self.computed,
                **{name: getattr(self, name) for name in RESULT_COLUMNS}}


@dataclass(frozen=True)
class ScheduleSummary:
    """Counts over the schedule and the most heavily used beam."""

    rows: int
    passed: int
    failed: int
    errors: int
    worst_utilization: float | None
    worst_mark: str | None
    worst_row: int | None

    def to_dict(self) -> dict:
        return dict(vars(self))

    def text(self) -> str:
        """One line a person reads: counts and the worst utilisation."""
        line = (f"{self.rows} beams: {self.passed} pass, {self.failed} fail, "
                f"{self.errors} could not be computed")
        if self.worst_utilization is not None:
            line += (f"; worst Mu/φMn = {self.worst_utilization:.3f} "
                     f"({self.worst_mark}, row {self.worst_row})")
        return line


@dataclass(frozen=True)
class ParsedSchedule:
    """A schedule read but not yet checked."""

    columns: tuple[str, ...]  # the header as given, in order
    unknown_columns: tuple[str, ...]  # reported, not used
    rows: tuple[ScheduleRow, ...]
    delimiter: str = ","


@dataclass(frozen=True)
class Schedule:
    """A checked schedule."""

    columns: tuple[str, ...]
    unknown_columns: tuple[str, ...]
    rows: tuple[ScheduleRow, ...]
    summary: ScheduleSummary

    def notes(self) -> tuple[str, ...]:
        """Unknown columns and row errors, one line each, for a person to read."""
        notes = [f"column {quoted(name)} is not an input; carried to the output unchanged (inputs: {', '.join(INPUT_COLUMNS)})"
                 for name in self.unknown_columns]
        notes += [row.message for row in self.rows if not row.computed]
        return tuple(notes)

    def to_dict(self) -> dict:
        return {"columns": list(self.columns), "unknown_columns": list(self.unknown_columns),
                "rows": [row.to_dict() for row in self.rows], "summary": self.summary.to_dict()}


def _delimiter(header_line: str) -> str:
    """The separator the header uses most: comma, tab (a spreadsheet paste) or semicolon."""
    return max(_DELIMITERS, key=header_line.count)


def parse_schedule(text: str) -> ParsedSchedule:
    """Read a schedule's CSV text into rows of `engine.check` keywords.

    Raises `ScheduleError` only when nothing can be read: no header, a
    required column missing, or a column named twice. Everything else is
    per row (`ScheduleRow.message`) or reported (`unknown_columns`): every
    non-blank line after the header ends up in a row, computed or not.
    """
    if text.startswith("\ufeff"):
        text = text[1:]
    lines = _lines(text)
    first = next((i for i, line in enumerate(lines) if line.strip(" \t\r\n,;")), None)
    if first is None:
        raise ScheduleError("the schedule is empty: expected a header row naming the columns "
                            f"({', '.join(REQUIRED_COLUMNS)})")
    delimiter = _delimiter(lines[first])
    layout: _Layout | None = None
    records = _records(lines, first, delimiter,
                       lambda cells: layout is not None and _line_breaks_allowed(cells, layout))
    header_record = next(records)
    if header_record.cells is None:
        raise ScheduleError(f"row {first + 1}: the header is not readable as CSV "
                            f"({header_record.problem})")
    header = header_record.cells
    fields, columns, unknown = _header_fields(header, first + 1)
    layout = _layout(fields, header, delimiter)
    rows = []
    for record in records:
        number = record.line + 1
        if record.cells is None:
            rows.append(_unreadable_row(number, lines[record.line], record.problem, layout))
        elif any(cell.strip() for cell in record.cells):
            rows.append(_parse_row(number, record.cells, layout))
    return ParsedSchedule(columns=tuple(columns), unknown_columns=tuple(unknown),
                          rows=tuple(rows), delimiter=delimiter)


_LINE_BREAK = re.compile(r"\r\n|\r|\n")


def _lines(text: str) -> list[str]:
    """`text` cut after each CRLF, CR or LF, the line breaks kept, as a spreadsheet counts lines.

    Not `str.splitlines`, which also cuts at form feeds, U+2028 and the like:
    those may sit inside a cell and must not move the row numbers.
    """
    lines, start = [], 0
    for match in _LINE_BREAK.finditer(text):
        lines.append(text[start:match.end()])
        start = match.end()
    if start < len(text):
        lines.append(text[start:])
    return lines


@dataclass(frozen=True)
class _Record:
    """One CSV record: where it starts (index into the lines) and its cells, or why none."""

    line: int
    cells: list[str] | None
    problem: str = ""


class _LineFeed:
    """The lines from `start` on, one at a time, counting how many the CSV reader took."""

    def __init__(self, lines: list[str], start: int) -> None:
        self.lines = lines
        self.next_index = start

    def __iter__(self) -> "_LineFeed":
        return self

    def __next__(self) -> str:
        if self.next_index >= len(self.lines):
            raise StopIteration
        self.next_index += 1
        return self.lines[self.next_index - 1]


_UNCLOSED_QUOTE = ('a quote (") opens a cell that runs on over the next lines; close it, '
                   "or remove it (only a column Rhoscope does not read, a note, may hold a "
                   "line break, inside quotes)")


def _records(lines: list[str], start: int, delimiter: str,
             line_breaks_allowed: Callable[[list[str]], bool]) -> Iterator[_Record]:
    """The CSV records of `lines` from `start` on; a broken one costs only its first line.

    A record the `csv` module refuses (a quote never closed, text after a
    closing quote, a cell over its size limit), or one that spans several
    lines where `line_breaks_allowed(cells)` says a line break cannot be, is
    reported at its first line; reading starts again on the next line, so
    one stray quote does not swallow the rows after it.
    """
    position = start
    while position < len(lines):
        feed = _LineFeed(lines, position)
        reader = csv.reader(feed, delimiter=delimiter, strict=True)
        position = len(lines)
        while True:
            begin = feed.next_index
            try:
                cells = next(reader)
            except StopIteration:
                break
            except csv.Error as error:
                yield _Record(begin, None, _csv_problem(str(error)))
                position = begin + 1
                break
            if feed.next_index - begin > 1 and not line_breaks_allowed(cells):
                yield _Record(begin, None, _UNCLOSED_QUOTE)
                position = begin + 1
                break
            yield _Record(begin, cells)


def _csv_problem(error: str) -> str:
    """The `csv` module's complaint as a person can act on it."""
    if "field limit" in error:
        return (f"a cell is longer than {csv.field_size_limit():,} characters (or a quote that "
                "is never closed runs on that far); nothing in this row was read")
    if "end of data" in error:
        return ('a quote (") opens a cell that is never closed; close it, or remove it; '
                "nothing in this row was read")
    if "expected after" in error:
        return ('text follows a closing quote (") in the same cell; quote the whole cell, '
                "or remove the quotes; nothing in this row was read")
    return f"not readable as CSV ({error}); nothing in this row was read"


def _line_breaks_allowed(cells: list[str], layout: "_Layout") -> bool:
    """Whether a record spanning lines is believable as one row with a note on several lines.

    It must fit the header; only cells of columns Rhoscope does not read (notes)
    may hold line breaks; and such a cell may not hold as many separators as a
    row has. A stray quote in column k that a quote in column j of a later line
    closes makes a record that fits the header only when j ≥ k, and then the
    cell holds the rest of the first row and the start of the last, at least
    width − 1 separators: whole rows, swallowed.
    """
    if len(cells) > layout.width:
        return False
    enough = max(layout.width - 1, 1)
    for i, cell in enumerate(cells):
        if "\n" in cell or "\r" in cell:
            if i not in layout.carried or cell.count(layout.delimiter) >= enough:
                return False
    return True


def _unreadable_row(number: int, line: str, problem: str, layout: "_Layout") -> ScheduleRow:
    """A row whose line could not be read as CSV: its mark if it can be told, and why."""
    position = next(i for i, name in layout.columns if name == "mark")
    pieces = line.rstrip("\r\n").split(layout.delimiter)
    mark = pieces[position].strip().strip('"').strip() if position < len(pieces) else ""
    if len(mark) > 200 or '"' in mark:
        mark = ""  # not believable as a mark: the quote or the long cell may be in it
    cells = {name: "" for _, name in layout.columns} | {"mark": mark}
    raw = tuple(mark if i == position else "" for i in range(layout.width))
    return ScheduleRow(row=number, mark=mark, cells=cells, inputs=None, raw=raw,
                       message=f"{_row_label(number, mark)}: {problem}")


def _row_label(number: int, mark: str) -> str:
    """How a message names a row: its line in the file, and its mark when it has one."""
    if not mark:
        return f"row {number}"
    return f"row {number} ({mark if len(mark) <= QUOTE_LIMIT else quoted(mark)})"


def _header_fields(header: list[str], line: int) -> tuple[dict[int, str], list[str], list[str]]:
    """Input column name by position; the header as given; the unknown names."""
    fields: dict[int, str] = {}
    seen: dict[str, int] = {}
    unknown = []
    for position, raw in enumerate(header):
        name = raw.strip()
        if not name:
            continue  # a trailing separator, common in spreadsheet exports
        canonical = _CANONICAL.get(name.lower())
        if canonical is None or canonical in RESULT_COLUMNS:
            # Result columns of an earlier run are recomputed, not read.
            if canonical is None:
                unknown.append(name)
            continue
        if canonical in seen:
            raise ScheduleError(f"row {line}: column {canonical!r} is named twice "
                                f"(columns {seen[canonical] + 1} and {position + 1})")
        seen[canonical] = position
        fields[position] = canonical
    missing = [name for name in REQUIRED_COLUMNS if name not in seen]
    if missing:
        raise ScheduleError(
            f"row {line}: the header lacks the column{'s' if len(missing) > 1 else ''} "
            f"{', '.join(missing)}; a schedule needs {', '.join(REQUIRED_COLUMNS)} "
            f"(optional: {', '.join(OPTIONAL_COLUMNS)})")
    return fields, [name.strip() for name in header], unknown


@dataclass(frozen=True)
class _Layout:
    """What every row of one file shares: where each input column is."""

    columns: tuple[tuple[int, str], ...]  # (position, input name), in INPUT_COLUMNS order
    unnamed: tuple[int, ...]  # positions under an empty header cell
    carried: frozenset[int]  # positions of named columns that are not read (notes, old results)
    width: int
    delimiter: str


def _layout(fields: Mapping[int, str], header: list[str], delimiter: str) -> _Layout:
    order = {name: k for k, name in enumerate(INPUT_COLUMNS)}
    return _Layout(
        columns=tuple(sorted(fields.items(), key=lambda item: order[item[1]])),
        unnamed=tuple(i for i, name in enumerate(header) if not name.strip()),
        carried=frozenset(i for i, name in enumerate(header)
                          if name.strip() and i not in fields),
        width=len(header), delimiter=delimiter)


_SEPARATOR_NAMES = {",": "comma", "\t": "tab", ";": "semicolon"}


def _parse_row(number: int, cells: list[str], layout: _Layout) -> ScheduleRow:
    count, width = len(cells), layout.width
    kept = {name: (cells[i].strip() if i < count else "") for i, name in layout.columns}
    mark = kept["mark"]
    raw = tuple(cells[:width]) + ("",) * (width - count)

    def failed(message: str) -> ScheduleRow:
        return ScheduleRow(row=number, mark=mark, cells=kept, inputs=None, raw=raw,
                           message=f"{_row_label(number, mark)}: {message}")

    # More cells than the header has columns most often means a decimal comma
    # split a number in two and shifted every cell after it into the next
    # column; nothing in the row can be trusted, an empty extra cell included.
    if count > width:
        extra = next((i for i in range(width, count) if cells[i].strip()), None)
        where = ("" if extra is None else
                 f" ({quoted(cells[extra].strip())} is in column {extra + 1}, past the last)")
        if layout.delimiter == ",":
            cause = ("a decimal comma (1,58 for 1.58) or an unquoted comma inside a cell splits "
                     "one value in two and shifts every cell after it; write 1.58, or quote a "
                     "cell that holds a comma")
        else:
            name = _SEPARATOR_NAMES[layout.delimiter]
            cause = (f"a {name} inside a cell splits it in two and shifts every cell after it; "
                     f"quote a cell that holds a {name}")
        return failed(f"{count} cells, but the header has {width} columns{where}, so nothing "
                      f"in this row was read: {cause}")
    # A value under an empty header cell: the same shift, or a column without a name.
    stray = [i for i in layout.unnamed if i < count and cells[i].strip()]
    if stray:
        hint = (" (a decimal comma splits a number in two and shifts the cells after it: "
                "write 3.16, not 3,16)" if layout.delimiter == "," else "")
        return failed(f"{quoted(cells[stray[0]].strip())} in column {stray[0] + 1}, which the "
                      f"header does not name; {width - len(layout.unnamed)} named "
                      f"columns{hint}; nothing in this row was read")
    # Fewer cells than columns: the missing ones at the end are blank, which
    # is fine for optional columns and names the required ones.
    missing = [name for i, name in layout.columns if i >= count and name in REQUIRED_COLUMNS]
    if missing:
        return failed(f"{count} cells, but the header has {width} columns: no cell for "
                      f"{', '.join(missing)} (a row may leave out only optional cells at its end)")
    if not mark:
        return failed("column mark is empty; every beam needs a mark")
    inputs: dict = {}
    try:
        for name, text in kept.items():
            if name == "mark":
                continue
            if name == "units":
                if not text:
                    raise _CellError(name, text, "us or si")
                inputs["units"] = text
            elif name == "spiral":
                inputs["spiral"] = _flag("spiral", text)
            elif name in FRAME_COLUMNS:
                continue  # read below: they ask for checks of their own, not for `check`
            elif name == "layers":
                if text:
                    inputs["layers"] = _layers(text)
            elif text and _NUMBER_TEXT.fullmatch(text):
                inputs[name] = float(text)
            elif text or name in REQUIRED_COLUMNS:
                _refuse_number(name, text)
        frame = None
        if _flag("frame", kept.get("frame", "")):
            frame = {}
            for name in ("top_As", "top_d"):
                text = kept.get(name, "")
                if text and not _NUMBER_TEXT.fullmatch(text):
                    _refuse_number(name, text)
                frame[name] = float(text) if text else None
    except _CellError as error:
        return failed(str(error))
    return ScheduleRow(row=number, mark=mark, cells=kept, inputs=inputs, raw=raw, frame=frame)


class _CellError(ValueError):
    def __init__(self, column: str, text: str, expected: str) -> None:
        super().__init__(f"column {column} = {quoted(text)}: expected {expected}")


def _refuse_number(column: str, text: str) -> None:
    """Raise the message for a cell that is not a plain decimal number."""
    if not text:
        raise _CellError(column, text, "a number (the cell is empty)")
    if _COMMA_NUMBER.fullmatch(text):
        raise _CellError(column, text, "a number with a decimal point (3.16), no commas: "
                         "decimal commas and thousands separators are not read")
    raise _CellError(column, text, "a number such as 4000 or 3.16")


def _layers(text: str) -> list[tuple[float, float]]:
    """`1.58@18.5 1.58@16` as [(1.58, 18.5), (1.58, 16.0)]."""
    pairs = []
    for item in re.split(r"[\s;]+", text.strip()):
        area, separator, depth = item.partition("@")
        if not (separator and _NUMBER_TEXT.fullmatch(area) and _NUMBER_TEXT.fullmatch(depth)):
            raise _CellError("layers", text, "AREA@DEPTH pairs separated by spaces, "
                             "e.g. 1.58@18.5 1.58@16")
        pairs.append((float(area), float(depth)))
    return pairs


def _flag(column: str, text: str) -> bool:
    lowered = text.lower()
    if lowered not in _TRUE + _FALSE:
        raise _CellError(column, text, "yes or no (true/false, 1/0; empty means no)")
    return lowered in _TRUE


def check_row(row: ScheduleRow) -> ScheduleRow:
    """`row` checked by `engine.check`, or with the engine's message when it refuses it.

    Never raises for an ordinary `Exception`: an unexpected one becomes the
    row's message ("internal error in the check: …; please report it").
    """
    if row.inputs is None or row.computed:
        return row
    try:
        return _checked(row)
    except InputError as error:
        field = error.field
        if field in row.cells:
            why = getattr(error, "why", "")
            text = (f"column {field} = {quoted(row.cells[field])}: expected {error.accepted}"
                    + (f" ({why})" if why else ""))
        else:
            text = str(error)
        return ScheduleRow(row=row.row, mark=row.mark, cells=row.cells, inputs=row.inputs,
                           raw=row.raw, message=f"{_row_label(row.row, row.mark)}: {text}")
    except Exception as error:  # noqa: BLE001 - one beam must never cost the schedule
        # A fault in the engine is a bug, not bad input: it fails this row alone,
        # says so and asks for a report, and the rest of the schedule is still checked.
        detail = quoted(str(error)) if str(error) else "no message"
        return ScheduleRow(row=row.row, mark=row.mark, cells=row.cells, inputs=row.inputs,
                           raw=row.raw,
                           message=f"{_row_label(row.row, row.mark)}: internal error in the "
                                   f"check: {type(error).__name__} ({detail}); please report "
                                   "it with this row")


def _checked(row: ScheduleRow) -> ScheduleRow:
    result = check(**row.inputs)
    state = result.state
    notes = [f"fails {c.clause} {c.title}: {c.detail}" for c in result.checks if not c.passed]
    notes += [f"warning: {w}" for w in result.warnings]
    frame_ok = None
    if row.frame is not None:
        section = {key: value for key, value in row.inputs.items() if key != "Mu"}
        frame = special_frame_check(**section, **{key: value for key, value in row.frame.items()
                                                  if value is not None})
        frame_ok = frame.ok
        notes += [f"frame: fails {c.clause} {c.title}: {c.detail}" for c in frame.checks
                  if not c.passed]
        notes += [f"frame: not checked {n.clause} {n.title}: {n.reason}"
                  for n in frame.not_checked]
    return ScheduleRow(
        row=row.row, mark=row.mark, cells=row.cells, inputs=row.inputs, raw=row.raw,
        computed=True,
        phiMn=result.phiMn, section_class=state.section_class.value, eps_t=state.eps_t,
        utilization=result.utilization, Mcr=result.Mcr, ductility=result.ductility,
        frame=row.frame, frame_ok=frame_ok, ok=result.ok, message="; ".join(notes))


def summarise(rows: Iterable[ScheduleRow]) -> ScheduleSummary:
    """How many rows pass, fail and could not be computed; the highest Mu/φMn."""
    count = passed = failed = errors = 0
    worst: ScheduleRow | None = None
    for row in rows:
        count += 1
        if not row.computed:
            errors += 1
            continue
        if row.ok:
            passed += 1
        else:
            failed += 1
        if row.utilization is not None and (worst is None or row.utilization > worst.utilization):
            worst = row
    return ScheduleSummary(
        rows=count, passed=passed, failed=failed, errors=errors,
        worst_utilization=None if worst is None else worst.utilization,
        worst_mark=None if worst is None else worst.mark,
        worst_row=None if worst is None else worst.row)


def check_schedule(parsed: ParsedSchedule,
                   progress: Callable[[int, int], None] | None = None) -> Schedule:
    """Check every row of `parsed`; `progress(done, total)` is called every 100 rows."""
    total = len(parsed.rows)
    rows = []
    for done, row in enumerate(parsed.rows, 1):
        rows.append(check_row(row))
        if progress is not None and (done % 100 == 0 or done == total):
            progress(done, total)
    return Schedule(columns=parsed.columns, unknown_columns=parsed.unknown_columns,
                    rows=tuple(rows), summary=summarise(rows))


def run_schedule(text: str) -> Schedule:
    """Read and check a schedule's CSV text (see `parse_schedule`, `check_schedule`)."""
    return check_schedule(parse_schedule(text))


def _cell(value: object) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return format_number(value) if math.isfinite(value) else str(value)
    return str(value)


def output_columns(schedule: Schedule | ParsedSchedule) -> tuple[int, ...]:
    """Positions of the input columns carried to the output, unknown ones included.

    Left out: columns without a name (a trailing separator; a row with a value
    there fails), and result columns of an earlier run, computed afresh.
    """
    return tuple(i for i, name in enumerate(schedule.columns)
                 if name and _CANONICAL.get(name.lower()) not in RESULT_COLUMNS)


_FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r", "\n")
_FIRST_CHARACTERS_TO_LOOK_AT = frozenset("=+-@\t\r\n ")


def spreadsheet_safe(text: str) -> str:
    """`text` as a results cell that a spreadsheet shows and never runs.

    The OWASP rule against CSV injection: a cell that starts with `=`, `+`,
    `-`, `@`, a tab or a line break (after any spaces) is a formula to
    Excel, LibreOffice and Google Sheets, which may fetch links or start
    programs when the file is opened; a single quote before it makes it
    text. A plain number such as -12.5 cannot run and stays a number.
    """
    if not text or text[0] not in _FIRST_CHARACTERS_TO_LOOK_AT:
        return text  # the usual case, decided by one character
    start = text.lstrip(" ")[:1]
    if start and start in _FORMULA_STARTS and not _NUMBER_TEXT.fullmatch(text.strip()):
        return "'" + text
    return text


def schedule_csv(schedule: Schedule) -> str:
    """The schedule as CSV: its input columns as given, then `RESULT_COLUMNS`.

    Numbers are written in full (the shortest text that reads back as the
    engine's float), so a spreadsheet rounds them for display, not the file.
    Every text that came from the file (header, cells, messages quoting
    them) passes through `spreadsheet_safe`; the numbers Rhoscope computed
    are written as numbers.
    """
    positions = output_columns(schedule)
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow([spreadsheet_safe(schedule.columns[i]) for i in positions]
                    + list(RESULT_COLUMNS))
    for row in schedule.rows:
        writer.writerow([spreadsheet_safe(row.raw[i]) for i in positions]
                        + [_cell(getattr(row, name)) for name in RESULT_COLUMNS[:-1]]
                        + [spreadsheet_safe(row.message)])
    return out.getvalue()
