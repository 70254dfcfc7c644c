"""The certified eigen route of engine.design.mcr_fe (Rayleigh-quotient iteration from the coarser mesh's λ,
a Cholesky certificate that no λ lies below it) against a dense reference, and its fall-back to the route
before.

Reference: ``scipy.linalg.eigh(G, K)`` (LAPACK's generalized symmetric solver) on the same reduced K and G,
λ = 1/μ_max. The problems are invented (about an IPE 300 over 6 m): uniform moment, end moments of both signs,
a UDL, point loads, loads above and below the shear centre, the axial force held or scaled, compression up to
near N_cr,z and tension, restraints."""

from __future__ import annotations

import math

import numpy as np
import pytest
import scipy.linalg
from hypothesis import given, settings
from hypothesis import strategies as st

from engine.design import mcr, mcr_fe

EI_Z, GI_T, L = 2.0e6, 4.0e4, 6.0  # invented (N·m², N·m², m)
EI_W = L**2 * GI_T / math.pi**2  # κ = 1
I0 = 0.02  # i0² [m²]
N_Z = math.pi**2 * EI_Z / L**2
X = np.linspace(0.0, L, 41)
RELATIVE = 1e-10

DIAGRAMS = {
    "uniform moment": (np.array([0.0, L]), np.array([1e4, 1e4]), None),
    "end moments, psi = -1": (np.array([0.0, L]), np.array([1e4, -1e4]), None),
    "end moments, psi = -0.5, negative": (np.array([0.0, L]), np.array([-1e4, 5e3]), None),
    "udl": (X, 4e3 * X * (L - X), [{"kind": "uniform", "q": 8e3}]),
    "udl, hogging": (X, -4e3 * X * (L - X), [{"kind": "uniform", "q": 8e3}]),
    "central point load": (X, 1e4 * np.minimum(X, L - X), [{"kind": "point", "F": 2e4, "x": L / 2}]),
    "point load off centre": (
        X,
        np.where(X < 2.0, X * (L - 2.0) / L, 2.0 * (L - X) / L) * 2e4,
        [{"kind": "point", "F": 2e4, "x": 2.0}],
    ),
}


def _matrices(
    x, m, loads, height, N, scale_axial, count, restraints=None, ends=(("fork", "fork"), ("free", "free"))
):
    """Reduced K and G of the problem on ``count`` elements, as critical_moment assembles them."""
    problem = mcr._problem(x, m, EI_Z, GI_T, EI_W, L, N, I0, height, loads, *ends, None)._held_by(restraints)
    nodes = problem.mesh(count)
    K, G, _ = problem.reduced(nodes, problem.props, scale_axial)
    return K, G


def _reference(K, G) -> float:
    """The reference: the smallest positive λ of K x = λ G x by scipy.linalg.eigh (inf when none)."""
    mu = scipy.linalg.eigh(G, K, eigvals_only=True)
    return 1.0 / mu[-1] if mu[-1] > 1e-12 * np.max(np.abs(mu)) else math.inf


def _solve_pair(K8, G8, K16, G16):
    """The coarse λ by the route before and the fine one from it, as critical_moment solves a mesh pair."""
    coarse, _ = mcr_fe._eigen(K8, G8)
    return mcr_fe._eigen(K16, G16, coarse)


def _check(K, G, lam, aux):
    reference = _reference(K, G)
    if math.isinf(reference):
        assert math.isinf(lam)
        return
    tolerance = RELATIVE
    if aux.ndim == 1:  # both routes are exact to about eps times the mode's sensitivity (mcr_fe's notes)
        g = float(aux @ (G @ aux))
        sensitivity = mcr_fe._sensitivity((np.abs(K), np.abs(G)), aux, lam, g)
        tolerance = max(RELATIVE, 4.0 * np.finfo(float).eps * sensitivity)
    assert lam == pytest.approx(reference, rel=tolerance)
    if aux.ndim == 1:  # the certified route's mode (the route before's is tested in test_mcr.py)
        mode = mcr_fe._eigenvector(K, G, lam, aux)
        residual = K @ mode - lam * (G @ mode)
        assert np.max(np.abs(residual)) < 1e-8 * np.max(np.abs(K @ mode))


