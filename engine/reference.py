r"""The first-order reference moment of the amplification, with the bow's moment in it.

A bow :math:`w_0` does nothing at :math:`P = 0`, so the first-order moment :math:`M_I` alone leaves it out,
and the ratio :math:`\max|M_{II}| / \max|M_I|` then counts the bow's moment as "amplification". The reference
here is the moment the loads and the bow give before the member deflects further:

.. math::

    M_{I,ref}(x) = M_I(x) + N\,w_0(x),

the form practitioners amplify, :math:`(M_I + N e_0)/(1 - N/N_{cr})`, and the one the deflection amplification
already uses (:math:`\max|w + w_0| / \max|w_I + w_0|`). For a sine bow on a pin-ended member the bow's part
amplifies by exactly :math:`1/(1 - \alpha)` (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. 1961,
ch. 1, derived). Its largest magnitude is found from the stations by Newton's iteration on
:math:`(M_I + N w_0)' = V_I + N w_0'`, on the exact cubic of :math:`M_I` in each segment.
"""

from __future__ import annotations

import numpy as np

from engine.solution import Batch, Points

__all__ = ["ReferenceData", "reference_peak", "reference_peaks"]


class ReferenceData:
    """M_I, V_I, q, q' and the bow at some stations of a model (P = 0), for the reference of any P.

    At P = 0, V' = -q and M'' = -q with q linear in each segment, so M_I is a cubic there and
    :math:`M_I(s + d) = M_I + V_I d - q d^2/2 - q' d^3/6` holds exactly; the bow is evaluated directly.
    """

    def __init__(self, model, seg, xi):
        self.model = model
        pts = Points(model, seg, xi)
        st = Batch(model, [0.0]).states(0, pts)
        self.bow = model.bow
        self.x, self.xi, self.h = pts.x, pts.xi, pts.h
        self.M, self.V, self.q, self.q1 = st["M"], st["V"], pts.q, pts.q1  # at P = 0, V = T
        self.w0 = pts.bow[0]
        self.spacing = float(np.diff(np.unique(self.x)).max()) if self.x.size > 1 else float(model.L)


def _refined(data: ReferenceData, i: np.ndarray, P: np.ndarray) -> np.ndarray:
    """|M_I + P w0| at the peak near station i (Newton on the slope, kept in the segment and near the
    station), never below the station's own value."""
    M, V, q, q1 = data.M[i], data.V[i], data.q[i], data.q1[i]
    x, low, high = data.x[i], -data.xi[i], data.h[i] - data.xi[i]
    low, high = np.maximum(low, -data.spacing), np.minimum(high, data.spacing)
    d = np.zeros_like(x)
    for _ in range(6):
        _, d1, d2, _ = data.bow.derivatives(x + d)
        slope = V - q * d - 0.5 * q1 * d * d + P * d1
        curv = -q - q1 * d + P * d2
        with np.errstate(divide="ignore", invalid="ignore"):
            step = np.where(curv != 0.0, -slope / curv, 0.0)
        moved = np.clip(d + step, low, high)
        if np.all(np.abs(moved - d) <= 1e-13 * data.spacing):
            d = moved
            break
        d = moved
    w0 = data.bow.derivatives(x + d)[0]
    value = M + V * d - 0.5 * q * d * d - q1 * d**3 / 6.0 + P * w0
    station = M + P * data.w0[i]
    return np.maximum(np.abs(station), np.abs(value)), np.where(np.abs(value) > np.abs(station), x + d, x)


def reference_peak(data: ReferenceData, P: float) -> tuple[float, float]:
    """max|M_I + P w0| [N·m] and where [m], for one axial force (exact to rounding; plain floats, quicker
    than arrays of one)."""
    f = data.M + P * data.w0
    i = int(np.argmax(np.abs(f)))
    station, x = float(f[i]), float(data.x[i])
    M, V, q, q1 = float(data.M[i]), float(data.V[i]), float(data.q[i]), float(data.q1[i])
    low = max(-float(data.xi[i]), -data.spacing)
    high = min(float(data.h[i] - data.xi[i]), data.spacing)
    d, value = 0.0, station
    derivatives = data.bow.derivatives
    for _ in range(8):
        _, d1, d2, _ = derivatives(np.array([x + d]))
        slope = V - q * d - 0.5 * q1 * d * d + P * float(d1[0])
        curv = -q - q1 * d + P * float(d2[0])
        if curv == 0.0:
            break
        moved = min(max(d - slope / curv, low), high)
        done = abs(moved - d) <= 1e-13 * data.spacing
        d = moved
        if done:
            break
    if d != 0.0:
        value = M + V * d - 0.5 * q * d * d - q1 * d**3 / 6.0 + P * float(derivatives(np.array([x + d]))[0][0])
    if abs(value) > abs(station):
        return abs(value), x + d
    return abs(station), x


def reference_peaks(data: ReferenceData, P: np.ndarray) -> np.ndarray:
    """max|M_I + P w0| [N·m] for many axial forces."""
    P = np.asarray(P, dtype=float)
    i = np.argmax(np.abs(data.M[None, :] + P[:, None] * data.w0[None, :]), axis=1)
    return _refined(data, i, P)[0]
