"""The Ductility tab: the section's moment–curvature response and μφ against ρ.

Every number is the engine's: `engine.moment_curvature` for the section
(the curve, cracking, first yield, crushing, μφ, Mcr, Mn/Mcr, the 6.6.5
redistribution and warnings), `engine.curvature_for_beam` for the same
section with its tension steel scaled to each limit ratio (as
`engine.capacity_curve` scales it, `BeamSection.with_tension_area`),
`engine.ductility_sweep` for μφ against ρ and `engine.check` for the limit
ratios. Without h there is no response (the concrete cracks at the extreme
tension fibre), and the tab asks for h instead of assuming one.

Like the calculation sheet, it follows the page's inputs but redraws only
while shown: a change while another tab is open marks it stale, and opening
it redraws it, so the Check tab's sliders pay nothing for it.
"""

from __future__ import annotations

import logging
from collections.abc import Callable
from dataclasses import dataclass
from html import escape

import panel as pn

import engine

from .ductility_plot import CURVATURE_SCALE, POINT_LABELS, POINT_NAMES, CurvaturePlot, DuctilityPlot
from .lazy_tab import LazyTab
from .plot import LIMIT_KEYS
from .summary import fmt, messages_html
from .theme import TEXT_CSS

LOG = logging.getLogger(__name__)
COMPARISON_SHARE = {"rho_min": 1.0, "rho_tc": 1.0, "rho_max": 1.0, "rho_b": 0.95}
"""Each comparison curve's ρ as a share of its limit: ρb itself has no first yield, so 0.95 ρb."""
COMPARISON_POINTS = 40  # the engine's least: thin curves need no more
NEEDS_H = ("Type h, the overall depth, to see the response: the concrete cracks at the extreme "
           "tension fibre, so moment–curvature needs the depth below the steel. No depth is "
           "assumed.")
MODEL_NOTE = ("Model: plane sections; parabola-and-line concrete, tension to fr then none; "
              "elastic–plastic steel; no confinement, strain hardening or tension stiffening. "
              "An aid for judging ductility, not a code check.")


@dataclass(frozen=True)
class DuctilityResults:
    """What the tab draws, all from engine calls for one set of inputs."""

    units: str
    response: engine.MomentCurvature
    sweep: engine.DuctilitySweep
    limits: dict[str, float | None]  # rho_min, rho_tc, rho_max, rho_b; None: unreachable
    rho: float  # the section's own
    comparisons: dict[str, engine.MomentCurvature]  # by limit key, at COMPARISON_SHARE of it
    comparison_rho: dict[str, float]


def ductility_results(inputs: dict) -> DuctilityResults:
    """The tab's results for `engine.check` keywords (h required; Mu ignored)."""
    kwargs = {key: value for key, value in inputs.items() if key != "Mu"}
    response = engine.moment_curvature(**kwargs)
    checked = engine.check(**kwargs).to_dict()
    limits = {key: checked[key] for key in LIMIT_KEYS}
    beam = response.beam
    comparisons, comparison_rho = {}, {}
    for key, share in COMPARISON_SHARE.items():
        if limits[key] is None:
            continue  # no steel area reaches this limit: no curve for it
        rho = share * limits[key]
        scaled = beam.with_tension_area(rho * beam.bw * beam.d)  # ρ = As/(bw d), as curve.py
        comparisons[key] = engine.curvature_for_beam(scaled, COMPARISON_POINTS)
        comparison_rho[key] = rho
    return DuctilityResults(units=checked["units"], response=response,
                            sweep=engine.ductility_sweep(**kwargs), limits=limits,
                            rho=checked["rho"], comparisons=comparisons,
                            comparison_rho=comparison_rho)


def _q(name: str, text: str) -> str:
    return f'<span data-q="{name}">{text}</span>'


def no_ductility_reason(response: engine.MomentCurvature) -> str:
    """Why μφ is missing, in plain text from the engine's strains."""
    if response.crushing is None:
        return ("no equilibrium with the extreme compression fibre at εcu = 0.003 "
                "(22.2.2.1)")
    return (f"no first yield: the strain at dt is {fmt(response.crushing.eps_t)} when the "
            f"concrete crushes, short of εty = {fmt(response.eps_ty)}")


