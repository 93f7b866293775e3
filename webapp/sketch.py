"""The cross-section drawn to scale: outline, stirrup, cover, bars, compression block, c.

`SectionSketch` keeps one Bokeh figure with equal scales on both axes
(`match_aspect`) and updates it by replacing data-source columns. Positions
come from the engine: the check's a and c, the layers' depths, and, when a
bar arrangement was chosen in "Size the bars", `engine.arrange`'s real bar
positions. Otherwise each layer is drawn as evenly spaced bars of a nominal
size (marked as schematic). No formula of the check is repeated here; the
drawing only places what the engine computed.

Coordinates: x across the section from the web's left face, y up from the
bottom face, in the section's length unit.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from bokeh.models import ColumnDataSource, DataRange1d, LabelSet
from bokeh.plotting import figure

import engine

from .state import drawn_groups
from .theme import BRONZE, CORAL, FONT, INK, MUTED, TEAL

# Drawing allowances when the inputs do not say (common practice): h = dt + 2.5 in
# (63 mm) when h is not given; cover 1.5 in (40 mm) to a #3 (No. 10) stirrup,
# ACI 318-19 Table 20.5.1.3.1's least for beams not exposed to weather.
_BELOW_DT = {"us": 2.5, "si": 63.0}
_NOMINAL = {"us": ("#3", 1.5, "#8"), "si": ("10", 40.0, "25")}


@dataclass(frozen=True)
class Drawing:
    """What the sketch shows, in the section's length unit (y up from the bottom)."""

    outline_x: list
    outline_y: list
    block_x: list
    block_y: list
    stirrup: tuple[float, float, float, float, float]  # left, right, bottom, top, thickness
    bars: dict  # x, y, r, kind ("tension" or "compression")
    c: float
    a: float
    h: float
    h_given: bool  # False: h was not an input, so `h` is the drawing allowance below dt
    width: float
    schematic: bool
    note: str
    b: float = 0.0  # the web width, dimensioned under the section
    d: float = 0.0  # the first tension layer's depth, dimensioned on the right


