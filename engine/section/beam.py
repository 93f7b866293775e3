"""The section being checked: shape, materials and steel layers, validated.

One model serves every case: a web of width bw (the `b` of a rectangle),
an optional flange on the compression side, and any number of steel
layers, each an area at a depth from the compression face. A layer is
tension or compression reinforcement by how it was given (`role`); the
limits and the capacity curve vary the tension layers together.

Depths, widths and areas are in the base units of `system` (in, in² or
mm, mm²); stresses in psi or MPa.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass
from functools import cached_property
from enum import Enum

from .errors import InputError
from .units import UnitSystem, unit_system
from .validation import flag, hard_maximum, in_range, range_text


class Role(str, Enum):
    TENSION = "tension"
    COMPRESSION = "compression"


@dataclass(frozen=True)
class SteelLayer:
    """Bars at one depth, lumped at their centroid."""

    area: float
    depth: float
    role: Role = Role.TENSION


@dataclass(frozen=True)
class Flange:
    """Effective flange on the compression face: width bf and thickness hf."""

    width: float
    thickness: float


@dataclass(frozen=True)
class BeamSection:
    """Inputs of one check, in the base units of `system`.

    `dt` is where εt is read: the extreme tension layer, or deeper where a
    lumped tension layer stands for several (issue 2's `--dt`).
    """

    system: UnitSystem
    fc: float
    fy: float
    es: float
    bw: float
    layers: tuple[SteelLayer, ...]
    dt: float
    h: float | None = None
    flange: Flange | None = None
    spiral: bool = False

    @property
    def b(self) -> float:
        """The web width bw (the width b of a rectangle)."""
        return self.bw

    @cached_property
    def tension_layers(self) -> tuple[SteelLayer, ...]:
        return tuple(layer for layer in self.layers if layer.role is Role.TENSION)

    @cached_property
    def As(self) -> float:
        """Total tension steel area."""
        return sum(layer.area for layer in self.tension_layers)

    @cached_property
    def d(self) -> float:
        """Depth to the centroid of the tension steel."""
        return sum(layer.area * layer.depth for layer in self.tension_layers) / self.As

    @property
    def is_rectangular(self) -> bool:
        return self.flange is None

    def with_tension_area(self, As: float) -> "BeamSection":
        """The same section with every tension layer scaled to a total of `As` (> 0)."""
        factor = As / self.As
        # One layer takes As itself: As/A·A can differ from As by an ulp, and a
        # check of As as given must see the very area searched for.
        single = len(self.tension_layers) == 1
        layers = tuple(SteelLayer(As if single else layer.area * factor, layer.depth, layer.role)
                       if layer.role is Role.TENSION else layer for layer in self.layers)
        return BeamSection(self.system, self.fc, self.fy, self.es, self.bw, layers, self.dt,
                           self.h, self.flange, self.spiral)


def beam_section(
    *,
    units: object,
    fc: object,
    fy: object,
    b: object,
    d: object | None = None,
    As: object | None = None,
    dt: object | None = None,
    es: object | None = None,
    spiral: object = False,
    h: object | None = None,
    bf: object | None = None,
    hf: object | None = None,
    asc: object | None = None,
    dc: object | None = None,
    layers: Iterable[tuple[object, object]] = (),
) -> BeamSection:
    """A validated `BeamSection`; raises `InputError` naming the first bad field.

    `As` at `d` is one tension layer; `layers` adds (area, depth) tension
    layers; `asc` at `dc` is a compression layer. `bf` and `hf` describe a
    flange on the compression side; `h` the overall depth.
    """
    system = unit_system(units)
    stress, length, area = system.stress, system.length, system.area
    max_length = hard_maximum(system, "length")
    size = _size_validator(system)

    fc_value = in_range("fc", fc, stress, hard_maximum(system, "stress_fc"))
    fy_value = in_range("fy", fy, stress, hard_maximum(system, "stress_fy"))
    es_value = system.default_es if es is None else in_range(
        "es", es, stress, hard_maximum(system, "modulus"))
    bw = size("b", b)
    h_value = None if h is None else size("h", h)
    named = list(_tension_layers(d, As, layers, system, bw * max_length))
    steel = [layer for _, layer in named]
    if asc is not None or dc is not None:
        _both_or_neither(("asc", asc, area, bw * max_length), ("dc", dc, length, max_length),
                         "compression steel")
        steel.append(SteelLayer(in_range("asc", asc, area, bw * max_length), size("dc", dc),
                                Role.COMPRESSION))
    deepest = max(layer.depth for layer in steel if layer.role is Role.TENSION)
    dt_value = deepest if dt is None else size("dt", dt)
    if dt_value < deepest:
        raise InputError("dt", dt, f"at least {deepest:g} {length}, the depth of the deepest tension layer")
    if h_value is not None and dt_value > h_value:
        if dt is not None and deepest <= h_value:  # the layers fit in h; dt alone lies below it
            raise InputError("dt", dt, f"at most h = {h_value:g} {length}",
                             why="the extreme tension steel must lie within the section")
        raise InputError("h", h, f"more than dt = {dt_value:g} {length}",
                         why="the steel must lie within the section")
    for layer in steel:
        if layer.role is Role.COMPRESSION and layer.depth >= dt_value:
            raise InputError("dc", dc, f"less than dt = {dt_value:g} {length}",
                             why="compression steel lies above the tension steel")
    gross_area = bw * (h_value if h_value is not None else dt_value)
    # A value is refused under its own field: one layer's area alone, else the total.
    for field, layer in named:
        if layer.area >= gross_area:
            raise InputError(field, layer.area, f"less than the gross area {gross_area:g} {area}")
    total_tension = sum(layer.area for _, layer in named)
    if total_tension >= gross_area:
        fields = ", ".join(field for field, _ in named)
        raise InputError("tension steel", total_tension,
                         f"less than the gross area {gross_area:g} {area}",
                         why=f"the total of {fields}")
    flange = _flange(bf, hf, bw, dt_value, system)
    return BeamSection(system=system, fc=fc_value, fy=fy_value, es=es_value, bw=bw,
                       layers=tuple(steel), dt=dt_value, h=h_value, flange=flange,
                       spiral=flag("spiral", spiral))


def rectangular_beam(*, units, fc, fy, b, d, As, dt=None, es=None, spiral=False) -> BeamSection:
    """A singly reinforced rectangle: one tension layer As at d (issue 2's inputs)."""
    return beam_section(units=units, fc=fc, fy=fy, b=b, d=d, As=As, dt=dt, es=es, spiral=spiral)


def _size_validator(system: UnitSystem):
    """in_range for a length of `system`: (field, value) -> float."""
    return lambda field, value: in_range(field, value, system.length,
                                         hard_maximum(system, "length"))


def _tension_layers(d, As, layers, system: UnitSystem, max_area: float):
    """Each tension layer with the name of the field its area came from."""
    size, area_unit = _size_validator(system), system.area
    if d is not None or As is not None:
        _both_or_neither(("As", As, area_unit, max_area),
                         ("d", d, system.length, hard_maximum(system, "length")), "a tension layer")
        yield "As", SteelLayer(in_range("As", As, area_unit, max_area), size("d", d))
    # Numbered as a reader counts them: the As at d layer, when given, is layer 1.
    first = 1 if d is None else 2
    count = 0
    for count, item in enumerate(layers, start=first):
        try:
            layer_area, layer_depth = item
        except (TypeError, ValueError):
            raise InputError("layer", item, "an area and a depth, as AREA@DEPTH") from None
        yield f"layer {count} area", SteelLayer(
            in_range(f"layer {count} area", layer_area, area_unit, max_area),
            size(f"layer {count} depth", layer_depth))
    if d is None and count == 0:  # no --as/--d and no layer at all
        raise InputError("As", None, range_text(area_unit, max_area),
                         why="give As and d, or at least one layer")


def _both_or_neither(first: tuple, second: tuple, what: str) -> None:
    """Refuse one of two inputs that only make sense together; each is (field, value, unit, maximum)."""
    for (field, value, unit, maximum), (partner, *_) in ((first, second), (second, first)):
        if value is None:
            raise InputError(field, None, range_text(unit, maximum),
                             why=f"{what} needs both {first[0]} and {second[0]}; {partner} was given")


def _flange(bf, hf, bw, dt, system: UnitSystem) -> Flange | None:
    if bf is None and hf is None:
        return None
    limits = (system.length, hard_maximum(system, "length"))
    _both_or_neither(("bf", bf, *limits), ("hf", hf, *limits), "a flange")
    size = _size_validator(system)
    width, thickness = size("bf", bf), size("hf", hf)
    if width < bw:
        raise InputError("bf", bf, f"at least the web width b = {bw:g} {system.length}")
    if thickness >= dt:
        raise InputError("hf", hf, f"less than dt = {dt:g} {system.length}",
                         why="the flange must be above the tension steel")
    return Flange(width=width, thickness=thickness)
