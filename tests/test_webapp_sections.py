"""Section shape, flange, A's and layers: widgets → engine → display, sketch, link (no browser)."""

from __future__ import annotations

import pytest

import engine
from webapp.page import BeamCheckPage
from webapp.state import parse_query

from webapp_html import displayed, number

DISPLAY_REL = 5e-4  # values are shown to 4 significant figures

# Harbourline Depot B-204 cast with the level-2 slab (invented): a T-beam with two
# #4 bars as compression steel (2 × 0.20 in², ASTM A615 Table 1).
T_LINK = ("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190&h=24&bf=48&hf=5"
          "&asc=0.4&dc=2.5&shape=T")


@pytest.fixture
def page():
    return BeamCheckPage()


def phi_mn_shown(page) -> float:
    return number(displayed(page.cards.object)["phiMn"][0])


def test_t_beam_link_is_checked_as_a_t_beam(page):
    page.apply_link(T_LINK.replace("&asc=0.4&dc=2.5", ""))
    assert page.link_messages == []
    # Hand computation (T-beam with the block inside the flange, as in McCormac & Brown,
    # Design of Reinforced Concrete, from memory): a = As fy / (0.85 f'c bf) < hf, so
    # the section acts as a 48 in wide rectangle, φ = 0.90 (ACI 318-19 Table 21.2.2).
    a = 3.16 * 60000 / (0.85 * 4000 * 48)
    assert a < 5
    assert phi_mn_shown(page) == pytest.approx(0.9 * 3.16 * 60000 * (21.5 - a / 2) / 12000,
                                               rel=DISPLAY_REL)
    page.apply_link(T_LINK)
    assert page.link_messages == []
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190,
                            h=24, bf=48, hf=5, asc=0.4, dc=2.5)
    assert phi_mn_shown(page) == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    assert page.current_inputs() == dict(units="us", fc=4000.0, fy=60000.0, b=14.0, d=21.5,
                                         As=3.16, Mu=190.0, h=24.0, bf=48.0, hf=5.0, asc=0.4,
                                         dc=2.5)


def test_shape_switch_adds_and_drops_the_flange(page):
    rect = page.result.phiMn
    page.shape_switch.value = "T"
    assert page.shape == "T" and page.bf is not None and page.hf is not None
    assert "bf=" in page._written_search and "shape=T" in page._written_search
    assert page.result.phiMn > rect  # a wider compression zone: a longer lever arm
    page.shape_switch.value = "rect"
    assert page.result.phiMn == pytest.approx(rect, rel=1e-12)
    assert "bf=" not in page._written_search


def test_flange_from_the_slab_follows_table_6_3_2_1(page):
    page.shape_switch.value = "T"
    page.flange_source.value = "slab"
    page.entries["hf"].value = "5.0"
    page.entries["sw"].value = "100.0"
    page.entries["ln"].value = "240.0"
    # ACI 318-19 Table 6.3.2.1 (T): each overhang the least of 8 hf = 40, sw/2 = 50 and
    # ln/8 = 30 in, so bf = 14 + 2 × 30 = 74 in.
    assert page.inputs().bf == pytest.approx(74.0)
    assert page.current_inputs()["bf"] == pytest.approx(74.0)
    page.shape_switch.value = "L"
    # L: one overhang, the least of 6 hf = 30, sw/2 = 50, ln/12 = 20 in: bf = 34 in.
    assert page.inputs().bf == pytest.approx(34.0)
    inputs, messages = parse_query(page.share_query())
    assert messages == () and inputs == page.inputs()


def test_compression_steel_and_a_second_layer_reach_the_engine(page):
    page.entries["asc"].value = "0.62"
    page.entries["dc"].value = "2.5"
    before = phi_mn_shown(page)
    page._add_layer()
    # A new layer starts empty and changes nothing until both values are typed.
    assert page.layers == () and len(page.layer_rows) == 3  # layer 1, the new row, its note
    area_box, depth_box = page.layer_rows[1][0], page.layer_rows[1][1]
    assert area_box.value == "" and depth_box.value == ""
    area_box.value = "1.2"
    assert page.layers == () and phi_mn_shown(page) == before
    depth_box.value = "18.5"
    assert page.layers == ((1.2, 18.5),) and len(page.layer_rows) == 2
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190,
                            asc=0.62, dc=2.5, layers=[(1.2, 18.5)])
    assert phi_mn_shown(page) == pytest.approx(expected.phiMn, rel=DISPLAY_REL)
    assert "layer=1.2@18.5" in page._written_search
    # the sketch draws both tension layers and the compression bars
    kinds = page.sketch.bars.data["kind"]
    assert "compression" in kinds and len({y for y, k in zip(page.sketch.bars.data["y"], kinds)
                                           if k == "tension"}) == 2
    page.layer_rows[1][3].clicks += 1  # remove the layer (area, depth, bars, ✕)
    assert page.layers == ()


def test_as_slider_moves_the_first_layer_only(page):
    page.apply_link("?units=us&b=14&d=21.5&As=2.37&layer=1.58@19&h=24")
    page.sliders["As"].value = 3.0
    assert page.layers == ((1.58, 19.0),) and page.As == 3.0
    expected = engine.check(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.0, Mu=190,
                            h=24, layers=[(1.58, 19.0)])
    assert phi_mn_shown(page) == pytest.approx(expected.phiMn, rel=DISPLAY_REL)


