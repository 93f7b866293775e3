"""The schedule view without a browser: text in, the engine's rows, summary and CSV out.

References: `engine.documents.schedule.run_schedule` / `schedule_csv` for the same text
(the view must show exactly what the engine computed), and the demo file's
documented outcome (tests/data/README.md: B-104, B-201 and B-202 fail).
"""

from __future__ import annotations

import asyncio
import math
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import pytest

from bokeh.core.properties import field

from engine.documents.schedule import run_schedule, schedule_csv
from webapp.page import BeamCheckPage
from webapp.schedule_view import (MAX_MESSAGE_LINES, MESSAGE_CHARS_PER_LINE, ROW_LINE_PX,
                                  ScheduleView, row_height, shown, table_data)

DATA = Path(__file__).parent / "data"
DEMO = (DATA / "harbourline_schedule.csv").read_text(encoding="utf-8")
MIXED = (DATA / "harbourline_schedule_mixed.csv").read_text(encoding="utf-8")


def run_async(make_coroutine):
    """Run a coroutine to its end in a thread of its own.

    The browser tests' Playwright session keeps an event loop running in the
    main thread for the rest of the pytest process, where `asyncio.run` refuses.
    """
    with ThreadPoolExecutor(max_workers=1) as pool:
        return pool.submit(lambda: asyncio.run(make_coroutine())).result()


def run(view: ScheduleView, text: str):
    return run_async(lambda: view.run(text))


def test_uploaded_text_becomes_the_engines_rows():
    view = ScheduleView()
    schedule = run(view, DEMO)
    reference = run_schedule(DEMO)
    assert schedule.to_dict() == reference.to_dict()
    data = view.source.data
    assert data["mark"] == [row.mark for row in reference.rows]
    # Shown rounded (4 and 3 significant figures), within half a unit of the last digit.
    for shown, full in zip(data["phiMn"], [row.phiMn for row in reference.rows]):
        assert shown == pytest.approx(full, rel=5e-4)
    for shown, full in zip(data["utilization"], [row.utilization for row in reference.rows]):
        assert shown == pytest.approx(full, rel=5e-3)
    # tests/data/README.md: three demo beams fail.
    assert {m for m, state in zip(data["mark"], data["state"]) if state == "fail"} == {
        "B-104", "B-201", "B-202"}


def test_summary_counts_and_worst_utilisation_are_shown():
    view = ScheduleView()
    run(view, DEMO)
    summary = run_schedule(DEMO).summary
    assert summary.text() in view.summary.object.replace("&#x27;", "'")
    assert f'data-failed="{summary.failed}"' in view.summary.object
    assert f"({summary.worst_mark}, row {summary.worst_row})" in view.summary.object


def test_download_is_the_engines_csv():
    view = ScheduleView()
    assert view.download.disabled  # nothing to download yet
    run(view, MIXED)
    assert not view.download.disabled
    assert view._download_file().getvalue().decode("utf-8") == schedule_csv(run_schedule(MIXED))


def test_bad_rows_fail_alone_and_are_listed_escaped():
    view = ScheduleView()
    text = "mark,units,fc,fy,b,d,As,Mu\n<b>B-1</b>,us,4000,60000,12,21.5,\"3,16\",180\n" \
           "B-2,us,4000,60000,12,21.5,3.16,180\n"
    run(view, text)
    data = view.source.data
    assert data["state"] == ["error", "pass"]
    assert math.isnan(data["phiMn"][0])
    assert "<b>" not in view.notes.object and "&lt;b&gt;B-1&lt;/b&gt;" in view.notes.object
    assert "column As = " in view.notes.object


def test_tab_separated_paste_is_read():
    rows = [line.split(",") for line in DEMO.strip().splitlines()]
    pasted = "\n".join("\t".join(cells) for cells in rows)
    view = ScheduleView()
    schedule = run(view, pasted)
    assert [r.phiMn for r in schedule.rows] == [r.phiMn for r in run_schedule(DEMO).rows]


def test_an_unreadable_schedule_is_a_message_not_a_table():
    view = ScheduleView()
    assert run(view, "mark,units,fc\nB-1,us,4000\n") is None
    assert "lacks the column" in view.status.object
    assert view.source.data["mark"] == []


def test_a_thousand_rows_are_checked_in_chunks_with_progress():
    lines = DEMO.strip().splitlines()
    text = "\n".join([lines[0]] + [lines[1 + i % (len(lines) - 1)] for i in range(1000)])
    view = ScheduleView(chunk=50)
    seen: list[int] = []
    view.progress.param.watch(lambda event: seen.append(event.new), "value")
    schedule = run(view, text)
    assert len(schedule.rows) == 1000 and len(view.source.data["mark"]) == 1000
    assert seen[:3] == [50, 100, 150] and seen[-1] == 1000  # one step a chunk
    assert not view.progress.visible and not view.running


