"""Several steel layers: what each layer reports, equilibrium, and how layers combine.

Sections are drawn by hypothesis: rectangles and flanges, with or without a
compression layer, and one to three tension layers. Every expected value is
written here from ACI 318-19 22.2 (strain compatibility), not taken from the
engine: strains from the linear profile with εcu = 0.003 (22.2.1.2, 22.2.2.1),
stresses Es·ε capped at ±fy (20.2.2.1), the block 0.85 f'c over a = β1·c
(22.2.2.4.1), displaced concrete deducted inside the block (common practice).
"""

from __future__ import annotations

import math

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import engine
from reference_cases import EPS_CU, ES_US

PROFILE = settings(max_examples=80, deadline=None)
KIP_FT = 12_000.0  # lb·in per kip·ft


@st.composite
def sections(draw, flanged=None, compression=None, max_layers=3):
    """Keywords of engine.check for a US section, valid by construction."""
    bw = draw(st.floats(8, 30))
    h = draw(st.floats(14, 48))
    cover = draw(st.floats(1.5, 3.5))
    count = draw(st.integers(1, max_layers))
    spacing = draw(st.floats(1.0, 3.0))
    depths = [h - cover - i * spacing for i in range(count)]
    rho = draw(st.floats(0.002, 0.05))
    shares = draw(st.lists(st.floats(0.3, 1.0), min_size=count, max_size=count))
    total = rho * bw * sum(depths) / count
    kw = dict(units="us", fc=draw(st.floats(3000, 10000)), fy=draw(st.floats(40000, 100000)),
              b=bw, h=h, layers=[(total * s / sum(shares), y) for s, y in zip(shares, depths)])
    if flanged if flanged is not None else draw(st.booleans()):
        kw.update(bf=bw * (1 + draw(st.floats(0, 6))), hf=h * draw(st.floats(0.08, 0.3)))
    if compression if compression is not None else draw(st.booleans()):
        kw.update(asc=total * draw(st.floats(0.05, 0.6)), dc=draw(st.floats(1.5, 3.0)))
    return kw


def block_force(kw, a):
    """0.85 f'c over the part of the section within a of the top (flange, then web, to h)."""
    a = min(a, kw["h"])
    if "bf" not in kw or a <= kw["hf"]:
        return 0.85 * kw["fc"] * kw.get("bf", kw["b"]) * a
    return 0.85 * kw["fc"] * (kw["bf"] * kw["hf"] + kw["b"] * (a - kw["hf"]))


@PROFILE
@given(sections())
def test_horizontal_equilibrium_from_the_reported_stresses(kw):
    # ΣF = 0 (22.2.2.4.1 with 20.2.2.1): the block, each layer's reported stress (tension positive),
    # and 0.85 f'c deducted over each bar inside the block.
    r = engine.check(**kw).to_dict()
    terms = [block_force(kw, r["a"])]
    for layer in r["layers"]:
        terms.append(-layer["area"] * layer["stress"])
        if layer["depth"] < r["a"]:
            terms.append(-0.85 * kw["fc"] * layer["area"])
    assert abs(sum(terms)) <= 1e-9 * max(abs(t) for t in terms)


@PROFILE
@given(sections())
def test_each_layer_reports_its_strain_stress_and_yield(kw):
    r = engine.check(**kw).to_dict()
    c, fy = r["c"], kw["fy"]
    given_layers = [(a, y, "tension") for a, y in kw["layers"]]
    if "asc" in kw:
        given_layers.append((kw["asc"], kw["dc"], "compression"))
    assert [(x["area"], x["depth"], x["role"]) for x in r["layers"]] == given_layers
    for layer in r["layers"]:
        strain = EPS_CU * (layer["depth"] - c) / c  # 22.2.1.2, tension positive
        stress = max(-fy, min(fy, ES_US * strain))  # 20.2.2.1
        assert math.isclose(layer["strain"], strain, rel_tol=1e-12, abs_tol=1e-15)
        assert math.isclose(layer["stress"], stress, rel_tol=1e-12, abs_tol=1e-9)
        assert layer["yields"] is (abs(ES_US * strain) >= fy)
    deepest = max(y for _, y in kw["layers"])
    assert math.isclose(r["eps_t"], EPS_CU * (deepest - c) / c, rel_tol=1e-12)  # dt: the deepest
    assert r["dt"] == deepest
    tension = [x for x in r["layers"] if x["role"] == "tension"]
    assert r["steel_yields"] is all(x["yields"] and x["stress"] > 0 for x in tension)


