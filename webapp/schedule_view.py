"""The beam schedule: upload a CSV or paste from a spreadsheet, check every row, download.

Reading, checking and writing are the engine's (`engine.documents.schedule`); this
view only feeds it text and draws what comes back: a sortable table (a
Bokeh DataTable, whose JS ships with the page), the summary, and the
notes on unknown columns and rows that could not be computed. Text the user
supplied (marks, messages quoting cells) is shown as table text or escaped.

A long schedule is checked in chunks of `CHUNK` rows, yielding to the event
loop between chunks (`await asyncio.sleep(0)`) and moving a progress bar,
so the page stays responsive; this works the same in a Panel server and in
Pyodide, which has no threads. A new run cancels one still going.
"""

from __future__ import annotations

import asyncio
import html
import io
import math
from collections.abc import Callable, Sequence

import panel as pn
import param
from bokeh.core.properties import field
from bokeh.models import ColumnDataSource, DataTable, NumberFormatter, StringFormatter, TableColumn

from engine.documents.schedule import (REQUIRED_COLUMNS, Schedule, ScheduleError, ScheduleRow,
                             check_row, parse_schedule, schedule_csv, summarise)
from engine.documents.share_link import share_query

from .summary import messages_html
from .theme import DOWNLOAD_CSS, TEXT_CSS

CHUNK = 50  # rows per step between yields: ~5 ms in CPython, a few tens in Pyodide
MAX_NOTES = 25  # notes listed; the rest are counted
MAX_UPLOAD_BYTES = 20_000_000
TABLE_HEIGHT = 420  # px; longer schedules scroll inside the table

COLUMNS = (  # (field, title, formatter kind, width); moment titles get their units in `show`
    ("row", "Row", "int", 45), ("mark", "Mark", "text", 80), ("units", "Units", "text", 45),
    ("phiMn", "φMn", "moment", 95), ("moment_unit", "unit", "text", 55),
    ("section_class", "Class", "text", 140), ("eps_t", "εt", "strain", 75),
    ("utilization", "Mu/φMn", "ratio", 70), ("Mcr", "Mcr", "moment", 90),
    ("ductility", "μφ", "ratio", 60), ("frame", "Ch. 18", "text", 80),
    ("ok", "Result", "text", 110),
    ("message", "Message", "text", 520),
)
_MOMENT_UNIT = {"us": "kip·ft", "si": "kN·m"}
VERDICT = {"pass": "✔ passes", "fail": "✘ fails", "error": "⚠ not computed"}
"""The result column's words: a mark and a word, so a failing row reads as one without colour."""
SHADE = {"pass": "#ffffff", "fail": "#fde2e2", "error": "#fff4d6"}  # row backgrounds
MOMENT_DIGITS, RATIO_DIGITS = 4, 3  # significant figures shown; the CSV keeps every digit
ROW_LINE_PX, MESSAGE_CHARS_PER_LINE, MAX_MESSAGE_LINES = 16, 80, 12


def shown(value: float | None, digits: int) -> float:
    """`value` rounded to `digits` significant figures for display (NaN when not computed)."""
    if value is None or not math.isfinite(value):
        return math.nan
    return float(f"{value:.{digits}g}")


def moment_title(units: Sequence[str], name: str = "φMn") -> str:
    """A moment column's title with its unit; "see unit" (the unit column) when units mix."""
    found = sorted({_MOMENT_UNIT[u] for u in units if u in _MOMENT_UNIT})
    return f"{name} ({found[0]})" if len(found) == 1 else f"{name} (see unit)"


def row_height(messages: Sequence[str]) -> int:
    """Grid row height (px) that shows the longest message wrapped, up to `MAX_MESSAGE_LINES`."""
    longest = max((len(m) for m in messages), default=0)
    lines = min(MAX_MESSAGE_LINES, max(1, math.ceil(longest / MESSAGE_CHARS_PER_LINE)))
    return 8 + ROW_LINE_PX * lines


def _state(row: ScheduleRow) -> str:
    if not row.computed:
        return "error"
    return "pass" if row.ok else "fail"


