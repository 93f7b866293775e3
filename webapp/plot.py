"""Bokeh figures that draw engine results; updated in place, never rebuilt.

`CapacityPlot` draws φMn and Mn against ρ from `engine.capacity_curve`, the
four limit ratios as labelled vertical lines, the ρ regions between them as
hatched bands named in a legend, the section itself as a marker and Mu as a
horizontal line. `LimitSweepPlot` draws the limit ratios against f'c at the
current fy, from `engine.check` across an f'c sweep. Each `update` replaces
data-source columns and moves annotations; the figure objects stay the same.
"""

from __future__ import annotations

import math

import numpy as np
from bokeh.models import (ColumnDataSource, HoverTool, Label, LabelSet, Legend, LegendItem,
                          NumeralTickFormatter, Range1d, Span)
from bokeh.plotting import figure

import engine

from .theme import BRONZE, CORAL, FONT, INK, LIMIT_STYLE, MUTED, REGION_STYLE, TEAL

LIMIT_KEYS = ("rho_min", "rho_tc", "rho_max", "rho_b")
LIMIT_LABELS = {"rho_min": "ρmin", "rho_tc": "ρtc", "rho_max": "ρ at εt = 0.004",
                "rho_b": "ρb"}
# The f'c plot's legend is narrow: the same limits in fewer characters.
LEGEND_LABELS = {"rho_min": "ρmin", "rho_tc": "ρtc", "rho_max": "ρ(εt=0.004)", "rho_b": "ρb"}
REGION_NAMES = {
    "below-min": "below ρmin",
    "tension-controlled": "tension-controlled",
    "transition": "transition, εt ≥ 0.004",
    "beyond-beam-limit": "εt < 0.004: not for beams",
    "compression-controlled": "compression-controlled",
}
MOMENT_TICKS = "0,0.[00]"  # plain numbers with thousands separators, never 1.400e+5
_HEADROOM = 1.22  # the y range ends this far above the largest moment, for the labels


def style_figure(fig) -> None:
    """The page's look on a Bokeh figure: no logo, a quiet grid, its font and ink."""
    fig.toolbar.autohide = True
    fig.toolbar.logo = None
    fig.background_fill_color = "#ffffff"
    fig.border_fill_color = "#ffffff"
    fig.outline_line_color = "#c9cfd2"
    for axis in (fig.xaxis, fig.yaxis):
        axis.axis_label_text_font = FONT
        axis.axis_label_text_font_style = "normal"
        axis.axis_label_text_color = INK
        axis.major_label_text_font_size = "11px"
    fig.grid.grid_line_color = "#e6e9ea"
    fig.title.text_font = FONT
    fig.title.text_font_size = "14px"
    fig.title.text_color = INK


def finite(values) -> np.ndarray:
    """A float array with infinities (εt at ρ = 0) as NaN, which Bokeh leaves blank."""
    array = np.asarray(values, dtype=float)
    return np.where(np.isfinite(array), array, np.nan)


