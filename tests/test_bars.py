"""Standard bar sizes against ASTM A615/A615M.

Source of every row: ASTM A615/A615M, Table 1 "Deformed bar designation
numbers, nominal weights, nominal dimensions and deformation requirements"
(from memory of the table; each row is also checked against the physics of a
round steel bar below, which is independent of the table).
"""

from __future__ import annotations

import math

import pytest

import engine
from engine import InputError

# ASTM A615, Table 1 (inch-pound): designation, nominal diameter in, area in², weight lb/ft.
A615_TABLE_1 = [
    ("#3", 0.375, 0.11, 0.376), ("#4", 0.500, 0.20, 0.668), ("#5", 0.625, 0.31, 1.043),
    ("#6", 0.750, 0.44, 1.502), ("#7", 0.875, 0.60, 2.044), ("#8", 1.000, 0.79, 2.670),
    ("#9", 1.128, 1.00, 3.400), ("#10", 1.270, 1.27, 4.303), ("#11", 1.410, 1.56, 5.313),
    ("#14", 1.693, 2.25, 7.650), ("#18", 2.257, 4.00, 13.600),
]
# ASTM A615M, Table 1 (SI): designation, nominal diameter mm, area mm², mass kg/m.
A615M_TABLE_1 = [
    ("10", 9.5, 71, 0.560), ("13", 12.7, 129, 0.994), ("16", 15.9, 199, 1.552),
    ("19", 19.1, 284, 2.235), ("22", 22.2, 387, 3.042), ("25", 25.4, 510, 3.973),
    ("29", 28.7, 645, 5.060), ("32", 32.3, 819, 6.404), ("36", 35.8, 1006, 7.907),
    ("43", 43.0, 1452, 11.38), ("57", 57.3, 2581, 20.24),
]


@pytest.mark.parametrize("designation, db, area, weight", A615_TABLE_1,
                         ids=[row[0] for row in A615_TABLE_1])
def test_a615_inch_pound_bars(designation, db, area, weight):
    # ASTM A615/A615M Table 1, inch-pound columns.
    bar = engine.bar("bar", designation, engine.US)
    assert bar.designation == designation
    assert bar.db == pytest.approx(db, abs=5e-4)
    assert bar.area == pytest.approx(area, abs=5e-3)
    assert bar.weight == pytest.approx(weight, abs=5e-4)


@pytest.mark.parametrize("designation, db, area, mass", A615M_TABLE_1,
                         ids=[row[0] for row in A615M_TABLE_1])
def test_a615m_metric_bars(designation, db, area, mass):
    # ASTM A615/A615M Table 1, SI columns.
    bar = engine.bar("bar", designation, engine.SI)
    assert bar.designation == designation
    assert bar.db == pytest.approx(db, abs=0.05)
    assert bar.area == pytest.approx(area, abs=0.5)
    assert bar.weight == pytest.approx(mass, abs=5e-3)


def test_the_lists_hold_exactly_the_standard_sizes_in_order():
    # ASTM A615 lists #3–#11, #14, #18; A615M lists No. 10–57 (Table 1).
    assert [b.designation for b in engine.standard_bars(engine.US)] == [r[0] for r in A615_TABLE_1]
    assert [b.designation for b in engine.standard_bars(engine.SI)] == [r[0] for r in A615M_TABLE_1]


def test_inch_pound_area_and_weight_are_those_of_the_nominal_diameter():
    # Nominal dimensions are those of a plain round bar of the same weight: A = π db²/4
    # (geometry), tabulated to 0.01 in²; w = A × 490 lb/ft³ / 144 (steel density, common
    # practice), to 0.3 %.
    for bar in engine.standard_bars(engine.US):
        exact = math.pi * bar.db**2 / 4
        assert abs(bar.area - exact) <= 0.005 + 1e-12, bar.designation
        assert bar.weight == pytest.approx(exact / 144 * 490, rel=0.003), bar.designation


def test_metric_bars_are_the_inch_pound_bars_in_millimetres():
    # A615M sizes are soft conversions of A615 sizes: No. 10 is #3 ... No. 57 is #18
    # (1 in = 25.4 mm, 1 lb/ft = 1.488164 kg/m, exact conversions).
    for us, si in zip(engine.standard_bars(engine.US), engine.standard_bars(engine.SI)):
        assert si.db == pytest.approx(us.db * 25.4, abs=0.06), (us.designation, si.designation)
        assert si.area == pytest.approx(us.area * 25.4**2, rel=0.01), si.designation
        assert si.weight == pytest.approx(us.weight * 1.488164, rel=0.002), si.designation


@pytest.mark.parametrize("text", ["#8", "8", "No. 8", " no.8 ", "NO8", 8], ids=repr)
def test_inch_pound_designations_are_read_in_their_usual_spellings(text):
    assert engine.bar("bar", text, engine.US).designation == "#8"


@pytest.mark.parametrize("text", ["25", "25M", "No. 25", "#25", 25], ids=repr)
def test_metric_designations_are_read_in_their_usual_spellings(text):
    assert engine.bar("bar", text, engine.SI).designation == "25"


@pytest.mark.parametrize("system, text", [(engine.US, "#12"), (engine.US, "#2"), (engine.US, "25"),
                                          (engine.SI, "#4"), (engine.SI, "20"), (engine.US, ""),
                                          (engine.US, None), (engine.US, True), (engine.US, 8.0)],
                         ids=["#12", "#2", "25 in US", "#4 in SI", "20 in SI", "empty", "None",
                              "True", "float"])
def test_a_size_not_in_the_table_is_refused_naming_the_field(system, text):
    with pytest.raises(InputError, match=r"^stirrup: .*expected one of") as caught:
        engine.bar("stirrup", text, system)
    assert caught.value.field == "stirrup"


def test_stirrup_sizes_are_limited_to_the_allowed_numbers():
    with pytest.raises(InputError, match="#3, #4, #5"):
        engine.bar("stirrup", "#6", engine.US, (3, 4, 5))
    assert engine.bar("stirrup", "#4", engine.US, (3, 4, 5)).db == pytest.approx(0.5)
