"""The aisc route's notional load about the other axis of a one-plane case whose other plane sways.

Sources (equation numbers and values from memory, to be checked against a copy of the Specification):
AISC 360-16 Appendix 7 §7.2.2 and §C2.2b (the notional load 0.002·Y_i, applied independently in each of two
orthogonal directions), Appendix 8 (B2 = 1/(1 − αP/P_e)), §C2.3 (the direct analysis method's stiffness
0.8·τ_b, L_c = L), §H1.1 (eqs. H1-1a/b). The second-order moments of a cantilever are the closed forms of
Timoshenko & Gere, *Theory of Elastic Stability*, 1961, §1.11 (from memory): a tip force H gives
H·tan(kL)/k at the base, k² = αN/(c·EI). The members are invented.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from engine.design import aisc360
from engine.design.aisc_member import _notional_moment
from engine.design.diagram import zero
from engine.design.en_member import Plane
from engine.sections import section_from_spec
from tests.engine.test_aisc_direct_analysis import _solve as _aisc_solve

ft, kip = 0.3048, 4448.2216152605
CANTILEVER = {"left": "fixed", "right": "free"}
PINNED = {"left": "pinned", "right": "pinned"}
L = 14 * ft


def _solve(supports, N, method, analysis, H=1.0 * kip, out_of_plane=None, **extra):
    """The invented W10x49 of 14 ft on the aisc route (the direct-analysis tests' member), a point load H at
    the tip (mid-span when pinned); out of plane as given, by default the case's default (not restrained)."""
    loads = [{"type": "point", "P": H, "x": L / 2 if supports == PINNED else L}]
    if "second_plane" not in extra:
        extra["out_of_plane"] = {} if out_of_plane is None else out_of_plane
    return _aisc_solve(supports, loads, N, method, analysis, length=L, **extra)


def _c(result, N, method, analysis):
    """0.8·τ_b of §C2.3 (eqs. C2-2a/b) with P_ns = F_y·A_g, or 1 by the effective length method; and α."""
    alpha = 1.6 if method == "ASD" else 1.0
    if analysis != "direct":
        return 1.0, alpha
    r = alpha * N / (result.material.fy * result.section.A)
    return 0.8 * (1.0 if r <= 0.5 else 4.0 * r * (1.0 - r)), alpha


@pytest.mark.parametrize("analysis", ["effective-length", "direct"])
@pytest.mark.parametrize("method", ["LRFD", "ASD"])
@pytest.mark.parametrize("N_kip", [40.0, 90.0, 130.0])
def test_a_cantilever_is_checked_with_the_notional_load_about_each_axis_in_turn(N_kip, method, analysis):
    """A cantilever of a one-plane case (out of plane by default 2L, so it sways about the minor axis too):
    the route's utilisation is the larger of H1-1 with the tilt in the plane analysed, (H + 0.002N)·tan(kL)/k
    and no minor-axis moment, and H1-1 with H·tan(kL)/k beside 0.002·N·L·B2 about the minor axis,
    B2 = 1/(1 − αN/(c·π²EI_z/(2L)²))."""
    N = N_kip * kip
    result, route = _solve(CANTILEVER, N, method, analysis)
    c, alpha = _c(result, N, method, analysis)
    H = 1.0 * kip
    k = math.sqrt(alpha * N / (c * result.EI))
    tilted, untilted = (H + N / 500.0) * math.tan(k * L) / k, H * math.tan(k * L) / k
    minor = section_from_spec({"name": "W10x49"}, "minor")
    N_cr_z = math.pi**2 * result.material.E * minor.I / (2.0 * L) ** 2
    if alpha * N >= c * N_cr_z:
        assert math.isinf(route.utilization)
        return
    M_z = 0.002 * N * L / (1.0 - alpha * N / (c * N_cr_z))
    f = route.facts
    P_c, M_cy, M_cz = f["P_c"], f["M_c_y"], f["M_c_z"]
    in_plane = aisc360.interaction(N, P_c, tilted, M_cy).utilization
    other = aisc360.interaction(N, P_c, untilted, M_cy, M_z, M_cz).utilization
    assert f["M_r_z_notional"] == pytest.approx(M_z, rel=1e-12)
    assert route.utilization == pytest.approx(max(in_plane, other), rel=1e-9)
    assert "aisc-notional-other-axis" in route.notes
    assert f["tilt_axis"] == ("y" if in_plane >= other else "z")


def test_the_direct_analysis_method_takes_L_c_as_the_member_length_about_the_swaying_other_axis():
    """§C3 (from memory): by the direct analysis method the swaying minor axis of the cantilever has
    F_e = π²E/(L/r)² with L the member's length (its sway is in M_r), by the effective length method
    π²E/(2L/r)²."""
    N = 60 * kip
    minor = section_from_spec({"name": "W10x49"}, "minor")
    result, direct = _solve(CANTILEVER, N, "LRFD", "direct")
    _, elm = _solve(CANTILEVER, N, "LRFD", "effective-length")
    E = result.material.E
    assert direct.facts["F_e_z"] * minor.A == pytest.approx(math.pi**2 * E * minor.I / L**2, rel=1e-9)
    assert elm.facts["F_e_z"] * minor.A == pytest.approx(math.pi**2 * E * minor.I / (2 * L) ** 2, rel=1e-9)


@pytest.mark.parametrize("analysis", ["effective-length", "direct"])
def test_a_member_held_in_plane_that_sways_out_of_plane_gets_the_tilt_about_the_other_axis(analysis):
    """A member pinned at both ends in the plane analysed (no in-plane tilt) with a given out-of-plane
    buckling length 2.1·L (longer than the member: its ends translate about the other axis): H1-1 with the
    in-plane M_r as it is and 0.002·N·L·B2 about the minor axis, B2 with N_cr = π²EI_z/(2.1L)²."""
    N = 80 * kip
    result, route = _solve(PINNED, N, "LRFD", analysis, out_of_plane={"buckling_length": 2.1 * L})
    c, _ = _c(result, N, "LRFD", analysis)
    minor = section_from_spec({"name": "W10x49"}, "minor")
    N_cr_z = math.pi**2 * result.material.E * minor.I / (2.1 * L) ** 2
    M_z = 0.002 * N * L / (1.0 - N / (c * N_cr_z))
    f = route.facts
    expected = aisc360.interaction(N, f["P_c"], f["M_r_y"], f["M_c_y"], M_z, f["M_c_z"]).utilization
    assert route.utilization == pytest.approx(expected, rel=1e-9)
    assert f["M_r_z"] == pytest.approx(M_z, rel=1e-12)


@pytest.mark.parametrize(
    "out_of_plane", [{"restrained": True}, {"buckling_length": L}, {"buckling_length": 0.7 * L}]
)
def test_no_tilt_about_the_other_axis_where_it_cannot_sway(out_of_plane):
    """Out-of-plane buckling prevented, or an out-of-plane buckling length at most the member's (both ends
    held against translation about that axis): no notional load about it, M_r,z = 0."""
    _, route = _solve(CANTILEVER, 80 * kip, "LRFD", "effective-length", out_of_plane=out_of_plane)
    assert "aisc-notional-other-axis" not in route.notes
    assert route.facts["M_r_z"] == 0.0


def test_no_tilt_about_the_other_axis_in_tension():
    """A member in tension carries no notional load (it is 0.002 × a gravity load in compression)."""
    _, route = _solve(CANTILEVER, -80 * kip, "LRFD", "effective-length")
    assert "aisc-notional-other-axis" not in route.notes


def test_a_two_plane_case_tilts_each_swaying_plane_itself():
    """A case with a second plane solves that plane (its own supports and tilt): no bound about it."""
    second = {"supports": CANTILEVER, "loads": [{"type": "point", "P": 0.5 * kip, "x": L}]}
    _, route = _solve(CANTILEVER, 60 * kip, "LRFD", "effective-length", second_plane=second)
    assert "aisc-notional-other-axis" not in route.notes


@given(fraction=st.floats(min_value=1e-6, max_value=0.999))
def test_the_b2_bound_is_never_below_the_exact_cantilever_moment(fraction):
    """N·φ·L/(1 − N/N_cr) ≥ N·φ·L·tan(kL)/(kL), kL = (π/2)·√(N/N_cr), for every N below N_cr (Timoshenko &
    Gere §1.11, from memory: a tilted cantilever's base moment): the bound is on the safe side."""
    EI, length = 2.0e7, 5.0
    N_cr = math.pi**2 * EI / (2.0 * length) ** 2
    N = fraction * N_cr
    plane = Plane(axis="z", section=None, N_cr=N_cr, EI=EI, diagram=zero(), M_second=0.0, sway_length=length)
    bound = _notional_moment(N, plane, 1.0, 1.0)
    u = 0.5 * math.pi * math.sqrt(fraction)
    exact = N * length / 500.0 * math.tan(u) / u
    assert bound >= exact * (1.0 - 1e-12)


def test_the_tilt_axis_names_the_plane_analysed_of_a_minor_axis_case():
    """A one-plane case bent about the minor axis (z analysed, y the swaying other axis): with a large
    in-plane tip load the check with the tilt in the plane analysed governs, and ``tilt_axis`` names z."""
    _, route = _solve(CANTILEVER, 40 * kip, "LRFD", "effective-length", H=3.0 * kip, axis="minor")
    assert "aisc-notional-other-axis" in route.notes
    assert route.facts["tilt_axis"] == "z"
    assert route.facts["M_r_y_notional"] > 0.0
