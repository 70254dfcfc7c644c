"""The equivalent-member rules (engine.design): AISC 360-16 §E3 and §H1.1, EN 1993-1-1 Annex B.

Sources are named beside each check; values recalled rather than read from a copy are marked "from memory".
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.design import aisc360, annex_b

KSI = 6.894757e6  # Pa per ksi (1 ksi = 1000 lbf/in², NIST SP 811)
E_US = 29_000 * KSI  # AISC 360-16 §E3 symbols list, E = 29 000 ksi (from memory)


def _phi_fcr_ksi(fy_ksi: float, slenderness: float) -> float:
    fe = math.pi**2 * E_US / slenderness**2  # eq. (E3-4)
    return aisc360.RESISTANCE["compression", "LRFD"] * aisc360.critical_stress(fy_ksi * KSI, fe) / KSI


@pytest.mark.parametrize(
    ("slenderness", "expected"),
    [(0.001, 45.0), (100, 21.7), (200, 5.65)],
)
def test_available_critical_stress_matches_the_manual_table(slenderness, expected):
    """φc·Fcr for Fy = 50 ksi: 45.0, 21.7 and 5.65 ksi at Lc/r = 0, 100 and 200 (AISC Steel Construction
    Manual, 15th ed., Table 4-14; from memory)."""
    assert _phi_fcr_ksi(50.0, slenderness) == pytest.approx(expected, abs=0.05)


def test_the_two_branches_of_e3_meet_at_the_elastic_limit():
    """At Fy/Fe = 2.25, 0.658^(Fy/Fe)·Fy and 0.877·Fe agree within 0.1 % (AISC 360-16 eqs. (E3-2)/(E3-3):
    their constants are rounded), and Lc/r = 4.71·√(E/Fy) is that limit (§E3, from memory)."""
    fy = 345e6
    fe = fy / aisc360.ELASTIC_LIMIT
    inelastic = 0.658**aisc360.ELASTIC_LIMIT * fy
    assert 0.877 * fe == pytest.approx(inelastic, rel=1e-3)
    assert aisc360.critical_stress(fy, fe) == pytest.approx(inelastic, rel=1e-12)
    assert aisc360.critical_stress(fy, fe * (1 - 1e-9)) == pytest.approx(0.877 * fe, rel=1e-8)
    limit = 4.71 * math.sqrt(E_US / fy)
    assert fy / (math.pi**2 * E_US / limit**2) == pytest.approx(2.25, rel=2e-3)


def test_no_buckling_leaves_the_yield_stress():
    """Fe → ∞ gives Fcr = Fy (eq. (E3-2) at Fy/Fe = 0)."""
    assert aisc360.critical_stress(250e6, math.inf) == 250e6


@given(st.floats(1e6, 1e9), st.floats(1e5, 1e11))
def test_critical_stress_never_exceeds_yield_or_the_elastic_stress(fy, fe):
    """0 < Fcr ≤ min(Fy, Fe) for every Fy, Fe: below squash and below Euler (AISC 360-16 §E3)."""
    fcr = aisc360.critical_stress(fy, fe)
    assert 0 < fcr <= min(fy, fe) * (1 + 1e-12)


def test_h1_branches_meet_at_their_common_point():
    """Pr/Pc = 0.2 with ΣMr/Mc = 0.9 is 1 by both (H1-1a) and (H1-1b) (AISC 360-16 §H1.1, from memory)."""
    above = aisc360.interaction(0.2, 1.0, 0.9, 1.0)
    below = aisc360.interaction(0.2 * (1 - 1e-12), 1.0, 0.9, 1.0)
    assert above.equation == "H1-1a" and below.equation == "H1-1b"
    assert above.utilization == pytest.approx(1.0, rel=1e-12)
    assert below.utilization == pytest.approx(1.0, rel=1e-11)


def test_h1_sums_both_axes_with_the_eight_ninths_factor():
    """Pr/Pc = 0.5, ΣMr/Mc = 0.3: 0.5 + 8/9·0.3 (H1-1a); Pr/Pc = 0.1: 0.05 + 0.3 (H1-1b)."""
    assert aisc360.interaction(500.0, 1000.0, 20.0, 100.0, 5.0, 50.0).utilization == pytest.approx(
        0.5 + 8 / 9 * 0.3, rel=1e-14
    )
    assert aisc360.interaction(-100.0, 1000.0, -20.0, 100.0, 5.0, 50.0).utilization == pytest.approx(
        0.35, rel=1e-14
    )


@pytest.mark.parametrize(
    ("M_h", "psi", "M_s", "load", "expected"),
    [
        (1.0, 1.0, 0.0, "uniform", 1.0),  # uniform moment
        (1.0, 0.0, 0.0, "uniform", 0.6),  # triangular
        (1.0, -1.0, 0.0, "concentrated", 0.4),  # double curvature: 0.2, held at 0.4
        (0.0, 0.0, 1.0, "uniform", 0.95),  # simply supported, uniform load
        (0.0, 0.0, 1.0, "concentrated", 0.90),  # simply supported, central point load
        (1.0, 1.0, -0.5, "uniform", 0.5),  # fixed ends, uniform load: alpha_s = -0.5, 0.1 + 0.4
        (1.0, 1.0, -0.5, "concentrated", 0.4),  # fixed ends, point load: -0.8·(-0.5) = 0.4
    ],
)
def test_equivalent_moment_factor_of_table_b3(M_h, psi, M_s, load, expected):
    """C_m of EN 1993-1-1 Annex B Table B.3 for the diagrams engineers meet most (cells from memory)."""
    assert annex_b.equivalent_moment_factor(M_h, psi, M_s, load) == pytest.approx(expected, abs=1e-12)


@given(
    st.floats(-1.0, 1.0),
    st.floats(-1.0, 1.0),
    st.floats(-3.0, 3.0).filter(lambda v: abs(v) > 1e-9),
    st.sampled_from(annex_b.LOAD_FORMS),
)
def test_equivalent_moment_factor_stays_between_its_bounds(M_h, psi, M_s, load):
    """0.4 ≤ C_m ≤ 1 for every diagram of Table B.3 (EN 1993-1-1 Annex B; its floor and the uniform-moment
    ceiling)."""
    if M_h == 0.0 and abs(M_s) <= abs(M_h):
        return
    cm = annex_b.equivalent_moment_factor(M_h, psi, M_s, load)
    assert 0.4 - 1e-12 <= cm <= 1.0 + 1e-12


@pytest.mark.parametrize("load", annex_b.LOAD_FORMS)
def test_table_b3_is_continuous_where_span_and_end_moments_are_equal(load):
    """With M_s = M_h (α_s = α_h = 1) both rows of Table B.3 give 1 (derived from the table's cells)."""
    by_alpha_s = annex_b.equivalent_moment_factor(1.0, 0.5, 1.0, load)
    by_alpha_h = annex_b.equivalent_moment_factor(1.0, 0.5, 1.0 + 1e-12, load)
    assert by_alpha_s == pytest.approx(1.0, abs=1e-12)
    assert by_alpha_h == pytest.approx(1.0, abs=1e-10)


def _factors(n_ratio: float, lam: float, section_class: int = 1, hollow: bool = False):
    chi = 0.6
    return annex_b.interaction_factors(
        N_Ed=n_ratio * chi * 1e6,
        N_Rk=1e6,
        chi_y=chi,
        chi_z=chi,
        lambda_y=lam,
        lambda_z=lam,
        C_my=0.9,
        C_mz=0.8,
        section_class=section_class,
        hollow=hollow,
    )


def test_interaction_factors_are_the_moment_factors_without_axial_force():
    """N_Ed = 0 gives k_yy = C_my, k_zz = C_mz (Table B.1: every factor is C_m(1 + … n), n = 0)."""
    k = _factors(0.0, 1.5)
    assert (k.k_yy, k.k_zz) == (pytest.approx(0.9), pytest.approx(0.8))
    assert (k.k_yz, k.k_zy) == (pytest.approx(0.6 * 0.8), pytest.approx(0.6 * 0.9))


@pytest.mark.parametrize(
    ("section_class", "hollow", "lam", "k_yy", "k_zz", "k_yz", "k_zy"),
    [
        # class 1, I section, λ̄ = 0.5, n = 0.5: k_yy = 0.9(1 + 0.3·0.5), k_zz = 0.8(1 + 0.4·0.5)
        (1, False, 0.5, 0.9 * 1.15, 0.8 * 1.2, 0.6 * 0.8 * 1.2, 0.6 * 0.9 * 1.15),
        # class 1, I section, λ̄ = 1.5, n = 0.5: both capped, 0.9(1 + 0.4) and 0.8(1 + 0.7)
        (1, False, 1.5, 0.9 * 1.4, 0.8 * 1.7, 0.6 * 0.8 * 1.7, 0.6 * 0.9 * 1.4),
        # class 2 hollow, λ̄ = 0.5: k_zz as k_yy, 0.8(1 + 0.15)
        (2, True, 0.5, 0.9 * 1.15, 0.8 * 1.15, 0.6 * 0.8 * 1.15, 0.6 * 0.9 * 1.15),
        # class 3, λ̄ = 0.5: 0.9(1 + 0.6·0.5·0.5), k_yz = k_zz, k_zy = 0.8 k_yy
        (3, False, 0.5, 0.9 * 1.15, 0.8 * 1.15, 0.8 * 1.15, 0.8 * 0.9 * 1.15),
    ],
)
def test_interaction_factors_of_table_b1(section_class, hollow, lam, k_yy, k_zz, k_yz, k_zy):
    """k_ij of EN 1993-1-1 Annex B Table B.1, members not susceptible to torsional deformations, by hand
    (cells from memory)."""
    k = _factors(0.5, lam, section_class, hollow)
    assert (k.k_yy, k.k_zz, k.k_yz, k.k_zy) == pytest.approx((k_yy, k_zz, k_yz, k_zy), rel=1e-12)


def test_member_check_is_the_sum_of_its_terms():
    """Eq. (6.61): N/(χ_y N_Rk) + k_yy M_y/M_y,Rk + k_yz M_z/M_z,Rk with γ_M1 = 1 (EN 1993-1-1 §6.3.3(4))."""
    k = annex_b.InteractionFactors(k_yy=1.0, k_yz=0.5, k_zy=0.6, k_zz=1.2, n_y=0.0, n_z=0.0)
    check = annex_b.member_check(
        N_Ed=300e3,
        M_y_Ed=-50e3,
        M_z_Ed=10e3,
        N_Rk=1000e3,
        M_y_Rk=200e3,
        M_z_Rk=100e3,
        chi_y=0.75,
        chi_z=0.5,
        factors=k,
    )
    assert check.eq_6_61 == pytest.approx(0.4 + 0.25 + 0.05, rel=1e-14)
    assert check.eq_6_62 == pytest.approx(0.6 + 0.15 + 0.12, rel=1e-14)
    assert check.utilization == check.eq_6_62


def test_class_4_is_refused():
    """Class 4 needs effective properties, which strutscope does not compute: refused, not guessed."""
    with pytest.raises(ValueError, match="class 4"):
        _factors(0.5, 1.0, section_class=4)
