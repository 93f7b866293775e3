"""`check --special-frame` (issue 12 item 3): the frame checks in the text and under `special_frame`.

Harbourline Depot's B-301 (tests/test_special_frame.py): 14 in × 21.5 in, bottom 2.37 in²,
top 3.16 in² at 21.5 in from the bottom face. Mn± and Mpr± by hand there; here the CLI must
print what the engine's API gives, and leave `check` unchanged without the flag.
"""

from __future__ import annotations

import json

import pytest

from engine import special_frame_check
from engine.cli import main

B301 = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "14", "--d", "21.5",
        "--as", "2.37"]
TOP = ["--top-as", "3.16", "--top-d", "21.5"]


def _json(capsys, *args) -> dict:
    assert main(["check", *args, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_json_carries_the_special_frame_object(capsys):
    out = _json(capsys, *B301, "--special-frame", *TOP)
    frame = out["special_frame"]
    assert {"checks", "not_checked", "Mpr_pos", "Mpr_neg", "Mn_pos", "Mn_neg", "warnings",
            "out_of_scope", "ok", "strength_basis"} <= frame.keys()
    api = special_frame_check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=2.37,
                              top_As=3.16, top_d=21.5).to_dict()
    assert frame == json.loads(json.dumps(api, ensure_ascii=False))
    # Hand values (tests/test_special_frame.py): Mpr+ = 290.81, Mpr− = 375.46 kip·ft.
    assert frame["Mpr_pos"] == pytest.approx(290.81, abs=0.01)
    assert frame["Mpr_neg"] == pytest.approx(375.46, abs=0.01)
    assert all({"clause", "passed", "detail"} <= c.keys() for c in frame["checks"])
    assert [c["clause"] for c in frame["checks"]] == ["18.6.3.1"] * 4 + ["18.6.3.2", "9.3.3.1"]


def test_without_the_flag_check_is_unchanged(capsys):
    plain = _json(capsys, *B301)
    framed = _json(capsys, *B301, "--special-frame")
    assert "special_frame" not in plain
    framed.pop("special_frame")
    assert framed == plain
    assert main(["check", *B301]) == 0
    text = capsys.readouterr().out
    assert "Special moment frame" not in text and "18.6" not in text


def test_without_top_steel_the_json_says_not_checked(capsys):
    frame = _json(capsys, *B301, "--special-frame")["special_frame"]
    assert frame["Mpr_neg"] is None and frame["Mn_neg"] is None and frame["ok"] is False
    assert {n["clause"] for n in frame["not_checked"]} == {"18.6.3.1", "18.6.3.2", "9.3.3.1"}


def test_text_lists_checks_not_checked_and_scope(capsys):
    assert main(["check", *B301, "--special-frame"]) == 0
    text = capsys.readouterr().out
    assert "[NOT CHECKED] 18.6.3.2" in text and "top: not given (--top-as, --top-d)" in text
    assert "[PASS] 18.6.3.1 bottom ρ ≤ 0.025" in text
    assert "out of scope:" in text and "joint shear" in text
    assert text.index("Special moment frame") < text.index("Rhoscope is a design aid")
    assert main(["check", *B301, "--special-frame", *TOP]) == 0
    text = capsys.readouterr().out
    assert "[PASS] 18.6.3.2" in text and "Mpr− = 375.5 kip·ft" in text


@pytest.mark.parametrize("args, message", [
    pytest.param(TOP, "top_As: '3.16' is not accepted; expected --special-frame", id="no-flag"),
    pytest.param(["--special-frame", "--top-as", "3.16"], "top_d: missing", id="no-depth"),
    pytest.param(["--special-frame", "--top-as", "x", "--top-d", "21.5"], "top_As: 'x'",
                 id="not-a-number"),
    pytest.param(["--special-frame", "--top-as", "3.16", "--top-d", "30", "--h", "24"],
                 "top_d: 30.0 is not accepted; expected at most h = 24 in", id="below-h"),
])
def test_bad_top_steel_exits_2_naming_the_field(capsys, args, message):
    assert main(["check", *B301, *args]) == 2
    captured = capsys.readouterr()
    assert captured.out == "" and message in captured.err
    assert len(captured.err.strip().splitlines()) == 1


def test_run_as_a_user_would(run_cli):
    done = run_cli("check", *B301, "--special-frame", *TOP, "--json")
    assert done.returncode == 0, done.stderr
    assert json.loads(done.stdout)["special_frame"]["ok"] is True
