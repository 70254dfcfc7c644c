"""The aisc route by the direct analysis method (``check.aisc_analysis = "direct"``).

Sources (equation numbers and values from memory, to be checked against a copy of the Specification):
AISC 360-16 §C2.3 (every stiffness at 0.8 ×, the flexural one further by τ_b, eqs. (C2-2a)/(C2-2b)), §C2.2b
(the notional load 0.002·Y_i), §C2.1 (ASD's analysis at 1.6 × the loads, divided by 1.6) and §C3 (L_c = L
unless a rational analysis gives less). The second-order moments are the closed forms of Timoshenko & Gere,
*Theory of Elastic Stability*, 1961, §1.10–1.12 (from memory), with the reduced stiffness c·EI:
k'² = αN/(c·EI). The members are invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design import aisc360
from engine.sections import section_from_spec

ft, kip = 0.3048, 4448.2216152605
CANTILEVER = {"left": "fixed", "right": "free"}
PINNED = {"left": "pinned", "right": "pinned"}


def _solve(supports, loads, N, method="LRFD", analysis="direct", length=4.0, **extra):
    out = {} if "second_plane" in extra else {"out_of_plane": {"restrained": True}}
    data = {
        "schema": 1,
        "length": length,
        "supports": supports,
        "axial_force": N,
        "loads": loads,
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        **out,
        "check": {
            "routes": ["aisc"],
            "aisc_method": method,
            "aisc_analysis": analysis,
            "ltb": {"restrained": True},
        },
        **extra,
    }
    result = engine.solve(engine.Case.from_dict(data))
    return result, next(r for r in result.routes if r.route == "aisc")


def _c(result, N, method):
    """0.8·τ_b of §C2.3 with P_ns = F_y·A_g (the W10x49 has no slender element in compression)."""
    alpha = 1.6 if method == "ASD" else 1.0
    r = alpha * N / (result.material.fy * result.section.A)
    tau = 1.0 if r <= 0.5 else 4.0 * r * (1.0 - r)
    return 0.8 * tau, alpha


@pytest.mark.parametrize(
    ("ratio", "expected"), [(0.0, 1.0), (0.5, 1.0), (0.6, 0.96), (0.75, 0.75), (0.9, 0.36), (1.0, 0.0)]
)
def test_tau_b_by_eqs_C2_2a_and_C2_2b(ratio, expected):
    """τ_b = 1 up to αP_r/P_ns = 0.5, then 4r(1 − r) (AISC 360-16 eqs. (C2-2a)/(C2-2b), from memory)."""
    assert aisc360.tau_b(ratio) == pytest.approx(expected, abs=1e-12)
    assert aisc360.stiffness_reduction(ratio) == pytest.approx(0.8 * expected, abs=1e-12)


@pytest.mark.parametrize("H", [4e3, -4e3])
@pytest.mark.parametrize("fraction", [0.2, 0.45, 0.7])
@pytest.mark.parametrize("method", ["LRFD", "ASD"])
def test_cantilever_M_r_with_the_reduced_stiffness_and_the_notional_load(method, fraction, H):
    """A cantilever (an end that translates): M_r = (|H| + 0.002·N)·tan(k'L)/k', k'² = αN/(0.8·τ_b·EI), and
    ASD's analysis at 1.6 × the loads divided by 1.6 has the same bracket (both H and the notional load are
    scaled and divided back). The forces reach τ_b < 1 (α·N/P_ns up to ~0.75 at 0.7 of the reduced N_cr)."""
    loads = [{"type": "point", "P": H, "x": 4.0}]
    first, _ = _solve(CANTILEVER, loads, 1e3, method)
    N_y = first.material.fy * first.section.A
    N = fraction * min(0.8 * float(first.critical_loads[0]), N_y) / (1.6 if method == "ASD" else 1.0)
    result, route = _solve(CANTILEVER, loads, N, method)
    c, alpha = _c(result, N, method)
    k = math.sqrt(alpha * N / (c * result.EI))
    expected = (abs(H) + N / 500.0) * math.tan(k * 4.0) / k
    assert route.facts["M_r_y"] == pytest.approx(expected, rel=1e-9)
    assert route.facts["tau_b"] == pytest.approx(c / 0.8, rel=1e-12)
    assert "aisc-direct-analysis" in route.notes
    assert "aisc-elm-drift-limit" not in route.notes and "aisc-out-of-plumb-in-Mr" not in route.notes


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
@pytest.mark.parametrize("fraction", [0.1, 0.5, 0.8])
def test_braced_member_M_r_is_the_reduced_member_without_notional_load(method, fraction):
    """Pinned at both ends (held against translation): no notional load in the member, M_r is the exact
    moment of the uniform load on the reduced member, q/k'²·(sec(k'L/2) − 1)."""
    loads = [{"type": "uniform", "q": 5e3}]
    first, _ = _solve(PINNED, loads, 1e3, method)
    alpha = 1.6 if method == "ASD" else 1.0
    N = fraction * min(0.8 * float(first.critical_loads[0]), first.material.fy * first.section.A) / alpha
    result, route = _solve(PINNED, loads, N, method)
    c, alpha = _c(result, N, method)
    k = math.sqrt(alpha * N / (c * result.EI))
    assert route.facts["M_r_y"] == pytest.approx(5e3 / k**2 * (1 / math.cos(k * 2.0) - 1), rel=1e-9)


def test_L_c_is_the_member_length_for_a_sway_member_and_the_exact_one_when_shorter():
    """§C3 (from memory): L_c = L for the cantilever (F_e = π²EI/(L²A), not the effective length 2L of
    Appendix 7), while a member fixed at both ends keeps its exact critical load 4π²EI/L² (a rational
    analysis giving less than L)."""
    loads = [{"type": "point", "P": 1e3, "x": 4.0}]
    for supports, factor in ((CANTILEVER, 1.0), ({"left": "fixed", "right": "fixed"}, 4.0)):
        result, route = _solve(supports, loads, 200e3)
        EI, A = result.EI, result.section.A
        assert route.facts["F_e_y"] == pytest.approx(factor * math.pi**2 * EI / (4.0**2 * A), rel=1e-9)
        _, elm = _solve(supports, loads, 200e3, analysis="effective-length")
        assert elm.facts["F_e_y"] == pytest.approx(float(result.critical_loads[0]) / A, rel=1e-12)


def test_direct_analysis_beyond_the_reduced_critical_load_fails():
    """At α·N ≥ 0.8·τ_b·N_cr the reduced member has no equilibrium: the route reads unbounded, though the
    nominal member (and the effective length method) still has a number."""
    loads = [{"type": "point", "P": 1e3, "x": 6.0}]
    first, _ = _solve(CANTILEVER, loads, 1e3, length=6.0)
    N = 0.9 * float(first.critical_loads[0])
    assert N < first.material.fy * first.section.A * 0.5  # τ_b = 1: c = 0.8
    _, route = _solve(CANTILEVER, loads, N, length=6.0)
    assert math.isinf(route.utilization)
    _, elm = _solve(CANTILEVER, loads, N, length=6.0, analysis="effective-length")
    assert math.isfinite(elm.utilization)


def test_two_planes_each_take_their_own_reduced_moment():
    """A two-plane case: each plane's M_r is its own uniform load's closed form on c·EI of that plane."""
    data = {
        "second_plane": {"supports": PINNED, "loads": [{"type": "uniform", "q": 1e3}]},
    }
    N = 500e3
    result, route = _solve(PINNED, [{"type": "uniform", "q": 3e3}], N, length=5.0, **data)
    c, _ = _c(result, N, "LRFD")
    for key, q, EI in (("M_r_y", 3e3, result.EI), ("M_r_z", 1e3, result.second_plane.EI)):
        k = math.sqrt(N / (c * EI))
        assert route.facts[key] == pytest.approx(q / k**2 * (1 / math.cos(2.5 * k) - 1), rel=1e-9)


def test_an_erw_hss_takes_the_design_wall_in_the_reduced_stiffness():
    """An ASTM A500 RHS: c = 0.8·τ_b·I_des/I_nom (§B4.2's design wall 0.93t in the stiffness and in P_ns)."""
    rhs = {"shape": "rhs", "h": 0.2, "b": 0.2, "t": 0.008, "manufacture": "cold-formed"}
    nominal = section_from_spec(rhs, "major")
    design = section_from_spec(dict(rhs, t=0.93 * 0.008), "major")
    N, q, L = 300e3, 4e3, 5.0
    result, route = _solve(
        PINNED,
        [{"type": "uniform", "q": q}],
        N,
        length=L,
        section=rhs,
        material={"name": "ASTM A500 Gr. C rectangular"},
    )
    r = N / (result.material.fy * design.A)
    c = 0.8 * (1.0 if r <= 0.5 else 4 * r * (1 - r)) * design.I / nominal.I
    k = math.sqrt(N / (c * result.EI))
    assert route.facts["M_r_y"] == pytest.approx(q / k**2 * (1 / math.cos(k * L / 2) - 1), rel=1e-9)
    assert route.facts["P_ns"] == pytest.approx(result.material.fy * design.A, rel=1e-12)


def test_effective_length_stays_the_default_and_the_setting_round_trips():
    """Without the key the route is Appendix 7's (unchanged); the key survives a round trip and a wrong value
    is refused with the field, the value and the allowed ones."""
    loads = [{"type": "point", "P": 1e3, "x": 4.0}]
    _, default = _solve(CANTILEVER, loads, 200e3, analysis="effective-length")
    assert "aisc-direct-analysis" not in default.notes and "aisc-out-of-plumb-in-Mr" in default.notes
    result, _ = _solve(CANTILEVER, loads, 200e3)
    again = engine.Case.from_dict(result.case.to_dict())
    assert again.check.aisc_analysis == "direct"
    plain = engine.Case.from_dict(dict(result.case.to_dict(), check={"routes": ["aisc"]}))
    assert plain.check.aisc_analysis == "effective-length"
    assert "aisc_analysis" not in plain.to_dict()["check"]
    with pytest.raises(
        engine.CaseError, match=r"check\.aisc_analysis: 'second-order' is not allowed.*'direct'"
    ):
        engine.Case.from_dict(dict(result.case.to_dict(), check={"aisc_analysis": "second-order"}))


def test_capacity_by_the_direct_analysis_method_reads_one_there():
    """The axial capacity with the aisc route alone, by the direct analysis method: solved there, the route
    reads 1 (the reduced stiffness, τ_b and L_c = L all follow the trial force)."""
    data = {
        "schema": 1,
        "length": 14 * ft,
        "supports": CANTILEVER,
        "axial_force": 100 * kip,
        "loads": [{"type": "point", "P": 1.0 * kip, "x": 14 * ft}],
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["aisc"], "aisc_analysis": "direct", "ltb": {"restrained": True}},
    }
    found = engine.capacity(engine.Case.from_dict(data))
    at = engine.solve(engine.Case.from_dict(dict(data, axial_force=found.axial_force)))
    route = next(r for r in at.routes if r.route == "aisc")
    assert route.utilization == pytest.approx(1.0, abs=1e-6)


def test_a_drag_through_the_reduced_range_keeps_a_bounded_number_of_tilted_members():
    """Above α·N/P_ns = 0.5 the notional tilt 0.002·c changes with every force: a drag of 40 forces there
    keeps at most 8 tilted variants of the prepared member (a session's memory stays bounded)."""
    from engine.prepared import prepare

    loads = [{"type": "point", "P": 1e3, "x": 2.0}]
    first, _ = _solve(CANTILEVER, loads, 1e3, length=2.0)
    N_y = first.material.fy * first.section.A
    assert 0.8 * float(first.critical_loads[0]) > 0.9 * N_y  # a stocky mast: τ_b < 1 is reached
    cases = []
    for N in [N_y * (0.55 + 0.008 * i) for i in range(40)]:
        result, route = _solve(CANTILEVER, loads, N, length=2.0)
        assert route.facts["tau_b"] < 1.0
        cases.append(result.case)
    tilted = [key for key in prepare(cases[-1])._variants if key.startswith("plumb")]
    assert 2 <= len(tilted) <= 8
