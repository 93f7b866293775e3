"""`python -m engine report` and `python -m engine batch` as a user runs them.

The round trip compares `batch` (the subject) with `check --json` (the
reference) row by row; the exit statuses are issue 6's: 0 when every row was
computed, 1 when some could not be, 2 when the file cannot be read.
"""

from __future__ import annotations

import csv
import io
import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from engine.provisions.checks import CAUTION
from engine.cli import main
from engine.documents.share_link import format_number

DATA = Path(__file__).parent / "data"
DEMO = DATA / "harbourline_schedule.csv"
B101_FLAGS = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "21.5",
              "--as", "3.16", "--mu", "180"]


def test_report_writes_a_sheet_with_the_share_link(run_cli, tmp_path):
    out = tmp_path / "B-101.html"
    done = run_cli("report", *B101_FLAGS, "--out", str(out), "--project", "Harbourline Depot",
                   "--mark", "B-101", "--engineer", "R. Ortega", "--date", "2025-03-14")
    assert done.returncode == 0, done.stderr
    assert "all checks pass" in done.stdout
    sheet = out.read_text(encoding="utf-8")
    assert sheet.startswith("<!DOCTYPE html>")
    assert "Harbourline Depot" in sheet and "2025-03-14" in sheet
    # Default link base, a placeholder for where the app is hosted.
    assert "http://localhost:8000/?units=us&amp;fc=4000&amp;fy=60000&amp;b=12&amp;d=21.5" in sheet
    assert "<svg" in sheet  # segno is installed with the web extra


def test_report_json_equals_check_json(tmp_path, capsys):
    out = tmp_path / "sheet.html"
    assert main(["check", *B101_FLAGS, "--json"]) == 0
    reference = json.loads(capsys.readouterr().out)
    assert main(["report", *B101_FLAGS, "--json", "--out", str(out), "--date", "2025-03-14",
                 "--link-base", "https://rhoscope.example/app/"]) == 0
    reported = json.loads(capsys.readouterr().out)
    assert reported.pop("link").startswith("https://rhoscope.example/app/?units=us&fc=4000")
    assert reported.pop("out") == str(out)
    assert json.dumps(reported) == json.dumps(reference)
    sheet = out.read_text(encoding="utf-8")
    assert f'data-key="phiMn" data-value="{format_number(reference["phiMn"])}"' in sheet


def test_report_escapes_hostile_header_text(tmp_path, capsys):
    out = tmp_path / "sheet.html"
    assert main(["report", *B101_FLAGS, "--out", str(out), "--date", "2025-03-14",
                 "--project", "<script>alert(1)</script>", "--mark", 'B-1"><b>']) == 0
    sheet = out.read_text(encoding="utf-8")
    assert "<script>" not in sheet and '"><b>' not in sheet
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in sheet


@pytest.mark.parametrize("extra, field", [
    pytest.param(["--date", "14/03/2025"], "date", id="date-format"),
    pytest.param(["--date", "2025-02-30"], "date", id="date-impossible"),
    pytest.param(["--bf", "10", "--hf", "4"], "bf", id="flange-narrower-than-web"),
    pytest.param(["--fc", "-4000"], "fc", id="bad-fc"),
])
def test_report_refuses_bad_input_in_one_line(run_cli, tmp_path, extra, field):
    done = run_cli("report", *B101_FLAGS, "--out", str(tmp_path / "x.html"), *extra)
    assert done.returncode == 2
    assert done.stderr.count("\n") == 1 and "Traceback" not in done.stderr
    assert f"{field}:" in done.stderr
    assert not (tmp_path / "x.html").exists()


