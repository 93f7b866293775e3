"""The app's input state, and its round trip through a share link's query string.

A link carries every input in the units it names: `units` ("us" or "si"),
`fc`, `fy`, `b`, `d`, `As` and `Mu` (blank for none). Numbers are written in
the shortest form that reads back to the same float, so opening a link
reproduces the check exactly. Parsing never raises: a value that is not a
plain decimal number, or that the engine rejects, falls back to the default
for that field alone and yields a plain-text message naming the field.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from urllib.parse import parse_qsl, urlencode

import engine

NUMBER_FIELDS = ("fc", "fy", "b", "d", "As", "Mu")
QUERY_KEYS = ("units",) + NUMBER_FIELDS
QUANTITY = {"fc": "stress", "fy": "stress", "b": "length", "d": "length", "As": "area",
            "Mu": "moment"}
UNIT_NAMES = ("us", "si")

# Beam B-204, Harbourline Depot (level 2): 4 #8 bars in a 14 in x 24 in beam.
# The SI set is the same beam in round metric sizes (4 #25 bars of ASTM A615M).
DEFAULTS = {
    "us": {"fc": 4000.0, "fy": 60000.0, "b": 14.0, "d": 21.5, "As": 3.16, "Mu": 190.0},
    "si": {"fc": 28.0, "fy": 420.0, "b": 350.0, "d": 545.0, "As": 2040.0, "Mu": 258.0},
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
_MAX_FIELDS = 64  # query fields read at all; the rest of a huge query is ignored
# A plain ASCII decimal, as a person types it. float() alone would also take
# "nan", "inf", "1_000" and non-ASCII digits, none of which a link should carry.
_DECIMAL = re.compile(r"[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")


@dataclass(frozen=True)
class Inputs:
    """One complete set of inputs, in the base units of `units`.

    us: psi, in, in², kip·ft; si: MPa, mm, mm², kN·m. `Mu` is None for none.
    """

    units: str
    fc: float
    fy: float
    b: float
    d: float
    As: float
    Mu: float | None

    def engine_kwargs(self) -> dict:
        """Keyword arguments for `engine.check`."""
        return {"units": self.units, "fc": self.fc, "fy": self.fy, "b": self.b,
                "d": self.d, "As": self.As, "Mu": self.Mu}

    def section_kwargs(self) -> dict:
        """Keyword arguments for `engine.capacity_curve` (no Mu)."""
        kwargs = self.engine_kwargs()
        del kwargs["Mu"]
        return kwargs

    def to_query(self) -> str:
        """The query string (with its leading "?") that reproduces these inputs."""
        pairs = [("units", self.units)]
        pairs += [(name, format_number(getattr(self, name))) for name in NUMBER_FIELDS[:-1]]
        pairs.append(("Mu", "" if self.Mu is None else format_number(self.Mu)))
        return "?" + urlencode(pairs)


def default_inputs(units: str = "us") -> Inputs:
    """Beam B-204 of the demo scenario, in `units`."""
    return Inputs(units=units, **DEFAULTS[units])


def format_number(value: float) -> str:
    """The shortest decimal text that reads back as the same float ("4000", "3.16", "1e20")."""
    text = repr(float(value))
    text = text[:-2] if text.endswith(".0") else text
    return text.replace("e+", "e")  # a "+" would need escaping in a URL


def convert_inputs(inputs: Inputs, units: str) -> Inputs:
    """`inputs` expressed in `units`, each value converted by the engine (not rounded)."""
    source, target = engine.unit_system(inputs.units), engine.unit_system(units)
    values = {}
    for name in NUMBER_FIELDS:
        value = getattr(inputs, name)
        values[name] = None if value is None else engine.convert(
            value, QUANTITY[name], source, target)
    return Inputs(units=target.name, **values)


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
    values, messages = _first_values(search)
    units_raw = values.get("units")
    units = "us"
    if units_raw is not None:
        key = units_raw.strip().lower()
        if key in UNIT_NAMES:
            units = key
        else:
            messages.append(f"units: {_shown(units_raw)} is not a unit system; expected "
                            f"'us' or 'si'. Using US customary.")
    defaults = DEFAULTS[units]
    accepted = dict(defaults)
    for name in NUMBER_FIELDS:
        raw = values.get(name)
        if raw is None:
            continue
        if name == "Mu" and raw.strip() == "":
            accepted["Mu"] = None
            continue
        fallback = f"Using {format_number(defaults[name])} {unit_label(units, name)}."
        number, problem = _decimal(raw)
        if problem:
            messages.append(f"{name}: {_shown(raw)} {problem}. {fallback}")
            continue
        error = _engine_rejects(units, accepted, name, number)
        if error is not None:
            messages.append(f"{name}: {_shown(raw)} is not accepted; expected "
                            f"{error.accepted}"
                            + (f" ({error.why})" if error.why else "") + f". {fallback}")
            continue
        accepted[name] = number
    inputs = Inputs(units=units, **accepted)
    try:
        engine.check(**inputs.engine_kwargs())
    except (engine.InputError, ArithmeticError) as error:
        # Each value passed on its own, but together they do not make a
        # section (e.g. a tiny b with the default As): start from B-204.
        messages.append(f"{error}. These values do not make a section together; "
                        f"using the default section.")
        inputs = default_inputs(units)
    return inputs, tuple(messages)


def _first_values(search: str) -> tuple[dict[str, str], list[str]]:
    """The first value of each known key (matched case-insensitively), and messages."""
    text = search[1:] if search.startswith("?") else search
    try:
        pairs = parse_qsl(text, keep_blank_values=True, max_num_fields=_MAX_FIELDS)
    except ValueError:
        pairs = parse_qsl(text, keep_blank_values=True)[:_MAX_FIELDS]
    canonical = {key.lower(): key for key in QUERY_KEYS}
    values: dict[str, str] = {}
    counts: dict[str, int] = {}
    for key, value in pairs:
        name = canonical.get(key.strip().lower())
        if name is None:
            continue
        counts[name] = counts.get(name, 0) + 1
        values.setdefault(name, value)
    messages = [f"{name}: given {count} times in the link; using the first, "
                f"{_shown(values[name])}." for name, count in counts.items() if count > 1]
    return values, messages


def _decimal(raw: str) -> tuple[float, str]:
    """`raw` as a float, or (nan, why not) when it is not a finite plain decimal."""
    text = raw.strip()
    if text == "":
        return math.nan, "is empty"
    if _DECIMAL.fullmatch(text) is None:
        return math.nan, "is not a plain decimal number"
    number = float(text)
    if not math.isfinite(number):
        return math.nan, "is too large to be a number"
    return number, ""


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
