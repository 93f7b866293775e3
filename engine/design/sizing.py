"""Design from demand: the tension steel for Mu, and bar arrangements that fit.

`design_section` takes a trial rectangular section (b, h), its materials, the
factored moment Mu, the clear cover, the stirrup and the aggregate size, and
returns a `DesignResult`:

* the least As for Mu with φ consistent with the strain it produces (ACI
  318-19 Table 21.2.2) and εt ≥ 0.004 (9.3.3.1), or a plain statement that no
  singly reinforced section of these dimensions reaches Mu within that limit,
  with the largest φMn it does reach and the usual ways out;
* for each standard bar size, the fewest bars that meet every rule, in one
  layer or, when they do not fit in one, in two (25.2.2; every split is
  tried, the upper layer may hold a single bar), each with its real d and
  dt, φMn and εt from the engine's check, and the rules it breaks;
* the options ranked in the order asked for (`Order`: "practical", the
  default, or "lightest"), with the lightest passing one always marked
  (`DesignResult.lightest`);
* the detailing checks of any option (`DesignResult.detailing`).

As,min is that of 9.6.1.2 unless the design allows the 9.6.1.3 waiver
(As ≥ 4/3 As,req); an option that passes only by the waiver says so
(`BarOption.min_steel_waived`).

Inputs and results are in the base units of the chosen system (psi, in, in²
or MPa, mm, mm²), moments in kip·ft or kN·m.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from enum import Enum

from ..mechanics.root_finding import least_root_from_above
from ..provisions.checks import CAUTION, CodeCheck, check_beam
from ..provisions.detailing import (DEFAULT_AGGREGATE, Exposure, Support, maximum_bar_spacing,
                                    minimum_clear_spacing, minimum_cover, minimum_depth, minimum_layer_gap,
                                    minimum_steel_area, minimum_steel_satisfied, service_stress,
                                    skin_depth_limit, skin_reinforcement_required)
from ..provisions.limits import EPS_T_BEAM_MINIMUM, steel_for_strain
from ..provisions.required_steel import design_moment, required_steel
from ..provisions.strength_reduction import TENSION_CONTROL_MARGIN
from ..section.bars import (DEFAULT_STIRRUP, STIRRUP_NUMBERS, Bar, bar as standard_bar,
                            bars as standard_bars_in)
from ..section.bars import standard_bars
from ..section.beam import BeamSection, SteelLayer
from ..section.errors import InputError
from ..section.materials import yield_strain
from ..section.units import UnitSystem, unit_system
from ..section.validation import hard_maximum, in_range
from .arrangement import (Arrangement, arrange, bars_that_fit, clear_spacing, distributions, fits_within,
                          nearest_distribution, side_cover)

_MAX_LAYERS = 2
_MAX_BARS = 400  # a search bound far past any beam's bar count
_GOLDEN_STEPS = 60

AREA_TIE = 0.005
"""Steel areas within this relative difference rank as equal (0.5 %): bar areas are
tabulated to two or three figures (ASTM A615/A615M Table 1), so 13 #7 (7.80 in²) and
5 #11 (7.80 in²) differ only by float noise, and the ranking rule, not the noise,
must decide between them."""

PRACTICAL_MARGIN = 0.10
"""In the practical order, passing options within 10 % of the lightest area rank as
equal in area, so fewer bars decide among them (common practice: a little more steel
is worth fewer bars to place)."""


class Order(str, Enum):
    """How the passing options are ranked."""

    PRACTICAL = "practical"  # fewer layers, then fewer bars among areas near the lightest, then area
    LIGHTEST = "lightest"  # least steel area, then fewer bars, then fewer layers


@dataclass(frozen=True)
class FailedRule:
    """A rule an arrangement breaks: its ACI 318-19 clause and a plain message."""

    clause: str
    message: str


@dataclass(frozen=True)
class DesignSection:
    """Validated inputs of one design, in the base units of `system`."""

    system: UnitSystem
    fc: float
    fy: float
    es: float
    b: float
    h: float
    Mu: float  # kip·ft or kN·m
    cover: float  # clear cover to the stirrup, Table 20.5.1.3.1
    stirrup: Bar
    aggregate: float  # nominal maximum aggregate size, 25.2.1
    max_layers: int
    layer_gap: float  # clear distance between layers, 25.2.2
    exposure: Exposure
    fs: float  # service stress in the bars for 24.3.2
    span: float | None
    support: Support | None
    bars: tuple[Bar, ...]  # the sizes to try
    order: Order = Order.PRACTICAL
    waive_as_min: bool = False  # allow 9.6.1.3: As ≥ 4/3 As,req in place of As,min

    def beam(self, layers: tuple[tuple[float, float], ...]) -> BeamSection:
        """The section with tension `layers` of (area, depth), the deepest giving dt."""
        steel = tuple(SteelLayer(area, depth) for area, depth in layers)
        return BeamSection(system=self.system, fc=self.fc, fy=self.fy, es=self.es, bw=self.b,
                           layers=steel, dt=max(depth for _, depth in layers), h=self.h)

    def arranged_beam(self, arrangement: Arrangement) -> BeamSection:
        """The section with `arrangement`'s bars, each layer at its own depth (22.2.1.2)."""
        return self.beam(arrangement.steel_layers)

    @property
    def cc(self) -> float:
        """Clear cover of the longitudinal bars (to the tension face), for 24.3.2."""
        return side_cover(self.cover, self.stirrup)