class CapacityPlot:
    """φMn and Mn against ρ, with the limits, the section and Mu."""

    def __init__(self) -> None:
        self.curve = ColumnDataSource(data=dict(rho=[], As=[], Mn=[], phiMn=[], phi=[],
                                                eps_t=[], section_class=[]), name="curve")
        self.section = ColumnDataSource(data=dict(rho=[], As=[], Mn=[], phiMn=[], phi=[],
                                                  eps_t=[], section_class=[]))
        self.regions = ColumnDataSource(data=dict(left=[], right=[], bottom=[], top=[],
                                                  color=[], hatch=[], name=[]))
        self.limit_labels = ColumnDataSource(data=dict(x=[], y=[], text=[], color=[]),
                                             name="limit-labels")
        self.x_range = Range1d(0, 0.05)
        self.y_range = Range1d(0, 1)
        fig = figure(height=390, sizing_mode="stretch_width", x_range=self.x_range,
                     y_range=self.y_range, tools="pan,wheel_zoom,box_zoom,reset,save",
                     title="Capacity against the tension steel ratio ρ", min_width=320)
        style_figure(fig)
        fig.xaxis.axis_label = "ρ = As / (b d)"
        fig.xaxis.formatter = NumeralTickFormatter(format="0.000")
        fig.yaxis.formatter = NumeralTickFormatter(format=MOMENT_TICKS)
        band = fig.quad(left="left", right="right", bottom="bottom", top="top",
                        source=self.regions, fill_color="color", fill_alpha=0.5,
                        hatch_pattern="hatch", hatch_color="#7d7466", hatch_alpha=0.22,
                        hatch_scale=11, hatch_weight=1, line_color=None, level="underlay")
        self.mn_line = fig.line("rho", "Mn", source=self.curve, line_width=2,
                                line_color=BRONZE, line_dash="dashed")
        self.phi_line = fig.line("rho", "phiMn", source=self.curve, line_width=3,
                                 line_color=TEAL)
        self.marker = fig.scatter("rho", "phiMn", source=self.section, size=14,
                                  marker="diamond", fill_color=CORAL, line_color=INK,
                                  line_width=1.5)
        self.spans = {}
        for key in LIMIT_KEYS:
            color, dash = LIMIT_STYLE[key]
            span = Span(location=0, dimension="height", line_color=color, line_dash=dash,
                        line_width=2, name=f"limit-{key}")
            fig.add_layout(span)
            self.spans[key] = span
        fig.add_layout(LabelSet(x="x", y="y", text="text", source=self.limit_labels,
                                text_color="color", text_font_size="12px",
                                text_font_style="bold", x_offset=4, text_baseline="top",
                                background_fill_color="#ffffff",
                                background_fill_alpha=0.8))
        self.mu_span = Span(location=0, dimension="width", line_color=CORAL,
                            line_dash=[8, 4], line_width=2, visible=False, name="Mu")
        fig.add_layout(self.mu_span)
        self.mu_label = Label(x=0, y=0, text="", text_color=CORAL, text_font_size="12px",
                              x_units="screen", x_offset=8, y_offset=3, visible=False,
                              background_fill_color="#ffffff", background_fill_alpha=0.8)
        fig.add_layout(self.mu_label)
        self.hover = HoverTool(renderers=[self.phi_line, self.marker], mode="mouse")
        fig.add_tools(self.hover)
        lines = Legend(items=[
            LegendItem(label="φMn", renderers=[self.phi_line]),
            LegendItem(label="Mn", renderers=[self.mn_line]),
            LegendItem(label="this section", renderers=[self.marker]),
        ], orientation="horizontal", location="top_left", label_text_font_size="12px",
            padding=2, spacing=10, border_line_color=None, margin=2)
        # Both legends sit outside the axes (none covers the curve or the
        # section's marker); the regions' one runs in two columns, so it fits
        # the figure's least width (a one-row legend spilled past a narrow plot).
        fig.add_layout(lines, "above")
        self.region_legend = Legend(
            items=[LegendItem(label=REGION_NAMES[name], renderers=[band], index=i)
                   for i, name in enumerate(REGION_STYLE)],
            orientation="horizontal", ncols=2, location="top_left",
            label_text_font_size="11.5px", glyph_width=22, glyph_height=14, padding=2,
            spacing=2, label_height=14, border_line_color=None, click_policy="none")
        fig.add_layout(self.region_legend, "below")
        self.figure = fig

    def update(self, curve: engine.CapacityCurve, result: engine.FlexuralCheck) -> None:
        """Show `curve` and `result` (same section) by replacing data in place.

        Only what changed is sent: while As alone moves, the page passes the
        same curve object, and just the marker (and Mu's line) move.
        """
        system = engine.unit_system(result.to_dict()["units"])
        new_curve = curve is not self._shown_curve
        if new_curve:
            self._shown_curve = curve
            self._show_curve(curve, system)
        y_top = max(self._curve_top, result.Mu or 0.0) * _HEADROOM or 1.0
        if new_curve or y_top != self.y_range.end:
            self._show_regions(curve.marks, y_top)
        s = result.state
        self.section.data = dict(rho=[result.rho], As=[result.to_dict()["As"]],
                                 Mn=[result.Mn], phiMn=[result.phiMn], phi=[s.phi],
                                 eps_t=[s.eps_t], section_class=[s.section_class.value])
        if result.Mu is None:
            self.mu_span.visible = self.mu_label.visible = False
        else:
            self.mu_span.location = result.Mu
            self.mu_label.update(y=result.Mu, text=f"Mu = {result.Mu:.4g} {system.moment}",
                                 visible=True)
            self.mu_span.visible = True

    _shown_curve: engine.CapacityCurve | None = None
    _curve_top = 0.0

    def _show_curve(self, curve: engine.CapacityCurve, system: engine.UnitSystem) -> None:
        rho = finite(curve.rho)
        Mn = finite(curve.Mn)
        self._curve_top = float(np.nanmax(Mn))
        self.x_range.update(start=0.0, end=float(np.nanmax(rho)))
        self.curve.data = dict(rho=rho, As=finite(curve.As), Mn=Mn,
                               phiMn=finite(curve.phiMn), phi=finite(curve.phi),
                               eps_t=finite(curve.eps_t),
                               section_class=list(curve.section_class))
        for key in LIMIT_KEYS:
            mark = curve.marks[key]
            self.spans[key].location = mark
            self.spans[key].visible = mark is not None  # None: no steel area reaches it
        self.figure.yaxis.axis_label = f"moment ({system.moment})"
        self.hover.tooltips = [
            ("ρ", "@rho{0.00000}"), ("As", f"@As{{0.000}} {system.area}"),
            ("φMn", f"@phiMn{{0.0}} {system.moment}"), ("Mn", f"@Mn{{0.0}} {system.moment}"),
            ("φ", "@phi{0.000}"), ("εt", "@eps_t{0.00000}"), ("class", "@section_class"),
        ]

    def _show_regions(self, marks: dict, y_top: float) -> None:
        self.y_range.update(start=0.0, end=y_top)
        x_end = self.x_range.end
        # A limit no steel area reaches (the engine's None) has no region edge:
        # its region closes at the next limit that exists, or the axis end.
        edges = [0.0]
        for key in LIMIT_KEYS:
            mark = marks[key]
            edges.append(edges[-1] if mark is None or not math.isfinite(mark) else mark)
        edges.append(max(x_end, edges[-1]))
        names = list(REGION_STYLE)
        self.regions.data = dict(
            left=edges[:-1], right=edges[1:], bottom=[0.0] * 5, top=[y_top] * 5,
            color=[REGION_STYLE[n][0] for n in names], hatch=[REGION_STYLE[n][1] for n in names],
            name=[REGION_NAMES[n] for n in names])
        # Labels sit in the head room; ρtc and ρ at εt = 0.004 are often close, so they
        # take alternate rows.
        rows = {"rho_min": 0.99, "rho_tc": 0.99, "rho_max": 0.935, "rho_b": 0.99}
        self.limit_labels.data = dict(
            x=[math.nan if marks[key] is None else marks[key] for key in LIMIT_KEYS],
            y=[y_top * rows[key] for key in LIMIT_KEYS],
            text=[LIMIT_LABELS[key] for key in LIMIT_KEYS],
            color=[LIMIT_STYLE[key][0] for key in LIMIT_KEYS])


