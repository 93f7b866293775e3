"""The share link: one check's inputs as a URL query, and back.

A link reproduces the check exactly: every number is written in the shortest
form that reads back as the same float (`repr`), so parsing the query gives
the very inputs that made it. Keys are the inputs' public names, the same as
`engine.check`'s keywords and the CLI's flags: units, fc, fy, b, d, As, Mu,
dt, es, spiral. Inputs left at their defaults (None, spiral off, Es of
ACI 318-19 20.2.2.2 for the unit system) are left out.

Example: ``?units=us&fc=4000&fy=60000&b=12&d=21.5&As=3.16&Mu=180``.
"""

from __future__ import annotations

import math
import re
from collections.abc import Mapping
from numbers import Real
from urllib.parse import parse_qsl, urlencode, urlsplit, urlunsplit

from .errors import InputError
from .units import unit_system

NUMBER_KEYS = ("fc", "fy", "b", "d", "As", "Mu", "dt", "es")
KEYS = ("units",) + NUMBER_KEYS + ("spiral",)

# What a link may carry for a number: the decimal forms `format_number` writes
# and people type; no "nan", "inf", underscores or hexadecimal.
_NUMBER_TEXT = re.compile(r"[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?")
_TRUE, _FALSE = ("1", "true", "yes", "on"), ("0", "false", "no", "off")


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


def share_query(inputs: Mapping[str, object]) -> str:
    """The URL query (without "?") for the `engine.check` keywords in `inputs`.

    Keys come in the order of `KEYS`; unknown keys raise `InputError`, so a
    link never silently drops an input.
    """
    unknown = sorted(set(inputs) - set(KEYS))
    if unknown:
        raise InputError(unknown[0], inputs[unknown[0]], "one of " + ", ".join(KEYS))
    if "units" not in inputs:
        raise InputError("units", None, "'us' or 'si'")
    system = unit_system(inputs["units"])
    pairs = [("units", system.name)]
    for key in NUMBER_KEYS:
        value = inputs.get(key)
        if value is None:
            continue
        if key == "es" and not isinstance(value, bool) and value == system.default_es:
            continue
        pairs.append((key, format_number(value, key)))
    spiral = inputs.get("spiral", False)
    if not isinstance(spiral, bool):
        raise InputError("spiral", spiral, "true or false")
    if spiral:
        pairs.append(("spiral", "1"))
    return urlencode(pairs)


def share_url(base: str, inputs: Mapping[str, object]) -> str:
    """`base` (the app's address) with the query of `inputs`.

    Any query `base` already has is kept, except keys this link sets; its
    fragment is kept too.
    """
    parts = urlsplit(base)
    kept = [(k, v) for k, v in parse_qsl(parts.query, keep_blank_values=True) if k not in KEYS]
    query = share_query(inputs)
    if kept:
        query = urlencode(kept) + "&" + query
    return urlunsplit((parts.scheme, parts.netloc, parts.path or "/", query, parts.fragment))


def parse_share_query(query: str) -> dict:
    """The `engine.check` keywords a share query carries.

    Accepts the query with or without its leading "?", or a whole URL. Keys
    other than `KEYS` are ignored (a link may carry the app's own state);
    a key given twice, or a value that is not a plain decimal number, raises
    `InputError` naming the key. Values are not range-checked here:
    `engine.check` does that, with the same field names.
    """
    if "?" in query:
        query = query.split("?", 1)[1]
    query = query.split("#", 1)[0]
    result: dict = {}
    for key, text in parse_qsl(query, keep_blank_values=True):
        if key not in KEYS:
            continue
        if key in result:
            raise InputError(key, text, "one value (the key is given twice)")
        if key == "units":
            result[key] = text
        elif key == "spiral":
            lowered = text.strip().lower()
            if lowered not in _TRUE + _FALSE:
                raise InputError(key, text, "1 or 0 (true or false)")
            result[key] = lowered in _TRUE
        else:
            if not _NUMBER_TEXT.fullmatch(text.strip()):
                raise InputError(key, text, "a decimal number such as 4000 or 3.16")
            result[key] = float(text)
    return result
