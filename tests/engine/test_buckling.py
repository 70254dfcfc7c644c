"""The critical-load search: the Wittrick–Williams count, the stiffness it counts with, and the modes."""

import math

import numpy as np
import pytest

import engine
from engine.solver.buckling import _Characteristic, _end_states

SPRING_SETS = [
    ("pinned", "pinned"),
    ("fixed", "free"),
    ({"translation": "fixed", "rotation": 3.0}, {"translation": 40.0, "rotation": "free"}),
    ({"translation": 2.0, "rotation": 7.0}, {"translation": 900.0, "rotation": 0.5}),
    ({"translation": "fixed", "rotation": 1e9}, {"translation": 1e-3, "rotation": "fixed"}),
]


def _case(left, right, L=1.0, EI=1.0):
    return engine.Case.from_dict(
        {"schema": 1, "length": L, "EI": EI, "supports": {"left": left, "right": right}}
    )


@pytest.mark.parametrize(("left", "right"), SPRING_SETS)
def test_count_matches_a_fine_determinant_scan(left, right):
    """J(λ) equals the number of sign changes of det D below λ, found by a 20 000-point scan ([derived])."""
    case = _case(left, right)
    ch = _Characteristic(case.left, case.right, 1.0, 1.0)
    lam = np.linspace(1e-4, 16.0, 20000)
    dets = np.linalg.det(ch.matrix(lam))
    changes = np.concatenate([[0], np.cumsum(np.sign(dets[1:]) != np.sign(dets[:-1]))])
    counts = ch.count(lam)
    # Away from the roots themselves (within one grid step) the two counts agree.
    roots = engine.critical_loads(case, count=8).wavenumbers
    away = np.min(np.abs(lam[:, None] - roots[None, :]), axis=1) > 2 * (lam[1] - lam[0])
    np.testing.assert_array_equal(counts[away], changes[away])


def test_end_stiffness_is_symmetric():
    """The exact end stiffness F·D⁻¹ of the member is symmetric (Maxwell–Betti, [derived]) for any λ."""
    lam = np.array([0.3, 2.0, 5.5, 11.0])
    s0, s1 = _end_states(lam)
    disp = np.stack([s0[:, 0], s0[:, 1], s1[:, 0], s1[:, 1]], axis=1)
    force = np.stack([-s0[:, 3], s0[:, 2], s1[:, 3], -s1[:, 2]], axis=1)
    K = force @ np.linalg.inv(disp)
    np.testing.assert_allclose(K, np.swapaxes(K, 1, 2), rtol=1e-10, atol=1e-10)


def test_zero_force_stiffness_is_the_textbook_beam_matrix():
    """At λ → 0 the end stiffness is 12, 6, 4, 2 (EI/L³ units) of the classical beam element.

    Common practice, no source."""
    s0, s1 = _end_states(np.array([0.0]))
    disp = np.stack([s0[:, 0], s0[:, 1], s1[:, 0], s1[:, 1]], axis=1)
    force = np.stack([-s0[:, 3], s0[:, 2], s1[:, 3], -s1[:, 2]], axis=1)
    K = (force @ np.linalg.inv(disp))[0]
    expected = np.array([[12, 6, -12, 6], [6, 4, -6, 2], [-12, -6, 12, -6], [6, 2, -6, 4]], dtype=float)
    np.testing.assert_allclose(K, expected, atol=1e-12)


def test_soft_translation_spring_gives_the_rigid_bar_load():
    """A pinned base and a soft top spring k buckle at P = k·L, the rigid-bar value (classical, [derived])."""
    k = 1e-4
    b = engine.critical_loads(_case("pinned", {"translation": k, "rotation": "free"}, L=3.0, EI=2.0))
    # The elastic bending lowers it by a relative O(kL³/EI).
    assert b.critical_loads[0] == pytest.approx(k * 3.0, rel=1e-3)


@pytest.mark.parametrize(("left", "right"), SPRING_SETS)
def test_modes_satisfy_their_end_conditions(left, right):
    """Each normalised mode has largest value +1 and meets the homogeneous end conditions to 1e-9."""
    case = _case(left, right)
    b = engine.critical_loads(case, count=5)
    x = np.linspace(0, 1, 4001)
    shapes = b.mode_shapes(x)
    assert np.allclose(shapes.max(axis=1), 1.0, atol=1e-6)
    for n in range(5):
        w, d1, d2, d3 = b.mode_derivatives(n, np.array([0.0, 1.0]))
        P = b.critical_loads[n]
        M, T = -d2, -d3 - P * d1
        for end, idx, support in (("left", 0, case.left), ("right", 1, case.right)):
            sign = -1.0 if end == "left" else 1.0
            t, r = support.translation, support.rotation
            res_t = w[idx] if t == "fixed" else T[idx] if t == "free" else T[idx] + sign * t * w[idx]
            res_r = d1[idx] if r == "fixed" else M[idx] if r == "free" else M[idx] - sign * r * d1[idx]
            # A stiff spring multiplies the rounding of w or w' by its stiffness, hence the second term.
            tol_t = 1e-9 * max(1.0, P) + (1e-14 * t if not isinstance(t, str) else 0.0)
            tol_r = 1e-9 * max(1.0, P) + (1e-14 * r if not isinstance(r, str) else 0.0)
            assert abs(res_t) < tol_t and abs(res_r) < tol_r, (n, end, res_t, res_r)


def test_effective_length_factor_is_pi_over_the_first_wavenumber():
    """K = π/λ₁: 0.699 fixed–pinned (AISC 360-16 Commentary Table C-A-7.1 theoretical value, from memory)."""
    b = engine.critical_loads(_case("fixed", "pinned", L=4.0, EI=9.0))
    assert b.effective_length_factor == pytest.approx(math.pi / 4.493409457909064, rel=1e-12)
    assert round(b.effective_length_factor, 3) == 0.699


def test_equal_extremes_make_the_left_one_positive():
    """Equal translation springs at both ends give a rigid-rotation mode with equal and opposite end values;
    the tie is broken by making the extreme nearest the left end +1, so rounding never flips a mode bow."""
    for scale in (1.0, 1.5, 2.0):
        k = 0.1 / (3.0 * scale) ** 3  # soft: k L³/EI = 0.1, so the first mode is the near-rigid rotation
        case = _case(
            {"translation": k, "rotation": "free"},
            {"translation": k, "rotation": "free"},
            L=3.0 * scale,
            EI=1.0,
        )
        x = np.linspace(0.0, case.length, 11)
        shape = engine.critical_loads(case).mode_shapes(x)[0]
        assert shape[0] == pytest.approx(1.0, abs=1e-9) and shape[-1] == pytest.approx(-1.0, abs=1e-9)
        assert shape[5] == pytest.approx(0.0, abs=1e-9)
