"""The calculation sheet as a filed document: blank header lines, who checked it, where the
link opens, the section sketch, the bars, and numbered pages with the header on each.

References: the sketch's geometry is compared with the inputs and with a and c computed
here by hand (ACI 318-19 22.2.2.4.1: a = As·fy / (0.85 f'c b), yielded steel); the
private and loopback address ranges are RFC 1918, RFC 4193 and RFC 5735 / 4291.
"""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET

import pytest

import engine
from engine.documents.sheet import BLANK, calculation_sheet, link_reach
from self_contained import outside_resources
from test_sheet import CASES, GENERAL, parse

B101 = CASES["B-101-us"]


def test_header_fields_left_empty_print_a_line_to_fill_in():
    sheet = parse(calculation_sheet(B101))
    for field in ("project", "mark", "engineer", "checked_by", "date"):
        assert sheet.fields[field] == BLANK, field
    assert set(BLANK) == {"_"}
    text = "".join(sheet.text)
    assert "Harbourline" not in text and "B-204" not in text  # no demo name by default
    assert re.search(r"Project:\s*_{8,}", text)


def test_checked_by_is_printed_next_to_the_engineer_and_escaped():
    document = calculation_sheet(B101, engineer="R. Ortega", checked_by="<b>M. Lund</b>")
    sheet = parse(document)
    assert sheet.fields["engineer"] == "R. Ortega"
    assert sheet.fields["checked_by"] == "<b>M. Lund</b>"
    assert "<b>M. Lund" not in document
    assert document.index('data-field="engineer"') < document.index('data-field="checked_by"')


@pytest.mark.parametrize("link, host", [
    ("http://localhost:5006/?units=us", "localhost"),
    ("http://127.0.0.1:8000/?units=us", "127.0.0.1"),
    ("http://127.8.9.10/", "127.8.9.10"),  # all of 127.0.0.0/8 is loopback (RFC 5735)
    ("http://[::1]:5006/?units=us", "::1"),
    ("http://LOCALHOST./", "localhost"),
], ids=["localhost", "127.0.0.1", "127/8", "ipv6", "upper-case-dot"])
def test_a_local_link_says_it_opens_only_on_the_serving_computer(link, host):
    note = link_reach(link)
    assert note is not None and "only on the computer that served" in note and host in note
    document = calculation_sheet(B101, link=link)
    sheet = parse(document)
    assert note in "".join(sheet.text)
    footer = document[document.index('class="footer"'):]
    # Beside the link: in the same footer block, right after the printed address.
    assert footer.index('class="url"') < footer.index("data-reach") < footer.index("</section>")


@pytest.mark.parametrize("link", [
    "http://192.168.1.20:5006/?units=us",  # RFC 1918
    "http://10.4.0.7/",  # RFC 1918
    "http://172.16.0.9:5006/",  # RFC 1918
    "http://[fd12:3456::1]/",  # RFC 4193 unique local
])
def test_a_private_network_link_says_so(link):
    note = link_reach(link)
    assert note is not None and "private network" in note


@pytest.mark.parametrize("link", [
    "https://rhoscope.example.org/?units=us", "http://8.8.8.8/", "", "http://[::1",
    "file:///tmp/sheet.html",
])
def test_a_public_or_unreadable_link_gets_no_note(link):
    assert link_reach(link) is None
    document = calculation_sheet(B101, link=link)
    assert "data-reach" not in document


def test_words_break_only_between_words_and_only_links_and_user_text_anywhere():
    style = parse(calculation_sheet(B101)).style
    assert not re.search(r"word-break:\s*break-all", style)
    assert not re.search(r"hyphens:\s*auto", style)
    for rule in re.findall(r"([^{}]+)\{([^}]*overflow-wrap:\s*anywhere[^}]*)\}", style):
        selectors = {s.strip() for s in rule[0].split(",")}
        assert selectors <= {".header td.value", ".url", ".running span"}, selectors


def _sketch(document: str) -> ET.Element:
    """The section sketch's <svg> out of a sheet, parsed as XML (it is well-formed)."""
    svg = re.search(r'<svg class="section-sketch".*?</svg>', document, re.S).group(0)
    return ET.fromstring(svg)


def _depth_on_drawing(svg: ET.Element, element: ET.Element) -> float:
    """A horizontal line's depth below the top face, in the section's length units."""
    return (float(element.get("y1")) - float(svg.get("data-top"))) / float(svg.get("data-scale"))


