"""The member check along the member: each criterion against its formula, by hand."""

import math

import numpy as np
import pytest

import engine

BASE = {
    "schema": 1,
    "length": 4.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 3.0e5,
    "section": {"name": "HEB 200"},
    "material": {"name": "S355"},
    "loads": [{"type": "uniform", "q": 1.5e4}],
    "imperfection": {"shape": "sine", "amplitude": 0.01},
    # these tests check the in-plane criteria: out-of-plane buckling (test_out_of_plane.py) is braced here
    "out_of_plane": {"restrained": True},
}


def _solve(**changes):
    return engine.solve(engine.Case.from_dict(dict(BASE, **changes)))


def test_elastic_check_is_n_over_a_plus_m_over_w():
    """σ = N/A + |M|/W_el against f_y/γ_M0 at every station (EN 1993-1-1 §6.2.1, linear form, from memory)."""
    r = _solve(check={"gamma_M0": 1.1})
    s, fy = r.section, r.material.fy
    expected = (3.0e5 / s.A + np.abs(r.moment) / s.W_el) / (fy / 1.1)
    np.testing.assert_allclose(r.check.axial_bending, expected, rtol=1e-12)
    assert r.check.strength_utilization == pytest.approx(max(expected.max(), r.check.shear.max()), rel=1e-12)


def test_plastic_check_for_an_i_section():
    """Major axis, n = N/N_pl: M_N = M_pl (1 − n)/(1 − 0.5a) ≤ M_pl (EN 1993-1-1 §6.2.9.1(5), from memory)."""
    r = _solve(check={"method": "plastic"})
    s, fy = r.section, r.material.fy
    n = 3.0e5 / (s.A * fy)
    a = min((s.A - 2 * s.width * s.dimensions["tf"]) / s.A, 0.5)
    M_N = s.W_pl * fy * min(1.0, (1 - n) / (1 - 0.5 * a))
    V_pl = s.A_v * fy / math.sqrt(3)
    rho = np.where(np.abs(r.shear) > 0.5 * V_pl, (2 * np.abs(r.shear) / V_pl - 1) ** 2, 0.0)
    expected = np.maximum(n, np.abs(r.moment) / (M_N * (1 - rho)))
    np.testing.assert_allclose(r.check.axial_bending, expected, rtol=1e-9)
    assert r.check.strength_kind in ("plastic N–M", "shear")


def test_shear_check():
    """|V| / (A_v f_y / √3) at every station (EN 1993-1-1 §6.2.6 eq. 6.18, from memory)."""
    r = _solve()
    expected = np.abs(r.shear) / (r.section.A_v * r.material.fy / math.sqrt(3))
    np.testing.assert_allclose(r.check.shear, expected, rtol=1e-12)


def test_deflection_check_against_span_over_n():
    """max|w| / (L/n) of the loads as given without the bow: span/250 by default (common practice, no
    source), and as set."""
    no_bow = _solve(imperfection={"shape": "none"})
    r = _solve()
    assert r.check.deflection_utilization == pytest.approx(
        np.abs(no_bow.deflection).max() / (4.0 / 250), rel=1e-12
    )
    assert r.service.utilization == r.check.deflection_utilization
    r = _solve(check={"deflection_limit": 500})
    assert r.check.deflection_utilization == pytest.approx(
        np.abs(no_bow.deflection).max() / (4.0 / 500), rel=1e-12
    )


def test_governing_value_position_and_kind():
    """result.utilization is the strength utilisation, with its kind and x on a station; deflection apart."""
    r = _solve(check={"deflection_limit": 10000, "ltb": {"restrained": True}})
    c = r.check
    assert c.deflection_utilization > c.strength_utilization
    assert r.utilization == c.strength_utilization
    assert c.x in r.x
    assert c.kind in ("elastic stress", "shear")


def test_plastic_check_falls_back_for_timber():
    """The plastic N–M rules are for steel sections: a timber case is checked elastically and says so."""
    r = engine.solve(
        engine.Case.from_dict(
            {
                "schema": 1,
                "length": 3.0,
                "supports": {"left": "pinned", "right": "pinned"},
                "axial_force": 2e4,
                "section": {"name": "TIMBER 45x195"},
                "material": {"name": "C24"},
                "check": {"method": "plastic"},
                "loads": [{"type": "uniform", "q": 1e3}],
                "imperfection": {"shape": "sine", "amplitude": 0.01},
            }
        )
    )
    # In plane: the elastic stress check. The member as a whole is beyond its Euler load about the minor
    # axis (20 kN > 17.9 kN), which now governs as a bound (tests/engine/test_out_of_plane_bound.py).
    assert r.check.in_plane_kind == "elastic stress"
    assert r.check.strength_kind == "out-of-plane elastic buckling" and r.utilization > 1
    assert any("elastic check is used instead" in note for note in r.check.notes)


def test_no_check_without_a_section():
    """A case given only EI has no member check: utilization and check are None."""
    r = engine.solve(
        engine.Case.from_dict(
            {"schema": 1, "length": 3.0, "EI": 1e6, "supports": {"left": "pinned", "right": "pinned"}}
        )
    )
    assert r.check is None and r.utilization is None