@dataclass(frozen=True)
class BarOption:
    """One arrangement of bars of one size; lengths from the top fibre."""

    arrangement: Arrangement
    phiMn: float  # kip·ft or kN·m
    phi: float
    eps_t: float
    section_class: str
    As_min: float  # 9.6.1.2 at this d
    As_req: float | None  # least As for Mu at this d and dt (None: not reachable)
    min_clear_spacing: float  # 25.2.1
    max_bar_spacing: float  # 24.3.2
    failed_rules: tuple[FailedRule, ...]
    min_steel_waived: bool = False  # As < As,min, accepted by 9.6.1.3 (As ≥ 4/3 As,req)

    bar = property(lambda self: self.arrangement.bar)
    count = property(lambda self: self.arrangement.count)
    layers = property(lambda self: self.arrangement.layers)
    per_layer = property(lambda self: self.arrangement.per_layer)
    As = property(lambda self: self.arrangement.As)
    d = property(lambda self: self.arrangement.d)
    dt = property(lambda self: self.arrangement.dt)
    clear_spacing = property(lambda self: self.arrangement.clear_spacing)
    bar_spacing = property(lambda self: self.arrangement.centre_spacing)

    @property
    def ok(self) -> bool:
        return not self.failed_rules

    @property
    def label(self) -> str:
        """For example "4 #8" or "6 #9 (4 + 2)"."""
        size = self.bar.designation if self.bar.designation.startswith("#") else f"No. {self.bar.designation}"
        text = f"{self.count} {size}"
        return text if self.layers == 1 else f"{text} ({' + '.join(map(str, self.per_layer))})"

    def to_dict(self) -> dict:
        return {
            "bar": self.bar.designation, "count": self.count, "layers": self.layers,
            "per_layer": list(self.per_layer), "As": self.As, "d": self.d, "dt": self.dt,
            "layer_depths": list(self.arrangement.layer_depths),
            "phiMn": self.phiMn, "phi": self.phi, "eps_t": self.eps_t,
            "section_class": self.section_class,
            "clear_spacing": self.clear_spacing, "min_clear_spacing": self.min_clear_spacing,
            "bar_spacing": self.bar_spacing, "max_bar_spacing": self.max_bar_spacing,
            "As_min": self.As_min, "As_req": self.As_req, "ok": self.ok,
            "min_steel_waived": self.min_steel_waived,
            "failed_rules": [vars(rule) for rule in self.failed_rules],
        }


@dataclass(frozen=True)
class DesignResult:
    """The required steel, the bar options (in the order asked for) and what the design found."""

    section: DesignSection
    As_req: float | None  # at the best option's d and dt, or at d_deepest when none works
    As_req_d: float  # the d that As_req belongs to
    d_deepest: float  # one layer of the smallest bar tried: the deepest d possible
    phiMn_max: float  # largest φMn with εt ≥ 0.004 at d_deepest
    feasible: bool  # Mu ≤ phiMn_max
    verdict: str
    remedies: tuple[str, ...]
    options: tuple[BarOption, ...]  # ranked in `section.order`, passing ones first
    warnings: tuple[str, ...]
    lightest: BarOption | None = None  # the passing option of least As (ties: fewer bars)

    @property
    def best(self) -> BarOption | None:
        """The first option that meets every rule, or None."""
        return next((option for option in self.options if option.ok), None)

    @property
    def lightest_index(self) -> int | None:
        """The position of `lightest` in `options`, or None."""
        return None if self.lightest is None else self.options.index(self.lightest)

    def detailing(self, option: BarOption) -> tuple[CodeCheck, ...]:
        """Every check of `option`: strength and steel limits, then detailing."""
        return detailing_checks(self.section, option)

    def to_dict(self) -> dict:
        s, best = self.section, self.best
        return {
            "units": s.system.name,
            "inputs": {
                "fc": s.fc, "fy": s.fy, "es": s.es, "b": s.b, "h": s.h, "Mu": s.Mu,
                "cover": s.cover, "stirrup": s.stirrup.designation, "agg": s.aggregate,
                "layers": s.max_layers, "layer_gap": s.layer_gap, "exposure": s.exposure.value,
                "fs": s.fs, "span": s.span, "support": None if s.support is None else s.support.value,
                "bars": [b.designation for b in s.bars],
                "order": s.order.value, "waive_as_min": s.waive_as_min,
            },
            "As_req": self.As_req, "As_req_d": self.As_req_d, "d_deepest": self.d_deepest,
            "phiMn_max": self.phiMn_max, "feasible": self.feasible, "verdict": self.verdict,
            "remedies": list(self.remedies),
            "options": [dict(option.to_dict(), lightest=option is self.lightest)
                        for option in self.options],
            "best": None if best is None else self.options.index(best),
            "lightest": self.lightest_index,
            "detailing": None if best is None else [vars(c) for c in self.detailing(best)],
            "warnings": list(self.warnings),
            "caution": CAUTION,
        }


