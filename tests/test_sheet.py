"""The calculation sheet: the engine's numbers, every step's equation, a safe self-contained file.

References: each step's value is compared with `engine.check(...).to_dict()`
(the sheet is the subject, the check the reference) and, for the headline
results, with hand formulas written here from ACI 318-19 22.2 (yielded steel:
a = As·fy/(0.85 f'c b), Mn = As·fy·(d − a/2)) and Table 21.2.2.
"""

from __future__ import annotations

import math
import re
from html.parser import HTMLParser

import pytest

import engine
from engine.documents.sheet import calculation_sheet, sheet_steps, significant
from self_contained import outside_resources

# Harbourline Depot beams (invented), chosen to reach each branch of the sheet.
CASES = {
    # Roof beam B-101: yielded, tension-controlled, 9.6.1.2(b) governs.
    "B-101-us": dict(units="us", fc=4000, fy=60000, b=12, d=21.5, As=3.16, Mu=180),
    # Level-2 beam B-204: f'c in the sloping row of Table 22.2.2.4.3, transition zone.
    "B-204-us-transition": dict(units="us", fc=5000, fy=60000, b=12, d=20, As=5.6, Mu=300),
    # B-201: over-reinforced; steel does not yield, compression-controlled.
    "B-201-us-no-yield": dict(units="us", fc=4000, fy=60000, b=10, d=17.5, As=6.0, Mu=250),
    # Girder G-3: SI, two layers (dt > d), spiral, steel below yield, Es not the default.
    "G-3-si-spiral": dict(units="si", fc=40, fy=420, b=300, d=500, dt=550, As=6000, Mu=180,
                          spiral=True, es=195_000),
    # G-5: SI, f'c at or above 55 MPa (β1 = 0.65), no Mu.
    "G-5-si-high-strength": dict(units="si", fc=60, fy=420, b=300, d=540, As=2000),
}

STRENGTH_KEYS = ("beta1", "eps_ty", "a", "c", "eps_t", "fs", "phi", "Mn", "phiMn")
LIMIT_KEYS = ("As_min_sqrt_term", "As_min_flat_term", "As_min", "rho_min", "rho", "rho_tc",
              "rho_max", "rho_b")
CLAUSE = re.compile(r"(Table )?\d+(\.\d+)+(\([a-z]\))?")  # ACI 318-19 clause numbering


class _Sheet(HTMLParser):
    """Collects what the tests look at: step rows, data values, fields, text, tags."""

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, dict]] = []
        self.values: dict[str, str] = {}
        self.steps: dict[str, list[str]] = {}
        self.fields: dict[str, str] = {}
        self.text: list[str] = []
        self.style = ""
        self._step: str | None = None
        self._cell: list[str] | None = None
        self._field: str | None = None
        self._in_style = False

    def handle_starttag(self, tag, attrs):
        attributes = dict(attrs)
        self.tags.append((tag, attributes))
        if "data-key" in attributes:
            self.values[attributes["data-key"]] = attributes["data-value"]
        if tag == "tr" and "data-step" in attributes:
            self._step = attributes["data-step"]
            self.steps[self._step] = []
        if tag == "td" and self._step is not None:
            self._cell = []
        if "data-field" in attributes:
            self._field = attributes["data-field"]
            self.fields[self._field] = ""
        self._in_style = tag == "style"

    def handle_endtag(self, tag):
        if tag == "td" and self._cell is not None and self._step is not None:
            self.steps[self._step].append("".join(self._cell).strip())
            self._cell = None
        if tag == "tr":
            self._step = None
        if tag == "td":
            self._field = None
        if tag == "style":
            self._in_style = False

    def handle_data(self, data):
        self.text.append(data)
        if self._cell is not None:
            self._cell.append(data)
        if self._field is not None:
            self.fields[self._field] += data
        if self._in_style:
            self.style += data


def parse(document: str) -> _Sheet:
    sheet = _Sheet()
    sheet.feed(document)
    sheet.close()
    return sheet


