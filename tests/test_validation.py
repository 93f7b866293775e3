"""Bad input is refused at the edge with an InputError naming the field, the value
and the accepted range; out-of-scope input computes with a warning naming the clause.

House rule 7 and issue 2 item 3 ("a specific error naming the field, the value and
the accepted range"). The hard ranges themselves are the engine's choice; the tests
only require that a range is stated: "(0, <max>] <unit>" for a size or strength.
"""

from __future__ import annotations

import math
import re

import pytest

import engine

GOOD = dict(units="us", fc=4000.0, fy=60000.0, b=12.0, d=20.0, As=3.0)
UNIT_OF = {"fc": "psi", "fy": "psi", "b": "in", "d": "in", "As": "in²", "dt": "in", "es": "psi",
           "Mu": "kip·ft"}
REQUIRED = ("fc", "fy", "b", "d", "As")
OPTIONAL = ("dt", "es", "Mu")

BAD_VALUES = [
    pytest.param("4000", id="string"),
    pytest.param(None, id="none"),
    pytest.param(True, id="bool"),
    pytest.param(math.nan, id="nan"),
    pytest.param(math.inf, id="plus-inf"),
    pytest.param(-math.inf, id="minus-inf"),
    pytest.param(0.0, id="zero"),
    pytest.param(-5.0, id="negative"),
]


def _raise(field, value):
    with pytest.raises(engine.InputError) as caught:
        engine.check(**{**GOOD, field: value})
    return caught.value


def _range_stated(message: str, field: str) -> bool:
    # e.g. "(0, 30,000] psi" or "[0, 10,000,000] kip·ft"
    return re.search(r"[\(\[]0, [0-9.,e+]+\] " + re.escape(UNIT_OF[field]), message) is not None


# Every (field, bad value) pair that must be refused. None means "not given" for an
# optional input, and Mu = 0 is a valid demand (test_checks.test_zero_mu_is_allowed).
REFUSED = [
    pytest.param(field, p.values[0], id=f"{p.id}-{field}")
    for field in REQUIRED + OPTIONAL for p in BAD_VALUES
    if not (p.values[0] is None and field in OPTIONAL) and not (field == "Mu" and p.id == "zero")
]


@pytest.mark.parametrize("field, value", REFUSED)
def test_bad_value_names_field_and_value(field, value):
    error = _raise(field, value)
    assert isinstance(error, ValueError)  # InputError subclasses ValueError
    assert error.field == field
    message = str(error)
    assert message.startswith(f"{field}:") and "\n" not in message
    # A value that is not there at all reads "missing", anything else is quoted.
    assert (value is None and "missing" in message) or repr(value) in message or str(value) in message


@pytest.mark.parametrize("value", BAD_VALUES)
def test_bad_value_states_accepted_range(value):
    # House rule 7: the message names the accepted range, whatever kind of bad value it is.
    messages = {field: str(_raise(field, value)) for field in REQUIRED}
    missing = {field: text for field, text in messages.items() if not _range_stated(text, field)}
    assert not missing, missing


def test_dt_above_d():
    error = _raise("dt", 19.0)
    assert error.field == "dt"
    assert re.search(r"at least (d = )?20 in", str(error))  # the accepted range: dt ≥ d


def test_dt_equal_to_d_is_fine():
    assert engine.check(**{**GOOD, "dt": 20.0}).state.eps_t > 0


def test_steel_larger_than_section():
    # b·d = 240 in² bounds As; the message states that bound.
    error = _raise("As", 12.0 * 20.0 * 1.01)
    assert error.field == "As" and "240 in²" in str(error)


@pytest.mark.parametrize("units", ["metric", "", None, 1, "imperial"])
def test_unknown_units(units):
    with pytest.raises(engine.InputError, match=r"^units: .*'us' or 'si'") as caught:
        engine.check(**{**GOOD, "units": units})
    assert caught.value.field == "units"


@pytest.mark.parametrize("spiral", ["yes", 1, None])
def test_spiral_must_be_boolean(spiral):
    with pytest.raises(engine.InputError, match=r"^spiral: .*true or false"):
        engine.check(**GOOD, spiral=spiral)


def test_curve_validates_the_same_way():
    with pytest.raises(engine.InputError, match=r"^b: "):
        engine.capacity_curve(**{**GOOD, "b": -1.0})


@pytest.mark.parametrize("inputs, clause", [
    # ACI 318-19 Table 19.2.1.1: f'c ≥ 2500 psi / 17 MPa for structural concrete.
    pytest.param(dict(units="us", fc=2000, fy=60000, b=12, d=20, As=2.0), "19.2.1.1", id="fc-2000psi"),
    pytest.param(dict(units="si", fc=15, fy=420, b=300, d=500, As=1200), "19.2.1.1", id="fc-15MPa"),
    # ACI 318-19 Table 20.2.2.4(a): flexural bars, 80 ksi / 550 MPa for special seismic systems,
    # 100 ksi / 690 MPa otherwise.
    pytest.param(dict(units="us", fc=4000, fy=90000, b=12, d=20, As=2.0), "20.2.2.4", id="fy-90ksi"),
    pytest.param(dict(units="si", fc=28, fy=600, b=300, d=500, As=1200), "20.2.2.4", id="fy-600MPa"),
    pytest.param(dict(units="us", fc=4000, fy=110000, b=12, d=20, As=2.0), "20.2.2.4", id="fy-110ksi"),
])
def test_out_of_scope_computes_with_warning(inputs, clause):
    r = engine.check(**inputs)
    assert r.Mn > 0 and math.isfinite(r.phiMn)
    assert any(clause in w and "ACI 318-19" in w for w in r.warnings), r.warnings
    assert r.to_dict()["warnings"] == list(r.warnings)


def test_in_scope_has_no_warnings():
    assert engine.check(**GOOD).warnings == ()
    assert engine.check(units="si", fc=28, fy=420, b=300, d=500, As=1500).warnings == ()
