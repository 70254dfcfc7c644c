"""Member buckling with the moments, counted by the second-order route where the en-member route cannot.

A one-plane member on a foundation (the en-member route is refused there) or stepped in section (the route
is not applied) used to be checked out of plane for N alone (N/N_b,Rd) and for lateral-torsional buckling
for M_y alone: the headline could miss eq. (6.62). The second-order route now adds the larger of eqs.
(6.61)/(6.62) that it does not count (engine.buckling_interaction), on a foundation with C_m = 1.

Reference formulas (EN 1993-1-1:2005, from memory): eq. (6.49) with the imperfection factors of Table 6.1,
curve c about z–z for a rolled H section with h/b <= 1.2 and t_f <= 100 mm (Table 6.2), eq. (6.62)
N/(χ_z N_Rk/γ_M1) + k_zy M_y,Ed/(χ_LT M_y,Rk/γ_M1), and Annex B Table B.2 for class 1–2 with λ̄_z >= 0.4:
k_zy = max(1 − 0.1 λ̄_z n_z/(C_mLT − 0.25), 1 − 0.1 n_z/(C_mLT − 0.25)), n_z = N/(χ_z N_Rk/γ_M1).
The members are invented (the demo wind post, HEB 200, S355, 6 m).
"""

from __future__ import annotations

import dataclasses
import math
import pathlib

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from engine.buckling_interaction import TERM
from engine.capacity import capacity
from engine.sections import section_from_spec

REPO = pathlib.Path(__file__).resolve().parents[2]


def _demo(**changes) -> dict:
    data = engine.load_case(REPO / "assets" / "demo_wind_post.json").to_dict()
    data.update(changes)
    return data


def _bedded(N=350e3, k=2e5, **changes) -> engine.Case:
    data = _demo(axial_force=N, foundation=[{"start": 0.0, "end": 6.0, "k": k}], **changes)
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    return engine.Case.from_dict(data)


def _route(result, name):
    return next(r for r in result.routes if r.route == name)


def _chi(lam: float, alpha: float) -> float:
    """EN 1993-1-1 eq. (6.49), written here independently of the engine."""
    phi = 0.5 * (1.0 + alpha * (lam - 0.2) + lam * lam)
    return min(1.0, 1.0 / (phi + math.sqrt(phi * phi - lam * lam)))


def _eq_6_62(result, section_y, section_z, N, fy, L_cr_z, chi_LT, M_y, gamma_M1=1.0, C_mLT=1.0) -> float:
    """Eq. (6.62) with Annex B Table B.2 (C_mLT = 1 unless given), class 1–2, by hand (module docstring)."""
    E = 210e9
    N_Rk = section_y.A * fy
    N_cr_z = math.pi**2 * E * section_z.I / L_cr_z**2
    lam_z = math.sqrt(N_Rk / N_cr_z)
    chi_z = _chi(lam_z, 0.49)  # curve c about z–z: α = 0.49 (Table 6.1, from memory)
    n_z = N / (chi_z * N_Rk / gamma_M1)
    assert lam_z >= 0.4
    k_zy = max(1.0 - 0.1 * lam_z * n_z / (C_mLT - 0.25), 1.0 - 0.1 * n_z / (C_mLT - 0.25))
    return n_z + k_zy * M_y / (chi_LT * section_y.W_pl * fy / gamma_M1)


def test_bedded_member_counts_eq_6_62_with_cm_1():
    """On a foundation the second-order route's interaction term is eq. (6.62) at C_mLT = 1, by hand."""
    result = engine.solve(_bedded())
    second = _route(result, "second-order")
    assert TERM in second.terms
    M_y = float(np.max(np.abs(result.first_order.moment)))
    z = section_from_spec({"name": "HEB 200"}, "minor")
    expected = _eq_6_62(result, result.section, z, 350e3, 355e6, 6.0, result.ltb.chi_LT, M_y)
    assert second.terms[TERM] == pytest.approx(expected, rel=1e-9)
    assert second.facts["interaction_equation"] == "eq-6.62"
    # It governs here (N/N_b,Rd is 0.423), and so does the headline: nothing is left to a caution.
    assert second.terms[TERM] > second.terms["out-of-plane"]
    assert result.utilization == pytest.approx(second.terms[TERM], rel=1e-12)
    codes = {c.code: c for c in result.cautions}
    assert "out-of-plane-interaction-not-counted" not in codes
    assert codes["buckling-interaction-counted"].values["value"] == second.terms[TERM]


