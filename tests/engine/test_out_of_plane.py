"""Out-of-plane flexural buckling, EN 1993-1-1:2005 §6.3.1 eqs. (6.46)–(6.49) (issue 12, item 7)."""

import dataclasses
import json
import math
from importlib.resources import files

import pytest

import engine
from engine import codes
from engine.errors import CaseError


def _demo(**changes):
    data = json.loads(files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8"))
    data.update(changes)
    return engine.Case.from_dict(data)


def _chi(lam, alpha):
    """χ of EN 1993-1-1 eq. (6.49) written out here, independent of engine.codes [text]."""
    phi = 0.5 * (1 + alpha * (lam - 0.2) + lam * lam)
    return min(1.0, 1 / (phi + math.sqrt(phi * phi - lam * lam)))


def test_demo_regression():
    """Issue 12: the demo (HEB 200 major axis, S355, 6 m, 350 kN) has λ̄_z = 1.55, χ_z = 0.299 (curve c,
    eq. 6.49) and N/N_b,z,Rd = 0.42, above its in-plane strength utilisation; N_cr,z = π²EI_z/L² = 1153 kN."""
    r = engine.solve(_demo())
    oop = r.check.out_of_plane
    assert oop.checked and oop.axis == "minor" and oop.curve == "c"
    minor = engine.sections.section_from_spec({"name": "HEB 200"}, "minor")
    n_cr = math.pi**2 * r.material.E * minor.I / 6.0**2  # Euler (Timoshenko & Gere 1961, ch. 2)
    assert oop.N_cr == pytest.approx(n_cr, rel=1e-12)
    assert oop.N_cr == pytest.approx(1153e3, rel=1e-3)
    lam = math.sqrt(minor.A * r.material.fy / n_cr)
    assert oop.lambda_bar == pytest.approx(1.55, abs=5e-3)
    assert oop.chi == pytest.approx(_chi(lam, 0.49), rel=1e-12)
    assert oop.chi == pytest.approx(0.299, abs=5e-4)
    assert oop.utilization == pytest.approx(350e3 / (oop.chi * minor.A * r.material.fy), rel=1e-12)
    assert oop.utilization == pytest.approx(0.42, abs=5e-3)
    assert r.check.in_plane_utilization < oop.utilization
    assert r.check.strength_utilization == oop.utilization
    assert r.check.strength_kind == "out-of-plane buckling"
    assert r.utilization >= oop.utilization


def test_demo_at_1500_kn_gets_the_danger_caution():
    """Issue 12: at 1500 kN the demo's N/N_b,z,Rd = 1.81 > 1: a danger caution (EN 1993-1-1 eq. 6.46)."""
    r = engine.solve(_demo(axial_force=1500e3))
    danger = [c for c in r.cautions if c.level == "danger" and c.code == "out-of-plane-buckling"]
    assert len(danger) == 1 and "N/N_b,Rd" in danger[0].message
    assert r.check.out_of_plane.utilization > 1


def test_capacity_never_exceeds_the_out_of_plane_resistance():
    """The demo's strut without its wind load has capacity N_b,z,Rd = χ_z A f_y/γ_M1 (828 kN), below the
    minor-axis N_cr of 1153 kN, not the 1484 kN of the in-plane check alone; with γ_M1 = 1.1 it is divided by
    1.1 (EN 1993-1-1 eq. 6.47). The second-order route alone (issue 14). With the wind load, eq. (6.62) adds
    the in-plane moment's term (counted by the second-order route when the en-member route is not enabled),
    so the capacity is lower still, and the same as with the default routes, where eq. (6.62) governs too."""
    alone = {"method": "elastic", "routes": ["second-order"]}
    case = _demo(check=alone, loads=[])
    cap = engine.capacity(case)
    oop = engine.solve(case).check.out_of_plane
    assert cap.axial_force == pytest.approx(oop.N_b_Rd, rel=1e-12)
    assert cap.check == "out-of-plane buckling" and cap.route == "second-order"
    assert cap.axial_force < oop.N_cr
    factored = _demo(check=dict(alone, gamma_M1=1.1), loads=[])
    assert engine.capacity(factored).axial_force == pytest.approx(oop.N_b_Rd / 1.1, rel=1e-12)
    loaded = engine.capacity(_demo(check=alone))
    assert loaded.axial_force < 0.95 * oop.N_b_Rd and loaded.route == "second-order"
    default = engine.capacity(_demo(check={"method": "elastic"}))
    assert loaded.axial_force == pytest.approx(default.axial_force, rel=1e-9)
    braced = engine.capacity(_demo(out_of_plane={"restrained": True}, check=alone))
    assert braced.axial_force > cap.axial_force
    proportional = engine.capacity(case, mode="proportional")
    assert proportional.axial_force <= oop.N_b_Rd * (1 + 1e-12)
    default = engine.capacity(_demo())
    assert default.axial_force < cap.axial_force
    assert default.route == "en-member" and default.check == "eq-6.62"


def test_buckling_length_is_used():
    """A given out-of-plane buckling length L_cr sets N_cr = π²EI_z/L_cr² (Euler); half the length, four times
    N_cr."""
    full = engine.solve(_demo()).check.out_of_plane
    half = engine.solve(_demo(out_of_plane={"buckling_length": 3.0})).check.out_of_plane
    assert half.buckling_length == 3.0 and full.buckling_length == 6.0
    assert half.N_cr == pytest.approx(4 * full.N_cr, rel=1e-12)
    assert half.chi > full.chi


def test_restrained_member_is_not_checked_and_says_so():
    """{"restrained": true}: no out-of-plane check, and an info caution says it was taken as restrained."""
    r = engine.solve(_demo(out_of_plane={"restrained": True}))
    assert not r.check.out_of_plane.checked
    assert r.check.strength_kind != "out-of-plane buckling"
    notes = [c for c in r.cautions if c.code == "out-of-plane-not-checked"]
    assert notes and notes[0].level == "info" and "restrained" in notes[0].message


def test_minor_axis_bending_checks_the_major_axis():
    """Bending about the minor axis: the check is about the major axis, with its own Table 6.2 curve (b for a
    rolled H with h/b <= 1.2, t_f <= 100 mm, S355, y–y; from memory)."""
    r = engine.solve(_demo(axis="minor"))
    oop = r.check.out_of_plane
    assert oop.axis == "major" and oop.curve == "b"
    major = engine.sections.section_from_spec({"name": "HEB 200"}, "major")
    assert oop.N_cr == pytest.approx(math.pi**2 * r.material.E * major.I / 36.0, rel=1e-12)


def test_circular_section_is_the_same_about_both_axes():
    """A CHS pinned at both ends: out-of-plane N_cr equals the in-plane Pcr1 (same I about every axis)."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 4.0,
            "axial_force": 1e5,
            "supports": {"left": "pinned", "right": "pinned"},
            "section": {"name": "CHS 114.3x5"},
            "material": {"name": "S355"},
        }
    )
    r = engine.solve(case)
    assert r.check.out_of_plane.N_cr == pytest.approx(r.critical_loads[0], rel=1e-9)


def test_custom_section_cannot_be_checked_out_of_plane():
    """A custom section has properties about one axis only: a warning says the out-of-plane check is not
    made."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 4.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 1e5,
            "section": {"shape": "custom", "A": 5e-3, "I": 2e-5, "W_el": 2e-4, "W_pl": 2.3e-4},
            "material": {"name": "S355"},
        }
    )
    r = engine.solve(case)
    assert not r.check.out_of_plane.checked
    warning = [c for c in r.cautions if c.code == "out-of-plane-not-checked"]
    assert warning and warning[0].level == "warning" and "custom" in warning[0].message


