"""A limit or a requirement that no tension steel area reaches is a result, never an error.

Each section here once crashed the check (NaN, AssertionError, ZeroDivisionError)
while it searched for As,req (9.6.1.3) or the strain limits by scaling the tension
layers toward an infinite area. Now the limit is null (None) with a warning that
says why, and As,req is found within the section's own area or is None.
"""

from __future__ import annotations

import json

import pytest
from scipy.optimize import brentq

import engine
from test_solver_scipy import Shape, nominal_moment, solve_c

ES = 29_000_000.0  # psi, ACI 318-19 20.2.2.2

REPRODUCTIONS = {
    # tension layer near the top: the tension layers push at every strain limit
    "layer-near-top": ["--units", "us", "--fc", "4000", "--fy", "40000", "--b", "36", "--d", "36",
                       "--as", "0.27", "--layer", "0.6@5.8", "--mu", "20"],
    # compression steel below the neutral axis pulls: no area is tension-controlled
    "pulling-compression-steel": ["--units", "us", "--fc", "3000", "--fy", "60000", "--b", "10",
                                  "--d", "18", "--as", "0.16", "--asc", "5.2", "--dc", "10.4",
                                  "--mu", "20"],
    "pulling-compression-steel-2": ["--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12",
                                    "--as", "3", "--d", "20", "--asc", "6", "--dc", "12",
                                    "--mu", "100"],
}


@pytest.mark.parametrize("args", REPRODUCTIONS.values(), ids=REPRODUCTIONS.keys())
def test_the_reproductions_compute(run_cli, args):
    for form in ([], ["--json"]):
        done = run_cli("check", *args, *form)
        assert done.returncode == 0, done.stderr
        assert "Traceback" not in done.stderr
    out = json.loads(done.stdout)
    assert out["As_tc"] is None and out["rho_tc"] is None
    assert any(w.startswith("As,tc is not given: ") for w in out["warnings"])


def test_tension_layers_that_push_leave_every_strain_limit_unreachable():
    # Hand computation at εt = 0.004 (9.3.3.1): c = 0.003·36/0.007 = 15.43 in, a = 0.85c = 13.11 in.
    # Layer 0.6 in² at 5.8 in: ε = 0.003·(15.43 − 5.8)/15.43 = 0.00187 in compression,
    # Es·ε = 54.2 ksi > fy, so 40 ksi less 0.85·4 ksi displaced: 0.6·36.6 = 21.96 kip pushing.
    # Layer 0.27 in² at 36 in yields in tension: 0.27·40 = 10.8 kip pulling. Scaled together
    # they push (11.16 kip net), so no area pulls εt down to 0.004; the other limits (εt larger:
    # c smaller, the top layer still yields in compression) alike.
    c = 0.003 * 36 / 0.007
    top = min(ES * 0.003 * (c - 5.8) / c, 40_000) - 0.85 * 4000
    assert 0.6 * top - 0.27 * 40_000 > 0
    result = engine.check(units="us", fc=4000, fy=40000, b=36, d=36, As=0.27, layers=[(0.6, 5.8)],
                          Mu=20)
    limits = result.to_dict()
    assert limits["As_tc"] is None and limits["As_max"] is None and limits["As_b"] is None
    assert sum("too far above dt" in w for w in result.warnings) == 3


def test_as_required_with_pushing_tension_layers_against_brentq():
    # As,req for Mu = 20 kip·ft with both tension layers scaled together, from the independent
    # strain-compatibility model of test_solver_scipy (brentq on c, then on the scale); εt there
    # is far above 0.005, so φ = 0.90 (Table 21.2.2). h = 100 in lies below any block reached.
    def phi_mn(scale):
        shape = Shape("us", 4000, 40000, 36, 100, ((0.27 * scale, 36.0), (0.6 * scale, 5.8)))
        return 0.9 * nominal_moment(shape, solve_c(shape))

    scale = brentq(lambda s: phi_mn(s) - 20, 1e-3, 1.0, xtol=1e-14)
    result = engine.check(units="us", fc=4000, fy=40000, b=36, d=36, As=0.27, layers=[(0.6, 5.8)],
                          Mu=20)
    assert result.As_req == pytest.approx(0.87 * scale, rel=1e-9)
    # 9.6.1.3: As = 0.87 in² ≥ 4/3 As,req, though below As,min = 200/40000·36·15.17 = 2.73 in².
    assert result.checks[0].clause == "9.6.1.3" and result.checks[0].passed


def test_as_tc_is_null_where_compression_steel_below_the_axis_pulls():
    # SI section of issue 10. Hand computation at the tension-controlled limit (Table 21.2.2):
    # εty = 678.5/200000 = 0.0033925, εt = 0.0063925, c = 0.003·1071.082/0.0093925 = 342.1 mm;
    # β1 = 0.85 (f'c < 28 MPa), a = 290.8 mm, block 0.85·20.58·763.74·290.8 = 3.885e6 N.
    # A's at 456.112 mm lies below c: ε = 0.003·(456.112 − 342.1)/342.1 = 0.001000 in tension,
    # 200 MPa·23557.4 = 4.71e6 N pulling: more than the block, so even no tension steel leaves
    # εt below the limit and no positive area is tension-controlled.
    eps_t = 678.5 / 200_000 + 0.003
    c = 0.003 * 1071.082 / (0.003 + eps_t)
    block = 0.85 * 20.58 * 763.74 * 0.85 * c
    pull = 23557.4 * min(200_000 * 0.003 * (456.112 - c) / c, 678.5)
    assert pull > block
    result = engine.check(units="si", fc=20.58, fy=678.5, b=763.74, As=24590.2, d=1071.082,
                          asc=23557.4, dc=456.112)
    out = result.to_dict()
    assert out["As_tc"] is None and out["rho_tc"] is None
    assert any(w.startswith("As,tc is not given: the steel given as compression steel lies below")
               for w in result.warnings)


def test_no_area_for_mu_says_why_the_waiver_cannot_apply():
    # B-204 shape with As = 0.5 in² < As,min = 200·14·21.5/60000 = 1.003 in² (9.6.1.2(b)) and
    # Mu = 600 kip·ft, beyond the 443 kip·ft peak within 9.3.3.1 (test_required_steel's hand
    # computation): there is no As,req, so 9.6.1.3 cannot waive As,min, and the check says so.
    result = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=0.5, Mu=600)
    assert result.As_req is None
    minimum = result.checks[0]
    assert minimum.clause == "9.6.1.2" and not minimum.passed
    assert "no tension steel area" in minimum.detail and "εt ≥ 0.004" in minimum.detail