@PROFILE
@given(sections(), st.data())
def test_moving_a_layer_deeper_never_lowers_mn_while_the_steel_yields(kw, data):
    # With every tension layer yielded, T = ΣAs·fy and c do not change; the moved layer's arm
    # grows by Δ, so Mn grows by exactly A·fy·Δ (issue 5 item 6; 22.2, hand algebra).
    index = data.draw(st.integers(0, len(kw["layers"]) - 1))
    shift = data.draw(st.floats(0.05, 4.0))
    area, depth = kw["layers"][index]
    moved = dict(kw, layers=[(a, y + shift) if i == index else (a, y)
                             for i, (a, y) in enumerate(kw["layers"])])
    moved["h"] = max(kw["h"], depth + shift + 1.0)
    before, after = engine.check(**kw), engine.check(**moved)
    assume(before.state.steel_yields and after.state.steel_yields)
    assert after.Mn >= before.Mn
    assert math.isclose(after.Mn - before.Mn, area * kw["fy"] * shift / KIP_FT,
                        rel_tol=1e-6, abs_tol=1e-9 * before.Mn)


@PROFILE
@given(sections(compression=False), st.floats(0.05, 4.0))
def test_deeper_layers_never_lower_mn_even_when_elastic(kw, shift):
    # Every tension layer deeper by the same Δ: more strain and more lever arm (22.2.1.2), so Mn
    # cannot fall whether the steel yields or not (common practice).
    moved = dict(kw, layers=[(a, y + shift) for a, y in kw["layers"]], h=kw["h"] + shift)
    assert engine.check(**moved).Mn >= engine.check(**kw).Mn * (1 - 1e-12)


@PROFILE
@given(sections(compression=False))
def test_yielded_layers_equal_one_layer_at_their_centroid(kw):
    # All yielded: T = ΣA·fy acts at the centroid d = ΣA·y/ΣA, so c and Mn equal those of one
    # lumped layer there (22.2.2.4.1); εt differs, read at each section's own dt.
    As = sum(a for a, _ in kw["layers"])
    d = sum(a * y for a, y in kw["layers"]) / As
    layered = engine.check(**kw)
    lumped = engine.check(**dict(kw, layers=[(As, d)]))
    assume(layered.state.steel_yields and lumped.state.steel_yields)
    assert math.isclose(layered.state.c, lumped.state.c, rel_tol=1e-12)
    assert math.isclose(layered.Mn, lumped.Mn, rel_tol=1e-12)
    r = layered.to_dict()
    assert math.isclose(r["d"], d, rel_tol=1e-12) and math.isclose(r["As"], As, rel_tol=1e-12)
    assert math.isclose(r["rho"], As / (kw["b"] * d), rel_tol=1e-12)  # on the web, 9.6.1.2


def test_two_layers_by_hand():
    # b = 12 in, layers 2.00 in² at 21.5 in and 1.20 in² at 19 in, f'c = 4000, fy = 60 ksi:
    # As = 3.20 in², d = (43 + 22.8)/3.2 = 20.5625 in; both yield (checked below):
    # a = 3.2·60/(0.85·4·12) = 192/40.8 = 4.7059 in, c = 5.5363 in;
    # ε at 19 in = 0.003(19 − 5.5363)/5.5363 = 0.00730 > 0.00207; εt at 21.5 in = 0.00865;
    # Mn = 192(20.5625 − 2.3529) = 3496.2 in-kips = 291.35 kip-ft (hand arithmetic).
    r = engine.check(units="us", fc=4000, fy=60000, b=12, layers=[(2.00, 21.5), (1.20, 19.0)])
    assert r.beam.d == pytest.approx(20.5625, rel=1e-12)
    assert r.state.c == pytest.approx(5.5363, rel=1e-4)
    assert r.state.eps_t == pytest.approx(0.00865, rel=1e-3)
    assert [x.yields for x in r.state.layers] == [True, True]
    assert r.Mn == pytest.approx(291.35, rel=1e-4)


