"""The app's input state, and its round trip through a share link's query string.

The link format is `engine.documents.share_link`'s (the one encoder and reader of links):
`units` ("us" or "si"), `fc`, `fy`, `b`, `d`, `As` and `Mu` (blank for none),
and for other sections `dt`, `h`, `shape` (rect, T, L) with `bf` and `hf`
(or the slab's `sw` and `ln`, Table 6.3.2.1), `asc` and `dc`, and one
`layer=AREA@DEPTH` per extra tension layer; the bar-sizing inputs `cover`,
`stirrup`, `agg`, `nlayers`, `span`, `support`, `order` (the ranking of the
options), `waiver` (the 9.6.1.3 waiver allowed), and `bars` (the chosen
arrangement); `frame` (the special moment frame checks, `engine.special_frame_check`)
with the top steel `top_As` at `top_d` (from the bottom face). Numbers are written in the shortest form that reads back to
the same float, so opening a link reproduces the check exactly.

Parsing never raises: a value that does not read, or that the engine
rejects, falls back to the default for that field alone and yields a
plain-text message naming the field.
"""

from __future__ import annotations

import functools

from dataclasses import dataclass, field, fields, replace

import engine
from engine.section.bar_groups import BarGroup, bar_group
from engine.documents.share_link import KEYS, MAX_FIELDS, format_number, read_share_query, share_query

NUMBER_FIELDS = ("fc", "fy", "b", "d", "As", "Mu")
QUERY_KEYS = KEYS
QUANTITY = {"fc": "stress", "fy": "stress", "b": "length", "d": "length", "As": "area",
            "Mu": "moment", "dt": "length", "h": "length", "bf": "length", "hf": "length",
            "sw": "length", "ln": "length", "asc": "area", "dc": "length", "cover": "length",
            "agg": "length", "span": "length", "es": "stress", "top_As": "area",
            "top_d": "length"}
UNIT_NAMES = ("us", "si")
SHAPES = ("rect", "T", "L")

# Beam B-204, Harbourline Depot (level 2): 4 #8 bars in a 14 in x 24 in beam.
# The SI set is the same beam in round metric sizes (4 #25 bars of ASTM A615M).
DEFAULTS = {
    "us": {"fc": 4000.0, "fy": 60000.0, "b": 14.0, "d": 21.5, "As": 3.16, "Mu": 190.0},
    "si": {"fc": 28.0, "fy": 420.0, "b": 350.0, "d": 545.0, "As": 2040.0, "Mu": 258.0},
}
# B-204 cast with the level-2 slab: what a T or L starts from when chosen, and
# the fallback for a link's bad flange value. h is the beam's overall depth.
SECTION_DEFAULTS = {
    "us": {"h": 24.0, "bf": 48.0, "hf": 5.0, "sw": 96.0, "ln": 288.0, "asc": 0.4, "dc": 2.5},
    "si": {"h": 610.0, "bf": 1200.0, "hf": 125.0, "sw": 2400.0, "ln": 7300.0, "asc": 258.0,
           "dc": 64.0},
}
# Bar sizing defaults (common practice: #3 / No. 10 stirrups, 3/4 in / 19 mm
# aggregate, bars in up to two layers). The cover has none here: left blank it
# is the engine's default, which meets Table 20.5.1.3.1 for the stirrup and
# every bar tried (a converted 1.5 in would be 38.1 mm, under the 40 mm of SI).
DESIGN_DEFAULTS = {
    "us": {"stirrup": "#3", "agg": 0.75, "nlayers": 2},
    "si": {"stirrup": "10", "agg": 19.0, "nlayers": 2},
}

# Slider spans (start, end, step) covering practical beams. The As end is a
# floor: the page moves it past the balanced steel area of the current section.
# A typed or shared value outside a span is used as given and widens it.
SLIDER_SPANS = {
    "us": {"fc": (2500.0, 12000.0, 50.0), "fy": (40000.0, 100000.0, 500.0),
           "b": (6.0, 48.0, 0.25), "d": (4.0, 60.0, 0.25), "As": (0.1, 10.0, 0.01)},
    "si": {"fc": (17.0, 80.0, 0.5), "fy": (280.0, 690.0, 5.0),
           "b": (150.0, 1200.0, 5.0), "d": (100.0, 1500.0, 5.0), "As": (60.0, 6500.0, 5.0)},
}

