"""The CLI contract of issue 2 item 4, run as a user would (subprocess, sys.executable)."""

from __future__ import annotations

import json
import math

import pytest

import engine

SECTION = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "20", "--as", "3"]
CONTRACT_KEYS = {"beta1", "eps_ty", "a", "c", "eps_t", "fs", "steel_yields", "phi", "Mn", "phiMn",
                 "rho", "As_min", "rho_min", "rho_tc", "rho_max", "rho_b", "section_class",
                 "warnings"}
CLASSES = {"tension-controlled", "transition", "compression-controlled"}


def strict_json(text: str):
    """RFC 8259 JSON: NaN and Infinity are not JSON, so they fail the parse."""

    def reject(constant):
        raise ValueError(f"not JSON: {constant}")

    return json.loads(text, parse_constant=reject)


def _same(cli: dict, api: dict, keys):
    for key in keys:
        expected = api[key]
        if isinstance(expected, float):
            assert cli[key] == pytest.approx(expected, rel=1e-12), key
        else:
            assert cli[key] == expected, key


def test_check_json_has_the_contract_keys(run_cli):
    done = run_cli("check", *SECTION, "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert CONTRACT_KEYS <= out.keys()
    assert "Mu" not in out and "utilization" not in out
    assert out["section_class"] in CLASSES
    assert isinstance(out["warnings"], list) and isinstance(out["steel_yields"], bool)
    api = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=3).to_dict()
    _same(out, api, CONTRACT_KEYS)


def test_check_json_with_mu(run_cli):
    done = run_cli("check", *SECTION, "--mu", "180", "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert CONTRACT_KEYS | {"Mu", "utilization"} <= out.keys()
    api = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=3, Mu=180).to_dict()
    _same(out, api, CONTRACT_KEYS | {"Mu", "utilization"})
    assert out["utilization"] == pytest.approx(180 / out["phiMn"], rel=1e-12)


def test_check_json_si_spiral_dt(run_cli):
    done = run_cli("check", "--units", "si", "--fc", "35", "--fy", "420", "--b", "300", "--d", "450",
                   "--dt", "480", "--as", "3500", "--spiral", "--json")
    assert done.returncode == 0, done.stderr
    api = engine.check(units="si", fc=35, fy=420, b=300, d=450, dt=480, As=3500, spiral=True).to_dict()
    _same(strict_json(done.stdout), api, CONTRACT_KEYS)


def test_out_of_scope_warning_in_json(run_cli):
    args = [*SECTION[:4], "--fy", "90000", *SECTION[6:], "--json"]
    out = strict_json(run_cli("check", *args).stdout)
    assert any("20.2.2.4" in w for w in out["warnings"])  # ACI 318-19 Table 20.2.2.4(a)


@pytest.mark.parametrize("args, field", [
    pytest.param(["--units", "us", "--fc", "abc", *SECTION[4:]], "fc", id="fc-not-a-number"),
    pytest.param(["--units", "us", "--fc", "nan", *SECTION[4:]], "fc", id="fc-nan"),
    pytest.param(["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "-12", *SECTION[8:]], "b",
                 id="b-negative"),
    pytest.param([*SECTION, "--dt", "10"], "dt", id="dt-above-d"),
    pytest.param(["--units", "metric", *SECTION[2:]], "units", id="units-unknown"),
    pytest.param([*SECTION, "--mu", "-5"], "Mu", id="mu-negative"),
    pytest.param(SECTION[:-2], "as", id="as-missing"),
])
def test_bad_input_exit_2_one_line(run_cli, args, field):
    done = run_cli("check", *args, "--json")
    assert done.returncode == 2
    assert done.stdout == ""
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1, done.stderr
    assert field.lower() in lines[0].lower()
    assert "Traceback" not in done.stderr


def test_curve_json(run_cli):
    done = run_cli("curve", *SECTION, "--points", "50", "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    api = engine.capacity_curve(units="us", fc=4000, fy=60000, b=12, d=20, As=3, points=50)
    for key in ("rho", "As", "Mn", "phiMn", "phi"):
        assert out[key] == pytest.approx(list(getattr(api, key)), rel=1e-12), key
    assert out["section_class"] == list(api.section_class)
    assert out["eps_t"][0] is None  # εt is unbounded at ρ = 0; JSON has no infinity
    assert set(out["marks"]) >= {"rho_min", "rho_tc", "rho_max", "rho_b", "rho"}
    assert len(out["rho"]) >= 50


def test_curve_bad_points(run_cli):
    done = run_cli("curve", *SECTION, "--points", "1", "--json")
    assert done.returncode == 2 and len(done.stderr.strip().splitlines()) == 1
    assert "points" in done.stderr and "Traceback" not in done.stderr


def test_readable_summary_has_caution(run_cli):
    done = run_cli("check", *SECTION, "--mu", "180")
    assert done.returncode == 0, done.stderr
    text = done.stdout
    assert " ".join(engine.CAUTION.split()) in " ".join(text.split())
    for clause in ("9.6.1.2", "9.3.3.1", "9.5.1.1"):
        assert clause in text
    with pytest.raises(json.JSONDecodeError):
        json.loads(text)


def test_json_is_strict_when_balanced_steel_is_unreachable(run_cli):
    # dt = 2d: ρb is unbounded (no steel reaches εt = εty at dt). The JSON must still be
    # RFC 8259 JSON (null or a stated value, never the non-standard Infinity/NaN tokens).
    done = run_cli("check", *SECTION, "--dt", "40", "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert all(v is None or math.isfinite(v) for v in (out["rho_b"], out["rho_max"], out["rho_tc"]))