def test_stepped_member_counts_the_worst_segment():
    """A member stepped in section gets eq. (6.62) for each segment's section with the whole member's largest
    first-order moment and its diagram's C_mLT; the largest governs, by hand (the headline was
    N/N_b,Rd = 0.597 before)."""
    data = _demo(steps=[{"x": 3.0, "section": {"name": "HEB 180"}}])
    result = engine.solve(engine.Case.from_dict(data))
    second = _route(result, "second-order")
    M_y = float(np.max(np.abs(result.first_order.moment)))
    values = []
    for name in ("HEB 200", "HEB 180"):
        y = section_from_spec({"name": name}, "major")
        z = section_from_spec({"name": name}, "minor")
        # The segment's own LTB check: χ_LT of that section along the whole member (the stepped check).
        data_one = _demo(section={"name": name})
        plain = engine.solve(engine.Case.from_dict(data_one))
        chi_LT = plain.ltb.chi_LT
        # The diagram's own C_mLT (a pinned member's first-order moment does not depend on its sections).
        C_mLT = _route(plain, "en-member").facts["C_mLT"]
        # The demo's uniform load with a point load fits no row of Table B.3: C_m = 1 (stop 38).
        assert C_mLT == 1.0
        # N_cr about z of the member is the weaker (HEB 180) section's, as the out-of-plane check takes it.
        weak = section_from_spec({"name": "HEB 180"}, "minor")
        N_cr = math.pi**2 * 210e9 * weak.I / 36.0
        L_equiv = math.pi * math.sqrt(210e9 * z.I / N_cr)
        values.append(_eq_6_62(result, y, z, 350e3, 355e6, L_equiv, chi_LT, M_y, C_mLT=C_mLT))
    assert second.terms[TERM] == pytest.approx(max(values), rel=1e-6)
    assert result.utilization >= second.terms[TERM] > second.terms["out-of-plane"]


def test_plain_member_is_unchanged():
    """Neither a foundation nor steps: no such term (the en-member route counts eq. (6.62))."""
    result = engine.solve(engine.Case.from_dict(_demo()))
    assert TERM not in _route(result, "second-order").terms
    assert result.utilization >= _route(result, "en-member").terms["eq-6.62"]


def test_nothing_left_to_count_gets_no_term():
    """Out-of-plane buckling prevented (``out_of_plane.restrained``) and the compression flange restrained
    (``check.ltb.restrained``): no interaction is left out of the second-order route, so none is added."""
    data = _bedded(out_of_plane={"restrained": True}).to_dict()
    data["check"] = dict(data["check"], ltb={"restrained": True})
    result = engine.solve(engine.Case.from_dict(data))
    assert TERM not in _route(result, "second-order").terms


def test_restrained_out_of_plane_still_counts_ltb_with_n():
    """Out-of-plane buckling prevented but lateral-torsional buckling not: eqs. (6.61)/(6.62) still add N to
    the LTB check (with χ_z = 1), and the term is never below the route's own equations."""
    result = engine.solve(_bedded(out_of_plane={"restrained": True}))
    second, member = _route(result, "second-order"), _route(result, "en-member")
    assert result.ltb.chi_LT < 1.0
    assert second.terms[TERM] >= max(member.terms["eq-6.61"], member.terms["eq-6.62"]) * (1 - 1e-12)
    assert second.terms[TERM] > second.terms["lateral-torsional"]


