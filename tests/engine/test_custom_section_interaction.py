"""A custom steel section in compression and bending: member buckling with the moments is counted.

The en-member and aisc routes are not applied to a custom section (its classes and buckling curves are not
known), and the second-order route had the out-of-plane term N/N_b,z and the lateral-torsional term
M_y,II/M_b,Rd each alone: the interaction of EN 1993-1-1 §6.3.3 eq. (6.62) was in no term. An independent
audit (stop 35) found an IPE 300 entered as a custom section, 6 m pinned, 10 kN/m on the top flange, passing
at 100 kN with 0.877 where eq. (6.62) gives 1.12–1.17 (unsafe). The route now adds the term
``buckling-interaction`` with the section read as class 3 (elastic properties), curve d about both axes (the
most unfavourable of Table 6.2, as the out-of-plane check takes a custom section) and the largest factors of
Annex B Tables B.1 and B.2.

Reference values by hand: EN 1993-1-1:2005 eq. (6.49) with α = 0.76 (curve d), eq. (6.62), Annex B Table B.2
k_zy for class 3, [1 − 0.05·λ̄_z·n_z/(C_mLT − 0.25)] ≥ [1 − 0.05·n_z/(C_mLT − 0.25)], with C_mLT = 1 (the
larger of the diagram's Table B.3 value and 1 is kept) (clauses from memory). χ_LT is the engine's own
(its M_cr was checked against an independent finite-element solution by the same audit).
"""

from __future__ import annotations

import math

import pytest

import engine

E, FY, LENGTH, Q = 210e9, 355e6, 6.0, 10e3
# The properties of an IPE 300 (rolled-section tables, from memory; I_t, I_w without the fillets' share)
SECTION = {
    "shape": "custom",
    "A": 53.81e-4,
    "I": 8356e-8,
    "W_el": 557.0e-6,  # 2I/h = 557.07 cm³ (the tables round it up to 557.1)
    "W_pl": 628.4e-6,
    "depth": 0.3,
    "width": 0.15,
    "t_max": 0.0107,
    "doubly_symmetric": True,
    "open_section": True,
    "Iz": 603.8e-8,
}
TORSION = {"It": 19.06e-8, "Iw": 120.5e-9, "ltb_curve": "a"}


def _case(N: float, torsion: bool = True) -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": LENGTH,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "section": {**SECTION, **(TORSION if torsion else {})},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
            "loads": [{"type": "uniform", "q": Q}],
        }
    )


def _chi_d(lam: float) -> float:
    phi = 0.5 * (1 + 0.76 * (lam - 0.2) + lam**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))


def _eq_6_62(N: float, chi_LT: float, gamma_M1: float) -> float:
    A, Iz, W = SECTION["A"], SECTION["Iz"], SECTION["W_el"]
    N_cr_z = math.pi**2 * E * Iz / LENGTH**2
    lam_z = math.sqrt(A * FY / N_cr_z)
    n_z = N / (_chi_d(lam_z) * A * FY / gamma_M1)
    C_mLT = 1.0
    k_zy = max(1 - 0.05 * lam_z * n_z / (C_mLT - 0.25), 1 - 0.05 * n_z / (C_mLT - 0.25))
    M = Q * LENGTH**2 / 8
    return n_z + k_zy * M / (chi_LT * W * FY / gamma_M1)


def _second_order(result):
    (route,) = [r for r in result.routes if r.route == "second-order"]
    return route


@pytest.mark.parametrize("N", [100e3, 200e3])
def test_eq_6_62_is_counted_for_a_custom_section(N):
    """The audit's case: the route's utilisation is eq. (6.62) by hand (1.17 at 100 kN, 1.73 at 200 kN),
    above the lateral-torsional term alone (0.877, 1.197) that governed before."""
    result = engine.solve(_case(N))
    route = _second_order(result)
    expected = _eq_6_62(N, result.ltb.chi_LT, result.case.check.gamma_M1)
    assert route.terms["buckling-interaction"] == pytest.approx(expected, rel=1e-6)
    assert route.governing == "buckling-interaction"
    assert route.utilization == pytest.approx(expected, rel=1e-6)
    assert route.utilization > route.terms["lateral-torsional"]
    assert route.facts["interaction_reason"] == "custom-section"
    assert expected > 1.0  # the member fails; it passed at 100 kN before
    codes = {c.code for c in result.cautions}
    assert "buckling-interaction-counted" in codes


def test_without_torsion_constants_the_out_of_plane_interaction_still_counts():
    """No I_t, I_w: lateral-torsional buckling is not checked (a caution says so), and χ_LT = 1; eq. (6.62)
    with Table B.2's k_zy still adds the moment to the out-of-plane term: 0.61 against N/N_b,z = 0.386."""
    result = engine.solve(_case(100e3, torsion=False))
    route = _second_order(result)
    expected = _eq_6_62(100e3, 1.0, result.case.check.gamma_M1)
    assert route.terms["buckling-interaction"] == pytest.approx(expected, rel=1e-6)
    assert route.utilization == pytest.approx(expected, rel=1e-6)
    assert route.terms["out-of-plane"] < expected


def test_no_term_in_tension_or_when_out_of_plane_buckling_is_prevented_and_no_ltb():
    """In tension eqs. (6.61)/(6.62) do not apply; with the other axis restrained and no torsion constants
    (χ_LT = 1) no equation is left that the second-order route does not already count in plane."""
    tension = _second_order(engine.solve(_case(-100e3)))
    assert "buckling-interaction" not in tension.terms
    data = _case(100e3, torsion=False).to_dict()
    data["out_of_plane"] = {"restrained": True}
    held = _second_order(engine.solve(engine.Case.from_dict(data)))
    assert "buckling-interaction" not in held.terms
