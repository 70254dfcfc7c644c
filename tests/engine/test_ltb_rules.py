"""Lateral-torsional buckling code rules (engine.design.ltb): the three-factor formula, C1 of the standard
diagrams, EN 1993-1-1 χ_LT and AISC 360-16 §F2.

Sources are named beside each check; values recalled rather than read from a copy are marked "from memory".
Reference values of χ_LT are recomputed here with mpmath at 30 digits from the formulas as written in
EN 1993-1-1:2005 §6.3.2.2/§6.3.2.3 (from memory), independently of the module's code.
All listed in tests/REFERENCES.md §11.
"""

from __future__ import annotations

import math

import mpmath
import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.design import ltb

KSI = 6.894757e6  # Pa per ksi (NIST SP 811)
IN = 0.0254  # m per inch
E_US = 29_000 * KSI  # AISC 360-16, E = 29 000 ksi (from memory)
# W18×50, AISC Steel Construction Manual 15th ed. Table 1-1 (from memory): Z_x, S_x, r_y, I_y, C_w, J, h_o.
W18X50 = {
    "Z_x": 101 * IN**3,
    "S_x": 88.9 * IN**3,
    "r_y": 1.65 * IN,
    "I_y": 40.1 * IN**4,
    "C_w": 3040 * IN**6,
    "J": 1.24 * IN**4,
    "h_o": 17.4 * IN,
}


def _chi_mp(lam, alpha, lam0, beta, kc=1.0):
    """χ_LT (and χ_LT,mod with kc) in mpmath, EN 1993-1-1:2005 eqs. (6.56)–(6.58) (from memory)."""
    mpmath.mp.dps = 30
    lam, alpha, lam0, beta, kc = (mpmath.mpf(v) for v in (lam, alpha, lam0, beta, kc))
    phi = (1 + alpha * (lam - lam0) + beta * lam**2) / 2
    chi = 1 / (phi + mpmath.sqrt(phi**2 - beta * lam**2))
    cap = min(mpmath.mpf(1), 1 / lam**2) if lam > 0 else mpmath.mpf(1)
    f = min(mpmath.mpf(1), 1 - (1 - kc) / 2 * (1 - 2 * (lam - mpmath.mpf("0.8")) ** 2))
    return float(min(chi / f, cap))


# ----------------------------------------------------------------------------- three-factor formula, C1


def test_three_factor_formula_with_c1_1_is_the_uniform_moment_closed_form():
    """C1 = 1, z_g = 0, k = k_w = 1: Timoshenko & Gere ch. 6 exactly; top-flange z_g lowers it, bottom raises
    it (ENV 1993-1-1 Annex F eq. (F.2), from memory)."""
    L, ei_z, gi_t, ei_w = 5.0, 3e6, 5e4, 2e4
    exact = math.pi / L * math.sqrt(ei_z * gi_t * (1 + math.pi**2 * ei_w / (L**2 * gi_t)))
    assert ltb.mcr_c1(L, ei_z, gi_t, ei_w, 1.0) == pytest.approx(exact, rel=1e-13)
    top = ltb.mcr_c1(L, ei_z, gi_t, ei_w, 1.127, 0.454, 0.2)
    bottom = ltb.mcr_c1(L, ei_z, gi_t, ei_w, 1.127, 0.454, -0.2)
    assert top < 1.127 * exact < bottom


@pytest.mark.parametrize(
    ("m", "diagram", "c1", "c2"),
    [
        (lambda xi: np.ones_like(xi), "uniform", 1.0, 0.0),
        (lambda xi: 4 * xi * (1 - xi), "udl", 1.127, 0.454),
        (lambda xi: 1 - np.abs(2 * xi - 1), "point", 1.348, 0.630),
        (lambda xi: 1 - xi, "linear", 1.88, 0.0),
        (lambda xi: 1 - 2 * xi, "linear", 2.70, 0.0),
        (lambda xi: -(4 * xi * (1 - xi)), "udl", 1.127, 0.454),
        (lambda xi: np.sin(3 * np.pi * xi), "none", 1.0, 0.0),
    ],
)
def test_the_nearest_standard_diagram_and_its_factors(m, diagram, c1, c2):
    """Standard diagrams are recognised with their C1/C2 (ENV 1993-1-1 Annex F Tables F.1.1/F.1.2 and the fit
    1.88 − 1.40ψ + 0.52ψ² ≤ 2.70; from memory); a shape far from all of them gets C1 = 1 (the safe side)."""
    xi = np.linspace(0, 1, 101)
    found = ltb.c1_for_diagram(xi * 7.0, m(xi))
    assert (found.diagram, found.C1, found.C2) == (diagram, pytest.approx(c1), pytest.approx(c2))


