"""Annex B for a solid rectangle or a deep RHS checked for lateral-torsional buckling: k_zy of Table B.2.

Eq. (6.62) of EN 1993-1-1 counts the member's twist through chi_LT; Table B.1's k_zy = 0.6 k_yy belongs to
members not susceptible to torsional deformation. A solid rectangle with chi_LT < 1 read 0.768 with B.1 where
Table B.2 gives 1.031 (an independent audit; Annex A gave 0.997). Each factor is now at least Table B.2's.

Hand values, EN 1993-1-1 from memory: Table B.2, class 1-2 (and the elastic method), lambda_z >= 0.4:
k_zy = max(1 - 0.1 lambda_z n_z/(C_mLT - 0.25), 1 - 0.1 n_z/(C_mLT - 0.25)); Table B.3 C_mLT = 0.95 for a
pinned span under a uniform load (alpha_h = 0); eq. (6.49) for chi_z with curve c (solid sections) or the
engine's curve for the RHS; eq. (6.62) = n_z + k_zy M_y,Ed/(chi_LT M_y,Rk), M_y,Ed = q L^2/8. chi_LT is
the engine's own (its lateral-torsional check has its own tests against M_cr references); section
properties are the engine's (tested against handbook tables elsewhere).
"""

from __future__ import annotations

import math

import pytest

import engine

_CURVES = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}  # Table 6.1, from memory


def _chi(lam: float, alpha: float) -> float:
    phi = 0.5 * (1.0 + alpha * (lam - 0.2) + lam * lam)
    return min(1.0, 1.0 / (phi + math.sqrt(phi * phi - lam * lam)))


@pytest.mark.parametrize(
    ("section", "length", "N", "q"),
    [
        ({"shape": "rectangle", "b": 0.04, "h": 0.25}, 3.0, 96e3, 76e3),  # the audit's member
        ({"shape": "rectangle", "b": 0.03, "h": 0.2}, 4.0, 30e3, 12e3),
        ({"shape": "rhs", "h": 0.3, "b": 0.1, "t": 0.01, "manufacture": "hot-finished"}, 8.0, 150e3, 20e3),
    ],
    ids=["audit-rectangle", "rectangle", "deep-rhs"],
)
def test_eq_6_62_takes_table_b2_k_zy(section, length, N, q):
    case = engine.Case.from_dict(
        {
            "title": "Invented beam-column",
            "length": length,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [{"type": "uniform", "q": q}],
            "section": section,
            "material": {"name": "S355"},
            "axis": "major",
            "check": {"method": "elastic", "gamma_M0": 1.0, "gamma_M1": 1.0},
        }
    )
    result = engine.solve(case)
    assert result.ltb is not None and result.ltb.applies and result.ltb.chi_LT < 1.0
    route = next(r for r in result.routes if r.route == "en-member")
    s, E = result.section, result.material.E
    N_Rk, M_Rk = route.facts["N_Rk"], route.facts["M_y_Rk"]
    fy = N_Rk / s.A  # the yield strength for the thickness (EN 10025-2, tested elsewhere)
    if section["shape"] == "rectangle":  # class 1: W_pl = b h^2/4 by hand
        assert M_Rk == pytest.approx(section["b"] * section["h"] ** 2 / 4 * fy, rel=1e-9)
    if section["shape"] == "rectangle":  # I_z = h b^3/12 by hand; the RHS's lambda_z is the engine's
        lam_z = math.sqrt(N_Rk / (math.pi**2 * E * section["h"] * section["b"] ** 3 / 12 / length**2))
        assert route.facts["lambda_z"] == pytest.approx(lam_z, rel=1e-9)
    else:
        lam_z = route.facts["lambda_z"]
    curve = "c" if section["shape"] == "rectangle" else route.facts["curve_z"]
    n_z = N / (_chi(lam_z, _CURVES[curve]) * N_Rk)
    C_mLT = 0.95
    k_zy = max(1 - 0.1 * lam_z * n_z / (C_mLT - 0.25), 1 - 0.1 * n_z / (C_mLT - 0.25))
    bending = (q * length**2 / 8) / (result.ltb.chi_LT * M_Rk)
    hand = n_z + k_zy * bending
    assert route.facts["k_zy"] >= k_zy * (1 - 1e-9)
    assert route.facts["C_mLT"] == pytest.approx(C_mLT)
    assert route.terms["eq-6.62"] >= hand * (1 - 1e-6)
    if section["shape"] == "rectangle":  # the rectangle: Table B.2's row is the largest, so it is the value
        assert route.terms["eq-6.62"] == pytest.approx(hand, rel=1e-6)