_MAX_SHOWN = 80  # characters of a rejected value quoted back in a message
# Extra tension layers the page holds: every layer a link can carry (the reader takes
# MAX_FIELDS fields), so a link the CLI or the sheet wrote opens with all of its layers.
MAX_EXTRA_LAYERS = MAX_FIELDS
WHOLE_SECTION = ("fc", "fy", "b", "d", "As")  # a link with all of these gives the whole section


@dataclass(frozen=True)
class Inputs:
    """One complete set of inputs, in the base units of `units`.

    us: psi, in, in², kip·ft; si: MPa, mm, mm², kN·m. `Mu` is None for none.
    `As` at `d` is the first tension layer and `layers` the others, as
    (area, depth) pairs (`engine.check`'s meaning). `es` is Es (None: ACI
    318-19 20.2.2.2's value for the unit system) and `spiral` whether the
    transverse reinforcement is a spiral (φ of Table 21.2.2). The flange (`bf`, `hf`)
    counts only when `shape` is "T" or "L"; when `sw` and `ln` are set, `bf`
    was found from them. `cover` ... `bars` are the bar-sizing inputs (None:
    the engine's default); `bars` names the chosen arrangement ("#8:4,2").
    `frame` adds the special moment frame checks (ACI 318-19 18.6.3, 18.6.5,
    20.2.2.5) with the top steel `top_As` at `top_d`, its depth from the
    bottom face (None: not given, and the top checks are listed as not made).
    """

    units: str
    fc: float
    fy: float
    b: float
    d: float
    As: float
    Mu: float | None
    dt: float | None = None
    h: float | None = None
    shape: str = "rect"
    bf: float | None = None
    hf: float | None = None
    sw: float | None = None
    ln: float | None = None
    asc: float | None = None
    dc: float | None = None
    layers: tuple[tuple[float, float], ...] = ()
    cover: float | None = None
    stirrup: str | None = None
    agg: float | None = None
    nlayers: int | None = None
    span: float | None = None
    support: str | None = None
    order: str | None = None  # ranking of the bar options; None: the engine's (practical)
    waiver: bool = False  # let 9.6.1.3 (As ≥ 4/3 As,req) stand in for As,min
    bars: str | None = field(default=None)
    # The bars as drawn, one entry a tension layer (the first layer first): COUNTxBAR
    # ("4x9") or None for a layer given by its area; () for none given at all.
    drawn: tuple[str | None, ...] = ()
    es: float | None = None
    spiral: bool = False
    frame: bool = False
    top_As: float | None = None
    top_d: float | None = None

    @property
    def flanged(self) -> bool:
        return self.shape in ("T", "L") and self.bf is not None and self.hf is not None

    def engine_kwargs(self) -> dict:
        """Keyword arguments for `engine.check` (Mu included, None for none)."""
        kwargs = {"units": self.units, "fc": self.fc, "fy": self.fy, "b": self.b,
                  "d": self.d, "As": self.As, "Mu": self.Mu}
        for name in ("dt", "es", "h", "asc", "dc"):
            if getattr(self, name) is not None:
                kwargs[name] = getattr(self, name)
        if self.spiral:
            kwargs["spiral"] = True
        if self.flanged:
            kwargs.update(bf=self.bf, hf=self.hf)
        if self.layers:
            kwargs["layers"] = [tuple(layer) for layer in self.layers]
        return kwargs

    def section_kwargs(self) -> dict:
        """Keyword arguments for `engine.capacity_curve` (no Mu)."""
        kwargs = self.engine_kwargs()
        del kwargs["Mu"]
        return kwargs

    def special_frame_kwargs(self) -> dict | None:
        """Keyword arguments for `engine.special_frame_check`, or None when `frame` is off."""
        if not self.frame:
            return None
        kwargs = self.section_kwargs()
        if self.top_As is not None and self.top_d is not None:
            kwargs.update(top_As=self.top_As, top_d=self.top_d)
        return kwargs

    def settings(self) -> dict:
        """The link's page keys for these inputs (None: left out)."""
        flanged = self.shape in ("T", "L")
        return {"shape": None if self.shape == "rect" else self.shape,
                "sw": self.sw if flanged else None, "ln": self.ln if flanged else None,
                "cover": self.cover, "stirrup": self.stirrup, "agg": self.agg,
                "nlayers": self.nlayers, "span": self.span, "support": self.support,
                "order": self.order, "waiver": True if self.waiver else None,
                "bars": self.bars,
                "drawn": ",".join(group or "" for group in self.drawn) if any(self.drawn)
                else None,
                "frame": True if self.frame else None,
                "top_As": self.top_As, "top_d": self.top_d}

    def to_query(self) -> str:
        """The query string (with its leading "?") that reproduces these inputs."""
        return "?" + share_query(self.engine_kwargs(), self.settings())


