"""Every value is refused under its own field, and no layer is ever dropped.

A layer's area too large for the section is named as that layer ("layer 2
area"), not as As; a dt deeper than h is named as dt; a dt far below every
tension layer given computes with a warning naming both; and every tension
layer given is carried, however many.
"""

from __future__ import annotations

import json

import pytest

import engine

BASE = ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "14"]


@pytest.mark.parametrize("args, field", [
    # 14 in × 21.5 in = 301 in² of concrete: 10,000 in² is one layer's typo, not As's.
    pytest.param([*BASE, "--d", "21.5", "--as", "3", "--layer", "10000@20"], "layer 2 area",
                 id="second-layer-too-large"),
    pytest.param([*BASE, "--layer", "10000@20"], "layer 1 area", id="only-layer-too-large"),
    pytest.param([*BASE, "--d", "21.5", "--as", "10000"], "As", id="as-too-large"),
    # 160 + 160 = 320 in² > 301 in², though each fits: the total is named.
    pytest.param([*BASE, "--d", "21.5", "--as", "160", "--layer", "160@20"], "tension steel",
                 id="total-too-large"),
    pytest.param([*BASE, "--d", "21.5", "--as", "3", "--layer", "x@20"], "layer 2 area",
                 id="layer-area-not-a-number"),
    pytest.param([*BASE, "--layer", "2@20", "--layer", "1@y"], "layer 2 depth",
                 id="layer-depth-not-a-number"),
    pytest.param([*BASE, "--d", "21.5", "--as", "3", "--layer", "3"], "layer 2",
                 id="layer-without-at"),
    # h = 24 in holds the steel at 21.5 in; dt = 30 in is the value outside it.
    pytest.param([*BASE, "--d", "21.5", "--as", "3", "--dt", "30", "--h", "24"], "dt",
                 id="dt-below-h"),
])
def test_a_refused_value_is_named_by_its_own_field(run_cli, args, field):
    done = run_cli("check", *args)
    assert done.returncode == 2 and done.stdout == ""
    assert done.stderr.startswith(f"python -m engine check: {field}: "), done.stderr


def test_every_tension_layer_given_is_carried(run_cli):
    # Ten layers of 0.2 in² at 11 … 20 in: all ten reported, As = 10 × 0.2 = 2 in² and
    # d = 0.2·(11 + … + 20)/2 = 15.5 in (the centroid, common practice).
    layers = [arg for depth in range(11, 21) for arg in ("--layer", f"0.2@{depth}")]
    done = run_cli("check", *BASE, *layers, "--json")
    assert done.returncode == 0, done.stderr
    out = json.loads(done.stdout)
    assert [layer["depth"] for layer in out["layers"]] == list(range(11, 21))
    assert out["As"] == pytest.approx(2.0, rel=1e-12) and out["d"] == pytest.approx(15.5, rel=1e-12)


def test_a_dt_far_below_the_steel_is_warned_naming_both():
    # The decimal-comma row of issue 10: dt = 190 in under one layer at 21.5 in. ACI 318-19 2.2
    # defines dt at the extreme tension steel; 190 in is far past any layer of bars a lumped
    # 21.5 in layer could stand for, so the check warns (it still computes: no h to refuse by).
    result = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=1.58, dt=190, Mu=190)
    warning = next(w for w in result.warnings if w.startswith("dt = 190 in"))
    assert "21.5 in" in warning and "2.2" in warning


def test_a_dt_a_layer_or_two_below_d_is_not_warned():
    # Two layers of #9 with 1 in clear (25.2.2) lumped at d = 21.5 in put the lower bars about
    # 1.1 in deeper (common practice): dt = 22.6 in is what --dt is for.
    result = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=4, dt=22.6)
    assert not any(w.startswith("dt = ") for w in result.warnings)