@pytest.fixture(params=list(CASES), ids=list(CASES))
def case(request):
    inputs = CASES[request.param]
    return inputs, engine.check(**inputs).to_dict(), parse(calculation_sheet(
        inputs, project="Harbourline Depot", mark=request.param, engineer="R. Ortega",
        date="2025-03-14", link="http://localhost:8000/?units=us"))


def test_every_step_value_is_the_engines(case):
    inputs, result, sheet = case
    keys = STRENGTH_KEYS + LIMIT_KEYS + (("utilization",) if "Mu" in inputs else ())
    for key in keys:
        expected = result[key]
        shown = sheet.values[key]
        if expected is None:  # a limit no As reaches (null in to_dict)
            assert shown == "inf"
        else:
            # data-value is the shortest exact text: the same float, bit for bit.
            assert float(shown).hex() == float(expected).hex(), key


def test_every_step_renders_equation_numbers_result_and_clause(case):
    inputs, result, sheet = case
    for key in STRENGTH_KEYS + LIMIT_KEYS:
        quantity, equation, substituted, shown, clause = sheet.steps[key]
        assert "=" in equation, key
        assert re.search(r"\d", substituted), key
        assert CLAUSE.search(clause), (key, clause)
        if result[key] is not None:
            # The visible result is the engine's value, rounded for print.
            assert significant(result[key], 3 if key in ("beta1", "phi") else 4) in shown, key


@pytest.mark.parametrize("name", ["B-101-us", "B-204-us-transition", "B-201-us-no-yield",
                                  "G-3-si-spiral", "G-5-si-high-strength"])
def test_substituted_numbers_evaluate_to_the_result(name):
    """Evaluating the printed substitution gives the printed result (to print rounding).

    This is what a reviewer does with a calculator; the tolerance is the
    4 significant figures the sheet prints.
    """
    steps = {s.key: s for s in sheet_steps(CASES[name])}
    for key in ("eps_ty", "eps_t", "phiMn", "As_min_sqrt_term", "As_min_flat_term", "As_min",
                "rho_min", "rho", "rho_tc", "rho_max", "rho_b", "a", "utilization"):
        if key not in steps or not math.isfinite(steps[key].value):
            continue
        text = steps[key].substituted.split(";")[-1]
        if "&lt;" in text or "≤" in text:
            continue
        assert _evaluate(text) == pytest.approx(steps[key].value, rel=2e-3), key


def _evaluate(text: str) -> float:
    plain = re.sub(r"<[^>]+>", "", text)
    plain = re.sub(r"kip·ft|kN·m|N·mm|lb·in|in²|mm²|psi|MPa|\bin\b|\bmm\b", "", plain)
    plain = (plain.replace("×", "*").replace("−", "-").replace("÷", "/")
             .replace("√", "sqrt"))
    plain = re.sub(r"sqrt(\d+(\.\d+)?)", r"sqrt(\1)", plain)
    assert re.fullmatch(r"[\d\s.*/+\-(),a-z]*", plain), plain
    return eval(plain, {"__builtins__": {}}, {"sqrt": math.sqrt, "max": max})  # noqa: S307


