"""The capacity curve where a limit cannot be reached or other steel carries load at ρ = 0."""

from __future__ import annotations

import json

import engine
from engine.cli import main


def _strict(text: str):
    # RFC 8259 JSON: no NaN or Infinity.
    def refuse(constant):
        raise ValueError(f"not JSON: {constant}")
    return json.loads(text, parse_constant=refuse)


def test_unreachable_limits_are_null_in_the_curve_json(capsys):
    # dt = 3d: at εt = εty at dt, c = 0.003·30/0.00507 = 17.8 in > d = 10 in, so the steel at d
    # would be in compression and no area reaches the limit (strain profile, 22.2.1.2).
    status = main(["curve", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12",
                   "--d", "10", "--dt", "30", "--as", "1", "--points", "5", "--json"])
    assert status == 0
    marks = _strict(capsys.readouterr().out)["marks"]
    assert marks["rho_b"] is None and marks["rho_tc"] is None
    assert marks["rho_min"] > 0


def test_a_section_with_compression_steel_starts_past_zero():
    # With A's = 2 in² at 6 in (below c for small As, so in tension) the section has strength
    # without any tension steel; a row at ρ = 0 with Mn = 0 would be false.
    curve = engine.capacity_curve(units="us", fc=4000, fy=60000, b=12, d=22, As=3, asc=2, dc=6,
                                  points=50)
    assert curve.rho[0] > 0
    assert curve.Mn[0] > 0


def test_a_singly_reinforced_section_starts_at_zero():
    curve = engine.capacity_curve(units="us", fc=4000, fy=60000, b=12, d=22, As=3, points=50)
    assert curve.rho[0] == 0.0 and curve.Mn[0] == 0.0