def test_c1_linear_fit_and_its_cap():
    """C1(ψ) = 1.88 − 1.40ψ + 0.52ψ² ≤ 2.70: 1.0 at ψ = 1, 1.31 at 0.5, 1.88 at 0, capped at 2.70 from about
    ψ = −0.5 (from memory)."""
    assert [ltb.c1_linear(p) for p in (1.0, 0.5, 0.0, -0.5, -1.0)] == pytest.approx(
        [1.0, 1.31, 1.88, 2.70, 2.70]
    )


# ----------------------------------------------------------------------------- EN 1993-1-1 §6.3.2


@pytest.mark.parametrize("curve", ["a", "b", "c", "d"])
@pytest.mark.parametrize("lam", [0.0, 0.2, 0.4, 0.7, 1.0, 1.5, 2.5])
def test_chi_lt_general_case_matches_the_formula(curve, lam):
    """§6.3.2.2 eq. (6.56), λ̄_LT,0 = 0.2, β = 1, α_LT of Table 6.3 (from memory), against mpmath."""
    alpha = {"a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}[curve]
    expected = min(1.0, _chi_mp(lam, alpha, 0.2, 1.0)) if lam > 0.2 else 1.0
    if lam > 0:
        expected = min(expected, 1.0)  # the general case has no 1/λ̄² cap; it never binds for β = 1
    assert ltb.chi_lt_general(lam, curve) == pytest.approx(expected, rel=1e-12)


def test_chi_lt_general_curve_b_at_slenderness_1():
    """Curve b at λ̄_LT = 1.0: χ_LT = 0.597 (EN 1993-1-1 Table 6.1's curve b value, the same formula; from
    memory)."""
    assert ltb.chi_lt_general(1.0, "b") == pytest.approx(0.597, abs=5e-4)


@pytest.mark.parametrize("curve", ["b", "c", "d"])
@pytest.mark.parametrize("lam", [0.3, 0.4, 0.8, 1.0, 1.6, 3.0])
@pytest.mark.parametrize("kc", [1.0, 0.94, 0.752])
def test_chi_lt_rolled_case_matches_the_formula(curve, lam, kc):
    """§6.3.2.3 eqs. (6.57)/(6.58), λ̄_LT,0 = 0.4, β = 0.75, χ_LT ≤ 1/λ̄², f with k_c (Table 6.6, from
    memory), against mpmath."""
    alpha = {"b": 0.34, "c": 0.49, "d": 0.76}[curve]
    expected = _chi_mp(lam, alpha, 0.4, 0.75, kc)
    assert ltb.chi_lt_rolled(lam, curve, kc=kc) == pytest.approx(min(expected, 1.0), rel=1e-12)


def test_rolled_case_plateau_cap_and_modification():
    """§6.3.2.3: χ_LT = 1 up to λ̄_LT,0 = 0.4; ≤ 1/λ̄² (binds at large λ̄ for curve b); f < 1 raises χ
    (kc = 0.94 at λ̄ = 0.8: f = 0.97 exactly) (from memory)."""
    assert ltb.chi_lt_rolled(0.4, "c") == 1.0
    assert ltb.chi_lt_rolled(3.0, "b") <= 1 / 9 + 1e-15
    plain = ltb.chi_lt_rolled(0.8, "c")
    assert ltb.chi_lt_rolled(0.8, "c", kc=0.94) == pytest.approx(plain / 0.97, rel=1e-12)


@given(st.floats(0.0, 4.0), st.sampled_from(["a", "b", "c", "d"]))
def test_rolled_case_is_never_below_the_general_case(lam, curve):
    """For the same curve, §6.3.2.3 (λ̄_0 = 0.4, β = 0.75) gives χ_LT at least the general case's (common
    practice, no source; the reason §6.3.2.3 exists)."""
    assert ltb.chi_lt_rolled(lam, curve) >= ltb.chi_lt_general(lam, curve) * (1 - 1e-12)


def test_curves_and_kc_from_the_tables():
    """Tables 6.4/6.5 (rolled I: a/b by h/b ≤ 2 for §6.3.2.2, b/c for §6.3.2.3; welded c/d) and Table 6.6
    (k_c: 1/(1.33 − 0.33ψ), 0.94 for a uniform load, 0.86 for a central point load on a simple span), from
    memory; both ≈ 1/√C1 with C1 = 1.13 and 1.35 (the table's 0.90 is a uniform load with fixed ends)."""
    assert [ltb.lt_curve(shape="rolled_i", h_over_b=r) for r in (1.5, 2.5)] == ["a", "b"]
    assert [ltb.lt_curve(shape="rolled_i", h_over_b=r, method="rolled") for r in (1.5, 2.5)] == ["b", "c"]
    assert [ltb.lt_curve(shape="welded_i", h_over_b=r) for r in (1.5, 2.5)] == ["c", "d"]
    assert ltb.lt_curve(shape="rhs", h_over_b=1.0) == "d"
    assert ltb.k_c("linear", 1.0) == pytest.approx(1.0)
    assert ltb.k_c("linear", -1.0) == pytest.approx(1 / 1.66)
    assert (ltb.k_c("udl"), ltb.k_c("point"), ltb.k_c("other")) == (0.94, 0.86, 1.0)
    assert ltb.k_c("udl") == pytest.approx(1 / math.sqrt(1.13), abs=0.005)
    assert ltb.k_c("point") == pytest.approx(1 / math.sqrt(1.35), abs=0.005)


# ----------------------------------------------------------------------------- AISC 360-16 Chapter F


def test_cb_of_the_common_diagrams():
    """Eq. (F1-1): uniform 1.0, UDL 1.14, central point load 1.32, linear to zero 1.67 (AISC 360-16
    Commentary Table C-F1.1 values, from memory)."""
    assert ltb.cb_aisc(1, 1, 1, 1) == 1.0
    assert ltb.cb_aisc(1, 0.75, 1, 0.75) == pytest.approx(1.14, abs=0.005)
    assert ltb.cb_aisc(1, 0.5, 1, 0.5) == pytest.approx(1.32, abs=0.005)
    assert ltb.cb_aisc(1, 0.75, 0.5, 0.25) == pytest.approx(1.67, abs=0.005)


def test_f2_limits_of_a_w18x50():
    """W18×50, F_y = 50 ksi: L_p = 5.83 ft, L_r = 16.9 ft, φM_p = 379 kip·ft (AISC Manual 15th ed. Table 3-2,
    from memory)."""
    r = ltb.aisc_f2(L_b=0.0, E=E_US, F_y=50 * KSI, **W18X50)
    assert r.L_p / (12 * IN) == pytest.approx(5.83, abs=0.01)
    assert r.L_r / (12 * IN) == pytest.approx(16.9, abs=0.1)
    assert 0.9 * r.M_p / (KSI * IN**3 * 12) == pytest.approx(379, abs=1)


def test_f2_is_continuous_at_lp_and_lr():
    """M_n = M_p at L_p; at L_r the inelastic branch reaches 0.7 F_y S_x and the elastic branch F_cr S_x
    equals it within 0.2 % (F2-2, F2-3, F2-6 with c = 1, C_b = 1; from memory: the constants 1.95 and 6.76 of
    F2-6 are rounded, the elastic branch lies 0.12 % below here, on the safe side)."""
    fy = 50 * KSI
    base = ltb.aisc_f2(L_b=0.0, E=E_US, F_y=fy, **W18X50)
    at_lp = ltb.aisc_f2(L_b=base.L_p * (1 + 1e-12), E=E_US, F_y=fy, **W18X50)
    assert at_lp.M_n == pytest.approx(base.M_p, rel=1e-9)
    below = ltb.aisc_f2(L_b=base.L_r * (1 - 1e-12), E=E_US, F_y=fy, **W18X50)
    above = ltb.aisc_f2(L_b=base.L_r * (1 + 1e-12), E=E_US, F_y=fy, **W18X50)
    target = 0.7 * fy * W18X50["S_x"]
    assert below.zone == "inelastic" and above.zone == "elastic"
    assert below.M_n == pytest.approx(target, rel=1e-9)
    assert above.M_n == pytest.approx(target, rel=2e-3) and above.M_n <= below.M_n
    assert above.F_cr == pytest.approx(0.7 * fy, rel=2e-3)


def test_f2_elastic_branch_is_the_exact_critical_moment():
    """Beyond L_r, F_cr S_x with C_b = 1 is the uniform-moment closed form (Timoshenko & Gere ch. 6) written
    with r_ts and h_o, for G = E/2.6 (AISC's G = 11 200 ksi, from memory): within 0.5 % (the 0.078 and
    r_ts² = √(I_y C_w)/S_x are exact for an I-shape with C_w = I_y h_o²/4)."""
    s = dict(W18X50, C_w=W18X50["I_y"] * W18X50["h_o"] ** 2 / 4)
    L_b = 30 * 12 * IN
    r = ltb.aisc_f2(L_b=L_b, E=E_US, F_y=50 * KSI, **s)
    g = E_US / 2.6
    exact = (
        math.pi
        / L_b
        * math.sqrt(E_US * s["I_y"] * g * s["J"] * (1 + math.pi**2 * E_US * s["C_w"] / (L_b**2 * g * s["J"])))
    )
    assert r.F_cr * s["S_x"] == pytest.approx(exact, rel=5e-3)