@pytest.mark.parametrize("name, phiMn, phi, klass", [
    # Hand calculation, ACI 318-19 22.2 with yielded steel: a = 3.16·60000/(0.85·4000·12)
    # = 4.647 in; Mn = 3.16·60000·(21.5 − 2.324)/12000 = 302.99 kip·ft; c = a/0.85 = 5.467 in,
    # εt = 0.003(21.5 − 5.467)/5.467 = 0.0088 ≥ 0.00507: φ = 0.90 (Table 21.2.2).
    pytest.param("B-101-us", 0.9 * 3.16 * 60000 * (21.5 - 3.16 * 60000 / (0.85 * 4000 * 12) / 2)
                 / 12000, 0.90, "tension-controlled", id="B-101"),
    # f'c = 5000 psi: β1 = 0.80 (Table 22.2.2.4.3); a = 5.6·60000/(0.85·5000·12) = 6.588 in,
    # c = 8.235 in, εt = 0.003(20 − 8.235)/8.235 = 0.004286; εty = 60000/29e6 = 0.002069;
    # φ = 0.65 + 0.25(0.004286 − 0.002069)/0.003 (Table 21.2.2); Mn = 5.6·60000(20 − a/2)/12000.
    pytest.param("B-204-us-transition",
                 (0.65 + 0.25 * (0.003 * (20 - 6.588235294117647 / 0.8) / (6.588235294117647 / 0.8)
                                 - 60000 / 29e6) / 0.003)
                 * 5.6 * 60000 * (20 - 6.588235294117647 / 2) / 12000,
                 None, "transition", id="B-204"),
])
def test_headline_results_match_hand_calculation(name, phiMn, phi, klass):
    sheet = parse(calculation_sheet(CASES[name]))
    assert float(sheet.values["phiMn"]) == pytest.approx(phiMn, rel=1e-9)
    if phi is not None:
        assert float(sheet.values["phi"]) == pytest.approx(phi)
    assert klass in " ".join(sheet.steps["phi"])


def test_branches_show_the_equation_that_applies():
    # Table 22.2.2.4.3 rows; 20.2.2.1 yielded or elastic steel; Table 21.2.2 φ rows.
    sheets = {name: {s.key: s for s in sheet_steps(inputs)} for name, inputs in CASES.items()}
    assert "= 0.85 for" in sheets["B-101-us"]["beta1"].equation
    assert "0.85 − 0.05" in sheets["B-204-us-transition"]["beta1"].equation
    assert "= 0.65 for" in sheets["G-5-si-high-strength"]["beta1"].equation
    assert "f<sub>s</sub> = f<sub>y</sub>" in sheets["B-101-us"]["fs"].equation
    assert "E<sub>s</sub> ε<sub>s</sub>" in sheets["B-201-us-no-yield"]["fs"].equation
    assert "φ = 0.90" in sheets["B-101-us"]["phi"].equation
    assert "0.65 + 0.25" in sheets["B-204-us-transition"]["phi"].equation
    assert "φ = 0.65 when" in sheets["B-201-us-no-yield"]["phi"].equation
    assert "0.75 + 0.15" in sheets["G-3-si-spiral"]["phi"].equation  # spiral row
    assert "= 0.25 √" in sheets["G-3-si-spiral"]["As_min_sqrt_term"].equation  # 9.6.1.2(a), SI
    assert "= 3 √" in sheets["B-101-us"]["As_min_sqrt_term"].equation  # 9.6.1.2(a), US


def test_inputs_checks_warnings_and_caution_are_on_the_sheet(case):
    inputs, result, sheet = case
    document = calculation_sheet(inputs)
    text = "".join(parse(document).text)
    for item in result["checks"]:
        assert f'data-clause="{item["clause"]}" data-passed="{str(item["passed"]).lower()}"' \
            in document
        assert item["detail"] in text
    for warning in result["warnings"]:
        assert warning in text
    assert engine.CAUTION in text
    assert ("All checks pass." in text) is result["ok"]
    assert f"{inputs['fc']:g}" in text


def test_warning_for_non_default_es_is_shown():
    # Scope warning: Es differs from ACI 318-19 20.2.2.2's 200,000 MPa.
    text = "".join(parse(calculation_sheet(CASES["G-3-si-spiral"])).text)
    assert "195000 MPa" in text and "20.2.2.2" in text


def _qr():
    segno = pytest.importorskip("segno", reason="segno (the web extra) makes the QR code")
    return segno.make("http://localhost:8000/?units=us", error="m").svg_inline(omitsize=True)


def test_the_file_needs_nothing_from_outside():
    document = calculation_sheet(CASES["B-101-us"], link="http://localhost:8000/?units=us",
                                 qr_svg=_qr())
    assert outside_resources(document) == []
    sheet = parse(document)
    assert "url(" not in sheet.style and "@import" not in sheet.style
    assert "<svg" in document  # the QR code is inline
    # The link is printed as text, not a link the page would follow.
    assert "http://localhost:8000/?units=us" in "".join(sheet.text)


