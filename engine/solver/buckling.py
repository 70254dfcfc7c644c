r"""Elastic critical loads and buckling modes of one member, springs included.

The critical loads are the roots of the exact characteristic equation :math:`\det D(\lambda) = 0`, where
:math:`\lambda = L\sqrt{P/EI}` and :math:`D` holds the four end conditions applied to the homogeneous solution
:math:`1, \xi, \varphi_2, \varphi_3` (:mod:`engine.solver.functions`). No root is missed: the number of
critical loads below any trial :math:`\lambda` is counted exactly by the Wittrick–Williams algorithm
(W. H. Wittrick and F. W. Williams, *A general algorithm for computing natural frequencies of elastic
structures*, Q. J. Mech. Appl. Math. 24 (1971) 263–284, and its buckling form, Williams & Wittrick, Int. J.
Mech. Sci. 12 (1970)),

.. math::

    J(\lambda) = J_0(\lambda) + s\{K(\lambda)\},

with :math:`s\{K\}` the number of negative eigenvalues of the member's exact end stiffness matrix (springs
added, fixed freedoms removed) and :math:`J_0` the number of clamped–clamped critical loads below
:math:`\lambda` (:math:`\lambda = 2\pi n` and :math:`\lambda = 2\mu`, :math:`\tan\mu = \mu`). Each counted
root is then polished by Brent's method on the determinant.

Everything is computed on the member made dimensionless (:math:`L = EI = 1`) and cached per support set.
Units: loads [N], lengths [m], EI [N·m²], λ and the mode shapes dimensionless.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, field

import numpy as np

from engine.roots import brentq
from engine.solver.functions import phi
from engine.solver.supports import boundary_rows

__all__ = ["Buckling", "critical_loads", "clear_cache"]

#: Every stable support set has its fifth root below the clamped–clamped one, 6π (constraint theorem,
#: Rayleigh). The scan covers this many roots at least, up to this bound of λ.
_MAX_COUNT = 12


@dataclass(frozen=True, kw_only=True)
class Buckling:
    """The elastic critical loads and modes of one member.

    Attributes
    ----------
    critical_loads : ndarray
        Ascending elastic critical compressive loads [N].
    wavenumbers : ndarray
        :math:`\\lambda_n = L\\sqrt{P_{cr,n}/EI}` [-].
    effective_length_factor : float
        :math:`K = \\pi / \\lambda_1` [-], so that :math:`P_{cr,1} = \\pi^2 EI/(K L)^2`.
    length : float
        Member length [m].
    """

    critical_loads: np.ndarray
    wavenumbers: np.ndarray
    effective_length_factor: float
    length: float
    _coefficients: np.ndarray = field(repr=False)  # (count, 4) in the basis 1, ξ, φ2, φ3 (ξ = x/L)

    def mode_shapes(self, x) -> np.ndarray:
        """The normalised mode shapes at ``x`` [m]: shape (count, len(x)), largest value +1 [-]."""
        xi = np.asarray(x, dtype=float) / self.length
        return np.stack(
            [_mode_value(lam, c, xi) for lam, c in zip(self.wavenumbers, self._coefficients, strict=True)]
        )

    def mode_derivatives(self, n: int, x):
        """Mode ``n`` (0-based) and its first three x-derivatives at ``x`` [m]: [-], [1/m], [1/m²], [1/m³]."""
        lam, c = self.wavenumbers[n], self._coefficients[n]
        xi = np.asarray(x, dtype=float) / self.length
        p0, p1, p2, p3 = phi(lam * lam, xi)
        L = self.length
        w = c[0] + c[1] * xi + c[2] * p2 + c[3] * p3
        d1 = (c[1] + c[2] * p1 + c[3] * p2) / L
        d2 = (c[2] * p0 + c[3] * p1) / L**2
        d3 = (-lam * lam * c[2] * p1 + c[3] * p0) / L**3
        return w, d1, d2, d3


def _mode_value(lam, c, xi):
    p = phi(lam * lam, xi)
    return c[0] + c[1] * xi + c[2] * p[2] + c[3] * p[3]


def _end_states(lam: np.ndarray):
    """State rows (w, w', M, T) of the basis 1, ξ, φ2, φ3 at ξ = 0 and 1, dimensionless: (n, 4, 4) each."""
    lam = np.asarray(lam, dtype=float)
    s = lam * lam
    n = lam.shape[0]
    s0 = np.zeros((n, 4, 4))
    s0[:, 0, 0] = 1.0
    s0[:, 1, 1] = 1.0
    s0[:, 2, 2] = -1.0
    s0[:, 3, 1] = -s
    s0[:, 3, 3] = -1.0
    p0, p1, p2, p3 = phi(s, np.ones(n))
    s1 = np.zeros((n, 4, 4))
    s1[:, 0, :] = np.stack([np.ones(n), np.ones(n), p2, p3], axis=-1)
    s1[:, 1, :] = np.stack([np.zeros(n), np.ones(n), p1, p2], axis=-1)
    s1[:, 2, 2] = -p0
    s1[:, 2, 3] = -p1
    s1[:, 3, 1] = -s
    s1[:, 3, 3] = -1.0
    return s0, s1


def _dimensionless_rows(support, side, EI, L):
    rows = boundary_rows(support, side) * np.array([L**3 / EI, L**2 / EI, L, 1.0])
    return rows / np.abs(rows).max(axis=1, keepdims=True)


@functools.lru_cache(maxsize=64)
def _clamped_roots(limit: float) -> np.ndarray:
    """The clamped–clamped roots λ below ``limit``: 2πn and 2μ with tan μ = μ (derived)."""
    roots = [2 * math.pi * n for n in range(1, int(limit / (2 * math.pi)) + 2)]
    m = 1
    while 2 * m * math.pi < limit + 2 * math.pi:
        mu = brentq(
            lambda t: math.sin(t) - t * math.cos(t),
            m * math.pi + 1e-9,
            m * math.pi + math.pi / 2 - 1e-12,
            xtol=1e-15,
        )
        roots.append(2 * mu)
        m += 1
    return np.sort(np.array(roots))


def _negative_count(K: np.ndarray) -> np.ndarray:
    """Number of negative eigenvalues of each symmetric matrix in a stack, by LDLᵀ with diagonal pivoting.

    Pivoting on the largest remaining diagonal eliminates stiff springs first, so their size does not spoil
    the signs of the soft freedoms (Sylvester's law of inertia).
    """
    A = np.array(K, dtype=float, copy=True)
    n, m, _ = A.shape
    neg = np.zeros(n, dtype=int)
    active = np.ones((n, m), dtype=bool)
    rows = np.arange(n)
    for _ in range(m):
        diag = np.where(active, np.abs(np.diagonal(A, axis1=1, axis2=2)), -1.0)
        p = np.argmax(diag, axis=1)
        d = A[rows, p, p]
        neg += d < 0
        d = np.where(d == 0.0, 1e-300, d)
        col = A[rows, :, p] * active
        A -= col[:, :, None] * col[:, None, :] / d[:, None, None]
        active[rows, p] = False
    return neg


class _Characteristic:
    """The dimensionless characteristic equation and eigenvalue count of one support set."""

    def __init__(self, left, right, EI, L):
        self.rl = _dimensionless_rows(left, "left", EI, L)
        self.rr = _dimensionless_rows(right, "right", EI, L)
        springs = []
        keep = []
        for support, base in ((left, 0), (right, 2)):
            for j, value in enumerate((support.translation, support.rotation)):
                if value == "fixed":
                    continue
                keep.append(base + j)
                stiff = 0.0 if value == "free" else float(value) * (L**3 / EI if j == 0 else L / EI)
                springs.append(stiff)
        self.keep = np.array(keep, dtype=int)
        self.springs = np.array(springs)

    def matrix(self, lam):
        s0, s1 = _end_states(np.atleast_1d(lam))
        return np.concatenate([self.rl @ s0, self.rr @ s1], axis=1)

    def det(self, lam: float) -> float:
        return float(np.linalg.det(self.matrix(lam))[0])

    def count(self, lam: np.ndarray) -> np.ndarray:
        """Number of critical loads with λ_n < lam (Wittrick–Williams)."""
        lam = np.atleast_1d(np.asarray(lam, dtype=float))
        j0 = np.searchsorted(_clamped_roots(float(lam.max()) + 1.0), lam)
        if self.keep.size == 0:
            return j0
        s0, s1 = _end_states(lam)
        disp = np.stack([s0[:, 0], s0[:, 1], s1[:, 0], s1[:, 1]], axis=1)
        force = np.stack([-s0[:, 3], s0[:, 2], s1[:, 3], -s1[:, 2]], axis=1)
        # K = F D^-1, so K^T = D^-T F^T.
        K = np.swapaxes(np.linalg.solve(np.swapaxes(disp, 1, 2), np.swapaxes(force, 1, 2)), 1, 2)
        K = 0.5 * (K + np.swapaxes(K, 1, 2))
        Kr = K[:, self.keep][:, :, self.keep] + np.diag(self.springs)
        return j0 + _negative_count(Kr)


def _polish(ch: _Characteristic, lo: float, hi: float, n: int) -> float:
    """The n-th root (1-based) inside [lo, hi], where count(lo) < n <= count(hi)."""
    for _ in range(200):
        if ch.count(np.array([lo]))[0] == n - 1 and ch.count(np.array([hi]))[0] == n:
            f_lo, f_hi = ch.det(lo), ch.det(hi)
            if f_lo == 0.0:
                return lo
            if f_hi == 0.0:
                return hi
            if np.sign(f_lo) != np.sign(f_hi):
                return brentq(ch.det, lo, hi, xtol=1e-15 * max(hi, 1e-300), rtol=4 * np.finfo(float).eps)
        if hi - lo <= 4 * np.finfo(float).eps * hi:
            return 0.5 * (lo + hi)
        mid = 0.5 * (lo + hi)
        if ch.count(np.array([mid]))[0] >= n:
            hi = mid
        else:
            lo = mid
    return 0.5 * (lo + hi)  # pragma: no cover - bisection always converges first


def _null_vector(ch: _Characteristic, lam: float) -> np.ndarray:
    _, _, vt = np.linalg.svd(ch.matrix(lam)[0])
    return vt[-1]


def _refined_extreme(lam: float, c: np.ndarray, xi: np.ndarray, w: np.ndarray, i: int) -> float:
    """The mode's value at the extreme nearest sample i (Newton on the slope for an interior one)."""
    x0 = xi[i]
    if 0 < i < xi.size - 1:
        for _ in range(8):
            p0, p1, p2, _ = phi(lam * lam, x0)
            slope = c[1] + c[2] * p1 + c[3] * p2
            curv = c[2] * p0 + c[3] * p1
            if curv == 0:
                break
            x0 = float(np.clip(x0 - slope / curv, xi[i - 1], xi[i + 1]))
    value = float(_mode_value(lam, c, np.array([x0]))[0])
    return value if abs(value) >= abs(w[i]) else float(w[i])


def _normalise(lam: float, c: np.ndarray) -> np.ndarray:
    """Scale mode coefficients so the largest |mode| over the member is 1 and that extreme is positive.

    Where two extremes are equally large (equal springs at both ends make them equal and opposite), the one
    nearest the left end is made positive, so that rounding never decides the direction of a mode or a bow.
    """
    xi = np.linspace(0.0, 1.0, 2001)
    w = _mode_value(lam, c, xi)
    mag = np.abs(w)
    top = mag.max()
    # Local maxima of |w| (ends included) within a sampling margin of the largest; refine each.
    interior = (mag[1:-1] >= mag[:-2]) & (mag[1:-1] >= mag[2:])
    local = np.concatenate([[mag[0] >= mag[1]], interior, [mag[-1] >= mag[-2]]])
    candidates = np.nonzero(local & (mag >= (1 - 1e-4) * top))[0]
    values = [_refined_extreme(lam, c, xi, w, int(i)) for i in candidates]
    largest = max(abs(v) for v in values)
    for v in values:  # left to right
        if abs(v) >= (1 - 1e-9) * largest:
            return c / (abs(v) if v > 0 else -abs(v)) if v != 0 else c
    return c / values[0]  # pragma: no cover - the loop always returns


@functools.lru_cache(maxsize=256)
def _dimensionless(left, right, EI, L, count):
    ch = _Characteristic(left, right, EI, L)
    limit = (count + 1) * math.pi + 1.0  # λ_n <= λ_n(clamped-clamped) <= (n + 1) π
    grid = np.concatenate([np.geomspace(1e-7, 0.05, 40), np.arange(0.05, limit, 0.05) + 0.0123])
    counts = ch.count(grid)
    if counts[-1] < count:  # pragma: no cover - guaranteed by the constraint theorem
        raise RuntimeError("critical-load scan found too few roots")
    lams = []
    for n in range(1, count + 1):
        i = int(np.searchsorted(counts, n))  # first grid point with count >= n
        lo = grid[i - 1] if i > 0 else 0.0
        lams.append(_polish(ch, lo, grid[i], n))
    lams = np.array(lams)
    coefs = np.stack([_normalise(lam, _null_vector(ch, lam)) for lam in lams])
    return lams, coefs


def _scaled(support, EI, L):
    """The end support with its springs made dimensionless (k_t L³/EI, k_r L/EI)."""
    t, r = support.translation, support.rotation
    if isinstance(t, str) and isinstance(r, str):
        return support
    return type(support)(
        translation=t if isinstance(t, str) else float(t) * L**3 / EI,
        rotation=r if isinstance(r, str) else float(r) * L / EI,
    )


def critical_loads(case, count: int = 5) -> Buckling:
    """The first elastic critical compressive loads and modes of the member in ``case``.

    Parameters
    ----------
    case : Case
        Only the length, EI and supports are used; EI must be given (the analysed member). For a case whose
        EI comes from its section and material, or has a stiffness factor, use
        :func:`engine.member.critical_loads` (``engine.critical_loads``).
    count : int
        How many critical loads, 1 to 12.

    Returns
    -------
    Buckling
        Critical loads [N] (ascending), mode shapes and the effective length factor.

    Examples
    --------
    >>> from engine.case import Case, EndSupport
    >>> pinned = EndSupport.named("pinned")
    >>> b = critical_loads(Case(length=2.0, EI=1.0, left=pinned, right=pinned), count=2)
    >>> [round(float(p / (3.141592653589793**2 / 4)), 9) for p in b.critical_loads]
    [1.0, 4.0]
    """
    if not 1 <= count <= _MAX_COUNT:
        raise ValueError(f"count: {count} must be between 1 and {_MAX_COUNT}")
    if case.EI is None:
        raise ValueError(
            "case.EI: the solver needs EI; engine.member.critical_loads finds it from the section"
        )
    EI, L = float(case.EI), float(case.length)
    # The dimensionless problem depends only on the springs made dimensionless, so one search serves every
    # member with the same end conditions (a batch of pinned struts searches once).
    lams, coefs = _dimensionless(_scaled(case.left, EI, L), _scaled(case.right, EI, L), 1.0, 1.0, int(count))
    return Buckling(
        critical_loads=lams**2 * case.EI / L**2,
        wavenumbers=lams.copy(),
        effective_length_factor=float(math.pi / lams[0]),
        length=L,
        _coefficients=coefs,
    )


def clear_cache() -> None:
    """Forget cached critical loads (for benchmarks of the uncached path)."""
    _dimensionless.cache_clear()