def default_inputs(units: str = "us") -> Inputs:
    """Beam B-204 of the demo scenario, in `units`."""
    return Inputs(units=units, **DEFAULTS[units])


def is_demo(inputs: Inputs) -> bool:
    """Whether `inputs` are the demo beam untouched, in either unit system (a switch included)."""
    return inputs in _demo_forms(inputs.units)


@functools.cache
def _demo_forms(units: str) -> tuple[Inputs, Inputs]:
    """The demo beam in `units`: as defined, and as a switch from the other system shows it.

    Cached: the page asks on every redraw, and the answer never changes.
    """
    other = "si" if units == "us" else "us"
    return default_inputs(units), rounded_inputs(convert_inputs(default_inputs(other), units))


def convert_inputs(inputs: Inputs, units: str) -> Inputs:
    """`inputs` expressed in `units`, each value converted by the engine (not rounded).

    Bar designations move to the same bar in the other system (ASTM A615
    #8 is A615M No. 25: the soft-metric bars of one table).
    """
    source, target = engine.unit_system(inputs.units), engine.unit_system(units)

    def convert(value, quantity):
        return None if value is None else engine.convert(value, quantity, source, target)

    values = {name: convert(getattr(inputs, name), quantity)
              for name, quantity in QUANTITY.items()}
    values["layers"] = tuple((convert(area, "area"), convert(depth, "length"))
                             for area, depth in inputs.layers)
    values["stirrup"] = _same_bar(inputs.stirrup, source, target)
    values["drawn"] = tuple(None if group is None else same_group(group, source, target)
                            for group in drawn_groups(inputs)) if inputs.drawn else ()
    if inputs.bars is not None:
        designation, _, counts = inputs.bars.partition(":")
        converted = _same_bar(designation, source, target)
        values["bars"] = None if converted is None else f"{converted}:{counts}"
    return with_drawn_areas(replace(inputs, units=target.name, **values))


def drawn_groups(inputs: Inputs) -> tuple[BarGroup | None, ...]:
    """One entry a tension layer (the first layer first): its bars as drawn, or None."""
    if not inputs.drawn:
        return (None,) * (1 + len(inputs.layers))
    system = engine.unit_system(inputs.units)
    return tuple(None if text is None else bar_group("drawn", text, system)
                 for text in inputs.drawn)


def with_drawn_areas(inputs: Inputs) -> Inputs:
    """`inputs` with each layer that has bars as drawn given exactly their area."""
    groups = drawn_groups(inputs)
    if not any(groups):
        return inputs
    as_area = inputs.As if groups[0] is None else groups[0].area
    layers = tuple((area if group is None else group.area, depth)
                   for (area, depth), group in zip(inputs.layers, groups[1:]))
    return replace(inputs, As=as_area, layers=layers)


def without_stale_drawn(inputs: Inputs) -> Inputs:
    """`inputs` without the bars of a layer whose area was changed away from them."""
    groups = drawn_groups(inputs)
    if not any(groups) or len(groups) != 1 + len(inputs.layers):
        return replace(inputs, drawn=()) if inputs.drawn else inputs
    areas = (inputs.As,) + tuple(area for area, _ in inputs.layers)
    kept = tuple(None if group is None or not _same_area(group.area, area) else group.link_text
                 for group, area in zip(groups, areas))
    return replace(inputs, drawn=kept if any(kept) else ())


def _same_area(a: float, b: float) -> bool:
    # Bars set their layer's area exactly; a difference past float noise is an edit.
    return abs(a - b) <= 1e-9 * max(abs(a), abs(b))


def same_group(group: BarGroup, source, target) -> str | None:
    """`group` as the same bars in the `target` system ("4x9" -> "4x29"); None if none."""
    designation = _same_bar(group.bar.designation, source, target)
    return None if designation is None else bar_group("drawn", f"{group.count}x{designation}",
                                                      target).link_text