def test_minor_axis_bending_takes_eq_6_61():
    """Bending about the minor axis on a foundation: the other axis is the major one, eq. (6.61)."""
    result = engine.solve(_bedded(N=300e3, axis="minor"))
    second = _route(result, "second-order")
    assert second.facts["interaction_equation"] == "eq-6.61"
    assert second.terms[TERM] >= second.terms["out-of-plane"]


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    N=st.floats(20e3, 900e3),
    k=st.floats(1e3, 5e6),
    q=st.floats(-6e3, 6e3),
    F=st.floats(-20e3, 20e3),
    at=st.floats(0.3, 5.7),
    annex=st.sampled_from(["A", "B"]),
)
def test_never_below_the_route_reading_its_own_diagram(N, k, q, F, at, annex):
    """Property: C_m = 1 is the largest factor either Annex gives, so the term is never below the en-member
    route's own equation on the same member (computed for comparison), nor below N/N_b,Rd."""
    data = _demo(
        axial_force=N,
        foundation=[{"start": 0.0, "end": 6.0, "k": k}],
        loads=[{"type": "uniform", "q": q}, {"type": "point", "P": F, "x": at}],
    )
    data["check"] = dict(data.get("check") or {}, routes=["second-order"], annex=annex)
    result = engine.solve(engine.Case.from_dict(data))
    second, member = _route(result, "second-order"), _route(result, "en-member")
    if TERM not in second.terms:  # no moment, or at a critical load: nothing to count
        return
    value = second.terms[TERM]
    assert value >= second.terms["out-of-plane"] * (1.0 - 1e-12)
    if member.utilization is not None and "eq-6.62" in member.terms:
        assert value >= member.terms["eq-6.62"] * (1.0 - 1e-12)
    assert result.utilization >= value * (1.0 - 1e-12)


def _ltb_heavy() -> engine.Case:
    """The demo under 15 kN/m with the second-order route alone: its lateral-torsional term governs at the
    capacity, while the member check's own largest term is out-of-plane buckling."""
    data = _demo(loads=[{"type": "uniform", "q": 15e3}])
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    return engine.Case.from_dict(data)


@pytest.mark.parametrize(
    "make",
    [
        _bedded,
        lambda: engine.Case.from_dict(_demo(steps=[{"x": 3.0, "section": {"name": "HEB 180"}}])),
        _ltb_heavy,
    ],
    ids=["foundation", "stepped", "ltb-term"],
)
def test_capacity_is_where_the_headline_reaches_one(make):
    """The capacity is the force where the headline reaches 1 even when a term of the second-order route
    beyond the member check governs. Before, it returned N_b,Rd whenever the member check's largest term was
    out-of-plane buckling: 828 kN where the headline is 1.157 (the LTB term) on the third member."""
    case = make()
    found = capacity(case)
    at = engine.solve(dataclasses.replace(case, axial_force=found.axial_force))
    assert at.utilization == pytest.approx(1.0, abs=1e-9)
    below = engine.solve(dataclasses.replace(case, axial_force=0.999 * found.axial_force))
    assert below.utilization < 1.0
    assert found.check == _route(at, "second-order").governing


def _two_planes(N, **changes) -> dict:
    data = engine.load_case(REPO / "assets" / "demo_two_planes.json").to_dict()
    data.update(axial_force=N, **changes)
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    return data


@pytest.mark.parametrize("N", [120e3, 180e3, 300e3, 400e3])
def test_two_planes_on_a_foundation_count_ltb_with_n(N):
    """A two-plane member on a foundation (the invented mullion post): its second-order route adds the larger
    of eqs. (6.61)/(6.62), never below the en-member route's own equations (computed for comparison). At
    180 kN that equation governs: 0.367 where the biaxial cross-section check gives 0.343 (before, 0.343 was
    the headline and no caution said what was left out)."""
    data = _two_planes(N, foundation=[{"start": 0.0, "end": 4.2, "k": 2e5, "plane": "both"}])
    result = engine.solve(engine.Case.from_dict(data))
    second, member = _route(result, "second-order"), _route(result, "en-member")
    own = max(member.terms["eq-6.61"], member.terms["eq-6.62"])
    assert second.terms[TERM] >= own * (1 - 1e-12)
    assert result.utilization >= second.terms[TERM]
    assert second.facts["interaction_one_plane"] is False
    if N == 180e3:
        assert second.governing == TERM
        assert second.terms[TERM] == pytest.approx(0.367, abs=5e-4)


