"""Where the tension bars sit: layers, effective depths d and dt, clear spacing.

Bars lie in one or two horizontal layers inside the stirrup, the bottom
layer at clear cover plus stirrup diameter from the tension face. Bars of an
upper layer sit directly above bars of the bottom layer, a clear distance
apart (ACI 318-19 25.2.2), so an upper layer never holds more bars than the
bottom one; it may hold a single bar (25.2.2 sets no least number). d is
measured to the centroid of the bars actually placed, dt to the centre of
the bottom layer; each layer keeps its own depth, so the check can give each
its own strain (22.2.1.2).

Corner bars are taken to bear on the straight legs of the stirrup; the extra
room that a stirrup bend of small radius takes from a large corner bar is
not modelled (a common textbook simplification). All lengths are in the
section's base units (in or mm).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..section.bars import Bar

MIN_BARS_PER_LAYER = 2
"""A bar in each bottom corner of the stirrup (common practice, and each stirrup
bend must enclose a longitudinal bar, ACI 318-19 25.7.1.3)."""

MIN_BARS_UPPER_LAYER = 1
"""An upper layer needs no corner bars: ACI 318-19 25.2.2 asks only that its bars sit
directly above bars of the bottom layer, at least 1 in (25 mm) clear of them."""

# Spacings computed at a rule's edge can land a few ulps short of it.
_FIT_TOLERANCE = 1e-9


@dataclass(frozen=True)
class Arrangement:
    """`per_layer` bars of one size, bottom layer first; lengths from the top fibre."""

    bar: Bar
    per_layer: tuple[int, ...]
    layer_depths: tuple[float, ...]  # depth of each layer's bar centres, bottom layer first
    clear_spacing: float  # clear distance between adjacent bars of the bottom layer
    centre_spacing: float  # centre-to-centre spacing of the bottom layer (for 24.3.2)
    layer_gap: float  # clear distance between layers (0 for one layer)

    @property
    def count(self) -> int:
        return sum(self.per_layer)

    @property
    def layers(self) -> int:
        return len(self.per_layer)

    @property
    def As(self) -> float:
        return self.count * self.bar.area

    @property
    def dt(self) -> float:
        """Depth to the extreme tension layer (the bottom one)."""
        return self.layer_depths[0]

    @property
    def steel_layers(self) -> tuple[tuple[float, float], ...]:
        """(area, depth) of each layer, bottom first: the `layers` of `engine.check`."""
        return tuple((n * self.bar.area, y) for n, y in zip(self.per_layer, self.layer_depths))

    @property
    def d(self) -> float:
        """Depth to the centroid of the bars placed."""
        centroid = sum(n * y for n, y in zip(self.per_layer, self.layer_depths)) / self.count
        return min(centroid, self.dt)  # never an ulp below dt: `check` requires d ≤ dt


def side_cover(cover: float, stirrup: Bar) -> float:
    """Distance from a face of the beam to the nearest face of a longitudinal bar."""
    return cover + stirrup.db


def clear_spacing(b: float, cover: float, stirrup: Bar, bar: Bar, count: int) -> float:
    """Clear distance between `count` ≥ 2 bars spread evenly across the stirrup."""
    inside = b - 2 * side_cover(cover, stirrup)
    return (inside - count * bar.db) / (count - 1)


def bars_that_fit(b: float, cover: float, stirrup: Bar, bar: Bar, s_min: float) -> int:
    """The most bars of one layer whose clear spacing is at least `s_min` (may be < 2)."""
    inside = b - 2 * side_cover(cover, stirrup)
    count = math.floor((inside + s_min) / (bar.db + s_min) + _FIT_TOLERANCE)
    return max(count, 0)


def arrange(*, b: float, h: float, cover: float, stirrup: Bar, bar: Bar,
            per_layer: tuple[int, ...], layer_gap: float) -> Arrangement:
    """The arrangement of `per_layer` bars (bottom first, each ≥ 2) in a b × h section.

    dt = h − cover − stirrup diameter − db/2; each upper layer sits db +
    `layer_gap` higher (clear distance between layers, ACI 318-19 25.2.2).
    Inputs are trusted (validated by the caller).
    """
    first = h - side_cover(cover, stirrup) - bar.db / 2
    depths = tuple(first - i * (bar.db + layer_gap) for i in range(len(per_layer)))
    bottom = per_layer[0]
    spacing = clear_spacing(b, cover, stirrup, bar, bottom)
    return Arrangement(bar=bar, per_layer=tuple(per_layer), layer_depths=depths,
                       clear_spacing=spacing, centre_spacing=spacing + bar.db,
                       layer_gap=layer_gap if len(per_layer) > 1 else 0.0)


def distributions(count: int, fits: int, max_layers: int) -> tuple[tuple[int, ...], ...]:
    """Ways to place `count` bars when at most `fits` go in one layer.

    One layer when the bars fit in it; otherwise every split between two
    layers, the fullest bottom layer first: the bottom holding at least 2
    (its corners) and at least as many as the upper one (bars directly above
    bars, 25.2.2), the upper at least 1. Empty when no such placement exists.
    """
    if count < MIN_BARS_PER_LAYER:
        return ()
    if count <= fits:
        return ((count,),)
    if max_layers < 2:
        return ()
    fullest = min(fits, count - MIN_BARS_UPPER_LAYER)
    least = max(MIN_BARS_PER_LAYER, (count + 1) // 2)
    return tuple((bottom, count - bottom) for bottom in range(fullest, least - 1, -1))


def nearest_distribution(count: int, max_layers: int) -> tuple[int, ...]:
    """The placement that needs the least width, for reporting an arrangement that does not fit."""
    count = max(count, MIN_BARS_PER_LAYER)
    if max_layers < 2 or count <= MIN_BARS_PER_LAYER:
        return (count,)
    return ((count + 1) // 2, count // 2)


def fits_within(spacing: float, s_min: float) -> bool:
    """Clear spacing at least `s_min`, with a rounding allowance at the edge."""
    return spacing >= s_min - _FIT_TOLERANCE * max(1.0, abs(s_min))