def table_data(rows: Sequence[ScheduleRow]) -> dict[str, list]:
    """The DataTable's columns for `rows`: numbers rounded for display (NaN when not computed).

    φMn to 4 significant figures, Mu/φMn to 3, εt to 5 decimals (its formatter);
    the results file keeps the engine's numbers in full (`schedule_csv`).
    """
    units = [str(row.cells.get("units", "")).strip().lower() for row in rows]
    states = [_state(row) for row in rows]
    return {
        "row": [row.row for row in rows],
        "mark": [row.mark for row in rows],
        "units": units,
        "phiMn": [shown(row.phiMn, MOMENT_DIGITS) for row in rows],
        "moment_unit": [_MOMENT_UNIT.get(u, "") if row.computed else ""
                        for u, row in zip(units, rows)],
        "section_class": [row.section_class or "" for row in rows],
        "eps_t": [math.nan if row.eps_t is None else float(row.eps_t) for row in rows],
        "utilization": [shown(row.utilization, RATIO_DIGITS) for row in rows],
        "Mcr": [shown(row.Mcr, MOMENT_DIGITS) for row in rows],  # rows with h only
        "ductility": [shown(row.ductility, RATIO_DIGITS) for row in rows],
        # the special moment frame checks, for rows that ask for them: a mark and a word
        "frame": ["" if row.frame_ok is None else "✔ pass" if row.frame_ok else "✘ fail"
                  for row in rows],
        "ok": [VERDICT[state] for state in states],
        "state": states,
        "shade": [SHADE[state] for state in states],
        "message": [row.message for row in rows],
    }


def _formatter(kind: str):
    """A cell formatter whose background is the row's shade (the `shade` column)."""
    shade = {"background_color": field("shade")}
    if kind == "int":
        return NumberFormatter(format="0", text_align="right", **shade)
    if kind == "moment":  # values already at 4 significant figures: no trailing zeros added
        return NumberFormatter(format="0,0.[000000]", text_align="right", nan_format="—",
                               **shade)
    if kind == "strain":
        return NumberFormatter(format="0.00000", text_align="right", nan_format="—", **shade)
    if kind == "ratio":  # values at 3 significant figures: 0.953, 1.20, 0.05
        return NumberFormatter(format="0.00[0]", text_align="right", nan_format="—", **shade)
    return StringFormatter(**shade)


# SlickGrid cells are one clipped line by default; the message column wraps instead.
TABLE_CSS = """
.slick-cell { white-space: normal; overflow-wrap: anywhere; line-height: 16px; }
.slick-row { cursor: pointer; }
"""


