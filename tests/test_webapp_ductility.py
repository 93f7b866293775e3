"""The Ductility tab without a browser: what it draws is what the engine returns.

The contract of a thin shell: every curve, marker, limit line and number in
the tab equals `engine.moment_curvature`, `engine.ductility_sweep` and
`engine.check` for the same inputs, called here through the public API (a
comparison curve through `moment_curvature` with As itself set, not the
view's scaling). Physics is asserted against hand numbers (Mcr by 24.2.3.5)
and the trade's rule that ductility falls as the steel ratio rises.
"""

from __future__ import annotations

import math

import pytest
from bokeh.models import Legend

import engine
from webapp.ductility_plot import CURVATURE_SCALE
from webapp.ductility_view import COMPARISON_POINTS, DuctilityView, NEEDS_H
from webapp.page import BeamCheckPage
from webapp.plot import LIMIT_KEYS

from webapp_html import displayed, number, tags

KIP_FT = 12_000.0  # lb·in per kip·ft
DISPLAY_REL = 5e-4  # four significant figures
# Beam B-204, Harbourline Depot (invented): the page's default beam, with h.
B204 = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190, h=24)
# An SI T-beam with compression steel (invented), as in README's curvature example.
SI_TEE = dict(units="si", fc=30, fy=420, b=300, d=640, As=2400, h=700, bf=1200, hf=120,
              asc=600, dc=60, Mu=None)
# 1/in to 10⁻³/in and 1/mm to 10⁻⁶/mm: the units the axis is labelled in.
SCALE = {"us": 1e3, "si": 1e6}
SHARE = {"rho_min": 1.0, "rho_tc": 1.0, "rho_max": 1.0, "rho_b": 0.95}  # the tab's choice


def view_of(inputs: dict) -> DuctilityView:
    view = DuctilityView(lambda: dict(inputs))
    view.refresh()
    return view


def section(inputs: dict) -> dict:
    return {key: value for key, value in inputs.items() if key != "Mu"}


def shown(view) -> dict[str, list[str]]:
    return displayed(view.numbers.object)


@pytest.mark.parametrize("inputs", [pytest.param(B204, id="us-B204"),
                                    pytest.param(SI_TEE, id="si-tee-with-As'")])
def test_the_drawn_curve_and_points_are_the_engines(inputs):
    view = view_of(inputs)
    expected = engine.moment_curvature(**section(inputs))
    data = view.curvature_plot.curve.data
    assert data["curvature"] == pytest.approx([p.curvature for p in expected.points], rel=1e-12)
    assert data["moment"] == pytest.approx([p.moment for p in expected.points], rel=1e-12)
    assert data["x"] == pytest.approx([p.curvature * SCALE[inputs["units"]]
                                       for p in expected.points], rel=1e-12)
    for name in ("cracking", "first_yield", "crushing"):
        point = getattr(expected, name)
        drawn = view.curvature_plot.points[name].data
        assert drawn["curvature"] == pytest.approx([point.curvature], rel=1e-12), name
        assert drawn["moment"] == pytest.approx([point.moment], rel=1e-12), name
    assert view.curvature_plot.point_labels.data["label"] == ["cracking", "first yield",
                                                              "crushing"]
    assert view.plots.visible and view.message.object == ""


@pytest.mark.parametrize("inputs", [pytest.param(B204, id="us-B204"),
                                    pytest.param(SI_TEE, id="si-tee-with-As'")])
def test_the_numbers_shown_are_the_engines(inputs):
    view = view_of(inputs)
    expected = engine.moment_curvature(**section(inputs))
    values = shown(view)
    assert number(values["ductility"][0]) == pytest.approx(expected.ductility, rel=5e-3)  # 3 figures
    assert number(values["Mcr"][0]) == pytest.approx(expected.Mcr, rel=DISPLAY_REL)
    assert number(values["Mn"][0]) == pytest.approx(expected.Mn, rel=DISPLAY_REL)
    assert number(values["Mn_over_Mcr"][0]) == pytest.approx(expected.Mn_over_Mcr, rel=5e-3)
    assert number(values["redistribution"][0]) == pytest.approx(
        expected.redistribution.percent, rel=5e-3)
    assert values["redistribution_reason"] == [expected.redistribution.reason]
    for name in ("cracking", "first_yield", "crushing"):
        point = getattr(expected, name)
        assert number(values[f"{name}_curvature"][0]) == pytest.approx(
            point.curvature * SCALE[inputs["units"]], rel=DISPLAY_REL)
        assert number(values[f"{name}_moment"][0]) == pytest.approx(point.moment, rel=DISPLAY_REL)
    system = engine.unit_system(inputs["units"])
    assert system.moment in view.numbers.object
    assert CURVATURE_SCALE[inputs["units"]][1] in view.curvature_plot.figure.xaxis[0].axis_label


