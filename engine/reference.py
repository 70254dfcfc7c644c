r"""The first-order reference moment of the amplification, with the bow's moment in it.

A bow :math:`w_0` does nothing at :math:`P = 0`, so the first-order moment :math:`M_I` alone leaves it out,
and the ratio :math:`\max|M_{II}| / \max|M_I|` then counts the bow's moment as "amplification". The reference
here is the moment the loads and the bow give before the member deflects further:

.. math::

    M_{I,ref}(x) = M_I(x) + N\,w_0(x),

the form practitioners amplify, :math:`(M_I + N e_0)/(1 - N/N_{cr})`, and the one the deflection amplification
already uses (:math:`\max|w + w_0| / \max|w_I + w_0|`). For a sine bow on a pin-ended member the bow's part
amplifies by exactly :math:`1/(1 - \alpha)` (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. 1961,
ch. 1, derived). Its largest magnitude is found from the stations by a Newton step on
:math:`(M_I + N w_0)' = V_I + N w_0'`, evaluated exactly (one solve) or by its quadratic Taylor model (a
sweep, where it serves a plot).
"""

from __future__ import annotations

import numpy as np

from engine.solution import Batch, Points

__all__ = ["ReferenceData", "reference_peak", "reference_peaks"]


class ReferenceData:
    """M_I, V_I, −q and w0, w0', w0'' at some stations of a model (P = 0), for the reference of any P."""

    def __init__(self, model, seg, xi):
        self.model = model
        self.batch = Batch(model, [0.0])
        pts = Points(model, seg, xi)
        st = self.batch.states(0, pts)
        self.seg, self.xi, self.x, self.h = pts.seg, pts.xi, pts.x, pts.h
        self.M, self.V, self.dV = st["M"], st["V"], -pts.q  # at P = 0, V = T and V' = -q
        self.w0, self.d1, self.d2 = pts.bow[0], pts.bow[1], pts.bow[2]
        self.spacing = float(np.diff(np.unique(self.x)).max()) if self.x.size > 1 else float(model.L)


def _value_at(data: ReferenceData, seg: int, xi: float, P: float):
    """M_I + P w0 and its first two derivatives at one point, exactly."""
    pts = Points(data.model, np.array([seg]), np.array([xi]))
    st = data.batch.states(0, pts)
    w0, d1, d2, _ = pts.bow
    return (float(st["M"][0] + P * w0[0]), float(st["V"][0] + P * d1[0]), float(-pts.q[0] + P * d2[0]))


def reference_peak(data: ReferenceData, P: float) -> tuple[float, float]:
    """max|M_I + P w0| [N·m] and where [m], for one axial force (exact to rounding)."""
    f = data.M + P * data.w0
    i = int(np.argmax(np.abs(f)))
    best, where = abs(float(f[i])), float(data.x[i])
    if P == 0.0 or not np.any(data.w0):
        return best, where
    seg, xi, h = int(data.seg[i]), float(data.xi[i]), float(data.h[i])
    slope, curv = float(data.V[i] + P * data.d1[i]), float(data.dV[i] + P * data.d2[i])
    for _ in range(3):  # Newton on the slope, kept in the segment and near the station
        if curv == 0.0:
            break
        step = float(np.clip(-slope / curv, -data.spacing, data.spacing))
        trial = min(max(xi + step, 0.0), h)
        if trial == xi:
            break
        value, s1, c1 = _value_at(data, seg, trial, P)
        if abs(value) <= best:
            break
        best, where, xi, slope, curv = abs(value), float(data.model.xa[seg] + trial), trial, s1, c1
    return best, where


def reference_peaks(data: ReferenceData, P: np.ndarray) -> np.ndarray:
    """max|M_I + P w0| [N·m] for many axial forces (quadratic Taylor model about the best station)."""
    P = np.asarray(P, dtype=float)
    f = data.M[None, :] + P[:, None] * data.w0[None, :]
    i = np.argmax(np.abs(f), axis=1)
    rows = np.arange(P.size)
    value = f[rows, i]
    slope = data.V[i] + P * data.d1[i]
    curv = data.dV[i] + P * data.d2[i]
    with np.errstate(divide="ignore", invalid="ignore"):
        step = np.where(curv != 0.0, -slope / curv, 0.0)
    step = np.clip(step, -data.xi[i], data.h[i] - data.xi[i])
    step = np.clip(step, -data.spacing, data.spacing)
    model_value = value + slope * step + 0.5 * curv * step * step
    return np.maximum(np.abs(value), np.abs(model_value))