class ScheduleView(pn.viewable.Viewer):
    """Check a whole beam schedule with the engine and show, summarise and download it."""

    running = param.Boolean(default=False, doc="a schedule is being checked")
    schedule = param.ClassSelector(class_=Schedule, default=None, allow_None=True,
                                   doc="the last checked schedule")

    def __init__(self, chunk: int = CHUNK, open_check: Callable[[str], None] | None = None,
                 **params) -> None:
        super().__init__(**params)
        self.chunk = chunk
        self._open_check = open_check  # the page's hook: a share query into the Check tab
        self._run_id = 0
        self.upload = pn.widgets.FileInput(accept=".csv,.tsv,.txt", multiple=False,
                                           css_classes=["rs-schedule-upload"])
        self.upload.param.watch(self._on_upload, "value")
        self.paste = pn.widgets.TextAreaInput(
            label="…or paste rows from a spreadsheet (header row first; tabs or commas)",
            placeholder=", ".join(REQUIRED_COLUMNS) + "\nB-101, us, 4000, 60000, 12, 21.5, 3.16, 180",
            height=130, sizing_mode="stretch_width", css_classes=["rs-schedule-paste"])
        self.run_button = pn.widgets.Button(label="Check pasted rows", color="primary",
                                            css_classes=["rs-schedule-run"])
        self.run_button.on_click(self._on_run)
        self.progress = pn.indicators.Progress(value=0, max=100, visible=False,
                                               sizing_mode="stretch_width", height=14,
                                               css_classes=["rs-schedule-progress"])
        self.status = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                   css_classes=["rs-schedule-status"])
        self.summary = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                    css_classes=["rs-schedule-summary"])
        self.notes = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                  css_classes=["rs-schedule-notes"])
        self.source = ColumnDataSource(table_data(()), name="schedule_rows")
        self.table = DataTable(
            source=self.source, sortable=True, reorderable=False, index_position=None,
            columns=[TableColumn(field=f, title=t, formatter=_formatter(k), width=w)
                     for f, t, k, w in COLUMNS],
            height=TABLE_HEIGHT, sizing_mode="stretch_width", name="schedule_table",
            stylesheets=[TABLE_CSS])
        self.source.selected.on_change("indices", self._on_select)
        # SlickGrid (the DataTable's grid) fails to start inside a hidden tab, and its
        # error stops the whole page from rendering; so the table joins the layout only
        # once there is something to show and the view is on screen.
        self.table_slot = pn.Column(sizing_mode="stretch_width")
        self._visible: Callable[[], bool] = lambda: True
        self.download = pn.widgets.FileDownload(
            callback=self._download_file, filename="schedule-results.csv",
            label="Download results (CSV)", color="primary", stylesheets=[DOWNLOAD_CSS],
            disabled=True, css_classes=["rs-schedule-download"], width=220)
        self._layout = pn.Column(
            pn.pane.HTML(
                "<h3>Beam schedule</h3><div class=\"rs-note\">One beam a row, with a header "
                "naming the columns: " + ", ".join(REQUIRED_COLUMNS) + " (optional: dt, es, "
                "spiral, h, bf, hf, asc, dc). Decimal points, not commas.</div>",
                stylesheets=[TEXT_CSS], sizing_mode="stretch_width"),
            pn.FlexBox(pn.pane.HTML('<div class="rs-note">Upload a CSV file:</div>',
                                    stylesheets=[TEXT_CSS], width=130), self.upload),
            self.paste, pn.FlexBox(self.run_button, self.download),
            self.progress, self.status, self.summary,
            self.table_slot,
            pn.pane.HTML('<div class="rs-note">Click a row to open that beam in the Check tab. '
                         'The table rounds (φMn to 4 significant figures, Mu/φMn to 3, εt to 5 '
                         'decimals); the results file keeps every digit.</div>',
                         stylesheets=[TEXT_CSS], sizing_mode="stretch_width"),
            self.notes,
            sizing_mode="stretch_width")

    # -- wiring ----------------------------------------------------------

    def follow(self, tabs: pn.Tabs) -> "ScheduleView":
        """Add the table only while this view is the active tab of `tabs`."""
        self._visible = lambda: (0 <= tabs.active < len(tabs.objects)
                                 and tabs.objects[tabs.active] is self._layout)
        tabs.param.watch(lambda event: self._place_table(), "active")
        return self

    @classmethod
    def attach(cls, page, title: str = "Beam schedule", **params) -> "ScheduleView":
        """A schedule view added to `page` as the tab `title` (page: add_view, views)."""
        view = cls(open_check=getattr(page, "open_check", None), **params)
        page.add_view(title, view)
        tabs = getattr(page, "views", None)
        if tabs is not None:
            view.follow(tabs)
        return view

    def _place_table(self) -> None:
        if not self.table_slot.objects and self.schedule is not None and self._visible():
            self.table_slot.append(pn.pane.Bokeh(self.table, sizing_mode="stretch_width"))

    def _on_select(self, attr, old, new) -> None:
        if new:
            self.open_row(new[0])

    def open_row(self, index: int) -> None:
        """Open row `index` of the table's data in the check: the page takes its inputs.

        The row's `engine.check` keywords travel as a share query
        (`engine.documents.share_link.share_query`), as if its link had been opened; the
        page shows the Check tab. A row whose cells could not be read has no
        inputs to open, and says so.
        """
        if self.schedule is None or not 0 <= index < len(self.schedule.rows):
            return
        row = self.schedule.rows[index]
        self.source.selected.indices = []  # a second click on the same row opens it again
        if row.inputs is None:
            self.status.object = messages_html(
                [f"{row.message} (nothing to open in the check)"])
            return
        if self._open_check is not None:
            self.status.object = ""
            frame = None if row.frame is None else {
                "frame": True, **{key: value for key, value in row.frame.items() if value is not None}}
            self._open_check(share_query(row.inputs, frame))

    # -- input -----------------------------------------------------------

    def _on_upload(self, event) -> None:
        data = event.new
        if not data:
            return
        if len(data) > MAX_UPLOAD_BYTES:
            self._fail(f"the file is {len(data):,} bytes; at most {MAX_UPLOAD_BYTES:,} are read")
            return
        try:
            text = data.decode("utf-8-sig")
        except UnicodeDecodeError as error:
            self._fail(f"{self.upload.filename or 'the file'}: not UTF-8 text (byte "
                       f"{error.start}); save the spreadsheet as 'CSV UTF-8'")
            return
        self.start(text)

    def _on_run(self, event) -> None:
        text = self.paste.value_input if self.paste.value_input is not None else self.paste.value
        self.start(text or "")

    def start(self, text: str) -> None:
        """Check `text` in the background of the page's event loop (see `run`)."""
        async def job() -> None:
            await self.run(text)

        pn.state.execute(job)

    def _fail(self, message: str) -> None:
        """Say why the new text could not be read, and drop the last schedule's results.

        The old table and summary would otherwise read as the new file's.
        """
        self._run_id += 1  # a run still going belongs to the old text: stop it
        with pn.io.hold():
            self.running = False
            self.schedule = None
            self.source.data = table_data(())
            self.table_slot.clear()
            self.summary.object = ""
            self.notes.object = ""
            self.download.disabled = True
            self.status.object = messages_html([message])
            self.progress.visible = False

    # -- checking --------------------------------------------------------

    async def run(self, text: str) -> Schedule | None:
        """Check the schedule in `text`, a chunk at a time; None when it cannot be read or was cancelled."""
        self._run_id += 1
        run_id = self._run_id
        try:
            parsed = parse_schedule(text)
        except ScheduleError as error:
            self._fail(str(error))
            return None
        except Exception as error:  # noqa: BLE001 - a bug must end in a message, not a stuck run
            self._fail(f"internal error while reading the schedule: {type(error).__name__}; "
                       "please report it with the file")
            return None
        total = len(parsed.rows)
        self.running = True
        self.progress.param.update(value=0, max=max(total, 1), visible=True)
        self.status.object = f'<div class="rs-note">Checking {total:,} rows…</div>'
        rows: list[ScheduleRow] = []
        try:
            for start in range(0, total, self.chunk):
                rows.extend(check_row(row) for row in parsed.rows[start:start + self.chunk])
                self.progress.value = len(rows)
                await asyncio.sleep(0)  # let the page draw and take input between chunks
                if run_id != self._run_id:
                    return None  # a newer run replaced this one
        finally:
            if run_id == self._run_id:
                self.running = False
        schedule = Schedule(columns=parsed.columns, unknown_columns=parsed.unknown_columns,
                            rows=tuple(rows), summary=summarise(rows))
        self.show(schedule)
        return schedule

    def show(self, schedule: Schedule) -> None:
        """Draw a checked schedule: table data in place, summary, notes, download."""
        with pn.io.hold():
            self.schedule = schedule
            data = table_data(schedule.rows)
            self.source.data = data
            self.table.row_height = row_height(data["message"])
            self.table.height = min(TABLE_HEIGHT,
                                    32 + self.table.row_height * max(len(schedule.rows), 1))
            units = {u for u, unit in zip(data["units"], data["moment_unit"]) if unit}
            columns = {column.field: column for column in self.table.columns}
            columns["phiMn"].title = moment_title(sorted(units))
            columns["Mcr"].title = moment_title(sorted(units), "Mcr")
            columns["moment_unit"].visible = len(units) > 1  # only when the units are mixed
            self.progress.visible = False
            self.status.object = ""
            self.summary.object = summary_html(schedule)
            self.notes.object = notes_html(schedule.notes())
            self.download.disabled = False
            self._place_table()

    def results_csv(self) -> str:
        """The engine's CSV of the last checked schedule ("" before any)."""
        return "" if self.schedule is None else schedule_csv(self.schedule)

    def _download_file(self) -> io.BytesIO:
        return io.BytesIO(self.results_csv().encode("utf-8"))

    def __panel__(self):
        return self._layout


def summary_html(schedule: Schedule) -> str:
    """Counts and the worst utilisation, escaped; the pass/fail state drives the colour."""
    s = schedule.summary
    css = "rs-ok" if s.failed == 0 and s.errors == 0 else "rs-msg"
    return (f'<div class="{css}" data-q="schedule-summary" data-rows="{s.rows}" '
            f'data-passed="{s.passed}" data-failed="{s.failed}" data-errors="{s.errors}">'
            f'{html.escape(s.text())}</div>')


def notes_html(notes: Sequence[str]) -> str:
    if not notes:
        return ""
    shown = list(notes[:MAX_NOTES])
    if len(notes) > MAX_NOTES:
        shown.append(f"… and {len(notes) - MAX_NOTES} more (see the message column)")
    return messages_html(shown, "rs-warn")
