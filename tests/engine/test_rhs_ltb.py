"""A rectangular hollow section bent about its stronger axis is checked for lateral-torsional buckling.

EN 1993-1-1 §6.3.2.1(2) (from memory) spares square and circular hollow sections; an RHS deeper than wide is
not spared, and Table 6.4 gives it curve d ("other cross-sections", from memory). It used to get χ_LT = 1: an
independent audit found an RHS 300×100×10 over 10 m passing at 0.952 where its check gives 1.216.

The reference: a beam on forks under equal and opposite end couples (uniform moment), I_w = 0 (neglected for
a closed section, as the engine does), M_cr = (π/L)·√(E I_z · G I_t) (Timoshenko & Gere 1961 §6.2, from
memory); χ_LT by eq. (6.56) with α_LT = 0.76 written out here; M_b,Rd = χ_LT W_pl,y f_y/γ_M1 for a class 1
section. I_t is the section's own (tests/engine/test_torsion.py checks it against EN 10210-2). Invented beam.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.sections import section_from_spec

RHS = {"shape": "rhs", "h": 0.3, "b": 0.1, "t": 0.010, "manufacture": "hot-finished"}


def _beam(section: dict, moment: float) -> dict:
    return {
        "schema": 1,
        "length": 10.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": [{"type": "couple", "C": moment, "x": 0.0}, {"type": "couple", "C": -moment, "x": 10.0}],
        "imperfection": {"shape": "none", "amplitude": 0.0},
        "section": section,
        "material": {"name": "S355"},
        "check": {"method": "plastic", "routes": ["second-order", "en-member"]},
    }


def _chi_lt_d(lam: float) -> float:
    """EN 1993-1-1 eq. (6.56), curve d: α_LT = 0.76, λ̄_LT,0 = 0.2 (from memory)."""
    phi = 0.5 * (1.0 + 0.76 * (lam - 0.2) + lam**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))


def test_a_deep_rhs_under_uniform_moment_is_checked_with_curve_d():
    moment = 150e3
    result = engine.solve(engine.Case.from_dict(_beam(RHS, moment)))
    ltb = result.ltb
    assert ltb.applies and ltb.curve == "d"
    y, z = section_from_spec(RHS, "major"), section_from_spec(RHS, "minor")
    E, G, fy = result.material.E, result.material.G, result.material.fy
    m_cr = math.pi / 10.0 * math.sqrt(E * z.I * G * y.torsion.I_t)
    assert ltb.M_cr == pytest.approx(m_cr, rel=1e-4)
    assert result.check.section_class.klass == 1
    chi = _chi_lt_d(math.sqrt(y.W_pl * fy / m_cr))
    assert chi < 0.95  # the check matters here
    expected = moment / (chi * y.W_pl * fy)
    assert ltb.utilisation == pytest.approx(expected, rel=1e-4)
    assert result.utilization >= ltb.utilisation  # the headline counts it
    assert "lateral-torsional-buckling" not in {c.code for c in result.cautions}  # the check replaces it


def test_a_square_hollow_section_is_not_checked():
    square = dict(RHS, b=0.3)
    result = engine.solve(engine.Case.from_dict(_beam(square, 150e3)))
    assert not result.ltb.applies and result.ltb.reason == "closed-or-solid"


def test_an_aluminium_rhs_keeps_the_warning_that_it_is_not_checked():
    data = _beam(RHS, 50e3)
    data["material"] = {"name": "EN AW-6082 T6"}
    result = engine.solve(engine.Case.from_dict(data))
    warning = next(c for c in result.cautions if c.code == "lateral-torsional-buckling")
    assert "rectangular hollow section" in warning.message


def test_a_section_turned_so_that_minor_is_its_stronger_axis_gets_a_danger_caution():
    """An RHS given as 100×300 and bent about "minor" is bent about its stronger axis: the lateral-torsional
    check runs for the plane called major only, so a danger caution says it is not made there (a self-audit:
    0.635 where the member given upright reads 0.827), in one plane and as a second plane; a flat bar too."""
    turned = {"shape": "rhs", "h": 0.1, "b": 0.3, "t": 0.010, "manufacture": "hot-finished"}
    data = dict(_beam(turned, 150e3), axis="minor")
    one = engine.solve(engine.Case.from_dict(data))
    assert "stronger-axis-named-minor" in {c.code for c in one.cautions if c.level == "danger"}
    two = dict(_beam(turned, 20e3), axis="major")
    two["second_plane"] = {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "uniform", "q": 5e3}],
    }
    both = engine.solve(engine.Case.from_dict(two))
    assert "stronger-axis-named-minor" in {c.code for c in both.cautions if c.level == "danger"}
    bar = dict(_beam({"shape": "rectangle", "b": 0.2, "h": 0.02}, 5e3), axis="minor")
    assert "stronger-axis-named-minor" in {c.code for c in engine.solve(engine.Case.from_dict(bar)).cautions}
    upright = engine.solve(engine.Case.from_dict(_beam(RHS, 150e3)))
    assert "stronger-axis-named-minor" not in {c.code for c in upright.cautions}