@pytest.mark.parametrize("name", sorted(DIAGRAMS))
@pytest.mark.parametrize("height", [0.0, 0.15, -0.15])
@pytest.mark.parametrize(("fraction", "scale_axial"), [(0.0, True), (0.5, False), (0.9, True), (-1.0, False)])
def test_the_route_equals_the_reference(name, height, fraction, scale_axial):
    """λ of the fine mesh (from the coarse mesh's λ) equals scipy's to 1e-10 and its mode solves K x = λ G x;
    a well-conditioned problem (no N, or N scaled with the moment) takes the certified route."""
    x, m, loads = DIAGRAMS[name]
    args = (x, m, loads, height, fraction * N_Z, scale_axial)
    K16, G16 = _matrices(*args, 16)
    lam, aux = _solve_pair(*_matrices(*args, 8), K16, G16)
    _check(K16, G16, lam, aux)
    if fraction == 0.0:
        assert aux.ndim == 1  # the certified route: its mode, not L⁻¹


@settings(max_examples=40, deadline=None)
@given(
    left=st.floats(-1.0, 1.0),
    right=st.floats(-1.0, 1.0),
    q=st.floats(0.0, 1.0),
    height=st.floats(-0.3, 0.3),
    fraction=st.floats(-2.0, 0.98),
    scale_axial=st.booleans(),
    point=st.floats(0.05, 0.95),
)
def test_drawn_problems_equal_the_reference(left, right, q, height, fraction, scale_axial, point):
    """End moments, a UDL and a point load of drawn sizes, heights and held or scaled axial force (tension to
    0.98 N_cr,z): whichever route solves it, λ and the mode agree with scipy to 1e-10, or to 4·eps times the
    mode's sensitivity where that is larger (an ill-conditioned problem: scipy rounds by as much)."""
    xp = point * L
    m = (
        1e4 * (left + (right - left) * X / L)
        + 4e3 * q * X * (L - X)
        + 1e4 * q * np.where(X < xp, X * (L - xp) / L, xp * (L - X) / L)
    )
    loads = [{"kind": "uniform", "q": 8e3 * q}, {"kind": "point", "F": 1e4 * q, "x": xp}]
    if not np.any(m):
        m = m + 1.0
    args = (X, m, loads, height, fraction * N_Z, scale_axial)
    try:
        K16, G16 = _matrices(*args, 16)
        lam, aux = _solve_pair(*_matrices(*args, 8), K16, G16)
    except ValueError:  # K not positive definite: the same refusal as the route before
        return
    _check(K16, G16, lam, aux)


def test_restraints_and_a_cantilever_equal_the_reference():
    """Intermediate restraints (a brace, springs) and a cantilever with warping held, by the route."""
    cases = [
        ([{"x": 2.0, "lateral": "fixed"}, {"x": 4.0, "twist": 3.0e5}], (("fork", "fork"), ("free", "free"))),
        ([{"x": 3.0, "lateral": 5.0e5, "lateral_rotation": 2.0e4}], (("fork", "fork"), ("fixed", "free"))),
        (None, (("fixed", "free"), ("fixed", "free"))),
    ]
    x, m, loads = DIAGRAMS["udl"]
    for restraints, ends in cases:
        args = (x, m, loads, 0.1, 0.0, True)
        K16, G16 = _matrices(*args, 16, restraints, ends)
        lam, aux = _solve_pair(*_matrices(*args, 8, restraints, ends), K16, G16)
        _check(K16, G16, lam, aux)