HOSTILE = {
    "project": '<script>alert("x")</script> & </td></table><img src=x onerror=alert(1)>',
    "mark": "B-101\" onmouseover=\"alert(1)' <!-- -->",
    "engineer": "Zoë Ångström-Ng 王 🙂 ‹›",
    "date": "2025-03-14 " + "long " * 1000,
}


def test_hostile_header_text_is_shown_escaped():
    document = calculation_sheet(CASES["B-101-us"], link='http://x/?a="<b>"', **HOSTILE)
    assert outside_resources(document) == []
    assert "<script>" not in document and "<img" not in document
    sheet = parse(document)
    assert sheet.fields["project"] == HOSTILE["project"]
    assert sheet.fields["mark"] == HOSTILE["mark"]
    assert sheet.fields["engineer"] == HOSTILE["engineer"]
    # Very long text is cut (with an ellipsis) rather than pushing the sheet off its page.
    assert sheet.fields["date"].startswith("2025-03-14 long")
    assert len(sheet.fields["date"]) <= 2001
    assert 'http://x/?a="<b>"' in "".join(sheet.text)


def test_control_characters_are_dropped_from_user_text():
    sheet = parse(calculation_sheet(CASES["B-101-us"], project="Harbour\x00line\x1b Depot"))
    assert sheet.fields["project"] == "Harbourline Depot"


@pytest.mark.parametrize("svg", [
    '<svg><script>alert(1)</script></svg>',
    '<svg><a href="https://example.org"><rect/></a></svg>',
    '<svg onload="alert(1)"></svg>',
    '<svg><rect style="fill:url(https://example.org/x)"/></svg>',
    '<p>not svg</p>',
], ids=["script", "href", "onload", "url", "not-svg"])
def test_qr_svg_with_scripts_or_links_is_refused(svg):
    with pytest.raises(engine.InputError, match="qr_svg"):
        calculation_sheet(CASES["B-101-us"], link="http://localhost:8000/", qr_svg=svg)


def test_bad_inputs_raise_the_engines_error():
    with pytest.raises(engine.InputError, match="^fc:"):
        calculation_sheet({**CASES["B-101-us"], "fc": -1})
    with pytest.raises(engine.InputError, match="^As:"):
        calculation_sheet({k: v for k, v in CASES["B-101-us"].items() if k != "As"})


def test_print_css_sizes_the_page_and_keeps_rows_whole():
    style = parse(calculation_sheet(CASES["B-101-us"])).style
    assert re.search(r"@page\s*{[^}]*size:\s*auto", style)
    assert "@media print" in style
    assert "break-inside: avoid" in style


# Sections beyond the one-layer rectangle: the general write-up (strain compatibility).
GENERAL = {
    # Level-2 T-beam B-210: block below the flange (a > hf).
    "B-210-T-web": dict(units="us", fc=4000, fy=60000, b=12, bf=30, hf=3, d=24, As=8, Mu=600),
    # Roof L-beam B-110: block within the flange (a ≤ hf).
    "B-110-L-flange": dict(units="us", fc=4000, fy=60000, b=10, bf=40, hf=5, d=20, As=3.0,
                           Mu=200),
    # B-220: doubly reinforced, compression steel yields (d' small).
    "B-220-doubly-yields": dict(units="us", fc=4000, fy=60000, b=12, d=22, As=6, asc=2, dc=2,
                                Mu=400),
    # B-221: doubly reinforced, compression steel below yield.
    "B-221-doubly-elastic": dict(units="us", fc=4000, fy=60000, b=12, d=22, As=6, asc=2, dc=3,
                                 Mu=400),
    # Girder G-4: SI, T flange, two tension layers, compression steel and h.
    "G-4-si-layers": dict(units="si", fc=35, fy=420, b=350, bf=1200, hf=120, h=800,
                          layers=[(2940, 720), (1470, 660)], asc=600, dc=60, Mu=900),
}