def test_a_new_run_cancels_one_still_going():
    lines = DEMO.strip().splitlines()
    long_text = "\n".join([lines[0]] + lines[1:] * 40)
    view = ScheduleView(chunk=10)

    async def both():
        first = asyncio.ensure_future(view.run(long_text))
        await asyncio.sleep(0)
        second = await view.run(DEMO)
        return await first, second

    first, second = run_async(both)
    assert first is None and len(second.rows) == 13
    assert len(view.source.data["mark"]) == 13


def test_the_upload_widget_feeds_the_run(monkeypatch):
    view = ScheduleView()
    started: list[str] = []
    monkeypatch.setattr(view, "start", started.append)
    view.upload.value = ("\ufeff" + DEMO).encode("utf-8")
    assert started == [DEMO]  # byte-order mark dropped
    view.upload.value = "mark,units\nB-1,ü".encode("latin-1")
    assert "not UTF-8" in view.status.object and len(started) == 1


def test_table_data_of_nothing_is_empty_columns():
    assert all(values == [] for values in table_data(()).values())


def test_a_bad_upload_clears_the_last_results():
    # After a good run, a file that cannot be read must not leave the old table,
    # summary or download on screen as if they were the new file's.
    view = ScheduleView()
    run(view, DEMO)
    assert view.source.data["mark"] and view.summary.object and not view.download.disabled
    assert view.table_slot.objects
    view.upload.value = "mark,units\nB-1,ü".encode("latin-1")
    assert "not UTF-8" in view.status.object
    assert view.source.data["mark"] == [] and view.summary.object == ""
    assert view.notes.object == "" and not view.table_slot.objects
    assert view.download.disabled and view.schedule is None and view.results_csv() == ""
    run(view, MIXED)
    assert view.summary.object and view.notes.object
    assert run(view, "mark,units,fc\nB-1,us,4000\n") is None  # readable bytes, no schedule
    assert "lacks the column" in view.status.object
    assert view.summary.object == "" and view.notes.object == "" and view.schedule is None


# Issue 10 item 3: the page reads uploads and pastes with the engine's reader, so a row
# shifted by a decimal comma fails there too (the reference is the engine's own reader).
SHIFTED = ("mark,units,fc,fy,b,d,As,Mu,dt\n"
           "B-7,us,4000,60000,14,21.5,1,58,190,\n"
           "B-8,us,4000,60000,14,21.5,1.58,190,\n")


def test_a_decimal_comma_fails_its_row_through_upload_and_paste(monkeypatch):
    view = ScheduleView()
    started: list[str] = []
    monkeypatch.setattr(view, "start", started.append)
    view.upload.value = SHIFTED.encode("utf-8")
    view.paste.value_input = SHIFTED.replace(",", "\t")  # as typed or pasted in the browser
    view._on_run(None)
    assert started == [SHIFTED, SHIFTED.replace(",", "\t")]
    for text in started:
        schedule = run(view, text)
        shifted, meant = schedule.rows
        assert not shifted.computed and "10 cells" in shifted.message
        assert meant.computed and meant.inputs["As"] == 1.58 and meant.inputs["Mu"] == 190.0
        assert view.source.data["state"] == ["error", "fail"]
        assert "10 cells" in view.notes.object
        assert view.results_csv() == schedule_csv(run_schedule(text))


def test_a_row_whose_check_raises_is_an_error_row_and_the_run_ends(monkeypatch):
    # Issue 10 item 1: the schedule tab stuck when one row's check raised.
    import engine.documents.schedule

    real_check = engine.documents.schedule.check

    def faulty(**inputs):
        if inputs["Mu"] == 300:
            raise AssertionError("unreachable")
        return real_check(**inputs)

    monkeypatch.setattr(engine.documents.schedule, "check", faulty)
    view = ScheduleView()
    schedule = run(view, DEMO)
    assert not view.running and not view.download.disabled
    assert len(view.source.data["mark"]) == 13
    assert view.source.data["state"].count("error") == 2  # B-104 and the other Mu = 300 beam
    assert "internal error in the check" in view.notes.object
    assert schedule.summary.errors == 2


def test_the_page_download_neutralises_formulas_like_the_cli():
    # Issue 10 item 4 (OWASP CSV injection rule): the page writes the engine's CSV.
    view = ScheduleView()
    run(view, "mark,units,fc,fy,b,d,As,Mu,=cmd\n"
              "=HYPERLINK(\"http://attacker.example\"),us,4000,60000,12,21.5,3.16,180,@SUM(1+1)\n")
    downloaded = view._download_file().getvalue().decode("utf-8")
    assert downloaded.splitlines()[0].endswith(",'=cmd,phiMn,section_class,eps_t,utilization,Mcr,ductility,frame_ok,ok,message")
    assert downloaded.splitlines()[1].startswith("\"'=HYPERLINK(\"\"http://attacker.example\"\")\",us,")
    assert ",'@SUM(1+1)," in downloaded


