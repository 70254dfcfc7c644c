r"""The exact second-order solution of one member: assembly, solve and evaluation at stations.

The member is cut at every load position and load boundary into segments. In each segment the load is a
polynomial of degree one and the bow curvature a constant plus one sinusoid, so

.. math::

    EI\,w'''' + P\,w'' = q_0 + q_1\xi - P\,w_0''(x)

has the exact solution :math:`w = c_0 + c_1\xi + c_2 B_2(\xi) + c_3 B_3(\xi) + w_p(\xi)`. The pair
:math:`B_2, B_3` is chosen per segment so that it is accurate and cannot overflow:

- :math:`|P| h^2/EI \le 4`: the series functions :math:`\varphi_2, \varphi_3` (:mod:`engine.functions`),
  with the
  particular solution :math:`(q_0\varphi_4 + q_1\varphi_5)/EI`, entire in :math:`P` and so continuous through
  :math:`P = 0`;
- compression beyond that: :math:`\cos k\xi, \sin k\xi`, with :math:`w_p = q_0\xi^2/2P + q_1\xi^3/6P`;
- tension beyond that: the decaying exponentials :math:`e^{-\kappa\xi}, e^{-\kappa(h-\xi)}`, bounded for any
  tension (no cosh overflow), with the same polynomial :math:`w_p`.

The bow's sinusoid :math:`F\sin(\beta x + \psi)` has the particular solution
:math:`sF\sin(\beta x+\psi)/(\beta^2(\beta^2 - s))`, :math:`s = P/EI`; within 2 % of resonance
(:math:`s \approx \beta^2`, which is not a critical load unless the supports make it one) the
zero-initial-value
particular solution is used instead, by its Taylor series, which passes smoothly through resonance.

The coefficients of all segments follow from one linear system: the end conditions (:mod:`engine.supports`)
and, at every cut, continuity of :math:`w, w'` and the jumps :math:`M^+ - M^- = C`, :math:`T^+ - T^- = -F`.
This is the field-matrix method (Pestel & Leckie, *Matrix Methods in Elastomechanics*, 1963) solved as one
global system rather than by chained products, which keeps strong tension well conditioned. The system is
equilibrated and solved for many axial forces at once, so a sweep costs about as much as one solve.
"""

from __future__ import annotations

import math

import numpy as np

from engine.functions import SERIES_LIMIT, SERIES_TERMS, phi_series, xi_powers
from engine.supports import boundary_rows

__all__ = ["Model", "Batch", "Points", "base_stations", "refine_peaks"]

# |s/β² - 1| below which the resonance-safe particular solution is used. Outside it the plain form loses at
# most log10(1/band) digits to the cancellation with the homogeneous part: 1.7 digits at 0.02.
_RESONANCE_BAND = 0.02
_RESONANCE_TERMS = 46  # (1.12 · 2π)^46 / 46! < 1e-17: enough for any first-mode wavenumber


class Points:
    """Where the solution is evaluated, with everything there that does not depend on the axial force.

    Parameters
    ----------
    model : Model
    seg : ndarray of int
        Segment of each point.
    xi : ndarray
        Distance of each point from its segment's start [m].
    """

    def __init__(self, model, seg, xi, ends=None):
        #: indices of the start and end of every segment, in the order the assembly needs (or None)
        self.ends = ends
        self.seg = np.asarray(seg, dtype=int)
        self.xi = np.asarray(xi, dtype=float)
        self.size = self.xi.size
        self.h = model.h[self.seg]
        self.xa = model.xa[self.seg]
        self.q0 = model.q0[self.seg]
        self.q1 = model.q1[self.seg]
        self.q = self.q0 + self.q1 * self.xi
        self.x = self.xa + self.xi
        self.h2 = self.h * self.h
        self.h2_range = (float(self.h2.min()), float(self.h2.max())) if self.size else (0.0, 0.0)
        self.bow = model.bow.derivatives(self.x)
        self.waves = tuple(
            (F, beta, psi, np.sin(beta * self.x + psi), np.cos(beta * self.x + psi))
            for F, beta, psi in model.bow.terms
        )
        self._powers = None
        self._same = None
        self._table = None

    @property
    def same_segment(self) -> np.ndarray:
        """Whether each pair of consecutive points lies in one segment (for bracketing), kept."""
        if self._same is None:
            self._same = self.seg[1:] == self.seg[:-1]
        return self._same

    def table(self, model) -> _StationTable:
        """The state rows here as polynomials in -P/EI (:class:`_StationTable`), built when first used."""
        if self._table is None:
            self._table = _StationTable(model, self)
        return self._table

    @property
    def powers(self) -> np.ndarray:
        """ξ^(2j) for the series, computed on first use and kept (the points do not move)."""
        if self._powers is None:
            self._powers = xi_powers(self.xi)
        return self._powers


