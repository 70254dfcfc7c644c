r"""The state at fixed stations as polynomials in the axial force, for one axial force at a time.

Where every segment is in the series regime (|P| h²/EI <= 4) every entry of the state rows at a station is a
polynomial in σ = -P/EI whose coefficients depend on the station only (the series of
:func:`engine.solver.functions.phi_series`, summed term by term). They are kept with the stations
(:func:`station_table`), so for one axial force the rows at all stations are one matrix–vector product. This
is a rearrangement of the same exact solution as :meth:`engine.solver.model.Model.basis`, not an
approximation of it: ``tests/engine/test_fast_paths.py`` checks the two agree to 1e-12.
"""

from __future__ import annotations

import math

import numpy as np

from engine.solver.functions import SERIES_LIMIT, SERIES_TERMS
from engine.solver.model import RESONANCE_BAND

__all__ = ["StationTable", "TARGET_ROWS", "TARGET_SLOPE_ROWS", "station_table"]


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


class StationTable:
    r"""The state at fixed stations as polynomials in :math:`\sigma = -P/EI`, for one axial force at a time.

    In the series regime (:math:`|s| h^2 \le 4` in every segment) each entry of :math:`B` and of the
    particular solution's state (:meth:`Model.basis`) is :math:`\sum_j \sigma^j c_j`, with coefficients that
    depend on the point only: :math:`\varphi_n = \sum_j \sigma^j \xi^{n+2j}/(n+2j)!`, and the bow's uniform
    curvature and slope enter through :math:`P = -EI\sigma`. For one axial force the rows at every station
    are then one product with the powers of :math:`\sigma` (the series of
    :func:`engine.solver.functions.phi_series`, summed directly). The state there, and the targets whose
    zeros are peaks, are then one small matrix (built from the segment's coefficients) times the stations'
    columns ``Y`` per segment: 1, ξ, φ0 … φ3, the particular state, the bow's derivatives, q, q' and the bow
    sinusoid. The bow's sinusoid adds its particular solution :math:`A(s)\,(\ldots)`,
    :math:`A = sF/(\beta^2(\beta^2 - s))`; within the resonance band, or outside the series regime,
    :meth:`evaluate` returns None and the caller evaluates the basis functions instead.
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
            if s > 0 and abs(s - b2) <= RESONANCE_BAND * b2:
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


# Rows of StationTable.state that are the targets (θ, θ + w0', V, dV/dx) and their slopes.
TARGET_ROWS = np.array([1, 6, 4, 7])
TARGET_SLOPE_ROWS = np.array([8, 9, 7, 10])


def station_table(model, pts) -> StationTable:
    """The table of the stations ``pts``, built when first asked for and kept with them."""
    if pts.station_table is None:
        pts.station_table = StationTable(model, pts)
    return pts.station_table
