"""The calculation sheet as a filed document: blank header lines, who checked it, where the
link opens, the section sketch, the bars, and numbered pages with the header on each.

References: the sketch's geometry is compared with the inputs and with a and c computed
here by hand (ACI 318-19 22.2.2.4.1: a = As·fy / (0.85 f'c b), yielded steel); the
private and loopback address ranges are RFC 1918, RFC 4193 and RFC 5735 / 4291.
"""

from __future__ import annotations

import re

import pytest

import engine
from engine.sheet import BLANK, calculation_sheet, link_reach
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
        assert selectors <= {".header td.value", ".url"}, selectors
