"""Lateral-torsional buckling of a solid rectangle bent about its stronger axis (a flat bar, a joist).

The check treated every solid rectangle as unable to buckle laterally ("a closed or solid section"), so a
steel flat bar 200 × 20 mm over 4 m under 3 kN/m read utilisation 0.130, where its lateral-torsional
buckling check gives 0.328 (and at 10 kN/m 0.43 against 1.09: it passed while failing). A deep narrow
rectangle does buckle laterally: Timoshenko & Gere (1961) §6.2, the narrow rectangular beam in pure
bending, M_cr = (π/L)·√(EI_z·GI_t), with I_t by Saint-Venant's series (Timoshenko & Goodier, Theory of
Elasticity, §109; from memory). χ_LT is EN 1993-1-1 §6.3.2.2 eq. (6.56) with curve d ("other
cross-sections", Table 6.4; from memory), written out here. A square bar, or a rectangle bent about its
weaker axis, is not checked (no lateral buckling). Members are invented.
"""

from __future__ import annotations

import math

import pytest

import engine

L = 4.0
B, H = 0.02, 0.2  # the flat bar's width and depth [m]


def flat_bar(**changes) -> engine.Case:
    """An invented pinned steel flat bar 200 × 20 mm, S355, bent about its stronger axis."""
    data = {
        "schema": 1,
        "title": "Invented flat bar",
        "length": L,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": [{"type": "uniform", "q": 3e3}],
        "section": {"shape": "rectangle", "h": H, "b": B},
        "material": {"name": "S355"},
        "axis": "major",
    }
    data.update(changes)
    return engine.Case.from_dict(data)


def saint_venant(b: float, h: float) -> float:
    """I_t of a solid b × h rectangle (b <= h) by Saint-Venant's series (Timoshenko & Goodier §109)."""
    series = sum(math.tanh(n * math.pi * h / (2 * b)) / n**5 for n in range(1, 80, 2))
    return h * b**3 / 3 * (1 - 192 / math.pi**5 * (b / h) * series)


def chi_lt_curve_d(lam: float) -> float:
    """EN 1993-1-1 eq. (6.56), general case, curve d (α_LT = 0.76), written out here."""
    phi = 0.5 * (1 + 0.76 * (lam - 0.2) + lam * lam)
    return min(1.0, 1 / (phi + math.sqrt(phi * phi - lam * lam)))


def test_uniform_moment_at_the_shear_centre_matches_the_narrow_beam_formula():
    """End couples of 5 kN·m, loads at the shear centre, forks: M_cr = (π/L)√(EI_z GI_t) to 1e-6."""
    case = flat_bar(
        loads=[{"type": "couple", "C": 5e3, "x": 0.0}, {"type": "couple", "C": -5e3, "x": L}],
        check={"ltb": {"load_position": "shear-centre"}},
    )
    r = engine.solve(case)
    E, G = r.material.E, r.material.G
    expected = math.pi / L * math.sqrt(E * (H * B**3 / 12) * G * saint_venant(B, H))
    assert r.ltb.applies
    assert r.ltb.M_cr == pytest.approx(expected, rel=1e-6)
    assert r.ltb.M_cr == pytest.approx(26.44e3, rel=1e-3)


def test_the_flat_bar_under_a_uniform_load_is_checked_and_the_headline_counts_it():
    """3 kN/m on top (destabilising): M_cr ≈ 28.9 kN·m (C1 = 1.127, C2 = 0.454 give the same to 1 %), λ̄_LT by
    W_pl (class 1), χ_LT of curve d, M_b,Rd = χ_LT·W_pl·f_y; the headline is at least M_Ed/M_b,Rd (0.328,
    it read 0.130)."""
    r = engine.solve(flat_bar())
    ltb = r.ltb
    assert ltb.applies and ltb.curve == "d"
    E, G = r.material.E, r.material.G
    EIz, GIt = E * H * B**3 / 12, G * saint_venant(B, H)
    c1, c2, zg = 1.127, 0.454, H / 2  # SN003 / ECCS for a uniform load, from memory
    euler = math.pi**2 * EIz / L**2
    three_factor = c1 * euler * (math.sqrt((c2 * zg) ** 2 + GIt * L**2 / (math.pi**2 * EIz)) - c2 * zg)
    assert ltb.M_cr == pytest.approx(three_factor, rel=1e-2)
    W_pl, fy = B * H**2 / 4, r.material.fy
    lam = math.sqrt(W_pl * fy / ltb.M_cr)
    assert ltb.lambda_LT == pytest.approx(lam, rel=1e-12)
    assert ltb.chi_LT == pytest.approx(chi_lt_curve_d(lam), rel=1e-12)
    assert ltb.M_b_Rd == pytest.approx(chi_lt_curve_d(lam) * W_pl * fy, rel=1e-12)
    M_Ed = 3e3 * L**2 / 8
    assert ltb.utilisation == pytest.approx(M_Ed / ltb.M_b_Rd, rel=1e-9)
    assert r.utilization >= M_Ed / ltb.M_b_Rd * (1 - 1e-12)
    assert r.utilization == pytest.approx(0.328, abs=2e-3)
    assert "lateral-torsional-buckling" not in [c.code for c in r.cautions]  # the check replaces the warning