def section_drawing(inputs, result: engine.FlexuralCheck, arrangement=None,
                    stirrup_bar=None, cover: float | None = None) -> Drawing:
    """The drawing of `inputs` (webapp Inputs) checked as `result`.

    `arrangement` (an `engine.Arrangement`) places the tension bars where
    `engine.arrange` put them; without it the layers are schematic.
    """
    units = inputs.units
    system = engine.unit_system(units)
    r = result.to_dict()
    layers = [(inputs.As, inputs.d)] + list(inputs.layers)
    dt = r.get("dt") or max(depth for _, depth in layers)
    if inputs.dt is not None:
        dt = max(dt, inputs.dt)
    h = inputs.h if inputs.h is not None else dt + _BELOW_DT[units]
    stirrup_name, cover_default, bar_name = _NOMINAL[units]
    stirrup_bar = stirrup_bar or engine.bar("stirrup", inputs.stirrup or stirrup_name, system)
    cover = cover if cover is not None else (inputs.cover or cover_default)
    bw = inputs.b
    bf = inputs.bf if inputs.flanged else bw
    hf = inputs.hf if inputs.flanged else 0.0
    if inputs.flanged and inputs.shape == "T":
        left, right = -(bf - bw) / 2, bw + (bf - bw) / 2
    else:
        left, right = 0.0, bf  # an L's flange runs to one side (the slab's)
    if inputs.flanged:
        xs = [0, bw, bw, right, right, left, left, 0]
        ys = [0, 0, h - hf, h - hf, h, h, h - hf, h - hf]
    else:
        xs, ys = [0, bw, bw, 0], [0, 0, h, h]
    a = min(r["a"], h)
    if inputs.flanged and a > hf:
        bx = [0, bw, bw, right, right, left, left, 0]
        by = [h - a, h - a, h - hf, h - hf, h, h, h - hf, h - hf]
    else:
        bx = [left, right, right, left]
        by = [h - a, h - a, h, h]
    inner = cover + stirrup_bar.db / 2
    stirrup = (inner, bw - inner, inner, h - inner, stirrup_bar.db)
    bars = {"x": [], "y": [], "r": [], "kind": []}
    schematic = arrangement is None
    drawn: tuple = ()
    if arrangement is not None:
        side = cover + stirrup_bar.db
        for count, depth in zip(arrangement.per_layer, arrangement.layer_depths):
            _row(bars, count, arrangement.bar.db, side, bw - side, h - depth, "tension")
    else:
        nominal = engine.bar("bar", bar_name, system)
        side = cover + stirrup_bar.db
        drawn = drawn_groups(inputs)
        schematic = None in drawn
        for (area, depth), group in zip(layers, drawn):
            if group is None:
                count, db = _schematic_bars(area, nominal, bw - 2 * side, system)
            else:  # the bars as entered: their count and their nominal diameter
                count, db = group.count, group.bar.db
            _row(bars, count, db, side, bw - side, h - depth, "tension")
    if inputs.asc is not None and inputs.dc is not None:
        count, db = _schematic_bars(inputs.asc, engine.bar("bar", _NOMINAL[units][2], system),
                                    bw - 2 * (cover + stirrup_bar.db), system)
        _row(bars, count, db, cover + stirrup_bar.db, bw - cover - stirrup_bar.db,
             h - inputs.dc, "compression")
    L = system.length
    if arrangement is None and any(drawn):
        entered = "; ".join(f"layer {index}: {group.text}" if group else
                            f"layer {index}: schematic (area typed)"
                            for index, group in enumerate(drawn, start=1))
        note = (f"Bars as entered ({entered}), evenly spaced. Cover {cover:g} {L} to a "
                f"{stirrup_bar.designation} stirrup assumed.")
    elif schematic:
        note = (f"Bars schematic: each layer drawn as evenly spaced bars of its area "
                f"(type the bars, e.g. 4 #9, to draw them as built). "
                f"Cover {cover:g} {L} to a {stirrup_bar.designation} stirrup assumed.")
    else:
        note = (f"Bars as arranged: {arrangement.count} {arrangement.bar.designation}, "
                f"cover {cover:g} {L}, {stirrup_bar.designation} stirrup.")
    if inputs.h is None:
        note += f" h not given: drawn {_BELOW_DT[units]:g} {L} below dt."
    return Drawing(outline_x=xs, outline_y=ys, block_x=bx, block_y=by, stirrup=stirrup,
                   bars=bars, c=r["c"], a=a, h=h, h_given=inputs.h is not None,
                   width=right - left, schematic=schematic,
                   note=note, b=bw, d=inputs.d)


def _schematic_bars(area: float, nominal, room: float, system) -> tuple[int, float]:
    """A count of equal bars for `area`: the nominal size, or the size that fits `room`."""
    for candidate in [nominal] + [b for b in engine.standard_bars(system) if b.area > nominal.area]:
        count = max(2, round(area / candidate.area))
        if count * candidate.db * 2 <= room or candidate is engine.standard_bars(system)[-1]:
            return count, candidate.db
    return 2, nominal.db


def _row(bars: dict, count: int, db: float, x0: float, x1: float, y: float, kind: str) -> None:
    """`count` bars of diameter `db` spread between faces x0 and x1 at height y."""
    first, last = x0 + db / 2, x1 - db / 2
    step = (last - first) / (count - 1) if count > 1 else 0.0
    for i in range(count):
        bars["x"].append(first + i * step if count > 1 else (x0 + x1) / 2)
        bars["y"].append(y)
        bars["r"].append(db / 2)
        bars["kind"].append(kind)


