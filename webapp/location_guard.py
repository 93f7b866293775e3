"""The browser's address for the page, kept safe from Panel's own query parsing.

Panel's `Location` turns every query value into a Python value
(`panel.util.parse_query`) each time the address is set: `int()` on any text
that `str.isdigit()` accepts. `int()` refuses some of those ('²' is a digit to
`isdigit`) and any number of more than 4,300 digits (Python's limit on
converting text to int), so a link such as `?x=%C2%B2` raised inside Panel
before the page could read it, and the page stayed blank. The page reads its
query itself (`state.parse_query`, through `engine.documents.share_link`) and syncs no
parameter through Panel's location, so its `Location` keeps the raw text and
never refuses a query: every query reaches the page's own reader and its
messages.
"""

from __future__ import annotations

from urllib.parse import parse_qsl

import panel as pn
from panel.io.location import Location


class RawQueryLocation(Location):
    """A `Location` whose `query_params` never raise (plain strings when Panel's parse fails)."""

    @property
    def query_params(self) -> dict:
        try:
            return super().query_params
        except Exception:  # int('²'), a 5,000-digit number, bad JSON-like text...
            return dict(parse_qsl(self.search[1:], keep_blank_values=True))


def page_location() -> Location | None:
    """The current session's `Location`, made a `RawQueryLocation` if the page makes it first.

    Panel keeps one location per document (`pn.state.location`) and creates it
    on first use; the page asks before anything else does, so this creates it.
    Outside a document (a test building the page alone) there is none.
    """
    doc = pn.state.curdoc
    if doc is None:
        return pn.state.location
    # Panel's own registry of per-document locations (what pn.state.location reads).
    locations = pn.state._locations
    location = locations.get(doc)
    if location is None:
        context = doc.session_context
        location = (RawQueryLocation.from_request(context.request) if context is not None
                    else RawQueryLocation())
        locations[doc] = location
    return location
