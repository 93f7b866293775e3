"""The neutral-axis depth c by strain compatibility and force equilibrium.

Strains are linear in depth with εcu = 0.003 at the compression face
(22.2.1.2, 22.2.2.1): ε(y) = εcu·(c − y)/c, compression positive. Each
layer carries As·fs with fs = Es·ε capped at ±fy (20.2.2.1); a layer inside
the block also displaces concrete, so it carries (fs − 0.85 f'c)·As, as is
common practice in ACI-based texts. The net axial force N(c) must vanish.

N(c) rises with c everywhere except where the block edge passes a layer and
its displaced concrete is deducted: a step down. So the solver walks the
intervals between those steps, takes the first in which N changes sign,
and closes in on the root there by Newton steps kept inside a shrinking
bracket, falling back to bisection whenever a step would leave the bracket
or stalls: so it always converges, and for yielded steel (where N is linear
in c) it lands on the root in one step.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..section.beam import BeamSection
from ..section.materials import BLOCK_STRESS_FACTOR, EPS_CU, steel_stress
from .stress_block import block_force, block_width

RELATIVE_FORCE_TOLERANCE = 1e-13  # of the largest force the steel could carry
_MAX_ITERATIONS = 200


@dataclass(frozen=True)
class Equilibrium:
    """The root found: c, the net force left there and the iterations used."""

    c: float
    residual: float
    iterations: int


def in_block(depth: float, c: float, beta1: float, *, edge_inside: bool = False) -> bool:
    """Whether a layer at `depth` lies within the block a = β1·c.

    Written as depth/β1 against c so that at a step (c = depth/β1, the same
    expression) the answer is exact; `edge_inside` picks the side of the step.
    """
    step = depth / beta1
    return step <= c if edge_inside else step < c


def layer_force(section: BeamSection, depth: float, area: float, c: float, inside: bool) -> float:
    """Force in one layer at neutral-axis depth c, compression positive."""
    stress = steel_stress(EPS_CU * (c - depth) / c, section.fy, section.es)
    if inside:  # the bar stands where the block's concrete was counted
        stress -= BLOCK_STRESS_FACTOR * section.fc
    return area * stress


def net_force_and_slope(section: BeamSection, c: float, beta1: float, *,
                        edge_inside: bool = False) -> tuple[float, float]:
    """N(c), the block's force plus every layer's (compression positive), and dN/dc.

    The solver's inner loop: `layer_force` written out, with its constants hoisted.
    """
    a = beta1 * c
    displaced = BLOCK_STRESS_FACTOR * section.fc
    total = block_force(section, a)[0]
    slope = displaced * beta1 * block_width(section, a)
    fy, stiffness = section.fy, section.es * EPS_CU / c  # stress per unit of (c − depth)
    for layer in section.layers:
        stress = stiffness * (c - layer.depth)
        if stress > fy:
            stress = fy
        elif stress < -fy:
            stress = -fy
        else:
            slope += layer.area * stiffness * layer.depth / c
        if in_block(layer.depth, c, beta1, edge_inside=edge_inside):
            stress -= displaced
        total += layer.area * stress
    return total, slope


def net_force(section: BeamSection, c: float, beta1: float, *, edge_inside: bool = False) -> float:
    """N(c) alone."""
    return net_force_and_slope(section, c, beta1, edge_inside=edge_inside)[0]


def solve_neutral_axis(section: BeamSection, beta1: float, *,
                       above: float | None = None) -> Equilibrium:
    """The smallest c with N(c) = 0, to `RELATIVE_FORCE_TOLERANCE`.

    With `above`, a step where N(above+) < 0, the smallest root past it
    (`later_equilibrium` looks for one).
    """
    steel_capacity = section.fy * sum(layer.area for layer in section.layers)
    tolerance = RELATIVE_FORCE_TOLERANCE * steel_capacity
    if above is None:
        lower, f_lower = 0.0, -steel_capacity  # as c → 0 every layer yields in tension
    else:
        lower, f_lower = above, net_force(section, above, beta1, edge_inside=True)
    upper = max(section.dt, 2 * lower)
    f_upper = net_force(section, upper, beta1)
    while f_upper < 0:  # as c grows all steel turns to compression, so this ends
        upper *= 2
        f_upper = net_force(section, upper, beta1)
    steps = sorted({layer.depth / beta1 for layer in section.layers})
    for edge in [step for step in steps if lower < step < upper] + [upper]:
        f_edge = f_upper if edge == upper else net_force(section, edge, beta1)
        if f_edge >= 0:
            return _safeguarded_newton(section, beta1, lower, f_lower, edge, f_edge, tolerance)
        lower, f_lower = edge, net_force(section, edge, beta1, edge_inside=True)
    raise AssertionError("unreachable: N(upper) >= 0 by construction")


def later_equilibrium(section: BeamSection, beta1: float, c: float) -> float | None:
    """A second c with N(c) = 0 past the root `c`, or None.

    N rises between its steps, so past the first root it can return to zero
    only after a step drops it below zero: a layer (usually A's) entering the
    block as c grows, its displaced concrete deducted. Then N rises again to
    a second root.
    """
    steps = sorted({layer.depth / beta1 for layer in section.layers})
    for step in steps:
        if step > c and net_force(section, step, beta1, edge_inside=True) < 0:
            # With h given the block stops growing at a = h, so N can stay below zero
            # for every deeper c (bars of more area than the concrete they displace from).
            far = 1e6 * steps[-1]
            if net_force(section, far, beta1) < 0:
                return None
            return solve_neutral_axis(section, beta1, above=step).c
    return None


def _safeguarded_newton(section: BeamSection, beta1: float, low: float, f_low: float,
                        high: float, f_high: float, tolerance: float) -> Equilibrium:
    """Root of N in (low, high], where N(low+) = f_low < 0 ≤ f_high = N(high)."""
    if f_high <= tolerance:
        return Equilibrium(high, f_high, 0)
    c = (low * f_high - high * f_low) / (f_high - f_low)  # first guess: the chord
    if not low < c < high:  # the chord underflowed (a vanishingly small steel area)
        c = 0.5 * (low + high)
    last_step = high - low
    for iteration in range(1, _MAX_ITERATIONS + 1):
        f, slope = net_force_and_slope(section, c, beta1)
        if abs(f) <= tolerance:
            return Equilibrium(c, f, iteration)
        if f < 0:
            low = c
        else:
            high = c
        if high - low <= 4e-16 * high:
            return Equilibrium(c, f, iteration)
        step = f / slope if slope > 0 else 0.0
        guess = c - step
        if not low < guess < high or abs(step) > 0.5 * last_step:
            guess = 0.5 * (low + high)  # bisection: the bracket halves
            step = c - guess
            if not low < guess < high:  # the bracket is as narrow as floats allow
                return Equilibrium(c, f, iteration)
        c, last_step = guess, abs(step)
    return Equilibrium(c, f, _MAX_ITERATIONS)