# Significant figures a unit switch keeps: the precision engineers write (14 in -> 355.6 mm,
# 4000 psi -> 27.58 MPa, 190 kip·ft -> 257.6 kN·m), not 355.59999999999997 or 569.444. The page
# keeps the exact values underneath: switching straight back restores them, and a switch whose
# rounding would change the outcome keeps the exact conversion (`webapp.page`).
SWITCH_FIGURES = 4


def rounded_inputs(inputs: Inputs, figures: int = SWITCH_FIGURES) -> Inputs:
    """`inputs` with every quantity (and each layer) rounded to `figures` significant figures.

    For values a unit switch produced by conversion, whose float noise would
    otherwise fill the share link; typed and linked values are never rounded.
    """
    def rounded(value):
        return None if value is None else float(f"{value:.{figures}g}")

    values = {name: rounded(getattr(inputs, name)) for name in QUANTITY}
    values["layers"] = tuple((rounded(area), rounded(depth)) for area, depth in inputs.layers)
    return with_drawn_areas(replace(inputs, **values))  # bars as drawn keep their exact area


def _same_bar(designation: str | None, source, target) -> str | None:
    if designation is None:
        return None
    try:
        index = engine.standard_bars(source).index(engine.bar("bar", designation, source))
    except engine.InputError:
        return None
    return engine.standard_bars(target)[index].designation


def slab_flange_width(shape: str, b: float, hf: float, sw: float, ln: float) -> float:
    """bf from the slab (ACI 318-19 Table 6.3.2.1, by the engine).

    An `InputError` names the page's own field: the engine calls the clear
    span `span`, which on the page is `ln` (`span` is the bar-sizing span).
    """
    try:
        return engine.effective_flange_width(shape, b, hf, sw, ln)
    except engine.InputError as error:
        field = {"span": "ln", "clear_web_spacing": "sw"}.get(error.field, error.field)
        raise engine.InputError(field, error.value, error.accepted, error.why) from None


def unit_label(units: str, name: str) -> str:
    """The unit a field is entered in: "psi", "mm²", "kip·ft"..."""
    system = engine.unit_system(units)
    return getattr(system, QUANTITY[name])


