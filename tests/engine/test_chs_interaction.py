"""The reduced plastic moment of a circular hollow section under axial force is never above the exact one.

Reference: the exact plastic interaction of an annulus, integrated here (the plastic neutral axis found with
scipy.optimize.brentq, the areas and first moments of the circular segments in closed form, [derived]).
A thin tube's exact curve is cos(πn/2) (the limit of that integration). The power law 1 − n^1.7 that
engine.codes takes for a CHS (from memory) exceeds the exact value of a thin tube by up to about 5 % above
n ≈ 0.69 (found by an independent check), so the engine takes the smaller of the two.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from scipy.optimize import brentq

from engine.codes import plastic_interaction


def _segment(R, c):
    """Area and first moment about the centre of the part of a disc of radius R above y = c."""
    c = min(max(c, -R), R)
    area = R * R * math.acos(c / R) - c * math.sqrt(R * R - c * c)
    return area, 2.0 / 3.0 * (R * R - c * c) ** 1.5


def _exact(n, D_over_t):
    """M_N/M_pl of an annulus (outer radius 1, wall 2/(D/t)) fully plastic at N = n·N_pl."""
    R, r = 1.0, 1.0 - 2.0 / D_over_t
    A = math.pi * (R * R - r * r)

    def parts(c):
        a_out, s_out = _segment(R, c)
        a_in, s_in = _segment(r, c) if r > 0 else (0.0, 0.0)
        return a_out - a_in, s_out - s_in

    c = brentq(lambda c: (2.0 * parts(c)[0] - A) / A - n, -R, R, xtol=1e-14)
    return parts(c)[1] / parts(0.0)[1]


@given(n=st.floats(min_value=0.0, max_value=0.999), D_over_t=st.floats(min_value=2.5, max_value=400.0))
def test_the_chs_reduced_moment_is_never_above_the_exact_annulus(n, D_over_t):
    """M_N,Rd/M_pl,Rd of a CHS at any n and D/t is at most the exact plastic interaction of its annulus."""
    assert plastic_interaction(shape="chs", axis="y", n=n) <= _exact(n, D_over_t) + 1e-9


@pytest.mark.parametrize("n", [0.8, 0.9, 0.95])
def test_a_thin_tube_at_high_axial_force_takes_the_exact_thin_tube_value(n):
    """At n = 0.8–0.95 the thin tube's cos(πn/2) governs (1 − n^1.7 is 2–6 % above it)."""
    assert plastic_interaction(shape="chs", axis="y", n=n) == pytest.approx(math.cos(0.5 * math.pi * n))
    assert 1.0 - n**1.7 > math.cos(0.5 * math.pi * n) * 1.02


def test_below_the_crossing_the_power_law_stands():
    """Up to n ≈ 0.68 the power law 1 − n^1.7 is the lower one and is kept."""
    values = np.array([0.1, 0.3, 0.5, 0.65])
    assert plastic_interaction(shape="chs", axis="y", n=values) == pytest.approx(1.0 - values**1.7)
