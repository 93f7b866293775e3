"""The beam schedule in Chromium: upload, table, summary, sort, download, a 1,000-row run.

References: `engine.documents.schedule.run_schedule` and `schedule_csv` for the same
file (the page must show and return what the engine computed), and the demo
file's documented outcome (tests/data/README.md: 13 beams, B-104, B-201
and B-202 fail).
"""

from __future__ import annotations

import time
from pathlib import Path

import pytest
from playwright.sync_api import expect

from engine.documents.schedule import run_schedule, schedule_csv

from app_driver import bokeh_models, open_app

pytestmark = pytest.mark.browser

DATA = Path(__file__).resolve().parents[1] / "data"
DEMO = DATA / "harbourline_schedule.csv"
MIXED = DATA / "harbourline_schedule_mixed.csv"
RUN_TIMEOUT_MS = 60_000


def open_schedule_tab(page, app_url: str) -> None:
    open_app(page, app_url)
    page.locator(".bk-tab", has_text="Beam schedule").first.click()
    expect(page.locator(".rs-schedule-upload input[type=file]")).to_be_attached()


def upload(page, path: Path) -> None:
    page.locator(".rs-schedule-upload input[type=file]").set_input_files(str(path))


def summary(page):
    return page.locator("[data-q=schedule-summary]")


def table_rows(page) -> dict[str, list]:
    sources = [m for m in bokeh_models(page, "ColumnDataSource") if m["name"] == "schedule_rows"]
    assert len(sources) == 1
    return sources[0]["data"]


def test_upload_shows_the_table_and_summary(page, app_url, screenshots):
    open_schedule_tab(page, app_url)
    upload(page, DEMO)
    reference = run_schedule(DEMO.read_text(encoding="utf-8"))
    expect(summary(page)).to_have_text(reference.summary.text(), timeout=RUN_TIMEOUT_MS)
    # tests/data/README.md: 13 beams, three of which fail.
    assert "13 beams: 10 pass, 3 fail, 0 could not be computed" in summary(page).inner_text()
    grid = page.locator(".slick-row")
    expect(grid.first).to_be_visible()
    expect(page.locator(".slick-cell", has_text="B-104").first).to_be_visible()
    data = table_rows(page)
    assert data["mark"] == [row.mark for row in reference.rows]
    # Shown to 4 significant figures (the CSV keeps every digit).
    assert data["phiMn"] == pytest.approx([row.phiMn for row in reference.rows], rel=5e-4)
    assert data["state"].count("fail") == 3
    failing = page.locator(".slick-row", has_text="B-104").first
    expect(failing).to_contain_text("✘ fails")
    page.screenshot(path=screenshots / "schedule-01-demo.png", full_page=True)
    assert page.page_errors == []


def test_clicking_a_row_opens_that_beam_in_the_check(page, app_url):
    open_schedule_tab(page, app_url)
    upload(page, DEMO)
    expect(summary(page)).to_be_visible(timeout=RUN_TIMEOUT_MS)
    page.locator(".slick-cell", has_text="B-203").first.click()
    # tests/data/harbourline_schedule.csv, B-203: b = 14, d = 26.0, As = 6.24, Mu = 520.
    page.wait_for_function("() => location.search.includes('As=6.24')", timeout=RUN_TIMEOUT_MS)
    assert "Mu=520" in page.evaluate("location.search")
    expect(page.locator(".bk-tab.bk-active", has_text="Check")).to_be_visible()
    assert page.page_errors == []


def test_sorting_a_column_reorders_the_rows(page, app_url):
    open_schedule_tab(page, app_url)
    upload(page, DEMO)
    expect(summary(page)).to_be_visible(timeout=RUN_TIMEOUT_MS)
    reference = run_schedule(DEMO.read_text(encoding="utf-8"))
    page.locator(".slick-header-column", has_text="Mu/φMn").click()
    lowest = min(reference.rows, key=lambda row: row.utilization)
    first_row = page.locator(".slick-row").first
    expect(first_row).to_contain_text(lowest.mark)


def test_download_is_the_engines_csv_of_the_file(page, app_url, tmp_path, screenshots):
    open_schedule_tab(page, app_url)
    upload(page, MIXED)
    expect(summary(page)).to_be_visible(timeout=RUN_TIMEOUT_MS)
    notes = page.locator(".rs-schedule-notes")
    expect(notes).to_contain_text("row 5 (B-105): column As = '3,16'")
    expect(notes).to_contain_text("column 'level' is not an input")  # the engine's note
    with page.expect_download() as info:
        page.locator(".rs-schedule-download").get_by_role("button").click()
    path = tmp_path / "results.csv"
    info.value.save_as(path)
    assert path.read_text(encoding="utf-8") == schedule_csv(
        run_schedule(MIXED.read_text(encoding="utf-8")))
    page.screenshot(path=screenshots / "schedule-02-mixed.png", full_page=True)


def test_pasted_tab_separated_rows_are_checked(page, app_url):
    open_schedule_tab(page, app_url)
    lines = DEMO.read_text(encoding="utf-8").strip().splitlines()[:4]
    pasted = "\n".join(line.replace(",", "\t") for line in lines)
    page.locator(".rs-schedule-paste textarea").fill(pasted)
    page.locator(".rs-schedule-run").get_by_role("button").click()
    expect(summary(page)).to_contain_text("3 beams", timeout=RUN_TIMEOUT_MS)


def test_a_thousand_rows_are_shown_and_the_page_keeps_answering(page, app_url, tmp_path,
                                                                screenshots):
    lines = DEMO.read_text(encoding="utf-8").strip().splitlines()
    text = "\n".join([lines[0]] + [lines[1 + i % (len(lines) - 1)] for i in range(1000)]) + "\n"
    path = tmp_path / "thousand.csv"
    path.write_text(text, encoding="utf-8")
    open_schedule_tab(page, app_url)
    started = time.perf_counter()
    upload(page, path)
    # The page still answers while the rows are checked: another tab opens and closes.
    page.locator(".bk-tab", has_text="Check").first.click()
    page.locator(".bk-tab", has_text="Beam schedule").first.click()
    expect(summary(page)).to_have_text(run_schedule(text).summary.text(),
                                       timeout=RUN_TIMEOUT_MS)
    expect(page.locator(".slick-row").first).to_be_visible()
    elapsed = time.perf_counter() - started
    print(f"\n1,000-row schedule: uploaded, checked and shown in {elapsed:.2f} s")
    assert len(table_rows(page)["mark"]) == 1000
    page.screenshot(path=screenshots / "schedule-03-thousand.png", full_page=True)
    assert page.page_errors == []


def test_a_bad_upload_clears_the_last_table_and_summary(page, app_url, tmp_path, screenshots):
    open_schedule_tab(page, app_url)
    upload(page, DEMO)
    expect(summary(page)).to_be_visible(timeout=RUN_TIMEOUT_MS)
    expect(page.locator(".slick-cell", has_text="B-104").first).to_be_visible()
    bad = tmp_path / "latin1.csv"
    bad.write_bytes("mark,units\nB-1,ü\n".encode("latin-1"))  # not UTF-8: cannot be read
    upload(page, bad)
    expect(page.locator(".rs-schedule-status")).to_contain_text("not UTF-8")
    expect(summary(page)).to_have_count(0)
    expect(page.locator(".slick-cell", has_text="B-104")).to_have_count(0)
    expect(page.locator(".rs-schedule-download button")).to_be_disabled()
    page.screenshot(path=screenshots / "schedule-05-bad-upload.png", full_page=True)
    assert page.page_errors == []