def parse_query(search: str) -> tuple[Inputs, tuple[str, ...]]:
    """Inputs from a query string ("?fc=4000&..." or without "?"), and messages.

    Missing keys take the default; unknown keys are ignored (room for inputs
    later versions add). Each message is plain text naming the field, the
    value given and what is accepted; it must be shown escaped.
    """
    reading = read_share_query(search)
    values = reading.values
    messages = [f"{name}: given {count} times in the link; using the first."
                for name, count in reading.repeated.items()]
    units = values.get("units", "us")
    for problem in reading.problems:
        if problem.field == "units":
            messages.append(f"units: {_shown(problem.value)} is not a unit system; expected "
                            f"'us' or 'si'. Using US customary.")
        else:
            messages.append(f"{problem.field}: {_shown(problem.value)} is not accepted; "
                            f"expected {problem.accepted}. {_fallback(units, problem.field)}")
    defaults = DEFAULTS[units]
    accepted = dict(defaults)
    layers = list(values.get("layers", ()))
    if layers and "As" not in values and "d" not in values:
        # A link in the CLI's form: every tension layer as `layer`, no As and d.
        (values["As"], values["d"]), layers = layers[0], layers[1:]
    if "Mu" not in values and all(name in values for name in WHOLE_SECTION):
        # A link that gives the whole section and no Mu is a check without a
        # demand, as on the command line (`report` without --mu writes such links).
        values["Mu"] = None
    for name in NUMBER_FIELDS:
        if name not in values:
            continue
        number = values[name]
        if name == "Mu" and number is None:
            accepted["Mu"] = None
            continue
        error = _engine_rejects(units, accepted, name, number)
        if error is None:
            accepted[name] = number
        else:
            messages.append(_rejected(name, number, error, _fallback(units, name)))
    kwargs = dict(accepted)
    if reading.unread:
        messages.append(f"The link has {reading.unread} more fields than the "
                        f"{MAX_FIELDS} that are read; those are left out.")
    if len(layers) > MAX_EXTRA_LAYERS:
        left_out = ", ".join(f"{format_number(area)}@{format_number(depth)}"
                             for area, depth in layers[MAX_EXTRA_LAYERS:])
        first, last = MAX_EXTRA_LAYERS + 2, len(layers) + 1
        which = f"layer {first} ({left_out}) is" if first == last else (
            f"layers {first} to {last} ({left_out}) are")
        messages.append(f"layer: the link has {len(layers)} extra tension layers; the page "
                        f"takes at most {MAX_EXTRA_LAYERS}, so {which} left out.")
        layers = layers[:MAX_EXTRA_LAYERS]
    kept_layers = []
    for index, layer in enumerate(layers, start=2):
        error = _group_rejects(units, dict(kwargs, layers=kept_layers + [layer]))
        if error is None:
            kept_layers.append(layer)
        else:
            messages.append(_rejected(f"layer {index}", f"{format_number(layer[0])}@"
                                      f"{format_number(layer[1])}", error,
                                      "This layer is left out."))
    if kept_layers:
        kwargs["layers"] = kept_layers
    for name in ("dt", "h"):
        if values.get(name) is not None:
            kwargs = _try(units, kwargs, {name: values[name]}, messages, name)
    if values.get("es") is not None:
        kwargs = _try(units, kwargs, {"es": values["es"]}, messages, "es",
                      f"Using Es = {format_number(engine.unit_system(units).default_es)} "
                      f"{unit_label(units, 'es')} (ACI 318-19 20.2.2.2).")
    if values.get("spiral"):
        kwargs["spiral"] = True
    shape = values.get("shape")
    if shape is None and (values.get("bf") is not None or values.get("hf") is not None):
        shape = "T"
    flange = {}
    if shape in ("T", "L"):
        flange = _flange(units, shape, kwargs, values, messages)
        if not flange:
            shape = "rect"
    kwargs.update({k: v for k, v in flange.items() if k in ("bf", "hf")})
    for name in ("asc", "dc"):
        if (values.get(name) is None) != (values.get("asc" if name == "dc" else "dc") is None):
            if values.get(name) is None:
                messages.append(f"{name}: missing; compression steel needs both asc and dc. "
                                f"The compression steel is left out.")
    if values.get("asc") is not None and values.get("dc") is not None:
        kwargs = _try(units, kwargs, {"asc": values["asc"], "dc": values["dc"]}, messages,
                      "asc", "The compression steel is left out.")
    design = _design_settings(units, kwargs, values, messages)
    drawn = _drawn(units, values.get("drawn"), kwargs, messages)
    inputs = Inputs(units=units, shape=shape or "rect", drawn=drawn,
                    **{k: (tuple(v) if k == "layers" else v) for k, v in kwargs.items()
                       if k != "units"}, **design)
    if inputs.flanged and flange.get("sw") is not None:
        inputs = replace(inputs, sw=flange["sw"], ln=flange["ln"])
    try:
        engine.check(**inputs.engine_kwargs())
    except (engine.InputError, ArithmeticError) as error:
        # Each value passed on its own, but together they do not make a
        # section (e.g. a tiny b with the default As): start from B-204.
        messages.append(f"{error}. These values do not make a section together; "
                        f"using the default section.")
        inputs = default_inputs(units)
    unreadable = {problem.field for problem in reading.problems}
    return _frame_settings(inputs, values, unreadable, messages), tuple(messages)


def _frame_settings(inputs: Inputs, values: dict, unreadable: set, messages: list) -> Inputs:
    """`inputs` with the link's `frame` and top steel, the top steel judged by the engine.

    A top steel value the link reader could not read has its message already; its
    partner is then left out without a second one.
    """
    top_As, top_d = values.get("top_As"), values.get("top_d")
    if unreadable & {"top_As", "top_d"}:
        top_As = top_d = None
    elif (top_As is None) != (top_d is None):
        missing = "top_d" if top_d is None else "top_As"
        messages.append(f"{missing}: missing; the top steel needs both top_As and top_d. "
                        f"The top steel is left out.")
        top_As = top_d = None
    elif top_As is not None:
        try:
            engine.special_frame_check(**inputs.section_kwargs(), top_As=top_As, top_d=top_d)
        except engine.InputError as error:
            name = error.field if error.field in ("top_As", "top_d") else "top_As"
            value = top_As if name == "top_As" else top_d
            messages.append(_rejected(name, value, error, "The top steel is left out."))
            top_As = top_d = None
        except ArithmeticError:
            messages.append("top_As: the engine cannot compute this top steel. "
                            "The top steel is left out.")
            top_As = top_d = None
    return replace(inputs, frame=bool(values.get("frame")), top_As=top_As, top_d=top_d)