def test_two_planes_second_order_alone_count_ltb_with_n():
    """A two-plane member (no foundation) checked by the second-order route alone: the en-member route is not
    enabled, so the second-order route counts that route's own eqs. (6.61)/(6.62) with χ_LT (at 180 kN eq.
    (6.62) 0.473 governs, where the biaxial cross-section check gives 0.445; before, 0.445 was the headline
    and only a warning named the 0.473). At 400 kN the cross-section check (1.204) stays the larger."""
    low = engine.solve(engine.Case.from_dict(_two_planes(180e3)))
    member, second = _route(low, "en-member"), _route(low, "second-order")
    eq = max(member.terms["eq-6.61"], member.terms["eq-6.62"])
    assert eq == pytest.approx(0.473, abs=5e-4)
    assert second.terms[TERM] == eq and second.governing == TERM
    assert low.utilization == eq > second.terms["cross-section"]
    codes = {c.code: c for c in low.cautions}
    assert "lateral-torsional-interaction-not-counted" not in codes
    assert codes["buckling-interaction-counted"].values["reason"] == "en-member-not-enabled"
    high = engine.solve(engine.Case.from_dict(_two_planes(400e3)))
    second = _route(high, "second-order")
    assert second.terms["cross-section"] > second.terms[TERM]
    assert high.utilization == second.terms["cross-section"]


def test_stepped_member_braced_out_of_plane_still_counts_ltb_with_n():
    """A stepped member braced out of plane (``out_of_plane.restrained``) still buckles laterally-torsionally:
    the term counts eqs. (6.61)/(6.62) with χ_LT (0.431 here, where the cross-section check gives 0.335 and
    M_y,II/M_b,Rd 0.299); with the compression flange restrained as well, nothing is left to count."""
    data = _demo(steps=[{"x": 3.0, "section": {"name": "HEB 180"}}], out_of_plane={"restrained": True})
    result = engine.solve(engine.Case.from_dict(data))
    second = _route(result, "second-order")
    assert second.terms[TERM] > max(second.terms["lateral-torsional"], second.terms["cross-section"])
    assert result.utilization == second.terms[TERM]
    data["check"] = dict(data.get("check") or {}, ltb={"restrained": True})
    braced = engine.solve(engine.Case.from_dict(data))
    assert TERM not in _route(braced, "second-order").terms


@pytest.mark.parametrize("at", [2.0, 3.0, 4.5])
def test_braced_member_without_the_en_member_route_takes_its_worst_piece(at):
    """A member braced in its plane (a rigid restraint at ``at``) is checked by the en-member route piece by
    piece (Annex B Table B.3 between braced points). With that route not enabled, the second-order route
    counts the largest eq. (6.61)/(6.62) over the pieces: never below the governing piece's equations, never
    above that route's utilisation (the largest term of all pieces). The invented demo wind post, 350 kN."""
    data = _demo(axial_force=350e3, restraints=[{"x": at, "translation": "fixed"}])
    both = engine.solve(engine.Case.from_dict(data))
    member = _route(both, "en-member")
    assert len(member.facts["segments"]) == 2
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    alone = engine.solve(engine.Case.from_dict(data))
    term = _route(alone, "second-order").terms[TERM]
    own = max(member.terms["eq-6.61"], member.terms["eq-6.62"])
    assert own <= term <= member.utilization
    assert alone.utilization >= term
    assert _route(both, "second-order").terms.get(TERM) is None  # counted by the enabled route instead
