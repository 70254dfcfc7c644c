"""Superposition shown wrong (engine.superposition): the exact combined result against the sum of the
separately solved actions.

References: the midspan moment of a pinned-pinned strut under a uniform load q and compression P,
M = (q EI / P)(sec(kL/2) − 1), k = √(P/EI) (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., ch. 1,
article from memory; tests/REFERENCES.md §1 and §10), against the first-order qL²/8 of the load solved alone;
linearity at N = 0 (common practice, no source). Members invented.
"""

import math

from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from engine.superposition import compare

EI, L, Q = 4.0e6, 5.0, 3.0e3
PCR = math.pi**2 * EI / L**2  # Euler, pinned-pinned


def two_actions(axial_g, axial_w=0.0, point=True):
    """An invented strut: G carries the axial force, W the transverse loads; one table row, factors 1."""
    w_loads = [{"type": "uniform", "q": Q}]
    if point:
        w_loads.append({"type": "point", "P": 2.0e3, "x": 1.7})
    return engine.Case.from_dict(
        {
            "length": L,
            "EI": EI,
            "supports": {"left": "pinned", "right": "pinned"},
            "actions": [
                {"name": "G", "category": "permanent", "axial_force": axial_g},
                {"name": "W", "category": "wind", "axial_force": axial_w, "loads": w_loads},
            ],
            "combinations": {
                "rule": "table",
                "table": [{"name": "C", "state": "ultimate", "factors": {"G": 1.0, "W": 1.0}}],
            },
        }
    )


def error_at(ratio, point=True):
    """The superposition error of the one combination with N = ratio × Pcr1."""
    case = two_actions(ratio * PCR, point=point)
    combination = engine.solve(case).actions.combinations[0].combination
    return compare(case, combination)


def test_superposition_is_exact_without_axial_force():
    """At N = 0 every part is first order, and the sum is the combined result to rounding."""
    result = error_at(0.0)
    assert abs(result.error) < 1e-12
    scale = abs(result.moment_exact).max()
    assert abs(result.moment_exact - result.moment_superposed).max() < 1e-12 * scale
    assert [name for name, _, _ in result.parts] == ["G", "W"]


def test_the_error_is_the_closed_form_amplification():
    """With a uniform load only, the sum gives qL²/8 and the exact moment (q EI/P)(sec(kL/2) − 1):
    the error is 1 − (qL²/8)/M (Timoshenko & Gere ch. 1, tests/REFERENCES.md §1), to 1e-9."""
    for ratio in (0.1, 0.5, 0.9):
        P = ratio * PCR
        k = math.sqrt(P / EI)
        exact = Q * EI / P * (1.0 / math.cos(k * L / 2) - 1.0)
        result = error_at(ratio, point=False)
        assert math.isclose(result.moment_peak_exact, exact, rel_tol=1e-9)
        assert math.isclose(result.moment_peak_superposed, Q * L**2 / 8, rel_tol=1e-12)
        assert math.isclose(result.error, 1 - Q * L**2 / 8 / exact, rel_tol=1e-9)


@settings(max_examples=25, deadline=None)
@given(a=st.floats(0.0, 0.97), b=st.floats(0.0, 0.97))
def test_the_error_grows_towards_the_critical_load(a, b):
    """The error is never negative and grows with N/Pcr1 (a property over pairs of axial forces)."""
    low, high = sorted((a, b))
    e_low, e_high = error_at(low).error, error_at(high).error
    assert e_low >= -1e-12
    assert e_high >= e_low - 1e-9


def test_the_error_is_large_near_the_critical_load():
    """Small near N = 0, large near Pcr1: about N/Pcr1 (under 3 % at 0.02 Pcr1, over 80 % at 0.95 Pcr1)."""
    assert 0.0 < error_at(0.02).error < 0.03
    assert error_at(0.95).error > 0.8