class Model:
    """Everything about a case that does not depend on the axial force.

    Parameters
    ----------
    case : Case
        The member.
    bow : Bow
        Its initial bow, from :func:`engine.imperfections.bow_for`.
    """

    def __init__(self, case, bow):
        L = float(case.length)
        self.L, self.EI, self.bow = L, float(case.EI), bow
        tol = 1e-12 * L
        cuts = [0.0, L]
        for load in case.loads:
            if load.type in ("point", "couple"):
                cuts.append(float(load.x))
            else:
                cuts.extend(load.span(L))
        cuts = np.sort(np.array(cuts))
        nodes = [cuts[0]]
        for c in cuts[1:]:
            if c - nodes[-1] > tol:
                nodes.append(float(c))
        nodes[-1] = L
        self.nodes = np.array(nodes)
        self.xa = self.nodes[:-1]
        self.h = np.diff(self.nodes)
        nseg = self.h.size
        self.nseg = nseg
        self.q0 = np.zeros(nseg)
        self.q1 = np.zeros(nseg)
        self.force = np.zeros(self.nodes.size)  # point loads at the nodes [N]
        self.couple = np.zeros(self.nodes.size)  # couples at the nodes [N·m]
        self.total_load = 0.0  # Σ F + ∫ q [N]
        self.total_moment = 0.0  # Σ F (L - x) + ∫ q (L - x) dx [N·m]
        self.total_couple = 0.0
        self.load_scale = 0.0
        for load in case.loads:
            if load.type in ("point", "couple"):
                i = int(np.argmin(np.abs(self.nodes - load.x)))
                if load.type == "point":
                    self.force[i] += load.P
                    self.total_load += load.P
                    self.total_moment += load.P * (L - self.nodes[i])
                    self.load_scale += abs(load.P)
                else:
                    self.couple[i] += load.C
                    self.total_couple += load.C
                continue
            a, b = load.span(L)
            qa, qb = (load.q, load.q) if load.type == "uniform" else (load.q_start, load.q_end)
            slope = (qb - qa) / (b - a)
            inside = (self.xa >= a - tol) & (self.xa + self.h <= b + tol)
            self.q0[inside] += qa + slope * (self.xa[inside] - a)
            self.q1[inside] += slope
            span = b - a
            self.total_load += 0.5 * (qa + qb) * span
            # ∫ q (L - x) dx over [a, b] for linear q, exactly.
            dq = qb - qa
            self.total_moment += span * (qa * (L - a) - qa * span / 2 + dq * (L - a) / 2 - dq * span / 3)
            self.load_scale += 0.5 * (abs(qa) + abs(qb)) * span
        self.couple_scale = float(np.abs(self.couple).sum())  # Σ |C| [N·m]
        self.rows_left = boundary_rows(case.left, "left")
        self.rows_right = boundary_rows(case.right, "right")
        self.jumps = np.stack([self.jump(i) for i in range(self.nodes.size)])
        j = np.arange(nseg - 1)[:, None, None]
        self.interface_index = (2 + 4 * j + np.arange(4)[None, :, None], 4 * j + np.arange(8)[None, None, :])
        # Both ends of every segment, for the continuity and end conditions.
        self.end_points = Points(
            self,
            np.repeat(np.arange(nseg), 2),
            np.stack([np.zeros(nseg), self.h], 1).ravel(),
            ends=np.arange(2 * nseg),
        )

    def position(self, seg: np.ndarray, xi: np.ndarray) -> np.ndarray:
        """x = start of the segment + ξ, exactly the node where ξ is the segment's length [m]."""
        x = self.xa[seg] + xi
        at_end = xi == self.h[seg]
        x[at_end] = self.nodes[seg[at_end] + 1]
        return x

    def segment_of(self, x: np.ndarray) -> np.ndarray:
        """The segment holding each x (a node belongs to the segment on its right, L to the last)."""
        return np.clip(np.searchsorted(self.nodes, x, side="right") - 1, 0, self.nseg - 1)

    # ----------------------------------------------------------------------------------------------
    def columns(self, P, pts):
        """The states (w, w', M, T) of basis functions 3 and 4 and of the particular solution at points.

        Basis functions 1 and 2 are 1 and ξ everywhere, with states (1, 0, 0, 0) and (ξ, 1, 0, -P).

        Parameters
        ----------
        P : float or ndarray
            Axial force [N], one for all points or one per point.
        pts : Points

        Returns
        -------
        cols : tuple of 7 arrays
            w, w', M of function 3; w, w', M, T of function 4 (T of function 3 is zero in every form).
        part : list of 4 arrays
            w, w', M, T of the particular solution, including the bow's term ``-P w0'`` in T.
        """
        EI = self.EI
        s = P / EI
        xi, h = pts.xi, pts.h
        q0 = pts.q0 + P * self.bow.uniform if self.bow.uniform else pts.q0
        q1 = pts.q1
        if np.ndim(s) == 0:
            z = None
            zlo, zhi = sorted((s * pts.h2_range[0], s * pts.h2_range[1]))
        else:
            z = s * pts.h2
            zlo, zhi = (float(z.min()), float(z.max())) if z.size else (0.0, 0.0)
        if -SERIES_LIMIT <= zlo and zhi <= SERIES_LIMIT:
            out = (
                _series_columns(EI, P, s, xi, h, q0, q1, pts.powers, pts.h2_range[1])
                if z is None
                else _series_columns(EI, P, s, xi, h, q0, q1)
            )
        elif zlo > SERIES_LIMIT:
            out = _trig_columns(EI, P, s, xi, h, q0, q1)
        elif zhi < -SERIES_LIMIT:
            out = _exp_columns(EI, P, s, xi, h, q0, q1)
        else:  # segments of different regimes
            n = pts.size
            P, s = np.broadcast_to(P, (n,)), np.broadcast_to(s, (n,))
            q0 = np.broadcast_to(q0, (n,))
            z = s * pts.h2 if z is None else z
            out = [np.zeros(n) for _ in range(11)]
            for mask, fn in (
                (np.abs(z) <= SERIES_LIMIT, _series_columns),
                (z > SERIES_LIMIT, _trig_columns),
                (z < -SERIES_LIMIT, _exp_columns),
            ):
                if mask.any():
                    values = fn(EI, P[mask], s[mask], xi[mask], h[mask], q0[mask], q1[mask])
                    for target, v in zip(out, values, strict=True):
                        target[mask] = v
        cols, part = tuple(out[:7]), list(out[7:])
        for F, beta, psi, sn, cs in pts.waves:
            pw, p1, p2, p3 = _bow_particular(s, F, beta, psi, pts, sn, cs)
            part[0] = part[0] + pw
            part[1] = part[1] + p1
            part[2] = part[2] - EI * p2
            part[3] = part[3] - (EI * p3 + P * p1)
        if self.bow.shape != "none":
            part[3] = part[3] - P * pts.bow[1]
        return cols, part

    def basis(self, P, pts, columns=None, index=None):
        """The state rows (w, w', M, T) of the four basis functions and of the particular solution.

        ``columns`` may pass in what :meth:`columns` already returned for these points, and ``index``
        pick some
        of them.

        Returns
        -------
        B : ndarray, shape (n, 4, 4)
            ``B[:, i, j]`` is state quantity i of basis function j.
        p : ndarray, shape (n, 4)
            The particular solution's state.
        """
        cols, part = self.columns(P, pts) if columns is None else columns
        xi = pts.xi
        if index is not None:
            cols = tuple(c[index] for c in cols)
            part = [np.broadcast_to(p, xi.shape)[index] for p in part]
            xi = xi[index]
        w3, t3, m3, w4, t4, m4, T4 = cols
        B = np.zeros((xi.size, 4, 4))
        B[:, 0, 0] = 1.0
        B[:, 0, 1] = xi
        B[:, 1, 1] = 1.0
        B[:, 3, 1] = -P if np.ndim(P) == 0 or index is None else np.asarray(P)[index]
        B[:, 0, 2], B[:, 1, 2], B[:, 2, 2] = w3, t3, m3
        B[:, 0, 3], B[:, 1, 3], B[:, 2, 3], B[:, 3, 3] = w4, t4, m4, T4
        return B, np.stack(np.broadcast_arrays(*part), axis=1)

    def jump(self, node: int) -> np.ndarray:
        """state(x+) - state(x-) at a node: (0, 0, C, -F)."""
        return np.array([0.0, 0.0, self.couple[node], -self.force[node]])


def _series_columns(EI, P, s, xi, h, q0, q1, powers=None, xi2_max=None):
    f0, f1, f2, f3, f4, f5 = phi_series(s, xi, powers, xi2_max)
    return (
        f2,
        f1,
        -EI * f0,
        f3,
        f2,
        -EI * f1,
        np.full(xi.size, -EI),
        (q0 * f4 + q1 * f5) / EI,
        (q0 * f3 + q1 * f4) / EI,
        -(q0 * f2 + q1 * f3),
        -q0 * xi - 0.5 * q1 * xi * xi,
    )


def _polynomial_particular(EI, P, xi, q0, q1):
    return (
        (q0 * xi * xi / 2 + q1 * xi**3 / 6) / P,
        (q0 * xi + q1 * xi * xi / 2) / P,
        -EI * (q0 + q1 * xi) / P,
        -EI * q1 / P - q0 * xi - 0.5 * q1 * xi * xi,
    )


def _trig_columns(EI, P, s, xi, h, q0, q1):
    k = np.sqrt(s)
    c, sn = np.cos(k * xi), np.sin(k * xi)
    ek2 = EI * k * k
    return (c, -k * sn, ek2 * c, sn, k * c, ek2 * sn, np.zeros(xi.size)) + _polynomial_particular(
        EI, P, xi, q0, q1
    )


def _exp_columns(EI, P, s, xi, h, q0, q1):
    kap = np.sqrt(-s)
    e1, e2 = np.exp(-kap * xi), np.exp(-kap * (h - xi))
    ek2 = -EI * kap * kap
    return (e1, -kap * e1, ek2 * e1, e2, kap * e2, ek2 * e2, np.zeros(xi.size)) + _polynomial_particular(
        EI, P, xi, q0, q1
    )


