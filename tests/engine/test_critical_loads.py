"""Elastic critical loads and effective length factors against references.md §2 and independent roots.

Sources: Euler loads per end conditions, references.md §2 (pinned–pinned n²π²EI/L², fixed–free
(2n−1)²π²EI/(4L²), fixed–fixed 4π²EI/L², fixed–guided π²EI/L², pinned–guided π²EI/(4L²): common practice,
no source); fixed–pinned 20.19 EI/L² [text: Hibbeler, *Mechanics of Materials*, ch. 13] with kL = 4.4934 the
root of tan kL = kL; higher modes 59.68, 118.9 (fixed–pinned) and 80.76 (fixed–fixed) EI/L² [derived in
references.md]. Roots are recomputed here with scipy.optimize.brentq, and every support set, springs
included, is also checked against the exact 4×4 characteristic determinant built below from the contract
(conventions.md) alone, independently of engine/.
"""

import math

import numpy as np
import pytest
from scipy.optimize import brentq

import engine

L = 6.0  # [m], invented
EI = 4.2e6  # [N·m²], invented
UNIT = EI / L**2  # critical loads below are c·EI/L²
EXACT_REL = 1e-9  # engine vs roots computed here with brentq (xtol 1e-15)

NAMED = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}


# ---------------------------------------------------------------- independent characteristic determinant


def _support(spec):
    return NAMED[spec] if isinstance(spec, str) else (spec["translation"], spec["rotation"])


def _rows(spec, side, z):
    """Two rows of the end conditions on w(ξ) = A sin zξ + B cos zξ + Cξ + D, ξ = x/L, z = L√(P/EI).

    With this basis (conventions.md): w' = θ, M = −EI w'', and T = V − P w' = −EI(w''' + k²w') = −P·C/L,
    so in units EI/L³ the transverse force is T̂ = −z²C. Springs: T(0) = k_t w(0), T(L) = −k_t w(L),
    M(0) = −k_r w'(0), M(L) = k_r w'(L), with k̂_t = k_t L³/EI and k̂_r = k_r L/EI.
    """
    trans, rot = _support(spec)
    if side == "left":
        s, c = 0.0, 1.0
    else:
        s, c = math.sin(z), math.cos(z)
    xi = 0.0 if side == "left" else 1.0
    w = np.array([s, c, xi, 1.0])
    dw = np.array([z * c, -z * s, 1.0, 0.0])
    m = np.array([z * z * s, z * z * c, 0.0, 0.0])  # M̂ = −w''
    t = np.array([0.0, 0.0, -z * z, 0.0])  # T̂
    sgn = 1.0 if side == "left" else -1.0
    rows = []
    if trans == "fixed":
        rows.append(w)
    elif trans == "free":
        rows.append(t)
    else:
        k = float(trans) * L**3 / EI
        rows.append((t - sgn * k * w) / (1.0 + k))
    if rot == "fixed":
        rows.append(dw)
    elif rot == "free":
        rows.append(m)
    else:
        k = float(rot) * L / EI
        rows.append((m + sgn * k * dw) / (1.0 + k))
    return rows


def characteristic(left, right, z):
    """det of the 4×4 end-condition matrix at z = L√(P/EI) [-]; zero at a critical load."""
    return float(np.linalg.det(np.array(_rows(left, "left", z) + _rows(right, "right", z))))


def independent_roots(left, right, count=5, z_max=40.0, step=2e-3):
    """First ``count`` critical loads [N] as sign changes of the determinant polished by brentq."""
    zs = np.arange(step, z_max, step)
    d = np.array([characteristic(left, right, z) for z in zs])
    roots = []
    for i in np.flatnonzero(np.sign(d[:-1]) * np.sign(d[1:]) < 0):
        roots.append(
            brentq(lambda z: characteristic(left, right, z), zs[i], zs[i + 1], xtol=1e-15, rtol=1e-15)
        )
        if len(roots) == count:
            break
    assert len(roots) == count, "scan range too short"
    return np.array(roots) ** 2 * UNIT


def _case(left, right, P=0.0):
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": L,
            "EI": EI,
            "supports": {"left": left, "right": right},
            "axial_force": P,
            "loads": [],
        }
    )


