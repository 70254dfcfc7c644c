"""The finite elements of :mod:`engine.design.mcr`: Hermite cubic shape functions, the element integrals of
the energy of lateral-torsional buckling, their assembly into K and G, the held DOFs (end conditions and
intermediate restraints) and the generalised eigenproblem K x = λ G x. See :mod:`engine.design.mcr` for the
energy and the method; everything here works on one mesh.
"""

from __future__ import annotations

import functools
import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

__all__ = ["clear_cache", "eigen_solution"]

# Gauss–Legendre points and weights on [0, 1], 4 points: exact to degree 7.
_GP, _GW = np.polynomial.legendre.leggauss(4)
_GP = 0.5 * (_GP + 1.0)
_GW = 0.5 * _GW


def _hermite(h: np.ndarray, xi: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Hermite shape functions and their first and second x-derivatives, shape (elements, points, 4)."""
    h = h[:, None]
    xi = xi[None, :]
    one = np.ones_like(h * xi)
    n = np.stack(
        [
            1 - 3 * xi**2 + 2 * xi**3 + 0 * h,
            h * (xi - 2 * xi**2 + xi**3),
            3 * xi**2 - 2 * xi**3 + 0 * h,
            h * (xi**3 - xi**2),
        ],
        -1,
    )
    d1 = np.stack(
        [
            (-6 * xi + 6 * xi**2) / h,
            (1 - 4 * xi + 3 * xi**2) * one,
            (6 * xi - 6 * xi**2) / h,
            (3 * xi**2 - 2 * xi) * one,
        ],
        -1,
    )
    d2 = np.stack([(-6 + 12 * xi) / h**2, (-4 + 6 * xi) / h, (6 - 12 * xi) / h**2, (6 * xi - 2) / h], -1)
    return n, d1, d2


def _mesh(length: float, elements: int, breaks: Sequence[float]) -> np.ndarray:
    """Nodes of ``elements`` equal elements, with the break points (point loads, load ends) added."""
    nodes = np.linspace(0.0, length, elements + 1)
    extra = [b for b in breaks if 0.0 < b < length and np.min(np.abs(nodes - b)) > 1e-9 * length]
    return np.unique(np.concatenate([nodes, extra])) if extra else nodes


_IV = np.array([0, 1, 4, 5])  # the v DOFs of an element: v, v' at both nodes
_IP = np.array([2, 3, 6, 7])  # the φ DOFs


@dataclass(frozen=True)
class _Elements:
    """The per-element integrals of one mesh that do not depend on N, and where they assemble."""

    kvv: np.ndarray  # EI_z ∫ v''², (elements, 4, 4)
    kpp: np.ndarray  # GI_t ∫ φ'² + EI_w ∫ φ''²
    slope: np.ndarray  # ∫ a' b': times N for v, times N i0² for φ
    gpq: np.ndarray  # ∫ q a φ²
    gpv: np.ndarray  # −∫ M φ v''
    rows: np.ndarray
    cols: np.ndarray
    size: int
    quadrature: tuple  # (points, weights, shape functions, their second derivatives): for −∫ M φ v'' again


def _integral(w, f, a, b):
    """∫ f a_i b_j dx per element, (elements, 4, 4), by the quadrature weights ``w``."""
    return np.einsum("eg,egi,egj->eij", w * f, a, b)


def _elements(nodes, m_at, props, uniform) -> _Elements:
    EI_z, GI_t, EI_w = props[:3]
    h = np.diff(nodes)
    ne = h.size
    n, d1, d2 = _hermite(h, _GP)
    xg = nodes[:-1, None] + h[:, None] * _GP[None, :]
    w = h[:, None] * _GW[None, :]  # quadrature weights in x, (elements, points)
    m = m_at(xg)
    aq = np.zeros_like(xg)
    for value, start, end, a in uniform:
        aq += np.where((xg >= start) & (xg <= end), value * a, 0.0)
    one = np.ones_like(xg)
    dofs = 4 * np.arange(ne)[:, None] + np.arange(8)[None, :]
    return _Elements(
        kvv=EI_z * _integral(w, one, d2, d2),
        kpp=GI_t * _integral(w, one, d1, d1) + EI_w * _integral(w, one, d2, d2),
        slope=_integral(w, one, d1, d1),
        gpq=_integral(w, aq, n, n),
        gpv=-_integral(w, m, n, d2),
        rows=np.broadcast_to(dofs[:, :, None], (ne, 8, 8)),
        cols=np.broadcast_to(dofs[:, None, :], (ne, 8, 8)),
        size=4 * (ne + 1),
        quadrature=(xg, w, n, d2),
    )


def _assemble(parts: _Elements, blocks) -> np.ndarray:
    """The global matrix of the element blocks ``((dofs_rows, dofs_cols, block), ...)``."""
    e = np.zeros((parts.kvv.shape[0], 8, 8))
    for rows, cols, block in blocks:
        e[:, rows[:, None], cols] = block
    out = np.zeros((parts.size, parts.size))
    np.add.at(out, (parts.rows, parts.cols), e)
    return out


def _stiffness(parts: _Elements, N: float, i0_sq: float, scale_axial: bool) -> np.ndarray:
    """K: with N held it softens the stiffness; when N grows with the load factor it is in G instead."""
    if scale_axial:
        return _assemble(parts, ((_IV, _IV, parts.kvv), (_IP, _IP, parts.kpp)))
    gvv = N * parts.slope  # N v'²
    gpn = N * i0_sq * parts.slope  # N i0² φ'²
    return _assemble(parts, ((_IV, _IV, parts.kvv - gvv), (_IP, _IP, parts.kpp - gpn)))


def _geometric(parts: _Elements, nodes, N: float, i0_sq: float, point, scale_axial: bool) -> np.ndarray:
    """G: the moment's coupling, the loads' height and (``scale_axial``) the axial force."""
    coupling = ((_IP, _IV, parts.gpv), (_IV, _IP, np.swapaxes(parts.gpv, 1, 2)))
    if scale_axial:  # N grows with the load factor
        gvv = N * parts.slope
        gpn = N * i0_sq * parts.slope
        G = _assemble(parts, ((_IV, _IV, gvv), (_IP, _IP, gpn + parts.gpq), *coupling))
    else:
        G = _assemble(parts, ((_IP, _IP, parts.gpq), *coupling))
    for force, x, a in point:
        node = int(np.argmin(np.abs(nodes - x)))
        G[4 * node + 2, 4 * node + 2] += force * a
    return G


def _matrices(nodes, m_at, props, uniform, point, scale_axial):
    """Assembled K and G (all 4·(n+1) DOFs: v, v', φ, φ' per node)."""
    N, i0_sq = props[3], props[4]
    parts = _elements(nodes, m_at, props, uniform)
    return _stiffness(parts, N, i0_sq, scale_axial), _geometric(parts, nodes, N, i0_sq, point, scale_axial)


@functools.lru_cache(maxsize=64)
def _free_dofs(nodes_count: int, lateral_ends, warping_ends, held_inside=()) -> np.ndarray:
    """The DOFs held neither by the end conditions nor by ``held_inside`` (cached; the array is read-only)."""
    held = set(held_inside)
    for end, node in (0, 0), (1, nodes_count - 1):
        if lateral_ends[end] == "free":  # a cantilever's tip: nothing held
            continue
        held.update({4 * node, 4 * node + 2})  # v = 0, φ = 0: a fork at each support
        if lateral_ends[end] == "fixed":
            held.add(4 * node + 1)
        if warping_ends[end] == "fixed":
            held.add(4 * node + 3)
    free = np.array([i for i in range(4 * nodes_count) if i not in held])
    free.flags.writeable = False
    return free


def clear_cache() -> None:
    """Forget the cached free DOFs (:func:`_free_dofs`)."""
    _free_dofs.cache_clear()


def _held_inside(nodes, inside) -> tuple[tuple, tuple]:
    """The DOFs the intermediate restraints ``inside`` hold on this mesh, and their springs as (DOF, k)."""
    held, springs = [], []
    for x, dofs in inside:
        node = int(np.argmin(np.abs(nodes - x)))
        for offset, value in dofs.items():
            if value == "fixed":
                held.append(4 * node + offset)
            else:  # a spring at the shear centre: ½ k v² (or ½ k_r v'², ½ k_φ φ²) joins the strain energy
                springs.append((4 * node + offset, value))
    return tuple(held), tuple(springs)


def _with_springs(K: np.ndarray, springs) -> np.ndarray:
    """K (all DOFs) with the restraints' springs added on its diagonal, in place."""
    for dof, k in springs:
        K[dof, dof] += k
    return K


def eigen_solution(K: np.ndarray, G: np.ndarray, *, vector: bool = True) -> tuple[float, np.ndarray]:
    """The smallest positive λ of K x = λ G x (K symmetric positive definite) and, if asked, its vector.

    The values come from the symmetric problem reduced by the Cholesky factor of K
    (``numpy.linalg.eigvalsh``); the vector from a few steps of inverse iteration shifted just below λ.
    Returns (inf, zeros) when G has no positive direction: the member does not buckle under these loads.
    """
    lam = _eigenvalue(K, G)
    if not vector or not math.isfinite(lam):
        return lam, np.zeros(K.shape[0])
    return lam, _eigenvector(K, G, lam)


def _eigenvalue(K: np.ndarray, G: np.ndarray) -> float:
    """λ of :func:`eigen_solution` alone (inf when G has no positive direction)."""
    try:
        chol = np.linalg.cholesky(K)
    except np.linalg.LinAlgError as error:
        raise ValueError(
            "the elastic stiffness is not positive definite (N held fixed above N_cr?)"
        ) from error
    inv = np.linalg.inv(chol)
    a = inv @ G @ inv.T
    mu = np.linalg.eigvalsh(0.5 * (a + a.T))
    if not mu[-1] > 1e-12 * float(np.max(np.abs(mu))):
        return math.inf
    lam = 1.0 / float(mu[-1])
    return lam if math.isfinite(lam) else math.inf


def _eigenvector(K: np.ndarray, G: np.ndarray, lam: float) -> np.ndarray:
    """The mode of the finite λ of :func:`eigen_solution`, by inverse iteration shifted just below it."""
    shifted = K - lam * (1.0 - 1e-6) * G
    x = np.linalg.solve(K, np.sum(np.abs(G), axis=1) + 1.0)  # a start with every DOF present
    for _ in range(4):
        x = np.linalg.solve(shifted, G @ x)
        x /= np.max(np.abs(x))
    return x


def _mode(nodes, K, G, free, lam) -> np.ndarray:
    """The mode (nodes, 4) of λ on the free DOFs ``free`` of K and G: zeros when λ is not finite."""
    full = np.zeros(4 * nodes.size)
    if math.isfinite(lam):
        full[free] = _eigenvector(K, G, lam)
    return full.reshape(-1, 4)


def _reduced(nodes, m_at, props, uniform, point, scale_axial, lateral_ends, warping_ends, inside=()):
    """K and G on the free DOFs, and those DOFs."""
    K, G = _matrices(nodes, m_at, props, uniform, point, scale_axial)
    held, springs = _held_inside(nodes, inside)
    _with_springs(K, springs)
    free = _free_dofs(nodes.size, lateral_ends, warping_ends, held)
    return K[np.ix_(free, free)], G[np.ix_(free, free)], free