def test_the_sketch_draws_b_d_and_a_of_b204():
    # Harbourline Depot B-204: 14 in × d 21.5 in, As 3.16 in², f'c 4000 psi, fy 60000 psi.
    inputs = dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, Mu=190)
    a = 3.16 * 60000 / (0.85 * 4000 * 14)  # 22.2.2.4.1 with C = T, steel yielding: 3.983 in
    svg = _sketch(calculation_sheet(inputs))
    texts = [t.text for t in svg.iter("text")]
    assert "b = 14 in" in texts and "d = 21.5 in" in texts and "As = 3.16 in²" in texts
    assert f"a = {a:.3f} in" in texts
    assert "h not given: drawn to the deepest steel" in texts
    block = next(e for e in svg.iter("rect") if e.get("data-part") == "block")
    scale = float(svg.get("data-scale"))
    assert float(block.get("height")) / scale == pytest.approx(a, abs=0.1 / scale)
    assert float(block.get("width")) / scale == pytest.approx(14, abs=0.1 / scale)
    steel = [e for e in svg.iter("line") if e.get("data-part") == "steel"]
    assert len(steel) == 1 and _depth_on_drawing(svg, steel[0]) == pytest.approx(21.5, abs=0.1)
    bottom = next(e for e in svg.iter("line") if e.get("data-part") == "bottom")
    assert bottom.get("stroke-dasharray")  # drawn to d, not a real face


def test_the_sketch_draws_every_layer_the_flange_h_and_compression_steel():
    inputs = GENERAL["G-4-si-layers"]  # 350 × 800 mm, bf 1200, hf 120, two layers, A's 600
    svg = _sketch(calculation_sheet(inputs))
    texts = [t.text for t in svg.iter("text")]
    assert "h = 800 mm" in texts and "bw = 350 mm" in texts
    assert "bf = 1200 mm, hf = 120 mm" in texts
    assert "A′s = 600 mm² at d′ = 60 mm" in texts
    assert "As,1 = 2940 mm² at 720 mm" in texts and "As,2 = 1470 mm² at 660 mm" in texts
    # d is the tension centroid (2.2): (2940·720 + 1470·660) / 4410 = 700 mm.
    assert "d = 700.0 mm" in texts
    steel = {(e.get("data-role"), float(e.get("data-area"))): _depth_on_drawing(svg, e)
             for e in svg.iter("line") if e.get("data-part") == "steel"}
    assert steel == pytest.approx({("tension", 2940): 720, ("tension", 1470): 660,
                                   ("compression", 600): 60}, abs=0.5)
    bottom = next(e for e in svg.iter("line") if e.get("data-part") == "bottom")
    assert bottom.get("stroke-dasharray") is None
    assert _depth_on_drawing(svg, bottom) == pytest.approx(800, abs=0.5)


@pytest.mark.parametrize("bars, shown", [
    ("#8:4,2", "4 #8 + 2 #8 (2 layers)"),
    ("#8:4", "4 #8 (1 layer)"),
    ("25:3", "3 #25 (1 layer)"),
    (None, "area typed: bars not specified"),
])
def test_the_bars_as_placed_are_stated(bars, shown):
    sheet = parse(calculation_sheet(B101, bars=bars))
    assert f"Bars: {shown}" in "".join(sheet.text)


def test_malformed_bars_are_refused_naming_the_field():
    with pytest.raises(engine.InputError, match="^bars:"):
        calculation_sheet(B101, bars="<b>8</b>:4")


def test_every_page_starts_with_the_header_and_its_number():
    document = calculation_sheet(B101, project="Harbourline Depot", mark="B-204",
                                 date="2025-03-14")
    pages = re.findall(r'<div class="page" data-page="(\d+)">(.*?)(?=<div class="page"|</main>)',
                       document, re.S)
    assert [int(n) for n, _ in pages] == list(range(1, engine.documents.sheet.PAGES + 1))
    for number, content in pages:
        running = parse(content)
        text = "".join(running.text)
        assert content.startswith('<div class="running">')
        assert "Project: Harbourline Depot" in text and "Beam mark: B-204" in text
        assert "Date: 2025-03-14" in text
        assert f"page {number} of {engine.documents.sheet.PAGES}" in text
    assert re.search(r"\.page \+ \.page\s*{[^}]*break-before:\s*page", parse(document).style)
    assert outside_resources(document) == []
    # The caution is on the sheet (on its last page, beside the link).
    assert engine.CAUTION in "".join(parse(pages[-1][1]).text)


def test_a_blank_running_header_prints_lines_to_fill_in():
    text = "".join(parse(calculation_sheet(B101)).text)
    assert f"Project: {BLANK}" in text and f"Beam mark: {BLANK}" in text
