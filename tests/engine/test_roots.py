"""The engine's root finder against scipy's (:func:`scipy.optimize.brentq`, the reference library).

`engine/roots.py` follows Brent (1973) in the form of scipy's brentq.c, step for step, so the roots must equal
scipy's bit for bit, whatever the function, bracket and tolerances; and both raise on a bracket without a
sign change.
"""

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq as scipy_brentq

from engine.roots import brentq

FUNCTIONS = {
    "cubic": lambda x: x**3 - 2 * x - 5,  # Newton's example; root 2.0945514815423265 (scipy agrees)
    "cos": lambda x: math.cos(x) - x,
    "tan-mu": lambda t: math.sin(t) - t * math.cos(t),  # the clamped-clamped buckling equation, tan μ = μ
    "steep": lambda x: math.expm1(40 * (x - 0.3)),
    "flat": lambda x: (x - 0.7) ** 5,
}

BRACKETS = {
    "cubic": (2.0, 3.0),
    "cos": (0.0, 1.0),
    "tan-mu": (math.pi + 1e-9, 1.5 * math.pi - 1e-12),
    "steep": (-1.0, 1.0),
    "flat": (0.0, 2.0),
}


@pytest.mark.parametrize("name", sorted(FUNCTIONS))
@pytest.mark.parametrize(
    ("xtol", "rtol"), [(2e-12, 8.881784197001252e-16), (1e-15, 8.881784197001252e-16), (1e-6, 1e-10)]
)
def test_the_root_is_scipys_to_the_last_bit(name, xtol, rtol):
    """Equal roots, or both give up after 100 steps (a quintic's flat root at xtol = 1e-15 does in both)."""
    f, (a, b) = FUNCTIONS[name], BRACKETS[name]
    for lo, hi in ((a, b), (b, a)):
        assert _outcome(brentq, f, lo, hi, xtol, rtol) == _outcome(scipy_brentq, f, lo, hi, xtol, rtol)


def _outcome(finder, f, a, b, xtol, rtol):
    try:
        return finder(f, a, b, xtol=xtol, rtol=rtol)
    except RuntimeError:
        return "no convergence"


@settings(max_examples=300, deadline=None)
@given(
    root=st.floats(-1e3, 1e3, allow_nan=False),
    scale=st.floats(1e-3, 1e3),
    power=st.sampled_from([1, 3, 5]),
    left=st.floats(1e-6, 1e3),
    right=st.floats(1e-6, 1e3),
)
def test_random_brackets_agree_with_scipy(root, scale, power, left, right):
    def f(x):
        return scale * (x - root) ** power + 0.1 * math.sin(x - root) * scale

    a, b = root - left, root + right
    assert brentq(f, a, b) == scipy_brentq(f, a, b)


def test_an_endpoint_root_is_returned_as_it_is():
    assert brentq(lambda x: x - 1.0, 1.0, 3.0) == 1.0
    assert brentq(lambda x: x - 3.0, 1.0, 3.0) == 3.0


def test_no_sign_change_is_refused_as_scipy_refuses_it():
    with pytest.raises(ValueError):
        scipy_brentq(lambda x: x * x + 1, -1.0, 1.0)
    with pytest.raises(ValueError, match="different signs"):
        brentq(lambda x: x * x + 1, -1.0, 1.0)
    with pytest.raises(ValueError, match="rtol"):
        brentq(lambda x: x, -1.0, 1.0, rtol=1e-17)


# A case the fuzzer met (tests/reliability/test_fuzz.py): a support with a vanishing translational spring
# (1e-194 N/m) next to a guided end. Its characteristic function takes equal values at two bracket points, so
# an extrapolation step divides by zero; scipy's C code then gets an infinite step and bisects; so must we.
NEAR_FREE = {
    "schema": 1,
    "title": "Fuzzed case (invented)",
    "length": 0.8,
    "EI": 20000.0,
    "supports": {"left": {"translation": 1e-194, "rotation": "free"}, "right": "guided"},
    "axial_force": 0.0,
    "loads": [],
    "imperfection": {"shape": "none", "amplitude": 0.0},
}


def test_a_zero_divisor_in_a_step_bisects_as_scipy_does(monkeypatch):
    import engine
    from engine import prepared
    from engine.solver import buckling

    calls = []

    def both(f, a, b, **kw):
        ours = brentq(f, a, b, **kw)
        assert ours == scipy_brentq(f, a, b, **kw), (a, b)
        calls.append((a, b))
        return ours

    monkeypatch.setattr(buckling, "brentq", both)
    buckling.clear_cache()
    prepared.clear_cache()
    result = engine.solve(engine.Case.from_dict(NEAR_FREE), stations=11)
    assert calls, "the critical loads were not found through the root finder"
    assert all(math.isfinite(n) for n in result.critical_loads)
