"""Self-tests of the independent solve_bvp reference (tests/support/bvp_reference.py).

The reference is checked against closed forms so that the engine comparisons built on it mean something.
Sources: Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. (1961), ch. 1 (article numbers from
memory); the check-value table of tests/REFERENCES.md §1 ([derived] there).
"""

import math

import mpmath
import numpy as np
import pytest

from tests.support.bvp_reference import reference_solution

mpmath.mp.dps = 30

L = 6.0  # [m], invented
EI = 4.2e6  # [N·m²], invented
P_E = math.pi**2 * EI / L**2


def _case(left, right, P=0.0, loads=(), imperfection=None):
    case = {
        "schema": 1,
        "length": L,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "axial_force": P,
        "loads": list(loads),
    }
    if imperfection is not None:
        case["imperfection"] = imperfection
    return case


def _eta(u):
    u = mpmath.mpf(u)
    return 12 * (2 * mpmath.sec(u) - 2 - u**2) / (5 * u**4)


def test_udl_midspan_deflection_first_order():
    """At P = 0 the reference gives 5qL⁴/384EI at mid-span of a simply supported span."""
    q = 2.5e3
    r = reference_solution(_case("pinned", "pinned", loads=[{"type": "uniform", "q": q}]), [L / 2])
    # Timoshenko & Gere, Strength of Materials / Theory of Elastic Stability ch. 1: 5qL⁴/384EI; rel 1e-8
    assert r["w"][0] == pytest.approx(5 * q * L**4 / (384 * EI), rel=1e-8)
    # qL²/8, same source; rel 1e-8
    assert r["M"][0] == pytest.approx(q * L**2 / 8, rel=1e-8)


def test_udl_amplification_at_0p3_euler_load():
    """At P = 0.3 P_E the reference's mid-span deflection ratio is η(u), u = (π/2)√0.3."""
    q = 2.5e3
    r = reference_solution(
        _case("pinned", "pinned", P=0.3 * P_E, loads=[{"type": "uniform", "q": q}]), [L / 2]
    )
    ratio = r["w"][0] / (5 * q * L**4 / (384 * EI))
    u = math.pi / 2 * math.sqrt(0.3)
    # η(u) = 12(2 sec u − 2 − u²)/(5u⁴), Timoshenko & Gere ch. 1 [derived in references.md §1]; rel 1e-8
    assert ratio == pytest.approx(float(_eta(u)), rel=1e-8)
    # tabulated η = 1.430086 at P/P_E = 0.3, references.md §1 check values [derived]; abs 1e-6
    assert ratio == pytest.approx(1.430086, abs=1e-6)


def test_off_centre_point_load_closed_form():
    """The reference matches the off-centre point-load closed form for w and M left of the load."""
    Q, a = 1.0e4, 0.3 * L
    b = L - a
    P = 0.7 * P_E
    k = math.sqrt(P / EI)
    xs = np.array([0.3, 0.9, 1.2, a])
    r = reference_solution(_case("pinned", "pinned", P=P, loads=[{"type": "point", "P": Q, "x": a}]), xs)
    # Timoshenko & Gere ch. 1, references.md §1 table row "point Q at x = a"; rel 1e-8
    w_ref = Q * np.sin(k * b) * np.sin(k * xs) / (P * k * math.sin(k * L)) - Q * b * xs / (P * L)
    m_ref = Q * np.sin(k * b) * np.sin(k * xs) / (k * math.sin(k * L))
    np.testing.assert_allclose(r["w"], w_ref, rtol=1e-8)
    np.testing.assert_allclose(r["M"], m_ref, rtol=1e-8)


def test_point_load_jump_gives_left_then_right_values():
    """A repeated station at a point load gives T just left, then just right: a jump of −F."""
    Q, a = 1.0e4, 2.0
    r = reference_solution(_case("pinned", "pinned", loads=[{"type": "point", "P": Q, "x": a}]), [a, a])
    # conventions.md: T(x+) − T(x−) = −F; reactions Qb/L and Qa/L (statics, common practice); rel 1e-9
    assert r["T"][0] == pytest.approx(Q * (L - a) / L, rel=1e-9)
    assert r["T"][1] - r["T"][0] == pytest.approx(-Q, rel=1e-9)


def test_equal_end_moments_give_sec_u():
    """Couples +M0 at x = 0 and −M0 at x = L give M0 sec u at mid-span and M0 at the ends."""
    M0, P = 2.0e4, 0.3 * P_E
    u = math.sqrt(P / EI) * L / 2
    loads = [{"type": "couple", "C": M0, "x": 0.0}, {"type": "couple", "C": -M0, "x": L}]
    r = reference_solution(_case("pinned", "pinned", P=P, loads=loads), [0.0, L / 2, L])
    # Timoshenko & Gere ch. 1: M_max = M0 sec u; rel 1e-8. End values M0 from conventions.md; rel 1e-9
    assert r["M"][1] == pytest.approx(M0 / math.cos(u), rel=1e-8)
    np.testing.assert_allclose(r["M"][[0, 2]], [M0, M0], rtol=1e-9)


