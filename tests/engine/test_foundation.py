"""The elastic (Winkler) foundation (issue 16): EI w'''' + N w'' + k w = q - N w0'', exact in every regime of
its roots, its critical loads by Wittrick–Williams, and the whole of issue 16 against the independent
solve_bvp reference (tests/support/bvp_reference.py, written from the contract alone).

Every number is checked against a source named beside it; lengths, stiffnesses and loads are invented.
"""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from tests.support.bvp_reference import reference_solution

EI = 4.2e6  # [N·m²], invented


def _case(length, foundation, left="pinned", right="pinned", P=0.0, loads=(), **extra):
    data = {
        "length": length,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "axial_force": P,
        "loads": list(loads),
        "foundation": list(foundation),
    }
    data.update(extra)
    return engine.Case.from_dict(data)


def test_keys_round_trip_and_errors():
    case = _case(6.0, [{"start": 1.0, "end": 5.0, "k": 2e6}])
    assert engine.Case.from_dict(case.to_dict()) == case
    with pytest.raises(engine.CaseError, match=r"foundation\[0\].k: -1.0 N/m² must be > 0"):
        _case(6.0, [{"start": 1.0, "end": 5.0, "k": -1.0}])
    with pytest.raises(engine.CaseError, match=r"foundation\[0\].end: 1.0 m must be beyond start"):
        _case(6.0, [{"start": 3.0, "end": 1.0, "k": 1e6}])
    with pytest.raises(engine.CaseError, match=r"foundation\[0\]: 1 to 7 m lies outside the member"):
        _case(6.0, [{"start": 1.0, "end": 7.0, "k": 1e6}])
    with pytest.raises(engine.CaseError, match=r"foundation\[1\]: 2 to 4 m overlaps foundation\[0\]"):
        _case(6.0, [{"start": 1.0, "end": 3.0, "k": 1e6}, {"start": 2.0, "end": 4.0, "k": 1e6}])
    # A code bow on a foundation takes the first mode's shape.
    result = engine.solve(
        _case(6.0, [{"start": 0.0, "end": 6.0, "k": 1e6}], imperfection={"preset": "aisc-l/1000"})
    )
    assert result.bow.shape == "mode"


def test_a_foundation_holds_a_free_free_member():
    # A free–free member is a mechanism, on a foundation it is not (common practice, no source).
    with pytest.raises(engine.CaseError):
        _case(6.0, [], left="free", right="free")
    _case(6.0, [{"start": 2.0, "end": 4.0, "k": 1e6}], left="free", right="free")
    # A hinge beside the foundation's end leaves the part beyond it free.
    with pytest.raises(engine.CaseError, match="hinge"):
        _case(
            6.0,
            [{"start": 0.0, "end": 3.0, "k": 1e6}],
            left="free",
            right="free",
            restraints=[{"x": 4.0, "hinge": True}],
        )


@pytest.mark.parametrize("P", [0.0, 5.0e5, -5.0e5])
def test_infinite_beam_under_a_point_load(P):
    # Hetényi, Beams on Elastic Foundation (1946), ch. II: an infinite beam under F, λ = (k/4EI)^(1/4):
    # w = Fλ/(2k) e^(-λ|x|) (cos λx + sin λ|x|), M = F/(4λ) e^(-λ|x|) (cos λx - sin λ|x|) (from memory).
    # With an axial force N (Hetényi ch. VIII, from memory): roots ±a ± ib with a² = (ω - s/2)/2 and
    # b² = (ω + s/2)/2 (ω = √(k/EI), s = N/EI), w = F/(4EI a b (a² + b²)) e^(-a|x|) (a sin b|x| + b cos bx)
    # and M = F/(4 a b) e^(-a|x|) (b cos bx - a sin b|x|), which at N = 0 is the form above.
    # A free–free beam of a L = 44 is infinite to 1e-9 (e^(-22) at the ends).
    k, F = 2.0e6, 1.0e5
    lam = (k / (4 * EI)) ** 0.25
    omega, s = math.sqrt(k / EI), P / EI
    a, b = math.sqrt((omega - s / 2) / 2), math.sqrt((omega + s / 2) / 2)
    L = 44.0 / a
    result = engine.solve(
        _case(
            L, [{"start": 0.0, "end": L, "k": k}], "free", "free", P, [{"type": "point", "P": F, "x": L / 2}]
        ),
        stations=801,
    )
    x = result.x - L / 2
    decay = np.exp(-a * np.abs(x))
    w = F / (4 * EI * a * b * (a * a + b * b)) * decay * (a * np.sin(b * np.abs(x)) + b * np.cos(b * x))
    M = F / (4 * a * b) * decay * (b * np.cos(b * x) - a * np.sin(b * np.abs(x)))
    # The finite length's effect is of the order of e^(-aL/2) ≈ 3e-10 of the peak values.
    assert np.abs(result.deflection - w).max() <= 1e-8 * np.abs(w).max()
    assert np.abs(result.moment - M).max() <= 1e-8 * np.abs(M).max()
    if P == 0.0:
        assert result.deflection.max() == pytest.approx(F * lam / (2 * k), rel=1e-9)


@pytest.mark.parametrize("k", [1e2, 3e4, 3e5, 2e6, 2e7])
def test_critical_loads_of_a_pinned_bar_on_a_foundation(k):
    # N_cr = min over m of (m²π²EI/L² + kL²/(m²π²)), the bar buckling in m half-waves (Timoshenko & Gere,
    # Theory of Elastic Stability, 2nd ed., ch. 2, the bar on an elastic foundation; from memory). The first
    # five critical loads are the five smallest of these values over m, none missed.
    L = 12.0
    pcr = engine.critical_loads(_case(L, [{"start": 0.0, "end": L, "k": k}]), 5).critical_loads
    values = sorted(m * m * math.pi**2 * EI / L**2 + k * L**2 / (m * m * math.pi**2) for m in range(1, 80))
    assert pcr == pytest.approx(values[:5], rel=1e-12)