@pytest.mark.parametrize("flags", [
    pytest.param(["--bf", "48", "--hf", "4", "--h", "30", "--layer", "3.16@27.5",
                  "--layer", "2.37@24.5", "--asc", "1.2", "--dc", "2.5", "--mu", "400"],
                 id="T-doubly-two-layers"),
    pytest.param(["--d", "22", "--as", "6", "--asc", "2", "--dc", "3", "--mu", "400"],
                 id="doubly"),
])
def test_report_covers_every_section_check_takes(tmp_path, capsys, flags):
    """The same flags as `check`; the sheet's φMn and each layer's stress are check --json's."""
    base = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12"]
    assert main(["check", *base, *flags, "--json"]) == 0
    reference = json.loads(capsys.readouterr().out)
    out = tmp_path / "sheet.html"
    assert main(["report", *base, *flags, "--out", str(out), "--date", "2025-03-14"]) == 0
    capsys.readouterr()
    sheet = out.read_text(encoding="utf-8")
    assert f'data-key="phiMn" data-value="{format_number(reference["phiMn"])}"' in sheet
    for index, layer in enumerate(reference["layers"], start=1):
        assert (f'data-key="layer{index}_stress" data-value="{format_number(layer["stress"])}"'
                in sheet)
    assert "0.85 f′<sub>c</sub>" in sheet  # the force balance and displaced concrete


def test_report_into_a_missing_folder_is_a_clear_error(run_cli, tmp_path):
    done = run_cli("report", *B101_FLAGS, "--out", str(tmp_path / "no" / "x.html"))
    assert done.returncode == 2 and "out:" in done.stderr and "Traceback" not in done.stderr


def test_batch_of_the_demo_exits_0_though_beams_fail(run_cli, tmp_path):
    out = tmp_path / "results.csv"
    done = run_cli("batch", str(DEMO), "--out", str(out))
    assert done.returncode == 0, done.stderr
    # The demo has three failing beams: B-104 (9.5.1.1), B-201 (9.3.3.1), B-202 (9.6.1.2).
    assert "13 beams: 10 pass, 3 fail, 0 could not be computed" in done.stdout
    rows = list(csv.DictReader(out.open(encoding="utf-8")))
    failing = {row["mark"]: row["message"] for row in rows if row["ok"] == "false"}
    assert set(failing) == {"B-104", "B-201", "B-202"}
    assert "9.5.1.1" in failing["B-104"] and "9.3.3.1" in failing["B-201"]
    assert "9.6.1.2" in failing["B-202"]


def test_round_trip_batch_against_check_row_by_row(tmp_path, capsys):
    """A schedule written from the demo scenario, batched, then each row through `check --json`."""
    beams = list(csv.DictReader(DEMO.open(encoding="utf-8")))
    schedule = tmp_path / "written.csv"
    with schedule.open("w", encoding="utf-8", newline="") as file:
        writer = csv.DictWriter(file, fieldnames=list(beams[0]))
        writer.writeheader()
        writer.writerows(beams)
    out = tmp_path / "out.csv"
    assert main(["batch", str(schedule), "--out", str(out)]) == 0
    capsys.readouterr()
    results = list(csv.DictReader(out.open(encoding="utf-8")))
    assert [row["mark"] for row in results] == [beam["mark"] for beam in beams]
    for beam, result in zip(beams, results):
        flags = ["--units", beam["units"], "--fc", beam["fc"], "--fy", beam["fy"], "--b", beam["b"],
                 "--d", beam["d"], "--as", beam["As"], "--mu", beam["Mu"]]
        flags += [item for name in ("dt", "es", "h") if beam[name]
                  for item in (f"--{name}", beam[name])]
        if beam["spiral"] == "yes":
            flags.append("--spiral")
        assert main(["check", *flags, "--json"]) == 0
        reference = json.loads(capsys.readouterr().out)
        for key in ("phiMn", "eps_t", "utilization"):
            # Both are the shortest exact text of the same float.
            assert result[key] == format_number(reference[key]), (beam["mark"], key)
        assert result["section_class"] == reference["section_class"]
        assert result["ok"] == str(reference["ok"]).lower()


def test_batch_exits_1_when_some_rows_cannot_be_computed(run_cli, tmp_path):
    schedule = tmp_path / "mixed.csv"
    schedule.write_text("mark,units,fc,fy,b,d,As,Mu\n"
                        "B-101,us,4000,60000,12,21.5,3.16,180\n"
                        'B-102,us,4000,60000,12,21.5,"3,16",180\n'
                        "G-3,si,28,420,300,500,1500,400\n", encoding="utf-8")
    out = tmp_path / "out.csv"
    done = run_cli("batch", str(schedule), "--out", str(out))
    assert done.returncode == 1, done.stderr
    assert "row 3 (B-102): column As = '3,16'" in done.stdout
    rows = list(csv.DictReader(out.open(encoding="utf-8")))
    assert [row["ok"] for row in rows] == ["true", "", "false"]


