"""The share link: one check's inputs (and the page's own settings) as a URL query, and back.

A link reproduces the check exactly: every number is written in the shortest
form that reads back as the same float (`repr`), so parsing the query gives
the very inputs that made it.

Check keys are `engine.check`'s keywords and the CLI's flags: units, fc, fy,
b, d, As, Mu, dt, es, h, bf, hf, asc, dc, spiral, and `layer`, repeated once
per extra tension layer as AREA@DEPTH (the CLI's `--layer`; the keyword is
`layers`). Inputs left at their defaults (None, spiral off, Es of ACI 318-19
20.2.2.2 for the unit system) are left out; a blank `Mu=` means "no demand"
(the key is written blank when the inputs say Mu is None).

Page keys describe how the page got those inputs and what else it shows;
they never change the check itself: `shape` (rect, T, L), `sw` and `ln`
(the slab geometry bf was found from, ACI 318-19 Table 6.3.2.1), and the
bar-sizing inputs `cover`, `stirrup`, `agg`, `nlayers` (1 or 2), `span`,
`support`, `order` (practical or lightest; absent: practical), `waiver` (1:
the 9.6.1.3 waiver of As,min allowed; absent: not), `bars` (the chosen
arrangement, BAR:COUNTS such as `#8:4,2`) and `drawn` (the bars as drawn, one
COUNTxBAR entry a tension layer, the first layer first and blank for a layer
given by its area, such as `4x9,,2x8`; each sets its layer's area exactly).
`frame` (1: the beam is checked as part of a special moment frame,
`engine.special_frame_check`; absent: not) with the top steel `top_As` at
`top_d` (from the bottom face), which add checks and never change the
flexural check itself.

Example: ``?units=us&fc=4000&fy=60000&b=12&d=21.5&As=3.16&Mu=180``.
"""

from __future__ import annotations

import math
import re
from collections.abc import Iterable, Mapping
from dataclasses import dataclass, field
from numbers import Real
from urllib.parse import parse_qsl, urlencode, urlsplit, urlunsplit

from ..design.sizing import Order
from ..provisions.detailing import Support
from ..section.errors import InputError
from ..section.units import unit_system
from ..section.validation import decimal_text

NUMBER_KEYS = ("fc", "fy", "b", "d", "As", "Mu", "dt", "es", "h", "bf", "hf", "asc", "dc")
CHECK_KEYS = ("units",) + NUMBER_KEYS + ("layers", "spiral")
"""The `engine.check` keywords a link carries (`layers` travels as repeated `layer`)."""
PAGE_NUMBER_KEYS = ("sw", "ln", "cover", "agg", "span", "top_As", "top_d")
PAGE_KEYS = ("shape", "sw", "ln", "cover", "stirrup", "agg", "nlayers", "span", "support", "order",
             "waiver", "bars", "drawn", "frame", "top_As", "top_d")
KEYS = ("units",) + NUMBER_KEYS + ("layer", "spiral") + PAGE_KEYS
"""Every key of the query, in the order `share_query` writes them."""
SHAPES = ("rect", "T", "L")
MAX_FIELDS = 64  # query fields read at all; the rest of a huge query is ignored

# What a link may carry for a number: the decimal forms `format_number` writes
# and people type; no "nan", "inf", underscores, hexadecimal or non-ASCII digits.
_DESIGNATION = re.compile(r"#?[0-9]{1,2}")
_DRAWN = re.compile(r"([0-9]{1,3}x[0-9]{1,2})?")
_BARS = re.compile(r"(#?[0-9]{1,2}):([0-9]{1,3}(?:,[0-9]{1,3}){0,3})")
_TRUE, _FALSE = ("1", "true", "yes", "on"), ("0", "false", "no", "off")
_SHAPE_WORDS = {"rect": "rect", "rectangle": "rect", "r": "rect", "t": "T", "l": "L"}
_BLANK_IS_NONE = ("Mu", "dt", "es", "h", "bf", "hf", "asc", "dc") + PAGE_NUMBER_KEYS
_CANONICAL = {key.lower(): key for key in KEYS}
_SAFE = "@,:"  # legal in a query (RFC 3986 pchar, sub-delims), kept readable


def format_number(value: object, field: str = "value") -> str:
    """`value` in the shortest text that `float()` reads back exactly.

    Whole numbers lose their ".0" (4000.0 -> "4000") and exponents their "+"
    (1e+20 -> "1e20"), which would otherwise need escaping in a URL.
    """
    if isinstance(value, bool) or not isinstance(value, Real):
        raise InputError(field, value, "a number")
    if isinstance(value, int):
        return str(value)
    number = float(value)
    if not math.isfinite(number):
        raise InputError(field, value, "a finite number")
    text = repr(number)
    if text.endswith(".0"):
        text = text[:-2]
    return text.replace("e+", "e")


