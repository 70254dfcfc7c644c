"""The lateral end conditions of the lateral-torsional buckling check read from the supports
(``check.ltb.lateral_ends`` = ``supports``, the default; engine/ltb_route.py).

An end whose support moves across the plane of bending is not taken as held laterally unless the case says
so: a fork there would be an assumption on the unsafe side (a decision of the project, DEVELOPERS.md
decisions log, stop 30; the out-of-plane buckling length of such a member is 2L for the same reason). The
physics the checks lean on: a member held at one end only is a cantilever laterally (Timoshenko & Gere 1961
ch. 6, checked against the closed forms in tests/engine/test_ltb_cantilever.py). Every member is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.ltb import LtbSettings

SPRING_TOP = {"translation": 1.0, "rotation": "free"}  # 1 N/m: the top all but free to move


def _case(left="fixed", right="pinned", *, ltb=None, second_plane=None, loads=None, axial=100e3):
    """HEB 200, S355, 4 m, N and a 5 kN point load at 3 m (invented)."""
    data = {
        "schema": 1,
        "title": "Invented post",
        "length": 4.0,
        "supports": {"left": left, "right": right},
        "axial_force": axial,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "loads": loads if loads is not None else [{"type": "point", "P": 5e3, "x": 3.0}],
        "check": {"routes": ["second-order", "en-member", "aisc"]},
    }
    if ltb is not None:
        data["check"]["ltb"] = ltb
    if second_plane is not None:
        data["second_plane"] = second_plane
    return engine.Case.from_dict(data)


def _codes(result) -> list:
    return [c.code for c in result.cautions]


HELD = ["pinned", "fixed", {"translation": "fixed", "rotation": 5e6}]


@pytest.mark.parametrize("left", HELD)
@pytest.mark.parametrize("right", HELD)
def test_ends_held_in_the_plane_are_forks_as_stated_forks(left, right):
    """Both ends held against translation: the default gives exactly the check of stated forks, with no new
    warning (what every case held at both ends gave before the setting existed)."""
    default = engine.solve(_case(left, right))
    forks = engine.solve(_case(left, right, ltb={"lateral_ends": ["fork", "fork"]}))
    assert default.ltb.applies and default.ltb.lateral_ends == ("fork", "fork")
    for name in ("M_cr", "chi_LT", "M_b_Rd", "utilisation"):
        assert getattr(default.ltb, name) == getattr(forks.ltb, name), name
    assert default.utilization == forks.utilization
    assert not {"ltb-end-moves", "ltb-end-held-assumed"} & set(_codes(default))


def test_a_top_on_a_soft_spring_is_a_cantilever_tip():
    """Fixed foot, top on a 1 N/m translational spring, tip load: laterally the member is the built-in
    cantilever (the same M_cr as the fixed-free member whose support is stated laterally fixed, to the
    spring's share of the load), not a span between forks."""
    tip = [{"type": "point", "P": 5e3, "x": 4.0}]
    spring = engine.solve(_case("fixed", SPRING_TOP, loads=tip))
    cantilever = engine.solve(_case("fixed", "free", loads=tip, ltb={"lateral_ends": ["fixed", "fork"]}))
    assert spring.ltb.applies and spring.ltb.lateral_ends == ("fixed", "free")
    assert spring.ltb.tip_moves and spring.ltb.root_assumed
    assert spring.ltb.M_cr == pytest.approx(cantilever.ltb.M_cr, rel=1e-4)
    forks = engine.solve(_case("fixed", SPRING_TOP, loads=tip, ltb={"lateral_ends": ["fork", "fork"]}))
    assert forks.ltb.M_cr > 2.0 * spring.ltb.M_cr  # what the fork assumed before
    codes = _codes(spring)
    assert "ltb-end-moves" in codes and "ltb-cantilever-support" in codes
    moves = next(c for c in spring.cautions if c.code == "ltb-end-moves")
    assert moves.level == "warning" and moves.values == {"end": "right"} and "x = L" in moves.message


def test_a_guided_top_over_a_fixed_foot_is_free_laterally_and_a_stated_fork_holds_it():
    """A sway column (fixed foot, guided top): free laterally at the top by default, with the warning;
    stating a fork there gives the check of a span between forks, with no warning."""
    default = engine.solve(_case("fixed", "guided"))
    assert default.ltb.applies and default.ltb.lateral_ends == ("fixed", "free") and default.ltb.tip_moves
    assert "ltb-end-moves" in _codes(default)
    stated = engine.solve(_case("fixed", "guided", ltb={"lateral_ends": ["fork", "fork"]}))
    assert stated.ltb.lateral_ends == ("fork", "fork") and not stated.ltb.tip_moves
    assert stated.ltb.M_cr > default.ltb.M_cr
    assert "ltb-end-moves" not in _codes(stated) and "ltb-cantilever-support" not in _codes(stated)
    turned = engine.solve(
        _case("guided", "fixed", loads=[{"type": "point", "P": 5e3, "x": 1.0}])  # the same member turned
    )
    assert turned.ltb.lateral_ends == ("free", "fixed")
    assert turned.ltb.M_cr == pytest.approx(default.ltb.M_cr, rel=1e-6)


@pytest.mark.parametrize("top", ["guided", SPRING_TOP])
def test_a_moving_top_over_a_pinned_foot_stays_a_fork_with_a_warning(top):
    """One plane, pinned foot, top that moves: nothing would hold the member laterally but its top, so the
    top stays a fork (the check as before) and a warning says it is assumed."""
    default = engine.solve(_case("pinned", top))
    forks = engine.solve(_case("pinned", top, ltb={"lateral_ends": ["fork", "fork"]}))
    assert default.ltb.applies and default.ltb.lateral_ends == ("fork", "fork")
    assert default.ltb.held_assumed == "right" and not forks.ltb.held_assumed
    assert default.ltb.M_cr == forks.ltb.M_cr and default.utilization == forks.utilization
    warning = next(c for c in default.cautions if c.code == "ltb-end-held-assumed")
    assert warning.level == "warning" and warning.values == {"end": "right"}
    assert "ltb-end-held-assumed" not in _codes(forks)


def test_the_minor_plane_says_how_the_ends_are_held_laterally():
    """Two planes: the plane of minor-axis bending states the lateral supports. Built in at the foot and
    free at the top there, the member is a cantilever laterally though its major plane is pinned at both
    ends; held at both ends there, the ends are forks."""
    cantilever = {"supports": {"left": "fixed", "right": "free"}, "loads": []}
    result = engine.solve(_case("pinned", "pinned", second_plane=cantilever, axial=50e3))
    assert result.ltb.applies and result.ltb.lateral_ends == ("fixed", "free") and result.ltb.tip_moves
    assert "ltb-end-moves" in _codes(result)
    held = {"supports": {"left": "pinned", "right": "pinned"}, "loads": []}
    spans = engine.solve(_case("pinned", "pinned", second_plane=held, axial=50e3))
    assert spans.ltb.lateral_ends == ("fork", "fork") and spans.ltb.M_cr > result.ltb.M_cr
    assert not {"ltb-end-moves", "ltb-end-held-assumed"} & set(_codes(spans))


def test_a_minor_plane_spring_at_a_pinned_member_leaves_the_check_unmade():
    """Two planes, minor plane pinned at the foot and on a translational spring at the top: laterally the
    top moves and the foot can turn, which the critical moment here does not model. Not checked
    (``free-end``) and the warning stays, rather than a fork the case contradicts."""
    spring = {"supports": {"left": "pinned", "right": {"translation": 2e5, "rotation": "free"}}, "loads": []}
    result = engine.solve(_case("pinned", "pinned", second_plane=spring, axial=50e3))
    assert not result.ltb.applies and result.ltb.reason == "free-end"
    assert "lateral-torsional-buckling" in _codes(result)


def test_the_setting_reads_and_writes():
    """``supports`` is the default and a value of each end; a case keeps stated forks in its file and
    leaves the default out."""
    assert LtbSettings().lateral_ends == ("supports", "supports")
    assert LtbSettings.from_data({"lateral_ends": ["supports", "fixed"]}).lateral_ends == (
        "supports",
        "fixed",
    )
    with pytest.raises(engine.CaseError, match="check.ltb.lateral_ends.left"):
        LtbSettings.from_data({"lateral_ends": ["free", "fork"]})
    assert "ltb" not in _case().to_dict()["check"]
    stated = _case(ltb={"lateral_ends": ["fork", "fork"]})
    assert stated.to_dict()["check"]["ltb"]["lateral_ends"] == ["fork", "fork"]
    assert engine.Case.from_dict(stated.to_dict()) == stated
    assert math.isfinite(engine.solve(stated).ltb.M_cr)


def test_a_member_on_springs_at_both_ends_keeps_both_forks_with_the_warning():
    """Translational springs at both ends (one plane): neither end is built in, so both stay forks and the
    warning names both."""
    spring = {"translation": 5e6, "rotation": "free"}
    result = engine.solve(_case(spring, spring))
    assert result.ltb.applies and result.ltb.lateral_ends == ("fork", "fork")
    assert result.ltb.held_assumed == "both"
    warning = next(c for c in result.cautions if c.code == "ltb-end-held-assumed")
    assert warning.values == {"end": "both"} and "both ends" in warning.message


@pytest.mark.parametrize(
    ("out_of_plane", "ends"),
    [
        ({"buckling_length": 4.0}, ("fork", "fork")),  # L_cr = L: held at both ends out of plane
        ({"buckling_length": 2.8}, ("fork", "fork")),
        ({"restrained": True}, ("fork", "fork")),
        ({"buckling_length": 8.0}, ("fixed", "free")),  # 2L: the top moves out of plane
    ],
)
def test_a_stated_out_of_plane_length_says_how_the_ends_are_held(out_of_plane, ends):
    """One plane: an out-of-plane buckling length not above L (or out-of-plane buckling prevented) states
    the member held out of plane at its ends, so a guided top is a fork with no warning; a longer one leaves
    the top free laterally (over a fixed foot), or makes a pinned member a cantilever out of its plane."""
    data = _case("fixed", "guided").to_dict()
    data["out_of_plane"] = out_of_plane
    result = engine.solve(engine.Case.from_dict(data))
    assert result.ltb.applies and result.ltb.lateral_ends == ends
    moves = "ltb-end-moves" in _codes(result)
    assert moves is (ends[1] == "free")
    data["supports"] = {"left": "pinned", "right": "guided"}
    pinned = engine.solve(engine.Case.from_dict(data))
    # Neither end built in: the top used to be taken as a fork, with a warning; a length above L says it is
    # not held, so the member is checked as a cantilever out of its plane from either end (stop 37).
    assert "ltb-end-held-assumed" not in _codes(pinned)
    assert ("ltb-out-of-plane-length" in _codes(pinned)) is (ends[1] == "free")
