"""`python -m engine check` with flanges, compression steel and layers, run as a user would.

Issue 5 item 4: --h, --bf --hf, --asc --dc and a repeatable --layer AREA@DEPTH
(then --as/--d may be left out); --b is the web width. The JSON adds `layers`
and As_b, As_tc, As_max, and rho_b, rho_tc, rho_max are those areas over bw·d
with d the tension centroid. The rectangle's issue-2 contract is unchanged.
"""

from __future__ import annotations

import json
import math

import pytest

import engine
from reference_cases import EPS_CU, ES_US

NILSON_T = ["--units", "us", "--fc", "3000", "--fy", "60000", "--b", "10", "--h", "30",
            "--bf", "28", "--hf", "6"]
LAYER_KEYS = {"area", "depth", "strain", "stress", "yields"}
ISSUE_2_KEYS = {"beta1", "eps_ty", "a", "c", "eps_t", "fs", "steel_yields", "phi", "Mn", "phiMn",
                "rho", "As_min", "rho_min", "rho_tc", "rho_max", "rho_b", "section_class",
                "warnings"}


def strict_json(text: str):
    """RFC 8259 JSON: NaN and Infinity are not JSON, so they fail the parse."""

    def reject(constant):
        raise ValueError(f"not JSON: {constant}")

    return json.loads(text, parse_constant=reject)


def _ok(done) -> dict:
    assert done.returncode == 0, done.stderr
    return strict_json(done.stdout)


def test_t_beam_given_as_two_layers(run_cli):
    # Nilson, Darwin & Dolan, 13th ed., Example 3.8 (from memory; see test_flanged.py): six No. 10
    # in two rows, here 3.795 in² at 27.5 in and 3.795 in² at 24.5 in (centroid d = 26 in).
    # Both rows yield (the upper: 0.003(24.5 − 8.30)/8.30 = 0.00585 > 0.00207), so c and Mn are
    # the book's: a = 7.06 in, c = 8.30 in, Mn = 10,379 in-kips.
    out = _ok(run_cli("check", *NILSON_T, "--layer", "3.795@27.5", "--layer", "3.795@24.5", "--json"))
    assert out["a"] == pytest.approx(7.06, rel=1e-3)
    assert out["c"] == pytest.approx(8.30, rel=1e-3)
    assert out["Mn"] * 12 == pytest.approx(10379, rel=1e-4)
    assert out["d"] == pytest.approx(26.0, rel=1e-12) and out["dt"] == 27.5
    assert (out["b"], out["h"], out["bf"], out["hf"]) == (10, 30, 28, 6)
    assert len(out["layers"]) == 2
    for layer in out["layers"]:
        assert LAYER_KEYS <= layer.keys()
        strain = EPS_CU * (layer["depth"] - out["c"]) / out["c"]  # 22.2.1.2, tension positive
        assert layer["strain"] == pytest.approx(strain, rel=1e-12)
        assert layer["stress"] == pytest.approx(min(60000, ES_US * strain), rel=1e-12)  # 20.2.2.1
        assert layer["yields"] is True
    assert out["eps_t"] == pytest.approx(EPS_CU * (27.5 - out["c"]) / out["c"], rel=1e-12)


def test_limits_are_areas_and_ratios_on_the_web(run_cli):
    # rho_* = As_* / (bw·d), bw the web width (--b), d the tension centroid (issue 5 item 4):
    # here d = (2·22 + 1·19)/3 = 21 in, bw·d = 10·21 = 210 in².
    out = _ok(run_cli("check", *NILSON_T, "--layer", "2@22", "--layer", "1@19", "--asc", "0.6",
                      "--dc", "2.5", "--json"))
    bd = 10 * 21.0
    for area, ratio in (("As_b", "rho_b"), ("As_tc", "rho_tc"), ("As_max", "rho_max")):
        assert out[area] > 0 and math.isfinite(out[area])
        assert out[ratio] == pytest.approx(out[area] / bd, rel=1e-12), ratio
    assert out["rho"] == pytest.approx(3.0 / bd, rel=1e-12)
    assert out["As_min"] == pytest.approx(out["rho_min"] * bd, rel=1e-12)
    # 9.6.1.2 on the web: max(3√3000, 200)·10·21/60000 = 200·210/60000 = 0.70 in² (by hand).
    assert out["As_min"] == pytest.approx(0.70, rel=1e-12)
    assert out["As_b"] > out["As_tc"] and out["As_b"] > out["As_max"] > out["As_tc"]
    assert [layer["role"] for layer in out["layers"]] == ["tension", "tension", "compression"]