class SectionSketch:
    """One Bokeh figure of the section, to scale; `update` replaces its data only."""

    def __init__(self) -> None:
        self.outline = ColumnDataSource(data=dict(x=[], y=[]), name="sketch-outline")
        self.block = ColumnDataSource(data=dict(x=[], y=[]), name="sketch-block")
        self.stirrup = ColumnDataSource(data=dict(left=[], right=[], bottom=[], top=[],
                                                  width=[]), name="sketch-stirrup")
        self.bars = ColumnDataSource(data=dict(x=[], y=[], r=[], kind=[], color=[]),
                                     name="sketch-bars")
        self.axis = ColumnDataSource(data=dict(x0=[], x1=[], y=[]), name="sketch-axis")
        # Dimension lines with their labels: b under the web, h on the left, d on the right.
        self.dims = ColumnDataSource(data=dict(x0=[], y0=[], x1=[], y1=[], lx=[], ly=[],
                                               text=[], angle=[]), name="sketch-dims")
        fig = figure(width=300, height=390, match_aspect=True, tools="pan,wheel_zoom,reset",
                     title="Section to scale", x_range=DataRange1d(range_padding=0.12),
                     y_range=DataRange1d(range_padding=0.12), name="sketch")
        fig.toolbar.logo = None
        fig.toolbar.autohide = True
        fig.axis.visible = False
        fig.grid.visible = False
        fig.outline_line_color = None
        fig.title.text_font = FONT
        fig.title.text_font_size = "14px"
        fig.title.text_color = INK
        fig.patch("x", "y", source=self.outline, fill_color="#e9e6df", line_color=INK,
                  line_width=2)
        fig.patch("x", "y", source=self.block, fill_color=TEAL, fill_alpha=0.28,
                  hatch_pattern="/", hatch_color=TEAL, hatch_alpha=0.5, line_color=TEAL,
                  line_width=1)
        fig.quad(left="left", right="right", bottom="bottom", top="top", source=self.stirrup,
                 fill_color=None, line_color=MUTED, line_width=2, line_dash=[4, 2])
        fig.segment(x0="x0", x1="x1", y0="y", y1="y", source=self.axis, line_color=CORAL,
                    line_width=2, line_dash="dashed")
        fig.circle(x="x", y="y", radius="r", source=self.bars, fill_color="color",
                   line_color=INK, line_width=1)
        fig.segment(x0="x0", y0="y0", x1="x1", y1="y1", source=self.dims, line_color=MUTED,
                    line_width=1)
        fig.add_layout(LabelSet(x="lx", y="ly", text="text", angle="angle", source=self.dims,
                                text_font_size="11.5px", text_color=INK, text_align="center",
                                text_baseline="middle"))
        self.figure = fig
        self.drawing: Drawing | None = None

    def update(self, drawing: Drawing, units: str) -> None:
        """Show `drawing` by replacing the sources' data in place."""
        self.drawing = drawing
        L = engine.unit_system(units).length
        self.outline.data = dict(x=drawing.outline_x, y=drawing.outline_y)
        self.block.data = dict(x=drawing.block_x, y=drawing.block_y)
        left, right, bottom, top, width = drawing.stirrup
        self.stirrup.data = dict(left=[left], right=[right], bottom=[bottom], top=[top],
                                 width=[width])
        colors = [BRONZE if kind == "tension" else "#5b4b8a" for kind in drawing.bars["kind"]]
        self.bars.data = dict(**drawing.bars, color=colors)
        x0, x1 = min(drawing.outline_x), max(drawing.outline_x)
        c_y = drawing.h - drawing.c
        self.axis.data = dict(x0=[x0 - 0.04 * drawing.width], x1=[x1 + 0.04 * drawing.width],
                              y=[c_y])
        self.dims.data = dimension_lines(drawing, L)


def dimension_lines(drawing: Drawing, length_unit: str) -> dict:
    """The sketch's dimension lines and labels: b below, h on the left, d on the right."""
    x0, x1 = min(drawing.outline_x), max(drawing.outline_x)
    gap = 0.09 * max(drawing.width, drawing.h)
    h_text = (f"h = {drawing.h:.4g} {length_unit}" if drawing.h_given
              else f"h not given (drawn {drawing.h:.4g} {length_unit})")
    return dict(
        x0=[0.0, x0 - gap, x1 + gap], x1=[drawing.b, x0 - gap, x1 + gap],
        y0=[-gap, 0.0, drawing.h], y1=[-gap, drawing.h, drawing.h - drawing.d],
        lx=[drawing.b / 2, x0 - 1.6 * gap, x1 + 1.6 * gap],
        ly=[-1.7 * gap, drawing.h / 2, drawing.h - drawing.d / 2],
        text=[f"b = {drawing.b:.4g} {length_unit}", h_text, f"d = {drawing.d:.4g} {length_unit}"],
        angle=[0.0, math.pi / 2, math.pi / 2])