def design_section(
    *,
    units: object,
    fc: object,
    fy: object,
    b: object,
    h: object,
    Mu: object,
    cover: object | None = None,
    stirrup: object | None = None,
    agg: object | None = None,
    layers: object = _MAX_LAYERS,
    layer_gap: object | None = None,
    exposure: object = Exposure.NOT_EXPOSED.value,
    fs: object | None = None,
    es: object | None = None,
    span: object | None = None,
    support: object | None = None,
    bars: object | None = None,
    order: object = Order.PRACTICAL.value,
    waive_as_min: object = False,
) -> DesignResult:
    """Size the tension steel of a b × h section for Mu and list bar arrangements.

    `cover` is the clear cover to the stirrup (default: ACI 318-19 Table
    20.5.1.3.1 for `exposure`), `stirrup` and `bars` are ASTM A615/A615M
    designations ("#3", "10"), `agg` the nominal maximum aggregate size
    (default 3/4 in or 19 mm), `layers` the most layers allowed (1 or 2),
    `layer_gap` the clear distance between layers (default the 25.2.2 minimum),
    `fs` the service stress for 24.3.2 (default 2/3 fy), `span` and `support`
    (both or neither) the Table 9.3.1.1 guidance, `order` the ranking
    ("practical" or "lightest", see `Order`), `waive_as_min` whether 9.6.1.3
    may stand in for As,min of 9.6.1.2 (default False: As,min always). Raises
    `InputError` naming the first bad field.
    """
    return design(_validated(units=units, fc=fc, fy=fy, b=b, h=h, Mu=Mu, cover=cover,
                             stirrup=stirrup, agg=agg, layers=layers, layer_gap=layer_gap,
                             exposure=exposure, fs=fs, es=es, span=span, support=support,
                             bars=bars, order=order, waive_as_min=waive_as_min))


def design(section: DesignSection) -> DesignResult:
    """`design_section` for already validated inputs."""
    system = section.system
    Mu_base = section.Mu * system.moment_to_base
    deepest = arrange(b=section.b, h=section.h, cover=section.cover, stirrup=section.stirrup,
                      bar=section.bars[0], per_layer=(2,), layer_gap=section.layer_gap)
    d_deepest = deepest.d
    deep_beam = section.beam(((1.0, d_deepest),))
    phiMn_max_base, _ = largest_design_moment(deep_beam)
    phiMn_max = phiMn_max_base / system.moment_to_base
    feasible = phiMn_max >= section.Mu

    options = [_best_for_bar(section, bar, Mu_base) for bar in section.bars]
    options = [_with_required_steel(section, option, Mu_base) for option in options]
    lightest = next(iter(ranked(options, Order.LIGHTEST)), None)
    options = ranked(options, section.order)
    lightest = lightest if lightest is not None and lightest.ok else None
    best = next((option for option in options if option.ok), None)
    if best is not None:
        As_req, As_req_d = best.As_req, best.d
    else:
        As_req = required_steel(deep_beam, Mu_base) if feasible else None
        As_req_d = d_deepest

    verdict, remedies = _verdict(section, feasible, phiMn_max, d_deepest, best, lightest,
                                 As_req, As_req_d)
    warnings = _warnings(section, best)
    return DesignResult(section=section, As_req=As_req, As_req_d=As_req_d, d_deepest=d_deepest,
                        phiMn_max=phiMn_max, feasible=feasible, verdict=verdict,
                        remedies=remedies, options=options, warnings=warnings,
                        lightest=lightest)


def ranked(options: list[BarOption] | tuple[BarOption, ...], order: Order
           ) -> tuple[BarOption, ...]:
    """`options` in `order`: those that meet every rule first, then the rest by fewest rules broken.

    Areas within `AREA_TIE` of each other count as equal, so that the rule
    decides and not float noise. "lightest": least As, then fewer bars, then
    fewer layers. "practical": fewer layers, then, among areas within
    `PRACTICAL_MARGIN` of the lightest passing As, fewer bars; beyond that
    margin least As, then fewer bars. Failing options are always in the
    "lightest" order.
    """
    tier = _area_tiers([option.As for option in options])
    passing = [option.As for option in options if option.ok]
    near = min(passing) * (1 + PRACTICAL_MARGIN) * (1 + AREA_TIE) if passing else 0.0

    def key(index: int) -> tuple:
        option = options[index]
        if not option.ok:
            return (1, len(option.failed_rules), tier[index], option.count, option.layers, 0)
        if order is Order.LIGHTEST:
            return (0, 0, tier[index], option.count, option.layers, 0)
        beyond = option.As > near
        return (0, option.layers, beyond, tier[index] if beyond else 0, option.count,
                tier[index])

    return tuple(options[i] for i in sorted(range(len(options)), key=key))


def _area_tiers(areas: list[float]) -> list[int]:
    """A rank for each area; areas within `AREA_TIE` of the tier's least share one.

    Tiers are formed from the least area up, so equality is transitive within
    the list and the ranking stays a total order.
    """
    tiers = [0] * len(areas)
    tier, start = -1, -math.inf
    for index in sorted(range(len(areas)), key=areas.__getitem__):
        if areas[index] > start * (1 + AREA_TIE):
            tier, start = tier + 1, areas[index]
        tiers[index] = tier
    return tiers