def test_cantilever_tip_load_first_order():
    """A fixed–free member with a tip load F has tip deflection FL³/3EI and root moment −FL."""
    F = 1.0e4
    r = reference_solution(_case("fixed", "free", loads=[{"type": "point", "P": F, "x": L}]), [0.0, L])
    # cantilever formulas, common practice, no source; rel 1e-8
    assert r["w"][1] == pytest.approx(F * L**3 / (3 * EI), rel=1e-8)
    assert r["M"][0] == pytest.approx(-F * L, rel=1e-8)
    # member-side T at the loaded free end is F (support side is 0): conventions.md jump rule; rel 1e-9
    assert r["T"][1] == pytest.approx(F, rel=1e-9)


def test_stiff_springs_tend_to_named_supports():
    """Very stiff translation and rotation springs reproduce a fixed end; zero springs a free one."""
    loads = [{"type": "uniform", "q": 1.0e3, "start": 1.0, "end": 4.0}]
    xs = np.linspace(0.0, L, 13)
    fixed = reference_solution(_case("fixed", "pinned", P=0.4 * P_E, loads=loads), xs)
    springs = reference_solution(
        _case({"translation": 1e18, "rotation": 1e18}, "pinned", P=0.4 * P_E, loads=loads), xs
    )
    # limit k → ∞ (conventions.md spring conditions); error ~ EI/(k L): rel 1e-8 of the peak
    np.testing.assert_allclose(springs["w"], fixed["w"], atol=1e-8 * np.max(np.abs(fixed["w"])))
    np.testing.assert_allclose(springs["M"], fixed["M"], atol=1e-8 * np.max(np.abs(fixed["M"])))
    free = reference_solution(_case("fixed", "free", P=0.1 * P_E, loads=loads), xs)
    zero = reference_solution(
        _case("fixed", {"translation": 0.0, "rotation": 0.0}, P=0.1 * P_E, loads=loads), xs
    )
    # k = 0 is the free end exactly; rel 1e-10
    np.testing.assert_allclose(zero["w"], free["w"], rtol=1e-10)


def test_sine_bow_total_offset():
    """An initial sine bow a·sin(πx/L) gives total offset a/(1−α) in compression and a/(1+α) in tension."""
    a = 0.01
    for alpha, expected in [(0.3, a / 0.7), (-0.3, a / 1.3)]:
        r = reference_solution(
            _case("pinned", "pinned", P=alpha * P_E, imperfection={"shape": "sine", "amplitude": a}), [L / 2]
        )
        # references.md §1 "initial sine bow" [memory; exact]; rel 1e-8
        assert r["w"][0] + r["w0"][0] == pytest.approx(expected, rel=1e-8)


def test_transverse_equilibrium_with_mixed_loads():
    """T(0) − T(L) equals the total transverse load for springs, partial and linear loads and a couple."""
    loads = [
        {"type": "uniform", "q": 2.0e3},
        {"type": "linear", "q_start": 0.0, "q_end": 4.0e3, "start": 1.0, "end": 5.0},
        {"type": "point", "P": 5.0e3, "x": 2.5},
        {"type": "couple", "C": -3.0e3, "x": 4.0},
    ]
    total = 2.0e3 * L + 0.5 * 4.0e3 * 4.0 + 5.0e3
    case = _case(
        {"translation": 2e6, "rotation": 1e6},
        {"translation": "fixed", "rotation": 5e5},
        P=0.2 * P_E,
        loads=loads,
        imperfection={"shape": "parabola", "amplitude": 0.01},
    )
    r = reference_solution(case, [0.0, L])
    # conventions.md: T(0) − T(L) = total transverse load; rel 1e-9
    assert r["T"][0] - r["T"][1] == pytest.approx(total, rel=1e-9)
    # spring conditions at the ends: T(0) = k_t w(0), M(0) = −k_r w'(0), M(L) = k_r w'(L); rel 1e-8
    assert r["T"][0] == pytest.approx(2e6 * r["w"][0], rel=1e-8)
    assert r["M"][0] == pytest.approx(-1e6 * r["rotation"][0], rel=1e-8)
    assert r["M"][1] == pytest.approx(5e5 * r["rotation"][1], rel=1e-8)


def test_reaches_requested_tolerance():
    """The reference reaches tol = 1e-10 on a multi-segment case without relaxing it."""
    loads = [
        {"type": "point", "P": 5.0e3, "x": 1.0},
        {"type": "couple", "C": 2.0e3, "x": 3.0},
        {"type": "linear", "q_start": 1.0e3, "q_end": -2.0e3, "start": 2.0, "end": 5.5},
    ]
    r = reference_solution(_case("fixed", "guided", P=0.8 * P_E, loads=loads), np.linspace(0, L, 11))
    assert r["tol"] == 1e-10  # the requested tolerance, not a relaxed one
