"""`python -m engine curvature` and check's new keys, run as a user would (subprocess)."""

from __future__ import annotations

import math

import pytest

import engine
from test_cli import strict_json

# Harbourline Depot (invented): B-204, a second-floor beam.
B204 = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "21.5", "--as", "3.16"]
B204_API = dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, h=24)
KEYS = {"cracking", "first_yield", "crushing", "ductility", "Mcr", "Mn_over_Mcr",
        "redistribution_percent", "points"}


def test_json_has_the_contract_keys(run_cli):
    done = run_cli("curvature", *B204, "--h", "24", "--json")
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert KEYS <= out.keys()
    for state in ("cracking", "first_yield", "crushing"):
        assert set(out[state]) == {"curvature", "moment"}
    assert len(out["points"]) == 60
    assert all(set(point) == {"curvature", "moment", "eps_top", "eps_t"} for point in out["points"])
    assert out["caution"] == engine.CAUTION
    api = engine.moment_curvature(**B204_API).to_dict()
    for key in ("ductility", "Mcr", "Mn_over_Mcr", "redistribution_percent"):
        assert out[key] == pytest.approx(api[key], rel=1e-12), key
    assert out["crushing"]["moment"] == pytest.approx(api["crushing"]["moment"], rel=1e-12)
    # Mcr by hand, 24.2.3.5: 7.5√4000 × (12·24³/12)/12 lb·in, in kip·ft.
    assert out["Mcr"] == pytest.approx(7.5 * math.sqrt(4000) * 13_824 / 12 / 12_000, rel=1e-6)


def test_si_flanged_doubly_reinforced(run_cli):
    args = ["--units", "si", "--fc", "30", "--fy", "420", "--b", "300", "--d", "640", "--as", "2400",
            "--h", "700", "--bf", "1200", "--hf", "120", "--asc", "600", "--dc", "60",
            "--points", "45", "--json"]
    done = run_cli("curvature", *args)
    assert done.returncode == 0, done.stderr
    out = strict_json(done.stdout)
    assert out["units"] == "si" and len(out["points"]) == 45
    api = engine.moment_curvature(units="si", fc=30, fy=420, b=300, d=640, As=2400, h=700, bf=1200,
                                  hf=120, asc=600, dc=60, points=45).to_dict()
    assert out["ductility"] == pytest.approx(api["ductility"], rel=1e-12)


def test_no_first_yield_is_null(run_cli):
    # ρ = 8.5/(12·21.5) = 0.0329 = 1.15 ρb, ρb = 0.0285 by hand (0.85·0.85·4000/60000·0.003/
    # 0.005069); the model's own balanced ratio is within 5 % of ρb (test_moment_curvature.py).
    done = run_cli("curvature", *B204[:-1], "8.5", "--h", "24", "--json")
    out = strict_json(done.stdout)
    assert out["first_yield"] is None and out["ductility"] is None
    assert out["redistribution_percent"] == 0  # εt < 0.0075, 6.6.5.1


def test_plain_text_has_the_states_and_the_caution(run_cli):
    done = run_cli("curvature", *B204, "--h", "24")
    assert done.returncode == 0, done.stderr
    for word in ("cracking", "first yield", "crushing", "μφ", "Mcr", "6.6.5"):
        assert word in done.stdout
    assert done.stdout.rstrip().endswith(engine.CAUTION)


@pytest.mark.parametrize("args, field", [
    pytest.param(B204, "h", id="h-missing"),
    pytest.param([*B204, "--h", "abc"], "h", id="h-not-a-number"),
    pytest.param([*B204, "--h", "-24"], "h", id="h-negative"),
    pytest.param([*B204, "--h", "nan"], "h", id="h-nan"),
    pytest.param([*B204, "--h", "20"], "h", id="h-above-the-steel"),
    pytest.param([*B204, "--h", "24", "--points", "10"], "points", id="points-too-few"),
    pytest.param([*B204[:-2], "--as", "-1", "--h", "24"], "As", id="as-negative"),
])
def test_bad_input_exits_2_with_one_line(run_cli, args, field):
    done = run_cli("curvature", *args)
    assert done.returncode == 2
    assert done.stdout == ""
    assert done.stderr.count("\n") == 1 and "Traceback" not in done.stderr
    assert f"{field}: " in done.stderr or f"--{field}" in done.stderr


def test_points_not_a_whole_number(run_cli):
    done = run_cli("curvature", *B204, "--h", "24", "--points", "4.5")
    assert done.returncode == 2 and done.stderr.count("\n") == 1 and "--points" in done.stderr


def test_check_json_gains_mcr_ductility_and_redistribution(run_cli):
    without_h = strict_json(run_cli("check", *B204, "--json").stdout)
    assert without_h["Mcr"] is None and without_h["ductility"] is None
    # εt = 0.0087978 by hand (a = 4.6471 in, c = 5.4671 in), so 1000εt = 8.80 % (6.6.5.3).
    assert without_h["redistribution_percent"] == pytest.approx(8.7978, rel=1e-4)
    with_h = strict_json(run_cli("check", *B204, "--h", "24", "--json").stdout)
    curve = engine.moment_curvature(**B204_API)
    assert with_h["Mcr"] == pytest.approx(curve.Mcr, rel=1e-12)
    assert with_h["ductility"] == pytest.approx(curve.ductility, rel=1e-12)
