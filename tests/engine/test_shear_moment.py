"""Shear and moment together (EN 1993-1-1:2005 §6.2.8, from memory): past half of the plastic shear
resistance the moment resistance takes (1 − ρ)·f_y, ρ = (2·V_Ed/V_pl,Rd − 1)², in the elastic check of one
plane and of two, and in the en-member route's cross-section term, as the plastic check already did.

An audit (stop 31) found the elastic check and the en-member cross-section term left it out: a short, heavily
loaded cantilever read a pass where §6.2.8 gives a failure. strutscope applies (1 − ρ) to the whole section,
on the safe side of the shear-area reading of §6.2.8(3) (a decision, written in DEVELOPERS.md).

HEB 200 (handbook values, ArcelorMittal sections tables, from memory): W_el,y = 570 cm³, A_v,z = 24.83 cm².
"""

from __future__ import annotations

import math

import pytest

import engine

L, FY = 0.5, 235e6


def _cantilever(P: float, method: str, N: float = 0.0, second: float | None = None) -> engine.Result:
    data = {
        "schema": 1,
        "length": L,
        "supports": {"left": "fixed", "right": "free"},
        "axial_force": N,
        "loads": [{"type": "point", "P": P, "x": L}],
        "section": {"name": "HEB 200"},
        "material": {"name": "S235"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "check": {"method": method, "gamma_M0": 1.0, "gamma_M1": 1.0},
    }
    if second is not None:
        data["second_plane"] = {
            "supports": {"left": "fixed", "right": "free"},
            "loads": [{"type": "point", "P": second, "x": L}],
            "imperfection": {"preset": "en1993-table-5.1"},
        }
    return engine.solve(engine.Case.from_dict(data))


def _rho(V: float, V_pl: float) -> float:
    """§6.2.8(3), from memory."""
    return 0.0 if V <= 0.5 * V_pl else (2.0 * V / V_pl - 1.0) ** 2


def test_heb_200_properties_match_the_handbook():
    section = _cantilever(1e3, "elastic").section
    assert section.W_el == pytest.approx(570e-6, rel=5e-3)  # handbook, from memory
    assert section.A_v == pytest.approx(24.83e-4, rel=5e-3)  # handbook, from memory


@pytest.mark.parametrize("P", [50e3, 150e3, 200e3, 250e3, 300e3])
def test_elastic_check_of_one_plane(P):
    """At the root of the cantilever, M = P·L (no axial force: the first order is exact), V = P."""
    result = _cantilever(P, "elastic")
    s = result.section
    V_pl = s.A_v * FY / math.sqrt(3.0)
    expected = P * L / (s.W_el * FY * (1.0 - _rho(P, V_pl)))
    assert float(max(result.check.axial_bending)) == pytest.approx(expected, rel=1e-6)


def test_the_audit_like_case_turns_from_a_pass_to_a_failure():
    """250 kN at 0.5 m: M/M_el,Rd = 0.93 alone; V/V_pl,Rd = 0.74, ρ = 0.24, so 1.23 (and the headline)."""
    result = _cantilever(250e3, "elastic")
    assert float(max(result.check.axial_bending)) > 1.2
    assert result.check.utilization > 1.2


@pytest.mark.parametrize("P", [100e3, 250e3])
def test_plastic_check_is_unchanged(P):
    """The plastic check had §6.2.8 already: M_pl·(1 − ρ)."""
    result = _cantilever(P, "plastic")
    s = result.section
    V_pl = s.A_v * FY / math.sqrt(3.0)
    expected = P * L / (s.W_pl * FY * (1.0 - _rho(P, V_pl)))
    assert float(max(result.check.axial_bending)) == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize("Pz", [20e3, 300e3])
def test_elastic_check_of_two_planes(Pz):
    """Both moments divided by (1 − ρ) with the larger ρ of the two planes."""
    Py = 250e3
    result = _cantilever(Py, "elastic", second=Pz)
    sy, sz = result.section, result.second_plane.section
    rho = max(_rho(Py, sy.A_v * FY / math.sqrt(3.0)), _rho(Pz, sz.A_v * FY / math.sqrt(3.0)))
    bending = Py * L / (sy.W_el * FY) + Pz * L / (sz.W_el * FY)
    assert float(max(result.check.axial_bending)) == pytest.approx(bending / (1.0 - rho), rel=1e-6)


@pytest.mark.parametrize("N", [0.0, 100e3])
@pytest.mark.parametrize("P", [100e3, 250e3])
def test_en_member_cross_section_term(N, P):
    """N/((A − ρA_v)·f_y) + (M_y/M_y,Rk)/(1 − ρ) with the first-order M_y = P·L and V = P (class 1: W_pl;
    §6.2.10(3): (1 − ρ)f_y in the shear area for N as well)."""
    result = _cantilever(P, "plastic", N=N)
    route = next(r for r in result.routes if r.route == "en-member")
    s = result.section
    rho = _rho(P, s.A_v * FY / math.sqrt(3.0))
    expected = N / ((s.A - rho * s.A_v) * FY) + P * L / (s.W_pl * FY) / (1.0 - rho)
    assert route.terms["cross-section"] == pytest.approx(expected, rel=1e-6)
    assert (route.facts.get("rho_shear", 0.0) > 0.0) == (rho > 0.0)
