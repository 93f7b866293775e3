"""The beam schedule: upload a CSV or paste from a spreadsheet, check every row, download.

Reading, checking and writing are the engine's (`engine.schedule`); this
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
from bokeh.models import ColumnDataSource, DataTable, NumberFormatter, StringFormatter, TableColumn

from engine.schedule import (REQUIRED_COLUMNS, Schedule, ScheduleError, ScheduleRow,
                             check_row, parse_schedule, schedule_csv, summarise)

from .summary import messages_html
from .theme import DOWNLOAD_CSS, TEXT_CSS

CHUNK = 50  # rows per step between yields: ~5 ms in CPython, a few tens in Pyodide
MAX_NOTES = 25  # notes listed; the rest are counted
MAX_UPLOAD_BYTES = 20_000_000
TABLE_HEIGHT = 420  # px; longer schedules scroll inside the table

COLUMNS = (  # (field, title, formatter kind, width)
    ("row", "Row", "int", 50), ("mark", "Mark", "text", 80), ("units", "Units", "text", 50),
    ("phiMn", "φMn", "number", 80), ("moment_unit", "unit", "text", 55),
    ("section_class", "Class", "text", 150), ("eps_t", "εt", "strain", 80),
    ("utilization", "Mu/φMn", "ratio", 75), ("ok", "OK", "text", 60),
    ("message", "Message", "text", 520),
)
_MOMENT_UNIT = {"us": "kip·ft", "si": "kN·m"}


def table_data(rows: Sequence[ScheduleRow]) -> dict[str, list]:
    """The DataTable's columns for `rows`: numbers as floats (NaN when not computed)."""
    def number(value: float | None) -> float:
        return math.nan if value is None else float(value)

    def verdict(row: ScheduleRow) -> str:
        if not row.computed:
            return "error"
        return "pass" if row.ok else "FAIL"

    units = [str(row.cells.get("units", "")).strip().lower() for row in rows]
    return {
        "row": [row.row for row in rows],
        "mark": [row.mark for row in rows],
        "units": units,
        "phiMn": [number(row.phiMn) for row in rows],
        "moment_unit": [_MOMENT_UNIT.get(u, "") if row.computed else ""
                        for u, row in zip(units, rows)],
        "section_class": [row.section_class or "" for row in rows],
        "eps_t": [number(row.eps_t) for row in rows],
        "utilization": [number(row.utilization) for row in rows],
        "ok": [verdict(row) for row in rows],
        "message": [row.message for row in rows],
    }


def _formatter(kind: str):
    if kind == "int":
        return NumberFormatter(format="0", text_align="right")
    if kind == "number":
        return NumberFormatter(format="0,0.0", text_align="right", nan_format="—")
    if kind == "strain":
        return NumberFormatter(format="0.00000", text_align="right", nan_format="—")
    if kind == "ratio":
        return NumberFormatter(format="0.000", text_align="right", nan_format="—")
    return StringFormatter()


class ScheduleView(pn.viewable.Viewer):
    """Check a whole beam schedule with the engine and show, summarise and download it."""

    running = param.Boolean(default=False, doc="a schedule is being checked")
    schedule = param.ClassSelector(class_=Schedule, default=None, allow_None=True,
                                   doc="the last checked schedule")

    def __init__(self, chunk: int = CHUNK, **params) -> None:
        super().__init__(**params)
        self.chunk = chunk
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
            height=TABLE_HEIGHT, sizing_mode="stretch_width", name="schedule_table")
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
            self.table_slot, self.notes,
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
        view = cls(**params)
        page.add_view(title, view)
        tabs = getattr(page, "views", None)
        if tabs is not None:
            view.follow(tabs)
        return view

    def _place_table(self) -> None:
        if not self.table_slot.objects and self.schedule is not None and self._visible():
            self.table_slot.append(pn.pane.Bokeh(self.table, sizing_mode="stretch_width"))

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
            self.source.data = table_data(schedule.rows)
            self.table.height = min(TABLE_HEIGHT, 32 + 26 * max(len(schedule.rows), 1))
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
