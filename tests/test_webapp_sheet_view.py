"""The calculation-sheet view without a browser: the engine's sheet, escaped, downloadable.

The reference is `engine.calculation_sheet` itself (the view must add
nothing and drop nothing); the hostile header is checked with the standard
library's HTML parser on the preview and on the file.
"""

from __future__ import annotations

import html
from html.parser import HTMLParser

import pytest

import engine
from engine.documents.sheet import calculation_sheet
from webapp.page import BeamCheckPage
from webapp.sheet_view import SheetView, preview_html, qr_svg, sheet_filename

# Beam B-204, Harbourline Depot (invented): the page's default beam.
B204 = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190)
LINK = "http://localhost:5006/?units=us&fc=4000&fy=60000&b=14&d=21.5&As=3.16&Mu=190"
HOSTILE = {
    "project": '<script>alert("x")</script><img src=x onerror=alert(1)>',
    "mark": 'B-204"><b onmouseover=alert(1)>bold</b>',
    "engineer": "</iframe><script>alert(2)</script>",
    "date": "2025-03-14 & <i>today</i>",
}


class _Tags(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.tags: list[tuple[str, dict]] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append((tag, dict(attrs)))


def tags_of(document: str) -> list[tuple[str, dict]]:
    parser = _Tags()
    parser.feed(document)
    return parser.tags


@pytest.fixture
def view():
    return SheetView(lambda: dict(B204), lambda: LINK, project="Harbourline Depot",
                     mark="B-204", engineer="R. Ortega", date="2025-03-14")


def test_the_sheet_is_the_engines_for_the_inputs(view):
    view.refresh()
    assert view.document == calculation_sheet(
        B204, project="Harbourline Depot", mark="B-204", engineer="R. Ortega",
        date="2025-03-14", link=LINK, qr_svg=qr_svg(LINK))


def test_download_is_the_same_document(view):
    data = view._download_file().getvalue().decode("utf-8")
    assert data == view.document and data.startswith("<!DOCTYPE html>")
    phiMn = engine.check(**B204).phiMn
    assert f'data-value="{engine.documents.share_link.format_number(phiMn)}"' in data


def test_preview_is_one_sandboxed_iframe_holding_the_document(view):
    view.refresh()
    tags = tags_of(view.frame.object)
    assert [tag for tag, _ in tags] == ["iframe"]  # nothing else reaches the page
    attributes = tags[0][1]
    assert attributes["sandbox"] == ""  # no scripts, forms or navigation inside
    assert attributes["srcdoc"] == view.document  # the parser unescapes the attribute


def test_hostile_header_text_is_never_markup(view):
    view.param.update(**HOSTILE)
    document = view.document
    names = [tag for tag, _ in tags_of(document)]
    assert "script" not in names and "img" not in names and "b" not in names and "i" not in names
    for text in HOSTILE.values():
        assert html.escape(text, quote=True) in document
    outer = [tag for tag, _ in tags_of(view.frame.object)]
    assert outer == ["iframe"]


def test_header_changes_redraw_and_rename_the_download(view):
    view.refresh()
    view.mark = "G-3 / level 2"
    assert "G-3 / level 2" in view.document
    assert view.download.filename == "G-3-level-2-calculation-sheet.html"
    assert sheet_filename('../../etc/"passwd"') == "etc-passwd-calculation-sheet.html"
    assert sheet_filename("") == "beam-calculation-sheet.html"


def test_bad_inputs_keep_the_last_sheet_and_say_why():
    inputs = dict(B204)
    view = SheetView(lambda: dict(inputs), lambda: LINK)
    view.refresh()
    good = view.document
    inputs["fc"] = -1
    view.refresh()
    assert view.document == good
    assert "fc" in view.message.object and "No sheet" in view.message.object


def test_a_flanged_doubly_reinforced_check_gets_its_sheet():
    inputs = dict(units="us", fc=4000, fy=60000, b=12, bf=48, hf=4, h=30,
                  layers=[(3.16, 27.5), (2.37, 24.5)], asc=1.2, dc=2.5, Mu=400)
    view = SheetView(lambda: inputs, lambda: "")
    view.refresh()
    assert view.document == calculation_sheet(inputs, project=view.project, mark=view.mark,
                                              engineer=view.engineer, date=view.date)


def test_on_the_page_the_sheet_follows_the_inputs_only_while_shown():
    page = BeamCheckPage()
    titles = list(page.views._names)
    assert "Calculation sheet" in titles and "Beam schedule" in titles
    index = titles.index("Calculation sheet")
    view = page.sheet_view
    page.views.active = index
    before = view.document
    page.As = 4.0
    assert view.document != before  # shown: redrawn at once
    assert view.document == calculation_sheet(
        page.current_inputs(), project=view.project, mark=view.mark, engineer=view.engineer,
        date=view.date, link=page.share_url(), qr_svg=qr_svg(page.share_url()))
    page.views.active = 0
    shown = view.document
    page.As = 3.5
    assert view.document == shown  # hidden: only marked stale
    page.views.active = index
    assert view.document != shown and "3.5 in²" in view.document



def test_project_and_mark_start_blank_with_the_example_only_as_a_placeholder():
    view = SheetView(lambda: dict(B204), lambda: LINK)
    assert view.project == "" and view.mark == "" and view.checked_by == ""
    assert "Harbourline Depot" in view.fields["project"].placeholder
    assert "B-204" in view.fields["mark"].placeholder
    view.refresh()
    assert "Harbourline" not in view.document and "B-204" not in view.document
    assert view.document == calculation_sheet(B204, date=view.date, link=LINK,
                                              qr_svg=qr_svg(LINK))


def test_checked_by_reaches_the_sheet(view):
    view.refresh()
    view.checked_by = "M. Lund"
    assert 'data-field="checked_by">M. Lund<' in view.document
    assert "Checked by" in [field.name for field in view.fields.values()]


def test_the_pages_chosen_bars_reach_the_sheet():
    page = BeamCheckPage()
    view = page.sheet_view
    view.refresh()
    assert "Bars: area typed: bars not specified" in view.document
    page.size_bars.choice.value = 0
    page.size_bars.use_selected()  # "Use in the check": the page now holds bars
    designation, counts = page.bars.split(":")
    counts = counts.split(",")
    expected = " + ".join(f"{n} {designation}" for n in counts)
    view.refresh()
    assert f"Bars: {expected} ({len(counts)} layer" in view.document
