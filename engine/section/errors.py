"""The engine's errors: one root, and one concrete error for bad input.

`InputError` subclasses `ValueError` so callers that only know the built-in
still catch it; it keeps its fields so a UI can point at the widget that is
wrong instead of parsing the message.

Every message quotes what was given through `quoted`, which shortens a long
value: a 100 kB paste must not come back as a 100 kB message.
"""

from __future__ import annotations

QUOTE_LIMIT = 40
"""Characters of a long value quoted in a message; the rest are counted, not shown."""


def quoted(value: object) -> str:
    """`value` as a message quotes it: its repr, or for a long one the start and the length.

    A text longer than a few dozen characters shows its first `QUOTE_LIMIT`
    characters and how many there are, e.g. `'9999999999…' (102,400 characters)`.
    The repr escapes line breaks and control characters, so a message stays one line.
    """
    text = value if isinstance(value, str) else repr(value)
    if len(text) <= QUOTE_LIMIT + 20:
        return repr(value)
    head = repr(text[:QUOTE_LIMIT]) if isinstance(value, str) else text[:QUOTE_LIMIT]
    return f"{head}… ({len(text):,} characters)"


class RhoscopeError(Exception):
    """Root of every error the engine raises on purpose."""


class InputError(RhoscopeError, ValueError):
    """An input that cannot be computed: wrong type, not finite, or out of range.

    `field` is the input's public name (as on the CLI and in share links),
    `value` what was given, and `accepted` the range or set that would do.
    """

    def __init__(self, field: str, value: object, accepted: str, why: str = "") -> None:
        self.field = field
        self.value = value
        self.accepted = accepted
        self.why = why
        super().__init__(str(self))

    def __str__(self) -> str:
        given = "missing" if self.value is None else f"{quoted(self.value)} is not accepted"
        text = f"{self.field}: {given}; expected {self.accepted}"
        return f"{text} ({self.why})" if self.why else text
