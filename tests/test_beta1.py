"""β1, the stress-block depth factor, against ACI 318-19 Table 22.2.2.4.3."""

from __future__ import annotations

import pytest

import engine
from reference_cases import BETA1_SI, BETA1_US, beta1_reference


def _beta1(units: str, fc: float) -> float:
    # A lightly reinforced section: β1 does not depend on the steel.
    b, d, As, fy = (12.0, 20.0, 1.0, 60000.0) if units == "us" else (300.0, 500.0, 600.0, 420.0)
    return engine.check(units=units, fc=fc, fy=fy, b=b, d=d, As=As).state.beta1


@pytest.mark.parametrize("fc, expected", BETA1_US)
def test_beta1_us_table(fc, expected):
    assert _beta1("us", fc) == pytest.approx(expected, abs=1e-12)  # ACI 318-19 Table 22.2.2.4.3


@pytest.mark.parametrize("fc, expected", BETA1_SI)
def test_beta1_si_table(fc, expected):
    assert _beta1("si", fc) == pytest.approx(expected, abs=1e-12)  # ACI 318-19 Table 22.2.2.4.3


@pytest.mark.parametrize("fc, expected", BETA1_US + BETA1_SI)
def test_reference_function_matches_table_rows(fc, expected):
    # The tests' own reading of the table agrees with the hand values above.
    units = "us" if fc > 1000 else "si"
    assert beta1_reference(fc, units) == pytest.approx(expected, abs=1e-12)


@pytest.mark.parametrize("fc", [4000.0 + 1e-6, 7999.999])
def test_beta1_us_continuous_at_breakpoints(fc):
    # ACI 318-19 Table 22.2.2.4.3 (US): rows (a)-(b) and (b)-(c) meet without a step.
    assert _beta1("us", fc) == pytest.approx(beta1_reference(fc, "us"), abs=1e-9)
    assert _beta1("us", fc) == pytest.approx(0.85 if fc < 5000 else 0.65, abs=1e-6)


def test_beta1_si_step_just_below_55_mpa():
    # ACI 318-19 Table 22.2.2.4.3 (SI): row (b) at 54.99 MPa is 0.6572, row (c) is 0.65.
    assert _beta1("si", 54.99) == pytest.approx(0.85 - 0.05 * 26.99 / 7, abs=1e-12)
    assert _beta1("si", 55.0) == pytest.approx(0.65, abs=1e-12)


def test_beta1_below_table_floor_uses_top_row_and_warns():
    # Below 2500 psi the table has no row; the top row (0.85) with a scope warning
    # naming ACI 318-19 Table 19.2.1.1 (f'c ≥ 2500 psi for structural concrete).
    r = engine.check(units="us", fc=2000, fy=60000, b=12, d=20, As=1.0)
    assert r.state.beta1 == pytest.approx(0.85)
    assert any("19.2.1.1" in w for w in r.warnings)
