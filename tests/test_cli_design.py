"""The `design` subcommand of issue 4 item 5, run as a user would (subprocess)."""

from __future__ import annotations

import json

import pytest

import engine

SECTION = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--h", "24", "--mu", "180"]
OPTION_KEYS = {"bar", "count", "layers", "As", "d", "dt", "phiMn", "eps_t", "clear_spacing", "ok",
               "failed_rules"}


def strict_json(text: str):
    def reject(constant):
        raise ValueError(f"not JSON: {constant}")

    return json.loads(text, parse_constant=reject)


def test_json_has_the_contract_keys_and_matches_the_api(run_cli):
    done = run_cli("design", *SECTION, "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert {"As_req", "options"} <= out.keys()
    assert out["options"] and all(OPTION_KEYS <= option.keys() for option in out["options"])
    api = engine.design_section(units="us", fc=4000, fy=60000, b=12, h=24, Mu=180).to_dict()
    assert out["As_req"] == pytest.approx(api["As_req"], rel=1e-12)
    assert [(o["bar"], o["count"], o["ok"]) for o in out["options"]] == \
        [(o["bar"], o["count"], o["ok"]) for o in api["options"]]
    for option in out["options"]:
        assert isinstance(option["bar"], str) and option["bar"].startswith("#")
        assert all({"clause", "message"} == rule.keys() for rule in option["failed_rules"])
        assert option["ok"] == (not option["failed_rules"])


def test_every_flag_is_read(run_cli):
    done = run_cli("design", *SECTION, "--cover", "2", "--stirrup", "#4", "--agg", "1",
                   "--layers", "1", "--layer-gap", "1.25", "--exposure", "exposed",
                   "--bars", "#6,#7,#8", "--fs", "36000", "--span", "300", "--support", "both-ends",
                   "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    inputs = out["inputs"]
    assert (inputs["cover"], inputs["stirrup"], inputs["agg"], inputs["layers"], inputs["layer_gap"],
            inputs["exposure"], inputs["fs"], inputs["span"], inputs["support"]) == \
        (2.0, "#4", 1.0, 1, 1.25, "exposed", 36000.0, 300.0, "both-ends")
    assert {o["bar"] for o in out["options"]} == {"#6", "#7", "#8"}
    assert all(o["layers"] == 1 for o in out["options"])
    # dt = 24 − 2 − 0.5 − db/2 for each option.
    for o in out["options"]:
        db = engine.bar("bar", o["bar"], engine.US).db
        assert o["dt"] == pytest.approx(24 - 2 - 0.5 - db / 2)
    assert any(c["clause"] == "Table 9.3.1.1" for c in out["detailing"])


def test_si_bars_are_metric_designations(run_cli):
    done = run_cli("design", "--units", "si", "--fc", "28", "--fy", "420", "--b", "300", "--h", "600",
                   "--mu", "250", "--stirrup", "13", "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert {o["bar"] for o in out["options"]} <= {b.designation for b in engine.standard_bars(engine.SI)}
    assert out["inputs"]["stirrup"] == "13"


def test_text_output_has_a_table_and_the_caution(run_cli):
    done = run_cli("design", *SECTION)
    assert done.returncode == 0, done.stderr
    assert "φMn" in done.stdout and "3 #8" in done.stdout
    assert engine.CAUTION in done.stdout


def test_infeasible_demand_is_said_plainly(run_cli):
    done = run_cli("design", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "10",
                   "--h", "16", "--mu", "400")
    assert done.returncode == 0, done.stderr
    assert "No singly reinforced" in done.stdout and "compression reinforcement" in done.stdout


@pytest.mark.parametrize("extra, field", [
    (["--stirrup", "#9"], "stirrup"),
    (["--stirrup", "13"], "stirrup"),
    (["--layers", "3"], "layers"),
    (["--layers", "two"], "layers"),
    (["--cover", "abc"], "cover"),
    (["--agg", "-1"], "agg"),
    (["--support", "simple"], "span"),
    (["--span", "240"], "support"),
    (["--span", "240", "--support", "pinned"], "support"),
    (["--exposure", "marine"], "exposure"),
    (["--bars", "#5,#12"], "bars"),
    (["--fs", "90000"], "fs"),
], ids=lambda v: v if isinstance(v, str) else " ".join(v))
def test_bad_input_exits_2_with_one_line_naming_the_field(run_cli, extra, field):
    done = run_cli("design", *SECTION, *extra)
    assert done.returncode == 2
    assert done.stdout == ""
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1, done.stderr
    assert lines[0].startswith(f"python -m engine design: {field}: ")
    assert "Traceback" not in done.stderr


@pytest.mark.parametrize("flag, value", [("--mu", "0"), ("--h", "nan"), ("--b", "x"), ("--fc", "-4000")])
def test_bad_section_values_are_refused(run_cli, flag, value):
    args = list(SECTION)
    args[args.index(flag) + 1] = value
    done = run_cli("design", *args)
    assert done.returncode == 2
    assert "Traceback" not in done.stderr
    assert len(done.stderr.strip().splitlines()) == 1


def test_a_missing_required_flag_is_a_one_line_usage_error(run_cli):
    done = run_cli("design", "--units", "us", "--fc", "4000")
    assert done.returncode == 2
    assert len(done.stderr.strip().splitlines()) == 1 and "required" in done.stderr


def test_in_process_main_returns_2(capsys):
    from engine.cli import main
    assert main(["design", *SECTION, "--stirrup", "#7"]) == 2
    err = capsys.readouterr().err
    assert err.startswith("python -m engine design: stirrup: ")


def test_order_and_waiver_flags_are_read_and_named(run_cli):
    # 12 × 24 in, Mu 15 kip·ft: 2 #3 (0.22 in², A615) carry Mu but are below As,min of 9.6.1.2
    # (200/60000 · 12 · 21.9375 = 0.8775 in², by hand); only the 9.6.1.3 waiver lets them pass.
    base = ["design", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--h", "24",
            "--mu", "15"]
    strict = strict_json(run_cli(*base, "--json").stdout)
    assert (strict["inputs"]["order"], strict["inputs"]["waive_as_min"]) == ("practical", False)
    assert not any(o["min_steel_waived"] for o in strict["options"])
    waived = run_cli(*base, "--order", "lightest", "--waive-as-min", "--json")
    assert waived.returncode == 0, waived.stderr
    out = strict_json(waived.stdout)
    assert (out["inputs"]["order"], out["inputs"]["waive_as_min"]) == ("lightest", True)
    first = out["options"][0]
    assert (first["bar"], first["count"], first["min_steel_waived"]) == ("#3", 2, True)
    assert out["lightest"] == 0 and first["lightest"] is True
    text = run_cli(*base, "--order", "lightest", "--waive-as-min").stdout
    assert "ok by 9.6.1.3" in text and "9.6.1.3 waiver" in text


def test_text_output_marks_the_lightest_in_the_practical_order(run_cli):
    # 14 × 24 in, Mu 300 kip·ft: one layer first (3 #10), the lightest 8 #6 (6 + 2) = 3.52 in²
    # further down (see test_design.test_practical_order_puts_one_layer_first_...).
    done = run_cli("design", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "14",
                   "--h", "24", "--mu", "300")
    rows = [line for line in done.stdout.splitlines() if line.startswith("  ") and " ok" in line]
    assert rows[0].split()[:2] == ["3", "#10"]
    marked = [row for row in rows if row.endswith("<- lightest")]
    assert len(marked) == 1 and marked[0].split()[:2] == ["8", "#6"]
    assert "order: practical" in done.stdout


@pytest.mark.parametrize("extra, field", [
    (["--order", "cheapest"], "order"),
    (["--order", ""], "order"),
], ids=["order-word", "order-blank"])
def test_bad_order_exits_2_naming_it(run_cli, extra, field):
    done = run_cli("design", *SECTION, *extra)
    assert done.returncode == 2 and done.stdout == ""
    assert done.stderr.startswith(f"python -m engine design: {field}: ")
