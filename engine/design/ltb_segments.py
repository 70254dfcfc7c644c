"""The unbraced segments of a member in the lateral-torsional buckling check, and AISC 360-16 §F2/§F11.2 on
them.

A brace point holds the section laterally and against twist (``"fixed"`` both); the pieces between brace
points are the segments. EN 1993-1-1's tabulated M_cr and AISC's nominal strength are taken per segment,
each with its own length, diagram and ends (a brace point is a fork with warping free: the neighbours'
restraint left out, on the safe side); :func:`engine.design.ltb_member.check` calls :func:`aisc_segments`.

AISC per segment: L_b its length, C_b of eq. (F1-1) from its own diagram, capped so that C_b·M_cr(L_b,
uniform moment) never exceeds an exact elastic critical moment that sees the load height (a load on the
top flange lowers M_cr, which eq. (F1-1) does not see; AISC 360-16 Commentary to §F1 says to account for
it; from memory):

- a member of one segment: the member's own M_cr at N = 0, α_cr,0·M_max (as before);
- a member of several: the segment's own M_cr (:func:`segment_mcr`: the piece alone between its ends, with
  its own loads at their height and the restraints inside it), and the segment's M_n never above
  α_cr,0·M_max,seg, the member's exact elastic critical moment at the segment's peak, which no segment's
  strength can exceed.

Capping C_b by the member's α_cr,0 alone (the rule before) made a short stocky segment beside a long one
absurdly weak: the long segment buckles first, so α_cr,0·M_max,seg / M_cr(L_b) is small there, and C_b
(0.19 on an invented IPE 300 of 8 m braced at 2 m) then scales §F2's inelastic straight line, whose
strength is not elastic buckling at all (utilisation 2.30 where the segments checked one by one give about
1.3).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from engine.design import ltb
from engine.design.mcr import critical_moment

__all__ = [
    "AISC_SOURCE",
    "AISC_SOURCE_F11",
    "aisc_segments",
    "aisc_source",
    "end_pair",
    "piece",
    "segment_mcr",
]

AISC_SOURCE = "AISC 360-16 §F1 eq. (F1-1), §F2 eqs. (F2-1)–(F2-7) (from memory)"
AISC_SOURCE_F11 = "AISC 360-16 §F1 eq. (F1-1), §F11.2 eqs. (F11-1)–(F11-4) (from memory)"


def piece(xs: np.ndarray, ms: np.ndarray, a: float, b: float) -> tuple[np.ndarray, np.ndarray]:
    """The diagram on [a, b] (its end values interpolated; a station given twice keeps its last value)."""
    keep = np.concatenate([np.diff(xs) > 0.0, [True]])
    x, m = xs[keep], ms[keep]
    inside = (x > a) & (x < b)
    return (
        np.concatenate([[a], x[inside], [b]]),
        np.concatenate([[np.interp(a, x, m)], m[inside], [np.interp(b, x, m)]]),
    )


def end_pair(pair, a: float, b: float, length: float, inner: str) -> tuple:
    """A segment's end conditions: the member's at its ends, ``inner`` at a brace point (fork, warping free:
    the neighbours' restraint left out, on the safe side)."""
    return (pair[0] if a <= 0.0 else inner, pair[1] if b >= length else inner)


def _piece_loads(loads, a: float, b: float) -> list:
    """The loads of :func:`critical_moment`'s form that act on (a, b), in the segment's own x (from a)."""
    out = []
    for load in loads:
        if load["kind"] == "uniform":
            start, end = max(load["start"], a), min(load["end"], b)
            if end > start:
                out.append({**load, "start": start - a, "end": end - a})
        elif a < load["x"] < b:  # a point load at a brace point is held there: no twist from its height
            out.append({**load, "x": load["x"] - a})
    return out


def segment_mcr(xs, ms, a, b, *, length, loads, stiffness, lateral_ends, warping_ends, restraints) -> float:
    """The exact elastic critical moment [N·m] of the segment [a, b] alone at N = 0 (its peak |M| times its
    load factor): its own diagram (a jump, a station given twice, kept), its loads at their height, the
    restraints strictly inside it, and its ends (:func:`end_pair`). NaN where the eigenproblem has no
    answer."""
    keep = np.concatenate([np.diff(xs) > 0.0, [True]])
    inside = (xs > a) & (xs < b)
    x = np.concatenate([[a], xs[inside], [b]]) - a
    m = np.concatenate([[np.interp(a, xs[keep], ms[keep])], ms[inside], [np.interp(b, xs[keep], ms[keep])]])
    EI_z, GI_t, EI_w = stiffness
    try:
        found = critical_moment(
            x,
            m,
            EI_z=EI_z,
            GI_t=GI_t,
            EI_w=EI_w,
            length=b - a,
            loads=_piece_loads(loads, a, b),
            lateral_ends=end_pair(lateral_ends, a, b, length, "fork"),
            warping_ends=end_pair(warping_ends, a, b, length, "free"),
            restraints=tuple({**r, "x": r["x"] - a} for r in restraints if a < r["x"] < b),
        )
    except ValueError:
        return math.nan
    return float(found.M_cr)


def aisc_source(aisc) -> tuple:
    """The source of the AISC part of the check: () where there is none, §F11.2 for a rectangular bar."""
    if aisc is None:
        return ()
    return (AISC_SOURCE_F11 if aisc.clause == "F11" else AISC_SOURCE,)


def aisc_segments(xs, ms, sy, sz, material, segments, I_t, I_w, alpha_0, stiffness, tip=None, own=None):
    """AISC 360-16 §F2 (an I section) or §F11.2 (a deep solid rectangle: d its depth, t its width) per
    unbraced segment (see the module). ``own(a, b)``: the segment's own exact M_cr (:func:`segment_mcr`),
    used where there are several segments. The segment of the largest M_max,seg / M_n governs; returns its
    result and its C_b of eq. (F1-1) before the cap (the route divides the member's largest moment by M_n:
    never less than that segment's own ratio)."""
    dims, bar = sy.dimensions, sy.shape == "rectangle"
    several = len(segments) > 1
    best = None
    for a, b in segments:
        sx, sm = piece(xs, ms, a, b) if several else (xs, ms)
        absolute = np.abs(sm)
        L_b = b - a
        quarter = [float(np.interp(a + t * L_b, sx, absolute)) for t in (0.25, 0.5, 0.75)]
        M_max = float(np.max(absolute))
        if M_max == 0.0:
            continue
        cb_f1 = ltb.cb_aisc(M_max, *(min(q, M_max) for q in quarter))
        if tip is not None and a <= tip <= b:
            cb_f1 = 1.0
        uniform = ltb.mcr_c1(L_b, *stiffness, 1.0)
        member_elastic = alpha_0 * M_max  # the member's exact M_cr at this segment's peak (NaN: unknown)
        elastic = member_elastic
        if several and own is not None:
            elastic = own(a, b)
            if not math.isfinite(elastic):
                elastic = member_elastic
        cb = cb_f1 if not math.isfinite(elastic) else min(cb_f1, max(elastic / uniform, 1e-6))
        common = dict(L_b=L_b, E=material.E, F_y=material.fy, Z_x=sy.W_pl, S_x=sy.W_el, C_b=cb)
        if bar:
            found = ltb.aisc_f11(d=sy.depth, t=sy.width, **common)
            # Never above the exact elastic M_cr at the segment's peak: F11-4's 1.9 holds J ≈ dt³/3, too
            # stiff for a stocky bar (a 2:1 bar's F11-4 lies 17 % above it)
            if math.isfinite(member_elastic) and found.M_n > member_elastic:
                found = dataclasses.replace(found, M_n=member_elastic, zone="exact-cap")
        else:
            found = ltb.aisc_f2(r_y=sz.i, I_y=sz.I, C_w=I_w, J=I_t, h_o=dims["h"] - dims["tf"], **common)
            if several and math.isfinite(member_elastic) and found.M_n > member_elastic:
                found = dataclasses.replace(found, M_n=member_elastic, zone="exact-cap")
        if best is None or M_max / found.M_n > best[0]:
            best = (M_max / found.M_n, found, cb_f1)
    return best[1], best[2]