@pytest.fixture(params=list(GENERAL), ids=list(GENERAL))
def general(request):
    inputs = GENERAL[request.param]
    return inputs, engine.check(**inputs).to_dict(), parse(calculation_sheet(
        inputs, project="Harbourline Depot", mark=request.param, engineer="R. Ortega",
        date="2025-03-14"))


def test_general_sections_show_the_engines_values(general):
    inputs, result, sheet = general
    for key in STRENGTH_KEYS[:5] + ("phi", "Mn", "phiMn", "utilization", "dt") + LIMIT_KEYS:
        if key == "fs":
            continue
        expected = result[key]
        shown = sheet.values[key]
        if expected is None:
            assert shown == "inf"
        else:
            assert float(shown).hex() == float(expected).hex(), key
    for index, layer in enumerate(result["layers"], start=1):
        for name in ("strain", "stress"):
            shown = float(sheet.values[f"layer{index}_{name}"])
            assert shown.hex() == float(layer[name]).hex(), (index, name)


def test_general_sections_render_every_step(general):
    inputs, result, sheet = general
    keys = ("beta1", "eps_ty", "dt", "c", "a", "Ac", "Cc", "balance", "eps_t", "phi",
            "Mn", "phiMn") + LIMIT_KEYS + tuple(f"layer{i}" for i in
                                                range(1, len(result["layers"]) + 1))
    for key in keys:
        quantity, equation, substituted, shown, clause = sheet.steps[key]
        assert "=" in equation, key
        assert re.search(r"\d", substituted), key
        assert CLAUSE.search(clause), (key, clause)
    text = "".join(sheet.text)
    assert engine.CAUTION in text
    for item in result["checks"]:
        assert item["detail"] in text


def test_the_block_case_that_applies_is_written():
    # ACI 318-19 22.2.2.4.1: the block is the part of the section within a of the top.
    web = {s.key: s for s in sheet_steps(GENERAL["B-210-T-web"])}
    flange = {s.key: s for s in sheet_steps(GENERAL["B-110-L-flange"])}
    assert "covers the flange and the web" in web["Ac"].equation
    assert "b<sub>f</sub> h<sub>f</sub> + b<sub>w</sub> (a − h<sub>f</sub>)" in web["Ac"].equation
    assert "lies in the flange" in flange["Ac"].equation
    assert "b<sub>f</sub> a" in flange["Ac"].equation


def test_compression_steel_shows_yield_and_displaced_concrete():
    # Common practice in ACI-based texts: a bar inside the block carries (f's − 0.85 f'c) A's.
    yields = {s.key: s for s in sheet_steps(GENERAL["B-220-doubly-yields"])}["layer2"]
    elastic = {s.key: s for s in sheet_steps(GENERAL["B-221-doubly-elastic"])}["layer2"]
    for step in (yields, elastic):
        assert "0.85 f′<sub>c</sub>" in step.equation and "displaces" in step.equation
        assert "(c − d′)" in step.equation
    assert "(yields)" in yields.result and "below yield" in elastic.result


def test_heading_names_the_section():
    document = calculation_sheet(GENERAL["G-4-si-layers"])
    assert "flanged (T or L) section, doubly reinforced, 2 tension layers" in document
    assert "rectangular section, singly reinforced" in calculation_sheet(CASES["B-101-us"])


def _fc_psi_block(a, b):
    return 0.85 * 4000 * b * a  # 22.2.2.4.1, lb


def test_t_beam_matches_the_textbook_flange_and_web_split():
    """Hand method (T-beam, a > hf, e.g. McCormac & Brown, from memory): Cf on the overhangs,
    Cw on bw·a; with As yielding, a = (As fy − Cf) / (0.85 f'c bw), Mn = Cf (d − hf/2) + Cw (d − a/2)."""
    bf, hf, bw, d, As, fy = 30, 3, 12, 24, 8, 60000
    Cf = _fc_psi_block(hf, bf - bw)
    a = (As * fy - Cf) / (0.85 * 4000 * bw)
    Mn = (Cf * (d - hf / 2) + _fc_psi_block(a, bw) * (d - a / 2)) / 12000
    sheet = parse(calculation_sheet(GENERAL["B-210-T-web"]))
    assert float(sheet.values["a"]) == pytest.approx(a, rel=1e-9)
    assert float(sheet.values["Ac"]) == pytest.approx(bf * hf + bw * (a - hf), rel=1e-9)
    assert float(sheet.values["Mn"]) == pytest.approx(Mn, rel=1e-9)


