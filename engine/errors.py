"""The engine's errors: one root, and one concrete error for bad input.

`InputError` subclasses `ValueError` so callers that only know the built-in
still catch it; it keeps its fields so a UI can point at the widget that is
wrong instead of parsing the message.
"""

from __future__ import annotations


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
        given = "missing" if self.value is None else f"{self.value!r} is not accepted"
        text = f"{self.field}: {given}; expected {self.accepted}"
        return f"{text} ({self.why})" if self.why else text