def _engine_loads(left, right, count=5):
    return np.asarray(engine.critical_loads(_case(left, right), count=count).critical_loads)


def _tan_root(n):
    """n-th positive root of tan z = z, by brentq on sin z − z cos z in (nπ, (n + ½)π)."""
    return brentq(
        lambda z: math.sin(z) - z * math.cos(z),
        n * math.pi + 1e-9,
        (n + 0.5) * math.pi - 1e-9,
        xtol=1e-15,
        rtol=1e-15,
    )


# ---------------------------------------------------------------- the table of references.md §2


def _fixed_fixed_exact(count=5):
    # symmetric modes z = 2nπ; antisymmetric tan(z/2) = z/2, so z = 2·(root of tan μ = μ) [derived]
    zs = sorted([2 * n * math.pi for n in range(1, 4)] + [2 * _tan_root(n) for n in range(1, 4)])
    return np.array(zs[:count]) ** 2 * UNIT


EXACT = {
    # (left, right): exact first five critical loads [N]
    ("pinned", "pinned"): np.array([n * n * math.pi**2 for n in range(1, 6)]) * UNIT,
    ("fixed", "free"): np.array([(2 * n - 1) ** 2 * math.pi**2 / 4 for n in range(1, 6)]) * UNIT,
    ("fixed", "pinned"): np.array([_tan_root(n) ** 2 for n in range(1, 6)]) * UNIT,
    ("fixed", "fixed"): _fixed_fixed_exact(),
    ("fixed", "guided"): np.array([n * n * math.pi**2 for n in range(1, 6)]) * UNIT,
    ("pinned", "guided"): np.array([(2 * n - 1) ** 2 * math.pi**2 / 4 for n in range(1, 6)]) * UNIT,
}
K_THEORETICAL = {
    ("pinned", "pinned"): 1.0,
    ("fixed", "free"): 2.0,
    ("fixed", "pinned"): 0.699,
    ("fixed", "fixed"): 0.5,
    ("fixed", "guided"): 1.0,
    ("pinned", "guided"): 2.0,
}
PAIRS = list(EXACT)


def _both_ways(pairs):
    return [p for pair in pairs for p in (pair, pair[::-1])]


@pytest.mark.parametrize("pair", _both_ways(PAIRS), ids=lambda p: f"{p[0]}-{p[1]}")
def test_named_supports_first_five(pair):
    """Every named end pair, both ways round, has the exact first five critical loads of references.md §2."""
    want = _exact_pair(tuple(pair))
    got = _engine_loads(*pair)
    # formulas of references.md §2 and brentq roots (see module docstring); rel 1e-9
    np.testing.assert_allclose(got[:5], want, rtol=EXACT_REL)


def test_fixed_pinned_published_values():
    """Fixed–pinned gives 20.19, 59.68 and 118.9 EI/L² and kL = 4.4934, as published."""
    got = _engine_loads("fixed", "pinned") / UNIT
    # Hibbeler, Mechanics of Materials, ch. 13 [text]: 20.19 (4 figures, rel 3e-4)
    assert got[0] == pytest.approx(20.19, rel=3e-4)
    # references.md §2 [derived]: 59.68 and 118.9 (4 figures, rel 5e-4)
    assert got[1] == pytest.approx(59.68, rel=5e-4)
    assert got[2] == pytest.approx(118.9, rel=5e-4)
    # kL = 4.4934, root of tan kL = kL (references.md §2); abs 5e-5
    assert math.sqrt(got[0]) == pytest.approx(4.4934, abs=5e-5)
    assert math.sqrt(got[0]) == pytest.approx(_tan_root(1), rel=1e-10)


def test_fixed_fixed_second_load():
    """Fixed–fixed gives 4π² then 80.76 EI/L²."""
    got = _engine_loads("fixed", "fixed") / UNIT
    # references.md §2: 4π² exact (rel 1e-9); 80.76 [derived], 4 figures (rel 5e-4)
    assert got[0] == pytest.approx(4 * math.pi**2, rel=EXACT_REL)
    assert got[1] == pytest.approx(80.76, rel=5e-4)