def _bow_particular(s, F, beta, psi, pts, sn, cs):
    """A particular solution of w'''' + s w'' = s F sin(β x + ψ) and its first three derivatives in ξ.

    ``sn`` and ``cs`` are sin(βx + ψ) and cos(βx + ψ) at the points.
    """
    b2 = beta * beta
    near = (s > 0) & (np.abs(s - b2) <= _RESONANCE_BAND * b2)
    if np.ndim(near) == 0:
        if not near:
            A = s * F / (b2 * (b2 - s))
            return A * sn, (A * beta) * cs, (-A * b2) * sn, (-A * b2 * beta) * cs
        near = np.ones(pts.size, dtype=bool)
        s = np.full(pts.size, s)
    out = [np.zeros(pts.size) for _ in range(4)]
    far = ~near
    if far.any():
        sf = s[far]
        A = sf * F / (b2 * (b2 - sf))
        out[0][far] = A * sn[far]
        out[1][far] = A * beta * cs[far]
        out[2][far] = -A * b2 * sn[far]
        out[3][far] = -A * b2 * beta * cs[far]
    if near.any():
        sn_ = s[near]
        r = _resonant_series(sn_ / b2, beta * pts.xa[near] + psi, beta * pts.xi[near])
        scale = sn_ * F / b2**2
        for d in range(4):
            out[d][near] = scale * r[d] * beta**d
    return out


def _resonant_series(sigma, theta, t):
    r"""Zero-initial-value solution R(t) of R'''' + σ R'' = sin(θ + t), and R', R'', R''', by Taylor series.

    Used only for t <= 2π·1.2 or so and σ near 1, where the series converges fast and loses no more than two
    digits to alternating terms.
    """
    N = _RESONANCE_TERMS
    n = t.size
    g = np.empty((n, N))
    phase = np.stack([np.sin(theta), np.cos(theta), -np.sin(theta), -np.cos(theta)], axis=1)
    fact = 1.0
    for j in range(N):
        if j:
            fact /= j
        g[:, j] = phase[:, j % 4] * fact
    r = np.zeros((n, N + 4))
    for j in range(N):
        prev = r[:, j + 2] if j + 2 < N + 4 else 0.0
        r[:, j + 4] = (g[:, j] - sigma * (j + 2) * (j + 1) * prev) / ((j + 1) * (j + 2) * (j + 3) * (j + 4))
    # Horner for the value and the first three derivatives.
    out = []
    coef = r
    for _ in range(4):
        acc = np.zeros(n)
        for j in range(coef.shape[1] - 1, -1, -1):
            acc = acc * t + coef[:, j]
        out.append(acc)
        m = coef.shape[1]
        coef = coef[:, 1:] * np.arange(1, m)[None, :]
    return out


def _table_coefficients(model, pts, J):
    """The coefficients of σ^0 … σ^J, σ = -P/EI, of the state rows at the points: shape (n, 20, J + 1).

    Entries 0–15 are B (state quantity i, basis function j at 4i + j), 16–19 the particular solution's state.
    """
    EI, u = model.EI, model.bow.uniform
    x = pts.xi
    n = x.size
    orders = np.arange(6)[:, None] + 2 * np.arange(J)[None, :]  # n + 2j
    inv = np.array([[1.0 / math.factorial(int(o)) for o in row] for row in orders])
    phi = x[:, None, None] ** orders[None, :, :] * inv[None, :, :]  # (n, 6, J): the σ^j coefficient of φ_n
    c = np.zeros((n, 20, J + 1))
    q0, q1 = pts.q0[:, None], pts.q1[:, None]
    c[:, 0, 0] = 1.0
    c[:, 1, 0] = x
    c[:, 2, :J], c[:, 3, :J] = phi[:, 2], phi[:, 3]  # w of functions 3 and 4
    c[:, 5, 0] = 1.0
    c[:, 6, :J], c[:, 7, :J] = phi[:, 1], phi[:, 2]  # w'
    c[:, 10, :J], c[:, 11, :J] = -EI * phi[:, 0], -EI * phi[:, 1]  # M
    c[:, 13, 1] = EI  # T of function 2 is -P = EI σ
    c[:, 15, 0] = -EI  # T of function 4
    # The particular solution of the load q0 + q1 ξ + P u, with P = -EI σ (one power higher).
    c[:, 16, :J] = (q0 * phi[:, 4] + q1 * phi[:, 5]) / EI
    c[:, 17, :J] = (q0 * phi[:, 3] + q1 * phi[:, 4]) / EI
    c[:, 18, :J] = -(q0 * phi[:, 2] + q1 * phi[:, 3])
    c[:, 19, 0] = -pts.q0 * x - 0.5 * pts.q1 * x * x
    if u:
        c[:, 16, 1:] -= u * phi[:, 4]
        c[:, 17, 1:] -= u * phi[:, 3]
        c[:, 18, 1:] += EI * u * phi[:, 2]
        c[:, 19, 1] += EI * u * x
    if model.bow.shape != "none":
        c[:, 19, 1] += EI * pts.bow[1]  # -P w0'
    return c


