"""The checked section drawn as inline SVG text, for the calculation sheet.

`section_svg(result)` draws one `FlexuralCheck`: the outline (b, the flange
bf × hf when there is one, down to h, or to the deepest tension steel with a
dashed bottom when h is not given), the compression block to depth a (cut at
h), every steel layer at its depth with its area, and dimensions for b (bw),
bf, h, d (the tension centroid) and a. Every number drawn or printed comes
from the result (its inputs, and a and d); nothing is computed here but the
drawing's own scale. A flange is drawn centred on the web: the check does not
tell a T from an L (both are a flange width).

The SVG is plain inline markup (no scripts, links, url() or external fonts),
so the sheet stays one self-contained file; its text is escaped.
"""

from __future__ import annotations

import html

from ..provisions.checks import FlexuralCheck
from ..section.beam import Role
from .number_text import significant
from .share_link import format_number

_WIDTH = 330.0  # drawing units; the sheet's CSS sets the printed size
_LEFT, _TOP = 52.0, 30.0  # room for the h and d dimensions on the left, bf above
_BOX_W, _BOX_H = 150.0, 150.0  # the section fits in this box, to scale
_FONT = 8.0
_LINE = 9.5  # least distance between two labels on the right


def _given(value: float, unit: str) -> str:
    """An input as the engine received it (shortest exact form), with its unit."""
    return f"{format_number(value).replace('-', '−')} {unit}"


def _found(value: float, unit: str) -> str:
    """A computed value (a, d) to 4 significant figures, with its unit."""
    return f"{significant(value, 4)} {unit}"


def _text(x: float, y: float, words: str, anchor: str = "start", extra: str = "") -> str:
    return (f'<text x="{x:.1f}" y="{y:.1f}" font-size="{_FONT:g}" text-anchor="{anchor}"'
            f'{extra}>{html.escape(words)}</text>')


def _spread(wanted: list[float], gap: float) -> list[float]:
    """Label heights at least `gap` apart, each as near its wanted height as the order allows."""
    placed: list[float] = []
    for y in wanted:
        placed.append(max(y, placed[-1] + gap) if placed else y)
    return placed