def _drawn(units: str, text: str | None, kwargs: dict, messages: list) -> tuple:
    """The link's bars as drawn, each kept only where it gives its layer's area exactly."""
    if not text:
        return ()
    entries = text.split(",")
    areas = [kwargs["As"]] + [area for area, _ in kwargs.get("layers", ())]
    if len(entries) != len(areas):
        messages.append(f"drawn: {_shown(text)} gives bars for {len(entries)} tension layers; "
                        f"the section has {len(areas)}. The bars as drawn are left out; the "
                        f"areas are used.")
        return ()
    system = engine.unit_system(units)
    kept = []
    for index, (entry, area) in enumerate(zip(entries, areas), start=1):
        group = None
        if entry:
            try:
                group = bar_group(f"drawn (layer {index})", entry, system)
            except engine.InputError as error:
                messages.append(f"{error}. Layer {index}'s bars are left out; its area is used.")
            else:
                if not _same_area(group.area, area):
                    messages.append(
                        f"drawn (layer {index}): {group.text} is {format_number(group.area)} "
                        f"{system.area}, not the layer's area {format_number(area)} "
                        f"{system.area}. The bars are left out; the area is used.")
                    group = None
        kept.append(None if group is None else group.link_text)
    return tuple(kept) if any(kept) else ()


def _flange(units: str, shape: str, kwargs: dict, values: dict, messages: list) -> dict:
    """bf and hf (and sw, ln) for a T or L, each falling back alone; {} for none."""
    base = SECTION_DEFAULTS[units]
    hf = values.get("hf")
    if hf is None or _group_rejects(units, dict(kwargs, bf=max(kwargs["b"], base["bf"]),
                                                hf=hf)) is not None:
        if hf is not None:
            messages.append(_rejected("hf", hf, _group_rejects(
                units, dict(kwargs, bf=max(kwargs["b"], base["bf"]), hf=hf)),
                f"Using {format_number(base['hf'])} {unit_label(units, 'hf')}."))
        hf = base["hf"]
    slab = {}
    sw, ln = values.get("sw"), values.get("ln")
    bf = values.get("bf")
    given = ("The flange width bf is taken as given." if bf is not None else
             f"Using bf = {format_number(max(kwargs['b'], base['bf']))} "
             f"{unit_label(units, 'bf')}.")
    if sw is not None and ln is not None:
        try:
            bf = slab_flange_width(shape, kwargs["b"], hf, sw, ln)
            slab = {"sw": sw, "ln": ln}
        except (engine.InputError, ArithmeticError) as error:
            messages.append(f"{error}. {given}")
    elif sw is not None or ln is not None:
        missing = "ln" if ln is None else "sw"
        messages.append(f"{missing}: missing; bf from the slab (Table 6.3.2.1) needs both sw "
                        f"and ln. {given}")
    if bf is None:
        bf = max(kwargs["b"], base["bf"])
    error = _group_rejects(units, dict(kwargs, bf=bf, hf=hf))
    if error is None:
        return {"bf": bf, "hf": hf, **slab}
    fallback = max(kwargs["b"], base["bf"])
    usable = fallback != bf and _group_rejects(units, dict(kwargs, bf=fallback, hf=hf)) is None
    messages.append(_rejected("bf", bf, error, f"Using {format_number(fallback)} "
                              f"{unit_label(units, 'bf')}." if usable else
                              "Using a rectangular section."))
    return {"bf": fallback, "hf": hf} if usable else {}


