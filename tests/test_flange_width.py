"""Effective flange width, ACI 318-19 Table 6.3.2.1, each limit where it governs and at its edge.

Table 6.3.2.1 (each overhang beyond the web face):
  T (slab on both sides): the least of 8 hf, sw/2, ln/8, on each side;
  L (slab on one side): the least of 6 hf, sw/2, ln/12, on the one side.
sw is the clear distance to the next web, ln the clear span; all in one unit.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine

# (shape, bw, hf, sw, ln, expected bf), the overhang computed by hand in the id.
CASES = [
    # T, hf = 5 in: 8hf = 40 in governs over sw/2 = 50, ln/8 = 60: bf = 12 + 80 = 92 in.
    pytest.param("T", 12.0, 5.0, 100.0, 480.0, 92.0, id="T-8hf-governs"),
    # T: sw/2 = 30 governs over 8hf = 40, ln/8 = 60: bf = 12 + 60 = 72 in.
    pytest.param("T", 12.0, 5.0, 60.0, 480.0, 72.0, id="T-half-clear-spacing-governs"),
    # T: ln/8 = 240/8 = 30 governs over 8hf = 40, sw/2 = 50: bf = 12 + 60 = 72 in.
    pytest.param("T", 12.0, 5.0, 100.0, 240.0, 72.0, id="T-span-over-8-governs"),
    # T at the three-way edge: 8hf = sw/2 = ln/8 = 40: bf = 12 + 80 = 92 in.
    pytest.param("T", 12.0, 5.0, 80.0, 320.0, 92.0, id="T-all-three-equal"),
    # T, edge of 8hf and sw/2 (both 40), ln/8 = 60 larger: 92 in.
    pytest.param("T", 12.0, 5.0, 80.0, 480.0, 92.0, id="T-8hf-equals-half-spacing"),
    # L, hf = 5 in: 6hf = 30 governs over sw/2 = 50, ln/12 = 40: bf = 12 + 30 = 42 in.
    pytest.param("L", 12.0, 5.0, 100.0, 480.0, 42.0, id="L-6hf-governs"),
    # L: sw/2 = 20 governs over 6hf = 30, ln/12 = 40: bf = 32 in.
    pytest.param("L", 12.0, 5.0, 40.0, 480.0, 32.0, id="L-half-clear-spacing-governs"),
    # L: ln/12 = 240/12 = 20 governs over 6hf = 30, sw/2 = 50: bf = 32 in.
    pytest.param("L", 12.0, 5.0, 100.0, 240.0, 32.0, id="L-span-over-12-governs"),
    # L at the three-way edge: 6hf = sw/2 = ln/12 = 30: bf = 42 in.
    pytest.param("L", 12.0, 5.0, 60.0, 360.0, 42.0, id="L-all-three-equal"),
    # SI, T: hf = 120 mm, 8hf = 960 mm; sw = 1500 mm, sw/2 = 750 governs; ln = 7200, ln/8 = 900:
    # bf = 300 + 1500 = 1800 mm.
    pytest.param("T", 300.0, 120.0, 1500.0, 7200.0, 1800.0, id="T-si-half-clear-spacing"),
    # SI, L: hf = 150 mm, 6hf = 900; sw/2 = 1200; ln = 6000, ln/12 = 500 governs: bf = 800 mm.
    pytest.param("L", 300.0, 150.0, 2400.0, 6000.0, 800.0, id="L-si-span-over-12"),
]


@pytest.mark.parametrize("shape, bw, hf, sw, ln, expected", CASES)
def test_table_6_3_2_1(shape, bw, hf, sw, ln, expected):
    assert engine.effective_flange_width(shape, bw, hf, sw, ln) == pytest.approx(expected, rel=1e-12)


# Each term, nudged 1 % either side of its edge with the others, switches which one governs.
EDGES = [
    # T, edge 8hf = sw/2 = 40 (ln/8 = 60 out of play): sw 1 % smaller → sw/2 = 39.6 governs.
    pytest.param("T", dict(hf=5.0, sw=80.0 * 0.99, ln=480.0), 12 + 2 * 39.6, id="T-sw-just-governs"),
    pytest.param("T", dict(hf=5.0, sw=80.0 * 1.01, ln=480.0), 12 + 2 * 40.0, id="T-8hf-just-governs"),
    # T, edge ln/8 = 8hf = 40 (sw/2 = 50 out of play).
    pytest.param("T", dict(hf=5.0, sw=100.0, ln=320.0 * 0.99), 12 + 2 * 39.6, id="T-ln-just-governs"),
    pytest.param("T", dict(hf=5.0 * 0.99, sw=100.0, ln=320.0), 12 + 2 * 39.6, id="T-hf-just-governs"),
    # L, edge 6hf = ln/12 = 30 (sw/2 = 50 out of play).
    pytest.param("L", dict(hf=5.0, sw=100.0, ln=360.0 * 0.99), 12 + 29.7, id="L-ln-just-governs"),
    pytest.param("L", dict(hf=5.0 * 0.99, sw=100.0, ln=360.0), 12 + 29.7, id="L-hf-just-governs"),
    # L, edge sw/2 = 6hf = 30 (ln/12 = 40 out of play).
    pytest.param("L", dict(hf=5.0, sw=60.0 * 0.99, ln=480.0), 12 + 29.7, id="L-sw-just-governs"),
]


@pytest.mark.parametrize("shape, geometry, expected", EDGES)
def test_each_term_at_its_edge(shape, geometry, expected):
    bf = engine.effective_flange_width(shape, 12.0, geometry["hf"], geometry["sw"], geometry["ln"])
    assert bf == pytest.approx(expected, rel=1e-12)


@settings(max_examples=100, deadline=None)
@given(st.floats(4, 60), st.floats(2, 12), st.floats(1, 400), st.floats(60, 1200))
def test_t_is_the_l_overhang_rule_on_both_sides(bw, hf, sw, ln):
    # Table 6.3.2.1 written out here: T = bw + 2·min(8hf, sw/2, ln/8); L = bw + min(6hf, sw/2, ln/12).
    t = engine.effective_flange_width("T", bw, hf, sw, ln)
    l_beam = engine.effective_flange_width("L", bw, hf, sw, ln)
    assert t == pytest.approx(bw + 2 * min(8 * hf, sw / 2, ln / 8), rel=1e-12)
    assert l_beam == pytest.approx(bw + min(6 * hf, sw / 2, ln / 12), rel=1e-12)
    assert bw < l_beam < t


@pytest.mark.parametrize("args, field", [
    pytest.param(("X", 12, 5, 60, 480), "shape", id="shape-unknown"),
    pytest.param(("T", 0, 5, 60, 480), "b", id="web-zero"),
    pytest.param(("T", 12, -5, 60, 480), "hf", id="hf-negative"),
    pytest.param(("L", 12, 5, 0, 480), "sw", id="spacing-zero"),
    pytest.param(("L", 12, 5, 60, float("nan")), "span", id="span-nan"),
    pytest.param(("T", 12, "5", 60, 480), "hf", id="hf-not-a-number"),
])
def test_bad_slab_geometry_names_the_field(args, field):
    with pytest.raises(engine.InputError, match=rf"^{field}\b") as caught:
        engine.effective_flange_width(*args)
    assert caught.value.field == field