def test_critical_moment_equals_the_route_before_to_rounding():
    """critical_moment's fine-mesh λ with the certified route against the route before on the same K and G
    (no estimate): equal to rounding (both are exact to ~2.2e-16 times the mode's sensitivity, ≤ 1e5)."""
    for x, m, loads in DIAGRAMS.values():
        for height in (0.0, 0.15, -0.15):
            result = mcr.critical_moment(
                x, m, EI_z=EI_Z, GI_t=GI_T, EI_w=EI_W, length=L, loads=loads, load_height=height
            )
            K, G = _matrices(x, m, loads, height, 0.0, True, result.elements)
            before, _ = mcr_fe._eigen(K, G)
            assert result.alpha_meshes[-1] == pytest.approx(before, rel=5e-11)


def test_a_failed_certificate_takes_the_route_before(monkeypatch):
    """With the certificate forced to fail, _eigen returns the route before's λ (bit for bit) and L⁻¹."""
    x, m, loads = DIAGRAMS["udl"]
    K8, G8 = _matrices(x, m, loads, 0.1, 0.0, True, 8)
    K16, G16 = _matrices(x, m, loads, 0.1, 0.0, True, 16)
    coarse, _ = mcr_fe._eigen(K8, G8)
    assert mcr_fe._eigen(K16, G16, coarse)[1].ndim == 1  # certified when left alone
    calls = []

    def failing(*args):
        calls.append(args)
        return False

    monkeypatch.setattr(mcr_fe, "_certify", failing)
    lam, aux = mcr_fe._eigen(K16, G16, coarse)
    before, inv = mcr_fe._eigen(K16, G16)
    assert calls
    assert aux.ndim == 2
    assert lam == before
    assert np.array_equal(aux, inv)


def test_an_iteration_caught_on_another_eigenvalue_is_not_certified():
    """An estimate at the second positive λ: the iteration converges there, the Cholesky factorisation of
    K − ρ(1 − ε)G fails (λ₁ lies below), and the route before gives λ₁."""
    x, m, loads = DIAGRAMS["uniform moment"]
    K, G = _matrices(x, m, loads, 0.0, 0.0, True, 16)
    mu = scipy.linalg.eigh(G, K, eigvals_only=True)
    second = 1.0 / mu[-2]
    assert mcr_fe._certified(K, G, second) is None
    lam, aux = mcr_fe._eigen(K, G, second)
    assert aux.ndim == 2
    assert lam == mcr_fe._eigen(K, G)[0]
    assert lam == pytest.approx(1.0 / mu[-1], rel=RELATIVE)


def test_no_positive_eigenvalue_and_a_stiffness_not_positive_definite_as_before():
    """Tension without moment: inf (no positive λ), as before, whatever the estimate; N held above N_cr,z:
    the same refusal."""
    x = np.array([0.0, L])
    K, G = _matrices(x, np.zeros(2), None, 0.0, -1e3, True, 16)
    assert math.isinf(mcr_fe._eigen(K, G, 1.0)[0])
    K, G = _matrices(x, np.array([1e4, 1e4]), None, 0.0, 1.01 * N_Z, False, 16)
    with pytest.raises(ValueError, match="not positive definite"):
        mcr_fe._eigen(K, G, 1.0)


def test_a_mode_sensitive_to_rounding_takes_the_route_before():
    """N held at 0.999 N_cr,z: the mode's sensitivity is far above the limit, so the numbers are the route
    before's, bit for bit."""
    x, m, loads = DIAGRAMS["uniform moment"]
    K8, G8 = _matrices(x, m, loads, 0.0, 0.999 * N_Z, False, 8)
    K16, G16 = _matrices(x, m, loads, 0.0, 0.999 * N_Z, False, 16)
    lam, aux = _solve_pair(K8, G8, K16, G16)
    assert aux.ndim == 2
    assert lam == mcr_fe._eigen(K16, G16)[0]
    _check(K16, G16, lam, aux)
