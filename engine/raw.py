"""The solution of one prepared member at one axial force, as :func:`engine.solve` uses it: the state at the
stations, the peaks between them found and merged in, and the reversed bow's solution formed from the forward
and bow-free ones (the problem is linear in the loads and the bow at a given axial force)."""

from __future__ import annotations

import math

import numpy as np

from engine.errors import CaseError
from engine.solver.batch import STATE_FIELDS, Batch, State
from engine.solver.peaks import refine_peaks

__all__ = ["CRITICAL_TOLERANCE", "critical_index", "raw", "reversed_raw"]

#: |P/Pcr_n - 1| below this counts as at the critical load (no equilibrium) [-].
CRITICAL_TOLERANCE = 1e-10


def critical_index(P: float, pcr) -> int:
    """1-based index of the critical load P is at, or 0 (one axial force: plain floats are quicker). Every
    critical load is positive here: :func:`raw` refuses compression on a member whose first one is 0."""
    if P <= 0:
        return 0
    for n, value in enumerate(pcr.tolist(), start=1):
        if abs(P / value - 1.0) < CRITICAL_TOLERANCE:
            return n
    return 0


def _merged_order(pts, extra_seg, extra_xi, L):
    """Indices into [base stations, extra points] that list the shown base stations and the extra points
    along the member, dropping an extra point that repeats a station or another extra point."""
    base_idx, base_key = pts.order_key
    padded = pts.padded_key
    if padded is None:  # the shown stations' keys between -inf and +inf, so that both neighbours always exist
        padded = pts.padded_key = np.concatenate([[-np.inf], base_key, [np.inf]])
    key = extra_seg * (2.0 * L) + extra_xi
    eo = np.argsort(key, kind="stable")
    key = key[eo]
    pos = np.searchsorted(base_key, key)
    tol = 1e-11 * L
    keep = np.minimum(key - padded[pos], padded[pos + 1] - key) > tol
    keep[1:] &= np.diff(key) > tol
    pos = pos[keep]
    out = np.empty(base_idx.size + pos.size, dtype=base_idx.dtype)
    at = pos + np.arange(pos.size)  # where each kept extra point lands (pos is sorted)
    rest = np.ones(out.size, dtype=bool)
    rest[at] = False
    out[at] = pts.size + eo[keep]
    out[rest] = base_idx
    return out


def raw(prep, n: int, P: float):
    """One prepared member at one axial force: status, critical index and the state at the stations.

    Returns ``(status, n_crit, values, x, seg, xi, batch, st, pts, merge)``: ``values`` at the shown stations
    and the peaks merged along ``x``, ``st`` the state at the base stations ``pts`` (None at a critical load),
    ``merge`` = (pts, order, extra_seg, extra_xi): ``x`` is [base stations, extra points][order]."""
    model, pcr = prep.model, prep.buckling.critical_loads
    if P > 0.0 and not pcr[0] > 0.0:
        raise CaseError(
            "supports: the ends leave the member a first critical load of 0 N (a spring so soft that the "
            "member is free to sway, e.g. 1e-194 N/m), so it cannot carry the compression of "
            f"{P:g} N; give a stiffer spring or hold the translation (pinned, fixed)"
        )
    n_crit = critical_index(P, pcr)
    seg, xi, shown, pts = prep.stations(n, math.sqrt(-P / float(model.EI_seg.min())) if P < 0 else 0.0)
    batch = Batch(model, [P], at=pts)
    status = "stable"
    if n_crit or batch.singular[0]:
        status = "critical"
        n_crit = n_crit or int(np.searchsorted(pcr, P)) + 1
    elif P > pcr[0]:
        status = "unstable"
    st = None if status == "critical" else batch.states(0, pts)
    return _peaks_merged(prep, n, status, n_crit, seg, xi, pts, batch, st)


def _peaks_merged(prep, n, status, n_crit, seg, xi, pts, batch, st):
    """:func:`raw` from the batch and the state at the base stations: the peaks found and merged in."""
    model = prep.model
    _, first_seg, first_xi, _, _, _ = prep.first_order(n)
    if status == "critical":
        ps, px = np.empty(0, dtype=int), np.empty(0)
    else:
        _, ps, px, ext = refine_peaks(
            batch, 0, pts, *batch.targets(st, pts), also=(first_seg, first_xi), states=st
        )
    # The peaks of both orders become stations, so that first_order shares x and both are exact there.
    extra_seg, extra_xi = np.concatenate([ps, first_seg]), np.concatenate([px, first_xi])
    order = _merged_order(pts, extra_seg, extra_xi, model.L)
    seg, xi = np.concatenate([seg, extra_seg])[order], np.concatenate([xi, extra_xi])[order]
    x = np.concatenate([pts.x_exact, model.position(extra_seg, extra_xi)])[order]
    if status == "critical":
        values = {"w0": model.bow.derivatives(x)[0]}
        batch = None
    else:
        # One gather for all six fields: rows of one array (each row is contiguous).
        both = np.concatenate([st.stacked(), ext.stacked()], axis=1)[:, order]
        values = dict(zip(STATE_FIELDS, both, strict=True))
    return status, n_crit, values, x, seg, xi, batch, st, pts, (pts, order, extra_seg, extra_xi)


def reversed_raw(prep, n: int, P: float, forward, free_raw, sources):
    """:func:`raw` of the reversed-bow variant ``prep`` from the forward and bow-free solutions (``forward``,
    ``free_raw``, of the prepared members ``sources``), or None where they do not serve.

    At a given N the problem is linear in the loads and the bow, so with the bow reversed every field (w, the
    rotation, M, T, V) and the solution's coefficients are 2 × (bow-free) − (forward). Only the stations'
    state and the coefficients are combined; the peaks are then found on the combined solution by the same
    refinement as for a solved one, so they are the peaks of the combination itself.
    """
    if forward[0] == "critical" or free_raw[0] != forward[0] or forward[7] is None or free_raw[7] is None:
        return None
    kappa = math.sqrt(-P / float(prep.model.EI_seg.min())) if P < 0 else 0.0
    seg, xi, _, pts = prep.stations(n, kappa)
    # The same stations (the bow adds none), so that the states combine pointwise. The stations are kept per
    # prepared member and never change, so the verdict is kept with them.
    key = (n, kappa, *map(id, sources))
    same = prep.same_stations.get(key)
    if same is None or same[0] is not sources[0] or same[1] is not sources[1]:
        verdict = True
        for other in sources:
            o_seg, o_xi, _, _ = other.stations(n, kappa)
            verdict = verdict and np.array_equal(o_seg, seg) and np.array_equal(o_xi, xi)
        same = prep.same_stations[key] = (sources[0], sources[1], verdict)
    if not same[2]:
        return None
    st_f, st_0 = forward[7], free_raw[7]
    batch = Batch.combined(prep.model, ((-1.0, forward[6]), (2.0, free_raw[6])))
    if batch is None:
        return None
    w0, d1, d2, d3 = pts.bow
    fields = {name: 2.0 * st_0[name] - st_f[name] for name in ("w", "rotation", "M", "T", "V")}
    st = State(**fields, w0=w0, w0_1=d1, w0_2=d2, w0_3=d3, P=st_f.P)
    return _peaks_merged(prep, n, forward[0], forward[1], seg, xi, pts, batch, st)