def largest_design_moment(beam: BeamSection) -> tuple[float, float]:
    """The largest φMn (base units) with εt ≥ 0.004, and the As that gives it.

    φMn rises with As while the section is tension-controlled (φ = 0.90); in
    the transition zone φ falls as Mn rises (Table 21.2.2), so the peak lies
    between the tension-controlled limit and the 9.3.3.1 limit: for Grade 60
    it is at εt = 0.004, for high-strength bars it can be at the
    tension-controlled limit. A golden-section search over that interval
    finds it.
    """
    eps_ty = yield_strain(beam.fy, beam.es)
    As_max = steel_for_strain(beam, EPS_T_BEAM_MINIMUM)
    As_tc = min(steel_for_strain(beam, eps_ty + TENSION_CONTROL_MARGIN), As_max)

    def moment(As: float) -> float:
        return design_moment(beam, As)

    low, high = As_tc, As_max
    ratio = (math.sqrt(5) - 1) / 2
    x1, x2 = high - ratio * (high - low), low + ratio * (high - low)
    f1, f2 = moment(x1), moment(x2)
    for _ in range(_GOLDEN_STEPS):
        if f1 < f2:
            low, x1, f1 = x1, x2, f2
            x2 = low + ratio * (high - low)
            f2 = moment(x2)
        else:
            high, x2, f2 = x2, x1, f1
            x1 = high - ratio * (high - low)
            f1 = moment(x1)
    return max((moment(As_tc), As_tc), (moment(As_max), As_max), (max(f1, f2), 0.5 * (x1 + x2)))


def detailing_checks(section: DesignSection, option: BarOption) -> tuple[CodeCheck, ...]:
    """The engine's check of `option` (9.6.1.2/9.6.1.3, 9.3.3.1, 9.5.1.1), then its
    detailing (25.2.1, 25.2.2, 20.5.1.3.1, 24.3.2) and the section's (9.7.2.3, Table 9.3.1.1).

    Where the design does not allow the 9.6.1.3 waiver, a check that passed
    only by it is shown as the 9.6.1.2 failure it is in this design."""
    arrangement = option.arrangement
    result = check_beam(section.arranged_beam(arrangement), section.Mu)
    checks = tuple(check if section.waive_as_min or check.clause != "9.6.1.3"
                   else _waiver_refused(section, option) for check in result.checks)
    return (checks + _arrangement_checks(section, arrangement, option.min_clear_spacing,
                                         option.max_bar_spacing)
            + _section_checks(section))


def _waiver_refused(section: DesignSection, option: BarOption) -> CodeCheck:
    """9.6.1.2 failed: As < As,min, and the design does not allow 9.6.1.3 to waive it."""
    area = section.system.area
    return CodeCheck("9.6.1.2", "As ≥ As,min", False,
                     f"As = {option.As:.4g} {area} < As,min = {option.As_min:.4g} {area}; "
                     f"9.6.1.3 (As ≥ 4/3 As,req) would waive it, but this design does not "
                     f"allow the waiver")


def _best_for_bar(section: DesignSection, bar: Bar, Mu_base: float) -> BarOption:
    """The fewest bars of `bar` that meet every rule; if none do, the nearest miss.

    Counts start at the least that could carry Mu at the one-layer depth
    (no arrangement of this bar is deeper) and rise until an arrangement
    works, the bars no longer fit, or εt drops below 0.004 (more steel only
    lowers it: dt is the same for every count of one bar size).

    The work is bounded by what could pass. Once the nearest miss is settled
    (the first count strong enough), counts that no rule lets pass are
    skipped: fewer bars than crack control (24.3.2) or As,min (9.6.1.2, or
    4/3 As,req by 9.6.1.3 where the design allows it) need, more than fit (25.2.1, 25.2.2), and every
    count when the cover (Table 20.5.1.3.1) fails for this bar. Layouts that
    a count-free rule already fails are not analysed.
    """
    s_min = minimum_clear_spacing(section.system, bar.db, section.aggregate)
    s_max = maximum_bar_spacing(section.system, section.fs, section.cc)
    fits = bars_that_fit(section.b, section.cover, section.stirrup, bar, s_min)
    one_layer = arrange(b=section.b, h=section.h, cover=section.cover, stirrup=section.stirrup,
                        bar=bar, per_layer=(2,), layer_gap=section.layer_gap)
    As_lower = required_steel(section.arranged_beam(one_layer), Mu_base)
    start = 2 if As_lower is None else max(2, math.ceil(As_lower / bar.area - 1e-9))

    def head_of(count: int) -> tuple[BarOption, tuple[tuple[int, ...], ...]]:
        """The first layout's option (the one the nearest miss is judged by) and all layouts."""
        layouts = distributions(count, fits, section.max_layers)
        shown = layouts or (nearest_distribution(count, section.max_layers),)
        return _evaluate(section, bar, shown[0], s_min, s_max), layouts

    if As_lower is None:
        return _nearest_miss_out_of_reach(section, start, lambda count: head_of(count)[0])
    cover_ok = _cover_ok(section, bar)
    most = fits if section.max_layers < 2 else 2 * fits  # the most bars that can be placed
    # As,min (9.6.1.2) is least at the shallowest d of any arrangement: the upper layer's.
    d_low = one_layer.dt - (bar.db + section.layer_gap if section.max_layers > 1 else 0.0)
    As_min_low = minimum_steel_area(section.system, section.fc, section.fy, section.b,
                                    max(d_low, 0.0))
    fewest = _fewest_that_could_pass(section, bar, fits, s_max, As_lower, As_min_low)
    first_strong = last_within = last = None
    count = start
    while count < start + _MAX_BARS:
        head, layouts = head_of(count)
        if head.ok:
            return head
        if cover_ok and _shallower_could_pass(head, As_min_low):
            for layout in layouts[1:]:
                if _layout_could_pass(section, bar, layout, s_max):
                    option = _evaluate(section, bar, layout, s_min, s_max)
                    if option.ok:
                        return option
        last = head
        within = head.eps_t >= EPS_T_BEAM_MINIMUM
        if within:
            last_within = head
        if first_strong is None and head.phiMn >= section.Mu:
            first_strong = head
        # A count with no layout can be followed by one that splits into two layers
        # (3 bars that do not fit one layer, then 2 + 2): stop only past the most that fit.
        if not within or (not layouts and first_strong is not None and count >= most):
            break
        if first_strong is None:
            count += 1
            continue
        # The nearest miss is settled: only an arrangement that passes can change the answer.
        if not cover_ok or fewest is None or max(count + 1, fewest) > most:
            break
        count = max(count + 1, fewest)
    return first_strong or last_within or last