def test_default_length_on_a_cantilever_warns():
    """A fixed–free member with the default L_cr = L gets a warning that L_cr may be up to 2L (Euler's
    cantilever, Timoshenko & Gere 1961 §2.1); with a given length there is none."""
    supports = {"left": "fixed", "right": "free"}
    r = engine.solve(_demo(supports=supports, axial_force=50e3, loads=[]))
    assert "out-of-plane-length" in [c.code for c in r.cautions if c.level == "warning"]
    given = engine.solve(
        _demo(supports=supports, axial_force=50e3, loads=[], out_of_plane={"buckling_length": 12.0})
    )
    assert "out-of-plane-length" not in [c.code for c in given.cautions]
    assert "out-of-plane-length" not in [c.code for c in engine.solve(_demo()).cautions]


def test_tension_has_no_out_of_plane_utilisation():
    """In tension N/N_b,Rd is 0 and no out-of-plane caution is given."""
    r = engine.solve(_demo(axial_force=-200e3))
    assert r.check.out_of_plane.utilization == 0.0
    assert not [c for c in r.cautions if c.code.startswith("out-of-plane")]


def test_chi_at_unit_slenderness_for_every_curve():
    """χ at λ̄ = 1 by eq. (6.49): 0.7253, 0.6656, 0.5970, 0.5399, 0.4671 for a0…d (EN 1993-1-1 Fig. 6.4
    read-offs, from memory; recomputed from the formula here)."""
    for curve, expected in zip(codes.BUCKLING_CURVES, (0.7253, 0.6656, 0.5970, 0.5399, 0.4671), strict=True):
        assert codes.reduction_factor(1.0, curve) == pytest.approx(expected, abs=5e-5)
        assert codes.reduction_factor(1.0, curve) == pytest.approx(
            _chi(1.0, codes.IMPERFECTION_FACTORS[curve]), rel=1e-14
        )


