r"""Critical loads and modes of a member with intermediate restraints, hinges or steps in EI.

The member is a chain of segments (cut at every restraint and step). The critical loads are counted exactly
by the Wittrick–Williams algorithm (W. H. Wittrick and F. W. Williams, Q. J. Mech. Appl. Math. 24 (1971)
263–284; the buckling form, Williams & Wittrick, Int. J. Mech. Sci. 12 (1970)):

.. math::

    J(P) = \sum_j J_{0,j}(P) + s\{K(P)\},

where :math:`J_{0,j}` counts the clamped–clamped critical loads of segment j below P (its
:math:`\lambda_j = h_j\sqrt{P/EI_j}` against :math:`2\pi n` and :math:`2\mu`, :math:`\tan\mu = \mu`), and
:math:`s\{K\}` is the number of negative eigenvalues of the exact global stiffness matrix: the segments' exact
end stiffnesses (the stability functions, from the same basis as :mod:`engine.solver.buckling`) assembled on
the node freedoms w and θ (two rotations at a hinge), springs added, fixed freedoms removed. J is monotone in
P, so each critical load is found by bisection on the count to a relative 1e-14; none is missed.

Each mode is the null vector of the global system of :mod:`engine.solver.batch` (end, continuity and
restraint conditions on the segments' exact basis, no loads) at its critical load, which has no poles.
Units: loads [N], lengths [m], EI [N·m²].
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, field, replace

import numpy as np

from engine.roots import brentq
from engine.solver import buckling as uniform
from engine.solver import foundation
from engine.solver.batch import Batch
from engine.solver.model import Model, Points

__all__ = ["SegmentedBuckling", "critical_loads", "needs_segments"]


def needs_segments(case) -> bool:
    """Whether the case has intermediate restraints (of its first plane) or steps in EI."""
    return (
        bool(getattr(case, "steps", ()))
        or any(r.plane != "second" for r in getattr(case, "restraints", ()))
        or any(f.plane != "second" for f in getattr(case, "foundation", ()))
    )


@dataclass(frozen=True, kw_only=True)
class SegmentedBuckling:
    """The elastic critical loads and modes of a member with restraints or steps (the interface of
    :class:`engine.solver.buckling.Buckling`).

    Attributes
    ----------
    critical_loads : ndarray
        Ascending elastic critical compressive loads [N].
    wavenumbers : ndarray
        :math:`L\\sqrt{P_{cr,n}/EI}` with the case's EI (of the first segment) [-].
    effective_length_factor : float
        :math:`K = \\pi/\\lambda_1`, relative to the whole length and the case's EI [-].
    length : float
        Member length [m].
    segment_starts, segment_EI : ndarray
        Where each segment of the model starts [m] and its EI [N·m²].
    """

    critical_loads: np.ndarray
    wavenumbers: np.ndarray
    effective_length_factor: float
    length: float
    segment_starts: np.ndarray
    segment_EI: np.ndarray
    _model: object = field(repr=False)
    _coefficients: np.ndarray = field(repr=False)  # (count, nseg, 4) in the model's basis
    _scale: np.ndarray = field(repr=False)  # (count,): divides each mode to max |w| = 1

    def effective_lengths(self, n: int = 0) -> np.ndarray:
        """L_cr = π √(EI_j / N_cr,n) of every segment for mode ``n`` (0-based) [m]."""
        return math.pi * np.sqrt(self.segment_EI / self.critical_loads[n])

    def moment_peak(self, n: int = 0) -> float:
        r"""max |M| of mode ``n`` along the member (the mode normalised to max|w| = 1), i.e. the largest
        :math:`EI_j|\eta''|` with each segment's own EI [N·m per unit of w]: the ends of every segment (both
        sides of a node) and the zeros of V = dM/dx inside it (Brent's method on V between samples)."""
        model = self._model
        best = 0.0
        for a, h in zip(model.xa.tolist(), model.h.tolist(), strict=True):
            xs = a + h * np.linspace(0.0, 1.0, 33)
            left = np.zeros(xs.size, dtype=bool)
            left[-1] = True  # the segment's own value at its right end
            _, _, M, V = self.mode_state(n, xs, left)
            best = max(best, float(np.abs(M).max()))

            def shear(x, a=a, h=h):
                return float(self.mode_state(n, [x], [x > a + 0.5 * h])[3][0])

            for i in np.nonzero(V[:-1] * V[1:] < 0.0)[0]:
                root = brentq(shear, float(xs[i]), float(xs[i + 1]), xtol=1e-15 * model.L)
                best = max(best, abs(float(self.mode_state(n, [root], [root > a + 0.5 * h])[2][0])))
        return best

    def _state(self, n, x, left=None):
        """The mode's state at x; where ``left`` is True and x is a node, the state just left of it."""
        model = self._model
        x = np.atleast_1d(np.asarray(x, dtype=float))
        seg = model.segment_of(x)
        xi = x - model.xa[seg]
        if left is not None:
            back = np.asarray(left, dtype=bool) & (seg > 0) & (np.abs(xi) <= 1e-12 * model.L)
            seg = np.where(back, seg - 1, seg)
            xi = np.where(back, model.h[seg], xi)
        pts = Points(model, seg, xi)
        batch = _ModeBatch(model, self.critical_loads[n], self._coefficients[n] / self._scale[n])
        return batch.states(0, pts), pts

    def mode_shapes(self, x) -> np.ndarray:
        """The normalised mode shapes at ``x`` [m]: shape (count, len(x)), largest value +1 [-]."""
        return np.stack([self._state(n, x)[0].w for n in range(self.critical_loads.size)])

    def mode_state(self, n: int, x, left=None):
        """Mode ``n``'s w [-], w' [1/m], and its M and V [N·m/m, N/m per unit of w] at ``x`` [m]:
        continuous where EI steps; ``left`` marks points at a node that take the value just left of it (a
        hinge's slope)."""
        st, _ = self._state(n, x, left)
        return st.w, st.rotation, st.M, st.V

    def mode_derivatives(self, n: int, x, left=None):
        """Mode ``n`` and its first three x-derivatives at ``x`` [m]: [-], [1/m], [1/m²], [1/m³] (``left`` as
        in :meth:`mode_state`)."""
        st, pts = self._state(n, x, left)
        return st.w, st.rotation, -st.M / pts.EI, -st.V / pts.EI


class _ModeBatch(Batch):
    """A batch with given coefficients at one axial force (a mode, evaluated by the batch's own states)."""

    def __init__(self, model, P, coefficients):  # noqa: D107 - no assembly: the coefficients are given
        self.model = model
        self.P = np.array([float(P)])
        self.table_rows = None
        self.reused = None
        self._targets = None
        self.singular = np.zeros(1, dtype=bool)
        self.coefficients = coefficients[None]


def _segment_stiffness(lam: np.ndarray) -> np.ndarray:
    """Exact dimensionless end stiffness (h = EI = 1) of a segment at λ = h√(P/EI): (n, 4, 4), freedoms
    (w_a, θ_a, w_b, θ_b) and forces (-T_a, M_a, T_b, -M_b), as in :mod:`engine.solver.buckling`."""
    s0, s1 = uniform._end_states(lam)
    disp = np.stack([s0[:, 0], s0[:, 1], s1[:, 0], s1[:, 1]], axis=1)
    force = np.stack([-s0[:, 3], s0[:, 2], s1[:, 3], -s1[:, 2]], axis=1)
    K = np.swapaxes(np.linalg.solve(np.swapaxes(disp, 1, 2), np.swapaxes(force, 1, 2)), 1, 2)
    return 0.5 * (K + np.swapaxes(K, 1, 2))


def _foundation_segment(P: np.ndarray, EI: float, k: float, h: float):
    """The exact end stiffness of a foundation segment at P [N] (n, 4, 4) and its clamped–clamped count J0.

    J0 by Wittrick–Williams substructuring: the segment is cut into 2^d equal pieces short enough that none
    has a clamped–clamped critical load below P (a foundation only raises the bare piece's 4π²EI/h_p², the
    energy k∫w² being positive); J0 is then the number of negative eigenvalues of the stiffness of the
    pieces' inner nodes, and the end stiffness that block's condensation.
    """
    pmax = max(float(P.max()), 0.0)
    d = 0
    while pmax >= 0.9 * 4 * math.pi**2 * EI / (h / 2**d) ** 2:
        d += 1
    m = 2**d
    Ke = foundation.end_stiffness(P, EI, k, h / m)
    n = P.size
    if m == 1:
        return Ke, np.zeros(n, dtype=int)
    size = 2 * (m + 1)
    K = np.zeros((n, size, size))
    for i in range(m):
        K[:, 2 * i : 2 * i + 4, 2 * i : 2 * i + 4] += Ke
    outer = np.array([0, 1, size - 2, size - 1])
    inner = np.arange(2, size - 2)
    Kii = K[:, inner][:, :, inner]
    Kib = K[:, inner][:, :, outer]
    Kbb = K[:, outer][:, :, outer]
    condensed = Kbb - np.swapaxes(Kib, 1, 2) @ np.linalg.solve(Kii, Kib)
    return 0.5 * (condensed + np.swapaxes(condensed, 1, 2)), uniform._negative_count(Kii)


class _Chain:
    """The freedoms of the chain of segments and the Wittrick–Williams count."""

    def __init__(self, model: Model, left, right):
        self.h, self.EI, L = model.h, model.EI_seg, model.L
        self.k = model.k_seg
        nseg = model.nseg
        hinge = np.zeros(nseg + 1, dtype=bool)
        t_spring = np.zeros(nseg + 1)
        r_spring = np.zeros(nseg + 1)
        t_fixed = np.zeros(nseg + 1, dtype=bool)
        r_fixed = np.zeros(nseg + 1, dtype=bool)

        def take(node, translation, rotation):
            if translation == "fixed":
                t_fixed[node] = True
            elif translation != "free":
                t_spring[node] += float(translation)
            if rotation == "fixed":
                r_fixed[node] = True
            elif rotation != "free":
                r_spring[node] += float(rotation)

        take(0, left.translation, left.rotation)
        take(nseg, right.translation, right.rotation)
        for r, node in zip(model.restraints, model.restraint_nodes, strict=True):
            take(node, r.translation, r.rotation)
            hinge[node] |= r.hinge
        # Freedoms: w at every node, θ at every node (θ- and θ+ at a hinge); -1 where fixed.
        index = 0
        w_dof, th_left, th_right = [], [], []
        diag = []
        for node in range(nseg + 1):
            if t_fixed[node]:
                w_dof.append(-1)
            else:
                w_dof.append(index)
                diag.append(("t", t_spring[node]))
                index += 1
            if r_fixed[node]:
                th_left.append(-1)
                th_right.append(-1)
            elif hinge[node]:
                th_left.append(index)
                th_right.append(index + 1)
                diag.extend([("r", 0.0), ("r", 0.0)])
                index += 2
            else:
                th_left.append(index)
                th_right.append(index)
                diag.append(("r", r_spring[node]))
                index += 1
        self.size = index
        self.springs = np.array([k for _, k in diag])
        self.map = np.array(
            [[w_dof[j], th_right[j], w_dof[j + 1], th_left[j + 1]] for j in range(nseg)], dtype=int
        )
        # Element scaling to physical units, then a congruence to order-one entries (inertia is kept).
        h, EI = self.h, self.EI
        self.dd = np.stack([1 / h, np.ones(nseg), 1 / h, np.ones(nseg)], axis=1)  # ŵ = w/h
        self.df = np.stack([EI / h**2, EI / h, EI / h**2, EI / h], axis=1)
        kinds = np.array([kind == "t" for kind, _ in diag])
        self.congruence = (
            np.where(kinds, L**1.5, L**0.5) / math.sqrt(float(EI.min())) if index else np.ones(0)
        )
        self.ref = float(model.EI)
        self.L = L

    def stiffness(self, P: np.ndarray, counts: np.ndarray | None = None) -> np.ndarray:
        """The global stiffness at axial forces P: (n, size, size) [congruence-scaled]; ``counts`` (n,), when
        given, receives every segment's clamped–clamped count J0."""
        n = P.size
        K = np.zeros((n, self.size, self.size))
        alike: dict = {}  # the pieces of a foundation range are alike: one evaluation serves them all
        for j in range(self.h.size):
            if self.k[j] > 0:
                key = (float(self.EI[j]), float(self.k[j]), round(float(self.h[j]), 12))
                if key not in alike:
                    alike[key] = _foundation_segment(P, *key)
                Ke, j0 = alike[key]
            else:
                lam = self.h[j] * np.sqrt(P / self.EI[j])
                Ke = _segment_stiffness(lam) * self.df[j][None, :, None] * self.dd[j][None, None, :]
                j0 = np.searchsorted(uniform._clamped_roots(float(lam.max()) + 1.0), lam)
            if counts is not None:
                counts += j0
            dofs = self.map[j]
            keep = dofs >= 0
            d = dofs[keep]
            K[:, d[:, None], d[None, :]] += Ke[:, keep][:, :, keep]
        K[:, np.arange(self.size), np.arange(self.size)] += self.springs
        c = self.congruence
        return K * c[None, :, None] * c[None, None, :]

    def count(self, P: np.ndarray) -> np.ndarray:
        """Number of critical loads below each P [N] (Wittrick–Williams)."""
        P = np.atleast_1d(np.asarray(P, dtype=float))
        j0 = np.zeros(P.size, dtype=int)
        K = self.stiffness(P, j0)
        if self.size == 0:
            return j0
        return j0 + uniform._negative_count(K)


@dataclass(frozen=True)
class _NoBow:
    """What :class:`engine.solver.model.Model` reads of a bow, for a straight member."""

    length: float
    shape: str = "none"
    uniform: float = 0.0
    terms: tuple = ()

    def derivatives(self, x):
        zero = np.zeros_like(np.asarray(x, dtype=float))
        return zero, zero, zero, zero


def _null_coefficients(model: Model, P: float) -> np.ndarray:
    """The null vector of the global system at P, as (nseg, 4) coefficients."""
    A = _system(model, P)
    # Inverse iteration: at a root A is singular to rounding, so one LU solve is all but the null vector
    # (far cheaper than an SVD for long chains of segments); the SVD where the solve fails or stalls.
    x = np.linspace(1.0, 2.0, A.shape[0])
    try:
        for _ in range(3):
            x = np.linalg.solve(A, x / np.linalg.norm(x))
        x /= np.linalg.norm(x)
        if np.isfinite(x).all() and np.linalg.norm(A @ x) <= 1e-8 * np.abs(A).max():
            return x.reshape(model.nseg, 4)
    except np.linalg.LinAlgError:
        pass
    _, _, vt = np.linalg.svd(A)
    return vt[-1].reshape(model.nseg, 4)


def _system(model: Model, P: float) -> np.ndarray:
    """The global matrix of :class:`engine.solver.batch.Batch` at one P, columns equilibrated (unloaded)."""
    nseg = model.nseg
    m = 4 * nseg
    B, _ = model.basis(P, model.end_points)
    B = B.reshape(nseg, 2, 4, 4)
    A = np.zeros((m, m))
    A[0:2, 0:4] = model.rows_left @ B[0, 0]
    if nseg > 1:
        rows, cols = model.interface_index
        A[rows, cols] = np.concatenate([model.node_left @ B[:-1, 1], model.node_right @ B[1:, 0]], axis=2)
    A[m - 2 :, m - 4 :] = model.rows_right @ B[nseg - 1, 1]
    row = np.abs(A).max(axis=1)
    row[row == 0] = 1.0
    return A / row[:, None]


def _polished(model: Model, P: float) -> float:
    """The root near P (from the count) made exact by Brent's method on the determinant of the global
    system, which has no poles; beside a clamped segment's own root the count loses digits to the stiffness
    matrix's pole, the determinant does not. P itself where no sign change is near (a double root)."""

    def det(p):
        sign, log = np.linalg.slogdet(_system(model, p))
        return float(sign) * math.exp(min(float(log), 600.0))

    for width in (1e-12, 1e-10, 1e-8, 1e-6):
        a, b = P * (1 - width), P * (1 + width)
        fa, fb = det(a), det(b)
        if fa == 0.0 or fb == 0.0 or np.sign(fa) != np.sign(fb):
            if fa == 0.0:
                return a
            if fb == 0.0:
                return b
            return brentq(det, a, b, xtol=1e-15 * P, rtol=4 * np.finfo(float).eps)
    return P


@functools.lru_cache(maxsize=64)
def _solve(case, count):
    model = Model(case, _NoBow(float(case.length)))
    chain = _Chain(model, case.left, case.right)
    # An upper bound holding `count` roots: every count is at least the clamped segments' own.
    hi = 10.0 * float(model.EI_seg.min()) / model.L**2
    while chain.count(np.array([hi]))[0] < count:
        hi *= 4.0
    lo = np.zeros(count)
    up = np.full(count, hi)
    target = np.arange(1, count + 1)
    for _ in range(200):
        mid = 0.5 * (lo + up)
        above = chain.count(mid) >= target
        up = np.where(above, mid, up)
        lo = np.where(above, lo, mid)
        if np.all(up - lo <= 1e-14 * up):
            break
    pcr = np.array([_polished(model, float(P)) for P in 0.5 * (lo + up)])
    coefs, scales = [], []
    xs = np.linspace(0.0, model.L, 2001)
    seg = model.segment_of(xs)
    pts = Points(model, seg, xs - model.xa[seg])
    for P in pcr:
        c = _null_coefficients(model, float(P))
        batch = _ModeBatch(model, P, c)
        w = batch.states(0, pts).w
        mag = np.abs(w)
        # The samples near the largest, each refined to its extreme by Newton's method on the slope.
        candidates = np.nonzero(mag >= (1 - 1e-4) * mag.max())[0]
        values = [_extreme(batch, xs, w, int(i)) for i in candidates]
        largest = max(abs(v) for v in values)
        first = next(v for v in values if abs(v) >= (1 - 1e-9) * largest)  # the leftmost is made positive
        coefs.append(c)
        scales.append(first if first != 0 else 1.0)
    return model, pcr, np.stack(coefs), np.array(scales)


def _extreme(batch, xs, w, i) -> float:
    """The mode's value at the extreme nearest sample i: Newton's method on w' = 0 (w'' = -M/EI) within the
    neighbouring samples; the sample itself at an end or where that finds no larger value."""
    if i == 0 or i == xs.size - 1:
        return float(w[i])
    model = batch.model
    x, lo, hi = float(xs[i]), float(xs[i - 1]), float(xs[i + 1])
    for _ in range(8):
        seg = model.segment_of(np.array([x]))
        st = batch.states(0, Points(model, seg, np.array([x]) - model.xa[seg]))
        curvature = float(-st.M[0] / np.atleast_1d(model.EI_seg[seg])[0])
        if curvature == 0.0:
            break
        x = min(max(x - float(st.rotation[0]) / curvature, lo), hi)
    seg = model.segment_of(np.array([x]))
    value = float(batch.states(0, Points(model, seg, np.array([x]) - model.xa[seg])).w[0])
    return value if abs(value) >= abs(w[i]) else float(w[i])


def critical_loads(case, count: int = 5):
    """The first elastic critical loads and modes of ``case``: :func:`engine.solver.buckling.critical_loads`
    for a uniform member between its end supports, :class:`SegmentedBuckling` with restraints or steps.

    Parameters
    ----------
    case : Case
        The plain case (EI given); only the length, EI, supports, restraints and steps are used.
    count : int
        How many critical loads, 1 to 12.
    """
    if not needs_segments(case):
        return uniform.critical_loads(case, count)
    if not 1 <= count <= 12:
        raise ValueError(f"count: {count} must be between 1 and 12")
    key = replace(case, axial_force=0.0, loads=(), imperfection=type(case.imperfection)())
    model, pcr, coefs, scales = _solve(key, int(count))
    EI, L = float(case.EI), float(case.length)
    lams = L * np.sqrt(pcr / EI)
    return SegmentedBuckling(
        critical_loads=pcr.copy(),
        wavenumbers=lams,
        effective_length_factor=float(math.pi / lams[0]),
        length=L,
        segment_starts=model.xa.copy(),
        segment_EI=model.EI_seg.copy(),
        _model=model,
        _coefficients=coefs,
        _scale=scales,
    )


def clear_cache() -> None:
    """Forget cached critical loads."""
    _solve.cache_clear()
