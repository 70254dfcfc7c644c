"""The largest curvature of a member's first buckling mode, for EN 1993-1-1 eq. (5.9)'s bow
(:mod:`engine.member`)."""

from __future__ import annotations

import math

__all__ = ["mode_curvature_peak"]


def mode_curvature_peak(buckling) -> float:
    r""":math:`|\eta''_{cr}|_{max}` [1/m²] of the first mode, normalised to max|η| = 1, found exactly.

    The mode is :math:`c_0 + c_1\xi + c_2\varphi_2 + c_3\varphi_3` in ξ = x/L (:mod:`engine.solver.buckling`),
    so :math:`L^2\eta'' = c_2\cos\lambda\xi + (c_3/\lambda)\sin\lambda\xi = R\cos(\lambda\xi - \theta)`:
    the peak is R where :math:`\lambda\xi - \theta` is a multiple of π inside the member, else at an end.
    """
    lam = float(buckling.wavenumbers[0])
    c = buckling._coefficients[0]
    a, b = float(c[2]), float(c[3]) / lam
    R = math.hypot(a, b)
    theta = math.atan2(b, a)
    k_low = math.ceil((0.0 - theta) / math.pi - 1e-12)
    inside = (theta + k_low * math.pi) <= lam * (1 + 1e-12)
    ends = max(abs(a), abs(a * math.cos(lam) + b * math.sin(lam)))
    return (R if inside else ends) / buckling.length**2
