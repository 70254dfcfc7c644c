r"""The first-order reference moment of the amplification, with the bow's moment in it.

A bow :math:`w_0` does nothing at :math:`P = 0`, so the first-order moment :math:`M_I` alone leaves it out,
and the ratio :math:`\max|M_{II}| / \max|M_I|` then counts the bow's moment as "amplification". The reference
here is the moment the loads and the bow give before the member deflects further:

.. math::

    M_{I,ref}(x) = M_I(x) + N\,(w_0(x) - e),

with :math:`e = 0` for a member held at both ends and :math:`e = w_0` at the free end of a cantilever (the
axial force keeps its direction and acts through the tip's initial offset: the sway's moment :math:`N(w_0(x) -
w_0(L))` is largest at the base, where :math:`w_0 = 0`), the form practitioners amplify, :math:`(M_I + N
e_0)/(1 - N/N_{cr})`, and the one the deflection amplification already uses (:math:`\max|w + w_0| / \max|w_I +
w_0|`). For a sine bow on a pin-ended member the bow's part amplifies by exactly :math:`1/(1 - \alpha)`
(Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. 1961, ch. 1, derived). Its largest magnitude is
found from the stations by Newton's iteration on :math:`(M_I + N w_0)' = V_I + N w_0'`, on the exact cubic of
:math:`M_I` in each segment and the bow's Taylor
series to its fifth derivative (no solve, no evaluation of the basis).
"""

from __future__ import annotations

import numpy as np

from engine.solver.batch import Batch
from engine.solver.model import Points

__all__ = ["ReferenceData", "reference_peak", "reference_peaks"]


class ReferenceData:
    r"""M_I, V_I, q, q' and the bow's derivatives at some stations of a model (P = 0), for any P's reference.

    At P = 0, V' = -q and M'' = -q with q linear in each segment, so M_I is a cubic there and
    :math:`M_I(s + d) = M_I + V_I d - q d^2/2 - q' d^3/6` holds exactly. The bow's curvature is a constant u
    plus at most one sinusoid of wavenumber β, so the fourth and fifth derivatives of w0 are
    :math:`-\beta^2 (w_0'' + u)` and :math:`-\beta^2 w_0'''`; its Taylor series to the fifth derivative is
    exact to rounding over a station spacing (the next term is :math:`(\beta d)^6/720` of the bow).
    """

    def __init__(self, model, seg, xi, free_end: str | None = None):
        pts = Points(model, seg, xi)
        st = Batch(model, [0.0]).states(0, pts)
        self.x, self.xi, self.h = pts.x, pts.xi, pts.h
        self.M, self.V, self.q, self.q1 = st["M"], st["V"], pts.q, pts.q1  # at P = 0, V = T
        self.w0, self.d1, self.d2, self.d3 = pts.bow
        if free_end is not None and self.x.size:  # N acts along a line through the free end's offset
            end = int(np.argmin(self.x)) if free_end == "left" else int(np.argmax(self.x))
            self.w0 = self.w0 - self.w0[end]
        bow = model.bow
        b2 = float(bow.terms[0][1]) ** 2 if bow.terms else 0.0
        self.d4, self.d5 = -b2 * (self.d2 + bow.uniform), -b2 * self.d3
        self.spacing = float(np.diff(np.unique(self.x)).max()) if self.x.size > 1 else float(model.L)


def _refined(data: ReferenceData, i, P):
    """|M_I + P w0| at the peak near station(s) i (Newton's iteration on the slope, kept in the segment and
    within a station spacing), never below the station's own value; and where."""
    M, V, q, q1 = data.M[i], data.V[i], data.q[i], data.q1[i]
    w0, d1, d2, d3, d4, d5 = data.w0[i], data.d1[i], data.d2[i], data.d3[i], data.d4[i], data.d5[i]
    low = np.maximum(-data.xi[i], -data.spacing)
    high = np.minimum(data.h[i] - data.xi[i], data.spacing)
    d = 0.0 * M
    for _ in range(8):
        slope = V - q * d - 0.5 * q1 * d * d + P * (d1 + d * (d2 + d * (d3 / 2 + d * (d4 / 6 + d * d5 / 24))))
        curv = -q - q1 * d + P * (d2 + d * (d3 + d * (d4 / 2 + d * d5 / 6)))
        with np.errstate(divide="ignore", invalid="ignore"):
            step = np.where(curv != 0.0, -slope / curv, 0.0)
        moved = np.clip(d + step, low, high)
        done = np.all(np.abs(moved - d) <= 1e-13 * data.spacing)
        d = moved
        if done:
            break
    bow = w0 + d * (d1 + d * (d2 / 2 + d * (d3 / 6 + d * (d4 / 24 + d * d5 / 120))))
    value = np.abs(M + d * (V - d * (q / 2 + d * q1 / 6)) + P * bow)
    station = np.abs(M + P * w0)
    better = value > station
    return np.where(better, value, station), np.where(better, data.x[i] + d, data.x[i])


def _refined_one(data: ReferenceData, i: int, P: float) -> tuple[float, float]:
    """:func:`_refined` for one station and one force, in plain floats (quicker than arrays of one)."""
    M, V, q, q1 = float(data.M[i]), float(data.V[i]), float(data.q[i]), float(data.q1[i])
    w0, d1, d2, d3, d4, d5 = (
        float(data.w0[i]),
        float(data.d1[i]),
        float(data.d2[i]),
        float(data.d3[i]),
        float(data.d4[i]),
        float(data.d5[i]),
    )
    low = max(-float(data.xi[i]), -data.spacing)
    high = min(float(data.h[i] - data.xi[i]), data.spacing)
    d = 0.0
    for _ in range(8):
        slope = V - q * d - 0.5 * q1 * d * d + P * (d1 + d * (d2 + d * (d3 / 2 + d * (d4 / 6 + d * d5 / 24))))
        curv = -q - q1 * d + P * (d2 + d * (d3 + d * (d4 / 2 + d * d5 / 6)))
        if curv == 0.0:
            break
        moved = min(max(d - slope / curv, low), high)
        done = abs(moved - d) <= 1e-13 * data.spacing
        d = moved
        if done:
            break
    bow = w0 + d * (d1 + d * (d2 / 2 + d * (d3 / 6 + d * (d4 / 24 + d * d5 / 120))))
    value = abs(M + d * (V - d * (q / 2 + d * q1 / 6)) + P * bow)
    station = abs(M + P * w0)
    x = float(data.x[i])
    return (value, x + d) if value > station else (station, x)


def reference_peak(data: ReferenceData, P: float) -> tuple[float, float]:
    """max|M_I + P w0| [N·m] and where [m], for one axial force (exact to rounding)."""
    return _refined_one(data, int(np.argmax(np.abs(data.M + P * data.w0))), float(P))


def reference_peaks(data: ReferenceData, P: np.ndarray) -> np.ndarray:
    """max|M_I + P w0| [N·m] for many axial forces."""
    P = np.asarray(P, dtype=float)
    i = np.argmax(np.abs(data.M[None, :] + P[:, None] * data.w0[None, :]), axis=1)
    return _refined(data, i, P)[0]
