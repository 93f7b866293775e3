"""Bars as drawn: a count of one standard bar size, as a drawing writes a layer ("4-#9").

An engineer reads a layer off a drawing as a count and a size; its area is
the count times the bar's nominal area (ASTM A615/A615M Table 1, in
`bars.py`), exactly. A group is written for people as "4 #9" (or "4 No. 25"
in SI) and in a share link as "4x9".
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from .bars import Bar, bar
from .errors import InputError
from .units import UnitSystem

MAX_COUNT = 99  # bars in one layer: far past any beam's, so a typo is caught

# "4-#9", "4 #9", "4#9", "4x9", "4 x #9", "4×9", "4 No. 25", "4-25M"
# A separator, or a size written with # or No., between count and size ("49" is refused).
_SIZE = r"(?:#|no\.?\s*)?[0-9]{1,2}m?"
_GROUP = re.compile(r"\s*([0-9]{1,3})\s*(?:(?:[-x×*]|\s)\s*(" + _SIZE + r")|((?:#|no\.?\s*)"
                    r"[0-9]{1,2}m?))\s*", re.IGNORECASE)
ACCEPTED = "a count and a bar size, such as 4 #9, 4-#9 or 4x9 (4 No. 25 in SI)"


@dataclass(frozen=True)
class BarGroup:
    """`count` bars of one standard size."""

    count: int
    bar: Bar

    @property
    def area(self) -> float:
        """The count times the bar's nominal area (ASTM A615/A615M Table 1)."""
        return self.count * self.bar.area

    @property
    def text(self) -> str:
        """As people write it: "4 #9", or "4 No. 25" for an A615M bar."""
        size = self.bar.designation if self.bar.designation.startswith("#") else (
            f"No. {self.bar.designation}")
        return f"{self.count} {size}"

    @property
    def link_text(self) -> str:
        """As a share link writes it: "4x9"."""
        return f"{self.count}x{self.bar.number}"


def bar_group(field: str, text: str, system: UnitSystem) -> BarGroup:
    """The group `text` writes, or an `InputError` naming `field` and what is accepted."""
    match = _GROUP.fullmatch(text or "")
    if match is None:
        raise InputError(field, text, ACCEPTED)
    count = int(match.group(1))
    if not 1 <= count <= MAX_COUNT:
        raise InputError(field, text, f"1 to {MAX_COUNT} bars in a layer")
    return BarGroup(count, bar(field, match.group(2) or match.group(3), system))
