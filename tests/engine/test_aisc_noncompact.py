"""M_n of a section with a noncompact element on the aisc route, by its chapter F clause (AISC 360-16, every
equation from memory): §F3.2 eq. (F3-1) for an I flange about the major axis, §F6.2 eq. (F6-2) about the
minor, §F7.2 eq. (F7-2) and §F7.3 eq. (F7-6) for a rectangular HSS flange and web, §F8.2 eq. (F8-2) for a
round HSS; a noncompact I web keeps 0.7·F_y·S (§F4 is not made: the lowest value it reaches). The route had
0.7·F_y·S for every noncompact element, on the safe side but 35 % below the Manual for a W14x90 about its
major axis and half of eq. (F6-2)'s value about its minor.

Check value: AISC Steel Construction Manual (15th ed.) Table 3-2, W14x90 (F_y = 50 ksi): φ_b·M_px = 574
kip·ft, reduced from φ_b·F_y·Z_x = 589 kip·ft by flange local buckling (from memory). Members are invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.aisc_member import flexure_class

KSI = 1000.0 * 4.4482216152605 / 0.0254**2
KIP_FT = 4448.2216152605 * 0.3048


def _route(section: dict, material: str, axis: str = "major"):
    data = {
        "schema": 1,
        "title": "Invented member bent by end couples",
        "length": 3.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": [{"type": "couple", "C": 1e4, "x": 0.0}, {"type": "couple", "C": -1e4, "x": 3.0}],
        "section": section,
        "material": {"name": material},
        "axis": axis,
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["aisc"], "ltb": {"restrained": True}},
    }
    result = engine.solve(engine.Case.from_dict(data))
    route = next(r for r in result.routes if r.route == "aisc")
    kind, parts = flexure_class(result.section, result.material.E, result.material.fy)
    return result, route, kind, {p[0]: p[1:] for p in parts}


def test_w14x90_major_axis_matches_the_manual():
    result, route, kind, parts = _route({"name": "W14x90"}, "ASTM A992")
    assert kind == "noncompact"
    s, Fy = result.section, result.material.fy
    lam, lp, lr = parts["flange"]
    M_p = min(Fy * s.W_pl, 1.6 * Fy * s.W_el)
    expected = M_p - (M_p - 0.7 * Fy * s.W_el) * (lam - lp) / (lr - lp)  # eq. (F3-1)
    assert route.facts["M_n_y"] == pytest.approx(expected, rel=1e-12)
    assert 0.9 * route.facts["M_n_y"] / KIP_FT == pytest.approx(574.0, rel=0.01)  # Manual Table 3-2


def test_w14x90_minor_axis_takes_eq_f6_2():
    result, route, kind, parts = _route({"name": "W14x90"}, "ASTM A992", axis="minor")
    assert kind == "noncompact"
    s, Fy = result.section, result.material.fy
    lam, lp, lr = parts["flange"]
    M_p = min(Fy * s.W_pl, 1.6 * Fy * s.W_el)
    expected = M_p - (M_p - 0.7 * Fy * s.W_el) * (lam - lp) / (lr - lp)
    M_n = route.facts["M_n_z"]  # the plane analysed bends about the minor axis (z)
    assert M_n == pytest.approx(expected, rel=1e-12)
    assert M_n > 1.35 * 0.7 * Fy * s.W_el  # it was 0.7·F_y·S


@pytest.mark.parametrize(("h", "b"), [(0.2, 0.2), (0.3, 0.15)])
def test_a_rectangular_hss_with_a_noncompact_flange_takes_eq_f7_2(h, b):
    t = b / 33.0  # (b − 3t)/t = 30: between 1.12√(E/F_y) = 26.97 and 1.40√(E/F_y) = 33.7 at 50 ksi
    section = {"shape": "rhs", "h": h, "b": b, "t": t, "manufacture": "hot-finished"}
    result, route, kind, parts = _route(section, "ASTM A992")
    s, Fy, E = result.section, result.material.fy, result.material.E
    M_p = min(Fy * s.W_pl, 1.6 * Fy * s.W_el)
    ratio = parts["flange"][0]
    expected = min(M_p, M_p - (M_p - Fy * s.W_el) * (3.57 * ratio * math.sqrt(Fy / E) - 4.0))
    web_ratio, web_lp, _ = parts["web"]
    if web_ratio > web_lp:
        expected = min(expected, M_p - (M_p - Fy * s.W_el) * (0.305 * web_ratio * math.sqrt(Fy / E) - 0.738))
    assert kind == "noncompact"
    assert route.facts["M_n_y"] == pytest.approx(expected, rel=1e-12)
    assert Fy * s.W_el < route.facts["M_n_y"] < M_p


def test_a_round_hss_with_a_noncompact_wall_takes_eq_f8_2():
    D = 0.5
    t = D / 100.0  # D/t = 100: between 0.07E/F_y = 40.6 and 0.31E/F_y = 180 at 50 ksi
    result, route, kind, _ = _route({"shape": "chs", "D": D, "t": t}, "ASTM A992")
    s, Fy, E = result.section, result.material.fy, result.material.E
    assert kind == "noncompact"
    assert route.facts["M_n_y"] == pytest.approx((0.021 * E / 100.0 + Fy) * s.W_el, rel=1e-12)


def test_a_noncompact_i_web_keeps_the_lower_bound():
    """h/t_w = 110, between 3.76√(E/F_y) = 90.6 and 5.70√(E/F_y) = 137 at 50 ksi: §F4 is not made, so
    0.7·F_y·S."""
    tw = 0.008
    section = {"shape": "welded_i", "h": 110 * tw + 0.04, "b": 0.3, "tw": tw, "tf": 0.02}
    result, route, kind, parts = _route(section, "ASTM A992")
    assert kind == "noncompact"
    assert parts["web"][0] > parts["web"][1]
    assert route.facts["M_n_y"] == pytest.approx(0.7 * result.material.fy * result.section.W_el, rel=1e-12)
