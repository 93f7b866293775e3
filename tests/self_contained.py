"""Whether an HTML document would load or run anything: the test of a self-contained file."""

from __future__ import annotations

import re
from html.parser import HTMLParser

_LOADING_TAGS = ("script", "link", "img", "iframe", "object", "embed", "base", "form")
_LOADING_ATTRIBUTES = ("src", "href", "xlink:href", "action", "srcset", "poster", "data")


class _Outside(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.problems: list[str] = []

    def handle_starttag(self, tag, attrs):
        if tag in _LOADING_TAGS:
            self.problems.append(f"<{tag}>")
        for name, value in attrs:
            if name in _LOADING_ATTRIBUTES:
                self.problems.append(f"{tag} {name}={value}")
            if name.startswith("on"):
                self.problems.append(f"{tag} {name}")


def outside_resources(document: str) -> list[str]:
    """Every tag, attribute or CSS rule in `document` that would fetch or run something."""
    checker = _Outside()
    checker.feed(document)
    problems = checker.problems
    if re.search(r"url\(|@import", document):
        problems.append("CSS url() or @import")
    return problems
