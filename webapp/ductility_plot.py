"""The two figures of the Ductility tab, drawn from engine results and updated in place.

`CurvaturePlot` draws moment against curvature (`engine.moment_curvature`)
for the section, its cracking, first-yield and crushing points as labelled
markers, and thin curves of the same section with its tension steel at the
limit ratios. `DuctilityPlot` draws μφ against ρ (`engine.ductility_sweep`)
with the capacity plot's limit lines and the section as a marker. Each
`update` replaces data-source columns; the figure objects stay the same.

Curvature is shown in 10⁻³/in or 10⁻⁶/mm (a change of unit, so the axis
reads 0.1–1 instead of 0.0001–0.001); the data keep the engine's 1/in or
1/mm in `curvature`, and the scaled value in `x`.
"""

from __future__ import annotations

import math

from bokeh.models import (ColumnDataSource, HoverTool, LabelSet, Legend, LegendItem,
                          NumeralTickFormatter, Range1d)
from bokeh.plotting import figure

import engine

from .plot import LIMIT_KEYS, LIMIT_LABELS, MOMENT_TICKS, finite, style_figure
from .theme import CORAL, INK, LIMIT_STYLE, TEAL

CURVATURE_SCALE = {"us": (1e3, "10⁻³/in"), "si": (1e6, "10⁻⁶/mm")}
"""Curvature on screen: (factor from 1/in or 1/mm, unit shown)."""

POINT_NAMES = ("cracking", "first_yield", "crushing")
POINT_LABELS = {"cracking": "cracking", "first_yield": "first yield", "crushing": "crushing"}
POINT_MARKERS = {"cracking": "circle", "first_yield": "square", "crushing": "triangle"}
_HEADROOM = 1.15  # the y range ends this far above the largest value, for the labels
_LEGEND = dict(orientation="horizontal", ncols=2, location="top_left",
               label_text_font_size="11.5px", glyph_width=22, padding=2, spacing=2,
               border_line_color=None, click_policy="none")


def _figure(title: str, height: int) -> tuple:
    """(figure, x range, y range): stretched to the tab's width, down to a phone's."""
    x_range, y_range = Range1d(0, 1), Range1d(0, 1)
    fig = figure(height=height, sizing_mode="stretch_width", min_width=300, x_range=x_range,
                 y_range=y_range, tools="pan,wheel_zoom,box_zoom,reset,save", title=title)
    style_figure(fig)
    return fig, x_range, y_range


def _empty_curve() -> dict:
    return dict(x=[], curvature=[], moment=[], eps_top=[], eps_t=[])


def curve_columns(points, units: str) -> dict:
    """A curve's columns: the engine's curvature, moment and strains, and `x` (curvature on screen)."""
    scale = CURVATURE_SCALE[units][0]
    return dict(x=[p.curvature * scale for p in points],
                curvature=[p.curvature for p in points], moment=[p.moment for p in points],
                eps_top=[p.eps_top for p in points], eps_t=[p.eps_t for p in points])


class CurvaturePlot:
    """Moment against curvature: the section, its three points, the comparison curves."""

    def __init__(self) -> None:
        self.curve = ColumnDataSource(data=_empty_curve(), name="curvature")
        self.points = {name: ColumnDataSource(data=_empty_curve(), name=f"point-{name}")
                       for name in POINT_NAMES}
        self.point_labels = ColumnDataSource(data=dict(x=[], moment=[], label=[]),
                                             name="point-labels")
        self.comparisons = {key: ColumnDataSource(data=_empty_curve(), name=f"compare-{key}")
                            for key in LIMIT_KEYS}
        fig, self.x_range, self.y_range = _figure("Moment–curvature", 380)
        fig.yaxis.formatter = NumeralTickFormatter(format=MOMENT_TICKS)
        fig.xaxis.formatter = NumeralTickFormatter(format="0.[000]")
        items = []
        for key in LIMIT_KEYS:
            color, dash = LIMIT_STYLE[key]
            line = fig.line("x", "moment", source=self.comparisons[key], line_color=color,
                            line_dash=dash, line_width=1.5, line_alpha=0.85)
            items.append(LegendItem(label=comparison_label(key), renderers=[line]))
        self.line = fig.line("x", "moment", source=self.curve, line_color=TEAL, line_width=3)
        markers = {name: fig.scatter("x", "moment", source=self.points[name],
                                     marker=POINT_MARKERS[name], size=11, fill_color=CORAL,
                                     line_color=INK, line_width=1.5)
                   for name in POINT_NAMES}
        fig.add_layout(LabelSet(x="x", y="moment", text="label", source=self.point_labels,
                                text_font_size="12px", text_color=INK, x_offset=6,
                                y_offset=-16, background_fill_color="#ffffff",
                                background_fill_alpha=0.8))
        self.hover = HoverTool(renderers=[self.line, *markers.values()], mode="mouse")
        fig.add_tools(self.hover)
        legend = Legend(items=[LegendItem(label="this section", renderers=[self.line]),
                               *(LegendItem(label=POINT_LABELS[name], renderers=[marker])
                                 for name, marker in markers.items()),
                               *items], **_LEGEND)
        fig.add_layout(legend, "below")  # below: never over the curves, fits a phone's width
        self.figure = fig

    def update(self, response: engine.MomentCurvature, comparisons: dict, units: str) -> None:
        """Show `response` and `comparisons` ({limit key: MomentCurvature}); missing keys blank."""
        self.curve.data = curve_columns(response.points, units)
        shown = []
        for name in POINT_NAMES:
            point = getattr(response, name)
            self.points[name].data = curve_columns([] if point is None else [point], units)
            if point is not None:
                shown.append((name, point))
        labels = curve_columns([point for _, point in shown], units)
        self.point_labels.data = dict(x=labels["x"], moment=labels["moment"],
                                      label=[POINT_LABELS[name] for name, _ in shown])
        all_points = list(response.points)
        for key in LIMIT_KEYS:
            other = comparisons.get(key)
            points = other.points if other is not None else ()
            self.comparisons[key].data = curve_columns(points, units)
            all_points += points
        system = engine.unit_system(units)
        scale, unit = CURVATURE_SCALE[units]
        x_end = max((p.curvature for p in all_points), default=0.0) * scale
        y_end = max((p.moment for p in all_points), default=0.0) * _HEADROOM
        self.x_range.update(start=0.0, end=x_end or 1.0)
        self.y_range.update(start=0.0, end=y_end or 1.0)
        self.figure.xaxis.axis_label = f"curvature ({unit})"
        self.figure.yaxis.axis_label = f"moment ({system.moment})"
        self.hover.tooltips = [("curvature", f"@x{{0.0000}} {unit}"),
                               ("M", f"@moment{{0.0}} {system.moment}"),
                               ("ε top", "@eps_top{0.00000}"), ("εt at dt", "@eps_t{0.00000}")]

    def clear(self) -> None:
        """Nothing drawn (the view says why in its message)."""
        self.curve.data = _empty_curve()
        self.point_labels.data = dict(x=[], moment=[], label=[])
        for source in (*self.points.values(), *self.comparisons.values()):
            source.data = _empty_curve()