@pytest.mark.parametrize("pair", _both_ways(PAIRS), ids=lambda p: f"{p[0]}-{p[1]}")
def test_effective_length_factor(pair):
    """The effective length factor K = π/(L√(Pcr1/EI)) is the theoretical one of references.md §2."""
    key = tuple(pair) if tuple(pair) in K_THEORETICAL else tuple(pair[::-1])
    b = engine.critical_loads(_case(*pair), count=5)
    # references.md §2 K column, given to 3 decimals; abs 5e-4
    assert b.effective_length_factor == pytest.approx(K_THEORETICAL[key], abs=5e-4)
    # and exactly π/√(c1); rel 1e-9
    k_exact = math.pi / math.sqrt(EXACT[key][0] / UNIT)
    assert b.effective_length_factor == pytest.approx(k_exact, rel=EXACT_REL)


@pytest.mark.parametrize("pair", _both_ways(PAIRS), ids=lambda p: f"{p[0]}-{p[1]}")
def test_named_supports_match_determinant(pair):
    """The engine's first five critical loads are the roots of the independent 4×4 determinant."""
    # exact determinant built in this file from conventions.md, roots by brentq; rel 1e-9
    np.testing.assert_allclose(_engine_loads(*pair)[:5], independent_roots(*pair), rtol=EXACT_REL)