def test_doubly_reinforced_from_the_command_line(run_cli):
    # Nilson, Darwin & Dolan, 13th ed., Example 3.5 (from memory; see test_doubly_reinforced.py):
    # with the displaced concrete, a = 7.6176 in, c = 9.5221 in, f's = fy, Mn = 773.55 kip-ft.
    out = _ok(run_cli("check", "--units", "us", "--fc", "5000", "--fy", "60000", "--b", "12",
                      "--d", "24", "--as", "7.59", "--asc", "1.20", "--dc", "2.5", "--json"))
    assert out["a"] == pytest.approx(7.6176, rel=1e-4)
    assert out["c"] == pytest.approx(9.5221, rel=1e-4)
    assert out["Mn"] == pytest.approx(773.55, rel=1e-4)
    top = out["layers"][-1]
    assert top["depth"] == 2.5 and top["area"] == 1.20
    assert top["stress"] == pytest.approx(-60000, rel=1e-12) and top["yields"] is True


def test_as_at_d_with_extra_layers(run_cli):
    # --as/--d is one tension layer among the --layer ones: same JSON as giving all as layers.
    base = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12"]
    mixed = _ok(run_cli("check", *base, "--d", "20", "--as", "1", "--layer", "2@22", "--json"))
    layers = _ok(run_cli("check", *base, "--layer", "1@20", "--layer", "2@22", "--json"))
    for key in ("a", "c", "eps_t", "Mn", "phiMn", "rho", "As", "d", "dt", "As_b", "As_tc", "As_max"):
        assert mixed[key] == pytest.approx(layers[key], rel=1e-12), key
    assert mixed["As"] == pytest.approx(3.0, rel=1e-12)
    assert mixed["d"] == pytest.approx(64 / 3, rel=1e-12)


def test_cli_matches_the_api(run_cli):
    out = _ok(run_cli("check", *NILSON_T, "--layer", "2@22", "--layer", "1@19", "--asc", "0.6",
                      "--dc", "2.5", "--mu", "300", "--json"))
    api = engine.check(units="us", fc=3000, fy=60000, b=10, h=30, bf=28, hf=6, asc=0.6, dc=2.5,
                       layers=[(2, 22), (1, 19)], Mu=300).to_dict()
    assert out.keys() == api.keys()
    for key, value in api.items():
        if isinstance(value, float):
            assert out[key] == pytest.approx(value, rel=1e-12), key
        elif key != "layers":
            assert out[key] == value, key
    for got, want in zip(out["layers"], api["layers"], strict=True):
        assert got.keys() == want.keys()
        for key in want:
            assert got[key] == (pytest.approx(want[key], rel=1e-12)
                                if isinstance(want[key], float) else want[key]), key


def test_rectangle_contract_is_unchanged(run_cli):
    # Issue 2's rectangle (b = 12, d = 20 in, As = 3.00 in², f'c = 4000, fy = 60 ksi), by hand:
    # a = 180/40.8 = 4.4118 in, c = 5.1903 in, εt = 0.003(20 − 5.1903)/5.1903 = 0.008560,
    # Mn = 180(20 − 2.2059) = 3202.9 in-kips = 266.91 kip-ft, φ = 0.90 (Table 21.2.2),
    # ρ = 3/240 = 0.0125, As,min = 200·240/60000 = 0.80 in² (9.6.1.2(b) governs).
    section = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "20", "--as", "3"]
    out = _ok(run_cli("check", *section, "--json"))
    assert ISSUE_2_KEYS <= out.keys()
    assert out["a"] == pytest.approx(180 / 40.8, rel=1e-12)
    assert out["c"] == pytest.approx(180 / 40.8 / 0.85, rel=1e-12)
    assert out["fs"] == pytest.approx(60000, rel=1e-12) and out["steel_yields"] is True
    assert out["Mn"] == pytest.approx(180 * (20 - 90 / 40.8) / 12, rel=1e-12)
    assert out["phi"] == pytest.approx(0.90, rel=1e-12)
    assert out["rho"] == pytest.approx(0.0125, rel=1e-12)
    assert out["As_min"] == pytest.approx(0.80, rel=1e-12)
    assert out["section_class"] == "tension-controlled"
    # The ratios keep issue 2's closed forms, e.g. ρb = 0.85 β1 (f'c/fy)·εcu/(εcu + εty)
    # (common practice): 0.85·0.85·(4/60)·0.003/(0.003 + 0.0020690) = 0.028507.
    eps_ty = 60000 / ES_US
    assert out["rho_b"] == pytest.approx(0.85 * 0.85 * 4 / 60 * 0.003 / (0.003 + eps_ty), rel=1e-12)
    assert out["rho_tc"] == pytest.approx(0.85 * 0.85 * 4 / 60 * 0.003 / (0.006 + eps_ty), rel=1e-12)
    assert out["rho_max"] == pytest.approx(0.85 * 0.85 * 4 / 60 * 0.003 / 0.007, rel=1e-12)
    assert out["h"] is None and out["bf"] is None and out["hf"] is None
    assert len(out["layers"]) == 1 and LAYER_KEYS <= out["layers"][0].keys()
    # A single --layer is the same rectangle.
    layer = _ok(run_cli("check", *section[:8], "--layer", "3@20", "--json"))
    for key in ISSUE_2_KEYS - {"warnings"}:
        assert layer[key] == (pytest.approx(out[key], rel=1e-12) if isinstance(out[key], float)
                              else out[key]), key


