"""The served page's HTML shell: Panel's own, with a viewport meta tag.

Without one, a phone lays the page out 980 px wide and shows it at about 0.4
scale (text of about 5 px). The static build adds the same tag in
`build_page.VIEWPORT`.
"""

from __future__ import annotations

from panel.io.resources import BASE_TEMPLATE

from .build_page import VIEWPORT

SERVED_TEMPLATE = BASE_TEMPLATE.environment.from_string(
    '{% extends "base.html" %}{% block preamble %}' + VIEWPORT + '{{ super() }}{% endblock %}')


SERVING = False
"""Set by `webapp.serve` only: `panel convert` runs app.py too, and builds its own page."""


def use_served_template(document) -> None:
    """Serve `document` with the viewport tag in its head, when `python -m webapp serve` runs."""
    if SERVING:
        document.template = SERVED_TEMPLATE