def share_query(inputs: Mapping[str, object], settings: Mapping[str, object] | None = None) -> str:
    """The URL query (without "?") for the `engine.check` keywords in `inputs`.

    `settings` holds page keys (`PAGE_KEYS`); None values are left out. Keys
    come in the order of `KEYS`; unknown keys raise `InputError`, so a link
    never silently drops an input.
    """
    settings = dict(settings or {})
    unknown = sorted(set(inputs) - set(CHECK_KEYS)) or sorted(set(settings) - set(PAGE_KEYS))
    if unknown:
        source = inputs if unknown[0] in inputs else settings
        raise InputError(unknown[0], source[unknown[0]],
                         "one of " + ", ".join(CHECK_KEYS + PAGE_KEYS))
    if "units" not in inputs:
        raise InputError("units", None, "'us' or 'si'")
    system = unit_system(inputs["units"])
    pairs = [("units", system.name)]
    for key in NUMBER_KEYS:
        value = inputs.get(key)
        if value is None:
            if key == "Mu" and "Mu" in inputs:
                pairs.append(("Mu", ""))  # the page's "no demand", not its default
            continue
        if key == "es" and not isinstance(value, bool) and value == system.default_es:
            continue
        pairs.append((key, format_number(value, key)))
    pairs += [("layer", text) for text in _layer_texts(inputs.get("layers") or ())]
    spiral = inputs.get("spiral", False)
    if not isinstance(spiral, bool):
        raise InputError("spiral", spiral, "true or false")
    if spiral:
        pairs.append(("spiral", "1"))
    for key in PAGE_KEYS:
        value = settings.get(key)
        if value is None:
            continue
        pairs.append((key, _page_text(key, value)))
    return urlencode(pairs, safe=_SAFE)


def share_url(base: str, inputs: Mapping[str, object],
              settings: Mapping[str, object] | None = None) -> str:
    """`base` (the app's address) with the query of `inputs` and `settings`.

    Any query `base` already has is kept, except keys this link sets; its
    fragment is kept too.
    """
    parts = urlsplit(base)
    ours = {key.lower() for key in KEYS}
    kept = [(k, v) for k, v in parse_qsl(parts.query, keep_blank_values=True)
            if k.lower() not in ours]
    query = share_query(inputs, settings)
    if kept:
        query = urlencode(kept) + "&" + query
    return urlunsplit((parts.scheme, parts.netloc, parts.path or "/", query, parts.fragment))


@dataclass(frozen=True)
class LinkReading:
    """What a query carries, read leniently.

    `values` holds every key that read well (the first of each, except the
    repeatable `layer`, gathered as `layers`: a list of (area, depth)) as
    check keywords and page keys; `problems` one `InputError` per value that
    did not (its `value` is the raw text); `repeated` maps a key given more
    than once to its count (the first was used); `unread` counts the fields
    past the first `MAX_FIELDS`, which are not read at all.
    """

    values: dict = field(default_factory=dict)
    problems: tuple[InputError, ...] = ()
    repeated: dict = field(default_factory=dict)
    unread: int = 0


def read_share_query(query: str) -> LinkReading:
    """Read a query ("?a=1&b=2", without "?", or a whole URL) without raising.

    Keys match without regard to case; other keys are ignored (a link may
    carry the app's own state); only the first `MAX_FIELDS` fields are read.
    Values are typed here (numbers, the flag, the words), not range-checked:
    `engine.check` and `engine.design_section` do that, with the same field
    names.
    """
    if "?" in query:
        query = query.split("?", 1)[1]
    query = query.split("#", 1)[0]
    fields = [part for part in query.split("&") if part]
    unread = max(0, len(fields) - MAX_FIELDS)
    pairs = parse_qsl("&".join(fields[:MAX_FIELDS]), keep_blank_values=True)
    values: dict = {}
    problems: list[InputError] = []
    counts: dict[str, int] = {}
    layers: list[tuple[float, float]] = []
    for raw_key, text in pairs:
        key = _CANONICAL.get(raw_key.strip().lower())
        if key is None:
            continue
        counts[key] = counts.get(key, 0) + 1
        if key == "layer":
            try:
                layers.append(_layer(text, counts[key]))
            except InputError as error:
                problems.append(error)
            continue
        if counts[key] > 1:
            continue
        try:
            values[key] = _value(key, text)
        except InputError as error:
            problems.append(error)
    if layers:
        values["layers"] = layers
    repeated = {key: n for key, n in counts.items() if n > 1 and key != "layer"}
    return LinkReading(values=values, problems=tuple(problems), repeated=repeated,
                       unread=unread)