def test_batch_json_carries_rows_and_summary(run_cli):
    done = run_cli("batch", str(DEMO), "--json")
    assert done.returncode == 0
    data = json.loads(done.stdout)
    assert data["summary"]["rows"] == 13 and data["summary"]["failed"] == 3
    assert data["rows"][0]["mark"] == "B-101" and data["rows"][0]["ok"] is True


def test_batch_without_out_prints_the_csv(run_cli):
    done = run_cli("batch", str(DEMO))
    assert done.returncode == 0
    rows = list(csv.DictReader(io.StringIO(done.stdout)))
    assert len(rows) == 13 and "phiMn" in rows[0]


@pytest.mark.parametrize("content, words", [
    pytest.param(None, ("cannot be read",), id="missing"),
    pytest.param("mark,units,fc\n".encode("utf-16"), ("UTF-8",), id="utf-16"),
    pytest.param(b"mark,units,fc,fy,b,d,As,Mu\nB-1,us,4000,60000,12,21.5,3.16,180\xb0\n",
                 ("UTF-8", "byte"), id="latin-1-byte"),
    pytest.param(b"", ("empty",), id="empty"),
    pytest.param(b"mark,units,fc,fy,b,d,As\n", ("Mu",), id="no-Mu-column"),
])
def test_batch_exits_2_with_one_line_for_an_unreadable_file(run_cli, tmp_path, content, words):
    path = tmp_path / "schedule.csv"
    if content is not None:
        path.write_bytes(content)
    done = run_cli("batch", str(path), "--out", str(tmp_path / "out.csv"))
    assert done.returncode == 2
    assert done.stderr.count("\n") == 1 and "Traceback" not in done.stderr
    assert done.stderr.startswith("python -m engine batch: ")
    for word in words:
        assert word in done.stderr
    assert not (tmp_path / "out.csv").exists()


def test_mixed_demo_schedule_reports_each_bad_row(run_cli):
    """tests/data/harbourline_schedule_mixed.csv: good, failing and malformed rows."""
    done = run_cli("batch", str(DATA / "harbourline_schedule_mixed.csv"))
    assert done.returncode == 1
    rows = {row["mark"]: row for row in csv.DictReader(io.StringIO(done.stdout))}
    assert rows["B-101"]["ok"] == "true" and rows["G-3"]["ok"] == "true"
    assert rows["B-104"]["ok"] == "false"  # φMn = 272.7 < Mu = 300 kip·ft (hand, test_schedule)
    assert rows["B-105"]["message"].startswith("row 5 (B-105): column As = '3,16'")
    assert rows["B-106"]["message"].startswith("row 6 (B-106): column Mu = ''")
    assert rows["G-7"]["message"].startswith("row 8 (G-7): column fc = '-28'")
    assert {row["level"] for row in rows.values()} == {"roof", "level 2"}  # unknown column kept


def test_report_with_a_link_too_long_for_a_qr_code_still_writes_the_sheet(run_cli, tmp_path):
    out = tmp_path / "sheet.html"
    done = run_cli("report", *B101_FLAGS, "--out", str(out), "--link-base",
                   "http://localhost:8000/" + "a" * 4000 + "/")
    assert done.returncode == 0 and "no QR code" in done.stderr
    assert "(no QR code)" in out.read_text(encoding="utf-8")


def test_batch_summary_carries_the_caution(tmp_path, capsys):
    # House rule: the caution appears on every report, a schedule's summary included.
    assert main(["batch", str(DEMO), "--out", str(tmp_path / "out.csv")]) == 0
    assert CAUTION in capsys.readouterr().out


def test_batch_to_stdout_keeps_the_csv_clean_and_cautions_on_stderr(capsys):
    assert main(["batch", str(DEMO)]) == 0
    captured = capsys.readouterr()
    assert CAUTION not in captured.out and CAUTION in captured.err
    assert captured.out.startswith("mark,")


def _raising_for_mu(mu):
    """engine.check that raises for one Mu: a stand-in for a crash inside the engine."""
    import engine.documents.schedule

    real_check = engine.documents.schedule.check

    def faulty(**inputs):
        if inputs.get("Mu") == mu:
            raise ZeroDivisionError("float division by zero")
        return real_check(**inputs)

    return faulty


