"""The series and closed forms of the beam-column functions against mpmath at 40 digits."""

import math

import mpmath as mp
import numpy as np
import pytest

from engine.solver.functions import SERIES_LIMIT, phi, phi_closed, phi_series

mp.mp.dps = 40


def _phi_mp(n, s, xi):
    """φ_n(ξ; s) = Σ (−s)^j ξ^(n+2j) / (n+2j)!, summed in 40-digit arithmetic (definition, [derived])."""
    s, xi = mp.mpf(s), mp.mpf(xi)
    return mp.nsum(lambda j: (-s) ** j * xi ** (n + 2 * j) / mp.factorial(n + 2 * int(j)), [0, mp.inf])


@pytest.mark.parametrize("z", [-4.0, -2.5, -1.0, -1e-3, -1e-9, 0.0, 1e-9, 1e-3, 0.7, 2.0, 3.999])
def test_series_matches_high_precision_sums(z):
    """Every φ_n from the series agrees with the 40-digit sum over |sξ²| ≤ 4, to 2e-15 of its scale ξⁿ/n!."""
    xi = 1.7
    s = -z / xi**2
    got = phi_series(s, xi)
    for n in range(6):
        ref = float(_phi_mp(n, s, xi))
        scale = xi**n / math.factorial(n)  # near a zero of cos kξ only the absolute error is meaningful
        assert abs(got[n] - ref) <= 2e-15 * scale, (n, got[n], ref)


@pytest.mark.parametrize("z", [4.0001, 9.0, 50.0, -4.0001, -30.0])
def test_closed_forms_match_high_precision_sums(z):
    """The trigonometric and hyperbolic closed forms agree with the 40-digit sums beyond the series range."""
    xi = 0.9
    s = -z / xi**2
    got = phi_closed(s, xi)
    for n in range(4):
        assert got[n] == pytest.approx(float(_phi_mp(n, s, xi)), rel=1e-13), n


def test_hybrid_is_continuous_at_the_series_limit():
    """phi switches from series to closed form at |sξ²| = 4 without a visible jump (1e-14 relative)."""
    xi = 1.0
    for sign in (1.0, -1.0):
        below = phi(sign * SERIES_LIMIT * (1 - 1e-12), xi)
        above = phi(sign * SERIES_LIMIT * (1 + 1e-12), xi)
        for a, b in zip(below, above, strict=True):
            assert a == pytest.approx(b, rel=1e-11)


def test_series_is_entire_through_zero_force():
    """φ_4 and φ_5 are smooth through s = 0: the one-sided values at ±1e-12 straddle the polynomial value."""
    xi = 2.0
    at0 = phi_series(0.0, xi)
    for n, exact in zip(range(6), [1.0, 2.0, 2.0, 8 / 6, 16 / 24, 32 / 120], strict=True):
        assert at0[n] == exact or at0[n] == pytest.approx(exact, rel=1e-16)
    up, down = phi_series(1e-12, xi), phi_series(-1e-12, xi)
    for n in range(6):
        assert (up[n] - at0[n]) * (down[n] - at0[n]) <= 0.0


def test_vectorised_call_matches_scalar_calls():
    """Arrays of s and ξ give the same numbers as element-by-element calls (the many-point path)."""
    rng = np.random.default_rng(3)
    xi = rng.uniform(0, 2, 3000)
    s = rng.uniform(-1, 1, 3000)
    many = phi_series(s, xi)
    for i in (0, 17, 2999):
        one = phi_series(s[i], xi[i])
        for n in range(6):
            assert many[n][i] == pytest.approx(float(one[n]), rel=1e-15, abs=1e-300)