def _nearest_miss_out_of_reach(section: DesignSection, start: int, head_of) -> BarOption:
    """The nearest miss of one bar size when Mu is out of reach within εt ≥ 0.004.

    No count then carries Mu with εt ≥ 0.004 (none does at the deepest, one-layer
    depth), so none passes: the answer is the most bars with εt ≥ 0.004, or the
    first count past that if it carries Mu, as a count-by-count search finds it.
    εt falls as bars are added, so the last count within 9.3.3.1 is found by
    bisection.
    """
    low, high = start, start + _MAX_BARS - 1
    first = head_of(low)
    if first.eps_t < EPS_T_BEAM_MINIMUM:
        return first
    top = head_of(high)
    if top.eps_t >= EPS_T_BEAM_MINIMUM:
        return top
    within, beyond = first, top
    while high - low > 1:  # head_of(low) within 9.3.3.1, head_of(high) not
        middle = (low + high) // 2
        option = head_of(middle)
        if option.eps_t >= EPS_T_BEAM_MINIMUM:
            low, within = middle, option
        else:
            high, beyond = middle, option
    return beyond if beyond.phiMn >= section.Mu else within


def _shallower_could_pass(head: BarOption, As_min_low: float) -> bool:
    """Whether a layout with fewer bars at the bottom could pass where `head` fails.

    The same bars placed higher carry less (9.5.1.1) and need more steel for Mu
    (so 9.6.1.3 waives no more); only As,min falls with d (9.6.1.2), and εt
    (9.3.3.1), crack control and the layer gap are judged layout by layout.
    """
    failed = {rule.clause for rule in head.failed_rules}
    if failed & {"9.5.1.1", "20.5.1.3.1", "25.2.1"}:
        return False
    return "9.6.1.2" not in failed or head.As >= As_min_low


def _fewest_that_could_pass(section: DesignSection, bar: Bar, fits: int, s_max: float,
                            As_lower: float, As_min_low: float) -> int | None:
    """A count below which no arrangement of `bar` meets every rule; None if none can.

    Crack control (24.3.2) needs bottom-layer spacing (inside − db)/(n − 1) ≤ s;
    As,min (9.6.1.2) is least at the shallowest d any arrangement has (the upper
    layer's depth), and, where the design allows 9.6.1.3, its 4/3 As,req is at
    least 4/3 of As,req at the deepest, one-layer depth. Both are lower bounds,
    so no passing count is lost.
    """
    if s_max <= 0:
        return None
    inside = section.b - 2 * side_cover(section.cover, section.stirrup)
    crack = max(2, math.ceil(1 + (inside - bar.db) / (s_max * (1 + 1e-9))) - 1)
    if crack > fits:
        return None
    least = min(As_min_low, 4.0 / 3.0 * As_lower) if section.waive_as_min else As_min_low
    steel = math.floor(least / bar.area)
    return max(crack, steel, 2)


def _cover_ok(section: DesignSection, bar: Bar) -> bool:
    """Table 20.5.1.3.1 for the stirrup and for `bar`: the same for every count."""
    u = section.system
    return (fits_within(section.cover, minimum_cover(u, section.exposure, section.stirrup))
            and fits_within(section.cc, minimum_cover(u, section.exposure, bar)))


def _crack_spacing_ok(spacing: float, s_max: float) -> bool:
    """Table 24.3.2: spacing of the bars nearest the tension face at most s."""
    return spacing <= s_max * (1 + 1e-9)