def test_batch_survives_a_row_whose_check_raises(tmp_path, capsys, monkeypatch):
    # Issue 10 item 1: one row must never abort the schedule; the results file is written.
    import engine.documents.schedule

    monkeypatch.setattr(engine.documents.schedule, "check", _raising_for_mu(520.0))  # B-203 alone
    out = tmp_path / "results.csv"
    assert main(["batch", str(DEMO), "--out", str(out)]) == 1  # a row could not be computed
    printed = capsys.readouterr().out
    assert "13 beams:" in printed and "1 could not be computed" in printed
    rows = list(csv.DictReader(out.open(encoding="utf-8")))
    assert len(rows) == 13  # every beam of the demo file, the broken one included
    broken = [row for row in rows if row["Mu"] == "520"]
    assert len(broken) == 1 and broken[0]["ok"] == "" and broken[0]["phiMn"] == ""
    assert "internal error in the check: ZeroDivisionError" in broken[0]["message"]
    assert "please report" in broken[0]["message"]
    assert sum(row["phiMn"] != "" for row in rows) == 12


NON_UTF8 = b"Harbourline \xff Depot"


@pytest.mark.parametrize("flag", ["--project", "--mark", "--engineer", "--link-base"])
def test_report_refuses_text_that_is_not_utf8_and_keeps_the_old_sheet(tmp_path, capsys, flag):
    # Issue 10 item 8: bytes that are not UTF-8 reach argv as lone surrogates (PEP 383).
    out = tmp_path / "B-101.html"
    out.write_text("the sheet written yesterday", encoding="utf-8")
    argv = ["report", *B101_FLAGS, "--out", str(out), flag, os.fsdecode(NON_UTF8)]
    assert main(argv) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and f"{flag[2:]}:" in err and "0xff" in err
    assert out.read_text(encoding="utf-8") == "the sheet written yesterday"
    assert [path.name for path in tmp_path.iterdir()] == ["B-101.html"]  # no temporary file left


def test_report_with_non_utf8_bytes_as_a_user_runs_it(tmp_path):
    import engine

    out = tmp_path / "B-101.html"
    out.write_bytes(b"old")
    done = subprocess.run([sys.executable, "-m", "engine", "report", *B101_FLAGS, "--out",
                           str(out), "--engineer", b"A. Ch\xe9cker"], capture_output=True,
                          cwd=Path(engine.__file__).resolve().parent.parent, timeout=60)
    assert done.returncode == 2 and b"Traceback" not in done.stderr
    assert done.stderr.count(b"\n") == 1 and b"engineer:" in done.stderr
    assert out.read_bytes() == b"old"


@pytest.mark.parametrize("command", ["report", "batch"])
def test_a_failed_write_leaves_the_existing_file_whole(tmp_path, capsys, monkeypatch, command):
    # The write fails half way (text that cannot be encoded): the old file must survive.
    import engine.commands.batch
    import engine.commands.report

    out = tmp_path / "existing.out"
    out.write_text("the results of last week", encoding="utf-8")
    if command == "report":
        monkeypatch.setattr(engine.commands.report, "calculation_sheet",
                            lambda *args, **kwargs: "<!DOCTYPE html>\udcff")
        argv = ["report", *B101_FLAGS, "--out", str(out)]
    else:
        monkeypatch.setattr(engine.commands.batch, "schedule_csv", lambda schedule: "mark\n\udcff")
        argv = ["batch", str(DEMO), "--out", str(out)]
    assert main(argv) == 2
    assert "out:" in capsys.readouterr().err
    assert out.read_text(encoding="utf-8") == "the results of last week"
    assert [path.name for path in tmp_path.iterdir()] == ["existing.out"]


def test_an_output_file_replaces_the_old_one_with_ordinary_permissions(tmp_path, capsys):
    out = tmp_path / "results.csv"
    out.write_text("old", encoding="utf-8")
    assert main(["batch", str(DEMO), "--out", str(out)]) == 0
    assert out.read_text(encoding="utf-8").startswith("mark,")
    umask = os.umask(0)
    os.umask(umask)
    assert out.stat().st_mode & 0o777 == 0o666 & ~umask  # as open() would create it