def test_a_foundation_over_part_of_the_member_against_the_reference():
    # Partial foundation: no closed form; the critical load lies between the bare bar's and the full
    # foundation's (constraint theorem), and the solver is singular there.
    L, k = 8.0, 5e5
    partial = engine.critical_loads(_case(L, [{"start": 2.0, "end": 6.0, "k": k}]), 1).critical_loads[0]
    full = engine.critical_loads(_case(L, [{"start": 0.0, "end": L, "k": k}]), 1).critical_loads[0]
    assert math.pi**2 * EI / L**2 < partial < full
    near = engine.solve(_case(L, [{"start": 2.0, "end": 6.0, "k": k}], P=partial * (1 - 1e-6), loads=[]))
    assert near.status == "stable"


@settings(max_examples=15, deadline=None)
@given(P=st.floats(-3e6, 1.0e6), x=st.floats(0.5, 5.5))
def test_a_vanishing_foundation_approaches_the_bare_member(P, x):
    # k → 0: the foundation's series is entire in k, so the solution tends to the bare member's (linear in k
    # to first order; common practice, no source).
    loads = [{"type": "uniform", "q": 2e3}, {"type": "point", "P": 1e4, "x": x}]
    bare = engine.solve(_case(6.0, [], P=P, loads=loads))
    soft = engine.solve(_case(6.0, [{"start": 0.0, "end": 6.0, "k": 1e-6}], P=P, loads=loads))
    assert soft.critical_loads[0] == pytest.approx(bare.critical_loads[0], rel=1e-9)
    idx = np.searchsorted(soft.x, bare.x)
    idx = np.minimum(idx, soft.x.size - 1)
    same = np.abs(soft.x[idx] - bare.x) < 1e-12
    assert np.abs(soft.moment[idx][same] - bare.moment[same]).max() <= 1e-8 * np.abs(bare.moment).max()


# --- issue 16 against solve_bvp, one case in every regime of the foundation's roots ---------------------

_K = 2e4  # [N/m²]: 2√(k EI) = 5.8e5 N lies below the first critical load (about 1.2e6 N)
_CASE = {
    "length": 6.0,
    "EI": EI,
    "supports": {"left": "pinned", "right": {"translation": 5e6, "rotation": 1e6}},
    "loads": [{"type": "uniform", "q": 2.5e3}, {"type": "point", "P": 1e4, "x": 2.2}],
    "imperfection": {"shape": "sine", "amplitude": 0.01},
    "restraints": [
        {"x": 1.5, "translation": 3e6},
        {"x": 4.0, "hinge": True, "translation": "fixed"},
        {"x": 5.0, "rotation": 2e6},
    ],
    "steps": [{"x": 3.0, "EI": 2.5e6}],
    "foundation": [{"start": 0.5, "end": 5.5, "k": _K}],
}


@pytest.mark.parametrize(
    "P",
    [
        0.0,
        3.0e5,  # compression below 2√(kEI): complex roots
        2 * math.sqrt(_K * EI),  # the double roots, first segment's EI
        2 * math.sqrt(_K * 2.5e6),  # the double roots, stepped segment's EI
        8.0e5,  # compression beyond: two imaginary pairs
        -2 * math.sqrt(_K * 2.5e6),  # tension at the double roots
        -1.0e6,  # tension beyond: two real pairs
    ],
)
def test_restraints_steps_and_foundation_against_solve_bvp(P):
    data = dict(_CASE, axial_force=P)
    result = engine.solve(engine.Case.from_dict(data))
    ref = reference_solution(data, result.x)
    for field, name in (("deflection", "w"), ("moment", "M"), ("shear", "V")):
        got, want = getattr(result, field), ref[name]
        assert np.abs(got - want).max() <= 1e-8 * np.abs(want).max(), field


def test_a_modal_bow_against_solve_bvp():
    # The bow in the shape of the first mode (a = 0.01 m), handed to the reference as callables of x.
    data = dict(_CASE, axial_force=3.0e5, imperfection={"shape": "mode", "amplitude": 0.01})
    result = engine.solve(engine.Case.from_dict(data))
    mode = result.buckling

    def bow(d):
        return lambda x: 0.01 * mode.mode_derivatives(0, np.asarray(x, dtype=float))[d]

    ref = reference_solution(data, result.x, bow=(bow(0), bow(1), bow(2)))
    # T rather than V: V = T + N(w' + w0') at a hinge's node needs the bow's slope on the node's side,
    # which the reference's output (a function of x alone) cannot tell.
    for field, name in (("deflection", "w"), ("moment", "M"), ("transverse_force", "T")):
        got, want = getattr(result, field), ref[name]
        assert np.abs(got - want).max() <= 1e-8 * np.abs(want).max(), field


def test_sweep_agrees_with_solve_on_a_foundation():
    # The many-force assembly gives the foundation's series per point; it must agree with one-force solves.
    case = engine.Case.from_dict(dict(_CASE, axial_force=0.0))
    pcr = engine.critical_loads(case, 1).critical_loads[0]
    forces = np.array([-1.0e6, 0.0, 3.0e5, 0.9 * pcr])
    swept = engine.sweep(case, forces)
    for i, P in enumerate(forces):
        one = engine.solve(engine.Case.from_dict(dict(_CASE, axial_force=float(P))))
        assert abs(swept.peak_moment[i]) == pytest.approx(one.governing.moment.magnitude, rel=1e-9)