def _layout_could_pass(section: DesignSection, bar: Bar, layout: tuple[int, ...],
                       s_max: float) -> bool:
    """Whether `layout` meets the rules that need no analysis: 25.2.2 and 24.3.2."""
    if len(layout) > 1 and not fits_within(section.layer_gap, minimum_layer_gap(section.system)):
        return False
    spacing = clear_spacing(section.b, section.cover, section.stirrup, bar, layout[0]) + bar.db
    return _crack_spacing_ok(spacing, s_max)


def _evaluate(section: DesignSection, bar: Bar, layout: tuple[int, ...], s_min: float,
              s_max: float) -> BarOption:
    arrangement = arrange(b=section.b, h=section.h, cover=section.cover, stirrup=section.stirrup,
                          bar=bar, per_layer=layout, layer_gap=section.layer_gap)
    beam = section.arranged_beam(arrangement)
    result = check_beam(beam)
    state = result.state
    u = section.system
    rules = []
    if result.phiMn < section.Mu:
        rules.append(FailedRule("9.5.1.1", f"φMn = {result.phiMn:.4g} {u.moment} is less than "
                                           f"Mu = {section.Mu:.4g} {u.moment}"))
    if state.eps_t < EPS_T_BEAM_MINIMUM:
        rules.append(FailedRule("9.3.3.1", f"εt = {state.eps_t:.5f} is below 0.004: too much "
                                           f"tension steel for a beam"))
    As_min = result.limits.As_min.value
    As_req = None
    waived = False
    if arrangement.As < As_min:
        below = f"As = {arrangement.As:.4g} {u.area} is below As,min = {As_min:.4g} {u.area}"
        if section.waive_as_min:
            As_req = required_steel(beam, section.Mu * u.moment_to_base)
            waived = minimum_steel_satisfied(arrangement.As, As_min, As_req)
            if not waived:
                rules.append(FailedRule("9.6.1.2", f"{below}, and below 4/3 of the As "
                                                   f"required (9.6.1.3)"))
        else:
            rules.append(FailedRule("9.6.1.2", f"{below} (the 9.6.1.3 waiver, As ≥ 4/3 As,req, "
                                               f"is not allowed in this design)"))
    rules += [FailedRule(check.clause, check.detail) for check in
              _arrangement_checks(section, arrangement, s_min, s_max) if not check.passed]
    return BarOption(arrangement=arrangement, phiMn=result.phiMn, phi=state.phi,
                     eps_t=state.eps_t, section_class=state.section_class.value, As_min=As_min,
                     As_req=As_req, min_clear_spacing=s_min, max_bar_spacing=s_max,
                     failed_rules=tuple(rules), min_steel_waived=waived and not rules)


def _with_required_steel(section: DesignSection, option: BarOption, Mu_base: float) -> BarOption:
    if option.As_req is not None:  # found already, for 9.6.1.3, at this very arrangement
        return option
    a = option.arrangement
    return replace(option, As_req=required_steel(section.arranged_beam(a), Mu_base))


def _arrangement_checks(section: DesignSection, arrangement: Arrangement, s_min: float,
                        s_max: float) -> tuple[CodeCheck, ...]:
    u = section.system
    L = u.length
    bar = arrangement.bar
    spacing = arrangement.clear_spacing
    layout = " + ".join(map(str, arrangement.per_layer))
    where = "one layer" if arrangement.layers == 1 else f"two layers ({layout})"
    checks = [CodeCheck(
        "25.2.1", "clear spacing of bars in a layer", fits_within(spacing, s_min),
        f"{arrangement.count} {bar.designation} in {where}: clear spacing {spacing:.3g} {L} "
        f"{'≥' if fits_within(spacing, s_min) else '<'} {s_min:.3g} {L} (the largest of "
        f"{minimum_clear_spacing(u, 0.0, 0.0):g} {L}, db = {bar.db:g} {L} and 4/3 × "
        f"{section.aggregate:g} {L} aggregate)")]
    if arrangement.layers > 1:
        gap_min = minimum_layer_gap(u)
        passed = fits_within(arrangement.layer_gap, gap_min)
        checks.append(CodeCheck(
            "25.2.2", "clear distance between layers", passed,
            f"{arrangement.layer_gap:.3g} {L} {'≥' if passed else '<'} {gap_min:g} {L}; upper bars "
            f"directly above the bottom ones"))
    cover_stirrup = minimum_cover(u, section.exposure, section.stirrup)
    cover_bar = minimum_cover(u, section.exposure, bar)
    passed = _cover_ok(section, bar)
    checks.append(CodeCheck(
        "20.5.1.3.1", "specified concrete cover", passed,
        f"stirrup {section.stirrup.designation}: {section.cover:.3g} {L} "
        f"{'≥' if fits_within(section.cover, cover_stirrup) else '<'} {cover_stirrup:g} {L}; "
        f"{bar.designation} bars: {section.cc:.3g} {L} "
        f"{'≥' if fits_within(section.cc, cover_bar) else '<'} {cover_bar:g} {L} "
        f"({section.exposure.value})"))
    s = arrangement.centre_spacing
    passed = _crack_spacing_ok(s, s_max)
    checks.append(CodeCheck(
        "24.3.2", "bar spacing for crack control", passed,
        f"spacing of the bars nearest the tension face {s:.3g} {L} {'≤' if passed else '>'} "
        f"{s_max:.3g} {L} (fs = {section.fs:.5g} {u.stress}, cc = {section.cc:.3g} {L})"))
    return tuple(checks)