def test_plot_marks_the_limits_of_a_flanged_section(page):
    page.apply_link(T_LINK)
    marks = engine.capacity_curve(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, h=24,
                                  bf=48, hf=5, asc=0.4, dc=2.5).marks
    for key in ("rho_min", "rho_tc", "rho_max", "rho_b"):
        assert page.capacity_plot.spans[key].location == pytest.approx(marks[key], rel=1e-12)


def test_sketch_is_to_scale_and_updated_in_place(page):
    figure, outline = page.sketch.figure, page.sketch.outline
    page.apply_link(T_LINK)
    assert page.sketch.figure is figure and page.sketch.outline is outline
    assert figure.match_aspect
    xs, ys = outline.data["x"], outline.data["y"]
    assert max(xs) - min(xs) == pytest.approx(48.0) and max(ys) == pytest.approx(24.0)
    a = page.result.state.a
    block_y = page.sketch.block.data["y"]
    assert 24.0 - min(block_y) == pytest.approx(a)  # shaded to the depth a from the top
    assert page.sketch.axis.data["y"] == [pytest.approx(24.0 - page.result.state.c)]


def test_bad_flange_in_a_link_is_named_and_falls_back(page):
    page.apply_link("?units=us&shape=T&bf=10&hf=5")
    assert any(m.startswith("bf: '10'") for m in page.link_messages)
    assert page.inputs().bf >= page.b  # the default flange, not the bad one
    engine.check(**page.current_inputs())


def test_markup_in_new_keys_is_text(page):
    from urllib.parse import quote
    bad = '<img src=x onerror="alert(1)">'
    page.apply_link(f"?shape={quote(bad)}&layer={quote(bad)}&stirrup={quote(bad)}")
    html = page.link_pane.object
    assert "<img" not in html and "&lt;img" in html
    assert page.shape == "rect"


def test_sketch_caption_says_when_h_is_assumed(page):
    # Default B-204 gives no h: the sketch draws it 2.5 in below dt = d = 21.5 in
    # (the drawing allowance, common practice), and must not present 24 in as an input.
    assert page.h is None
    # The dimension labels: b under the section, h on the left, d on the right.
    assert page.sketch.dims.data["text"] == ["b = 14 in", "h not given (drawn 24 in)",
                                             "d = 21.5 in"]
    page.apply_link(T_LINK)  # h = 24 in given
    assert page.sketch.dims.data["text"][1] == "h = 24 in"
    page.apply_link("?units=si")  # SI B-204: d = 545 mm, drawn 63 mm below (common practice)
    assert page.sketch.dims.data["text"] == ["b = 350 mm", "h not given (drawn 608 mm)",
                                             "d = 545 mm"]


def _strains_by_hand(c: float, depths) -> list[float]:
    # ACI 318-19 22.2.1.2 and 22.2.2.1: linear strains, 0.003 at the top; tension positive.
    return [0.003 * (depth - c) / c for depth in depths]


def test_section_state_shows_fs_prime_and_each_layers_strain_and_stress(page):
    from scipy.optimize import brentq

    page.apply_link("?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190&h=24"
                    "&layer=1.58@19&asc=0.4&dc=2.5")
    assert page.link_messages == []
    # Equilibrium written here: 0.85 f'c b β1 c (22.2.2.4.1, β1 = 0.85 for 4000 psi,
    # Table 22.2.2.4.3) plus A's (f's − 0.85 f'c) (displaced concrete deducted, common
    # practice) against the tension layers, each stress Es ε within ±fy (20.2.2.1,
    # Es = 29,000 ksi, 20.2.2.2).
    bars = [(3.16, 21.5), (1.58, 19.0), (0.4, 2.5)]

    def stress(strain):
        return max(-60000.0, min(60000.0, 29e6 * strain))

    def net(c):
        steel = sum(area * stress(e) for (area, _), e in
                    zip(bars, _strains_by_hand(c, [d for _, d in bars])))
        return 0.85 * 4000 * 14 * 0.85 * c - 0.85 * 4000 * 0.4 - steel

    c = brentq(net, 3.0, 10.0, xtol=1e-12)
    strains = _strains_by_hand(c, [d for _, d in bars])
    shown = displayed(page.details.object)
    assert number(shown["fs_comp"][0]) == pytest.approx(stress(strains[2]), rel=DISPLAY_REL)
    assert number(shown["fs_comp"][0]) < 0  # compression negative: tension positive
    assert number(shown["eps_comp"][0]) == pytest.approx(strains[2], rel=DISPLAY_REL)
    assert "tension positive" in page.details.object
    assert "elastic" in page.details.object  # |f's| < fy = 60,000 psi here
    assert len(shown["layer"]) == 3
    assert [number(v) for v in shown["layer_area"]] == pytest.approx([3.16, 1.58, 0.4])
    assert [number(v) for v in shown["layer_depth"]] == pytest.approx([21.5, 19.0, 2.5])
    assert [number(v) for v in shown["layer_strain"]] == pytest.approx(strains, rel=DISPLAY_REL)
    assert [number(v) for v in shown["layer_stress"]] == pytest.approx(
        [stress(e) for e in strains], rel=DISPLAY_REL)
    assert shown["layer_yields"] == ["yes", "yes", "no (elastic)"]


def test_one_tension_layer_has_no_layer_table_and_no_fs_prime(page):
    shown = displayed(page.details.object)
    assert "layer" not in shown and "fs_comp" not in shown
    page.apply_link("?units=us&h=24&asc=0.4&dc=2.5")  # A's alone: f's, still no table
    shown = displayed(page.details.object)
    assert "fs_comp" in shown and "layer" not in shown