def test_a_heavier_load_now_fails_where_it_passed():
    """10 kN/m: the cross-section alone is 0.43; lateral-torsional buckling takes it above 1."""
    r = engine.solve(flat_bar(loads=[{"type": "uniform", "q": 10e3}]))
    assert r.check.in_plane_utilization < 0.5
    assert r.utilization > 1.0


@pytest.mark.parametrize(
    ("section", "axis"),
    [
        ({"shape": "rectangle", "h": 0.05, "b": 0.05}, "major"),
        ({"shape": "rectangle", "h": H, "b": B}, "minor"),
    ],
    ids=["square", "bent-about-the-weaker-axis"],
)
def test_no_lateral_buckling_where_the_section_is_no_stronger_in_the_plane_of_bending(section, axis):
    r = engine.solve(flat_bar(section=section, axis=axis, loads=[{"type": "uniform", "q": 0.5e3}]))
    assert not r.ltb.applies


def test_a_timber_joist_is_warned_that_lateral_torsional_buckling_is_not_checked():
    """The check is for steel; a timber rectangle deeper than wide gets the warning (it had none)."""
    case = flat_bar(
        section={"name": "TIMBER 45x195"}, material={"name": "C24"}, loads=[{"type": "uniform", "q": 1e3}]
    )
    warning = [c for c in engine.solve(case).cautions if c.code == "lateral-torsional-buckling"]
    assert warning and warning[0].level == "warning" and "deeper than wide" in warning[0].message


def test_a_timber_joist_counts_m_over_m_cr_as_a_bound():
    """The check is for steel, but the exact M_cr (Vlasov, G of C24 690 MPa, EN 338 from memory) bounds any
    code's resistance (EN 1995-1-1 §6.3.3: k_crit·f_m·W <= M_cr, since k_crit <= 1/λ_rel,m²; from memory).
    An invented joist 45 × 220 mm, 6 m, 0.8 kN/m on top, no axial force: M_cr ≈ 4.4 kN·m by the
    three-factor formula (C1 = 1.127, C2 = 0.454; SN003, from memory), M_Ed = 3.6 kN·m, so M/M_cr ≈ 0.82
    governs over the stress (about 0.41)."""
    b, h, length = 0.045, 0.22, 6.0
    case = flat_bar(
        length=length,
        section={"name": "TIMBER 45x220"},
        material={"name": "C24"},
        loads=[{"type": "uniform", "q": 0.8e3}],
    )
    r = engine.solve(case)
    assert not r.ltb.applies and r.ltb.reason == "material-timber"
    E, G = 7_400e6, 690e6 * 7_400 / 11_000  # E_0,05 and G_0,05 = G_mean E_0,05/E_mean (EN 338, from memory)
    EIz, GIt = E * h * b**3 / 12, G * saint_venant(b, h)
    c1, c2, zg = 1.127, 0.454, h / 2
    euler = math.pi**2 * EIz / length**2
    three_factor = c1 * euler * (math.sqrt((c2 * zg) ** 2 + GIt * length**2 / (math.pi**2 * EIz)) - c2 * zg)
    assert r.ltb.M_cr == pytest.approx(three_factor, rel=1e-2)
    M_Ed = 0.8e3 * length**2 / 8
    second = next(route for route in r.routes if route.route == "second-order")
    assert second.terms["lateral-torsional-elastic"] == pytest.approx(M_Ed / r.ltb.M_cr, rel=1e-9)
    assert second.governing == "lateral-torsional-elastic"
    assert r.utilization == pytest.approx(M_Ed / r.ltb.M_cr, rel=1e-9)
    assert r.check.in_plane_utilization < 0.5 < r.utilization
    warning = next(c for c in r.cautions if c.code == "lateral-torsional-buckling")
    assert "M_y,II/M_cr" in warning.message and warning.level == "warning"