def _section_checks(section: DesignSection) -> tuple[CodeCheck, ...]:
    u = section.system
    L = u.length
    limit = skin_depth_limit(u)
    needed = skin_reinforcement_required(u, section.h)
    if needed:
        s_skin = maximum_bar_spacing(u, section.fs, section.cc)
        detail = (f"h = {section.h:g} {L} > {limit:g} {L}: provide skin reinforcement on both "
                  f"side faces over h/2 = {section.h / 2:.3g} {L} from the tension face, spaced "
                  f"at most {s_skin:.3g} {L} (24.3.2, cc to the side face); not designed here")
    else:
        detail = f"h = {section.h:g} {L} ≤ {limit:g} {L}: no skin reinforcement needed"
    checks = [CodeCheck("9.7.2.3", "skin reinforcement", not needed, detail)]
    if section.span is not None and section.support is not None:
        h_min = minimum_depth(u, section.span, section.support, section.fy)
        passed = section.h >= h_min
        checks.append(CodeCheck(
            "Table 9.3.1.1", "minimum depth without a deflection calculation", passed,
            f"h = {section.h:g} {L} {'≥' if passed else '<'} {h_min:,.4g} {L} for a "
            f"{section.support.value} span of {section.span:g} {L} (9.3.1.1.1 factor for fy "
            f"included; normalweight concrete; members not supporting construction likely to "
            f"be damaged by deflection){'' if passed else '; otherwise calculate deflections (24.2)'}"))
    return tuple(checks)


def _verdict(section: DesignSection, feasible: bool, phiMn_max: float, d_deepest: float,
             best: BarOption | None, lightest: BarOption | None, As_req: float | None,
             As_req_d: float) -> tuple[str, tuple[str, ...]]:
    u = section.system
    if feasible:
        text = (f"A singly reinforced {section.b:g} × {section.h:g} {u.length} section carries "
                f"Mu = {section.Mu:g} {u.moment} with εt ≥ 0.004: " + (
                    f"As,req = {As_req:.4g} {u.area} at d = {As_req_d:.4g} {u.length}."
                    if As_req is not None else
                    "no As,req was found within the section's own area (b·h)."))
        if best is None or lightest is None:
            text += " No bar arrangement tried meets every rule; see each option's failed rules."
        else:
            text += (f" First in the {section.order.value} order: {best.label}, As = "
                     f"{best.As:.4g} {u.area}{_waiver_note(best)}.")
            text += (" It is also the lightest that works." if best is lightest else
                     f" Lightest that works: {lightest.label}, As = {lightest.As:.4g} "
                     f"{u.area}{_waiver_note(lightest)}.")
        return text, ()
    ratio = section.Mu / phiMn_max
    d_needed = d_deepest * math.sqrt(ratio)
    text = (f"No singly reinforced {section.b:g} × {section.h:g} {u.length} section carries "
            f"Mu = {section.Mu:g} {u.moment} with εt ≥ 0.004 (ACI 318-19 9.3.3.1): even at the "
            f"deepest d = {d_deepest:.4g} {u.length} the largest φMn within that limit is "
            f"{phiMn_max:.4g} {u.moment}.")
    fc_needed = _concrete_needed(section, d_deepest)
    remedies = (
        f"a deeper section: about h = {_rounded_up(section.h + d_needed - d_deepest, u)} "
        f"{u.length} (φMn,max grows with d²)",
        f"a wider section: about b = {_rounded_up(section.b * ratio, u)} {u.length} "
        f"(φMn,max grows with b), if the bars then fit",
        ("stronger concrete: f'c of about "
         f"{fc_needed:,.0f} {u.stress}" if fc_needed is not None else
         "stronger concrete alone does not reach Mu at this size"),
        "compression reinforcement (a doubly reinforced section; not yet designed here)",
    )
    return text, remedies


def _waiver_note(option: BarOption) -> str:
    return ", below As,min by the 9.6.1.3 waiver (As ≥ 4/3 As,req)" if option.min_steel_waived \
        else ""


def _rounded_up(length: float, system: UnitSystem) -> str:
    """A size to suggest: up to the next 1/2 in or 10 mm, so it is never the size given."""
    step = 0.5 if system.name == "us" else 10.0
    return f"{math.floor(length / step + 1) * step:g}"


def _concrete_needed(section: DesignSection, d: float) -> float | None:
    """The least f'c at which φMn,max at depth d reaches Mu, or None if none in range."""
    Mu_base = section.Mu * section.system.moment_to_base
    top = hard_maximum(section.system, "stress_fc")

    # φMn,max rises with f'c: the Illinois method on its shortfall, kept bracketed, to a
    # thousandth of a psi or MPa (the remedy quotes f'c to the unit).
    def shortfall(fc: float) -> float:
        return largest_design_moment(replace(section.beam(((1.0, d),)), fc=fc))[0] - Mu_base

    f_high = shortfall(top)
    if f_high < 0:
        return None
    low, high = section.fc, top
    f_low = shortfall(low)
    return least_root_from_above(shortfall, low, f_low, high, f_high,
                                 lambda low, high, f_high: high - low <= 1e-3 or f_high == 0,
                                 max_steps=100)


