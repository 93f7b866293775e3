"""The least tension steel for a demand (As,req) and the 9.6.1.3 waiver built on it."""

from __future__ import annotations

import json
import math

import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

import engine
from engine.cli import main

B204 = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16)


def test_tension_controlled_demand_matches_the_textbook_quadratic():
    # Textbook closed form (common practice): Mu/φ = As·fy·(d − As·fy/(1.7 f'c b)), φ = 0.90
    # (ACI 318-19 Table 21.2.2), solved here for As by the quadratic formula.
    Mu_lb_in = 190 * 12_000
    a_coef = 60000**2 / (1.7 * 4000 * 14)
    b_coef = -60000 * 21.5
    c_coef = Mu_lb_in / 0.9
    expected = (-b_coef - math.sqrt(b_coef**2 - 4 * a_coef * c_coef)) / (2 * a_coef)
    assert engine.check(**B204, Mu=190).As_req == pytest.approx(expected, rel=1e-12)


@settings(max_examples=60, deadline=None)
@given(st.floats(min_value=1.0, max_value=440.0))  # below the 443 kip·ft peak found below
@example(1.4375)  # As/3.16·3.16 once lost an ulp of the area found
def test_the_required_area_meets_the_demand(Mu):
    # The least As must carry Mu itself (ACI 318-19 9.5.1.1), not an ulp short of it.
    As_req = engine.check(**B204, Mu=Mu).As_req
    assert As_req is not None
    assert engine.check(**{**B204, "As": As_req}, Mu=Mu).phiMn >= Mu


def test_no_area_reaches_a_demand_beyond_the_beam_limit():
    # φMn at εt = 0.004 (9.3.3.1) for B-204: c = 0.003·21.5/0.007 = 9.214 in, a = 7.832 in,
    # As = 0.85·4000·7.832·14/60000 = 6.213 in², Mn = 6.213·60·(21.5 − 3.916)/12 = 546.3 kip·ft,
    # φ = 0.65 + 0.25·(0.004 − 0.002069)/0.003 = 0.8109, φMn = 443.0 kip·ft (hand computation);
    # at the tension-controlled limit (As = 5.390 in², a = 6.794 in) φMn = 0.9·487.9 = 439.1.
    # For Grade 60 the peak within 9.3.3.1 is the 443 kip·ft at εt = 0.004, so 600 is out of reach.
    assert engine.check(**B204, Mu=600).As_req is None


def test_steel_below_the_neutral_axis_given_as_compression_steel_needs_no_more():
    # A's = 2 in² at d' = 6 in sits below c, yields in tension and alone gives about
    # 2·60·(6 − a/2)/12 ≈ 45 kip·ft > Mu = 20 kip·ft (hand estimate): no tension steel needed.
    inputs = dict(units="us", fc=4000, fy=60000, b=12, d=22, As=3, asc=2, dc=6)
    assert engine.check(**inputs, Mu=20).As_req == 0.0


def test_the_same_through_the_command_line(capsys):
    status = main(["check", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12",
                   "--d", "22", "--as", "3", "--asc", "2", "--dc", "6", "--mu", "20", "--json"])
    assert status == 0
    assert json.loads(capsys.readouterr().out)["As_req"] == 0.0


def test_zero_demand_requires_no_steel_so_9_6_1_3_waives_the_minimum():
    # ACI 318-19 9.6.1.3: As,min need not be provided where As ≥ 4/3 of the As required by
    # analysis. Mu = 0 requires no steel, and 0.5 in² ≥ 4/3 × 0; any Mu > 0 small enough waives
    # it too, so refusing it at exactly Mu = 0 would make a smaller demand fail where a larger
    # one passes.
    result = engine.check(**{**B204, "As": 0.5}, Mu=0)
    assert result.As_req == 0.0
    assert result.checks[0].clause == "9.6.1.3" and result.checks[0].passed


def test_a_third_more_than_required_waives_the_minimum():
    # ACI 318-19 9.6.1.3: As = 0.7 in² against As,min = 200·14·21.5/60000 = 1.003 in² (9.6.1.2(b)),
    # with Mu = 40 kip·ft needing about 0.42 in² (Mu/(0.9·fy·0.95d) = 480000/(0.9·60000·20.4),
    # common-practice estimate), so 4/3·As,req ≈ 0.56 in² < 0.7 in².
    minimum = engine.check(**{**B204, "As": 0.7}, Mu=40).checks[0]
    assert minimum.clause == "9.6.1.3" and minimum.passed


@pytest.mark.parametrize("Mu", [40, 60])
def test_a_smaller_demand_never_turns_the_waiver_into_a_failure(Mu):
    # b = 12 in, d = 20 in, As = 0.5 in² < As,min = 200·12·20/60000 = 0.8 in² (9.6.1.2(b)), with
    # A's = 2 in² at d' = 8 in. Hand computation with no tension steel: A's yields in tension
    # (2·60 = 120 kip), a = 120/(0.85·4·12) = 2.94 in, c = 3.46 in, ε at 8 in = 0.003·4.54/3.46
    # = 0.0039 > εty; Mn = 120·(8 − 1.47)/12 = 65.3 kip·ft, εt = 0.003·16.54/3.46 = 0.0143, so
    # φ = 0.90 and φMn = 58.8 kip·ft. Mu = 40 needs no tension steel (As,req = 0); Mu = 60 needs
    # a little. Either way As ≥ 4/3 As,req and 9.6.1.3 waives As,min.
    result = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=0.5, asc=2, dc=8, Mu=Mu)
    assert (result.As_req == 0.0) is (Mu < 58.8)
    assert result.checks[0].clause == "9.6.1.3" and result.checks[0].passed