def test_case_key_round_trip_and_errors():
    """The out_of_plane key survives to_dict/from_dict; bad values name the field and the allowed range."""
    case = _demo(out_of_plane={"buckling_length": 3.0})
    assert engine.Case.from_dict(case.to_dict()) == case
    assert "out_of_plane" not in _demo().to_dict()
    for bad, field in (
        ({"buckling_length": 0}, "out_of_plane.buckling_length"),
        ({"restrained": "yes"}, "out_of_plane.restrained"),
        ({"length": 3}, "out_of_plane.length"),
        ({"restrained": True, "buckling_length": 2.0}, "out_of_plane.buckling_length"),
    ):
        with pytest.raises(CaseError, match=rf"^{field}"):
            _demo(out_of_plane=bad)
    replaced = dataclasses.replace(_demo(), out_of_plane={"restrained": True})
    assert replaced.out_of_plane.restrained


def test_a_custom_section_with_iz_is_checked_out_of_plane_with_curve_d():
    """A custom section that gives Iz (0 < Iz <= I) was left unchecked out of plane, with a warning. Now:
    N_cr = π²E·Iz/L² (Euler) and χ of curve d (EN 1993-1-1 Table 6.2's most unfavourable: any other curve
    gives a larger χ; eq. 6.49 written out here), N_b,Rd = χ·A·f_y/γ_M1."""
    data = {
        "schema": 1,
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 1e5,
        "section": {"shape": "custom", "A": 5e-3, "I": 2e-5, "W_el": 2e-4, "W_pl": 2.3e-4, "Iz": 1e-6},
        "material": {"name": "S355"},
    }
    r = engine.solve(engine.Case.from_dict(data))
    out = r.check.out_of_plane
    n_cr = math.pi**2 * 210e9 * 1e-6 / 4.0**2
    lam = math.sqrt(5e-3 * 355e6 / n_cr)
    chi = _chi(lam, 0.76)
    assert out.checked and out.curve == "d"
    assert out.N_cr == pytest.approx(n_cr, rel=1e-12)
    assert out.chi == pytest.approx(chi, rel=1e-12)
    assert out.utilization == pytest.approx(1e5 / (chi * 5e-3 * 355e6), rel=1e-12)
    assert r.check.strength_kind == "out-of-plane buckling" and r.utilization >= out.utilization
    assert "out-of-plane-not-checked" not in [c.code for c in r.cautions]
    aluminium = engine.solve(engine.Case.from_dict(data | {"material": {"name": "EN AW-6082 T6"}}))
    bound = aluminium.check.out_of_plane
    assert not bound.checked and bound.elastic_bound == pytest.approx(1e5 / bound.N_cr, rel=1e-12)
    assert aluminium.utilization >= bound.elastic_bound


@pytest.mark.parametrize(
    ("left", "right", "factor"),
    [
        ("pinned", "pinned", 1.0),
        ("fixed", "pinned", 1.0),
        ("fixed", "fixed", 1.0),
        ("fixed", "free", 2.0),
        ("free", "fixed", 2.0),
        ("fixed", "guided", 2.0),
        ("pinned", "guided", 2.0),
        ("fixed", {"translation": 2e5, "rotation": "free"}, 2.0),
    ],
)
def test_default_length_is_a_cantilevers_where_an_end_sways(left, right, factor):
    """Without ``out_of_plane``, L_cr about the other axis is the member length where both ends are held in
    the plane analysed, and 2L where an end is free to translate there (free, guided or a translational
    spring): the member is then taken as a cantilever out of plane too, K = 2 (Euler; Timoshenko & Gere 1961
    ch. 2), the longest buckling length of a member fixed at one end, with the warning `out-of-plane-length`.
    With L (the default before), N_b,Rd of a 4 m cantilever HEB 200 was 2.8 times too high. A given length is
    used as given, without the warning. (The project's decision: DEVELOPERS.md decisions log, stop 29.)"""
    L = 4.0
    case = _demo(length=L, axial_force=200e3, supports={"left": left, "right": right})
    result = engine.solve(case)
    oop = result.check.out_of_plane
    minor = engine.sections.section_from_spec({"name": "HEB 200"}, "minor")
    assert oop.buckling_length == factor * L
    assert oop.N_cr == pytest.approx(math.pi**2 * result.material.E * minor.I / (factor * L) ** 2, rel=1e-12)
    lam = math.sqrt(minor.A * result.material.fy / oop.N_cr)
    assert oop.N_b_Rd == pytest.approx(_chi(lam, 0.49) * minor.A * result.material.fy, rel=1e-12)
    warned = [c for c in result.cautions if c.code == "out-of-plane-length"]
    assert [c.level for c in warned] == (["warning"] if factor == 2.0 else [])
    given = engine.solve(
        _demo(
            length=L,
            axial_force=200e3,
            supports={"left": left, "right": right},
            out_of_plane={"buckling_length": L},
        )
    )
    assert given.check.out_of_plane.buckling_length == L
    assert not [c for c in given.cautions if c.code == "out-of-plane-length"]
    assert given.check.out_of_plane.N_b_Rd >= oop.N_b_Rd