def _warnings(section: DesignSection, best: BarOption | None) -> tuple[str, ...]:
    u = section.system
    notes = []
    if best is not None:
        a = best.arrangement
        notes += check_beam(section.arranged_beam(a)).warnings
        if best.bar.number >= (11 if u.name == "us" else 36) and \
                section.stirrup.number < (4 if u.name == "us" else 13):
            notes.append(f"{section.stirrup.designation} stirrups around {best.bar.designation} "
                         f"bars: ACI 318-19 25.7.2.2 asks ties of at least "
                         f"{'#4' if u.name == 'us' else '13'} for such bars; common practice "
                         f"applies the same to stirrups.")
    return tuple(notes)


def _one_of(field: str, value: object, kind: type) -> object:
    try:
        return kind(value.strip().lower() if isinstance(value, str) else value)
    except ValueError:
        raise InputError(field, value, "one of " + ", ".join(m.value for m in kind)) from None


def _validated(*, units, fc, fy, b, h, Mu, cover, stirrup, agg, layers, layer_gap, exposure, fs,
               es, span, support, bars, order, waive_as_min) -> DesignSection:
    system = unit_system(units)
    stress, length = system.stress, system.length
    max_length = hard_maximum(system, "length")
    fc_value = in_range("fc", fc, stress, hard_maximum(system, "stress_fc"))
    fy_value = in_range("fy", fy, stress, hard_maximum(system, "stress_fy"))
    es_value = system.default_es if es is None else in_range(
        "es", es, stress, hard_maximum(system, "modulus"))
    b_value = in_range("b", b, length, max_length)
    h_value = in_range("h", h, length, max_length)
    Mu_value = in_range("Mu", Mu, system.moment, hard_maximum(system, "moment"))
    exposure_value = _one_of("exposure", exposure, Exposure)
    stirrup_bar = standard_bar("stirrup", DEFAULT_STIRRUP[system.name] if stirrup is None
                               else stirrup, system, STIRRUP_NUMBERS[system.name])
    tried = standard_bars(system) if bars is None else standard_bars_in("bars", bars, system)
    if cover is None:
        # Table 20.5.1.3.1 applies to the stirrup and to the bars inside it: the
        # default clear cover to the stirrup satisfies both, for every bar tried.
        cover_value = max([minimum_cover(system, exposure_value, stirrup_bar)]
                          + [minimum_cover(system, exposure_value, bar) - stirrup_bar.db
                             for bar in tried])
    else:
        cover_value = in_range("cover", cover, length, max_length)
    agg_value = DEFAULT_AGGREGATE[system.name] if agg is None else in_range(
        "agg", agg, length, max_length)
    if isinstance(layers, bool) or layers not in (1, 2):
        raise InputError("layers", layers, "1 or 2")
    # The upper layer must stay near the tension face: a gap of a quarter of h
    # is far past any detailing practice, and more would lift it out of the web.
    gap_value = minimum_layer_gap(system) if layer_gap is None else in_range(
        "layer_gap", layer_gap, length, max_length)
    if gap_value > h_value / 4:
        raise InputError("layer_gap", layer_gap, f"at most h/4 = {h_value / 4:g} {length}",
                         why="the upper layer must stay near the tension face")
    fs_value = service_stress(fy_value) if fs is None else in_range("fs", fs, stress, max_length**2)
    if fs_value > fy_value:
        raise InputError("fs", fs, f"at most fy = {fy_value:g} {stress}",
                         why="the service stress of 24.3.2 cannot exceed yield")
    if (span is None) != (support is None):
        missing = "span" if span is None else "support"
        raise InputError(missing, None, "a value whenever "
                         f"{'support' if missing == 'span' else 'span'} is given (Table 9.3.1.1)")
    span_value = None if span is None else in_range("span", span, length, max_length)
    support_value = None if support is None else _one_of("support", support, Support)
    order_value = _one_of("order", order, Order)
    if not isinstance(waive_as_min, bool):
        raise InputError("waive_as_min", waive_as_min, "true or false",
                         why="whether 9.6.1.3 may stand in for As,min of 9.6.1.2")
    inside = 2 * side_cover(cover_value, stirrup_bar)
    if b_value <= inside:
        raise InputError("b", b, f"more than 2 × (cover + stirrup) = {inside:g} {length}",
                         why="no room for bars inside the stirrup")
    h_least = inside + tried[-1].db
    if h_value <= h_least:
        raise InputError("h", h, f"more than 2 × (cover + stirrup) + db = {h_least:g} {length}",
                         why=f"no room for {tried[-1].designation} bars inside the cover")
    return DesignSection(system=system, fc=fc_value, fy=fy_value, es=es_value, b=b_value,
                         h=h_value, Mu=Mu_value, cover=cover_value, stirrup=stirrup_bar,
                         aggregate=agg_value, max_layers=int(layers), layer_gap=gap_value,
                         exposure=exposure_value, fs=fs_value, span=span_value,
                         support=support_value, bars=tried, order=order_value,
                         waive_as_min=waive_as_min)