class _StationTable:
    r"""The state at fixed stations as polynomials in :math:`\sigma = -P/EI`, for one axial force at a time.

    In the series regime (:math:`|s| h^2 \le 4` in every segment) each entry of :math:`B` and of the
    particular
    solution's state (:meth:`Model.basis`) is :math:`\sum_j \sigma^j c_j`, with coefficients that depend
    on the
    point only: :math:`\varphi_n = \sum_j \sigma^j \xi^{n+2j}/(n+2j)!`, and the bow's uniform curvature
    and slope
    enter through :math:`P = -EI\sigma`. For one axial force the rows at every station are then one
    product with
    the powers of :math:`\sigma` (the series of :func:`engine.functions.phi_series`, summed directly). The
    state there, and the targets whose zeros are peaks, are then one small matrix (built from the segment's
    coefficients) times the stations' columns ``Y`` per segment: 1, ξ, φ0 … φ3, the particular state, the
    bow's
    derivatives, q, q' and the bow sinusoid. The bow's sinusoid adds its particular solution
    :math:`A(s)\,(\ldots)`, :math:`A = sF/(\beta^2(\beta^2 - s))`; within the resonance band, or outside the
    series regime, :meth:`evaluate` returns None and the caller evaluates the basis functions instead.
    """

    def __init__(self, model, pts):
        J = SERIES_TERMS
        EI = model.EI
        with np.errstate(over="ignore", under="ignore"):
            full = _table_coefficients(model, pts, J)
        n = pts.size
        poly = np.stack(
            [
                full[:, 10] / -EI,
                full[:, 6],
                full[:, 2],
                full[:, 3],
                full[:, 16],
                full[:, 17],
                full[:, 18],
                full[:, 19],
            ]
        )  # φ0, φ1, φ2, φ3, p_w, p_θ, p_M, p_T: (8, n, J + 1)
        self.poly = np.ascontiguousarray(poly).reshape(-1, J + 1)
        self.ends = np.ascontiguousarray(full[pts.ends]).reshape(-1, J + 1)
        self.exponents = np.arange(J + 1, dtype=float)
        self.h2_max = pts.h2_range[1]
        self.EI = EI
        self.size = n
        static = np.zeros((18, n))
        static[0] = 1.0
        static[1] = pts.xi
        static[10], static[11], static[12] = pts.bow[1], pts.bow[2], pts.bow[3]
        static[13], static[14] = pts.q, pts.q1
        static[17] = pts.bow[0]
        self.wave = None
        if pts.waves:
            F, beta, _, sn, cs = pts.waves[0]
            static[15], static[16] = sn, cs
            b2 = beta * beta
            fixed = np.stack([sn, beta * cs, EI * b2 * sn, EI * b2 * beta * cs])[:, pts.ends].T.copy()
            self.wave = (F, beta, b2, fixed, -beta * cs[pts.ends])
        self.static = static
        # base[k, i, r]: the coefficient of u_k (c0, c1, c2, c3, 1) in row i (w, θ, M, T) on column r of Y.
        self.base0 = np.zeros((5, 4, 18))
        b = self.base0
        b[0, 0, 0] = b[1, 0, 1] = b[2, 0, 4] = b[3, 0, 5] = 1.0
        b[1, 1, 0] = b[2, 1, 3] = b[3, 1, 4] = 1.0
        b[2, 2, 2] = b[3, 2, 3] = b[3, 3, 0] = -EI
        b[4, 0, 6] = b[4, 1, 7] = b[4, 2, 8] = b[4, 3, 9] = 1.0
        self.base_p = np.zeros((5, 4, 18))
        self.base_p[1, 3, 0] = -1.0  # T of function 2: -P
        self.base_a = np.zeros((5, 4, 18))
        self.base_ap = np.zeros((5, 4, 18))
        if self.wave is not None:
            beta = self.wave[1]
            self.base_a[4, 0, 15], self.base_a[4, 1, 16] = 1.0, beta
            self.base_a[4, 2, 15], self.base_a[4, 3, 16] = EI * beta * beta, EI * beta**3
            self.base_ap[4, 3, 16] = -beta
        # The constant columns of the derived rows (see state): P w0' in V, w0' in the total slope, -q +
        # P w0''
        # in dV, w0'' in the total curvature, -q' + P w0''' - (P²/EI) w0' in d²V.
        self.extra0 = np.zeros((11, 18))
        self.extra_p = np.zeros((11, 18))
        self.extra_rp = np.zeros((11, 18))
        self.extra_p[4, 10] = 1.0
        self.extra0[5, 17] = 1.0  # w0 itself
        self.extra0[6, 10] = 1.0
        self.extra0[7, 13], self.extra_p[7, 11] = -1.0, 1.0
        self.extra0[9, 11] = 1.0
        self.extra_rp[10, 10], self.extra0[10, 14], self.extra_p[10, 12] = -1.0, -1.0, 1.0
        ends = pts.ends
        self.ranges = [(int(ends[2 * j]), int(ends[2 * j + 1]) + 1) for j in range(ends.size // 2)]

    def evaluate(self, P: float):
        """(B, p) at the segment ends and the stations' columns for axial force P [N]; None outside the table.

        Returns ``(B, p, columns)``: B and p as :meth:`Model.basis` gives them at the ends, and what
        :meth:`state` needs.
        """
        EI = self.EI
        s = P / EI
        if not abs(s) * self.h2_max <= SERIES_LIMIT:
            return None
        A = 0.0
        if self.wave is not None:
            F, _, b2, fixed, with_p = self.wave
            if s > 0 and abs(s - b2) <= _RESONANCE_BAND * b2:
                return None
            A = s * F / (b2 * (b2 - s))
        pw = np.power(-s, self.exponents)
        if not math.isfinite(pw[-1]):
            return None
        rows = (self.ends @ pw).reshape(-1, 20)
        p = rows[:, 16:]
        if A:
            p = p + A * fixed
            p[:, 3] += (A * P) * with_p
        Y = np.empty((18, self.size))
        Y[:2] = self.static[:2]
        Y[10:] = self.static[10:]
        np.dot(self.poly, pw, out=Y[2:10].reshape(-1))
        return rows[:, :16].reshape(-1, 4, 4), p, (Y, A)

    def state(self, P: float, coefficients: np.ndarray, columns) -> np.ndarray:
        """Rows w, θ, M, T, V, w0, θ + w0', dV/dx, -M/EI, -M/EI + w0'', d²V/dx² at the stations: (11, n).

        ``coefficients`` (nseg, 4) are the solved basis coefficients, ``columns`` what :meth:`evaluate`
        returned.
        """
        Y, A = columns
        EI = self.EI
        r = P / EI
        # Rows w, θ, M, T on the columns of Y, linear in the coefficients: c @ base[:4] + base[4].
        base = self.base0 + P * self.base_p
        if A:
            base = base + A * self.base_a + (A * P) * self.base_ap
        G4 = coefficients @ base[:4].reshape(4, -1) + base[4].reshape(-1)
        # The derived rows: V = T + P(θ + w0'), θ + w0', dV = -q + P w0'' - (P/EI) M, -M/EI, -M/EI + w0'' and
        # d²V = -q' + P w0''' - (P/EI) V, from w, θ, M, T and the constant columns (self.extra*).
        mix = np.array(
            [
                [1.0, 0.0, 0.0, 0.0],
                [0.0, 1.0, 0.0, 0.0],
                [0.0, 0.0, 1.0, 0.0],
                [0.0, 0.0, 0.0, 1.0],
                [0.0, P, 0.0, 1.0],
                [0.0, 0.0, 0.0, 0.0],
                [0.0, 1.0, 0.0, 0.0],
                [0.0, 0.0, -r, 0.0],
                [0.0, 0.0, -1.0 / EI, 0.0],
                [0.0, 0.0, -1.0 / EI, 0.0],
                [0.0, -r * P, 0.0, -r],
            ]
        )
        G = mix @ G4.reshape(-1, 4, 18) + (self.extra0 + P * self.extra_p + (r * P) * self.extra_rp)
        out = np.empty((11, self.size))
        for j, (a, b) in enumerate(self.ranges):
            out[:, a:b] = G[j] @ Y[:, a:b]
        return out


# Rows of _StationTable.state that are the targets (θ, θ + w0', V, dV/dx) and their slopes.
_TARGET_ROWS = np.array([1, 6, 4, 7])
_TARGET_SLOPE_ROWS = np.array([8, 9, 7, 10])


class Batch:
    """The solution of one model for many axial forces at once.

    Parameters
    ----------
    model : Model
    axial_forces : array_like
        Axial forces [N], compression positive.
    """

    def __init__(self, model: Model, axial_forces, at: Points | None = None):
        self.model = model
        P = np.atleast_1d(np.asarray(axial_forces, dtype=float))
        self.P = P
        nP, nseg = P.size, model.nseg
        m = 4 * nseg
        ends = model.end_points
        self._reuse = None
        rows = None
        if nP == 1 and at is not None and at.ends is not None:
            rows = at.table(model).evaluate(float(P[0]))
        self._table = None
        self._targets = None
        if rows is not None:
            # The rows at the segment ends and the stations' columns, from the stations' table.
            B, p, columns = rows
            self._table = (at, at.table(model), columns)
        elif nP == 1 and at is not None and at.ends is not None:
            # One evaluation serves both the assembly (at the segment ends) and the stations themselves.
            cols, part = model.columns(P[0], at)
            self._reuse = (at, cols, part)
            B, p = model.basis(P[0], at, (cols, part), index=at.ends)
        elif nP == 1:
            B, p = model.basis(P[0], ends)
        else:
            tiled = Points(model, np.tile(ends.seg, nP), np.tile(ends.xi, nP))
            B, p = model.basis(np.repeat(P, ends.size), tiled)
        if nP == 1:
            self._solve_one(B.reshape(nseg, 2, 4, 4), p.reshape(nseg, 2, 4))
            return
        B = B.reshape(nP, nseg, 2, 4, 4)
        p = p.reshape(nP, nseg, 2, 4)
        A = np.zeros((nP, m, m))
        rhs = np.zeros((nP, m))
        rl, rr = model.rows_left, model.rows_right
        jumps = model.jumps
        A[:, 0:2, 0:4] = rl @ B[:, 0, 0]
        rhs[:, 0:2] = (jumps[0][None, :] - p[:, 0, 0]) @ rl.T
        if nseg > 1:
            # Every interface block at once: [-B(end of j) | B(start of j+1)] in rows 2 + 4j.
            rows, cols_ = model.interface_index
            A[:, rows, cols_] = np.concatenate([-B[:, :-1, 1], B[:, 1:, 0]], axis=3)
            rhs[:, 2 : m - 2] = (jumps[None, 1:nseg] - p[:, 1:, 0] + p[:, :-1, 1]).reshape(nP, -1)
        A[:, m - 2 : m, m - 4 : m] = rr @ B[:, nseg - 1, 1]
        rhs[:, m - 2 : m] = -(p[:, nseg - 1, 1] + jumps[nseg][None, :]) @ rr.T
        # Equilibrate rows, then columns, so that stiff springs and strong tension keep the pivots honest.
        row = np.abs(A).max(axis=2, keepdims=True)
        row[row == 0] = 1.0
        A /= row
        rhs /= row[:, :, 0]
        col = np.abs(A).max(axis=1, keepdims=True)
        col[col == 0] = 1.0
        A /= col
        self.singular = np.zeros(nP, dtype=bool)
        try:
            y = np.linalg.solve(A, rhs[:, :, None])[:, :, 0]
        except np.linalg.LinAlgError:
            y = np.zeros((nP, m))
            for i in range(nP):
                try:
                    y[i] = np.linalg.solve(A[i], rhs[i])
                except np.linalg.LinAlgError:
                    self.singular[i] = True
        y = y / col[:, 0, :]
        self.singular |= ~np.isfinite(y).all(axis=1)
        y[self.singular] = 0.0
        self.coefficients = y.reshape(nP, nseg, 4)

    def _solve_one(self, B, p):
        """The assembly and solve of :meth:`__init__` for one axial force, in two dimensions (fewer steps)."""
        model = self.model
        nseg = B.shape[0]
        m = 4 * nseg
        A = np.zeros((m, m))
        rhs = np.empty(m)
        rl, rr, jumps = model.rows_left, model.rows_right, model.jumps
        A[0:2, 0:4] = rl @ B[0, 0]
        rhs[0:2] = rl @ (jumps[0] - p[0, 0])
        if nseg > 1:
            rows, cols_ = model.interface_index
            A[rows, cols_] = np.concatenate([-B[:-1, 1], B[1:, 0]], axis=2)
            rhs[2 : m - 2] = (jumps[1:nseg] - p[1:, 0] + p[:-1, 1]).ravel()
        A[m - 2 : m, m - 4 : m] = rr @ B[nseg - 1, 1]
        rhs[m - 2 : m] = -(rr @ (p[nseg - 1, 1] + jumps[nseg]))
        # Equilibrate rows, then columns, as for many forces.
        row = np.abs(A).max(axis=1)
        row[row == 0] = 1.0
        A /= row[:, None]
        rhs /= row
        col = np.abs(A).max(axis=0)
        col[col == 0] = 1.0
        A /= col
        self.singular = np.zeros(1, dtype=bool)
        try:
            y = np.linalg.solve(A, rhs) / col
        except np.linalg.LinAlgError:
            y = np.zeros(m)
            self.singular[0] = True
        if not np.isfinite(y).all():
            self.singular[0] = True
            y = np.zeros(m)
        self.coefficients = y.reshape(1, nseg, 4)

    def states(self, iP, pts):
        """The state at points: a dict of w, rotation, M, T, V and the bow derivatives w0..w0'''.

        Parameters
        ----------
        iP : int or ndarray of int
            Index into the axial forces of the batch: one for all points, or one per point.
        pts : Points
        """
        model = self.model
        P = self.P[iP]
        if self._table is not None and self._table[0] is pts and np.ndim(iP) == 0:
            _, table, columns = self._table
            out = table.state(float(P), self.coefficients[iP], columns)
            w0, d1, d2, d3 = pts.bow
            st = {
                "w": out[0],
                "rotation": out[1],
                "M": out[2],
                "T": out[3],
                "V": out[4],
                "w0": w0,
                "w0_1": d1,
                "w0_2": d2,
                "w0_3": d3,
                "P": P,
                "_table": (out, columns[0]),
            }
            self._targets = (st, out[_TARGET_ROWS], out[_TARGET_SLOPE_ROWS])
            return st
        if self._reuse is not None and self._reuse[0] is pts:
            cols, (pw, pt, pm, pT) = self._reuse[1:]
        else:
            cols, (pw, pt, pm, pT) = model.columns(P, pts)
        w3, t3, m3, w4, t4, m4, T4 = cols
        c = self.coefficients[iP][pts.seg] if np.ndim(iP) == 0 else self.coefficients[iP, pts.seg]
        c0, c1, c2, c3 = c[:, 0], c[:, 1], c[:, 2], c[:, 3]
        rot = c1 + c2 * t3 + c3 * t4 + pt
        T = c3 * T4 - P * c1 + pT
        w0, d1, d2, d3 = pts.bow
        return {
            "w": c0 + c1 * pts.xi + c2 * w3 + c3 * w4 + pw,
            "rotation": rot,
            "M": c2 * m3 + c3 * m4 + pm,
            "T": T,
            "V": T + P * (rot + d1),
            "w0": w0,
            "w0_1": d1,
            "w0_2": d2,
            "w0_3": d3,
            "P": P,
        }

    def targets(self, states, pts):
        """Values and slopes of the four functions whose interior zeros are peaks.

        Returns arrays shaped (4, n): the rotation (peak of w), the total slope (peak of w + w0),
        V (peak of M) and dV/dx (peak of V).
        """
        if self._targets is not None and self._targets[0] is states:
            return self._targets[1], self._targets[2]
        EI = self.model.EI
        P = states["P"]
        curv = -states["M"] / EI
        dV = -pts.q + P * (states["w0_2"] + curv)
        f = np.stack([states["rotation"], states["rotation"] + states["w0_1"], states["V"], dV])
        df = np.stack([curv, curv + states["w0_2"], dV, -pts.q1 + P * (states["w0_3"] - states["V"] / EI)])
        return f, df


def base_stations(model: Model, count: int, tension_kappa: float = 0.0):
    """Base stations as (segment, ξ, shown): a uniform grid and every node, at both ends of each segment.

    ``shown`` marks the stations that the result lists: a node appears twice only where a point load or couple
    makes the state jump; elsewhere the segment-end copy serves only to bracket peaks.

    Parameters
    ----------
    model : Model
    count : int
        Number of uniformly spaced stations over the member (both ends included), at least 2.
    tension_kappa : float
        :math:`\\sqrt{-P/EI}` of the strongest tension to be resolved [1/m]; extra stations are placed in the
        boundary layers of width :math:`1/\\kappa` at each segment end so that no peak there is missed.
    """
    L = model.L
    grid = np.linspace(0.0, L, max(int(count), 2))
    seg_list, xi_list, shown = [], [], []
    tol = 1e-12 * L
    for j in range(model.nseg):
        a, h = model.xa[j], model.h[j]
        inner = grid[(grid > a + tol) & (grid < a + h - tol)] - a
        extra = np.empty(0)
        if tension_kappa * h > 8:
            d = np.array([0.25, 0.5, 1.0, 2.0, 3.0, 5.0, 8.0]) / tension_kappa
            extra = np.concatenate([d, h - d])
        xs = np.unique(np.concatenate([[0.0], inner, extra[(extra > 0) & (extra < h)], [h]]))
        last = j == model.nseg - 1
        jump_after = not last and (model.force[j + 1] != 0.0 or model.couple[j + 1] != 0.0)
        out = np.ones(xs.size, dtype=bool)
        # The next segment starts with the same, continuous, point: bracket with it, but list it once.
        out[-1] = last or jump_after
        seg_list.append(np.full(xs.size, j))
        xi_list.append(xs)
        shown.append(out)
    return np.concatenate(seg_list), np.concatenate(xi_list), np.concatenate(shown)


def refine_peaks(batch: Batch, iP, pts, f, df, also=None, states=None):
    """Interior zeros of the target functions between consecutive stations, and the state there.

    One bracketed Newton step from a second-order start, then a third-order Taylor step of the state to the
    root (the derivatives of every state quantity are known exactly: w' = θ, θ' = -M/EI, M' = V, T' = -q,
    V' = -q + P(w0'' - M/EI)). The step is O(Δx²) long, so what the Taylor step neglects is O(Δx⁶) relative:
    below rounding for any usable station spacing.

    Parameters
    ----------
    batch : Batch
    iP : int or ndarray of int
        Axial-force index, one for all or one per station.
    pts : Points
        The stations, ordered along the member for each axial force.
    f, df : ndarray, shape (4, n)
        The target values and their slopes at the stations. A value that is zero at a station (a fixed end's
        rotation, say) takes the sign its neighbourhood has, from the slope, so that a peak next to it is
        still bracketed.
    also : tuple of (seg, xi), optional
        More points to evaluate in the same pass (a single axial force only).
    states : dict, optional
        The states at ``pts`` (what ``batch.states`` returned), for a single axial force: the zeros and the
        state there then come from the Taylor series of the exact solution about the stations
        (:func:`_refine_by_series`) wherever that series is short enough; otherwise, or without ``states``,
        from exact evaluations as above.

    Returns
    -------
    iP, seg, xi : ndarray
        Where the zeros are.
    states : dict of ndarray
        w, rotation, M, T, V and w0 there, followed by those at ``also``.
    """
    seg, xi = pts.seg, pts.xi
    st_at_stations = states
    single = np.ndim(iP) == 0
    if single:  # one axial force: "same segment" depends on the stations only, so keep it with them
        same = pts.same_segment
        iP = np.zeros(seg.size, dtype=int)
    else:
        iP = np.asarray(iP)
        same = (iP[1:] == iP[:-1]) & (seg[1:] == seg[:-1])
    mag = np.abs(f)
    zero = mag <= 1e-13 * mag.max(axis=1, keepdims=True)
    left_side = np.where(zero, df, f)  # just right of a station
    right_side = np.where(zero, -df, f)  # just left of it
    sign_change = (left_side[:, :-1] * right_side[:, 1:] < 0) & same[None, :]
    fid, k = np.nonzero(sign_change)
    # One gather for everything the start needs, at the left (k) and right (k + 1) station of each bracket.
    both = np.concatenate([k, k + 1])
    fid2 = np.concatenate([fid, fid])
    flo, fhi = left_side[fid, k], right_side[fid, k + 1]
    g_f, g_df, g_zero = f[fid2, both], df[fid2, both], zero[fid2, both]
    n_roots = k.size
    lo, hi = xi[k], xi[k + 1]
    bi, bs = iP[k], seg[k]
    # Start from the secant; beside a zero station, from the parabola through that zero with its slope and the
    # other end's value. Either start is within O(Δx²) of the root, so one Newton step leaves O(Δx⁴).
    width = hi - lo
    x0 = lo - flo * width / (fhi - flo)  # the secant; flo and fhi have opposite signs, so no division by zero
    if g_zero.any():
        z_lo, z_hi = g_zero[:n_roots], g_zero[n_roots:]
        with np.errstate(divide="ignore", invalid="ignore"):
            d_lo, d_hi = g_df[:n_roots], g_df[n_roots:]
            from_lo = lo - d_lo / ((g_f[n_roots:] - d_lo * width) / width**2)
            from_hi = hi - d_hi / ((g_f[:n_roots] + d_hi * width) / width**2)
        x0 = np.where(z_lo, from_lo, np.where(z_hi, from_hi, x0))
        x0 = np.where(np.isfinite(x0) & (x0 > lo) & (x0 < hi), x0, 0.5 * (lo + hi))
    if single and batch.P.size == 1:
        fast = _refine_by_series(batch, pts, st_at_stations, fid, k, lo, hi, x0, also)
        if fast is not None:
            return fast
    if also is not None:
        trial = Points(batch.model, np.concatenate([bs, also[0]]), np.concatenate([x0, also[1]]))
        which = 0
    else:
        trial = Points(batch.model, bs, x0)
        which = bi if batch.P.size > 1 else 0
    st = batch.states(which, trial)
    fv, dv = batch.targets(st, trial)
    sel = np.arange(n_roots)
    fx, dx = fv[fid, sel], dv[fid, sel]
    flat = dx == 0.0
    step = -fx / np.where(flat, 1.0, dx)
    step[flat] = np.inf  # no slope: the bracket check below bisects instead
    # The Taylor step below is exact to rounding when the step is below 1e-4 of the shortest length of the
    # solution there (the segment, or the wavelength 1/k). Coarse stations may need more Newton steps first.
    P_at = batch.P[bi] if batch.P.size > 1 else batch.P[0]
    scale = np.minimum(trial.h[:n_roots], 1.0 / np.sqrt(np.abs(P_at) / batch.model.EI + 1e-300))
    q_at = trial.q[:n_roots].copy()  # the load intensity where each root's state was last evaluated
    for _ in range(8):
        loose = ~(np.abs(step) <= 1e-4 * scale)
        if not loose.any():
            break
        sub = np.nonzero(loose)[0]
        xs = np.clip(x0[sub] + np.nan_to_num(step[sub]), lo[sub], hi[sub])
        again = Points(batch.model, bs[sub], xs)
        st_sub = batch.states(bi[sub] if batch.P.size > 1 else 0, again)
        fv_sub, dv_sub = batch.targets(st_sub, again)
        fs, ds = fv_sub[fid[sub], np.arange(sub.size)], dv_sub[fid[sub], np.arange(sub.size)]
        # Keep the bracket: the root stays between lo and hi.
        right = np.sign(fs) == np.sign(flo[sub])
        lo[sub], hi[sub] = np.where(right, xs, lo[sub]), np.where(right, hi[sub], xs)
        flo[sub] = np.where(right, fs, flo[sub])
        with np.errstate(divide="ignore", invalid="ignore"):
            st_step = -fs / ds
        bad = ~(np.isfinite(st_step) & (xs + st_step >= lo[sub]) & (xs + st_step <= hi[sub]))
        st_step = np.where(bad, 0.5 * (lo[sub] + hi[sub]) - xs, st_step)
        x0[sub], step[sub] = xs, st_step
        for name in st:
            if isinstance(st[name], np.ndarray) and st[name].ndim == 1 and st[name].size == trial.size:
                st[name][sub] = st_sub[name]
        q_at[sub] = trial.q0[sub] + trial.q1[sub] * xs
    x1 = x0 + step
    ok = np.isfinite(x1) & (x1 >= lo) & (x1 <= hi)
    if not ok.all():  # a flat or odd bracket: bisect the half with the sign change and evaluate it exactly
        left = np.sign(fx) == np.sign(flo)
        x1 = np.where(ok, x1, np.where(left, 0.5 * (x0 + hi), 0.5 * (lo + x0)))
        step = np.where(ok, step, 0.0)
    out = _taylor(batch, st, q_at, trial.q1[:n_roots], n_roots, step)
    if not ok.all():
        bad = np.nonzero(~ok)[0]
        again = Points(batch.model, bs[bad], x1[bad])
        exact = batch.states(bi[bad] if batch.P.size > 1 else 0, again)
        for name in _STATE_FIELDS:
            out[name][bad] = exact[name]
    return bi, bs, x1, out


_STATE_FIELDS = ("w", "rotation", "M", "T", "V", "w0")


# The Taylor series about a station (see _refine_by_series): the terms kept, the derivatives of w that they
# and Halley's iteration on the fourth target (-EI w^(4)) need, and the largest reach (distance times the
# largest wavenumber of the solution) at which the kept terms are exact to rounding: the first neglected
# term is below 0.5^18 / 18! = 6e-22 of the solution's scale.
_SERIES_TERMS = 18
_SERIES_DERIVATIVES = _SERIES_TERMS + 6
_SERIES_REACH = 0.5
_INV_FACTORIAL = np.array([1.0 / math.factorial(j) for j in range(_SERIES_TERMS)])
_SIN_PHASE = np.array([1.0, 0.0, -1.0, 0.0])  # the m-th derivative of sin(θ) is β^m (this · sin + next · cos)
_COS_PHASE = np.array([0.0, 1.0, 0.0, -1.0])
_WINDOWS = np.arange(4)[:, None] + np.arange(_SERIES_TERMS)[None, :]  # d[:, _WINDOWS[r]]: the series of w^(r)
_POWERS = np.arange(_SERIES_TERMS, dtype=float)
# From the series (w, w', w'', w''', w0, w0') to the state's rows; the entries set per solve are -EI and -P.
_TO_ROWS = np.zeros((6, 6))
_TO_ROWS[0, 0] = _TO_ROWS[1, 1] = _TO_ROWS[5, 4] = 1.0
_STATE_WINDOWS = np.concatenate([_WINDOWS, _SERIES_DERIVATIVES + _WINDOWS[:2]])  # w … w''', w0, w0'
_TARGET_OFFSET = np.array([1, 1, 3, 4])  # the targets are w', (w + w0)', -EI w''' and -EI w''''


class _SeriesTables:
    r"""What the derivative recursion of the governing equation needs that does not depend on P.

    Differentiating :math:`w^{(4)} + s\,w'' = g(x)`, :math:`g = (q + P u + P F \sin(\beta x + \psi))/EI`,
    gives
    :math:`w^{(m+4)} = -s\,w^{(m+2)} + g^{(m)}`. Unrolled, every derivative is linear in
    :math:`v = (w, w', w'', w''', (q + P u)/EI, q'/EI, F\sin\theta, F\cos\theta)` at the station:
    :math:`w^{(j)} = \sum_b (-s)^b g^{(j-4-2b)} + (-s)^{a} w^{(j-2a)}` with :math:`j - 2a \in \{2, 3\}`,
    that is
    :math:`K(s)\,G(s)\,v`, K holding powers of :math:`-s` and G the derivatives of g (and two rows that pass
    :math:`w''` and :math:`w'''` through).
    """

    def __init__(self, model):
        n = _SERIES_DERIVATIVES - 4
        j = np.arange(4, _SERIES_DERIVATIVES)
        diff = np.arange(n)[:, None] - np.arange(n)[None, :]
        # K, row j - 4: columns g^(0) … g^(n-1), then w'' and w'''. Entries index the powers of -s; the index
        # n stands for zero.
        kexp = np.where((diff >= 0) & (diff % 2 == 0), diff // 2, n)
        hexp = np.full((n, 2), n)
        hexp[np.arange(n), j % 2] = (j - 2 - j % 2) // 2
        self.kexp = np.concatenate([kexp, hexp], axis=1)
        self.exponents = np.arange(n, dtype=float)
        self._pick = None
        terms = model.bow.terms
        self.usable = len(terms) <= 1
        beta = float(terms[0][1]) if len(terms) == 1 else 0.0
        self.beta = abs(beta)
        m = np.arange(n)
        bm = beta ** m.astype(float)
        # G: g^(m) on v for m < n (the part independent of s, and the part proportional to s), then w'', w'''.
        self.g0 = np.zeros((n + 2, 8))
        self.g0[0, 4] = self.g0[1, 5] = 1.0
        self.g0[n, 2] = self.g0[n + 1, 3] = 1.0
        self.g1 = np.zeros((n + 2, 8))
        self.g1[:n, 6], self.g1[:n, 7] = bm * _SIN_PHASE[m % 4], bm * _COS_PHASE[m % 4]
        # w0^(j) = -F β^(j-2) (sin θ)^(j-2) for j >= 4, on (F sin θ, F cos θ).
        mm = j - 2
        bmm = beta ** mm.astype(float)
        self.w0 = np.stack([-bmm * _SIN_PHASE[mm % 4], -bmm * _COS_PHASE[mm % 4]], axis=1)

    def pick(self, model, out, Y) -> np.ndarray:
        """v (8 rows) and w0 … w0''' (4 rows) from the rows of _StationTable.state and its columns Y at some
        stations (the load term P u / EI of v[4] is added by the caller)."""
        if self._pick is None:
            EI = model.EI
            F = float(model.bow.terms[0][0]) if model.bow.terms else 0.0
            so, sy = np.zeros((12, 11)), np.zeros((12, 18))
            so[0, 0] = so[1, 1] = so[2, 8] = 1.0  # w, θ, -M/EI
            so[3, 4] = -1.0 / EI  # -V/EI
            sy[4, 13], sy[5, 14] = 1.0 / EI, 1.0 / EI  # q/EI, q'/EI
            sy[6, 15], sy[7, 16] = F, F  # F sin θ, F cos θ
            so[8, 5] = 1.0  # w0
            sy[9, 10] = sy[10, 11] = sy[11, 12] = 1.0  # w0', w0'', w0'''
            self._pick = (so, sy)
        so, sy = self._pick
        return so @ out + sy @ Y

    def recursion(self, s: float) -> np.ndarray:
        """The derivatives 4, 5, … of w on v: shape (derivatives - 4, 8)."""
        pw = np.empty(self.exponents.size + 1)
        np.power(-s, self.exponents, out=pw[:-1])
        pw[-1] = 0.0
        return pw[self.kexp] @ (self.g0 + s * self.g1)


def _series_tables(model) -> _SeriesTables:
    tables = model.__dict__.get("_series_tables")
    if tables is None:
        tables = model._series_tables = _SeriesTables(model)
    return tables


def _nearest_station(pts, seg, xi):
    """Index of the station nearest each point within its segment, and the offset from it; kept on pts."""
    cache = pts.__dict__.get("_nearest")
    if cache is not None and cache[0] is seg and cache[1] is xi:
        return cache[2], cache[3]
    span = float(pts.h.max(initial=1.0)) * 2.0
    key_all = pts.seg + pts.xi / span  # segment, then ξ/(2 h_max) in [0, 0.5]
    key = seg + xi / span
    pos = np.searchsorted(key_all, key)
    lo_i = np.clip(pos - 1, 0, pts.size - 1)
    hi_i = np.clip(pos, 0, pts.size - 1)
    d_lo = np.where(pts.seg[lo_i] == seg, np.abs(xi - pts.xi[lo_i]), np.inf)
    d_hi = np.where(pts.seg[hi_i] == seg, np.abs(pts.xi[hi_i] - xi), np.inf)
    k = np.where(d_lo <= d_hi, lo_i, hi_i)
    t = xi - pts.xi[k]
    pts._nearest = (seg, xi, k, t)
    return k, t


def _refine_by_series(batch, pts, st, fid, k, lo, hi, x0, also):
    r"""The zeros of the targets and the state there (and at ``also``) from Taylor series about the stations.

    At a station the state gives :math:`w, w', w'', w'''`, and the governing equation gives every higher
    derivative (:class:`_SeriesTables`), so the solution between stations is its Taylor series about the
    station: exact to rounding when the distance times the largest wavenumber (:math:`\sqrt{|P|/EI}` or the
    bow's :math:`\beta`) is at most 0.5, with 18 terms. Each zero is found by Halley's iteration on that
    series
    from the secant start, inside its bracket. This gives what an exact evaluation at the zero gives (a test
    checks it) without evaluating the basis functions again. Returns None where it does not apply (coarse
    stations for the wavenumber, strong tension, more than one bow sinusoid, a zero that does not settle
    inside its bracket); the caller then evaluates exactly.
    """
    if st is None:
        return None
    model = batch.model
    tables = _series_tables(model)
    if not tables.usable:
        return None
    P = float(batch.P[0])
    EI = model.EI
    s = P / EI
    wave = max(math.sqrt(abs(s)), tables.beta)
    n_roots = k.size
    width = hi - lo
    reach = float(width.max(initial=0.0))
    if also is not None:
        ka, ta = _nearest_station(pts, also[0], also[1])
        reach = max(reach, float(np.abs(ta).max(initial=0.0)))
    else:
        ka, ta = np.empty(0, dtype=int), np.empty(0)
    if not reach * wave <= _SERIES_REACH:
        return None
    kk = np.concatenate([k, ka]) if ka.size else k
    n = kk.size
    rows = st.get("_table")
    if rows is not None:
        # The state's rows and the stations' columns (_StationTable) at the stations: v and w0 … w0''' by two
        # small products.
        out, Y = rows
        vw = tables.pick(model, out[:, kk], Y[:, kk])
        vw[4] += P * model.bow.uniform / EI
        v = vw[:8].T
        bow4 = vw[8:].T
    else:
        v = np.empty((n, 8))
        v[:, 0] = st["w"][kk]
        v[:, 1] = st["rotation"][kk]
        v[:, 2] = st["M"][kk] * (-1.0 / EI)
        v[:, 3] = st["V"][kk] * (-1.0 / EI)
        v[:, 4] = (pts.q[kk] + P * model.bow.uniform) / EI
        v[:, 5] = pts.q1[kk] / EI
        if pts.waves:
            F, _, _, sn, cs = pts.waves[0]
            v[:, 6], v[:, 7] = F * sn[kk], F * cs[kk]
        else:
            v[:, 6:] = 0.0
        bow4 = np.stack([st[name][kk] for name in ("w0", "w0_1", "w0_2", "w0_3")], axis=1)
    D = _SERIES_DERIVATIVES
    both = np.empty((n, 2 * D))
    d, w0 = both[:, :D], both[:, D:]  # w, w', w'', ... and w0, w0', ... at each station
    d[:, :4] = v[:, :4]
    d[:, 4:] = v @ tables.recursion(s).T
    w0[:, :4] = bow4
    w0[:, 4:] = v[:, 6:] @ tables.w0.T
    t = x0 - lo
    if n_roots:
        # Each target's derivatives (rotation w', total slope w' + w0', V = -EI w''', dV/dx = -EI w''''), as
        # the series of the target and of its first two derivatives in t.
        rows = np.arange(n_roots)[:, None, None]
        idx = _TARGET_OFFSET[fid][:, None, None] + _WINDOWS[:3]
        series = d[rows, idx]
        total = fid == 1
        if total.any():
            series += np.where(total[:, None, None], w0[rows, idx], 0.0)
        series *= np.where(fid >= 2, -EI, 1.0)[:, None, None] * _INV_FACTORIAL
        tol = 1e-7 * float(width.max())
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            for iteration in range(8):
                f0, f1, f2 = (series @ np.power(t[:, None], _POWERS)[:, :, None])[:, :, 0].T
                step = f0 * f1 / (0.5 * f0 * f2 - f1 * f1)
                t = t + step
                # From the secant start the first step is never the last. Halley converges cubically: once a
                # step is below 1e-7 of the bracket, what is left is below rounding.
                if iteration and np.abs(step).max() <= tol:
                    break
            else:
                return None
        if not ((t > 0.0) & (t < width)).all():
            return None
    tt = np.concatenate([t, ta]) if ka.size else t
    powers = np.power(tt[:, None], _POWERS) * _INV_FACTORIAL
    # w, w', w'', w''', w0, w0' there, then the state's rows: w, θ, M = -EI w'', T = V - P(θ + w0'),
    # V = -EI w''' and w0.
    series = (both[:, _STATE_WINDOWS] @ powers[:, :, None])[:, :, 0]
    to_rows = _TO_ROWS.copy()
    to_rows[2, 2] = to_rows[3, 3] = to_rows[4, 3] = -EI
    to_rows[3, 1] = to_rows[3, 5] = -P
    rows = to_rows @ series.T
    out = dict(zip(_STATE_FIELDS, rows, strict=True))
    out["_rows"] = rows
    return np.zeros(n_roots, dtype=int), pts.seg[k], lo + t, out


def _taylor(batch, st, q, q1, n, h):
    """The state moved by h along the first n points (third order), the rest unchanged.

    ``q`` and ``q1`` are the load intensity [N/m] and its slope [N/m²] at those n points.
    """
    EI = batch.model.EI
    P = st["P"]
    P = P[:n] if np.ndim(P) else P
    w, th, M, T, V = (st[k][:n] for k in ("w", "rotation", "M", "T", "V"))
    w0, d1, d2, d3 = (st[k][:n] for k in ("w0", "w0_1", "w0_2", "w0_3"))
    dV = -q + P * (d2 - M / EI)
    ddV = -q1 + P * (d3 - V / EI)
    h2, h3 = h * h / 2, h * h * h / 6
    moved = {
        "w": w + th * h - M / EI * h2 - V / EI * h3,
        "rotation": th - M / EI * h - V / EI * h2 - dV / EI * h3,
        "M": M + V * h + dV * h2 + ddV * h3,
        "T": T - q * h - q1 * h2,
        "V": V + dV * h + ddV * h2,
        "w0": w0 + d1 * h + d2 * h2 + d3 * h3,
    }
    return {name: np.concatenate([moved[name], st[name][n:]]) for name in _STATE_FIELDS}


def strongest_tension_kappa(model: Model, P) -> float:
    """:math:`\\sqrt{-P_{min}/EI}` for the strongest tension among ``P`` [1/m], 0 without tension."""
    pmin = float(np.min(P))
    return math.sqrt(-pmin / model.EI) if pmin < 0 else 0.0
