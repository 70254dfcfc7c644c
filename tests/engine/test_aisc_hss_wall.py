"""The design wall of an ERW hollow section on the aisc route: AISC 360-16 §B4.2 (from memory) takes 0.93 ×
the nominal wall thickness of an ASTM A500 HSS for every property its checks use.

The audit (stop 31) found the route used the nominal wall: A_g, S and Z about 7 % high, on the unsafe side.
The expected values here are the section rebuilt with t = 0.93·t (engine.sections, itself checked against
handbook tables and sectionproperties elsewhere), Euler's N_cr ∝ EI for the buckling load, and Timoshenko &
Gere's closed form for a pinned strut under a uniform load, M = q/k²·(sec(kL/2) − 1), k = √(N/EI) (from
memory). Members are invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.aisc_member import flexure_class
from engine.sections import section_from_spec

A500 = "ASTM A500 Gr. C rectangular"
RHS = {"shape": "rhs", "h": 0.15, "b": 0.15, "t": 0.008, "manufacture": "cold-formed"}
L, Q = 4.0, 3e3


def _route(section: dict, material: str, N: float = 300e3, method: str = "LRFD"):
    data = {
        "schema": 1,
        "title": "Invented HSS strut on the aisc route",
        "length": L,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": N,
        "loads": [{"type": "uniform", "q": Q}],
        "section": section,
        "material": {"name": material},
        "check": {"routes": ["aisc"], "aisc_method": method},
    }
    result = engine.solve(engine.Case.from_dict(data))
    return result, next(r for r in result.routes if r.route == "aisc")


def _design(section: dict) -> dict:
    return {**section, "t": 0.93 * section["t"]}


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
def test_an_a500_hss_takes_the_design_wall(method):
    N = 300e3
    result, route = _route(RHS, A500, N, method)
    f = route.facts
    design = section_from_spec(_design(RHS))
    assert f["t_nominal"] == pytest.approx(0.008, rel=1e-12)
    assert f["t_design"] == pytest.approx(0.93 * 0.008, rel=1e-12)
    assert f["A_g"] == pytest.approx(design.A, rel=1e-12)
    assert f["A_g"] < 0.95 * result.section.A  # the nominal area is 6-7 % larger
    # Euler: N_cr ∝ EI, so the design load is the analysed one times I_des/I_nom; F_e = N_cr,des/A_g
    N_cr_design = float(result.critical_loads[0]) * design.I / result.section.I
    assert f["F_e_y"] == pytest.approx(N_cr_design / design.A, rel=1e-9)
    # M_r: the nominal bow-free moment grown by the single mode's (1 − αN/N_cr)/(1 − αN/N_cr,des); it is
    # within 0.3 % of the closed form with the design stiffness, and never below it by more than that
    alpha = 1.6 if method == "ASD" else 1.0
    EI_nom, EI_des = result.EI, result.material.E * design.I

    def closed(EI):
        k = math.sqrt(alpha * N / EI)
        return Q / k**2 * (1 / math.cos(k * L / 2) - 1)

    N_cr = float(result.critical_loads[0])
    grown = closed(EI_nom) * (1 - alpha * N / N_cr) / (1 - alpha * N / N_cr_design)
    assert f["M_r_y"] == pytest.approx(grown, rel=1e-6)
    assert f["M_r_y"] == pytest.approx(closed(EI_des), rel=3e-3)
    assert "aisc-erw-design-wall" in route.notes


def test_another_steel_keeps_the_nominal_wall():
    result, route = _route(RHS, "ASTM A36")
    assert route.facts["A_g"] == pytest.approx(result.section.A, rel=1e-12)
    assert "t_design" not in route.facts
    assert "aisc-erw-design-wall" not in route.notes


def test_a_round_a500_hss_takes_the_design_wall():
    chs = {"shape": "chs", "D": 0.1683, "t": 0.0071, "manufacture": "cold-formed"}
    _, route = _route(chs, "ASTM A500 Gr. C round")
    assert route.facts["A_g"] == pytest.approx(section_from_spec(_design(chs)).A, rel=1e-12)


def test_the_design_wall_makes_a_compact_wall_noncompact():
    """b/t = (B − 3t)/t = 26 with the nominal wall, within λ_p = 1.12√(E/F_y) = 26.97 at F_y = 50 ksi
    (Table B4.1b, from memory); 28.2 with the design wall, beyond it: M_n by eq. (F7-2), not F_y·Z."""
    t = 0.2 / 29
    rhs = {"shape": "rhs", "h": 0.2, "b": 0.2, "t": t, "manufacture": "cold-formed"}
    result, route = _route(rhs, A500, N=100e3)
    E, Fy = result.material.E, result.material.fy
    assert flexure_class(section_from_spec(rhs), E, Fy)[0] == "compact"
    assert route.facts["flexure_y"] == "noncompact"
    design = section_from_spec(_design(rhs))
    M_p = min(Fy * design.W_pl, 1.6 * Fy * design.W_el)
    ratio = (0.2 - 3 * 0.93 * t) / (0.93 * t)
    expected = M_p - (M_p - Fy * design.W_el) * (3.57 * ratio * math.sqrt(Fy / E) - 4.0)  # eq. (F7-2)
    assert route.facts["M_n_y"] == pytest.approx(expected, rel=1e-12)
    assert route.facts["M_n_y"] < 0.99 * Fy * design.W_pl
