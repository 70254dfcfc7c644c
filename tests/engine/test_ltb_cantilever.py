"""A cantilever in the lateral-torsional buckling check (issue 15): ``critical_moment`` with a free end and
the member check of a cantilever whose support is stated laterally fixed.

Closed forms of Timoshenko & Gere 1961 ch. 6 (from memory), for a cantilever built in at its support
(v = v' = φ = 0) and free at its tip, with EI_w = 0 (a narrow rectangular bar) and the loads at the shear
centre: tip load P_cr = 4.013·√(EI_z·GI_t)/L², uniform load (qL)_cr = 12.85·√(EI_z·GI_t)/L², uniform moment
M_cr = (π/2L)·√(EI_z·GI_t) (the fork-ended span of length 2L). Every member here is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.mcr import critical_moment

EIZ, GIT, L = 1.0e6, 2.0e5, 4.0
ROOT = math.sqrt(EIZ * GIT)
CANTILEVER = {"lateral_ends": ("fixed", "free"), "warping_ends": ("free", "free")}


def test_tip_load_against_timoshenko_and_gere():
    found = critical_moment(
        [0.0, L],
        [L, 0.0],
        EI_z=EIZ,
        GI_t=GIT,
        EI_w=0.0,
        length=L,
        loads=[{"kind": "point", "F": 1.0, "x": L}],
        **CANTILEVER,
    )
    assert found.M_cr == pytest.approx(4.013 * ROOT / L, rel=3e-4)  # the constant to four figures


def test_uniform_moment_is_the_span_of_twice_the_length():
    found = critical_moment([0.0, L], [1.0, 1.0], EI_z=EIZ, GI_t=GIT, EI_w=0.0, length=L, **CANTILEVER)
    assert found.M_cr == pytest.approx(math.pi / (2.0 * L) * ROOT, rel=1e-6)


def test_uniform_load_with_the_root_on_the_right():
    """The support at x = L: the same member turned round gives the same value."""
    x = [L * i / 40 for i in range(41)]
    M = [0.5 * xi**2 for xi in x]
    found = critical_moment(
        x,
        M,
        EI_z=EIZ,
        GI_t=GIT,
        EI_w=0.0,
        length=L,
        loads=[{"kind": "uniform", "q": 1.0}],
        lateral_ends=("free", "fixed"),
        warping_ends=("free", "free"),
    )
    assert found.M_cr == pytest.approx(12.85 * ROOT / L / 2.0, rel=3e-4)  # M_max = qL²/2


def test_the_mesh_converges_as_h_to_the_fourth():
    exact = math.pi / (2.0 * L) * ROOT
    errors = [
        critical_moment(
            [0.0, L], [1.0, 1.0], EI_z=EIZ, GI_t=GIT, EI_w=0.0, length=L, elements=n, **CANTILEVER
        ).M_cr
        / exact
        - 1.0
        for n in (2, 4, 8, 16)
    ]
    assert all(e > 0.0 for e in errors)
    assert all(10.0 < a / b < 20.0 for a, b in zip(errors[:-1], errors[1:], strict=True)), errors


def test_a_free_end_needs_the_other_fixed():
    with pytest.raises(ValueError, match="lateral_ends"):
        critical_moment(
            [0.0, L], [1.0, 1.0], EI_z=EIZ, GI_t=GIT, EI_w=0.0, length=L, lateral_ends=("fork", "free")
        )


def _case(ltb, left="fixed", right="free"):
    """IPE 300 cantilever, 3 m, S355, 10 kN at the tip (invented)."""
    tip = 3.0 if right == "free" else 0.0
    return engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented cantilever",
            "length": 3.0,
            "supports": {"left": left, "right": right},
            "section": {"name": "IPE 300"},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
            "loads": [{"type": "point", "P": 10e3, "x": tip}],
            "check": {"routes": ["second-order", "en-member", "aisc"], "ltb": ltb},
        }
    )


def test_a_cantilever_is_checked_when_its_support_is_laterally_fixed():
    held = engine.solve(_case({"lateral_ends": ["fixed", "fork"], "warping_ends": ["fixed", "fixed"]}))
    ltb = held.ltb
    assert ltb.applies and ltb.lateral_ends == ("fixed", "free") and ltb.warping_ends == ("fixed", "free")
    assert math.isnan(ltb.M_cr_tabulated) and ltb.diagram == "cantilever"
    assert ltb.aisc.C_b <= 1.0 and ltb.C_b_F1_1 == 1.0
    assert "lateral-torsional-buckling" not in [c.code for c in held.cautions]
    # the same cantilever turned round: the same M_cr
    turned = engine.solve(
        _case(
            {"lateral_ends": ["fork", "fixed"], "warping_ends": ["fixed", "fixed"]},
            left="free",
            right="fixed",
        )
    ).ltb
    assert turned.M_cr == pytest.approx(ltb.M_cr, rel=1e-6)
    # the top flange lowers it, warping free at the support lowers it
    top = engine.solve(_case({"lateral_ends": ["fixed", "fork"], "load_position": "destabilising"})).ltb
    assert top.M_cr < ltb.M_cr


def test_a_built_in_cantilever_left_with_a_fork_is_checked_held_laterally():
    """A cantilever built in within its plane whose ``check.ltb`` leaves the default fork at its support (a
    fork would let it swing laterally) is checked as held laterally there: the same M_cr, χ_LT and M_b,Rd
    as the support stated ``fixed`` (Timoshenko & Gere ch. 6's built-in cantilever, as above), and a
    warning says what was assumed (DEVELOPERS.md decisions log, stop 29); the not-checked warning is gone.
    Before, the check was not made and the headline left lateral-torsional buckling out."""
    assumed = engine.solve(_case({}))
    stated = engine.solve(_case({"lateral_ends": ["fixed", "fork"]}))
    assert assumed.ltb.applies and assumed.ltb.root_assumed and not stated.ltb.root_assumed
    assert assumed.ltb.lateral_ends == stated.ltb.lateral_ends == ("fixed", "free")
    for name in ("M_cr", "chi_LT", "M_b_Rd", "utilisation"):
        assert getattr(assumed.ltb, name) == getattr(stated.ltb, name)
    assert assumed.utilization == stated.utilization
    codes = {c.code: c for c in assumed.cautions}
    assert "lateral-torsional-buckling" not in codes
    assert codes["ltb-cantilever-support"].level == "warning"
    assert codes["ltb-cantilever-support"].values == {"support": "left", "warping": "free"}
    assert "ltb-cantilever-support" not in [c.code for c in stated.cautions]
    turned = engine.solve(_case({}, left="free", right="fixed"))
    assert turned.ltb.root_assumed and turned.ltb.M_cr == pytest.approx(assumed.ltb.M_cr, rel=1e-9)


def test_a_cantilever_on_a_rotational_spring_with_a_fork_is_not_checked():
    """A support that is not built in (a rotational spring in the plane analysed) is not taken as holding
    the member laterally: with the fork the case gives, the check is not made and the warning stays."""
    result = engine.solve(_case({}, left={"translation": "fixed", "rotation": 5e6}))
    assert not result.ltb.applies and result.ltb.reason == "free-end"
    assert "lateral-torsional-buckling" in [c.code for c in result.cautions]


def test_annex_a_takes_the_cantilever_as_a_span_of_twice_its_length():
    """EN 1993-1-1 Annex A with a cantilever: finite terms, λ̄_0 from the uniform-moment M_cr of the span 2L
    (the built-in cantilever with warping free, Timoshenko & Gere ch. 6 as above), so the route is made."""
    case = _case({"lateral_ends": ["fixed", "fork"]})
    data = case.to_dict()
    data["check"]["annex"] = "A"
    data["axial_force"] = 50e3
    data["section"] = {"name": "HEB 200"}  # class 1 in compression (IPE 300's web is class 4 then)
    result = engine.solve(engine.Case.from_dict(data))
    route = next(r for r in result.routes if r.route == "en-member")
    assert result.ltb.applies and route.utilization is not None and math.isfinite(route.utilization)


def test_a_warping_restraint_without_warping_stiffness_holds_nothing():
    """EI_w = 0: a 'fixed' warping end must not raise M_cr (φ' = 0 would be a constraint the member lacks)."""
    free = critical_moment([0.0, L], [1.0, 1.0], EI_z=EIZ, GI_t=GIT, EI_w=0.0, length=L, **CANTILEVER).M_cr
    held = critical_moment(
        [0.0, L],
        [1.0, 1.0],
        EI_z=EIZ,
        GI_t=GIT,
        EI_w=0.0,
        length=L,
        lateral_ends=("fixed", "free"),
        warping_ends=("fixed", "free"),
    ).M_cr
    assert held == pytest.approx(free, rel=1e-12)


@pytest.mark.parametrize(
    ("minor_root", "assumed"), [("fixed", True), ({"translation": "fixed", "rotation": 5e6}, False)]
)
def test_a_two_plane_cantilever_is_held_laterally_only_where_both_planes_build_it_in(minor_root, assumed):
    """A cantilever analysed in both planes: its support is taken as held laterally (v' = 0 there) only
    where the plane of minor-axis bending builds it in too; on a rotational spring in that plane the
    support can turn laterally, so the check is not made (``free-end``), as for one plane."""
    data = _case({}).to_dict()
    data["second_plane"] = {"supports": {"left": minor_root, "right": "free"}, "loads": []}
    result = engine.solve(engine.Case.from_dict(data))
    assert result.ltb.applies is assumed
    if assumed:
        assert result.ltb.root_assumed
        stated = dict(data, check=dict(data["check"], ltb={"lateral_ends": ["fixed", "fork"]}))
        own = engine.solve(engine.Case.from_dict(stated)).ltb
        assert not own.root_assumed and own.M_cr == result.ltb.M_cr
    else:
        assert result.ltb.reason == "free-end"
