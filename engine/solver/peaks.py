"""The stations along the member and the peaks between them.

:func:`base_stations` places the stations (a uniform grid, every node, and more in the boundary layers of
strong tension); :func:`refine_peaks` finds the interior zeros of the targets (rotation, total slope, V,
dV/dx), whose positions are the peaks of w, w + w0, M and V, and the state there: by the Taylor series about
the stations (:mod:`engine.solver.series`) for one axial force where it applies, by Newton's iteration on
exact evaluations otherwise.
"""

from __future__ import annotations

import math

import numpy as np

from engine.solver import series
from engine.solver.batch import STATE_FIELDS, Batch, State
from engine.solver.model import Model, Points

__all__ = ["base_stations", "refine_peaks", "strongest_tension_kappa"]

# The fields of a state that hold one value per point, kept in step while the peaks are refined.
_PER_POINT = (*STATE_FIELDS, "w0_1", "w0_2", "w0_3", "P")


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
        jump_after = not last and (
            model.force[j + 1] != 0.0 or model.couple[j + 1] != 0.0 or j + 1 in model.restraint_nodes
        )
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
    states : State, optional
        The states at ``pts`` (what ``batch.states`` returned), for a single axial force: the zeros and the
        state there then come from the Taylor series of the exact solution about the stations
        (:func:`engine.solver.series.refine_by_series`) wherever that series is short enough; otherwise, or
        without ``states``, from exact evaluations as above.

    Returns
    -------
    iP, seg, xi : ndarray
        Where the zeros are.
    states : State
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
    any_zero = bool(zero.any())
    if any_zero:
        left_side = np.where(zero, df, f)  # just right of a station
        right_side = np.where(zero, -df, f)  # just left of it
    else:  # no value is zero: both sides are the values themselves
        left_side = right_side = f
    # signs, not the product: the product of two values near 1e±200 overflows (a warning, and the same answer)
    sign_change = (np.sign(left_side[:, :-1]) * np.sign(right_side[:, 1:]) < 0) & same[None, :]
    fid, k = np.nonzero(sign_change)
    if k.size == 0 and single and batch.P.size == 1:  # no bracket: only the points ``also`` to evaluate
        none = xi[k]
        fast = series.refine_by_series(batch, pts, st_at_stations, fid, k, none, none, none, also)
        if fast is not None:
            return fast
    flo, fhi = left_side[fid, k], right_side[fid, k + 1]
    n_roots = k.size
    lo, hi = xi[k], xi[k + 1]
    # Start from the secant; beside a zero station, from the parabola through that zero with its slope and the
    # other end's value. Either start is within O(Δx²) of the root, so one Newton step leaves O(Δx⁴).
    width = hi - lo
    x0 = lo - flo * width / (fhi - flo)  # the secant; flo and fhi have opposite signs, so no division by zero
    if any_zero:
        # One gather for what the parabola needs, at the left (k) and right (k + 1) station of each bracket.
        both = np.concatenate([k, k + 1])
        fid2 = np.concatenate([fid, fid])
        g_f, g_df, g_zero = f[fid2, both], df[fid2, both], zero[fid2, both]
        if g_zero.any():
            z_lo, z_hi = g_zero[:n_roots], g_zero[n_roots:]
            with np.errstate(divide="ignore", invalid="ignore"):
                d_lo, d_hi = g_df[:n_roots], g_df[n_roots:]
                from_lo = lo - d_lo / ((g_f[n_roots:] - d_lo * width) / width**2)
                from_hi = hi - d_hi / ((g_f[:n_roots] + d_hi * width) / width**2)
            x0 = np.where(z_lo, from_lo, np.where(z_hi, from_hi, x0))
            x0 = np.where(np.isfinite(x0) & (x0 > lo) & (x0 < hi), x0, 0.5 * (lo + hi))
    if single and batch.P.size == 1 and not batch.model.special:
        fast = series.refine_by_series(batch, pts, st_at_stations, fid, k, lo, hi, x0, also)
        if fast is not None:
            return fast
    bi, bs = iP[k], seg[k]
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
    EI_at = trial.EI if np.ndim(trial.EI) == 0 else trial.EI[:n_roots]
    scale = np.minimum(trial.h[:n_roots], 1.0 / np.sqrt(np.abs(P_at) / EI_at + 1e-300))
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
        for name in _PER_POINT:
            values = getattr(st, name)
            if isinstance(values, np.ndarray) and values.ndim == 1 and values.size == trial.size:
                values[sub] = getattr(st_sub, name)
        q_at[sub] = trial.q0[sub] + trial.q1[sub] * xs
    x1 = x0 + step
    ok = np.isfinite(x1) & (x1 >= lo) & (x1 <= hi)
    if not ok.all():  # a flat or odd bracket: bisect the half with the sign change and evaluate it exactly
        left = np.sign(fx) == np.sign(flo)
        x1 = np.where(ok, x1, np.where(left, 0.5 * (x0 + hi), 0.5 * (lo + x0)))
        step = np.where(ok, step, 0.0)
    k_at = trial.k if np.ndim(trial.k) == 0 else trial.k[:n_roots]
    out = _taylor(batch, st, q_at, trial.q1[:n_roots], n_roots, step, EI_at, k_at)
    if not ok.all():
        bad = np.nonzero(~ok)[0]
        again = Points(batch.model, bs[bad], x1[bad])
        exact = batch.states(bi[bad] if batch.P.size > 1 else 0, again)
        for name in STATE_FIELDS:
            out[name][bad] = exact[name]
    return bi, bs, x1, out


def _taylor(batch, st, q, q1, n, h, EI, k=0.0):
    """The state moved by h along the first n points (third order), the rest unchanged.

    ``q`` and ``q1`` are the load intensity [N/m] and its slope [N/m²] at those n points, EI [N·m²] and the
    foundation modulus k [N/m²] there (its reaction -k w adds to the load).
    """
    P = st.P
    P = P[:n] if np.ndim(P) else P
    w, th, M, T, V = st.w[:n], st.rotation[:n], st.M[:n], st.T[:n], st.V[:n]
    w0, d1, d2, d3 = st.w0[:n], st.w0_1[:n], st.w0_2[:n], st.w0_3[:n]
    q, q1 = q - k * w, q1 - k * th  # the foundation's reaction is a load -k w
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
    return State(**{name: np.concatenate([moved[name], getattr(st, name)[n:]]) for name in STATE_FIELDS})


def strongest_tension_kappa(model: Model, P) -> float:
    """:math:`\\sqrt{-P_{min}/EI}` for the strongest tension among ``P`` [1/m], 0 without tension."""
    pmin = float(np.min(P))
    return math.sqrt(-pmin / float(model.EI_seg.min())) if pmin < 0 else 0.0
