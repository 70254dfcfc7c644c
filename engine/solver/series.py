r"""Series refinement: the peaks between stations from the Taylor series of the exact solution about them.

For one axial force the governing equation gives every derivative of w from w … w''' at a station
(:class:`SeriesTables`), so between stations the solution is its Taylor series about the station. With 18
terms it is exact to rounding while the distance times the largest wavenumber (√(|P|/EI), the bow's β) is
at most 0.5. :func:`refine_by_series` finds the zeros of the targets by Halley's iteration on that series,
and the state there; it returns None where it does not apply, and the caller evaluates exactly.
"""

from __future__ import annotations

import math

import numpy as np

from engine.solver.batch import STATE_FIELDS, State

__all__ = ["SERIES_DERIVATIVES", "SeriesTables", "refine_by_series", "series_tables"]

# The Taylor series about a station (see refine_by_series): the terms kept, the derivatives of w that they
# and Halley's iteration on the fourth target (-EI w^(4)) need, and the largest reach (distance times the
# largest wavenumber of the solution) at which the kept terms are exact to rounding: the first neglected
# term is below 0.5^18 / 18! = 6e-22 of the solution's scale.
_SERIES_TERMS = 18
SERIES_DERIVATIVES = _SERIES_TERMS + 6
_SERIES_REACH = 0.5
_INV_FACTORIAL = np.array([1.0 / math.factorial(j) for j in range(_SERIES_TERMS)])
_SIN_PHASE = np.array([1.0, 0.0, -1.0, 0.0])  # the m-th derivative of sin(θ) is β^m (this · sin + next · cos)
_COS_PHASE = np.array([0.0, 1.0, 0.0, -1.0])
_WINDOWS = np.arange(4)[:, None] + np.arange(_SERIES_TERMS)[None, :]  # d[:, _WINDOWS[r]]: the series of w^(r)
_POWERS = np.arange(_SERIES_TERMS, dtype=float)
# From the series (w, w', w'', w''', w0, w0') to the state's rows; the entries set per solve are -EI and -P.
_TO_ROWS = np.zeros((6, 6))
_TO_ROWS[0, 0] = _TO_ROWS[1, 1] = _TO_ROWS[5, 4] = 1.0
_STATE_WINDOWS = np.concatenate([_WINDOWS, SERIES_DERIVATIVES + _WINDOWS[:2]])  # w … w''', w0, w0'
_TARGET_OFFSET = np.array([1, 1, 3, 4])  # the targets are w', (w + w0)', -EI w''' and -EI w''''


class SeriesTables:
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
        n = SERIES_DERIVATIVES - 4
        j = np.arange(4, SERIES_DERIVATIVES)
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
        """v (8 rows) and w0 … w0''' (4 rows) from the rows of StationTable.state and its columns Y at some
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


def series_tables(model) -> SeriesTables:
    """The model's :class:`SeriesTables`, built when first asked for and kept with the model."""
    if model.series_tables is None:
        model.series_tables = SeriesTables(model)
    return model.series_tables


def nearest_station(pts, seg, xi):
    """Index of the station nearest each point within its segment, and the offset from it; kept on pts."""
    cache = pts.nearest
    if cache is not None and cache[0] is seg and cache[1] is xi:
        return cache[2], cache[3]
    span = float(pts.h.max(initial=1.0)) * 2.0
    key_all = pts.seg + pts.xi / span  # segment, then ξ/(2 h_max) in [0, 0.5]
    key = seg + xi / span
    pos = np.searchsorted(key_all, key)
    lo_i = np.minimum(np.maximum(pos - 1, 0), pts.size - 1)
    hi_i = np.minimum(pos, pts.size - 1)  # pos >= 0
    d_lo = np.where(pts.seg[lo_i] == seg, np.abs(xi - pts.xi[lo_i]), np.inf)
    d_hi = np.where(pts.seg[hi_i] == seg, np.abs(pts.xi[hi_i] - xi), np.inf)
    k = np.where(d_lo <= d_hi, lo_i, hi_i)
    t = xi - pts.xi[k]
    pts.nearest = (seg, xi, k, t)
    return k, t


def refine_by_series(batch, pts, st, fid, k, lo, hi, x0, also):
    r"""The zeros of the targets and the state there (and at ``also``) from Taylor series about the stations.

    At a station the state gives :math:`w, w', w'', w'''`, and the governing equation gives every higher
    derivative (:class:`SeriesTables`), so the solution between stations is its Taylor series about the
    station: exact to rounding when the distance times the largest wavenumber (:math:`\sqrt{|P|/EI}` or the
    bow's :math:`\beta`) is at most 0.5, with 18 terms. Each zero is found by Halley's iteration on that
    series from the secant start, inside its bracket. This gives what an exact evaluation at the zero gives (a
    test checks it) without evaluating the basis functions again. Returns None where it does not apply (coarse
    stations for the wavenumber, strong tension, more than one bow sinusoid, a zero that does not settle
    inside its bracket); the caller then evaluates exactly.
    """
    if st is None:
        return None
    model = batch.model
    tables = series_tables(model)
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
        ka, ta = nearest_station(pts, also[0], also[1])
        reach = max(reach, float(np.abs(ta).max(initial=0.0)))
    else:
        ka, ta = np.empty(0, dtype=int), np.empty(0)
    if not reach * wave <= _SERIES_REACH:
        return None
    kk = np.concatenate([k, ka]) if ka.size else k
    n = kk.size
    if n == 0:  # no zero between the stations and nothing else asked for: what the series would return
        rows = np.empty((len(STATE_FIELDS), 0))
        out = State(**dict(zip(STATE_FIELDS, rows, strict=True)), rows=rows)
        return np.zeros(0, dtype=int), pts.seg[k], np.empty(0), out
    if st.columns is not None:
        # The state's rows and the stations' columns (StationTable) at the stations: v and w0 … w0''' by two
        # small products.
        vw = tables.pick(model, st.rows[:, kk], st.columns[:, kk])
        vw[4] += P * model.bow.uniform / EI
        v = vw[:8].T
        bow4 = vw[8:].T
    else:
        v = np.empty((n, 8))
        v[:, 0] = st.w[kk]
        v[:, 1] = st.rotation[kk]
        v[:, 2] = st.M[kk] * (-1.0 / EI)
        v[:, 3] = st.V[kk] * (-1.0 / EI)
        v[:, 4] = (pts.q[kk] + P * model.bow.uniform) / EI
        v[:, 5] = pts.q1[kk] / EI
        if pts.waves:
            F, _, _, sn, cs = pts.waves[0]
            v[:, 6], v[:, 7] = F * sn[kk], F * cs[kk]
        else:
            v[:, 6:] = 0.0
        bow4 = np.stack([st.w0[kk], st.w0_1[kk], st.w0_2[kk], st.w0_3[kk]], axis=1)
    D = SERIES_DERIVATIVES
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
    out = State(**dict(zip(STATE_FIELDS, rows, strict=True)), rows=rows)
    return np.zeros(n_roots, dtype=int), pts.seg[k], lo + t, out
