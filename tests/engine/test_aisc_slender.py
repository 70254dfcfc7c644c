"""AISC 360-16 §E7: members with slender elements in compression (P_n = F_cr A_e, effective widths).

Sources beside each check: AISC 360-16 eqs. (E7-1)–(E7-7), Table E7.1 and Table B4.1a (all from memory), the
W16x26 dimensions of the AISC Manual (from memory: d = 15.7 in, b_f = 5.50 in, t_f = 0.345 in, t_w = 0.250 in,
the catalogue's k_des), and hand arithmetic written out in the tests. The members are invented.
"""

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

import engine
from engine.design import aisc360
from engine.design.aisc_member import compression_elements, effective_area
from engine.materials import material_from_spec
from engine.sections import section_from_spec


@pytest.mark.parametrize("kind", sorted(aisc360.E7_FACTORS))
def test_table_e7_1_factors_meet_at_the_limit(kind):
    """Table E7.1's c2 is (1 − √(1 − 4c1))/(2c1) to its printed two decimals, which is what makes eq. (E7-3)
    give b_e = b at the limit λ = λ_r √(F_y/F_cr) of eq. (E7-2) (algebra: with √(F_el/F_cr) = c2 there,
    (1 − c1 c2) c2 = 1)."""
    c1, c2 = aisc360.E7_FACTORS[kind]
    assert c2 == pytest.approx((1 - math.sqrt(1 - 4 * c1)) / (2 * c1), abs=0.005)
    assert (1 - c1 * c2) * c2 == pytest.approx(1.0, abs=0.002)


@given(
    ratio=st.floats(5.0, 300.0),
    limit=st.floats(10.0, 60.0),
    stress=st.floats(0.05, 1.0),
    kind=st.sampled_from(sorted(aisc360.E7_FACTORS)),
)
def test_effective_width_is_never_wider_and_falls_with_slenderness(ratio, limit, stress, kind):
    """Invariants of eq. (E7-3) (common practice, no source): 0 < b_e ≤ b, and b_e does not grow as the
    element gets more slender (λ up) or as the member's critical stress rises."""
    Fy = 345e6
    Fcr = stress * Fy
    b = 0.1
    be = aisc360.effective_width(b, ratio, limit, kind, Fy, Fcr)
    assert 0.0 < be <= b
    assert aisc360.effective_width(b, ratio * 1.1, limit, kind, Fy, Fcr) <= be * (1 + 1e-12)
    assert aisc360.effective_width(b, ratio, limit, kind, Fy, min(Fy, Fcr * 1.1)) <= be * (1 + 1e-12)


def test_w16x26_web_by_hand():
    """W16x26 in A992 (F_y = 345 MPa): web h/t_w > 1.49√(E/F_y) = 35.9, slender; flange b_f/2t_f = 7.97 <
    0.56√(E/F_y) = 13.5. Under F_cr = F_y (a short member): F_el = (1.31 λ_r/λ)² F_y, b_e = h(1 −
    0.18√(F_el/F_cr))√(F_el/F_cr), A_e = A_g − (h − b_e)t_w (eqs. (E7-3), (E7-5), hand arithmetic)."""
    section = section_from_spec({"name": "W16x26"}, "major")
    Fy, E = 345e6, 200e9
    elements = dict((name, (ratio, limit)) for name, ratio, limit in compression_elements(section, E, Fy))
    ratio, limit = elements["web"]
    assert limit == pytest.approx(1.49 * math.sqrt(E / Fy), rel=1e-12) and ratio > limit
    assert elements["flange"][0] < elements["flange"][1]
    tw = section.dimensions["tw"]
    h = ratio * tw
    root = 1.31 * limit / ratio  # √(F_el/F_cr) with F_cr = F_y
    be = h * (1 - 0.18 * root) * root
    assert effective_area(section, E, Fy, Fy) == pytest.approx(section.A - (h - be) * tw, rel=1e-12)
    assert 0.8 < effective_area(section, E, Fy, Fy) / section.A < 0.9


def test_round_hss_effective_area():
    """Eq. (E7-7) (from memory): A_e = (0.038E/(F_y D/t) + 2/3) A_g for 0.11E/F_y < D/t < 0.45E/F_y; A_g
    below; beyond, §E7 does not apply (the route is then not applied)."""
    E, Fy, A = 200e9, 345e6, 1e-3
    assert aisc360.round_hss_area(A, 50.0, E, Fy) == A  # 50 < 0.11E/F_y = 63.8
    assert aisc360.round_hss_area(A, 100.0, E, Fy) == pytest.approx((0.038 * E / (Fy * 100.0) + 2 / 3) * A)
    assert math.isnan(aisc360.round_hss_area(A, 300.0, E, Fy))  # > 0.45E/F_y = 261
    # continuous at 0.11E/F_y: 0.038/0.11 + 2/3 = 1.0121, a 1 % step up that the Specification has
    assert (0.038 / 0.11 + 2 / 3) == pytest.approx(1.0121, abs=1e-4)


def _w_column(N, name="W16x26", length=4.0):
    return engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented W-shape beam-column",
            "length": length,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [{"type": "uniform", "q": 5e3}],
            "imperfection": {"preset": "en1993-table-5.1"},
            "section": {"name": name},
            "material": {"name": "A992"},
            "check": {"routes": ["aisc"]},
            "out_of_plane": {"restrained": True},
        }
    )


@pytest.mark.parametrize("N", [100e3, 300e3, 600e3])
def test_the_aisc_route_takes_p_n_on_the_effective_area(N):
    """The route's P_n is F_cr A_e with F_cr of eqs. (E3-2)/(E3-3) from F_e = N_cr/A_g (the engine's exact
    critical load) and A_e of §E7 under that F_cr; it is below F_cr A_g. Before, the route was not applied."""
    r = engine.solve(_w_column(N))
    aisc = next(route for route in r.routes if route.route == "aisc")
    section = section_from_spec({"name": "W16x26"}, "major")
    steel = material_from_spec({"name": "A992"}, section.t_max)
    Fe = float(r.critical_loads[0]) / section.A
    ratio = steel.fy / Fe
    Fcr = 0.658**ratio * steel.fy if ratio <= 2.25 else 0.877 * Fe
    A_e = effective_area(section, steel.E, steel.fy, Fcr)
    assert aisc.facts["P_n"] == pytest.approx(Fcr * A_e, rel=1e-9)
    assert aisc.facts["P_n"] < Fcr * section.A
    assert "aisc-slender-e7" in aisc.notes


def test_a_round_hss_beyond_e7_is_not_applied():
    """A CHS 500 × 1.5 (D/t = 333 > 0.45E/F_y = 266 for S355): beyond §E7's range, the route says so."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented thin tube",
            "length": 3.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 50e3,
            "loads": [],
            "imperfection": {"preset": "en1993-table-5.1"},
            "section": {"shape": "chs", "D": 0.5, "t": 0.0015},
            "material": {"name": "S355"},
            "check": {"routes": ["second-order", "aisc"]},
        }
    )
    aisc = next(route for route in engine.solve(case).routes if route.route == "aisc")
    assert aisc.utilization is None and aisc.reason == "slender-element-compression"
