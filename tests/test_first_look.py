"""The first look: a link's own check as plain text, with only the standard library and the engine.

References: a hand computation of the over-reinforced link (below, closed
form of 22.2.1.2 strain compatibility with the Whitney block); the full
page's own result for the same link (the first look must show what the page
that replaces it shows); engine.CAUTION.
"""

from __future__ import annotations

import json
import math
import random
import subprocess
import sys

import pytest

import engine
import webapp.first_look as first_look_module
from pyodide_node import REPO, require_tools, run_in_pyodide
from webapp.first_look import first_look, first_look_json
from webapp.summary import fmt

FAILING = "?units=us&fc=3000&fy=60000&b=10&d=15&As=6&Mu=500"
LINKS = {
    "over-reinforced rectangle": FAILING,
    "SI rectangle": "?units=si&fc=28&fy=420&b=350&d=540&As=2040&Mu=260",
    "T with A's and a layer": "?units=us&fc=5000&fy=60000&b=14&d=24&As=4.8&Mu=350&shape=T&bf=48&hf=5"
                              "&asc=0.88&dc=2.5&layer=1.2@20.5&h=27",
    "no demand": "?units=us&fc=4000&fy=60000&b=12&d=20&As=2&Mu=",
}


def quantity(look: dict, label: str) -> str:
    return next(row[1] for row in look["quantities"] if row[0] == label)


def test_over_reinforced_link_by_hand():
    # Steel elastic (fs < fy): 0.85 f'c b β1 c = As Es εcu (d − c)/c, β1 = 0.85 for 3000 psi
    # (Table 22.2.2.4.3), εcu = 0.003 (22.2.2.1), Es = 29,000 ksi (20.2.2.2).
    fc, fy, b, d, As, Es = 3000.0, 60000.0, 10.0, 15.0, 6.0, 29e6
    beta1 = 0.85
    A, B, C = 0.85 * fc * b * beta1, As * Es * 0.003, -As * Es * 0.003 * d
    c = (-B + math.sqrt(B * B - 4 * A * C)) / (2 * A)
    fs = Es * 0.003 * (d - c) / c
    assert fs < fy
    eps_t = 0.003 * (d - c) / c
    Mn = As * fs * (d - beta1 * c / 2) / 12000.0  # kip·ft
    phiMn = 0.65 * Mn  # εt < εty: compression-controlled, Table 21.2.2
    look = first_look(FAILING)
    assert look["verdict"]["kind"] == "bad" and look["verdict"]["title"] == "✘ Does not pass"
    assert float(quantity(look, "Design strength φMn")) == pytest.approx(phiMn, abs=0.05)
    assert float(quantity(look, "Net tensile strain εt")) == pytest.approx(eps_t, rel=1e-3)
    assert quantity(look, "Mu/φMn") == fmt(500 / phiMn, 3)
    assert quantity(look, "Section class") == "Compression-controlled"
    assert look["inputs"] == ("f'c = 3000 psi, fy = 60000 psi, b = 10 in, d = 15 in, As = 6 in², "
                              "Mu = 500 kip·ft")
    assert look["caution"] == engine.CAUTION


@pytest.mark.parametrize("link", LINKS.values(), ids=LINKS.keys())
def test_first_look_shows_what_the_full_page_shows(link):
    from webapp.page import BeamCheckPage

    page = BeamCheckPage()
    page.apply_link(link)
    result = page.result.to_dict()
    look = first_look(link)
    assert quantity(look, "Design strength φMn") == fmt(result["phiMn"])
    assert float(quantity(look, "Net tensile strain εt")) == pytest.approx(result["eps_t"], rel=1e-3)
    assert look["messages"] == list(page.link_messages)
    ratios = {row[0]: row[2] for row in look["ratios"]}
    assert ratios["ρ"] == fmt(result["rho"]) and ratios["ρb"] == fmt(result["rho_b"])


def test_bad_and_hostile_values_come_back_named_as_plain_text():
    hostile = '<img src=x onerror="alert(1)">'
    look = first_look(f"?units=us&fc=4000x&b={hostile}&d=20&As=2&fy=60000")
    text = "\n".join(look["messages"])
    assert "fc: '4000x' is not accepted" in text
    assert hostile in text and "&lt;" not in text  # raw text: the page sets it with textContent


def test_anything_in_a_query_gives_a_look_never_an_exception():
    rng = random.Random(2026)
    alphabet = "?&=%#+-.,;:@<>\"'/\\ 0123456789eEnaNiIfFusUSbdAMlyrhtwx\u00b2\u202e\x00"
    for _ in range(300):
        query = "".join(rng.choice(alphabet) for _ in range(rng.randrange(0, 60)))
        look = json.loads(first_look_json(query))
        assert look["verdict"]["title"] in ("✔ Passes", "✘ Does not pass", "Not checked")
        assert look["caution"] == engine.CAUTION


def test_an_engine_failure_is_a_named_refusal(monkeypatch):
    def broken(**_):
        raise ZeroDivisionError("float division by zero")

    monkeypatch.setattr(first_look_module.engine, "check", broken)
    look = json.loads(first_look_json(FAILING))
    assert look["verdict"]["title"] == "Not checked" and look["quantities"] == []
    assert "no result is shown" in look["verdict"]["note"]


def test_first_look_needs_no_panel_bokeh_or_numpy():
    code = ("import sys, webapp.first_look as f; f.first_look_json('" + FAILING + "'); "
            "print(sorted({m.split('.')[0] for m in sys.modules} & {'panel', 'bokeh', 'numpy', 'param'}))")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=REPO, timeout=60)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip() == "[]"


def test_first_look_in_pyodide_equals_cpython(tmp_path):
    require_tools()
    script = tmp_path / "look.py"
    script.write_text("import json\nfrom webapp.first_look import first_look\n"
                      f"print(json.dumps([first_look(q) for q in {list(LINKS.values())!r}]))\n")
    done = run_in_pyodide(script, packages=(REPO / "engine", REPO / "webapp"))
    assert done.returncode == 0, done.stderr
    assert json.loads(done.stdout.strip().splitlines()[-1]) == [first_look(q) for q in LINKS.values()]