class LimitSweepPlot:
    """The four limit ratios against f'c, at the current fy, with the section's ρ."""

    def __init__(self) -> None:
        self.source = ColumnDataSource(data=dict(fc=[], rho_min=[], rho_tc=[], rho_max=[],
                                                 rho_b=[]))
        fig = figure(height=400, width=320,
                     tools="pan,wheel_zoom,reset", title="Limits against f'c, at this fy")
        style_figure(fig)
        fig.yaxis.formatter = NumeralTickFormatter(format="0.000")
        fig.yaxis.axis_label = "ρ"
        items = []
        markers = {"rho_min": "circle", "rho_tc": "square", "rho_max": "triangle",
                   "rho_b": "inverted_triangle"}
        renderers = []
        for key in LIMIT_KEYS:
            color, dash = LIMIT_STYLE[key]
            line = fig.line("fc", key, source=self.source, line_color=color, line_dash=dash,
                            line_width=2)
            dots = fig.scatter("fc", key, source=self.source, marker=markers[key], size=6,
                               fill_color="#ffffff", line_color=color)
            items.append(LegendItem(label=LEGEND_LABELS[key],
                                    renderers=[line, dots]))
            renderers.append(line)
        self.fc_span = Span(location=0, dimension="height", line_color=CORAL,
                            line_dash=[6, 3], line_width=2)
        self.rho_span = Span(location=0, dimension="width", line_color=MUTED,
                             line_dash="dotted", line_width=2)
        fig.add_layout(self.fc_span)
        fig.add_layout(self.rho_span)
        self.rho_label = Label(x=0, y=0, text="ρ of this section", text_align="right",
                               x_offset=-4, y_offset=2, text_font_size="11px",
                               text_color=MUTED)
        fig.add_layout(self.rho_label)
        fig.xaxis.formatter = NumeralTickFormatter(format="0,0.[0]")
        # Below the axes, so it never covers the curves.
        fig.add_layout(Legend(items=items, orientation="horizontal", location="center",
                              label_text_font_size="11.5px", padding=2, spacing=6,
                              glyph_width=18, border_line_color=None), "below")
        self.hover = HoverTool(renderers=renderers, mode="vline")
        fig.add_tools(self.hover)
        self.figure = fig
        self._key = None

    def update(self, result: engine.FlexuralCheck, fc_span: tuple[float, float],
               section: dict) -> None:
        """Sweep f'c over `fc_span` with the other inputs of `section` (engine kwargs)."""
        units = section["units"]
        key = (tuple((k, v) for k, v in section.items() if k != "fc"), fc_span)
        if key != self._key:
            self._key = key
            self.source.data = sweep_limits(section, fc_span)
            system = engine.unit_system(units)
            self.figure.xaxis.axis_label = f"f'c ({system.stress})"
            self.hover.tooltips = [("f'c", f"@fc{{0.[0]}} {system.stress}")] + [
                (LEGEND_LABELS[k], f"@{k}{{0.00000}}") for k in LIMIT_KEYS]
        self.fc_span.location = section["fc"]
        self.rho_span.location = result.rho
        self.rho_label.update(x=fc_span[1], y=result.rho)


def sweep_limits(section: dict, fc_span: tuple[float, float], points: int = 41) -> dict:
    """Columns fc, rho_min, rho_tc, rho_max, rho_b from `engine.check` at each f'c."""
    start, end = fc_span
    columns = {"fc": [], **{key: [] for key in LIMIT_KEYS}}
    kwargs = {k: v for k, v in section.items() if k != "Mu"}
    for i in range(points):
        fc = start + (end - start) * i / (points - 1)
        limits = engine.check(**dict(kwargs, fc=fc)).limits
        columns["fc"].append(fc)
        for key in LIMIT_KEYS:
            value = getattr(limits, key)
            columns[key].append(math.nan if value is None else value)  # None: not reached
    return columns