@pytest.mark.parametrize("value, digits, expected", [
    (1234.5678, 4, 1235.0),  # 4 significant figures, rounded half up by hand
    (152.2961, 4, 152.3),
    (0.0123456, 4, 0.01235),
    (0.95349, 3, 0.953),
    (1.2049, 3, 1.20),
    (None, 4, math.nan),
    (math.inf, 3, math.nan),
])
def test_numbers_are_shown_to_their_significant_figures(value, digits, expected):
    result = shown(value, digits)
    assert (math.isnan(result) and math.isnan(expected)) or result == pytest.approx(expected)


def test_table_rounds_and_names_units_and_the_csv_keeps_every_digit():
    view = ScheduleView()
    schedule = run(view, DEMO)
    columns = {column.field: column for column in view.table.columns}
    # tests/data/README.md: the demo holds US and SI rows, so each row shows its unit.
    assert columns["phiMn"].title == "φMn (see unit)" and columns["moment_unit"].visible
    assert columns["eps_t"].formatter.format == "0.00000"  # strains to 5 decimals
    for shown_value, row in zip(view.source.data["phiMn"], schedule.rows):
        assert shown_value == float(f"{row.phiMn:.4g}")
    csv_text = view.results_csv()
    full = schedule.rows[0].phiMn
    assert repr(full) in csv_text and f"{full:.4g}" != repr(full)  # the file is not rounded
    run(view, "mark,units,fc,fy,b,d,As,Mu\nB-101,us,4000,60000,12,21.5,3.16,180\n")
    columns = {column.field: column for column in view.table.columns}
    assert columns["phiMn"].title == "φMn (kip·ft)" and not columns["moment_unit"].visible
    run(view, "mark,units,fc,fy,b,d,As,Mu\nG-1,si,30,420,300,500,1500,200\n")
    assert columns["phiMn"].title == "φMn (kN·m)"


def test_failing_rows_are_marked_in_words_and_shaded():
    view = ScheduleView()
    run(view, DEMO)
    data = view.source.data
    for mark, verdict, shade in zip(data["mark"], data["ok"], data["shade"]):
        failing = mark in ("B-104", "B-201", "B-202")  # tests/data/README.md
        assert ("✘" in verdict and "fails" in verdict) == failing, mark
        assert (shade != "#ffffff") == failing, mark
    # Every cell takes its row's shade, so a failing row is coloured across.
    for column in view.table.columns:
        assert column.formatter.background_color == field("shade")


def test_the_message_column_wraps_instead_of_clipping():
    view = ScheduleView()
    run(view, DEMO)
    assert "white-space: normal" in view.table.stylesheets[0]
    longest = max(len(m) for m in view.source.data["message"])
    lines = -(-longest // MESSAGE_CHARS_PER_LINE)  # ceiling division
    assert view.table.row_height >= min(lines, MAX_MESSAGE_LINES) * ROW_LINE_PX
    assert row_height([]) == row_height([""]) > 0


def test_clicking_a_row_opens_that_beam_in_the_check():
    page = BeamCheckPage()
    view = page.schedule_view
    page.views.active = list(page.views._names).index("Beam schedule")
    schedule = run(view, DEMO)
    index = [row.mark for row in schedule.rows].index("B-203")
    view.source.selected.indices = [index]  # what a click on the row sends
    # tests/data/harbourline_schedule.csv, B-203: us, 5000, 60000, 14, 26.0, 6.24, 520, dt 27.5, h 30.
    inputs = page.inputs()
    assert (inputs.units, inputs.fc, inputs.fy, inputs.b, inputs.d, inputs.As, inputs.Mu) == (
        "us", 5000, 60000, 14, 26.0, 6.24, 520)
    assert (inputs.dt, inputs.h) == (27.5, 30)
    assert page.views.active == 0  # the Check tab
    assert view.source.selected.indices == []  # ready for the next click
    assert page.result.phiMn == pytest.approx(schedule.rows[index].phiMn, rel=1e-12)


def test_a_row_that_could_not_be_read_opens_nothing_and_says_so():
    page = BeamCheckPage()
    view = page.schedule_view
    run(view, "mark,units,fc,fy,b,d,As,Mu\nB-301,us,4000,60000,12,21.5,3,16,180\n")
    before = page.inputs()
    view.open_row(0)
    assert page.inputs() == before
    assert "nothing to open" in view.status.object and "B-301" in view.status.object