def _design_settings(units: str, kwargs: dict, values: dict, messages: list) -> dict:
    """The bar-sizing inputs a link carries, each judged by `engine.design_section`."""
    base = {"units": units, "fc": kwargs["fc"], "fy": kwargs["fy"], "b": kwargs["b"],
            "h": kwargs.get("h") or max(SECTION_DEFAULTS[units]["h"], 1.2 * kwargs["d"]),
            "Mu": kwargs.get("Mu") or DEFAULTS[units]["Mu"]}
    settings: dict = {}
    for name, engine_name in (("cover", "cover"), ("stirrup", "stirrup"), ("agg", "agg"),
                              ("nlayers", "layers")):
        value = values.get(name)
        if value is None:
            continue
        try:
            engine.design_section(**base, **{engine_name: value})
        except engine.InputError as error:
            if error.field in (engine_name, name):
                messages.append(_rejected(name, value, error, "Using the default."))
                continue
        except ArithmeticError:
            pass  # not this value's fault: kept, and the bar-sizing tab says what failed
        settings[name] = value
    span, support = values.get("span"), values.get("support")
    if (span is None) != (support is None):
        messages.append(f"{'support' if support is None else 'span'}: missing; the depth "
                        f"guidance of Table 9.3.1.1 needs both span and support. Left out.")
    elif span is not None:
        try:
            engine.design_section(**base, span=span, support=support)
        except engine.InputError as error:
            if error.field in ("span", "support"):
                messages.append(_rejected(error.field, error.value, error,
                                          "The span and support are left out."))
                span = support = None
            # Any other field's error is not the span's: both are kept, and the
            # bar-sizing tab names that field.
        except ArithmeticError:
            pass
        if span is not None:
            settings.update(span=span, support=support)
    # Words the link reader has already checked; they fit every section.
    if values.get("order") is not None:
        settings["order"] = values["order"]
    if values.get("waiver"):
        settings["waiver"] = True
    if values.get("bars") is not None:
        settings["bars"] = values["bars"]
    return settings


def _try(units: str, kwargs: dict, extra: dict, messages: list, name: str,
         fallback: str = "") -> dict:
    """`kwargs` with `extra` if the engine accepts them together, else with a message."""
    trial = dict(kwargs, **extra)
    error = _group_rejects(units, trial)
    if error is None:
        return trial
    messages.append(_rejected(name, extra[name], error,
                              fallback or f"{name} is left out (the default)."))
    return kwargs


def _group_rejects(units: str, kwargs: dict):
    try:
        engine.check(**dict(kwargs, units=units))
    except engine.InputError as error:
        return error
    except ArithmeticError:
        return engine.InputError("value", None, "a value the engine can compute")
    return None


def _rejected(name: str, value, error, fallback: str) -> str:
    shown = _shown(value) if isinstance(value, str) else _shown(format_number(value)) \
        if isinstance(value, (int, float)) else _shown(str(value))
    why = f" ({error.why})" if getattr(error, "why", "") else ""
    about = "" if error.field == name else f" with the other inputs ({error})"
    accepted = error.accepted if error.field == name else "a value that leaves the section valid"
    return f"{name}: {shown} is not accepted; expected {accepted}{why}{about}. {fallback}"


def _fallback(units: str, name: str) -> str:
    if name in DEFAULTS[units]:
        return f"Using {format_number(DEFAULTS[units][name])} {unit_label(units, name)}."
    if name.startswith("layer"):
        return "This layer is left out."
    if name in ("top_As", "top_d"):
        return "The top steel is left out."
    return "Using the default."


def _engine_rejects(units: str, accepted: dict, name: str, number: float):
    """The engine's `InputError` for `name` = `number` among `accepted`, else None.

    Fields are read in the order fc, fy, b, d, As, Mu, so As is judged against
    the b and d already accepted; while an earlier field is judged, As is held
    well inside b·d so that only the field itself can be at fault.
    """
    trial = dict(accepted, **{name: number})
    if name not in ("As", "Mu"):
        trial["As"] = min(trial["As"], 0.5 * trial["b"] * trial["d"])
    try:
        engine.check(units=units, **trial)
    except engine.InputError as error:
        if error.field == name:
            return error
        return engine.InputError(name, number, f"a value that leaves the other inputs valid "
                                 f"({error})")
    except ArithmeticError:
        # An engine failure on an extreme value (e.g. a subnormal Mu) is still
        # a value the page cannot show: reject it like any other.
        return engine.InputError(name, number, "a value the engine can compute")
    return None


def _shown(raw: str) -> str:
    """`raw` quoted for a message, shortened when long (plain text: escape to show)."""
    text = raw if len(raw) <= _MAX_SHOWN else raw[:_MAX_SHOWN] + "…"
    return repr(text)


FRAME_FIELDS = ("frame", "top_As", "top_d")
INPUT_FIELDS = tuple(f.name for f in fields(Inputs))  # the page holds each as a parameter