def test_mcr_shown_for_b204_is_the_hand_value():
    # ACI 318-19 24.2.3.5 and 19.2.3.1: fr = 7.5√4000 = 474.34 psi; Ig/yt = b h²/6 =
    # 14·24²/6 = 1,344 in³; Mcr = 474.34 × 1,344 = 637,510 lb·in = 53.13 kip·ft.
    view = view_of(B204)
    Mcr = 7.5 * math.sqrt(4000) * 14 * 24**2 / 6 / KIP_FT
    assert number(shown(view)["Mcr"][0]) == pytest.approx(Mcr, rel=DISPLAY_REL)


@pytest.mark.parametrize("inputs", [pytest.param(B204, id="us-B204"),
                                    pytest.param(dict(SI_TEE, asc=None, dc=None), id="si-tee")])
def test_comparison_curves_are_the_section_with_its_steel_at_each_limit(inputs):
    inputs = {key: value for key, value in inputs.items() if value is not None}
    view = view_of(inputs)
    limits = engine.check(**inputs).to_dict()
    drawn_ductility = {}
    for key in LIMIT_KEYS:
        rho = SHARE[key] * limits[key]
        # One tension layer: the scaled section is the same inputs with As = ρ b d.
        expected = engine.moment_curvature(**dict(section(inputs), As=rho * inputs["b"] * inputs["d"]),
                                           points=COMPARISON_POINTS)
        data = view.curvature_plot.comparisons[key].data
        assert data["curvature"] == pytest.approx([p.curvature for p in expected.points], rel=1e-9)
        assert data["moment"] == pytest.approx([p.moment for p in expected.points], rel=1e-9)
        drawn_ductility[key] = view.results.comparisons[key].ductility
    # Common practice (any reinforced-concrete text): curvature ductility falls as ρ rises.
    falling = [drawn_ductility[key] for key in LIMIT_KEYS if drawn_ductility[key] is not None]
    assert falling == sorted(falling, reverse=True) and len(falling) >= 3


@pytest.mark.parametrize("inputs", [pytest.param(B204, id="us-B204"),
                                    pytest.param(SI_TEE, id="si-tee-with-As'")])
def test_the_ductility_plot_is_the_engines_sweep_with_the_limits(inputs):
    view = view_of(inputs)
    sweep = engine.ductility_sweep(**section(inputs))
    checked = engine.check(**section(inputs)).to_dict()
    plot = view.ductility_plot
    assert list(plot.sweep.data["rho"]) == pytest.approx(sweep.rho, rel=1e-12)
    drawn = list(plot.sweep.data["ductility"])
    for mu, expected in zip(drawn, sweep.ductility):
        assert math.isnan(mu) if expected is None else mu == pytest.approx(expected, rel=1e-12)
    for key in LIMIT_KEYS:
        assert list(plot.limits[key].data["rho"]) == pytest.approx([checked[key]] * 2, rel=1e-12)
    mu = engine.moment_curvature(**section(inputs)).ductility
    assert plot.section.data["rho"] == pytest.approx([checked["rho"]], rel=1e-12)
    assert plot.section.data["ductility"] == pytest.approx([mu], rel=1e-12)


def test_without_h_the_tab_asks_for_it_and_draws_nothing():
    view = view_of(dict(B204, h=None))
    assert "Type h, the overall depth" in view.message.object
    assert displayed(view.message.object)["message"] == [NEEDS_H]
    assert view.numbers.object == "" and not view.plots.visible
    assert view.curvature_plot.curve.data["x"] == [] and view.ductility_plot.sweep.data["rho"] == []


