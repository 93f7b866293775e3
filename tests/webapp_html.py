"""Reading the app's result markup the way a test needs it: values by `data-q`, and tags."""

from __future__ import annotations

from html.parser import HTMLParser


class _Reader(HTMLParser):
    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.values: dict[str, list[str]] = {}
        self.tags: list[tuple[str, dict]] = []
        self._open: list[str | None] = []

    def handle_starttag(self, tag, attrs):
        attributes = dict(attrs)
        self.tags.append((tag, attributes))
        if tag in ("br",):
            return
        name = attributes.get("data-q")
        self._open.append(name)
        if name is not None:
            self.values.setdefault(name, []).append("")

    def handle_endtag(self, tag):
        if tag != "br" and self._open:
            self._open.pop()

    def handle_data(self, data):
        for name in self._open:
            if name is not None:
                self.values[name][-1] += data


def displayed(markup: str) -> dict[str, list[str]]:
    """Text shown under each `data-q` name, in page order."""
    reader = _Reader()
    reader.feed(markup)
    return reader.values


def tags(markup: str) -> list[tuple[str, dict]]:
    """Every start tag in `markup` with its attributes."""
    reader = _Reader()
    reader.feed(markup)
    return reader.tags


def number(text: str) -> float:
    """A displayed number ("60,000", "−0.3100", "+2.157") as a float."""
    return float(text.replace(",", "").replace("−", "-").strip())