def section_svg(result: FlexuralCheck) -> str:
    """The section of `result` to scale, as one <svg> element (text; see the module doc)."""
    beam = result.beam
    u = beam.system
    L, A = u.length, u.area
    a, d = result.state.a, beam.d
    tension = beam.tension_layers
    depth = beam.h if beam.h is not None else max(layer.depth for layer in tension)
    flange = beam.flange
    widest = max(beam.bw, flange.width) if flange is not None else beam.bw
    scale = min(_BOX_W / widest, _BOX_H / depth)
    centre = _LEFT + _BOX_W / 2

    def x(offset: float) -> float:
        return centre + offset * scale

    def y(below_top: float) -> float:
        return _TOP + below_top * scale

    half_w = beam.bw / 2
    if flange is None:
        corners = [(-half_w, 0), (half_w, 0), (half_w, depth), (-half_w, depth)]
    else:
        half_f, hf = flange.width / 2, min(flange.thickness, depth)
        corners = [(-half_f, 0), (half_f, 0), (half_f, hf), (half_w, hf), (half_w, depth),
                   (-half_w, depth), (-half_w, hf), (-half_f, hf)]
    points = " ".join(f"{x(px):.1f},{y(py):.1f}" for px, py in corners)
    parts = [f'<polygon points="{points}" fill="#f4f4f4" stroke="none"/>']

    # The compression block: flange only, flange and web, or web; cut at h.
    block = min(a, depth)
    if flange is None or block <= flange.thickness:
        top_half = half_w if flange is None else flange.width / 2
        parts.append(f'<rect data-part="block" x="{x(-top_half):.1f}" y="{y(0):.1f}" '
                     f'width="{2 * top_half * scale:.1f}" height="{block * scale:.1f}" '
                     f'fill="#c8c8c8"/>')
    else:
        block_corners = [(-flange.width / 2, 0), (flange.width / 2, 0),
                         (flange.width / 2, flange.thickness), (half_w, flange.thickness),
                         (half_w, block), (-half_w, block), (-half_w, flange.thickness),
                         (-flange.width / 2, flange.thickness)]
        block_points = " ".join(f"{x(px):.1f},{y(py):.1f}" for px, py in block_corners)
        parts.append(f'<polygon data-part="block" points="{block_points}" fill="#c8c8c8"/>')

    # The outline: solid, but a dashed bottom where h is not given (drawn to the steel).
    start = corners.index((half_w, depth))  # from the bottom right, round to the bottom left
    sides = [corners[(start - k) % len(corners)] for k in range(len(corners))]
    side_points = " ".join(f"{x(px):.1f},{y(py):.1f}" for px, py in sides)
    parts.append(f'<polyline points="{side_points}" fill="none" stroke="#111" '
                 f'stroke-width="1.2"/>')
    bottom = (' stroke-dasharray="4 3"' if beam.h is None else "")
    parts.append(f'<line data-part="bottom" x1="{x(-half_w):.1f}" y1="{y(depth):.1f}" '
                 f'x2="{x(half_w):.1f}" y2="{y(depth):.1f}" stroke="#111" '
                 f'stroke-width="1.2"{bottom}/>')

    # Steel: each layer a bar line across the web at its depth, labelled on the right.
    labels: list[tuple[float, str, float, float]] = []  # (wanted y, text, end x, layer y)
    right = x(widest / 2)
    count = 0
    for layer in beam.layers:
        compression = layer.role is Role.COMPRESSION
        inset = 0.12 * beam.bw  # the bars sit inside the web, clear of its faces
        x1, x2, ly = x(-half_w + inset), x(half_w - inset), y(layer.depth)
        colour = "#444" if compression else "#111"
        if compression:
            name = f"A′s = {_given(layer.area, A)} at d′ = {_given(layer.depth, L)}"
        else:
            count += 1
            name = (f"As = {_given(layer.area, A)}" if len(tension) == 1 else
                    f"As,{count} = {_given(layer.area, A)} at {_given(layer.depth, L)}")
        parts.append(f'<line data-part="steel" data-role="{layer.role.value}" '
                     f'data-depth="{format_number(layer.depth)}" '
                     f'data-area="{format_number(layer.area)}" x1="{x1:.1f}" y1="{ly:.1f}" '
                     f'x2="{x2:.1f}" y2="{ly:.1f}" stroke="{colour}" stroke-width="3.2" '
                     f'stroke-linecap="round"/>')
        labels.append((ly, name, x2, ly))
    labels.append((y(block / 2), f"a = {_found(a, L)}" + (" (cut at h)" if a > depth else ""),
                   right, y(block / 2)))
    labels.sort()
    label_x = right + 18
    for (wanted, words, end_x, line_y), at in zip(labels, _spread([w for w, *_ in labels],
                                                                  _LINE)):
        parts.append(f'<line x1="{end_x + 2:.1f}" y1="{line_y:.1f}" x2="{label_x - 2:.1f}" '
                     f'y2="{at - 3:.1f}" stroke="#888" stroke-width="0.5"/>')
        parts.append(_text(label_x, at, words))

    # The a dimension: a tick line beside the block.
    ax = right + 6
    parts.append(f'<line data-part="a" x1="{ax:.1f}" y1="{y(0):.1f}" x2="{ax:.1f}" '
                 f'y2="{y(block):.1f}" stroke="#555" stroke-width="0.8"/>')

    # Vertical dimensions on the left: h outermost (when given), d inside it.
    left = x(-widest / 2)
    d_text = _given(d, L) if len(tension) == 1 else _found(d, L)  # one layer: d is an input
    verticals = [("d", d, f"d = {d_text}", left - 10)]
    if beam.h is not None:
        verticals.append(("h", beam.h, f"h = {_given(beam.h, L)}", left - 26))
    for key, extent, words, vx in verticals:
        y0, y1 = y(0), y(extent)
        parts.append(f'<line data-part="{key}" x1="{vx:.1f}" y1="{y0:.1f}" x2="{vx:.1f}" '
                     f'y2="{y1:.1f}" stroke="#555" stroke-width="0.8"/>')
        for end in (y0, y1):
            parts.append(f'<line x1="{vx - 3:.1f}" y1="{end:.1f}" x2="{vx + 3:.1f}" '
                         f'y2="{end:.1f}" stroke="#555" stroke-width="0.8"/>')
        mid = (y0 + y1) / 2
        parts.append(_text(vx - 3, mid, words, "middle",
                           f' transform="rotate(-90 {vx - 3:.1f} {mid:.1f})"'))

    # Horizontal dimensions: b (bw) below, bf above.
    below = y(depth) + 12
    parts.append(f'<line data-part="b" x1="{x(-half_w):.1f}" y1="{below:.1f}" '
                 f'x2="{x(half_w):.1f}" y2="{below:.1f}" stroke="#555" stroke-width="0.8"/>')
    width_name = "b" if flange is None else "bw"
    parts.append(_text(centre, below + 10, f"{width_name} = {_given(beam.bw, L)}", "middle"))
    if flange is not None:
        above = y(0) - 8
        parts.append(f'<line data-part="bf" x1="{x(-flange.width / 2):.1f}" y1="{above:.1f}" '
                     f'x2="{x(flange.width / 2):.1f}" y2="{above:.1f}" stroke="#555" '
                     f'stroke-width="0.8"/>')
        parts.append(_text(centre, above - 4, f"bf = {_given(flange.width, L)}, "
                                              f"hf = {_given(flange.thickness, L)}", "middle"))
    if beam.h is None:
        parts.append(_text(centre, below + 20, "h not given: drawn to the deepest steel",
                           "middle", ' fill="#555"'))
    last_label = _spread([w for w, *_ in labels], _LINE)[-1]
    height = max(below + 26, last_label + 6)
    label = html.escape(f"Section sketch to scale, {u.length}")
    return (f'<svg class="section-sketch" viewBox="0 0 {_WIDTH:g} {height:.1f}" role="img" '
            f'aria-label="{label}" data-scale="{scale:.6g}" data-top="{_TOP:g}">'
            f'{"".join(parts)}</svg>')
