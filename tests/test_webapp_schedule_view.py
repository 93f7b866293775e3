"""The schedule view without a browser: text in, the engine's rows, summary and CSV out.

References: `engine.schedule.run_schedule` / `schedule_csv` for the same text
(the view must show exactly what the engine computed), and the demo file's
documented outcome (tests/data/README.md: B-104, B-201 and B-202 fail).
"""

from __future__ import annotations

import asyncio
import math
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import pytest

from engine.schedule import run_schedule, schedule_csv
from webapp.schedule_view import ScheduleView, table_data

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
    assert data["phiMn"] == [row.phiMn for row in reference.rows]
    assert data["utilization"] == [row.utilization for row in reference.rows]
    # tests/data/README.md: three demo beams fail.
    assert {m for m, ok in zip(data["mark"], data["ok"]) if ok == "FAIL"} == {
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
    assert data["ok"] == ["error", "pass"]
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
        assert view.source.data["ok"] == ["error", "FAIL"]
        assert "10 cells" in view.notes.object
        assert view.results_csv() == schedule_csv(run_schedule(text))


def test_a_row_whose_check_raises_is_an_error_row_and_the_run_ends(monkeypatch):
    # Issue 10 item 1: the schedule tab stuck when one row's check raised.
    import engine.schedule

    real_check = engine.schedule.check

    def faulty(**inputs):
        if inputs["Mu"] == 300:
            raise AssertionError("unreachable")
        return real_check(**inputs)

    monkeypatch.setattr(engine.schedule, "check", faulty)
    view = ScheduleView()
    schedule = run(view, DEMO)
    assert not view.running and not view.download.disabled
    assert len(view.source.data["mark"]) == 13
    assert view.source.data["ok"].count("error") == 2  # B-104 and the other Mu = 300 beam
    assert "internal error in the check" in view.notes.object
    assert schedule.summary.errors == 2


def test_the_page_download_neutralises_formulas_like_the_cli():
    # Issue 10 item 4 (OWASP CSV injection rule): the page writes the engine's CSV.
    view = ScheduleView()
    run(view, "mark,units,fc,fy,b,d,As,Mu,=cmd\n"
              "=HYPERLINK(\"http://attacker.example\"),us,4000,60000,12,21.5,3.16,180,@SUM(1+1)\n")
    downloaded = view._download_file().getvalue().decode("utf-8")
    assert downloaded.splitlines()[0].endswith(",'=cmd,phiMn,section_class,eps_t,utilization,ok,message")
    assert downloaded.splitlines()[1].startswith("\"'=HYPERLINK(\"\"http://attacker.example\"\")\",us,")
    assert ",'@SUM(1+1)," in downloaded