def numbers_html(results: DuctilityResults) -> str:
    """μφ, Mcr, Mn/Mcr, 6.6.5, the three points and the warnings, escaped, each with a data-q."""
    r = results.response
    system = engine.unit_system(results.units)
    moment = escape(system.moment)
    scale, curvature_unit = CURVATURE_SCALE[results.units]
    if r.ductility is None:
        ductility = (f'<div class="v">{_q("ductility", "—")}</div>'
                     f'<div class="n">{_q("ductility_reason", escape(no_ductility_reason(r)))}</div>')
    else:
        ductility = (f'<div class="v">{_q("ductility", fmt(r.ductility, 3))}</div>'
                     '<div class="n">φ at crushing / φ at first yield</div>')
    redistribution = r.redistribution
    percent = (f'{_q("redistribution", fmt(redistribution.percent, 3))}<span class="u">%</span>'
               if redistribution.permitted else _q("redistribution", "none"))
    cards = (
        f'<div class="rs-card"><div class="k">Curvature ductility μφ</div>{ductility}</div>'
        f'<div class="rs-card"><div class="k">Cracking moment Mcr</div>'
        f'<div class="v">{_q("Mcr", fmt(r.Mcr))}<span class="u">{moment}</span></div>'
        '<div class="n">fr·Ig/yt, gross section, ACI 318-19 24.2.3.5</div></div>'
        f'<div class="rs-card"><div class="k">Mn / Mcr</div>'
        f'<div class="v">{_q("Mn_over_Mcr", fmt(r.Mn_over_Mcr, 3))}</div>'
        f'<div class="n">Mn = {_q("Mn", fmt(r.Mn))} {moment} (22.2)</div></div>'
        f'<div class="rs-card"><div class="k">Redistribution, 6.6.5</div>'
        f'<div class="v">{percent}</div>'
        f'<div class="n">{_q("redistribution_reason", escape(redistribution.reason))}</div></div>')
    rows = []
    for name in POINT_NAMES:
        point = getattr(r, name)
        if point is None:
            rows.append(f'<tr><td>{POINT_LABELS[name]}</td>'
                        f'<td class="num" colspan="4">{_q(name + "_curvature", "—")} none</td></tr>')
            continue
        rows.append(
            f'<tr><td>{POINT_LABELS[name]}</td>'
            f'<td class="num">{_q(name + "_curvature", fmt(point.curvature * scale))}</td>'
            f'<td class="num">{_q(name + "_moment", fmt(point.moment))}</td>'
            f'<td class="num">{fmt(point.eps_top)}</td><td class="num">{fmt(point.eps_t)}</td></tr>')
    warnings = "".join(f'<div class="rs-msg rs-warn" data-q="warning">{escape(text)}</div>'
                       for text in r.warnings)
    return (
        f'<div class="rs-cards">{cards}</div>'
        f'<h3>Key points</h3><table><tr><th>state</th><th>curvature ({escape(curvature_unit)})'
        f'</th><th>moment ({moment})</th><th>ε top</th><th>εt at dt</th></tr>{"".join(rows)}'
        f'</table>{warnings}<div class="rs-note">{escape(MODEL_NOTE)}</div>')


class DuctilityView(LazyTab, pn.viewable.Viewer):
    """Moment–curvature and μφ against ρ for the inputs `inputs()` returns."""

    def __init__(self, inputs: Callable[[], dict], **params) -> None:
        super().__init__(**params)
        self._inputs = inputs
        self.results: DuctilityResults | None = None
        self.curvature_plot = CurvaturePlot()
        self.ductility_plot = DuctilityPlot()
        self.message = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                    css_classes=["rs-ductility-message"])
        self.numbers = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                    css_classes=["rs-ductility-numbers"], margin=(4, 8))
        self.plots = pn.Column(
            pn.pane.Bokeh(self.curvature_plot.figure, sizing_mode="stretch_width", min_width=300),
            pn.pane.Bokeh(self.ductility_plot.figure, sizing_mode="stretch_width", min_width=300),
            sizing_mode="stretch_width", visible=False)
        self._layout = pn.Column(self.message, self.numbers, self.plots,
                                 sizing_mode="stretch_width")

    # -- wiring ----------------------------------------------------------

    @classmethod
    def attach(cls, page, title: str = "Ductility") -> "DuctilityView":
        """A view of `page`'s inputs added as the tab `title` (page: current_inputs, add_view)."""
        view = cls(page.current_inputs)
        view.follow(page, getattr(page, "views", None))  # first: not drawn while hidden
        page.add_view(title, view)
        return view

    # -- drawing ---------------------------------------------------------

    def refresh(self) -> None:
        """Compute and draw the current inputs; anything that cannot be drawn says why instead."""
        self._stale = False
        inputs = self._inputs()
        if inputs.get("h") is None:
            self._show_message(NEEDS_H, css="rs-warn")
            return
        try:
            results = ductility_results(inputs)
        except (engine.InputError, ArithmeticError) as error:
            text = str(error) if isinstance(error, engine.InputError) else (
                f"the engine could not compute these inputs ({type(error).__name__})")
            self._show_message(f"No response for these inputs: {text}.")
            return
        except Exception as error:  # an engine fault must not take the page down
            LOG.exception("moment–curvature failed for %r", inputs)
            self._show_message(f"The response cannot be computed for these inputs "
                               f"({type(error).__name__}). The check is not affected.")
            return
        try:
            self.numbers.object = numbers_html(results)
            if results.response.points:
                self.curvature_plot.update(results.response, results.comparisons, results.units)
            else:
                self.curvature_plot.clear()
            self.ductility_plot.update(results.sweep, results.limits, results.rho,
                                       results.response.ductility)
        except Exception as error:
            LOG.exception("could not draw the ductility view")
            self._show_message(f"The ductility view cannot be drawn for these inputs "
                               f"({type(error).__name__}: {error}). The check is not affected.")
            return
        self.results = results
        self.message.object = ""
        self.plots.visible = True

    def _show_message(self, text: str, css: str = "") -> None:
        self.results = None
        self.message.object = messages_html([text], css)
        self.numbers.object = ""
        self.curvature_plot.clear()
        self.ductility_plot.clear()
        self.plots.visible = False

    def __panel__(self):
        if self._stale and self._visible():
            self.refresh()
        return self._layout
