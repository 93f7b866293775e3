"""Number boxes that read what was typed strictly: a number, blank, or a refusal that says why.

Bokeh's own number box drops a character it cannot read as it is typed, and
turns a value below its lower bound into the bound: "5,000" or letters
reverted without a word, −100 stayed in the box while another Mu was checked,
and a cleared box showed "NaN". These boxes are plain text boxes. The page
reads their text with `read_number`, computes what it reads, and refuses what
it cannot read with the field named (the "Not checked" treatment); the engine
refuses a number out of its range the same way.
"""

from __future__ import annotations

import panel as pn

from engine.section.validation import decimal_text

SHOWN_DECIMALS = 4  # a value the page sets is shown to 4 decimals, trailing zeros dropped


def shown_number(value: float | None) -> str:
    """`value` as the box shows it: "" for none, "21.5", "3.1416", "60000"."""
    if value is None:
        return ""
    text = f"{value:.{SHOWN_DECIMALS}f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


def read_number(field: str, text: str | None) -> float | None:
    """The number typed for `field`; None for a blank box; `engine.InputError` if unreadable."""
    if text is None or not text.strip():
        return None
    return decimal_text(field, text)


def number_box(label: str, value: float | None, css_class: str, **layout) -> pn.widgets.TextInput:
    """A text box for one number, showing `value`."""
    return pn.widgets.TextInput(label=label, value=shown_number(value), css_classes=[css_class],
                                **layout)


def shows(box: pn.widgets.TextInput, value: float | None) -> bool:
    """Whether `box` already shows `value` (as typed or as the page wrote it)."""
    try:
        typed = read_number("value", box.value)
    except ValueError:
        return False
    if typed is None or value is None:
        return typed is value
    return shown_number(typed) == shown_number(value)