def test_doubly_reinforced_with_yielding_compression_steel_matches_the_closed_form():
    """Both steels yield (Nilson's doubly reinforced method, from memory), bar area deducted:
    0.85 f'c b a + A's (fy − 0.85 f'c) = As fy; Mn = 0.85 f'c b a (d − a/2) + A's (fy − 0.85 f'c)(d − d')."""
    b, d, As, asc, dc, fy, fc = 12, 22, 6, 2, 2, 60000, 4000
    a = (As * fy - asc * (fy - 0.85 * fc)) / (0.85 * fc * b)
    c = a / 0.85
    assert 0.003 * (c - dc) / c >= fy / 29e6  # the closed form's premise: A's yields
    Mn = (0.85 * fc * b * a * (d - a / 2) + asc * (fy - 0.85 * fc) * (d - dc)) / 12000
    sheet = parse(calculation_sheet(GENERAL["B-220-doubly-yields"]))
    assert float(sheet.values["Mn"]) == pytest.approx(Mn, rel=1e-9)
    assert float(sheet.values["layer2_stress"]) == pytest.approx(-fy)  # tension positive


def test_doubly_reinforced_elastic_compression_steel_against_scipy():
    """A's below yield: c from the force balance solved here by scipy's brentq (independent)."""
    optimize = pytest.importorskip("scipy.optimize")
    b, d, As, asc, dc, fy, fc, es = 12, 22, 6, 2, 3, 60000, 4000, 29e6

    def net(c):  # compression positive, 22.2.1.2 and 20.2.2.1
        fsc = min(fy, es * 0.003 * (c - dc) / c)
        return 0.85 * fc * b * 0.85 * c + asc * (fsc - 0.85 * fc) - As * fy

    c = optimize.brentq(net, dc + 1e-6, d, xtol=1e-14)
    fsc = es * 0.003 * (c - dc) / c
    assert fsc < fy
    Mn = (0.85 * fc * b * 0.85 * c * (d - 0.85 * c / 2) + asc * (fsc - 0.85 * fc) * (d - dc)) / 12000
    sheet = parse(calculation_sheet(GENERAL["B-221-doubly-elastic"]))
    assert float(sheet.values["c"]) == pytest.approx(c, rel=1e-9)
    assert -float(sheet.values["layer2_stress"]) == pytest.approx(fsc, rel=1e-9)
    assert float(sheet.values["Mn"]) == pytest.approx(Mn, rel=1e-9)


def _evaluate_forces(text: str) -> float:
    return _evaluate(re.sub(r"kip·in|kN·mm|kip·ft|kN·m|\bkip\b|\bkN\b", "", text))


@pytest.mark.parametrize("name", list(GENERAL))
def test_general_substitutions_evaluate_to_the_result(name):
    """A reviewer's calculator on the printed numbers gives the printed result (4 figures)."""
    steps = {s.key: s for s in sheet_steps(GENERAL[name])}
    for key in ("a", "Cc", "eps_t", "phiMn", "As_min", "rho"):
        value = steps[key].value / (1000 if key == "Cc" else 1)  # Cc printed in kip or kN
        text = steps[key].substituted.split(";")[0]
        assert _evaluate_forces(text) == pytest.approx(value, rel=2e-3), key
    centroid = steps["Cc"].substituted.split("ȳ = ")[1]
    assert float(parse(calculation_sheet(GENERAL[name])).values["y_c"]) == pytest.approx(
        _evaluate(centroid.replace("[", "(").replace("]", ")")), rel=2e-3)
    area = steps["Ac"].substituted.split(";")[-1]
    assert _evaluate(area) == pytest.approx(steps["Ac"].value, rel=2e-3)
    lever_sum, factor = steps["Mn"].substituted.rsplit(" = ", 1)
    divisor = float(factor.split("÷")[1])
    assert _evaluate_forces(lever_sum) / divisor == pytest.approx(steps["Mn"].value, rel=2e-3)
    if "d" in steps:  # several tension layers: d is their centroid
        assert _evaluate(steps["d"].substituted) == pytest.approx(steps["d"].value, rel=2e-3)
    residual = steps["balance"].substituted.rsplit(" = ", 1)[0]
    assert abs(_evaluate_forces(residual)) <= 2e-3 * steps["Cc"].value / 1000


