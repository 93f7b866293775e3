"""The schedule's Mcr and μφ columns (issue 12.6): filled for a row with h, blank without.

Mcr by hand, ACI 318-19 24.2.3.5 and 19.2.3.1 (normalweight, λ = 1):
fr = 7.5 √4000 = 474.34 psi; Ig = 14 × 24³ / 12 = 16,128 in⁴; yt = 12 in;
Mcr = 474.34 × 16,128 / 12 = 637,510 lb·in = 53.13 kip·ft.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.documents.schedule import run_schedule, schedule_csv

SCHEDULE = ("mark,units,fc,fy,b,d,As,Mu,h\n"
            "B-204,us,4000,60000,14,21.5,3.16,190,24\n"  # Harbourline Depot, with h
            "B-205,us,4000,60000,14,21.5,3.16,190,\n")  # the same beam, no h


def test_mcr_and_ductility_for_a_row_with_h_and_blank_without():
    schedule = run_schedule(SCHEDULE)
    with_h, without_h = schedule.rows
    expected_mcr = 7.5 * math.sqrt(4000) * (14 * 24 ** 3 / 12) / 12 / 12000
    assert with_h.Mcr == pytest.approx(expected_mcr, rel=1e-9)
    assert with_h.Mcr == pytest.approx(53.13, abs=0.005)
    # μφ is the engine's moment–curvature result, itself checked against an independent
    # fibre integration in tests/test_moment_curvature.py.
    curve = engine.moment_curvature(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, h=24)
    assert with_h.ductility == pytest.approx(curve.ductility, rel=1e-12)
    assert without_h.Mcr is None and without_h.ductility is None
    header, first, second = schedule_csv(schedule).splitlines()[:3]
    assert "Mcr,ductility" in header
    assert second.split(",")[header.split(",").index("Mcr")] == ""


def test_a_row_can_ask_for_the_special_moment_frame_checks():
    # Harbourline Depot B-204 with 4.00 in² of top steel at 21.5 in from the bottom.
    text = ("mark,units,fc,fy,b,d,As,Mu,frame,top_As,top_d\n"
            "B-204,us,4000,60000,14,21.5,3.16,190,yes,4,21.5\n"
            "B-206,us,4000,60000,14,21.5,3.16,190,yes,,\n"  # no top steel: cannot pass
            "B-207,us,4000,60000,14,21.5,3.16,190,,,\n")  # not asked
    with_top, without_top, not_asked = run_schedule(text).rows
    expected = engine.special_frame_check(units="us", fc=4000, fy=60000, b=14, d=21.5,
                                          As=3.16, top_As=4.0, top_d=21.5)
    assert with_top.frame_ok is expected.ok
    assert without_top.frame_ok is False and "frame: not checked" in without_top.message
    assert not_asked.frame_ok is None and "frame:" not in not_asked.message


def test_a_bad_frame_cell_names_its_column():
    text = ("mark,units,fc,fy,b,d,As,Mu,frame,top_As,top_d\n"
            "B-204,us,4000,60000,14,21.5,3.16,190,maybe,4,21.5\n"
            "B-205,us,4000,60000,14,21.5,3.16,190,yes,4 in,21.5\n")
    first, second = run_schedule(text).rows
    assert "column frame = 'maybe'" in first.message and not first.computed
    assert "top_As" in second.message and not second.computed