def test_solve_reports_the_same_critical_loads():
    """result.critical_loads of engine.solve equals engine.critical_loads for the same case."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": L,
            "EI": EI,
            "supports": {"left": "fixed", "right": "pinned"},
            "axial_force": 1.0e5,
            "loads": [{"type": "uniform", "q": 1.0e3}],
        }
    )
    r = engine.solve(case, stations=101)
    # same computation, two entry points; rel 1e-12
    direct = np.asarray(engine.critical_loads(case, count=5).critical_loads)
    np.testing.assert_allclose(np.asarray(r.critical_loads)[:5], direct[:5], rtol=1e-12)
    np.testing.assert_allclose(np.asarray(r.critical_loads)[:5], EXACT[("fixed", "pinned")], rtol=EXACT_REL)


def test_first_modes_are_euler_shapes():
    """result.modes[0] is sin(πx/L) (pinned–pinned) or 1 − cos(πx/2L) (fixed–free) at stations."""
    for (left, right), shape in [
        (("pinned", "pinned"), lambda x: np.sin(np.pi * x / L)),
        (("fixed", "free"), lambda x: 1 - np.cos(np.pi * x / (2 * L))),
    ]:
        r = engine.solve(_case(left, right, P=0.1 * EI / L**2), stations=201)
        x = np.asarray(r.x)
        modes = np.asarray(r.modes)
        assert modes.shape[0] >= 5 and modes.shape[1] == x.size
        # Euler buckled shapes, common practice, no source; spec: max |mode| = 1, largest value positive;
        # abs 1e-9
        np.testing.assert_allclose(modes[0], shape(x), rtol=0, atol=1e-9)


def test_mode_shapes_method_gives_euler_shapes():
    """Buckling.mode_shapes(x) gives sin(πx/L) (pinned–pinned) and 1 − cos(πx/2L) (fixed–free)."""
    x = np.linspace(0.0, L, 201)
    for (left, right), shape in [
        (("pinned", "pinned"), lambda x: np.sin(np.pi * x / L)),
        (("fixed", "free"), lambda x: 1 - np.cos(np.pi * x / (2 * L))),
    ]:
        b = engine.critical_loads(_case(left, right), count=5)
        # Euler buckled shapes, common practice, no source; abs 1e-9
        np.testing.assert_allclose(np.asarray(b.mode_shapes(x))[0], shape(x), rtol=0, atol=1e-9)


# ---------------------------------------------------------------- springs

SPRING_LIMITS = [
    # (left, right as a function of k, named pair at k = 0, named pair at k → ∞)
    ("fixed", lambda k: {"translation": k, "rotation": "free"}, ("fixed", "free"), ("fixed", "pinned")),
    ("pinned", lambda k: {"translation": "fixed", "rotation": k}, ("pinned", "pinned"), ("pinned", "fixed")),
    ("fixed", lambda k: {"translation": "free", "rotation": k}, ("fixed", "free"), ("fixed", "guided")),
    ("fixed", lambda k: {"translation": k, "rotation": "fixed"}, ("fixed", "guided"), ("fixed", "fixed")),
]


def _exact_pair(pair):
    return EXACT[pair] if pair in EXACT else EXACT[pair[::-1]]


@pytest.mark.parametrize("case_index", range(len(SPRING_LIMITS)))
@pytest.mark.parametrize("mirror", [False, True], ids=["spring-right", "spring-left"])
def test_spring_limits(case_index, mirror):
    """A spring of 0 gives the released support and a spring of 1e18 the restrained one; loads rise with k."""
    named, spring, at_zero, at_inf = SPRING_LIMITS[case_index]

    def loads(k):
        return _engine_loads(spring(k), named) if mirror else _engine_loads(named, spring(k))

    # k = 0 is the released support exactly (conventions.md); rel 1e-9
    np.testing.assert_allclose(loads(0.0)[:5], _exact_pair(at_zero), rtol=EXACT_REL)
    # k = 1e18 (largest allowed) gives the restrained support to within EI/(k L) ~ 1e-12; rel 1e-8
    np.testing.assert_allclose(loads(1e18)[:5], _exact_pair(at_inf), rtol=1e-8)
    # adding stiffness never lowers a critical load (Rayleigh's constraint theorem, common practice)
    firsts = np.array([loads(k)[0] for k in 10.0 ** np.arange(0, 19, 2)])
    assert np.all(np.diff(firsts) >= -1e-9 * firsts[:-1])
    assert firsts[-1] > firsts[0]


@pytest.mark.parametrize("beta", [0.5, 2.0, 10.0, 50.0])
def test_rotation_spring_characteristic_equation(beta):
    """Pinned base with the top held in translation and a rotation spring k_r solves tan z = βz/(z² + β)."""
    # [derived] from conventions.md: w = A sin kx + Cx (w(0) = M(0) = 0); w(L) = 0 and M(L) = k_r w'(L) give
    # z² sin z = β(z cos z − sin z), β = k_r L/EI, z = kL. β → 0: z = π; β → ∞: tan z = z (Timoshenko & Gere
    # ch. 2 treats the elastically restrained end; article from memory).
    k_r = beta * EI / L
    z1 = brentq(
        lambda z: (z * z + beta) * math.sin(z) - beta * z * math.cos(z),
        math.pi,
        _tan_root(1),
        xtol=1e-15,
        rtol=1e-15,
    )
    right = {"translation": "fixed", "rotation": k_r}
    got = _engine_loads("pinned", right)
    # rel 1e-9
    assert got[0] == pytest.approx(z1**2 * UNIT, rel=EXACT_REL)
    assert math.pi**2 * UNIT < got[0] < _tan_root(1) ** 2 * UNIT
    np.testing.assert_allclose(got[:5], independent_roots("pinned", right), rtol=EXACT_REL)
    # mirrored: spring at the base, pin at the top; rel 1e-9
    np.testing.assert_allclose(_engine_loads(right, "pinned")[:5], got[:5], rtol=EXACT_REL)


SPRING_SETS = [
    ({"translation": 5e6, "rotation": 2e6}, "pinned"),
    ({"translation": "fixed", "rotation": 3e5}, {"translation": "fixed", "rotation": 8e6}),
    ("fixed", {"translation": 2e5, "rotation": "free"}),
    ({"translation": 1e6, "rotation": "free"}, {"translation": 4e6, "rotation": "free"}),
    ({"translation": 3e6, "rotation": 1e7}, {"translation": "free", "rotation": 5e5}),
    ("guided", {"translation": 2e6, "rotation": 1e6}),
]


@pytest.mark.parametrize("pair", SPRING_SETS, ids=[f"springs{i}" for i in range(len(SPRING_SETS))])
def test_spring_supports_match_determinant(pair):
    """With springs at one or both ends the five critical loads are the roots of the 4×4 determinant."""
    # independent exact determinant (this file, from conventions.md), roots by brentq; rel 1e-9
    np.testing.assert_allclose(_engine_loads(*pair)[:5], independent_roots(*pair), rtol=EXACT_REL)