def comparison_label(key: str) -> str:
    """The legend's name of the comparison curve at limit `key` (ρb's is at 0.95 ρb)."""
    return "0.95 ρb" if key == "rho_b" else LIMIT_LABELS[key]


class DuctilityPlot:
    """μφ against ρ, the capacity plot's four limit lines, and the section."""

    def __init__(self) -> None:
        self.sweep = ColumnDataSource(data=dict(rho=[], ductility=[]), name="ductility-sweep")
        self.section = ColumnDataSource(data=dict(rho=[], ductility=[]), name="section")
        self.limits = {key: ColumnDataSource(data=dict(rho=[], ductility=[]), name=f"limit-{key}")
                       for key in LIMIT_KEYS}
        fig, self.x_range, self.y_range = _figure("μφ against ρ", 340)
        fig.xaxis.axis_label = "ρ = As / (b d)"
        fig.yaxis.axis_label = "curvature ductility μφ"
        fig.xaxis.formatter = NumeralTickFormatter(format="0.000")
        items = []
        for key in LIMIT_KEYS:
            color, dash = LIMIT_STYLE[key]
            line = fig.line("rho", "ductility", source=self.limits[key], line_color=color,
                            line_dash=dash, line_width=2)
            items.append(LegendItem(label=LIMIT_LABELS[key], renderers=[line]))
        self.line = fig.line("rho", "ductility", source=self.sweep, line_color=TEAL, line_width=3)
        self.marker = fig.scatter("rho", "ductility", source=self.section, size=14,
                                  marker="diamond", fill_color=CORAL, line_color=INK,
                                  line_width=1.5)
        fig.add_tools(HoverTool(renderers=[self.line, self.marker], mode="mouse",
                                tooltips=[("ρ", "@rho{0.00000}"), ("μφ", "@ductility{0.00}")]))
        fig.add_layout(Legend(items=[LegendItem(label="μφ", renderers=[self.line]),
                                     LegendItem(label="this section", renderers=[self.marker]),
                                     *items], **_LEGEND), "below")
        self.figure = fig

    def update(self, sweep: engine.DuctilitySweep, limits: dict, rho: float,
               ductility: float | None) -> None:
        """Show `sweep`, the limit ratios `limits` (None: unreachable) and the section (ρ, μφ)."""
        values = finite([math.nan if mu is None else mu for mu in sweep.ductility])
        shown = [mu for mu in values if math.isfinite(mu)]
        if ductility is not None:
            shown.append(ductility)
        y_end = max(shown, default=1.0) * _HEADROOM
        self.y_range.update(start=0.0, end=y_end)
        self.x_range.update(start=0.0, end=max(sweep.rho[-1], rho))
        self.sweep.data = dict(rho=list(sweep.rho), ductility=values)
        self.section.data = (dict(rho=[rho], ductility=[ductility]) if ductility is not None
                             else dict(rho=[], ductility=[]))
        for key in LIMIT_KEYS:
            mark = limits.get(key)
            self.limits[key].data = (dict(rho=[mark, mark], ductility=[0.0, y_end])
                                     if mark is not None else dict(rho=[], ductility=[]))

    def clear(self) -> None:
        """Nothing drawn (the view says why in its message)."""
        for source in (self.sweep, self.section, *self.limits.values()):
            source.data = dict(rho=[], ductility=[])