def test_an_over_reinforced_section_shows_no_ductility_and_why():
    # As = 14 in² on 14 × 21.5 in: ρ = 0.0465, far past ρb = 0.0285 (ACI 318-19 21.2.2 for
    # f'c = 4000 psi, fy = 60,000 psi: 0.85·0.85·4000/60000 · 0.003/(0.003 + 0.00207)).
    inputs = dict(B204, As=14.0)
    rho_b = 0.85 * 0.85 * 4000 / 60000 * 0.003 / (0.003 + 60000 / 29e6)
    assert 14.0 / (14 * 21.5) > rho_b
    view = view_of(inputs)
    expected = engine.moment_curvature(**section(inputs))
    values = shown(view)
    assert values["ductility"] == ["—"] and values["first_yield_curvature"] == ["—"]
    reason = values["ductility_reason"][0]
    assert "no first yield" in reason
    assert number(reason.split("strain at dt is ")[1].split(" ")[0]) == pytest.approx(
        expected.crushing.eps_t, rel=DISPLAY_REL)
    assert values["redistribution"] == ["none"]
    assert values["redistribution_reason"] == [expected.redistribution.reason]
    assert values["warning"] == list(expected.warnings)
    assert view.ductility_plot.section.data["rho"] == []  # no μφ, no marker
    assert view.curvature_plot.points["first_yield"].data["x"] == []


def test_mn_at_or_below_mcr_is_warned_as_the_engine_warns():
    # The deep, lightly reinforced beam of tests/test_moment_curvature.py: Mn 189.5 < Mcr 236.2 kN·m.
    inputs = dict(units="si", fc=28, fy=420, b=300, d=1140, As=400, h=1200)
    view = view_of(inputs)
    warnings = shown(view)["warning"]
    assert any("Mcr" in text and "9.6.1" in text for text in warnings)
    assert number(shown(view)["Mn_over_Mcr"][0]) < 1


@pytest.mark.parametrize("inputs", [
    pytest.param(dict(B204, As=0.01), id="next-to-no-steel"),
    pytest.param(dict(B204, As=60.0), id="far-over-reinforced"),
    pytest.param(dict(B204, layers=[(1.2, 18.5)], asc=0.88, dc=2.5), id="two-layers-and-As'"),
    pytest.param(dict(B204, dt=23.0, fc=16000), id="very-strong-concrete"),
    pytest.param(dict(B204, fy=20000), id="very-low-fy"),
])
def test_odd_sections_draw_or_say_why(inputs):
    view = view_of(inputs)
    assert view.message.object == "" or "rs-msg" in view.message.object
    if view.results is not None:
        expected = engine.moment_curvature(**section(inputs))
        assert view.results.response.ductility == expected.ductility


def test_bad_inputs_say_which_field():
    view = view_of(dict(B204, fc=-1))
    assert "No response for these inputs" in view.message.object and "fc" in view.message.object
    assert not view.plots.visible


def test_an_engine_fault_is_a_message_not_a_crash(monkeypatch):
    def broken(**kwargs):
        raise RuntimeError("broken")

    monkeypatch.setattr(engine, "moment_curvature", broken)
    view = view_of(B204)
    assert "cannot be computed" in view.message.object and "RuntimeError" in view.message.object


def test_hostile_text_in_an_input_is_escaped():
    hostile = '<img src=x onerror=alert(1)><script>alert("x")</script>'
    view = view_of(dict(B204, fc=hostile))
    assert [tag for tag, _ in tags(view.message.object)] == ["div"]
    assert "onerror" not in str(tags(view.message.object))
    assert "&lt;img src=x onerror=alert(1)&gt;" in view.message.object  # quoted, as text


def test_figures_fit_a_phone_and_keep_legends_below():
    view = view_of(B204)
    for fig in (view.curvature_plot.figure, view.ductility_plot.figure):
        assert fig.sizing_mode == "stretch_width" and fig.min_width <= 340
        assert len(fig.title.text) <= 24  # short: no clipping at 768 px
        assert any(isinstance(item, Legend) for item in fig.below)
        assert not any(isinstance(item, Legend) for item in fig.center + fig.above)


def test_on_the_page_the_tab_follows_the_inputs_only_while_shown():
    page = BeamCheckPage()
    titles = list(page.views._names)
    assert titles[-1] == "Ductility"
    view = page.ductility_view
    assert view.results is None and view._stale  # never computed while hidden
    page.views.active = titles.index("Ductility")
    assert "Type h" in view.message.object  # the default beam has no h
    page.h = 24.0
    assert view.results is not None
    assert view.results.response.ductility == engine.moment_curvature(
        **section(page.current_inputs())).ductility
    page.views.active = 0
    shown_before = view.results
    page.As = 4.0
    assert view.results is shown_before  # hidden: only marked stale
    page.views.active = titles.index("Ductility")
    assert view.results is not shown_before
    assert view.results.rho == pytest.approx(4.0 / (14 * 21.5), rel=1e-12)
    page.unit_switch.value = "si"
    assert view.results.units == "si"
    assert engine.unit_system("si").moment in view.numbers.object