def test_a_layer_list_with_one_layer_is_the_closed_form():
    # The same beam given as one `layers` entry is the textbook rectangle, step for step.
    as_layer = sheet_steps(dict(units="us", fc=4000, fy=60000, b=12, layers=[(3.16, 21.5)],
                                Mu=180))
    assert [s.key for s in as_layer] == [s.key for s in sheet_steps(CASES["B-101-us"])]


def test_the_strain_limit_ratio_is_named_by_what_it_is():
    # ACI 318-19 defines no ρmax; the 9.3.3.1 limit is εt ≥ 0.004 (see test_webapp_page).
    document = calculation_sheet(CASES["B-101-us"], project="", mark="", engineer="",
                                 date="2025-03-14", link="")
    assert "ρ<sub>max</sub>" not in document and "ρmax" not in document
    assert "ρ at ε<sub>t</sub> = 0.004" in document


# The ductility block, with h: the engine's moment–curvature values (engine.moment_curvature).
@pytest.mark.parametrize("inputs", [
    pytest.param(dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16, h=24, Mu=190),
                 id="B-204-us"),
    pytest.param(GENERAL["G-4-si-layers"], id="G-4-si-layers"),
])
def test_with_h_the_sheet_shows_the_moment_curvature_values(inputs):
    sheet = parse(calculation_sheet(inputs))
    expected = engine.moment_curvature(**inputs)
    assert float(sheet.values["ductility"]) == pytest.approx(expected.ductility, rel=1e-12)
    assert float(sheet.values["Mcr"]) == pytest.approx(expected.Mcr, rel=1e-12)
    assert float(sheet.values["Mn_over_Mcr"]) == pytest.approx(expected.Mn_over_Mcr, rel=1e-12)
    assert float(sheet.values["redistribution_percent"]) == pytest.approx(
        expected.redistribution.percent, rel=1e-12)
    assert expected.redistribution.reason in "".join(sheet.text)
    assert [len(sheet.steps[key]) for key in ("ductility", "Mcr", "Mn_over_Mcr",
                                               "redistribution")] == [4] * 4


def test_b204_mcr_on_the_sheet_is_the_hand_value():
    # ACI 318-19 24.2.3.5, 19.2.3.1: 7.5√4000 psi × 14·24²/6 in³ = 637,510 lb·in = 53.13 kip·ft.
    sheet = parse(calculation_sheet(dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=3.16,
                                         h=24)))
    assert float(sheet.values["Mcr"]) == pytest.approx(
        7.5 * math.sqrt(4000) * 14 * 24**2 / 6 / 12_000, rel=1e-9)


def test_without_h_there_is_no_ductility_block_and_without_yield_no_mu():
    sheet = parse(calculation_sheet(CASES["B-101-us"] | {"h": None}))
    assert "ductility" not in sheet.values and "Mcr" not in sheet.values
    # Over-reinforced (ρ = 14/(14·21.5) = 0.047 > ρb = 0.0285): no first yield, so no μφ.
    over = parse(calculation_sheet(dict(units="us", fc=4000, fy=60000, b=14, d=21.5, As=14,
                                        h=24)))
    assert over.values["ductility"] == "none"
    assert engine.moment_curvature(units="us", fc=4000, fy=60000, b=14, d=21.5, As=14,
                                   h=24).ductility is None
    assert over.values["redistribution_percent"] == "0"