def parse_share_query(query: str) -> dict:
    """The `engine.check` keywords a share query carries.

    Accepts the query with or without its leading "?", or a whole URL. Page
    keys and others are left out; a key given twice (other than `layer`), or
    a value that does not read as its kind, raises `InputError` naming the
    key. Values are not range-checked here: `engine.check` does that, with
    the same field names.
    """
    reading = read_share_query(query)
    if reading.problems:
        raise reading.problems[0]
    if reading.repeated:
        key = next(iter(reading.repeated))
        raise InputError(key, reading.values.get(key), "one value (the key is given twice)")
    return {key: value for key, value in reading.values.items() if key in CHECK_KEYS}


def _value(key: str, text: str) -> object:
    stripped = text.strip()
    if key == "units":
        return stripped.lower() if stripped.lower() in ("us", "si") else _refuse(
            key, text, "'us' or 'si'")
    if key in ("spiral", "waiver", "frame"):
        lowered = stripped.lower()
        if lowered not in _TRUE + _FALSE:
            _refuse(key, text, "1 or 0 (true or false)")
        return lowered in _TRUE
    if key == "shape":
        word = _SHAPE_WORDS.get(stripped.lower())
        return word if word is not None else _refuse(key, text, "rect, T or L")
    if key == "stirrup":
        return stripped if _DESIGNATION.fullmatch(stripped) else _refuse(
            key, text, "a bar designation such as #3 or 10")
    if key == "support":
        lowered = stripped.lower()
        if lowered not in [s.value for s in Support]:
            _refuse(key, text, "one of " + ", ".join(s.value for s in Support))
        return lowered
    if key == "order":
        lowered = stripped.lower()
        if lowered not in [o.value for o in Order]:
            _refuse(key, text, "one of " + ", ".join(o.value for o in Order))
        return lowered
    if key == "nlayers":
        return int(stripped) if stripped in ("1", "2") else _refuse(key, text, "1 or 2")
    if key == "drawn":
        # The bars as drawn, one entry a tension layer (the first layer first), blank
        # for a layer given as an area: "4x9,,2x8". Sizes are checked with the units.
        if not all(_DRAWN.fullmatch(item) for item in stripped.split(",")):
            _refuse(key, text, "COUNTxBAR for each tension layer, such as 4x9,2x8 "
                               "(blank for a layer given by its area)")
        return stripped
    if key == "bars":
        read_bars(text)
        return stripped
    if stripped == "" and key in _BLANK_IS_NONE:
        return None
    return _number(key, text)


def read_bars(text: str) -> tuple[str, tuple[int, ...]]:
    """A `bars` value (BAR:COUNTS, the bottom layer first) as its designation and counts.

    `"#8:4,2"` is `("#8", (4, 2))`; anything else raises `InputError` naming `bars`.
    """
    match = _BARS.fullmatch(text.strip())
    if match is None:
        _refuse("bars", text, "BAR:COUNTS, the bottom layer first, such as #8:4,2")
    designation, counts = match.groups()
    return "#" + designation.lstrip("#"), tuple(int(n) for n in counts.split(","))


def _number(key: str, text: str) -> float:
    return decimal_text(key, text)


def _layer(text: str, index: int) -> tuple[float, float]:
    area, at, depth = text.partition("@")
    if not at:
        _refuse("layer", text, "AREA@DEPTH, e.g. 1.58@21.5")
    return _number(f"layer {index} area", area), _number(f"layer {index} depth", depth)


def _layer_texts(layers: Iterable) -> list[str]:
    texts = []
    for index, item in enumerate(layers, start=1):
        try:
            area, depth = item
        except (TypeError, ValueError):
            raise InputError("layers", item, "(area, depth) pairs") from None
        texts.append(f"{format_number(area, f'layer {index} area')}@"
                     f"{format_number(depth, f'layer {index} depth')}")
    return texts


def _page_text(key: str, value: object) -> str:
    if key in PAGE_NUMBER_KEYS:
        return format_number(value, key)
    if key == "nlayers":
        if value not in (1, 2) or isinstance(value, bool):
            raise InputError(key, value, "1 or 2")
        return str(int(value))
    if key in ("waiver", "frame"):
        if not isinstance(value, bool):
            raise InputError(key, value, "true or false")
        return "1" if value else "0"
    text = str(value.value if isinstance(value, (Support, Order)) else value)
    _value(key, text)  # refuse what could not be read back
    return text


def _refuse(key: str, text: str, accepted: str):
    raise InputError(key, text, accepted)
