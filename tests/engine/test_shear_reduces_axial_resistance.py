"""High shear reduces the axial resistance as well as the moment resistance.

Source: EN 1993-1-1:2005 §6.2.10(3) with §6.2.8(3) (from memory): where V_Ed > 0.5·V_pl,Rd, the resistance
to N and M is found with the reduced yield strength (1 − ρ)·f_y in the shear area A_v,
ρ = (2V_Ed/V_pl,Rd − 1)², so N_pl,V = (A − ρ·A_v)·f_y. strutscope also keeps its reduction of the whole
moment resistance by (1 − ρ) (on the safe side). The invented stub column (HEB 200, S355, 1 m, a heavy point
load 5 mm from a pinned end) came from an independent check, where the code's check fails (1.133) and the
tool read 0.916 before.
"""

from __future__ import annotations

import math

import pytest

import engine

STUB = {
    "schema": 1,
    "title": "Invented HEB 200 stub column: high axial force and high shear at a pinned end",
    "length": 1.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 2495e3,
    "loads": [{"type": "point", "P": 421e3, "x": 0.005}],
    "imperfection": {"preset": "en1993-table-5.1"},
    "section": {"name": "HEB 200"},
    "axis": "major",
    "material": {"name": "S355"},
    "check": {"method": "plastic"},
    "out_of_plane": {"restrained": True},
}


def _rho(V, V_pl):
    """ρ of EN 1993-1-1 §6.2.8(3) (from memory)."""
    ratio = min(abs(V) / V_pl, 1.0)
    return 0.0 if ratio <= 0.5 else (2.0 * ratio - 1.0) ** 2


@pytest.mark.parametrize("method", ["plastic", "elastic"])
def test_the_pinned_end_of_the_stub_column_fails_by_the_reduced_axial_resistance(method):
    """At the pinned end (M = 0, V/V_pl,Rd ≈ 0.9) the cross-section utilisation is N/((A − ρA_v)·f_y/γ_M0),
    1.133 in the plastic check: the member fails where it read 0.916 before."""
    result = engine.solve(engine.Case.from_dict(STUB | {"check": {"method": method}}))
    s, fy = result.section, result.material.fy
    assert result.x[0] == 0.0 and result.moment[0] == 0.0
    rho = _rho(result.shear[0], s.A_v * fy / math.sqrt(3.0))
    assert rho > 0.5
    expected = result.axial_force / ((s.A - rho * s.A_v) * fy)
    assert result.check.axial_bending[0] == pytest.approx(expected, rel=1e-12)
    assert result.utilization >= expected > 1.0
    if method == "plastic":
        assert expected == pytest.approx(1.133, abs=5e-4)  # the independent check's value


@pytest.mark.parametrize("factor", [0.2, 0.45])
def test_below_half_the_shear_resistance_the_axial_resistance_is_the_full_one(factor):
    """V ≤ 0.5·V_pl,Rd everywhere (a lighter point load): ρ = 0, and N/N_pl,Rd at the pinned end."""
    data = STUB | {"loads": [{"type": "point", "P": factor * 421e3, "x": 0.005}], "axial_force": 1500e3}
    result = engine.solve(engine.Case.from_dict(data))
    s, fy = result.section, result.material.fy
    assert abs(result.shear).max() <= 0.5 * s.A_v * fy / math.sqrt(3.0)
    assert result.check.axial_bending[0] == pytest.approx(1500e3 / (s.A * fy), rel=1e-12)


def test_two_planes_take_each_plane_s_shear_area_off_the_axial_resistance():
    """A second plane with its own heavy point load at the same place: at x = 0 (no moment) the utilisation
    is N/((A − ρ_z·A_v,z − ρ_y·A_v,y)·f_y), each ρ from that plane's shear and shear area."""
    data = dict(STUB)
    data.pop("out_of_plane")
    data["axial_force"] = 1500e3
    data["second_plane"] = {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "point", "P": 1050e3, "x": 0.005}],
    }
    result = engine.solve(engine.Case.from_dict(data))
    two = result.second_plane
    fy = result.material.fy
    A_vz, A_vy = result.section.A_v, two.section.A_v
    rho_z = _rho(result.shear[0], A_vz * fy / math.sqrt(3.0))
    rho_y = _rho(two.shear[0], A_vy * fy / math.sqrt(3.0))
    assert rho_z > 0.0 and rho_y > 0.0
    assert result.check.at[0] == 0.0
    expected = 1500e3 / ((result.section.A - rho_z * A_vz - rho_y * A_vy) * fy)
    assert result.check.axial_bending[0] == pytest.approx(expected, rel=1e-12)


def test_the_equivalent_member_cross_section_term_takes_the_reduced_axial_resistance():
    """The en-member route's cross-section term: N·γ_M0/((A − ρA_v)·f_y) + (M_y/M_y,Rk)·γ_M0/(1 − ρ), with
    its largest first-order shear and moment (the route's own combination, on the safe side)."""
    result = engine.solve(engine.Case.from_dict(STUB))
    route = next(r for r in result.routes if r.route == "en-member")
    s, fy = result.section, result.material.fy
    f = route.facts
    V = 421e3 * (1.0 - 0.005)  # the first-order reaction at the near end (statics)
    rho = _rho(V, s.A_v * fy / math.sqrt(3.0))
    assert f["rho_shear"] == pytest.approx(rho, rel=1e-9)
    expected = 2495e3 / ((s.A - rho * s.A_v) * fy) + f["M_y_Ed"] / f["M_y_Rk"] / (1.0 - rho)
    assert route.terms["cross-section"] == pytest.approx(expected, rel=1e-9)
