"""An overhang past a support in the lateral-torsional buckling check: a free end, a fork at the other end
and a restraint inside the member that holds it laterally (``critical_moment`` and the member check).

References: the built-in cantilever under uniform moment with EI_w = 0, M_cr = (π/2L)·√(EI_z·GI_t)
(Timoshenko & Gere 1961 ch. 6, from memory; the fork span of 2L), which the overhang approaches as its
support moves onto the fork end (two points held laterally and against twist a short way apart hold the
section like a clamp) [derived]; and that a restraint added never lowers an elastic critical load (Rayleigh's
principle) [derived]. Every member is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.mcr import critical_moment

EIZ, GIT, L = 1.0e6, 2.0e5, 4.0
ROOT = math.sqrt(EIZ * GIT)


def _mcr(tip: str, restraint: dict) -> float:
    """M_cr under uniform moment with a fork at x = 0, ``tip`` at x = L and ``restraint`` inside."""
    return critical_moment(
        [0.0, L],
        [1.0, 1.0],
        EI_z=EIZ,
        GI_t=GIT,
        EI_w=0.0,
        length=L,
        lateral_ends=("fork", tip),
        restraints=[restraint],
    ).M_cr


def _overhang(a: float, tip: str = "free", **held) -> float:
    """The support at x = a held laterally and against twist (or as ``held`` says)."""
    return _mcr(tip, {"x": a, "lateral": "fixed", "twist": "fixed", **held})


@pytest.mark.parametrize(("a", "tolerance"), [(0.05, 2e-3), (0.01, 5e-4), (0.002, 1e-4)])
def test_an_overhang_whose_support_nears_the_fork_is_a_built_in_cantilever(a, tolerance):
    """The support a short way from the fork: the overhang L − a takes the built-in cantilever's M_cr."""
    cantilever = math.pi / (2.0 * (L - a)) * ROOT
    assert _overhang(a) == pytest.approx(cantilever, rel=tolerance)
    assert _overhang(a) >= cantilever * (1 - 1e-9)  # the short span holds less than a clamp, never more


@pytest.mark.parametrize("a", [0.5, 1.5, 2.5, 3.5])
def test_holding_the_tip_never_lowers_the_critical_moment(a):
    """Rayleigh: a fork at the tip adds a restraint, so M_cr does not fall; nor does a stiffer restraint at
    the support (a lateral spring in place of the fixed one gives the lower M_cr)."""
    free, held = _overhang(a), _overhang(a, "fork")
    assert held >= free * (1 - 1e-9)
    assert _overhang(a, lateral=1e5) <= free * (1 + 1e-9)


def test_a_free_end_without_a_lateral_hold_inside_is_refused():
    """A fork and a free end with only a twist restraint inside would swing laterally about the fork."""
    with pytest.raises(ValueError, match="lateral_ends"):
        _mcr("free", {"x": 2.0, "twist": "fixed"})


def _member(second_plane: bool):
    """HEB 200, S355, 6 m, pinned at x = 0, supported at 4.5 m, free at 6 m, 3 kN/m (invented)."""
    data = {
        "schema": 1,
        "title": "Invented overhang",
        "length": 6.0,
        "supports": {"left": "pinned", "right": "free"},
        "axial_force": 20e3,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "loads": [{"type": "uniform", "q": 3e3}],
        "restraints": [{"x": 4.5, "translation": "fixed", "twist": "fixed"}],
    }
    if second_plane:
        data["second_plane"] = {"supports": {"left": "pinned", "right": "free"}, "loads": []}
    return engine.Case.from_dict(data)


def test_an_overhang_is_checked_in_two_planes_and_in_one_with_its_support_taken_as_a_fork():
    """With the plane of minor-axis bending the support holds the member laterally: the check is made with
    the fork at x = 0 and the tip free, and its M_cr is the exact one of that problem. In one plane the
    support inside is taken as a fork, as a supported end is (the same M_cr), and a warning says so; on a
    translational spring it is not, and the check is not made (``free-end``)."""
    two = engine.solve(_member(True))
    assert two.ltb.applies and two.ltb.lateral_ends == ("fork", "free")
    assert two.ltb.segments == ((0.0, 4.5), (4.5, 6.0)) and not two.ltb.supports_assumed
    codes = [c.code for c in two.cautions]
    assert "lateral-torsional-buckling" not in codes and "ltb-support-held-assumed" not in codes
    assert math.isfinite(two.ltb.M_cr) and 0.0 < two.ltb.chi_LT <= 1.0
    one = engine.solve(_member(False))
    assert one.ltb.applies and one.ltb.supports_assumed == (4.5,)
    assert one.ltb.M_cr == pytest.approx(two.ltb.M_cr, rel=1e-9)
    warning = next(c for c in one.cautions if c.code == "ltb-support-held-assumed")
    assert warning.level == "warning" and warning.values == {"x": [4.5]} and "x = 4.500 m" in warning.message
    data = _member(False).to_dict()
    data["restraints"] = [{"x": 4.5, "translation": 1e7, "twist": "fixed"}]
    spring = engine.solve(engine.Case.from_dict(data))
    assert not spring.ltb.applies and spring.ltb.reason == "free-end"
    assert "lateral-torsional-buckling" in [c.code for c in spring.cautions]


def test_a_built_in_root_keeps_the_cantilever_and_ignores_the_support_inside():
    """Fixed at x = 0 with a support inside and a free end (one plane): checked as the cantilever from its
    built-in support, as before; the support inside is not taken as a fork (the lower M_cr)."""
    data = _member(False).to_dict()
    data["supports"] = {"left": "fixed", "right": "free"}
    result = engine.solve(engine.Case.from_dict(data))
    assert result.ltb.applies and result.ltb.lateral_ends == ("fixed", "free")
    assert not result.ltb.supports_assumed and result.ltb.root_assumed


def test_an_overhang_whose_other_end_is_stated_fixed_is_a_cantilever_from_it():
    """One plane, the end at x = 0 stated laterally fixed: the cantilever from that end, with the support
    inside not taken as a fork (the case says how the member is held; the lower M_cr)."""
    data = _member(False).to_dict()
    data["check"] = dict(data.get("check") or {}, ltb={"lateral_ends": ["fixed", "supports"]})
    stated = engine.solve(engine.Case.from_dict(data))
    assert stated.ltb.applies and stated.ltb.lateral_ends == ("fixed", "free")
    assert not stated.ltb.supports_assumed and all("lateral" not in r for r in stated.ltb.restraints)
    assert stated.ltb.M_cr < engine.solve(_member(False)).ltb.M_cr