def test_layers_and_as_at_d_combine():
    # --as/--d is one more tension layer: 1.00 in² at 20 in with a layer 2.00 in² at 22 in is the
    # same as the two layers given as layers (d = (20 + 44)/3 = 21.333 in).
    both = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=1.00, layers=[(2.00, 22.0)])
    layers = engine.check(units="us", fc=4000, fy=60000, b=12, layers=[(1.00, 20.0), (2.00, 22.0)])
    assert both.beam.As == pytest.approx(3.00, rel=1e-12)
    assert both.beam.d == pytest.approx(64 / 3, rel=1e-12)
    assert both.Mn == pytest.approx(layers.Mn, rel=1e-12)
    assert both.state.eps_t == pytest.approx(layers.state.eps_t, rel=1e-12)


def test_one_layer_equals_as_at_d():
    a = engine.check(units="us", fc=4000, fy=60000, b=12, d=20, As=3.00).to_dict()
    b = engine.check(units="us", fc=4000, fy=60000, b=12, layers=[(3.00, 20.0)]).to_dict()
    for key in ("a", "c", "eps_t", "fs", "Mn", "phiMn", "rho", "As_b", "As_tc", "As_max", "As_min"):
        assert b[key] == pytest.approx(a[key], rel=1e-12), key


@pytest.mark.parametrize("layers, field", [
    pytest.param([(2.0, 21.5), (-1.0, 19.0)], "layer 2 area", id="negative-area"),
    pytest.param([(2.0, 0.0)], "layer 1 depth", id="zero-depth"),
    pytest.param([(2.0,)], "layer", id="depth-missing"),
    pytest.param([(2.0, float("inf"))], "layer 1 depth", id="infinite-depth"),
])
def test_bad_layers_name_the_layer(layers, field):
    with pytest.raises(engine.InputError, match=rf"^{field}\b"):
        engine.check(units="us", fc=4000, fy=60000, b=12, layers=layers)


def test_dt_above_the_deepest_layer_is_refused():
    # εt is read at the extreme tension steel (21.2.2), so dt cannot be shallower than it.
    with pytest.raises(engine.InputError, match=r"^dt\b.*21\.5"):
        engine.check(units="us", fc=4000, fy=60000, b=12, dt=20, layers=[(2.0, 21.5), (1.2, 19.0)])


def test_strain_and_stress_are_reported_in_pairs_at_named_depths():
    # eps_t/fs_t at dt and eps_s/fs at the centroid d, each stress from its own strain by
    # 20.2.2.1 (Es·ε capped at fy); with dt at its default the dt pair is the deepest layer's.
    # Layers 0.6 in² at 21.5 in and 2.4 in² at 14 in: d = (0.6·21.5 + 2.4·14)/3 = 15.5 in.
    r = engine.check(units="us", fc=4000, fy=60000, b=12, d=21.5, As=0.6, layers=[(2.4, 14.0)])
    out = r.to_dict()
    c = out["c"]
    assert out["d"] == pytest.approx(15.5, rel=1e-12)
    assert out["eps_t"] == pytest.approx(EPS_CU * (21.5 - c) / c, rel=1e-12)
    assert out["eps_s"] == pytest.approx(EPS_CU * (15.5 - c) / c, rel=1e-12)
    assert out["fs_t"] == pytest.approx(min(60000, ES_US * out["eps_t"]), rel=1e-12)
    assert out["fs"] == pytest.approx(min(60000, ES_US * out["eps_s"]), rel=1e-12)
    deepest = max(out["layers"], key=lambda layer: layer["depth"])
    assert (deepest["strain"], deepest["stress"]) == pytest.approx((out["eps_t"], out["fs_t"]))
