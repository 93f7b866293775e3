"""Reference cases shared by the engine tests, each with its source beside it.

Nothing here is computed by the engine. Values come from ACI 318-19's tables,
from textbooks (named, with "from memory" where recalled), or are hand
arithmetic shown in the comment. Each row has a readable `id` for pytest.
"""

from __future__ import annotations

from dataclasses import dataclass

import pytest

EPS_CU = 0.003  # ACI 318-19 22.2.2.1
ES_US = 29_000_000.0  # psi, ACI 318-19 20.2.2.2
ES_SI = 200_000.0  # MPa, ACI 318-19 20.2.2.2
PSI_PER_MPA = 1.0 / 0.006894757293168361  # 1 lbf = 4.4482216152605 N, 1 in = 25.4 mm (exact)


def beta1_reference(fc: float, units: str) -> float:
    """β1 written straight from ACI 318-19 Table 22.2.2.4.3, for tests only.

    US: 0.85 for 2500 ≤ f'c ≤ 4000 psi; 0.85 − 0.05(f'c − 4000)/1000 between;
    0.65 for f'c ≥ 8000 psi. SI: 0.85 for 17 ≤ f'c ≤ 28 MPa;
    0.85 − 0.05(f'c − 28)/7 between; 0.65 for f'c ≥ 55 MPa.
    """
    low, high, step = (4000.0, 8000.0, 1000.0) if units == "us" else (28.0, 55.0, 7.0)
    if fc <= low:
        return 0.85
    if fc >= high:
        return 0.65
    return 0.85 - 0.05 * (fc - low) / step


# ACI 318-19 Table 22.2.2.4.3 (US), values at and between the breakpoints by hand.
BETA1_US = [
    pytest.param(2500.0, 0.85, id="us-2500psi-table-floor"),  # Table 22.2.2.4.3 row (a)
    pytest.param(3000.0, 0.85, id="us-3000psi"),  # row (a)
    pytest.param(4000.0, 0.85, id="us-4000psi-breakpoint"),  # row (a), upper end
    pytest.param(4500.0, 0.825, id="us-4500psi"),  # row (b): 0.85 - 0.05*500/1000
    pytest.param(5000.0, 0.80, id="us-5000psi"),  # row (b): 0.85 - 0.05
    pytest.param(6000.0, 0.75, id="us-6000psi"),  # row (b): 0.85 - 0.10
    pytest.param(7000.0, 0.70, id="us-7000psi"),  # row (b): 0.85 - 0.15
    pytest.param(7500.0, 0.675, id="us-7500psi"),  # row (b): 0.85 - 0.175
    pytest.param(8000.0, 0.65, id="us-8000psi-breakpoint"),  # row (c)
    pytest.param(12000.0, 0.65, id="us-12000psi"),  # row (c)
]

# ACI 318-19 Table 22.2.2.4.3 (SI). The SI breakpoints 28 and 55 MPa are ACI's
# own rounded values, not conversions of 4000 and 8000 psi (27.58, 55.16 MPa).
BETA1_SI = [
    pytest.param(17.0, 0.85, id="si-17MPa-table-floor"),  # row (a)
    pytest.param(25.0, 0.85, id="si-25MPa"),  # row (a)
    pytest.param(28.0, 0.85, id="si-28MPa-breakpoint"),  # row (a), upper end
    pytest.param(31.5, 0.825, id="si-31.5MPa"),  # row (b): 0.85 - 0.05*3.5/7
    pytest.param(35.0, 0.80, id="si-35MPa"),  # row (b): 0.85 - 0.05
    pytest.param(42.0, 0.75, id="si-42MPa"),  # row (b): 0.85 - 0.10
    pytest.param(49.0, 0.70, id="si-49MPa"),  # row (b): 0.85 - 0.15
    pytest.param(54.0, 0.85 - 0.05 * 26 / 7, id="si-54MPa"),  # row (b): 0.66429
    # row (c): at 55 MPa the table gives 0.65, although row (b)'s formula would
    # give 0.657 there; ACI's SI table has this small step, the US one has none.
    pytest.param(55.0, 0.65, id="si-55MPa-breakpoint"),
    pytest.param(80.0, 0.65, id="si-80MPa"),
]


@dataclass(frozen=True)
class Materials:
    units: str
    fc: float
    fy: float
    d: float
    dt: float


# f'c/fy pairs (and d, dt) at which the limit ratios are checked against the
# closed forms derived with sympy in test_limits.py. b does not enter a ratio.
LIMIT_PAIRS = [
    pytest.param(Materials("us", 4000.0, 60000.0, 20.0, 20.0), id="us-4000-gr60"),  # common practice
    pytest.param(Materials("us", 3000.0, 40000.0, 20.0, 20.0), id="us-3000-gr40"),  # ASTM A615 Grade 40
    pytest.param(Materials("us", 5000.0, 60000.0, 20.0, 20.0), id="us-5000-gr60-beta1-0.80"),
    pytest.param(Materials("us", 6000.0, 80000.0, 24.0, 24.0), id="us-6000-gr80"),  # ASTM A615 Grade 80
    pytest.param(Materials("us", 9000.0, 100000.0, 30.0, 30.0), id="us-9000-gr100-beta1-0.65"),
    pytest.param(Materials("us", 4000.0, 60000.0, 20.0, 22.0), id="us-4000-gr60-dt-gt-d"),
    pytest.param(Materials("us", 5000.0, 60000.0, 20.0, 26.0), id="us-5000-gr60-dt-much-deeper-than-d"),
    pytest.param(Materials("si", 28.0, 420.0, 500.0, 500.0), id="si-28-420"),  # ASTM A615M Grade 420
    pytest.param(Materials("si", 35.0, 420.0, 500.0, 500.0), id="si-35-420-beta1-0.80"),
    pytest.param(Materials("si", 40.0, 550.0, 600.0, 660.0), id="si-40-550-dt-gt-d"),
]


@dataclass(frozen=True)
class Section:
    units: str
    fc: float
    fy: float
    b: float
    d: float
    As: float
    dt: float | None = None


# Sections whose Mn is checked against a scipy brentq solution of equilibrium.
# Yielding and non-yielding steel; which is which is asserted in the test.
MN_SECTIONS = [
    pytest.param(Section("us", 4000.0, 60000.0, 12.0, 20.0, 0.60), id="us-light-steel"),
    pytest.param(Section("us", 4000.0, 60000.0, 12.0, 20.0, 3.00), id="us-typical"),
    pytest.param(Section("us", 4000.0, 60000.0, 12.0, 20.0, 6.50), id="us-near-balanced-yields"),
    pytest.param(Section("us", 4000.0, 60000.0, 12.0, 20.0, 9.00), id="us-over-reinforced"),
    pytest.param(Section("us", 4000.0, 60000.0, 12.0, 20.0, 16.0), id="us-heavily-over-reinforced"),
    pytest.param(Section("us", 6000.0, 80000.0, 14.0, 24.0, 8.00), id="us-6000-gr80-over"),
    pytest.param(Section("us", 9000.0, 60000.0, 16.0, 30.0, 5.00, 32.0), id="us-9000-dt-gt-d"),
    pytest.param(Section("si", 30.0, 420.0, 300.0, 500.0, 1500.0), id="si-typical"),
    pytest.param(Section("si", 30.0, 420.0, 300.0, 500.0, 6000.0), id="si-over-reinforced"),
    pytest.param(Section("si", 50.0, 550.0, 350.0, 650.0, 9000.0, 700.0), id="si-50-550-over-dt"),
]