def test_summary_lists_layers_and_flange(run_cli):
    done = run_cli("check", *NILSON_T, "--layer", "3.795@27.5", "--layer", "3.795@24.5",
                   "--asc", "0.6", "--dc", "2.5")
    assert done.returncode == 0, done.stderr
    text = done.stdout
    assert "bf = 28" in text and "hf = 6" in text
    assert text.count(" layer ") >= 3  # two tension layers and the compression layer
    assert " ".join(engine.CAUTION.split()) in " ".join(text.split())


def test_curve_for_a_t_beam_marks_the_limits(run_cli):
    # The capacity curve for any section (issue 5 item 2): its marks are the check's ratios on bw·d.
    args = [*NILSON_T, "--layer", "3.795@27.5", "--layer", "3.795@24.5"]
    check = _ok(run_cli("check", *args, "--json"))
    curve = _ok(run_cli("curve", *args, "--points", "40", "--json"))
    for name in ("rho_min", "rho_tc", "rho_max", "rho_b", "rho"):
        assert curve["marks"][name] == pytest.approx(check[name], rel=1e-12), name
        assert curve["marks"][name] in curve["rho"]


BASE = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12", "--d", "20", "--as", "3"]


@pytest.mark.parametrize("args, field", [
    pytest.param([*BASE, "--bf", "10", "--hf", "4"], "bf", id="bf-narrower-than-web"),
    pytest.param([*BASE, "--bf", "40", "--hf", "20"], "hf", id="hf-at-dt"),
    pytest.param([*BASE, "--bf", "40", "--hf", "25"], "hf", id="hf-below-dt"),
    pytest.param([*BASE, "--bf", "40"], "hf", id="bf-without-hf"),
    pytest.param([*BASE, "--asc", "0.6"], "dc", id="asc-without-dc"),
    pytest.param([*BASE, "--dc", "2.5"], "asc", id="dc-without-asc"),
    pytest.param([*BASE, "--asc", "0.6", "--dc", "21"], "dc", id="dc-below-the-tension-steel"),
    pytest.param([*BASE, "--layer", "3x"], "layer", id="layer-without-at"),
    pytest.param([*BASE, "--layer", "2@x"], "layer", id="layer-depth-not-a-number"),
    pytest.param([*BASE, "--layer=-2@22"], "layer", id="layer-area-negative"),
    pytest.param([*BASE, "--h", "18"], "h", id="h-above-the-steel"),
    pytest.param([*BASE, "--asc", "abc", "--dc", "2.5"], "asc", id="asc-not-a-number"),
    pytest.param(BASE[:8], "As", id="no-tension-steel"),
    pytest.param([*BASE[:8], "--d", "20"], "As", id="d-without-as"),
])
def test_bad_section_input_exit_2_one_line(run_cli, args, field):
    done = run_cli("check", *args, "--json")
    assert done.returncode == 2
    assert done.stdout == ""
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1, done.stderr
    assert lines[0].startswith(f"python -m engine check: {field}"), lines[0]  # names the field
    assert "Traceback" not in done.stderr


def test_negative_layer_after_a_space_is_still_one_line(run_cli):
    # argparse reads "-2@22" after a space as an unknown option, not as the value of --layer;
    # the refusal must still be one line naming --layer (the "=" form is tested above).
    done = run_cli("check", *BASE, "--layer", "-2@22", "--json")
    assert done.returncode == 2 and done.stdout == ""
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1 and "--layer" in lines[0], done.stderr
    assert "Traceback" not in done.stderr
